/** `trivar solve`: read a board, solve it, print the report or JSON. */
import { readBoardText, solveBoard, type BoardResult } from '@trivar/core';
import type { CliIo } from '../io.js';
import { renderSolveReport } from '../format/solveReport.js';

export interface SolveCommandOptions {
  readonly json?: boolean;
  readonly openNeutral?: boolean;
}

export async function runSolve(file: string, options: SolveCommandOptions, io: CliIo): Promise<BoardResult> {
  const text = await io.readSource(file);
  const result = solveBoard(readBoardText(text), options.openNeutral ? { openNeutral: true } : {});
  io.stdout(options.json ? `${JSON.stringify(result, null, 2)}\n` : renderSolveReport(result));
  return result;
}
