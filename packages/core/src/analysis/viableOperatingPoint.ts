/**
 * Studies that size equipment for a board (correction), or read the harmonics of its
 * state, refuse a board whose supply has collapsed: the equipment would be sized, the
 * distortion read, for a state that cannot exist. The CLI's `solve` raises the same error after printing the figures.
 */
import type { Board } from '../board/boardModel.js';
import { NumericalError } from '../errors.js';
import { solveInstallationNetwork, type NetworkSolution } from '../network/solveNetwork.js';
import { installationOf } from '../network/installationModel.js';
import { analyseSolution } from './analyseSolution.js';
import type { OperatingPoint } from './boardResult.js';
import { argumentError, assertBoardModel, isObject } from '../board/modelGuards.js';
import { argumentIssueError } from '../_internal/argumentChecks.js';

/**
 * The error for a solved board whose operating point is a collapse (reason `collapsed`).
 * @throws {InputError} naming `result` or its findings when there is no collapse finding to quote (an error
 *   saying "cannot carry these loads: " and nothing after it would contradict a viable board)
 */
export function collapseError(result: { readonly operatingPoint: Pick<OperatingPoint, 'findings'> }): NumericalError {
  if (!isObject(result) || !isObject(result.operatingPoint))
    throw argumentError('result', 'a solved board from solveBoard(...) or solveBoardModel(...) whose operating point collapsed', result, 'the result argument is not a solved board', 'solved');
  const findings: unknown = result.operatingPoint.findings;
  if (!Array.isArray(findings) || findings.length === 0 || !findings.every((f) => typeof f === 'string' && f.length > 0))
    throw argumentIssueError('result.operatingPoint.findings', 'the findings of a collapsed operating point, at least one, as text', findings);
  return new NumericalError('collapsed', `no viable operating point: the supply cannot carry these loads: ${result.operatingPoint.findings.join('; ')}`);
}

/**
 * Solves the board — for a board with a place in an installation, the whole installation, every board
 * judged — and throws when an operating point has collapsed.
 * @throws {NumericalError} reason `collapsed`, or as `solveNetwork` throws
 */
export function assertViableBoard(board: Board): void {
  assertBoardModel(board);
  // A comparison asks once for the study and once per arrangement; a board is an immutable value.
  if (viableBoards.has(board)) return;
  const { installation } = installationOf(board);
  assertViableSolutions(solveInstallationNetwork(installation).boards);
  viableBoards.add(board);
}

/**
 * Throws when a solved board (one per board of an installation) has collapsed, each finding named by
 * its board when there are several: for a study that solved the fundamental itself (harmonics).
 * @throws {NumericalError} reason `collapsed`
 */
export function assertViableSolutions(boards: readonly NetworkSolution[]): void {
  const findings = boards.flatMap((s) => {
    const point = analyseSolution(s).operatingPoint;
    if (!point.collapsed) return [];
    return boards.length > 1 ? point.findings.map((f) => `${s.board.name}: ${f}`) : point.findings;
  });
  if (findings.length) throw collapseError({ operatingPoint: { findings } });
}

/** Boards already solved and found viable. */
const viableBoards = new WeakSet<Board>();
