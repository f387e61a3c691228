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
 * takes, of every size on the catalogue grid and a finer one (three-phase units
 * from 1 kvar in 0.5 kvar steps, which catalogues also list; common practice, no
 * source) whose steps the controller's own rule closes up to the sized need, the
 * one that by that rule leaves the fewest intervals short of the target (ties:
 * fewer steps); where none does, it keeps the catalogue steps and says so (`reaches`).
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
}

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

/** Intervals whose need (kvar) the controller's rule leaves short with `count` steps of `each`: the shortfall the sizing weighs candidates by. */
function intervalsShort(needs: Float64Array, each: number, count: number, responseShare: number): number {
  let short = 0;
  for (const need of needs) if (need > 0 && !closesToTarget(need, each, count, responseShare)) short++;
  return short;
}

/**
 * Equal steps covering `need` (the cover percentile of `needs`): at most `most`, no more than the need calls
 * for. The catalogue size with the most steps where the controller closes them up to the need; else, of every
 * size on the grids whose steps it does close up to it, the one leaving the fewest intervals short (ties: fewer
 * steps); where none does, the catalogue size, flagged.
 */
function equalSteps(need: number, needs: Float64Array, most: number, grids: readonly StepGrid[], responseShare: number): { each: number; count: number; reaches: boolean } {
  const countFor = (each: number) => Math.min(most, Math.max(1, Math.ceil(need / each - 1e-9)));
  const first = Math.max(grids[0]!.smallest, roundUp(need / most, grids[0]!.unit));
  if (closesToTarget(need, first, countFor(first), responseShare)) return { each: first, count: countFor(first), reaches: true };
  let best: { each: number; count: number; short: number } | null = null;
  for (const grid of grids) {
    // From the finest size that covers the need in `most` steps up to one step covering it all.
    for (let each = Math.max(grid.smallest, roundUp(need / most, grid.unit)); ; each += grid.unit) {
      const count = countFor(each);
      if (count * each >= need - 1e-9 && closesToTarget(need, each, count, responseShare)) {
        const short = intervalsShort(needs, each, count, responseShare);
        if (!best || short < best.short || (short === best.short && count < best.count)) best = { each, count, short };
      }
      if (count === 1 && each >= need) break;
    }
  }
  return best ? { each: best.each, count: best.count, reaches: true } : { each: first, count: countFor(first), reaches: false };
}

export function sizeBankSteps(
  board: Board,
  before: IntervalFigures,
  options: { readonly targetPf: number; readonly coverShare: number; readonly stepCount: number; readonly perPhase: boolean; readonly responseShare: number },
): StepSizing {
  const tan = Math.tan(Math.acos(options.targetPf));
  const n = before.count;
  let needs = new Float64Array(0);
  const needOf = (pick: (i: number) => [number, number]) => {
    needs = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const [w, q] = pick(i);
      needs[i] = Math.max(0, q - Math.max(w, 0) * tan) / 1000;
    }
    return percentilesOf(needs, [options.coverShare])[0]!.value;
  };
  const steps: SwitchedStep[] = [];
  const needKvar: Record<string, number> = {};
  const reaches: Record<string, boolean> = {};
  if (options.perPhase && board.hasNeutral) {
    board.phases.forEach((p, k) => {
      const need = needOf((i) => [before.phaseW[k]![i]!, before.phaseVar[k]![i]!]);
      needKvar[p] = need;
      if (need <= 0) return;
      const { each, count, reaches: closes } = equalSteps(need, needs, options.stepCount, SINGLE_PHASE_GRIDS, options.responseShare);
      reaches[p] = closes;
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
      const { each, count, reaches: closes } = equalSteps(need, needs, options.stepCount, THREE_PHASE_GRIDS, options.responseShare);
      reaches.ABC = closes;
      for (let s = 0; s < count; s++) steps.push({ kvar: each, channel: 'ABC' });
    }
  }
  return { steps, needKvar, reaches };
}
