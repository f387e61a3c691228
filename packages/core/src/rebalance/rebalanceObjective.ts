/**
 * Scores: the figures of each load condition from the quantity magnitudes, the
 * built-in weighted score, and the adapter for a caller's own objective. Every
 * score here is non-decreasing in each magnitude, which the bounds rely on.
 */
import { InputError, inputIssue } from '../errors.js';
import type { AimFigure } from './rebalanceSpec.js';

/** Where the quantities of one condition at one measured board sit in the problem's quantity list. */
export interface ConditionLayout {
  /** The condition's name. */
  readonly name: string;
  /** The board whose incomer the quantities are read at. */
  readonly board: string;
  /** Index of the condition (layouts of one condition share it). */
  readonly condition: number;
  readonly weight: number;
  /** Quantity index of each line current, in the board's phase order. */
  readonly lines: readonly number[];
  /** Quantity index of the neutral current, or −1 (no neutral). */
  readonly neutral: number;
  /** Quantity index of the negative-sequence current, or −1 (not three-phase). */
  readonly negative: number;
  /** Quantity index of the negative-sequence board voltage, or −1 (not asked for). */
  readonly voltageNegative: number;
  /**
   * The part of the line currents no assignment changes, A: |I1| on a
   * three-phase board, |I_A − I_B|/2 on a split-phase board (both fixed by the
   * total complex power on a stiff supply). The mean square of the line
   * currents is this squared plus the squares of the parts that do change
   * (Parseval), so the largest line current is at least the root of that sum.
   */
  readonly balancedA: number;
  /** Multiplier taking |I_N| to its share of that sum: 1/3 (I0) on three-phase, 1/2 on split-phase. */
  readonly neutralShare: number;
  /** |I1|, A (the current-unbalance denominator); 0 when not three-phase. */
  readonly positiveA: number;
  /** |V1| at the board in the scoring model, V. */
  readonly positiveV: number;
}

/**
 * The figures of one condition at one board's incomer that a score may weigh;
 * null where the board has no such figure. On an installation a score sees one
 * entry per condition and measured board.
 */
export interface ConditionFigures {
  /** The condition's name. */
  readonly name: string;
  /** The board whose incomer these figures are read at. */
  readonly board: string;
  /** Line current magnitudes, A, in the board's phase order. */
  readonly lineA: readonly number[];
  readonly largestLineA: number;
  readonly neutralA: number | null;
  /** |I2|/|I1|, %; null on a board with fewer than three lines, and in a report's figures of a board drawing no current (0/0). */
  readonly currentUnbalancePercent: number | null;
  /** |V2|/|V1| at the board, %. */
  readonly voltageUnbalancePercent: number | null;
  /**
   * NEMA MG 1 line-voltage unbalance rate at the board, %: the largest deviation of a line-to-line voltage
   * from the mean of the three, as % of that mean (what `trivar solve` reports). Network re-solve only:
   * the fast model has no line voltages, so its figures carry null; null too on a board with fewer than
   * three lines. No built-in score weighs it.
   */
  readonly lineVoltageRatePercent: number | null;
}

/**
 * A caller's own score of the condition figures (lower is better). It must not
 * decrease when any figure grows: the search feeds it lower bounds of the
 * figures to prune, so a score that breaks this rule voids the proof (the
 * study detects some such cases and then reports no bound).
 */
export type RebalanceObjective = (conditions: readonly ConditionFigures[]) => number;

export function conditionFigures(layout: ConditionLayout, m: Float64Array): ConditionFigures {
  const lineA = layout.lines.map((j) => m[j]!);
  let largest = Math.max(...lineA);
  // A bound on each line alone can be weaker than the mean-square bound; take the stronger.
  let square = layout.balancedA ** 2;
  if (layout.neutral >= 0) square += (m[layout.neutral]! * layout.neutralShare) ** 2;
  if (layout.negative >= 0) square += m[layout.negative]! ** 2;
  largest = Math.max(largest, Math.sqrt(square));
  return {
    name: layout.name,
    board: layout.board,
    lineA,
    largestLineA: largest,
    neutralA: layout.neutral >= 0 ? m[layout.neutral]! : null,
    currentUnbalancePercent: layout.negative >= 0 ? (100 * m[layout.negative]!) / Math.max(layout.positiveA, 1e-12) : null,
    voltageUnbalancePercent: layout.voltageNegative >= 0 ? (100 * m[layout.voltageNegative]!) / Math.max(layout.positiveV, 1e-12) : null,
    lineVoltageRatePercent: null,
  };
}

export type AimWeights = Readonly<Record<AimFigure, number>>;

function figureValue(f: ConditionFigures, figure: AimFigure): number {
  switch (figure) {
    case 'largestLine':
      return f.largestLineA;
    case 'neutral':
      return f.neutralA ?? 0;
    case 'currentUnbalance':
      return f.currentUnbalancePercent ?? 0;
    case 'voltageUnbalance':
      return f.voltageUnbalancePercent ?? 0;
  }
}

/** Weighted sum of the aimed figures of one condition. */
export function conditionScore(f: ConditionFigures, aim: AimWeights): number {
  let s = 0;
  for (const figure of Object.keys(aim) as AimFigure[]) if (aim[figure] > 0) s += aim[figure] * figureValue(f, figure);
  return s;
}

