/**
 * Load conditions from interval data (the profile reader's drivers and
 * columns): a handful of representative intervals, each one condition of the
 * rebalancing study, because scoring every interval of a year in the search
 * would cost a year of intervals per step.
 *
 * The rule, in full: with the present wiring, each interval's line and
 * neutral currents are read in the fast model (stiff balanced supply, each
 * circuit's complex power at nominal voltage, as the study scores). Picked:
 * the interval of the highest current on each line, of the highest neutral
 * current, of the highest line current of each part named in `parts` (an
 * installation's sub-board feeders), of the highest total import (kW) and, where the board exports, of
 * the highest total export; then `spread` intervals at evenly spaced
 * quantiles of the total apparent power ((k + ½)/spread), the board's typical
 * states. An interval picked for several reasons is one condition. Weights
 * are hours: each peak stands for its own interval; each quantile pick for the
 * intervals of its quantile band, less the peaks that fall in that band, so
 * the weights add up to the data's hours.
 */
import type { Board } from '../board/boardModel.js';
import { abs, add, complex, div, mul, ZERO, type ComplexValue } from '../complex.js';
import type { DriverColumns, DriverSpec } from '../profile/batchNetwork.js';
import { fixedLoadLineCurrents, nominalPhaseVoltages } from './buildAssignmentProblem.js';
import { assertBoardModel } from '../board/modelGuards.js';

export interface IntervalConditionOptions {
  /** Quantile picks of the total apparent power besides the peaks. @defaultValue 8 */
  readonly spread?: number;
  /**
   * Parts of the board whose own peak is picked too: per part, the interval of the highest current
   * on any of its lines from its loads alone (an installation's sub-board feeders). @defaultValue none
   */
  readonly parts?: readonly { readonly name: string; readonly loads: readonly number[] }[];
}

/** One load condition for `rebalanceBoard`'s `loadConditions` option. */
export interface LoadConditionInput {
  readonly name: string;
  /** Hours the condition stands for (the weight in the weighted mean). */
  readonly weight: number;
  /** Complex multiplier of each load's rating, by load index. */
  readonly factors: readonly ComplexValue[];
}

export interface IntervalPick {
  /** Interval index in the data. */
  readonly interval: number;
  readonly utcMs: number;
  /** Why it was picked: `peak line A`, `peak neutral`, `peak current at Workshop`, `peak import`, `peak export`, `quantile 6 %`. */
  readonly reasons: readonly string[];
  readonly hours: number;
}

export interface IntervalConditions {
  /** The board to rebalance: loads rated 0 (metered phase totals) re-rated at 1 VA so a factor can scale them. */
  readonly board: Board;
  readonly conditions: readonly LoadConditionInput[];
  readonly picks: readonly IntervalPick[];
}

/** Each load's rated complex power at nominal voltage (sum of its branches), VA. */
const ratingOf = (board: Board, l: number) => board.loads[l]!.branches.reduce((s, b) => add(s, b.sNominal), ZERO);

const isoMinute = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace('T', ' ');

/**
 * @param board the board the drivers address (the column plan's board, metered phases included).
 * @param drivers, columns the profile reader's drivers and per-interval driver values.
 * @param utcMs start of each interval; @param intervalMs interval length.
 */
