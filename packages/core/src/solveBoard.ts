import { parseBoard } from './board/validateBoard.js';
import { normaliseBoard } from './board/normaliseBoard.js';
import type { Board } from './board/boardModel.js';
import { solveNetwork, type SolveOptions } from './network/solveNetwork.js';
import { analyseSolution } from './analysis/analyseSolution.js';
import { studyOpenNeutral } from './analysis/studyOpenNeutral.js';
import type { BoardResult } from './analysis/boardResult.js';
import { NumericalError } from './errors.js';

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
  const result = analyseSolution(solveNetwork(board, options));
  const wantOpen = options.openNeutral ?? board.studies.openNeutral;
  return assertFiniteResult(wantOpen ? { ...result, openNeutral: studyOpenNeutral(board, options) } : result);
}

/** No NaN or infinity may reach a caller (JSON would silently turn them into null). */
export function assertFiniteResult<T>(result: T): T {
  // First a plain walk; the path is only spelled out when something is wrong
  // (building path strings for every number was most of the check's cost).
  const allFinite = (value: unknown): boolean => {
    if (typeof value === 'number') return Number.isFinite(value);
    if (Array.isArray(value)) return value.every(allFinite);
    if (value && typeof value === 'object') {
      for (const k in value) if (!allFinite((value as Record<string, unknown>)[k])) return false;
    }
    return true;
  };
  if (allFinite(result)) return result;
  const visit = (value: unknown, path: string): void => {
    if (typeof value === 'number') {
      if (!Number.isFinite(value)) throw new NumericalError('non-finite', `the result has a non-finite value at ${path}; check for extreme impedance or power values`);
    } else if (Array.isArray(value)) value.forEach((v, i) => visit(v, `${path}[${i}]`));
    else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) visit(v, path ? `${path}.${k}` : k);
  };
  visit(result, '');
  return result;
}

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
