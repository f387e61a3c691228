/**
 * Steps of an automatic bank sized from the profile: the bank holds the target
 * power factor in `coverShare` of the intervals (the need at that percentile of
 * the intervals), split into at most `stepCount` equal steps. Three-phase steps
 * are rounded up to 2.5 kvar and single-phase steps to 0.5 kvar, the granularity
 * of common catalogue units (common practice, no source). A small need takes
 * fewer steps: six 2.5 kvar steps for a 3.3 kvar need would install 15 kvar, far
 * past what the board ever asks for, so the count stops where the steps cover the need.
 *
 * The controller closes a step only while the remaining need exceeds its response
 * threshold (responseShare × the smallest step, the C/k setting; METHODS §10), so
 * steps that cover the need on paper may never all close: a 2.77 kvar need on two
 * 2.5 kvar steps leaves 0.27 kvar after the first, under the 1.68 kvar threshold,
 * and the second stays open. Where the catalogue steps have that flaw, the sizing
 * weighs every size on the catalogue grid and a finer one (three-phase units from
 * 1 kvar in 0.5 kvar steps, which catalogues also list; common practice, no source)
 * whose steps the controller's own rule closes up to the sized need (a finer size
 * only where it does clearly better than the catalogue's). Each is judged
 * by the size of what it leaves, not by a count of intervals: for each step count,
 * the size with the least kvar short of the target at a steady load (its dead bands)
 * is rehearsed over the profile with the controller's rule and delay, and the one
 * leaving the least kvarh short of the target plus leading wins (ties: fewer steps).
 * Leading counts as much as short: many tariffs bill or refuse a leading power factor,
 * and it raises the voltage (common practice, no source). Where no size closes up to
 * the need, the sizing keeps the catalogue steps and says so (`reaches`).
 */
import type { Board } from '../board/boardModel.js';
import type { SwitchedStep } from './bankController.js';
import { percentilesOf } from './intervalStatistics.js';
import type { IntervalFigures } from './solveBatch.js';

export interface StepSizing {
  readonly steps: readonly SwitchedStep[];
  /** Need at the cover percentile, kvar, per channel. */
  readonly needKvar: Readonly<Record<string, number>>;
  /**
   * Per channel with a need: whether the controller's rule closes enough of these steps to reach the target
   * at that need (false: no step size tried lets the last step close; the steps are the catalogue ones).
   */
  readonly reaches: Readonly<Record<string, boolean>>;
  /** Per channel sized with fewer steps than `stepCount` allows, why; channels with every step allowed are absent. */
  readonly fewerSteps: Readonly<Record<string, FewerStepsReason>>;
}

/**
 * Why fewer steps than allowed: 'need-covered', that many of the catalogue size cover the need (or none
 * closes up to it); 'rehearsed', the controller rehearsed on the profile left less short and less leading
 * with fewer, larger steps; 'catalogue', more, finer steps did better, but by less than FINER_GRID_GAIN.
 */
export type FewerStepsReason = 'need-covered' | 'rehearsed' | 'catalogue';

const roundUp = (x: number, unit: number) => Math.ceil(x / unit - 1e-9) * unit;

/** A step grid: sizes from `smallest` up in multiples of `unit`, kvar. */
interface StepGrid {
  readonly unit: number;
  readonly smallest: number;
}

/** Catalogue grid first, then the finer one (see the module comment). */
const THREE_PHASE_GRIDS: readonly StepGrid[] = [
  { unit: 2.5, smallest: 2.5 },
  { unit: 0.5, smallest: 1 },
];
const SINGLE_PHASE_GRIDS: readonly StepGrid[] = [{ unit: 0.5, smallest: 0.5 }];

/**
 * Steps the controller closes at a steady `need` (kvar) with `count` steps of `each`: one more while the need
 * left exceeds the response threshold (bankController's rule), and whether they reach the need without
 * leaving it over-corrected past that threshold (which would switch a step straight back out).
 */
export function closesToTarget(need: number, each: number, count: number, responseShare: number): boolean {
  const threshold = responseShare * each;
  let closed = 0;
  while (closed < count && need - closed * each > threshold) closed++;
  const left = need - closed * each;
  return left <= 1e-9 * Math.max(1, need) && left >= -threshold;
}

/**
 * The needs of one channel, sorted, with running sums: what the score of a candidate is read from without a
 * pass over every interval. `q` is the channel's lagging kvar in each interval, for the leading part.
 */