/** Total weight of the conditions (each counted once, however many boards are measured). */
export const conditionWeight = (layouts: readonly ConditionLayout[]) =>
  layouts.reduce((s, l, k) => (k === 0 || layouts[k - 1]!.condition !== l.condition ? s + l.weight : s), 0);

/** Per-condition scores → the worst condition, or the mean weighted by each condition's weight. */
export function combineConditionScores(
  perCondition: ReadonlyMap<number, number>,
  layouts: readonly ConditionLayout[],
  totalWeight: number,
  combine: 'worst' | 'weighted',
): number {
  let worst = 0;
  let mean = 0;
  for (const [c, s] of perCondition) {
    worst = Math.max(worst, s);
    mean += (layouts.find((l) => l.condition === c)!.weight * s) / totalWeight;
  }
  return combine === 'worst' ? worst : mean;
}

/**
 * The built-in score: per condition the weighted figures, added over the measured
 * boards, then the worst condition or the weighted mean of conditions.
 */
export function builtInObjective(aim: AimWeights, combine: 'worst' | 'weighted', layouts: readonly ConditionLayout[]): RebalanceObjective {
  const totalWeight = conditionWeight(layouts);
  return (figures) => {
    const perCondition = new Map<number, number>();
    figures.forEach((f, k) => perCondition.set(layouts[k]!.condition, (perCondition.get(layouts[k]!.condition) ?? 0) + conditionScore(f, aim)));
    return combineConditionScores(perCondition, layouts, totalWeight, combine);
  };
}

/** A figure set as the caller's score sees it: a copy, frozen, so a score that writes into it changes nothing of ours. */
function frozenFigures(f: ConditionFigures): ConditionFigures {
  return Object.freeze({ ...f, lineA: Object.freeze([...f.lineA]) });
}

/**
 * A caller's objective as the study calls it: on frozen copies of the figures, its score checked. A score
 * that is not a finite number (NaN, a string, ±Infinity) would compare false with every other, and the
 * search would keep whatever it met first and call it proven: refused instead.
 * @throws {InputError} at `objective` when a score is not a finite number
 */
export function guardedObjective(objective: RebalanceObjective): RebalanceObjective {
  return (figures) => {
    const score: unknown = objective(Object.freeze(figures.map(frozenFigures)));
    if (typeof score === 'number' && Number.isFinite(score)) return score;
    throw new InputError(
      [inputIssue('invalid_score', 'objective', 'a finite number from the objective for every set of condition figures (lower is better)', score)],
      'rebalanceBoard options are not valid',
    );
  };
}

/** The magnitude-level score the searches call. */
export function magnitudeScore(objective: RebalanceObjective, layouts: readonly ConditionLayout[]): (m: Float64Array) => number {
  return (m) => objective(layouts.map((l) => conditionFigures(l, m)));
}

/**
 * The built-in score straight from the magnitudes, without building figure
 * objects: the exact search calls it at every node. Same value as
 * `magnitudeScore(builtInObjective(...))` (a test holds them together).
 */
export function builtInMagnitudeScore(aim: AimWeights, combine: 'worst' | 'weighted', layouts: readonly ConditionLayout[]): (m: Float64Array) => number {
  const totalWeight = conditionWeight(layouts);
  const wLine = aim.largestLine;
  const wNeutral = aim.neutral;
  const wCurrent = aim.currentUnbalance;
  const wVoltage = aim.voltageUnbalance;
  const plan = layouts.map((l, k) => ({
    lines: Int32Array.from(l.lines),
    neutral: l.neutral,
    negative: l.negative,
    voltageNegative: l.voltageNegative,
    balancedSquare: l.balancedA ** 2,
    neutralShare: l.neutralShare,
    perCurrent: 100 / Math.max(l.positiveA, 1e-12),
    perVoltage: 100 / Math.max(l.positiveV, 1e-12),
    share: l.weight / totalWeight,
    // Layouts of one condition are adjacent; the last one closes the condition's sum.
    closes: k + 1 === layouts.length || layouts[k + 1]!.condition !== l.condition,
  }));
  return (m) => {
    let worst = 0;
    let mean = 0;
    let s = 0;
    for (let k = 0; k < plan.length; k++) {
      const c = plan[k]!;
      const neutral = c.neutral >= 0 ? m[c.neutral]! : 0;
      const negative = c.negative >= 0 ? m[c.negative]! : 0;
      if (wLine > 0) {
        let largest = 0;
        for (let t = 0; t < c.lines.length; t++) largest = Math.max(largest, m[c.lines[t]!]!);
        const ns = neutral * c.neutralShare;
        largest = Math.max(largest, Math.sqrt(c.balancedSquare + ns * ns + negative * negative));
        s += wLine * largest;
      }
      if (wNeutral > 0) s += wNeutral * neutral;
      if (wCurrent > 0) s += wCurrent * negative * c.perCurrent;
      if (wVoltage > 0 && c.voltageNegative >= 0) s += wVoltage * m[c.voltageNegative]! * c.perVoltage;
      if (!c.closes) continue;
      if (s > worst) worst = s;
      mean += c.share * s;
      s = 0;
    }
    return combine === 'worst' ? worst : mean;
  };
}