export function conditionsFromIntervals(
  board: Board,
  drivers: readonly DriverSpec[],
  columns: DriverColumns,
  utcMs: Float64Array,
  intervalMs: number,
  options: IntervalConditionOptions = {},
): IntervalConditions {
  assertBoardModel(board);
  const spread = options.spread ?? 8;
  const n = columns.count;
  const hoursEach = intervalMs / 3_600_000;
  // Zero-rated loads (metered phase totals) get a 1 VA rating: their factor is then their power in VA.
  const rerated: Board = {
    ...board,
    loads: board.loads.map((load, l) =>
      abs(ratingOf(board, l)) > 0 ? load : { ...load, branches: load.branches.map((b) => ({ ...b, sNominal: complex(1 / load.branches.length, 0) })) },
    ),
  };
  const rating = rerated.loads.map((_, l) => ratingOf(rerated, l));
  // Per driver and line: the line current per unit (conjugated) driver value, in the fast model.
  const v = nominalPhaseVoltages(rerated);
  const lines = rerated.phases.length;
  /** Line currents of every interval from the loads `counted` lets through. */
  const lineCurrents = (counted: (load: number) => boolean) => {
    const perDriver = drivers.map((d) => {
      let w = rerated.phases.map(() => ZERO);
      for (const { load, coefficient } of d.loads) {
        if (!counted(load)) continue;
        const unit = fixedLoadLineCurrents(rerated, v, rerated.loads[load]!, div(coefficient, rating[load]!));
        w = w.map((x, k) => add(x, unit[k]!));
      }
      return w;
    });
    // I(i) = Σ_d conj(a_d(i)) · w_d (each load current is conj(S/V), linear in conj of its power).
    const re = Array.from({ length: lines }, () => new Float64Array(n));
    const im = Array.from({ length: lines }, () => new Float64Array(n));
    for (let i = 0; i < n; i++)
      for (let d = 0; d < drivers.length; d++) {
        const a = columns.re[d]![i]!;
        const b = -columns.im[d]![i]!;
        for (let k = 0; k < lines; k++) {
          const w = perDriver[d]![k]!;
          re[k]![i]! += a * w.re - b * w.im;
          im[k]![i]! += a * w.im + b * w.re;
        }
      }
    return { re, im };
  };
  const { re: lineRe, im: lineIm } = lineCurrents(() => true);
  const kW = new Float64Array(n);
  const kVA = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let p = 0;
    let q = 0;
    for (let d = 0; d < drivers.length; d++)
      for (const { coefficient } of drivers[d]!.loads) {
        p += columns.re[d]![i]! * coefficient.re - columns.im[d]![i]! * coefficient.im;
        q += columns.re[d]![i]! * coefficient.im + columns.im[d]![i]! * coefficient.re;
      }
    kW[i] = p / 1000;
    kVA[i] = Math.hypot(p, q) / 1000;
  }
  const argMax = (value: (i: number) => number): number => {
    let best = 0;
    for (let i = 1; i < n; i++) if (value(i) > value(best)) best = i;
    return best;
  };
  const reasons = new Map<number, string[]>();
  const pick = (i: number, why: string) => reasons.set(i, [...(reasons.get(i) ?? []), why]);
  const lineA = (k: number, i: number) => Math.hypot(lineRe[k]![i]!, lineIm[k]![i]!);
  rerated.phases.forEach((p, k) => pick(argMax((i) => lineA(k, i)), `peak line ${p}`));
  if (rerated.hasNeutral && lines > 1) {
    const neutral = (i: number) => {
      let re = 0;
      let im = 0;
      for (let k = 0; k < lines; k++) {
        re += lineRe[k]![i]!;
        im += lineIm[k]![i]!;
      }
      return Math.hypot(re, im);
    };
    pick(argMax(neutral), 'peak neutral');
  }
  for (const part of options.parts ?? []) {
    const own = new Set(part.loads);
    const at = lineCurrents((l) => own.has(l));
    const worst = (i: number) => Math.max(...at.re.map((re, k) => Math.hypot(re[i]!, at.im[k]![i]!)));
    const i = argMax(worst);
    if (worst(i) > 0) pick(i, `peak current at ${part.name}`);
  }
  pick(argMax((i) => kW[i]!), 'peak import');
  const exportAt = argMax((i) => -kW[i]!);
  if (kW[exportAt]! < 0) pick(exportAt, 'peak export');
  const peaks = new Set(reasons.keys());
  // Quantile bands of the total apparent power.
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => kVA[a]! - kVA[b]!);
  const bands = Math.max(0, Math.min(spread, n));
  const bandHours = new Map<number, number>();
  for (let b = 0; b < bands; b++) {
    const from = Math.floor((b * n) / bands);
    const to = Math.floor(((b + 1) * n) / bands);
    const at = order[Math.min(to - 1, Math.floor(((b + 0.5) * n) / bands))]!;
    let members = 0;
    for (let r = from; r < to; r++) if (!peaks.has(order[r]!)) members++;
    if (members === 0) continue;
    pick(at, `quantile ${Math.round((100 * (b + 0.5)) / bands)} %`);
    bandHours.set(at, (bandHours.get(at) ?? 0) + members * hoursEach);
  }
  const picks: IntervalPick[] = [...reasons.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([interval, why]) => ({ interval, utcMs: utcMs[interval]!, reasons: why, hours: (peaks.has(interval) ? hoursEach : 0) + (bandHours.get(interval) ?? 0) }));
  const conditions = picks.map((p): LoadConditionInput => {
    const power = rerated.loads.map(() => ZERO as ComplexValue);
    drivers.forEach((d, k) => {
      const a = complex(columns.re[k]![p.interval]!, columns.im[k]![p.interval]!);
      for (const { load, coefficient } of d.loads) power[load] = add(power[load]!, mul(a, coefficient));
    });
    return { name: `${isoMinute(p.utcMs)} UTC (${p.reasons.join(', ')})`, weight: p.hours, factors: power.map((s, l) => div(s, rating[l]!)) };
  });
  return { board: rerated, conditions, picks };
}
