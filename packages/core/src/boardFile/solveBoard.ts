import { normaliseBoard } from '../board/normaliseBoard.js';
import { solveBoardModel, type SolveBoardOptions } from '../analysis/solveBoardModel.js';
import type { BoardResult } from '../analysis/boardResult.js';
import { parseBoard } from './validateBoard.js';

/**
 * Validates, normalises and solves a board given as a plain object (a parsed
 * board file) or a typed `BoardSpec`.
 * @throws {InputError} listing every problem in the board, each with its path.
 * @throws {NumericalError} for a singular network or a load iteration that does not settle.
 * @example
 * const result = solveBoard({
 *   supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
 *   loads: [{ name: 'heater', connection: 'A-N', kW: 2.3, pf: 1 }],
 * });
 * result.neutral?.current.magnitude //=> 10 (A: the whole phase-A current returns in the neutral)
 */
export function solveBoard(input: unknown, options: SolveBoardOptions = {}): BoardResult {
  return solveBoardModel(normaliseBoard(parseBoard(input)), options);
}
