/**
 * Studies that size equipment for a board (correction) refuse a board whose
 * supply has collapsed: the equipment would be sized for a state that cannot
 * exist. The CLI's `solve` raises the same error after printing the figures.
 */
import type { Board } from '../board/boardModel.js';
import { NumericalError } from '../errors.js';
import { solveInstallationNetwork } from '../network/solveNetwork.js';
import { installationOf } from '../network/installationModel.js';
import { analyseSolution } from './analyseSolution.js';
import type { OperatingPoint } from './boardResult.js';

/** The error for a solved board whose operating point is a collapse (reason `collapsed`). */
export function collapseError(result: { readonly operatingPoint: Pick<OperatingPoint, 'findings'> }): NumericalError {
  return new NumericalError('collapsed', `no viable operating point: the supply cannot carry these loads: ${result.operatingPoint.findings.join('; ')}`);
}

/**
 * Solves the board — for a board with a place in an installation, the whole installation, every board
 * judged — and throws when an operating point has collapsed.
 * @throws {NumericalError} reason `collapsed`, or as `solveNetwork` throws
 */
export function assertViableBoard(board: Board): void {
  // A comparison asks once for the study and once per arrangement; a board is an immutable value.
  if (viableBoards.has(board)) return;
  const { installation } = installationOf(board);
  const boards = solveInstallationNetwork(installation).boards;
  const findings = boards.flatMap((s) => {
    const point = analyseSolution(s).operatingPoint;
    if (!point.collapsed) return [];
    return boards.length > 1 ? point.findings.map((f) => `${s.board.name}: ${f}`) : point.findings;
  });
  if (findings.length) throw collapseError({ operatingPoint: { findings } });
  viableBoards.add(board);
}

/** Boards already solved and found viable. */
const viableBoards = new WeakSet<Board>();
