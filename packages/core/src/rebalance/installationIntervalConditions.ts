/**
 * Interval data on an installation as load conditions for `rebalanceInstallation`. The column plan
 * (planInstallationColumns) reads every board's loads as one list; conditionsFromIntervals picks the
 * representative intervals over that list — the incomer's peaks and quantiles — and, besides, the
 * interval of each sub-board feeder's own highest line current (its board and every board it feeds).
 * The installation comes back board by board in file order, as the study's load conditions are
 * indexed, with each metered phase total the data names as a load on its board (not movable).
 */
import type { BoardLoad, Installation } from '../board/boardModel.js';
import type { DriverColumns, DriverSpec } from '../profile/batchNetwork.js';
import { boardNamesOf, type InstallationColumnPlan } from '../profile/installationColumns.js';
import { conditionsFromIntervals, type IntervalConditionOptions, type IntervalPick, type LoadConditionInput } from './intervalConditions.js';
import { assertInstallationModel } from '../board/modelGuards.js';

export interface InstallationIntervalConditions {
  /** The installation to rebalance: zero-rated loads re-rated at 1 VA, metered phase totals added on their boards. */
  readonly installation: Installation;
  /** Per condition, a factor per load board by board in file order (`rebalanceInstallation`'s `loadConditions`). */
  readonly conditions: readonly LoadConditionInput[];
  readonly picks: readonly IntervalPick[];
}

/** Board numbers fed through board b's feeder: b and every board downstream of it. */
function fedThrough(installation: Installation, b: number): Set<number> {
  // A board is fed through b's feeder when b is on its way up to the main board (the file order need not be the feeding order).
  const through = new Set<number>();
  installation.subBoards.forEach((_, i) => {
    for (let at = i + 1; ; at = installation.subBoards[at - 1]!.fedFrom) {
      if (at === b) {
        through.add(i + 1);
        break;
      }
      if (at === 0) break;
    }
  });
  return through;
}

/**
 * @param plan the installation's column plan; @param drivers, columns its drivers and per-interval values.
 * @param utcMs start of each interval; @param intervalMs interval length.
 */
export function conditionsFromInstallationIntervals(
  installation: Installation,
  plan: InstallationColumnPlan,
  drivers: readonly DriverSpec[],
  columns: DriverColumns,
  utcMs: Float64Array,
  intervalMs: number,
  options: Omit<IntervalConditionOptions, 'parts'> = {},
): InstallationIntervalConditions {
  assertInstallationModel(installation);
  const names = boardNamesOf(installation);
  const parts = installation.subBoards.map((_, i) => {
    const through = fedThrough(installation, i + 1);
    return { name: names[i + 1]!, loads: plan.loadBoards.flatMap((b, l) => (through.has(b) ? [l] : [])) };
  });
  const picked = conditionsFromIntervals(plan.board, drivers, columns, utcMs, intervalMs, { ...options, parts });
  // Board by board, each board's loads in the plan's order (the file's loads first, then metered phases).
  const order = names.flatMap((_, b) => plan.loadBoards.flatMap((at, l) => (at === b ? [l] : [])));
  const loadsOf = (b: number): BoardLoad[] =>
    order.filter((l) => plan.loadBoards[l] === b).map((l) => {
      const load = picked.board.loads[l]!;
      return { ...load, name: load.name.slice(names[b]!.length + 1) };
    });
  const boardLoads = names.map((_, b) => loadsOf(b));
  // A bank the file lists in service (harmonics.banks) has no column: it stays in service, as rated, in
  // every condition (its parts keep their places among the board's loads).
  const bankParts = new Set((installation.banksInService ?? []).flatMap((bank) => bank.loads.map((k) => `${bank.boardIndex}:${k}`)));
  const inService = boardLoads.flatMap((loads, b) => loads.map((_, k) => bankParts.has(`${b}:${k}`)));
  return {
    installation: { ...installation, main: { ...installation.main, loads: boardLoads[0]! }, subBoards: installation.subBoards.map((sb, i) => ({ ...sb, loads: boardLoads[i + 1]! })) },
    conditions: picked.conditions.map((c) => ({ ...c, factors: order.map((l, i) => (inService[i] ? { re: 1, im: 0 } : c.factors[l]!)) })),
    picks: picked.picks,
  };
}
