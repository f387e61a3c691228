/**
 * The search behind `selectBankUnits` for one branch: every build of one unit
 * type (a fixed count plus k units per step in the pattern's ratios), the best
 * switching state of each, and the choice among them.
 */
import type { CapacitorUnitSpec } from '../correctionSpec.js';
import { CORRECTION_DEFAULTS } from '../correctionDefaults.js';
import { unitCapacitanceF } from '../capacitorOutput.js';

export interface UsableUnit {
  readonly unit: CapacitorUnitSpec;
  /** Index in the user catalogue; null for a typical unit. */
  readonly index: number | null;
}

export interface Candidate {
  readonly unit: CapacitorUnitSpec;
  readonly index: number | null;
  readonly fixedUnits: number;
  readonly stepBase: number;
  readonly stepsOn: readonly boolean[];
  readonly designF: number;
  readonly installedKvar: number;
  readonly units: number;
  readonly tier: number;
}

/** What a branch's design state should reach, F (capacitance). Null bounds are unknown. */
export interface Need {
  /** The sizing's requirement. */
  readonly nominalF: number;
  /** Requirement / (1 − tol⁻): met even with the lowest capacitance. */
  readonly minF: number;
  /** Limit / (1 + tol⁺): no line leads even with the highest capacitance. */
  readonly maxF: number | null;
  /** The limit itself (nominal capacitance). */
  readonly limitF: number | null;
  readonly fixedMaxF: number;
}

/**
 * How well a design state fits, best first:
 * 0 target at −tol and no lead at +tol; 1 target at nominal, no lead at +tol;
 * 2 target at nominal, no lead at nominal; 3 short of the target but no lead
 * at +tol; 4 short of the target, no lead at nominal; 5 past the limit;
 * 6 short of the target where no limit is known. Never leading comes before
 * reaching the target.
 */
export function tierOf(designF: number, need: Need): number {
  const eps = 1e-12 * Math.max(need.nominalF, 1e-30);
  const underMax = need.maxF === null || designF <= need.maxF + eps;
  const underLimit = need.limitF === null || designF <= need.limitF + eps;
  if (designF >= need.minF - eps && underMax) return 0;
  if (designF >= need.nominalF - eps && underMax) return 1;
  if (designF >= need.nominalF - eps && underLimit) return 2;
  if (need.maxF !== null && underMax) return 3;
  if (need.limitF !== null && underLimit) return 4;
  if (need.limitF !== null) return 5;
  return 6;
}

/** Short of the target (tiers 3, 4, 6) the largest state is best; otherwise the smallest that does the job. */
export const shortOfTarget = (tier: number) => tier === 3 || tier === 4 || tier === 6;
const tieBreak = (tier: number, designF: number) => (shortOfTarget(tier) ? -designF : designF);

/** The best switching state of a bank with these fixed and step capacitances. */
function bestState(multipliers: readonly number[], stepF: number, fixedF: number, need: Need): { on: boolean[]; designF: number; tier: number } {
  let best: { on: boolean[]; designF: number; tier: number } | null = null;
  for (let mask = 0; mask < 1 << multipliers.length; mask++) {
    const on = multipliers.map((_, i) => (mask & (1 << i)) !== 0);
    const designF = fixedF + stepF * multipliers.reduce((sum, m, i) => sum + (on[i] ? m : 0), 0);
    const tier = tierOf(designF, need);
    if (!best || tier < best.tier || (tier === best.tier && tieBreak(tier, designF) < tieBreak(tier, best.designF))) best = { on, designF, tier };
  }
  return best!;
}

/**
 * Best tier first. Short of the target (tiers 3, 4, 6) the largest design
 * matters most, past the limit (5) the smallest: builds within 1 % of that count
 * as equal. Then installed kvar within the slack of the least counts as equal,
 * then fewer units, then the finer step.
 */
function pickBest(candidates: readonly Candidate[]): Candidate | null {
  if (!candidates.length) return null;
  const tier = Math.min(...candidates.map((c) => c.tier));
  let pool = candidates.filter((c) => c.tier === tier);
  if (shortOfTarget(tier)) {
    const largest = Math.max(...pool.map((c) => c.designF));
    pool = pool.filter((c) => c.designF >= 0.99 * largest);
  } else if (tier === 5) {
    const smallest = Math.min(...pool.map((c) => c.designF));
    pool = pool.filter((c) => c.designF <= 1.01 * smallest);
  }
  const least = Math.min(...pool.map((c) => c.installedKvar));
  const near = pool.filter((c) => c.installedKvar <= least * (1 + CORRECTION_DEFAULTS.selectionKvarSlackPercent / 100) + 1e-12);
  const stepF = (c: Candidate) => c.stepBase * unitCapacitanceF(c.unit);
  return near.reduce((best, c) => {
    if (c.units !== best.units) return c.units < best.units ? c : best;
    if (Math.abs(c.installedKvar - best.installedKvar) > 1e-9 * least) return c.installedKvar < best.installedKvar ? c : best;
    return stepF(c) < stepF(best) ? c : best;
  });
}

export function candidatesFor(usable: readonly UsableUnit[], multipliers: readonly number[], need: Need, maxUnits: number): Candidate | null {
  const stepSum = multipliers.reduce((a, b) => a + b, 0);
  const all: Candidate[] = [];
  // Building nothing is a candidate too: better than a single unit that makes a line lead.
  const first = usable[0]!;
  all.push({ unit: first.unit, index: first.index, fixedUnits: 0, stepBase: 0, stepsOn: multipliers.map(() => false), designF: 0, installedKvar: 0, units: 0, tier: tierOf(0, need) });
  for (const { unit, index } of usable) {
    const cu = unitCapacitanceF(unit);
    const add = (fixedUnits: number, stepBase: number) => {
      const units = fixedUnits + stepBase * stepSum;
      if (units < 1 || units > maxUnits) return;
      const state = bestState(multipliers, stepBase * cu, fixedUnits * cu, need);
      all.push({ unit, index, fixedUnits, stepBase, stepsOn: state.on, designF: state.designF, installedKvar: units * unit.ratedKvar, units, tier: state.tier });
    };
    // Unit counts that reach each end of the window, and the one just below the limit.
    const counts = (f: number | null, perCount: number) => (f === null ? [] : [Math.ceil(f / perCount - 1e-9), Math.floor(f / perCount + 1e-9)]);
    if (stepSum === 0) {
      for (const n of new Set([...counts(need.minF, cu), ...counts(need.nominalF, cu), ...counts(need.maxF, cu), ...counts(need.limitF, cu)])) add(n, 0);
      continue;
    }
    const fixedMax = Math.min(maxUnits, Math.floor(need.fixedMaxF / cu + 1e-9));
    for (let j = 0; j <= fixedMax; j++) {
      const rest = (f: number | null) => (f === null ? null : Math.max(0, f - j * cu));
      const ks = new Set(
        [rest(need.minF), rest(need.nominalF), rest(need.maxF), rest(need.limitF)].flatMap((f) => counts(f, stepSum * cu)).filter((k) => k >= 0),
      );
      for (const k of ks) add(j, k);
    }
  }
  return pickBest(all);
}
