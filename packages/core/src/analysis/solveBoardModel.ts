import type { Board } from '../board/boardModel.js';
import { solveNetwork, type SolveOptions } from '../network/solveNetwork.js';
import { analyseSolution } from './analyseSolution.js';
import { studyOpenNeutral } from './studyOpenNeutral.js';
import type { BoardResult } from './boardResult.js';
import { assertFiniteResult } from './assertFiniteResult.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';
import { SOLVE_OPTION_KEYS, solveOptionsOf } from '../network/solveOptions.js';

export interface SolveBoardOptions extends SolveOptions {
  /**
   * Also solve the board with its neutral conductor broken and report what each
   * line-to-neutral load would see. The board file's `studies.openNeutral` turns it on too.
   * @defaultValue false
   */
  readonly openNeutral?: boolean;
}

/**
 * Solves a normalised board (see `normaliseBoard`) and analyses the result.
 * @throws {NumericalError} for a singular network or a load iteration that does not settle.
 */
export function solveBoardModel(board: Board, options: SolveBoardOptions = {}): BoardResult {
  assertBoardModel(board);
  checkOptionKeys(options, 'options', [...SOLVE_OPTION_KEYS, 'openNeutral']);
  const result = analyseSolution(solveNetwork(board, solveOptionsOf(options)));
  const wantOpen = options.openNeutral ?? board.studies.openNeutral;
  return assertFiniteResult(wantOpen ? { ...result, openNeutral: studyOpenNeutral(board, solveOptionsOf(options)) } : result);
}
