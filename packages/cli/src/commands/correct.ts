/** `trivar correct`: size, choose and verify power-factor correction for a board. */
import { boardOfInstallation, meteringPointIssues, boardHasHarmonicData, installationHasHarmonicData, compareCorrections, compareInstallationCorrections, correctBoard, correctInstallation, InputError, installationBoardIndex, installationInService, isInstallationInput, normaliseBoard, readPlainBoardText, readWellFormedBoard, readWellFormedCorrectionBoard, readWellFormedInstallation, type Board, type CorrectionComparison, type CorrectionReport } from '@trivar/core';
import type { CliIo } from '../io.js';
import { writeResult } from '../writeResult.js';
import { renderCorrectionReport } from '../format/correctionReport.js';
import { renderComparisonReport } from '../format/comparisonReport.js';
import { renderInstallationComparison, renderInstallationCorrection } from '../format/installationCorrectionReport.js';
import { UsageError } from '../exitCodes.js';
import { assertOptionsFit, fieldSources, studySpec, withFieldSources, type CorrectStudyOptions } from './correctStudyOptions.js';
import { boardIndexOption } from './boardIndexOption.js';

export interface CorrectCommandOptions extends CorrectStudyOptions {
  readonly json?: boolean;
  readonly maxInputMb?: number;
  /** Installation files: the board the equipment goes on (default: the main board). */
  readonly board?: string;
}

/** What `trivar correct` produced: one arrangement's report, or every arrangement compared. */
export type CorrectOutcome = { readonly kind: 'single'; readonly report: CorrectionReport } | { readonly kind: 'comparison'; readonly comparison: CorrectionComparison };

/** True when the outcome meets the target (exit 0), false for exit 5 (also where what meets it fails the harmonic check). */
export function outcomeMeetsTarget(outcome: CorrectOutcome): boolean {
  if (outcome.kind === 'comparison') return outcome.comparison.meetsTarget;
  const s = outcome.report.status;
  if (outcome.report.warnings.some((w) => w.code === 'harmonic-check-failed')) return false;
  return s !== 'infeasible' && s !== 'misses-target-with-available-units' && s !== 'no-suitable-units' && s !== 'nothing-to-build';
}

/** The study's input errors restated at their place in the file (`correction.target.pf`). */
export function inFileSection(error: unknown): unknown {
  if (!(error instanceof InputError)) return error;
  return new InputError(
    error.issues.map((i) => {
      const path = i.path ? `correction.${i.path}` : 'correction';
      // Messages start with "<path>: "; restate them at the path inside the board file.
      return { ...i, path, message: `${path}: ${i.message.slice(i.message.indexOf(': ') + 2)}` };
    }),
    'the correction study is not valid (board file correction section or command-line options)',
  );
}

/** A restater for the text report: warnings that name a study field name the option or file field that gave it. */
function fieldsNamed(fromFile: Record<string, unknown> | undefined, options: CorrectStudyOptions): <T>(result: T) => T {
  const sources = fieldSources(fromFile, options);
  return (result) => withFieldSources(result, sources);
}

/**
 * `--measured-at` checked against the equipment's board: a point that is not upstream of it (or a name the
 * file makes ambiguous) is a command line that does not fit the file, which alone is valid: a usage error
 * naming the option (exit 2), as every other option that does not fit the file.
 */
function assertMeteringOption(board: Board, point: string | undefined, what: 'file' | 'installation'): void {
  const issues = meteringPointIssues(board, point, '--measured-at');
  if (issues.length) throw new UsageError(`the options do not fit the ${what}: ${issues.map((i) => i.message).join('; ')}`);
}

