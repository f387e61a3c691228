/** `trivar harmonics`: the harmonic study of a board or installation file (spectra, neutrals, resonance scan, capacitor duty). */
import { isInstallationInput, readBoardText, studyHarmonics, studyInstallationHarmonics, type HarmonicsReport, type InstallationHarmonicsReport } from '@trivar/core';
import type { CliIo } from '../io.js';
import { renderHarmonicsReport } from '../format/harmonicsReport.js';
import { renderInstallationHarmonicsReport } from '../format/installationHarmonicsReport.js';
import { boardOptionOnBoardFile, unknownBoardError } from './chooseBoard.js';
import { writeResult } from '../writeResult.js';
import { escapeControlCharacters } from '../format/terminalText.js';

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
    writeResult(io, report, options.json, renderHarmonicsReport);
    return report;
  }
  const report = studyInstallationHarmonics(input);
  const names = report.boards.map((b) => b.board);
  const unknown = (options.board ?? []).filter((n) => !names.includes(n));
  if (unknown.length) throw unknownBoardError(unknown, names);
  const detailed = options.allBoards ? names : names.filter((n) => options.board?.includes(n));
  // The text report reads the escaped copy of the data: the names it looks up are escaped alike.
  writeResult(io, report, options.json, (r) => renderInstallationHarmonicsReport(r, { detailed: detailed.map(escapeControlCharacters) }));
  return report;
}
