/**
 * `rebalanceBoard`: the rebalancing study on one board. A board that is part
 * of an installation (it carries its place) is studied in place: its own
 * circuits move, its incomer is measured, and the whole installation is re-solved.
 */
import type { Board } from '../board/boardModel.js';
import { installationOf } from '../network/installationModel.js';
import { rebalanceInstallation, type RebalanceOptions } from './rebalanceInstallation.js';
import type { RebalanceReport } from './rebalanceResult.js';
import { assertBoardModel } from '../board/modelGuards.js';

export type { RebalanceOptions } from './rebalanceInstallation.js';

/**
 * Finds which circuits to move to which connection so the score (by default the
 * largest line current plus the neutral current, in the worst load condition)
 * is as small as possible, within the move limit and line capacities, and
 * re-solves the board before and after with the network solver.
 *
 * @param board a normalised board (`normaliseBoard`).
 * @param study the study, shaped like the board file's `rebalance:` section.
 * @throws {InputError} for a bad study (paths relative to the study: `pinned[1].on`).
 * @throws {NumericalError} when the network solver cannot solve a condition.
 * @example
 * // Studio, 400 V: kiln 6 kW (circuit '1') and kitchen sockets 3 kW ('3') on A-N, lights 1 kW ('5') on B-N, heater 2 kW ('7') on C-N
 * const report = rebalanceBoard(normaliseBoard(parseBoard(studio)), { moveLimit: 2 });
 * report.moves //=> [
 * //   { board: 'Studio', circuit: '1', listPosition: 1, name: 'Kiln', from: 'A-N', to: 'B-N', circuitNumber: { verdict: 'position-changes', implied: null, positions: null } },
 * //   { board: 'Studio', circuit: '5', listPosition: 3, name: 'Lights', from: 'B-N', to: 'C-N', circuitNumber: { verdict: 'position-changes', implied: null, positions: null } },
 * // ]
 * // `circuit` is the file's circuit number as written (null where it gives none), `listPosition` the load's place in the list.
 */
export function rebalanceBoard(board: Board, study: unknown, options: RebalanceOptions = {}): RebalanceReport {
  assertBoardModel(board);
  const { installation } = installationOf(board);
  if (installation.subBoards.length === 0) return rebalanceInstallation(installation, study, options);
  const name = board.name;
  const given = typeof study === 'object' && study !== null ? (study as Record<string, unknown>) : {};
  return rebalanceInstallation(installation, { boards: [name], measureAt: name, ...given }, options);
}
