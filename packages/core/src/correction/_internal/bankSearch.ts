/**
 * The search behind `selectBankUnits` for one set of branches: a three-phase
 * set (the three branches of a delta or star bank) gets a balanced part —
 * three-phase units, or one single-phase unit per branch — that adds the same
 * capacitance to every branch, plus optional single-phase trim units on single
 * branches; a lone branch (split-phase, single-phase) gets single-phase units.
 *
 * No build has a switched step below the least step (its nameplate below
 * `minStepKvar`, or its capacitance below `leastStepF`: the C/k a controller tells
 * from its CT's error, leastSwitchedStep.ts); the empty build is always there.
 * Each build is judged on the hardware rules (unit cap, controller outputs) and
 * per branch against the tolerance window (`tierOf`), then on a step series no
 * wider than `widestStepRatio` where one fits as well, then on
 * the stated cost (nameplate kvar + a fixed kvar-equivalent per unit; a build
 * with single-line steps ranked as if it cost `singleLineStepsKvar` more, so
 * equal steps are kept unless those save more) and the units bought, and only
 * then on how centrally it sits in its windows: a build
 * that holds the target from four units is not passed over for one of seventy
 * that sits nearer the middle of a narrow window. The study re-solves what is
 * chosen (correctBoard.ts), windows being first-order.
 */
import type { CatalogueUnit } from '../unitCatalogues.js';

/** What one branch's design state should reach, F (capacitance). Null bounds are unknown. */
export interface Need {
  /** The sizing's requirement. */
  readonly nominalF: number;
  /** Requirement / (1 − tol⁻): met even with the lowest capacitance. */
  readonly minF: number;
  /** Limit / (1 + tol⁺): no line passes its upper bound even with the highest capacitance. */
  readonly maxF: number | null;
  /** The limit itself (nominal capacitance). */
  readonly limitF: number | null;
  /** Most the fixed part may have (light load). */
  readonly fixedMaxF: number;
}

/** A unit that may be used on a set, with the capacitance it adds per branch. */
export interface UnitChoice {
  readonly unit: CatalogueUnit;
  /** Index in the user catalogue; null for a typical unit. */
  readonly index: number | null;
  /** Capacitance added to each branch it serves, F (one element). */
  readonly elementF: number;
  /** Units bought for one "count": 1 for a three-phase unit or a unit on a lone branch, 3 for single-phase units spread over three branches. */
  readonly unitsPerCount: number;
}

export interface SetRules {
  readonly unitCostKvar: number;
  /** Added to the cost of a build with trims when ranking (not to its cost): what equal steps are kept for. 0 on a lone branch. */
  readonly singleLineStepsKvar: number;
  /** Fewest equal switched steps wanted, where outputs and the minimum step allow. */
  readonly minSwitchedSteps: number;
  /** Least nameplate of a switched step, kvar. */
  readonly minStepKvar: number;
  /** Least capacitance per branch of a switched step, F: a balanced step's on each branch, and a trim's on each branch (0: none). */
  readonly leastStepF: { readonly balanced: number; readonly trims: readonly number[] };
  /** C/k per farad per branch, A/F: of a balanced step, and of a trim on each branch (the step series' measure). */
  readonly ckPerF: { readonly balanced: number; readonly trims: readonly number[] };
  /** Widest largest/smallest C/k of the switched steps a build is ranked to keep within. */
  readonly widestStepRatio: number;
  /** Controller outputs available to this set. */
  readonly outputs: number;
  readonly maxUnitsPerBranch: number;
}

export interface TrimBuild {
  readonly branch: number;
  readonly choice: UnitChoice;
  readonly count: number;
}

export interface SetBuild {
  readonly balanced: { readonly choice: UnitChoice; readonly count: number; readonly fixedCount: number; readonly stepCounts: readonly number[] } | null;
  readonly trims: readonly TrimBuild[];
  /** Design-state capacitance per branch, F. */
  readonly designF: readonly number[];
  readonly fixedF: readonly number[];
  readonly tiers: readonly number[];
  /** The windows the build was judged against: the equal bank's own for an equal build, the per-branch ones otherwise. */
  readonly needs: readonly Need[];
  readonly units: number;
  readonly nameplateKvar: number;
  readonly cost: number;
  /** The cost the ranking compares: `cost`, plus `SetRules.singleLineStepsKvar` where the build has trims. */
  readonly rankedCost: number;
  /** Hardware rules broken (0 when none): outputs short, steps below the least step (never chosen), units per branch over the cap. */
  readonly violations: { readonly outputs: boolean; readonly minStep: boolean; readonly unitCap: boolean };
  /** Largest over smallest C/k of the switched steps; null with fewer than two. */
  readonly stepRatio: number | null;
  /** True when `stepRatio` is wider than `SetRules.widestStepRatio`. */
  readonly stepsWide: boolean;
  /** Equal steps short of the number wanted (0 when the bank follows the load finely enough). */
  readonly stepsShort: number;
}