interface NeedTable {
  /** Every interval's need, kvar: negative where the PF is past the target already. */
  readonly needs: Float64Array;
  readonly q: Float64Array;
  /** The positive needs, ascending, and their running sums (sums[k] = the first k added). */
  readonly sorted: Float64Array;
  readonly sums: Float64Array;
}

function needTable(needs: Float64Array, q: Float64Array): NeedTable {
  const sorted = needs.filter((x) => x > 0).sort();
  const sums = new Float64Array(sorted.length + 1);
  for (let k = 0; k < sorted.length; k++) sums[k + 1] = sums[k]! + sorted[k]!;
  return { needs, q, sorted, sums };
}

/** How many of the sorted needs are at most x. */
function countUpTo(sorted: Float64Array, x: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid]! <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}


/**
 * The kvar·intervals the controller's rule leaves short of the target with `count` steps of `each`, each interval
 * taken from no step in: where the need left is under the threshold (no step closes for it) and where every
 * step is in. Exact, from the sorted needs: the rule closes j steps for needs in ((j − 1 + r)·each, (j + r)·each].
 */
function kvarShort(t: NeedTable, each: number, count: number, r: number): number {
  let short = 0;
  for (let j = 0; j <= count; j++) {
    const lo = Math.max(j === 0 ? 0 : (j - 1 + r) * each, j * each);
    const hi = j === count ? Number.POSITIVE_INFINITY : (j + r) * each;
    if (hi <= lo) continue;
    const a = countUpTo(t.sorted, lo);
    const b = hi === Number.POSITIVE_INFINITY ? t.sorted.length : countUpTo(t.sorted, hi);
    if (b > a) short += t.sums[b]! - t.sums[a]! - j * each * (b - a);
  }
  return short;
}

/**
 * The controller rehearsed on a channel's needs alone (no voltage change, no discharge wait): from no step in,
 * each interval it moves one step at a time, a move every `delayShare` of an interval (0: it settles at once),
 * closing while the need left exceeds the threshold and opening while the board is over-corrected past it.
 * Returns the kvar·intervals left short of the target plus those leading (more capacitance in than the lagging
 * kvar), each state weighted by the share of the interval it holds: what a size is judged by.
 */
function rehearsedShortfall(t: NeedTable, each: number, count: number, r: number, delayShare: number): number {
  const threshold = r * each;
  const movesCap = delayShare > 0 ? Math.floor(1 / delayShare + 1e-9) : 2 * count;
  let k = 0;
  let score = 0;
  for (let i = 0; i < t.needs.length; i++) {
    const need = t.needs[i]!;
    const q = t.q[i]!;
    let elapsed = 0;
    for (let moves = 0; ; moves++) {
      const left = need - k * each;
      const wants = left > threshold && k < count ? 1 : left < -threshold && k > 0 ? -1 : 0;
      // The state holds until the next move falls due, or to the interval's end when none does in it.
      const last = wants === 0 || moves >= movesCap || elapsed + delayShare > 1 + 1e-9;
      const holds = last ? 1 - elapsed : delayShare;
      if (left > 0) score += holds * left;
      const over = k * each - q;
      if (over > 0) score += holds * over;
      if (last) break;
      elapsed += holds;
      k += wants;
    }
  }
  return score;
}

/**
 * A size off the catalogue grid is taken only where it leaves at most this share of the best catalogue
 * size's kvarh short and leading: a catalogue unit is the one to buy, and a size just above the need has no
 * margin for a sagging voltage (a step's output goes as V²) (common practice, no source).
 */
const FINER_GRID_GAIN = 0.9;

/**
 * Equal steps covering `need` (the cover percentile of the needs): at most `most`, no more than the need calls
 * for. The catalogue size with the most steps where the controller closes them up to the need; else, of the
 * sizes on the grids whose steps it does close up to it, the one the rehearsed controller leaves least short
 * of the target and least leading over the profile (rehearsedShortfall; ties: fewer steps), the catalogue's
 * unless a finer size is clearly better (FINER_GRID_GAIN). Only the size with the least kvar short at a steady
 * load is rehearsed for each grid and step count; where no size closes up to the need, the catalogue size, flagged.
 */
