/**
 * A stronger lower bound for built-in scores that add terms over several
 * measured boards (installations): the score is, per condition, a sum of one
 * term per board incomer, then the worst or weighted condition. Each term
 * reads only the circuits under its board; where those are few, the term's
 * true minimum over every placing of them (enumerated) replaces its polygon
 * bound. The polygon bound lets circuits split between phases, which on a
 * floor board of three circuits promises a balance no whole placing reaches;
 * enumeration does not. Valid because each term is at least its own minimum
 * and the combination never falls when a term grows. The move limit is
 * ignored here (a minimum over more placings is still a lower bound).
 */
import { contributionOffset, type AssignmentProblem } from './assignmentProblem.js';
import { builtInMagnitudeScore, combineConditionScores, conditionWeight, type AimWeights, type ConditionLayout } from './rebalanceObjective.js';

/** Largest number of placings enumerated for one term (3^11: a few ms). */
const MAX_PLACINGS = 177_147;

/**
 * @returns a function of the polygon magnitude bounds giving the decomposed bound,
 *   or null when no term is small enough to enumerate (or there is only one term).
 */
export function termBoundFor(p: AssignmentProblem, layouts: readonly ConditionLayout[], aim: AimWeights, combine: 'worst' | 'weighted'): ((bounds: Float64Array) => number) | null {
  if (layouts.length === new Set(layouts.map((l) => l.condition)).size) return null; // one board measured: nothing to add up
  const terms = layouts.map((layout) => {
    const rows = [...layout.lines, layout.neutral, layout.negative].filter((j) => j >= 0);
    const slots: number[] = [];
    for (let i = 0; i < p.circuitCount; i++) {
      let touches = false;
      for (let k = 0; k < p.optionCounts[i]! && !touches; k++)
        for (const j of rows) if (p.contributions[contributionOffset(p, i, k) + 2 * j] !== 0 || p.contributions[contributionOffset(p, i, k) + 2 * j + 1] !== 0) touches = true;
      if (touches) slots.push(i);
    }
    const placings = slots.reduce((n, i) => n * p.optionCounts[i]!, 1);
    return { layout, rows, slots, placings, score: builtInMagnitudeScore(aim, 'worst', [layout]) };
  });
  if (!terms.some((t) => t.placings <= MAX_PLACINGS)) return null;
  const totalWeight = conditionWeight(layouts);

  /** Least value of one term over every placing of its circuits, other magnitudes at their bounds. */
  const exactMinimum = (t: (typeof terms)[number], bounds: Float64Array): number => {
    const m = Float64Array.from(bounds);
    const sums = new Float64Array(2 * t.rows.length);
    t.rows.forEach((j, r) => {
      sums[2 * r] = p.base[2 * j]!;
      sums[2 * r + 1] = p.base[2 * j + 1]!;
    });
    let least = Infinity;
    const walk = (depth: number) => {
      if (depth === t.slots.length) {
        t.rows.forEach((j, r) => (m[j] = Math.sqrt(sums[2 * r]! ** 2 + sums[2 * r + 1]! ** 2)));
        least = Math.min(least, t.score(m));
        return;
      }
      const i = t.slots[depth]!;
      for (let k = 0; k < p.optionCounts[i]!; k++) {
        const at = contributionOffset(p, i, k);
        t.rows.forEach((j, r) => {
          sums[2 * r]! += p.contributions[at + 2 * j]!;
          sums[2 * r + 1]! += p.contributions[at + 2 * j + 1]!;
        });
        walk(depth + 1);
        t.rows.forEach((j, r) => {
          sums[2 * r]! -= p.contributions[at + 2 * j]!;
          sums[2 * r + 1]! -= p.contributions[at + 2 * j + 1]!;
        });
      }
    };
    walk(0);
    return least;
  };

  return (bounds) => {
    const perCondition = new Map<number, number>();
    for (const t of terms) {
      const polygon = t.score(bounds);
      const value = t.placings <= MAX_PLACINGS ? Math.max(polygon, exactMinimum(t, bounds)) : polygon;
      perCondition.set(t.layout.condition, (perCondition.get(t.layout.condition) ?? 0) + value);
    }
    return combineConditionScores(perCondition, layouts, totalWeight, combine);
  };
}
