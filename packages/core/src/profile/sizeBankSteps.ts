/**
 * Steps of an automatic bank sized from the profile: the bank holds the target
 * power factor in `coverShare` of the intervals (the need at that percentile of
 * the intervals), split into at most `stepCount` equal steps. Three-phase steps
 * are rounded up to 2.5 kvar and single-phase steps to 0.5 kvar, the granularity
 * of common catalogue units (common practice, no source). A small need takes
 * fewer steps: six 2.5 kvar steps for a 3.3 kvar need would install 15 kvar, far
 * past what the board ever asks for, so the count stops where the steps cover the need.
 */
import type { Board } from '../board/boardModel.js';
import type { SwitchedStep } from './bankController.js';
import { percentilesOf } from './intervalStatistics.js';
import type { IntervalFigures } from './solveBatch.js';

export interface StepSizing {
  readonly steps: readonly SwitchedStep[];
  /** Need at the cover percentile, kvar, per channel. */
  readonly needKvar: Readonly<Record<string, number>>;
}

const roundUp = (x: number, unit: number) => Math.ceil(x / unit - 1e-9) * unit;

/** Equal steps of at least `unit` (rounded up to it) covering `need`: at most `most` of them, no more than the need calls for. */
function equalSteps(need: number, most: number, unit: number): { each: number; count: number } {
  const each = Math.max(unit, roundUp(need / most, unit));
  return { each, count: Math.min(most, Math.max(1, Math.ceil(need / each - 1e-9))) };
}

export function sizeBankSteps(
  board: Board,
  before: IntervalFigures,
  options: { readonly targetPf: number; readonly coverShare: number; readonly stepCount: number; readonly perPhase: boolean },
): StepSizing {
  const tan = Math.tan(Math.acos(options.targetPf));
  const n = before.count;
  const needOf = (pick: (i: number) => [number, number]) => {
    const need = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const [w, q] = pick(i);
      need[i] = Math.max(0, q - Math.max(w, 0) * tan) / 1000;
    }
    return percentilesOf(need, [options.coverShare])[0]!.value;
  };
  const steps: SwitchedStep[] = [];
  const needKvar: Record<string, number> = {};
  if (options.perPhase && board.hasNeutral) {
    board.phases.forEach((p, k) => {
      const need = needOf((i) => [before.phaseW[k]![i]!, before.phaseVar[k]![i]!]);
      needKvar[p] = need;
      if (need <= 0) return;
      const { each, count } = equalSteps(need, options.stepCount, 0.5);
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
      const { each, count } = equalSteps(need, options.stepCount, 2.5);
      for (let s = 0; s < count; s++) steps.push({ kvar: each, channel: 'ABC' });
    }
  }
  return { steps, needKvar };
}
