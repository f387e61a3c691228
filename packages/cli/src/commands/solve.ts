/** `trivar solve`: read a board, solve it, print the report or JSON. */
import { readBoardText, solveBoard, type BoardResult } from '@trivar/core';
import type { CliIo } from '../io.js';
import { writeResult } from '../writeResult.js';
import { collapseError } from '../exitCodes.js';
import { renderSolveReport } from '../format/solveReport.js';

export interface SolveCommandOptions {
  readonly json?: boolean;
  readonly openNeutral?: boolean;
  readonly maxInputMb?: number;
}

export async function runSolve(file: string, options: SolveCommandOptions, io: CliIo): Promise<BoardResult> {
  const text = await io.readSource(file, options.maxInputMb === undefined ? {} : { maxInputMB: options.maxInputMb });
  const result = solveBoard(readBoardText(text), options.openNeutral ? { openNeutral: true } : {});
  writeResult(io, result, options.json, renderSolveReport);
  if (result.operatingPoint.collapsed) throw collapseError(result);
  return result;
}
