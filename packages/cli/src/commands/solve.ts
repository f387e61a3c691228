/** `trivar solve`: read a board or installation file, solve it, print the report or JSON. */
import {
  installationInService,
  isInstallationInput,
  normaliseBoard,
  readPlainBoardText,
  readWellFormedBoard,
  readWellFormedInstallation,
  solveBoardModel,
  solveInstallationModel,
  type BoardResult,
  type InstallationResult,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { writeResult } from '../writeResult.js';
import { escapeControlCharacters } from '../format/terminalText.js';
import { collapseOf } from '../exitCodes.js';
import { renderSolveReport } from '../format/solveReport.js';
import { renderInstallationReport } from '../format/installationReport.js';
import { boardOptionOnBoardFile, unknownBoardError } from './chooseBoard.js';

export interface SolveCommandOptions {
  readonly json?: boolean;
  readonly openNeutral?: boolean;
  readonly maxInputMb?: number;
  /** Installation files: boards whose full report to show. */
  readonly board?: readonly string[];
  readonly allBoards?: boolean;
}

const hasCorrectionSection = (input: unknown): boolean => input !== null && typeof input === 'object' && Object.hasOwn(input, 'correction');

export async function runSolve(file: string, options: SolveCommandOptions, io: CliIo): Promise<BoardResult | InstallationResult> {
  const text = await io.readSource(file, options.maxInputMb === undefined ? {} : { maxInputMB: options.maxInputMb });
  // JSON and plain YAML are read without yaml; only other YAML loads it (and words any syntax error).
  const input = readPlainBoardText(text) ?? (await import('./yamlReading.js')).readBoardText(text);
  const solveOptions = options.openNeutral ? { openNeutral: true } : {};
  if (!isInstallationInput(input)) {
    if (options.board?.length || options.allBoards) throw boardOptionOnBoardFile('--board and --all-boards');
    // solveBoard's steps, with the schemas loaded only for a board the shortcut steps aside from.
    // A board with a correction section (solve leaves it to `trivar correct`) builds that section's schema only.
    const spec =
      readWellFormedBoard(input) ??
      (hasCorrectionSection(input) ? (await import('./correctionShortcut.js')).readWellFormedCorrectionBoard(input) : undefined) ??
      (await import('./schemaChecks.js')).parseBoard(input);
    const result = solveBoardModel(normaliseBoard(spec), solveOptions);
    writeResult(io, result, options.json, renderSolveReport);
    const collapse = collapseOf(result);
    if (collapse) throw collapse;
    return result;
  }
  // solveInstallation's steps for an installation file, with the schemas loaded only where the shortcut steps aside.
  const wellFormed = readWellFormedInstallation(input);
  const result = wellFormed ? solveInstallationModel(installationInService(wellFormed), solveOptions) : (await import('./schemaChecks.js')).solveInstallation(input, solveOptions);
  const names = result.boards.map((b) => b.name);
  const unknown = (options.board ?? []).filter((n) => !names.includes(n));
  if (unknown.length) throw unknownBoardError(unknown, names);
  const detailed = options.allBoards ? names : names.filter((n) => options.board?.includes(n));
  // The text report reads the escaped copy of the result: the names it looks up are escaped alike.
  writeResult(io, result, options.json, (r) => renderInstallationReport(r, { detailed: detailed.map(escapeControlCharacters) }));
  // As for a board file: the figures are printed, then a collapse anywhere is the exit status.
  const collapse = collapseOf(result);
  if (collapse) throw collapse;
  return result;
}