/** An installation file: the equipment on the board `--board` names (default: the main board), its effect on every board. */
async function runCorrectInstallation(input: unknown, options: CorrectCommandOptions, io: CliIo): Promise<CorrectOutcome> {
  // The schemas are loaded only for an installation the well-formed shortcut steps aside from (a study section).
  const spec = readWellFormedInstallation(input) ?? (await import('./schemaChecks.js')).parseInstallation(input);
  // The banks the file lists are in service; the one on the equipment's board, if any, is the study's to replace.
  const installation = installationInService(spec);
  // Checked before the study, so the error names the option, not the file's correction section.
  boardIndexOption(installation, options.board, '--board');
  // The file's correction.board places the equipment (--board overrides it); it is not part of the study itself.
  const { board: fileBoard, ...fromFile } = spec.correction ?? {};
  if (fileBoard !== undefined) installationBoardIndex(installation, fileBoard, 'correction.board');
  const study = studySpec(fromFile as Record<string, unknown>, options);
  // The text names where a warned value came from: the option, or the file's field.
  const named = fieldsNamed(fromFile as Record<string, unknown>, options);
  const boardName = options.board ?? fileBoard;
  const placement = boardName === undefined ? {} : { board: boardName };
  // Also checked before the study, so the error names the option.
  const equipmentBoard = boardOfInstallation(installation, installationBoardIndex(installation, boardName));
  assertMeteringOption(equipmentBoard, options.measuredAt, 'installation');
  assertOptionsFit(fromFile as Record<string, unknown>, options, equipmentBoard);
  // An installation file with harmonic data (spectra, a harmonics: section) gets the harmonic check
  // of the bank on its board, with detuned variants beside the plain one, as a board file does.
  const harmonic = installationHasHarmonicData(spec) ? await import('./correctWithHarmonicData.js') : null;
  // Its harmonics section is checked before the study, so an error there is named at its own path.
  harmonic?.checkHarmonicsSection(spec);
  try {
    if (harmonic) return harmonic.writeInstallationWithHarmonics(spec, installation, study, placement, options.json, io, named);
    if (study.arrangement === undefined) {
      const compared = compareInstallationCorrections(installation, study, placement);
      writeResult(io, compared, options.json, (r) => renderInstallationComparison(named(r)));
      return { kind: 'comparison', comparison: compared.comparison };
    }
    const corrected = correctInstallation(installation, study, placement);
    writeResult(io, corrected, options.json, (r) => renderInstallationCorrection(named(r)));
    return { kind: 'single', report: corrected.report };
  } catch (error) {
    throw inFileSection(error);
  }
}

export async function runCorrect(file: string, options: CorrectCommandOptions, io: CliIo): Promise<CorrectOutcome> {
  const text = await io.readSource(file, options.maxInputMb === undefined ? {} : { maxInputMB: options.maxInputMb });
  // JSON and plain YAML are read without yaml (the same data); only other YAML loads it (and words any syntax error).
  const input = readPlainBoardText(text) ?? (await import('./yamlReading.js')).readBoardText(text);
  if (isInstallationInput(input)) return runCorrectInstallation(input, options, io);
  if (options.board !== undefined)
    throw new InputError(
      [{ code: 'not_applicable', path: '', expected: 'an installation file (with boards:) for --board', message: '--board applies to installation files (with boards:), and this is a single board' }],
      'the options do not fit the file',
    );
  // A well-formed board is read without the board-file schemas (zod and every study's section), as solve reads it;
  // one with a correction section and no other study with only that section's schema, which the study needs anyway.
  const spec = readWellFormedBoard(input) ?? readWellFormedCorrectionBoard(input) ?? (await import('./schemaChecks.js')).parseBoard(input);
  const study = studySpec(spec.correction as Record<string, unknown> | undefined, options);
  const named = fieldsNamed(spec.correction as Record<string, unknown> | undefined, options);
  // correctBoard and compareCorrections refuse a board whose supply has collapsed.
  const board = normaliseBoard(spec);
  assertMeteringOption(board, options.measuredAt, 'file');
  assertOptionsFit(spec.correction as Record<string, unknown> | undefined, options, board);
  try {
    // Without an arrangement (file or option) every arrangement that fits the board is compared.
    if (study.arrangement === undefined) {
      if (boardHasHarmonicData(spec)) {
        const { writeComparisonWithHarmonics } = await import('./correctWithHarmonicData.js');
        return { kind: 'comparison', comparison: writeComparisonWithHarmonics(spec, board, study, options.json, io, named) };
      }
      const comparison = compareCorrections(board, study);
      writeResult(io, comparison, options.json, (r) => renderComparisonReport(named(r)));
      return { kind: 'comparison', comparison };
    }
    // A board file with harmonic data (spectra, a harmonics: section) gets the harmonic check
    // of the bank, with detuned variants beside the plain one.
    if (boardHasHarmonicData(spec)) {
      const { writeCorrectionWithHarmonics } = await import('./correctWithHarmonicData.js');
      return { kind: 'single', report: writeCorrectionWithHarmonics(spec, board, study, options.json, io, named) };
    }
    const report = correctBoard(board, study);
    writeResult(io, report, options.json, (r) => renderCorrectionReport(named(r)));
    return { kind: 'single', report };
  } catch (error) {
    // The study comes from the board file's correction section (and the options laid over it).
    throw inFileSection(error);
  }
}
