/** `trivar harmonics`: the harmonic study of a board or installation file (spectra, neutrals, resonance scan, capacitor duty). */
import { isInstallationInput, readBoardText, studyHarmonics, studyInstallationHarmonics, type HarmonicsReport, type InstallationHarmonicsReport } from '@trivar/core';
import type { CliIo } from '../io.js';
import { renderHarmonicsReport } from '../format/harmonicsReport.js';
import { renderInstallationHarmonicsReport } from '../format/installationHarmonicsReport.js';
import { boardOptionOnBoardFile, unknownBoardError } from './chooseBoard.js';

export interface HarmonicsCommandOptions {
  readonly json?: boolean;
  /** Installation files: boards whose full figures to show. */
  readonly board?: readonly string[];
  readonly allBoards?: boolean;
}

export async function runHarmonics(file: string, options: HarmonicsCommandOptions, io: CliIo): Promise<HarmonicsReport | InstallationHarmonicsReport> {
  const input = readBoardText(await io.readSource(file));
  if (!isInstallationInput(input)) {
    if (options.board?.length || options.allBoards) throw boardOptionOnBoardFile('--board and --all-boards');
    const report = studyHarmonics(input);
    io.stdout(options.json ? `${JSON.stringify(report, null, 2)}\n` : renderHarmonicsReport(report));
    return report;
  }
  const report = studyInstallationHarmonics(input);
  const names = report.boards.map((b) => b.board);
  const unknown = (options.board ?? []).filter((n) => !names.includes(n));
  if (unknown.length) throw unknownBoardError(unknown, names);
  const detailed = options.allBoards ? names : names.filter((n) => options.board?.includes(n));
  io.stdout(options.json ? `${JSON.stringify(report, null, 2)}\n` : renderInstallationHarmonicsReport(report, { detailed }));
  return report;
}
