/** `trivar correct`: size, choose and verify power-factor correction for a board. */
import { boardHasHarmonicData, compareCorrections, compareWithHarmonics, correctBoard, correctWithHarmonics, InputError, normaliseBoard, parseBoard, readBoardText, solveBoardModel, type CorrectionComparison, type CorrectionReport, type HarmonicComparison, type HarmonicCorrectionReport } from '@trivar/core';
import type { CliIo } from '../io.js';
import { writeResult } from '../writeResult.js';
import { collapseError } from '../exitCodes.js';
import { renderCorrectionReport } from '../format/correctionReport.js';
import { renderComparisonHarmonics, renderCorrectionHarmonics } from '../format/correctionHarmonicsReport.js';
import { renderComparisonReport } from '../format/comparisonReport.js';

export interface CorrectCommandOptions {
  readonly json?: boolean;
  readonly arrangement?: string;
  readonly pf?: number;
  readonly definition?: string;
  readonly allowLeading?: boolean;
  readonly upperPf?: number;
  readonly lightLoad?: number;
  readonly outputs?: string;
  readonly practice?: string;
  readonly ct?: number;
  readonly maxInputMb?: number;
}

/** The board file's `correction` section with the command-line options laid over it. */
function studySpec(fromFile: Record<string, unknown> | undefined, o: CorrectCommandOptions): Record<string, unknown> {
  const spec: Record<string, unknown> = { ...(fromFile ?? {}) };
  const target: Record<string, unknown> = { ...((spec.target as Record<string, unknown> | undefined) ?? {}) };
  if (o.arrangement !== undefined) spec.arrangement = o.arrangement;
  if (o.pf !== undefined) target.pf = o.pf;
  if (o.definition !== undefined) target.definition = o.definition;
  if (o.allowLeading) target.leading = 'allowed';
  if (o.upperPf !== undefined) target.maxLaggingPf = o.upperPf;
  if (Object.keys(target).length) spec.target = target;
  if (o.lightLoad !== undefined) spec.lightLoad = { ...((spec.lightLoad as object | undefined) ?? {}), fraction: o.lightLoad };
  if (o.practice !== undefined) spec.practice = o.practice;
  const controller: Record<string, unknown> = { ...((spec.controller as Record<string, unknown> | undefined) ?? {}) };
  if (o.outputs !== undefined) controller.outputs = Number(o.outputs);
  if (o.ct !== undefined) controller.ctPrimaryA = o.ct;
  if (Object.keys(controller).length) spec.controller = controller;
  return spec;
}

/** What `trivar correct` produced: one arrangement's report, or every arrangement compared. */
export type CorrectOutcome = { readonly kind: 'single'; readonly report: CorrectionReport } | { readonly kind: 'comparison'; readonly comparison: CorrectionComparison };

/** True when the outcome meets the target (exit 0), false for exit 5. */
export function outcomeMeetsTarget(outcome: CorrectOutcome): boolean {
  if (outcome.kind === 'comparison') return outcome.comparison.meetsTarget;
  const s = outcome.report.status;
  return s !== 'infeasible' && s !== 'misses-target-with-available-units' && s !== 'no-suitable-units';
}

export async function runCorrect(file: string, options: CorrectCommandOptions, io: CliIo): Promise<CorrectOutcome> {
  const spec = parseBoard(readBoardText(await io.readSource(file, options.maxInputMb === undefined ? {} : { maxInputMB: options.maxInputMb })));
  const study = studySpec(spec.correction as Record<string, unknown> | undefined, options);
  try {
    const board = normaliseBoard(spec);
    // Correcting a board whose supply has collapsed would size equipment for a state that cannot exist.
    const present = solveBoardModel(board);
    if (present.operatingPoint.collapsed) throw collapseError(present);
    // Without an arrangement (file or option) every arrangement that fits the board is compared.
    if (study.arrangement === undefined) {
      if (boardHasHarmonicData(spec)) {
        const comparison = compareWithHarmonics(spec, board, study);
        writeResult(io, comparison, options.json, (c: HarmonicComparison) => renderComparisonReport(c) + renderComparisonHarmonics(c.harmonics));
        return { kind: 'comparison', comparison };
      }
      const comparison = compareCorrections(board, study);
      writeResult(io, comparison, options.json, renderComparisonReport);
      return { kind: 'comparison', comparison };
    }
    // A board file with harmonic data (spectra, a harmonics: section) gets the harmonic check
    // of the bank, with detuned variants beside the plain one.
    if (boardHasHarmonicData(spec)) {
      const checked = correctWithHarmonics(spec, board, study);
      writeResult(io, checked, options.json, (r: HarmonicCorrectionReport) => renderCorrectionReport(r) + renderCorrectionHarmonics(r.harmonics));
      return { kind: 'single', report: checked };
    }
    const report = correctBoard(board, study);
    writeResult(io, report, options.json, renderCorrectionReport);
    return { kind: 'single', report };
  } catch (error) {
    if (error instanceof InputError) throw asCorrectionInputError(error);
    throw error;
  }
}

/** An input error of the correction study restated at its path inside the board file (correction.…). */
export function asCorrectionInputError(error: InputError): InputError {
  return new InputError(
    error.issues.map((i) => {
      const path = i.path ? `correction.${i.path}` : 'correction';
      // Messages start with "<path>: "; restate them at the path inside the board file.
      return { ...i, path, message: `${path}: ${i.message.slice(i.message.indexOf(': ') + 2)}` };
    }),
    'the correction study is not valid (board file correction section or command-line options)',
  );
}