function equalSteps(need: number, table: NeedTable, most: number, grids: readonly StepGrid[], responseShare: number, delayShare: number): { each: number; count: number; reaches: boolean; why: FewerStepsReason } {
  const countFor = (each: number) => Math.min(most, Math.max(1, Math.ceil(need / each - 1e-9)));
  const first = Math.max(grids[0]!.smallest, roundUp(need / most, grids[0]!.unit));
  if (closesToTarget(need, first, countFor(first), responseShare)) return { each: first, count: countFor(first), reaches: true, why: 'need-covered' };
  // Per grid and step count, the size whose dead bands leave the least short at a steady load.
  const shortlist = new Map<string, { each: number; count: number; grid: number; short: number }>();
  grids.forEach((grid, g) => {
    // From the finest size that covers the need in `most` steps up to one step covering it all.
    for (let each = Math.max(grid.smallest, roundUp(need / most, grid.unit)); ; each += grid.unit) {
      const count = countFor(each);
      if (count * each >= need - 1e-9 && closesToTarget(need, each, count, responseShare)) {
        const short = kvarShort(table, each, count, responseShare);
        const key = `${g}|${count}`;
        const held = shortlist.get(key);
        if (!held || short < held.short) shortlist.set(key, { each, count, grid: g, short });
      }
      if (count === 1 && each >= need) break;
    }
  });
  // The best of each grid, then the catalogue's unless the finer grid's is clearly better.
  const best = grids.map(() => null as { each: number; count: number; score: number } | null);
  for (const c of shortlist.values()) {
    const score = rehearsedShortfall(table, c.each, c.count, responseShare, delayShare);
    const held = best[c.grid];
    const tie = held !== null && held !== undefined && Math.abs(score - held.score) <= 1e-9 * Math.max(1, held.score);
    if (!held || (tie ? c.count < held.count : score < held.score)) best[c.grid] = { each: c.each, count: c.count, score };
  }
  const catalogue = best[0] ?? null;
  const finer = best.slice(1).find((b) => b !== null) ?? null;
  const chosen = catalogue && (!finer || finer.score >= FINER_GRID_GAIN * catalogue.score) ? catalogue : finer;
  if (!chosen) return { each: first, count: countFor(first), reaches: false, why: 'need-covered' };
  // Fewer steps than allowed because more of them did worse, or because the better ones were off the catalogue.
  const moreDidBetter = finer !== null && chosen === catalogue && finer.count > chosen.count && finer.score < chosen.score;
  return { each: chosen.each, count: chosen.count, reaches: true, why: moreDidBetter ? 'catalogue' : 'rehearsed' };
}

export function sizeBankSteps(
  board: Board,
  before: IntervalFigures,
  options: { readonly targetPf: number; readonly coverShare: number; readonly stepCount: number; readonly perPhase: boolean; readonly responseShare: number; readonly delayShare?: number },
): StepSizing {
  const tan = Math.tan(Math.acos(options.targetPf));
  const n = before.count;
  let table = needTable(new Float64Array(0), new Float64Array(0));
  const needOf = (pick: (i: number) => [number, number]) => {
    const needs = new Float64Array(n);
    const lagging = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const [w, q] = pick(i);
      needs[i] = (q - Math.max(w, 0) * tan) / 1000;
      lagging[i] = q / 1000;
    }
    table = needTable(needs, lagging);
    return Math.max(0, percentilesOf(needs, [options.coverShare])[0]!.value);
  };
  const steps: SwitchedStep[] = [];
  const needKvar: Record<string, number> = {};
  const reaches: Record<string, boolean> = {};
  const fewerSteps: Record<string, FewerStepsReason> = {};
  if (options.perPhase && board.hasNeutral) {
    board.phases.forEach((p, k) => {
      const need = needOf((i) => [before.phaseW[k]![i]!, before.phaseVar[k]![i]!]);
      needKvar[p] = need;
      if (need <= 0) return;
      const { each, count, reaches: closes, why } = equalSteps(need, table, options.stepCount, SINGLE_PHASE_GRIDS, options.responseShare, options.delayShare ?? 1);
      reaches[p] = closes;
      if (count < options.stepCount) fewerSteps[p] = why;
      for (let s = 0; s < count; s++) steps.push({ kvar: each, channel: p });
    });
  } else {
    const need = needOf((i) => {
      let w = 0;
      let q = 0;
      for (let k = 0; k < board.phases.length; k++) {
        w += before.phaseW[k]![i]!;
        q += before.phaseVar[k]![i]!;
      }
      return [w, q];
    });
    needKvar.ABC = need;
    if (need > 0) {
      const { each, count, reaches: closes, why } = equalSteps(need, table, options.stepCount, THREE_PHASE_GRIDS, options.responseShare, options.delayShare ?? 1);
      reaches.ABC = closes;
      if (count < options.stepCount) fewerSteps.ABC = why;
      for (let s = 0; s < count; s++) steps.push({ kvar: each, channel: 'ABC' });
    }
  }
  return { steps, needKvar, reaches, fewerSteps };
}
