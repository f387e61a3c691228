/** `trivar correct`: size, choose and verify power-factor correction for a board. */
import { correctBoard, InputError, normaliseBoard, parseBoard, readBoardText, type CorrectionReport } from '@trivar/core';
import type { CliIo } from '../io.js';
import { writeResult } from '../writeResult.js';
import { UsageError } from '../exitCodes.js';
import { renderCorrectionReport } from '../format/correctionReport.js';

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

export async function runCorrect(file: string, options: CorrectCommandOptions, io: CliIo): Promise<CorrectionReport> {
  const spec = parseBoard(readBoardText(await io.readSource(file, options.maxInputMb === undefined ? {} : { maxInputMB: options.maxInputMb })));
  const study = studySpec(spec.correction as Record<string, unknown> | undefined, options);
  if (study.arrangement === undefined)
    throw new UsageError('choose what to size: --arrangement star-bank | delta-bank | balancing-compensator, or correction.arrangement in the board file');
  let report: CorrectionReport;
  try {
    report = correctBoard(normaliseBoard(spec), study);
  } catch (error) {
    // The study comes from the board file's correction section (and the options laid over it).
    if (error instanceof InputError)
      throw new InputError(
        error.issues.map((i) => {
          const path = i.path ? `correction.${i.path}` : 'correction';
          // Messages start with "<path>: "; restate them at the path inside the board file.
          return { ...i, path, message: `${path}: ${i.message.slice(i.message.indexOf(': ') + 2)}` };
        }),
        'the correction study is not valid (board file correction section or command-line options)',
      );
    throw error;
  }
  writeResult(io, report, options.json, renderCorrectionReport);
  return report;
}