/**
 * How well a design state fits, best first:
 * 0 target at −tol and within the bound at +tol; 1 target at nominal, within
 * the bound at +tol; 2 target at nominal, within the bound at nominal; 3 short
 * of the target but within the bound at +tol; 4 short of the target, within
 * the bound at nominal; 5 past the bound; 6 short of the target where no bound
 * is known. Staying within the bound (never leading) comes before the target.
 */
export function tierOf(designF: number, need: Need): number {
  const eps = 1e-9 * Math.max(need.nominalF, need.minF, 1e-30);
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

export const shortOfTarget = (tier: number) => tier === 3 || tier === 4 || tier === 6;

/** How far a branch is from where its tier wants it, per unit (0 when it meets the target within its bound). */
function miss(designF: number, need: Need, tier: number): number {
  if (shortOfTarget(tier)) return need.minF > 0 ? (need.minF - designF) / need.minF : 0;
  if (tier === 5 && need.limitF !== null) return (designF - need.limitF) / Math.max(need.limitF, need.minF, 1e-30);
  return 0;
}

/**
 * Unit counts that put `f` at each end of a window, for a unit adding `per` each
 * (a plain loop: a flatMap's array per value cost more than the rest of a pruned search).
 */
function countsNear(values: readonly (number | null)[], per: number): number[] {
  const counts: number[] = [];
  for (let i = 0; i < values.length; i++) {
    const f = values[i]!;
    if (f === null || f <= 0) continue;
    counts.push(Math.floor(f / per + 1e-9), Math.ceil(f / per - 1e-9));
  }
  return counts;
}

/**
 * Near-equal split of `count` units into the most steps the outputs allow with
 * every step at least `minStepKvar` and at least `leastCount` units; steps differ by at most one unit.
 */
export function splitSteps(count: number, kvarPerCount: number, outputs: number, minStepKvar: number, leastCount = 0): { steps: number[]; outputsShort: boolean; belowMin: boolean } {
  const below = (units: number) => units * kvarPerCount < minStepKvar - 1e-9 || units < leastCount;
  if (count === 0) return { steps: [], outputsShort: false, belowMin: false };
  if (outputs < 1) return { steps: [count], outputsShort: true, belowMin: below(count) };
  let best = 1;
  for (let s = Math.min(outputs, count); s >= 1; s--)
    if (!below(Math.floor(count / s))) {
      best = s;
      break;
    }
  const base = Math.floor(count / best);
  const extra = count - base * best;
  const steps = Array.from({ length: best }, (_, k) => base + (k < extra ? 1 : 0));
  return { steps, outputsShort: false, belowMin: below(base) };
}

/** Units of `choice` a balanced switched step needs to reach the least step's capacitance (0: no floor). */
const leastBalancedCount = (rules: SetRules, choice: UnitChoice) => (rules.leastStepF.balanced > 0 ? Math.ceil(rules.leastStepF.balanced / choice.elementF - 1e-9) : 0);

/** True when a trim of `count` × `choice` on `branch` is below the least step. */
const trimBelowLeast = (rules: SetRules, branch: number, choice: UnitChoice, count: number) =>
  count * choice.unit.ratedKvar < rules.minStepKvar - 1e-9 || count * choice.elementF < (rules.leastStepF.trims[branch] ?? 0) * (1 - 1e-9);

/** A switched step of a build: the set's branches it serves (indices in the set), capacitance per branch (F) and C/k (A). */
export interface SwitchedStep {
  readonly branches: readonly number[];
  readonly capacitanceF: number;
  readonly responseA: number;
}

/** The switched steps of a build, balanced ones first, with their C/k by the rules' measure. */
export function switchedStepsOf(build: SetBuild, rules: SetRules): SwitchedStep[] {
  const out: SwitchedStep[] = [];
  const every = build.designF.map((_, i) => i);
  if (build.balanced)
    for (const count of build.balanced.stepCounts) {
      const f = count * build.balanced.choice.elementF;
      out.push({ branches: every, capacitanceF: f, responseA: f * rules.ckPerF.balanced });
    }
  for (const t of build.trims) {
    const f = t.count * t.choice.elementF;
    out.push({ branches: [t.branch], capacitanceF: f, responseA: f * (rules.ckPerF.trims[t.branch] ?? 0) });
  }
  return out;
}

/** Largest over smallest of positive C/k values; null with fewer than two. */
function ratioOf(cks: readonly number[]): number | null {
  if (cks.length < 2) return null;
  let least = Infinity;
  let most = 0;
  for (const ck of cks) {
    least = Math.min(least, ck);
    most = Math.max(most, ck);
  }
  return least > 0 ? most / least : null;
}

function evaluate(
  needs: readonly Need[],
  rules: SetRules,
  balanced: { choice: UnitChoice; count: number } | null,
  trims: readonly TrimBuild[],
): SetBuild {
  const n = needs.length;
  const designF = needs.map(() => 0);
  const fixedF = needs.map(() => 0);
  const perBranchUnits = needs.map(() => 0);
  let units = 0;
  let nameplateKvar = 0;
  let fixedCount = 0;
  if (balanced) {
    const { choice, count } = balanced;
    for (let i = 0; i < n; i++) {
      designF[i] = count * choice.elementF;
      perBranchUnits[i] = count;
    }
    fixedCount = Math.min(count, ...needs.map((need) => Math.floor(need.fixedMaxF / choice.elementF + 1e-9)));
    for (let i = 0; i < n; i++) fixedF[i] = fixedCount * choice.elementF;
    units += count * choice.unitsPerCount;
    nameplateKvar += count * choice.unitsPerCount * choice.unit.ratedKvar;
  }
  for (const t of trims) {
    designF[t.branch] = designF[t.branch]! + t.count * t.choice.elementF;
    perBranchUnits[t.branch] = perBranchUnits[t.branch]! + t.count;
    units += t.count;
    nameplateKvar += t.count * t.choice.unit.ratedKvar;
  }
  const tiers = needs.map((need, i) => tierOf(designF[i]!, need));
  const trimOutputs = trims.length;
  const kvarPerCount = balanced ? balanced.choice.unitsPerCount * balanced.choice.unit.ratedKvar : 0;
  const leastCount = balanced ? leastBalancedCount(rules, balanced.choice) : 0;
  const switchedCount = balanced ? balanced.count - fixedCount : 0;
  const split = splitSteps(switchedCount, kvarPerCount, rules.outputs - trimOutputs, rules.minStepKvar, leastCount);
  const trimBelowMin = trims.some((t) => trimBelowLeast(rules, t.branch, t.choice, t.count));
  const switchedKvar = switchedCount * kvarPerCount;
  const wanted =
    switchedKvar > 0
      ? Math.min(rules.minSwitchedSteps, rules.outputs - trimOutputs, Math.floor(switchedKvar / Math.max(rules.minStepKvar, 1e-9) + 1e-9), balanced && rules.leastStepF.balanced > 0 ? Math.floor((switchedCount * balanced.choice.elementF) / rules.leastStepF.balanced + 1e-9) : Infinity)
      : 0;
  const cks: number[] = [];
  if (balanced) for (const c of split.steps) cks.push(c * balanced.choice.elementF * rules.ckPerF.balanced);
  for (const t of trims) cks.push(t.count * t.choice.elementF * (rules.ckPerF.trims[t.branch] ?? 0));
  const stepRatio = ratioOf(cks);
  return {
    stepRatio,
    stepsWide: stepRatio !== null && stepRatio > rules.widestStepRatio * (1 + 1e-9),
    stepsShort: Math.max(0, wanted - split.steps.length),
    balanced: balanced ? { ...balanced, fixedCount, stepCounts: split.steps } : null,
    trims,
    designF,
    fixedF,
    tiers,
    needs,
    units,
    nameplateKvar,
    cost: nameplateKvar + rules.unitCostKvar * units,
    rankedCost: nameplateKvar + rules.unitCostKvar * units + (trims.length ? rules.singleLineStepsKvar : 0),
    violations: {
      outputs: split.outputsShort || trimOutputs > rules.outputs,
      minStep: split.belowMin || trimBelowMin,
      unitCap: perBranchUnits.some((u) => u > rules.maxUnitsPerBranch),
    },
  };
}

/**
 * How far the design state sits from the middle of its windows: per branch with a known width, the
 * distance from the centre over the half-width, the largest (0 at the centre, 1 at an end). A branch
 * without an upper end, or held empty, adds nothing. The last word between builds of equal cost.
 */
function offCentre(designF: readonly number[], needs: readonly Need[]): number {
  let worst = 0;
  for (let i = 0; i < needs.length; i++) {
    const need = needs[i]!;
    if (need.maxF === null || !(need.maxF > need.minF)) continue;
    const half = (need.maxF - need.minF) / 2;
    worst = Math.max(worst, Math.abs(designF[i]! - (need.minF + half)) / half);
  }
  return worst;
}

/** Where `rankKey` holds the equal steps short of the number wanted. */
const STEPS_SHORT = 6;

/**
 * A key as builds with single-line steps are compared, with each other and with equal builds: steps
 * short weigh only between equal builds, since single-line steps follow the load line by line, never
 * in equal thirds (their coarser following is in `singleLineStepsKvar` instead).
 */
const acrossKinds = (key: readonly number[]) => key.map((x, k) => (k === STEPS_SHORT ? 0 : x));

/** Ranking key, compared left to right, smaller first. */
function rankKey(build: SetBuild, needs: readonly Need[]): number[] {
  const v = build.violations;
  const worst = Math.max(...build.tiers);
  const missSum = build.tiers.reduce((s, t, i) => s + miss(build.designF[i]!, needs[i]!, t), 0);
  const steps = (build.balanced?.stepCounts.length ?? 0) + build.trims.length;
  // Misses within 5 % of the requirement count as equal, so cost decides between near-equal builds
  // (a bank that cannot reach the target anyway is not worth a dozen small cans for the last per cent).
  // A step series wider than the controller takes well is ranked after the fit (a build that meets the target
  // with it beats one that does not without it) and before the cost; a step below the least is never chosen (`searchSet`).
  const past = build.tiers.some((t) => t === 5);
  return [Number(v.unitCap), Number(v.outputs), Number(past), worst, Math.round(missSum * 20), Number(build.stepsWide), build.stepsShort, build.rankedCost, build.units, -steps, offCentre(build.designF, needs)];
}

/** True when a build fits every branch's window and breaks no hardware rule. */
const fitsWhole = (build: SetBuild) => Math.max(...build.tiers) === 0 && !Object.values(build.violations).some(Boolean);

/**
 * Searches against every set of windows and returns the best build of them all by the search's
 * ranking, each judged against its own windows: one that fits a wide set whole at a lower cost
 * beats one that fits a narrow set, and of equals the first (sets come narrowest first, where a
 * build sits most centrally).
 */
export function leastCostOverWindows(searches: readonly (() => SetBuild)[]): SetBuild {
  let best: SetBuild | null = null;
  for (const search of searches) {
    const build = search();
    // The same build found again in a wider set stays judged on the narrower one (where it sits off-centre only because the set is wider).
    if (best === null || (!sameUnits(build, best) && beats(build, best))) best = build;
  }
  return best!;
}

/** Whether two builds buy the same units in the same places. */
const sameUnits = (a: SetBuild, b: SetBuild) =>
  a.units === b.units && a.designF.every((f, i) => f === b.designF[i]) && a.fixedF.every((f, i) => f === b.fixedF[i]) && (a.balanced?.choice.unit ?? null) === (b.balanced?.choice.unit ?? null);

/** Whether build `a` ranks before `b`, each on its own windows (steps short only between two equal builds). */
function beats(a: SetBuild, b: SetBuild): boolean {
  const [ka, kb] = [rankKey(a, a.needs), rankKey(b, b.needs)];
  return a.trims.length === 0 && b.trims.length === 0 ? better(ka, kb) : better(acrossKinds(ka), acrossKinds(kb));
}

/**
 * Searches against one set of windows after another and returns the first build that fits whole,
 * else the best of them all by the search's ranking (each judged against its own windows; the first of equals):
 * the equal-steps preference (see `searchSet`'s `equalStepsFirst`), the study's second candidate.
 */
export function firstFit(searches: readonly (() => SetBuild)[]): SetBuild {
  let best: SetBuild | null = null;
  for (const search of searches) {
    const build = search();
    if (fitsWhole(build)) return build;
    if (best === null || beats(build, best)) best = build;
  }
  return best!;
}

const better = (a: readonly number[], b: readonly number[]) => {
  for (let k = 0; k < a.length; k++) if (Math.abs(a[k]! - b[k]!) > 1e-9 * Math.max(1, Math.abs(b[k]!))) return a[k]! < b[k]!;
  return false;
};

/** `better` on two three-entry keys held as numbers (the trim search compares thousands of them). */
function betterOfThree(a0: number, a1: number, a2: number, b0: number, b1: number, b2: number): boolean {
  const differs = (a: number, b: number) => Math.abs(a - b) > 1e-9 * Math.max(1, Math.abs(b));
  if (differs(a0, b0)) return a0 < b0;
  if (differs(a1, b1)) return a1 < b1;
  if (differs(a2, b2)) return a2 < b2;
  return false;
}

/**
 * Whether the search may skip builds on lower bounds of their keys: the bounds below hold for
 * windows ordered as `selectBankUnits` makes them (0 ≤ nominal ≤ min; max ≤ limit, both known or
 * neither) and for costs that only grow with units; anything else is searched build by build.
 */
const boundable = (needs: readonly Need[], rules: SetRules, choices: readonly UnitChoice[]) =>
  rules.unitCostKvar >= 0 &&
  rules.singleLineStepsKvar >= 0 &&
  choices.every((c) => c.unit.ratedKvar >= 0 && c.elementF > 0) &&
  needs.every((n) => 0 <= n.nominalF && n.nominalF <= n.minF && (n.maxF === null ? n.limitF === null : n.limitF !== null && 0 <= n.maxF && n.maxF <= n.limitF));

/*
 * Lower bounds of `rankKey`, entry by entry. A build whose bound is not `better` than the best key
 * so far is not better itself (if it were, the first entry where it differs would be lower, and the
 * bound's entries are no higher), so skipping it leaves the search's answer as it was.
 * Entries not worked out here are bounded by their least value: 0, and for −steps the most steps
 * a set can have (`splitSteps` uses at most the outputs left, or one step, besides one per trim).
 */
const leastNegativeSteps = (rules: SetRules, branches: number) => -Math.max(rules.outputs, 1 + branches);

/** Bound for an equal build of `count` units: exact on every entry but the step rules. */
function equalKeyBound(needs: readonly Need[], rules: SetRules, choice: UnitChoice, count: number): number[] {
  const f = count * choice.elementF;
  let worst = 0;
  let past = 0;
  let missSum = 0;
  for (let i = 0; i < needs.length; i++) {
    const tier = tierOf(f, needs[i]!);
    worst = Math.max(worst, tier);
    if (tier === 5) past = 1;
    missSum = missSum + miss(f, needs[i]!, tier);
  }
  const units = count * choice.unitsPerCount;
  const cost = count * choice.unitsPerCount * choice.unit.ratedKvar + rules.unitCostKvar * units;
  return [Number(count > rules.maxUnitsPerBranch), 0, past, worst, Math.round(missSum * 20), 0, 0, cost, units, leastNegativeSteps(rules, needs.length), 0];
}

/**
 * The lowest tier any capacitance from `baseF` up can have: the first of `tierOf`'s tests that
 * some F ≥ baseF passes (a test asking F ≥ x and F ≤ bound + eps passes where max(baseF, x) does).
 */
function leastTierFrom(baseF: number, need: Need): number {
  const eps = 1e-9 * Math.max(need.nominalF, need.minF, 1e-30);
  const underMaxFrom = (x: number) => need.maxF === null || Math.max(baseF, x) <= need.maxF + eps;
  const underLimitFrom = (x: number) => need.limitF === null || Math.max(baseF, x) <= need.limitF + eps;
  if (underMaxFrom(need.minF - eps)) return 0;
  if (underMaxFrom(need.nominalF - eps)) return 1;
  if (underLimitFrom(need.nominalF - eps)) return 2;
  if (need.maxF !== null && underMaxFrom(baseF)) return 3;
  if (need.limitF !== null && underLimitFrom(baseF)) return 4;
  return need.limitF !== null ? 5 : 6;
}

/**
 * Bound for every build on `choice`, before its counts are worked out: each puts at least one
 * count of it on every branch, so no branch is below the tier capacitance from one count up can
 * reach; with trims (`leastTrimKvar` finite), at least one trim unit more is bought.
 */
function choiceKeyBound(needs: readonly Need[], rules: SetRules, choice: UnitChoice, leastTrimKvar: number | null): number[] {
  let worst = 0;
  for (let i = 0; i < needs.length; i++) worst = Math.max(worst, leastTierFrom(choice.elementF, needs[i]!));
  const kvar = 1 * choice.unitsPerCount * choice.unit.ratedKvar;
  const units = leastTrimKvar === null ? choice.unitsPerCount : choice.unitsPerCount + 1;
  const cost = leastTrimKvar === null ? kvar + rules.unitCostKvar * units : kvar + leastTrimKvar + rules.unitCostKvar * units + rules.singleLineStepsKvar;
  return [0, 0, Number(worst === 5), worst, 0, 0, 0, cost, units, leastNegativeSteps(rules, needs.length), 0];
}

/**
 * Whether trims on top of `balanced` may win (`mayWin` on a bound of their key), before choosing them. A build with trims
 * has them on some branches S (at least one); the key is bounded for each S and the build skipped
 * only if no S may win. A branch in S may reach any tier more capacitance can give it
 * (`leastTierFrom`), with no miss; one outside stays as the balanced part leaves it. `bestTrim`
 * puts a trim only where it beats no trim on [below minimum, tier, miss, cost], so never on a
 * branch that already fits (tier 0) or is past its limit (tier 5: more capacitance keeps it
 * there, further past). Each trim costs at least its branch's cheapest unit.
 * @param leastTrimKvar per branch, the least nameplate of its trim units (Infinity: none)
 */
function trimsMayWin(
  needs: readonly Need[],
  rules: SetRules,
  balanced: { choice: UnitChoice; count: number } | null,
  leastTrimKvar: readonly number[],
  leastTrimKvarPerF: readonly number[],
  mayWin: (bound: number[]) => boolean,
): boolean {
  const n = needs.length;
  const baseF = balanced ? balanced.count * balanced.choice.elementF : 0;
  const units = balanced ? balanced.count * balanced.choice.unitsPerCount : 0;
  const kvar = balanced ? balanced.count * balanced.choice.unitsPerCount * balanced.choice.unit.ratedKvar : 0;
  const tiers: number[] = [];
  let open = 0; // branches that may take a trim, as bits
  for (let i = 0; i < n; i++) {
    tiers.push(tierOf(baseF, needs[i]!));
    if (leastTrimKvar[i]! < Infinity && tiers[i] !== 0 && tiers[i] !== 5) open |= 1 << i;
  }
  for (let s = open; s > 0; s = (s - 1) & open) {
    let worst = 0;
    let past = 0;
    let missSum = 0;
    let trimKvar = kvar;
    // The trims' least nameplate where every trimmed branch reaches its window (tier 0): the capacitance
    // it lacks at the least kvar per farad any of its trim units has.
    let fittingTrimKvar = kvar;
    let trimmedCanFit = true;
    let trims = 0;
    for (let i = 0; i < n; i++) {
      const need = needs[i]!;
      if (s & (1 << i)) {
        trimKvar = trimKvar + leastTrimKvar[i]!;
        trims++;
        const least = leastTierFrom(baseF, need);
        worst = Math.max(worst, least);
        if (least !== 0) trimmedCanFit = false;
        const lacking = need.minF - 1e-9 * Math.max(need.nominalF, need.minF, 1e-30) - baseF;
        fittingTrimKvar = fittingTrimKvar + Math.max(leastTrimKvar[i]!, lacking * leastTrimKvarPerF[i]! * (1 - 1e-9));
        continue;
      }
      const tier = tiers[i]!;
      worst = Math.max(worst, tier);
      if (tier === 5) past = 1;
      missSum = missSum + miss(baseF, need, tier);
    }
    const fixedCost = rules.unitCostKvar * (units + trims) + rules.singleLineStepsKvar;
    const key = (w: number, kvarBought: number) => [0, Number(trims > rules.outputs), past, w, Math.round(missSum * 20), 0, 0, kvarBought + fixedCost, units + trims, leastNegativeSteps(rules, n), 0];
    // Where every trimmed branch may fit, a build either does (and buys what they lack) or leaves one at tier 1 or worse.
    if (trimmedCanFit ? mayWin(key(worst, fittingTrimKvar)) || mayWin(key(Math.max(worst, 1), trimKvar)) : mayWin(key(worst, trimKvar))) return true;
  }
  return false;
}

/** The best trim on one branch given the balanced capacitance already there (or none). */
function bestTrim(branch: number, need: Need, baseF: number, choices: readonly UnitChoice[], rules: SetRules, baseUnits: number): TrimBuild | null {
  // Ranked by [tier, miss in 5 % steps, cost], compared as `better` compares keys (a trim below the least step is not built).
  const baseTier = tierOf(baseF, need);
  let best: TrimBuild | null = null;
  let bestTier = baseTier;
  let bestMiss = Math.round(miss(baseF, need, baseTier) * 20);
  let bestCost = 0;
  const room = rules.maxUnitsPerBranch - baseUnits;
  // What the window's ends ask of a trim above the balanced part (null: unknown). Called for every
  // balanced build on every branch, so the counts near them (`countsNear`, capped at the room left,
  // each once in first-seen order) are gathered in one reused array rather than sets and closures.
  const rest = [need.minF - baseF, need.nominalF - baseF, need.maxF === null ? null : need.maxF - baseF, need.limitF === null ? null : need.limitF - baseF];
  const counts: number[] = [];
  const add = (c: number) => {
    const capped = Math.min(c, room);
    if (!counts.includes(capped)) counts.push(capped);
  };
  // Index loops: unoptimised code allocates an iterator result per step of a for…of.
  for (let c = 0; c < choices.length; c++) {
    const choice = choices[c]!;
    counts.length = 0;
    for (let r = 0; r < rest.length; r++) {
      const f = rest[r]!;
      if (f === null || f <= 0) continue;
      add(Math.floor(f / choice.elementF + 1e-9));
      add(Math.ceil(f / choice.elementF - 1e-9));
    }
    // The least trim allowed, where the window's ends ask for less: it may still fit, or come nearer.
    const leastF = rules.leastStepF.trims[branch] ?? 0;
    const least = Math.max(leastF > 0 ? Math.ceil(leastF / choice.elementF - 1e-9) : 0, choice.unit.ratedKvar > 0 ? Math.ceil(rules.minStepKvar / choice.unit.ratedKvar - 1e-9) : 0);
    if (least > 1 && counts.some((n) => n >= 1 && n < least)) add(least);
    for (let j = 0; j < counts.length; j++) {
      const count = counts[j]!;
      // A trim below the least step is not built (no trim there is the alternative).
      if (count < 1 || trimBelowLeast(rules, branch, choice, count)) continue;
      const f = baseF + count * choice.elementF;
      const tier = tierOf(f, need);
      const kvar = count * choice.unit.ratedKvar;
      const missed = Math.round(miss(f, need, tier) * 20);
      const cost = kvar + rules.unitCostKvar * count;
      if (betterOfThree(tier, missed, cost, bestTier, bestMiss, bestCost)) {
        best = { branch, choice, count };
        bestTier = tier;
        bestMiss = missed;
        bestCost = cost;
      }
    }
  }
  return best;
}

/**
 * The best build for one set by the ranking (`rankKey`): equal steps, single-phase trims, or both,
 * whichever fits as well for less. With `equalStepsFirst`, trims are searched only where no equal
 * build fits every branch's window: an ordinary one-CT controller before a cheaper build that needs
 * every line measured (the study's second candidate, kept where it re-solves better).
 * @param balancedChoices units for the balanced part (a lone branch: its units)
 * @param trimChoices per branch, single-phase units for a trim step (empty: no trims)
 */
export function searchSet(
  needs: readonly Need[],
  balancedChoices: readonly UnitChoice[],
  trimChoices: readonly (readonly UnitChoice[])[],
  rules: SetRules,
  equalNeeds: readonly Need[] = needs,
  options: { readonly exhaustive?: boolean; readonly equalStepsFirst?: boolean } = {},
): SetBuild {
  // The best of each kind: equal steps only (the empty build too), and with single-line steps (trims).
  let best: SetBuild | null = null;
  let bestKey: number[] = [];
  let bestTrimmed: SetBuild | null = null;
  let bestTrimmedKey: number[] = [];
  // Skip builds whose key bound cannot beat the best so far (`exhaustive`: judge every build, for tests).
  const pruning = !options.exhaustive && boundable([...needs, ...equalNeeds], rules, [...balancedChoices, ...trimChoices.flat()]);
  const mayWin = (bound: number[]) => best === null || better(bound, bestKey);
  // Every equal build is judged before any trimmed one: a trimmed build matters only if it may beat both
  // the best trimmed build so far and, across kinds, the best equal one (equal builds win ties).
  const trimmedMayWin = (bound: number[]) => (bestTrimmed === null || better(bound, bestTrimmedKey)) && (best === null || better(bound, acrossKinds(bestKey)));
  const consider = (build: SetBuild) => {
    // A step below the least is not built: the build is not a candidate (the empty build always is).
    if (build.violations.minStep) return;
    const k = build.trims.length ? acrossKinds(rankKey(build, build.needs)) : rankKey(build, build.needs);
    if (build.trims.length) {
      if (!bestTrimmed || better(k, bestTrimmedKey)) {
        bestTrimmed = build;
        bestTrimmedKey = k;
      }
    } else if (!best || better(k, bestKey)) {
      best = build;
      bestKey = k;
    }
  };
  const edges = [...needs, ...equalNeeds].flatMap((need) => [need.minF, need.nominalF, need.maxF, need.limitF]);
  const countsOf = new Map<UnitChoice, number[]>();
  const balancedCounts = (choice: UnitChoice) => {
    let counts = countsOf.get(choice);
    if (counts) return counts;
    const near = countsNear(edges, choice.elementF);
    // Then multiples of the step counts wanted, so equal steps are within reach; and the
    // largest build within the unit cap is always a candidate (never dropped for being over it).
    // Each count once, capped, in first-seen order (a few dozen at most: a scan beats a Set's hashing).
    counts = [];
    const put = (c: number) => {
      const capped = Math.min(c, rules.maxUnitsPerBranch);
      if (capped >= 1 && !counts!.includes(capped)) counts!.push(capped);
    };
    for (let i = 0; i < near.length; i++) put(near[i]!);
    for (let i = 0; i < near.length; i++)
      for (let m = 2; m <= 4; m++) {
        put(Math.floor(near[i]! / m) * m);
        put(Math.ceil(near[i]! / m) * m);
      }
    put(1);
    // One switched step at the least step, where the windows ask for less (it may still fit, or come nearer).
    const least = leastBalancedCount(rules, choice);
    if (least > 1 && counts.some((c) => c < least)) put(least);
    countsOf.set(choice, counts);
    return counts;
  };
  const leastTrimKvar = needs.map((_, i) => (trimChoices[i] ?? []).reduce((least, c) => Math.min(least, c.unit.ratedKvar), Infinity));
  const leastTrimKvarPerF = needs.map((_, i) => (trimChoices[i] ?? []).reduce((least, c) => Math.min(least, c.unit.ratedKvar / c.elementF), Infinity));
  const withTrims = (balanced: { choice: UnitChoice; count: number } | null) => {
    if (pruning && (best !== null || bestTrimmed !== null) && !trimsMayWin(needs, rules, balanced, leastTrimKvar, leastTrimKvarPerF, trimmedMayWin)) return;
    const baseF = balanced ? balanced.count * balanced.choice.elementF : 0;
    const baseUnits = balanced ? balanced.count : 0;
    const trims = needs.flatMap((need, i) => {
      const t = trimChoices[i]?.length ? bestTrim(i, need, baseF, trimChoices[i]!, rules, baseUnits) : null;
      return t ? [t] : [];
    });
    if (trims.length) consider(evaluate(needs, rules, balanced, trims));
  };
  // Equal steps, then trims (with `equalStepsFirst` only where no equal build fits every branch's window).
  consider(evaluate(needs, rules, null, []));
  for (const choice of balancedChoices) {
    if (pruning && !mayWin(choiceKeyBound(equalNeeds, rules, choice, null))) continue;
    for (const count of balancedCounts(choice))
      if (!pruning || mayWin(equalKeyBound(equalNeeds, rules, choice, count))) consider(evaluate(equalNeeds, rules, { choice, count }, []));
  }
  const equalFits = options.equalStepsFirst === true && best !== null && fitsWhole(best);
  if (!equalFits && trimChoices.some((c) => c.length)) {
    withTrims(null);
    const leastAnyTrimKvar = Math.min(...leastTrimKvar);
    for (const choice of balancedChoices) {
      if (pruning && !trimmedMayWin(choiceKeyBound(needs, rules, choice, leastAnyTrimKvar))) continue;
      for (const count of balancedCounts(choice)) withTrims({ choice, count });
    }
  }
  if (bestTrimmed === null) return best!;
  return better(acrossKinds(bestTrimmedKey), acrossKinds(bestKey)) ? bestTrimmed : best!;
}

/**
 * The cheapest way to make one step of `count` × `choice` on a lone branch from a single kind of
 * unit among `choices`: the same capacitance (to 1 part in 10⁶) from fewer or cheaper units where
 * the catalogue has them (two 1 kvar cans are one 2 kvar can of the same rating). The search
 * splits one unit choice into steps; this rebuilds each step, so the step's µF, and with it the
 * verified answer, stay as they were while the cost can only fall.
 * @example cheapestStepUnits(2, oneKvar, [oneKvar, twoKvar], 2) //=> { choice: twoKvar, count: 1 }
 */
export function cheapestStepUnits(count: number, choice: UnitChoice, choices: readonly UnitChoice[], unitCostKvar: number): { choice: UnitChoice; count: number } {
  const targetF = count * choice.elementF;
  const costOf = (c: UnitChoice, m: number) => m * c.unitsPerCount * (c.unit.ratedKvar + unitCostKvar);
  let best = { choice, count };
  let bestCost = costOf(choice, count);
  for (const c of choices) {
    if (!(c.elementF > 0) || c.unitsPerCount !== choice.unitsPerCount) continue;
    const m = Math.round(targetF / c.elementF);
    if (m < 1 || Math.abs(m * c.elementF - targetF) > 1e-6 * targetF) continue;
    const cost = costOf(c, m);
    if (cost < bestCost - 1e-9) {
      best = { choice: c, count: m };
      bestCost = cost;
    }
  }
  return best;
}
