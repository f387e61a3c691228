/**
 * Every sentence the correction study writes: definitions, shortfalls,
 * reasons, warnings and cautions. Plain text; the CLI decides how to show it.
 */
import type { PhaseLabel } from '../board/conventions/phaseNames.js';
import type { PhaseId } from '../board/boardModel.js';
import type { PowerFactorSense } from '../analysis/boardResult.js';
import type { Arrangement, TargetDefinition } from './correctionSpec.js';
import type { BuildVerdict, ControllerSettings, CtBasis, LeastSwitchedStep, SmallBranch, WithheldBuild, StepStateCurrent, StepStateOrders, StepStateResonance, SparedBranch, TargetName } from './correctionResult.js';
import { argumentIssueError, checkListArgument, checkNumberArgument, checkObjectArgument, checkTextArgument, checkWordArgument } from '../_internal/argumentChecks.js';
import { starWordOf, type StarWord } from '../board/conventions/regionWords.js';
import { REGIONS, type Region } from '../board/conventions/region.js';
import { SYSTEMS } from '../board/boardRanges.js';
import { quoteText } from '../errors.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { lineToNeutralCapacitorsCaution } from '../analysis/openNeutralWording.js';

interface TargetWords {
  readonly definition: TargetDefinition;
  readonly pf: number;
  readonly leading: 'never' | 'allowed';
  readonly minLeadingPf: number | null;
  readonly maxLaggingPf: number | null;
}

const f3 = (x: number) => x.toFixed(3);
/** 3 → "3rd", 11 → "11th", 21 → "21st". */
const ordinal = (n: number): string => `${n}${n % 100 >= 11 && n % 100 <= 13 ? 'th' : ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th'}`;

/** Resonance orders printed so that they tell apart: one decimal, or more (up to three) where two would print alike (6.77 and 6.84, not 6.8 and 6.8). */
export function orderFigures(orders: readonly number[]): string[] {
  for (let decimals = 1; decimals < 3; decimals++) {
    const printed = orders.map((h) => h.toFixed(decimals));
    if (new Set(printed).size === printed.length) return printed;
  }
  return orders.map((h) => h.toFixed(3));
}

/** Each resonance order that lies near a watched order, to two decimals as the resonance figures are given, with the order it is near: "6.54 (the 7th)"; `near` gives an order's watched orders. */
export function ordersNearWords(orders: readonly number[], near: (h: number) => readonly number[]): string[] {
  return orders.flatMap((h) => (near(h).length ? [`${h.toFixed(2)} (the ${near(h).map(ordinal).join(' and the ')})`] : []));
}

/**
 * A figure beside the bound it misses, with enough decimals that the two read
 * differently (0.9499 beside 0.950, never "0.950, below the target 0.950").
 */
export function distinctDigits(value: number, bound: number, digits = 3): [string, string] {
  let d = digits;
  while (d < 8 && value.toFixed(d) === bound.toFixed(d)) d++;
  return [value.toFixed(d), bound.toFixed(digits)];
}
const f1 = (x: number) => x.toFixed(1);
/** A percentage as set: 5, 2.5 (no trailing zeros). */
const trimmed = (x: number) => String(Number(x.toFixed(1)));
const pfText = (pf: number | null, sense: PowerFactorSense) => (pf === null ? 'no current (no PF)' : sense === 'unity' ? '1.000' : `${f3(pf)} ${sense}`);

export const TARGET_STATEMENTS: Record<TargetDefinition, string> = {
  'per-line':
    'displacement power factor of every line at the board, P/|S| with S = V·I* per line (voltage to the neutral bar where the board has a neutral, to the virtual neutral on a three-phase 3-wire board)',
  effective: 'IEEE Std 1459 effective power factor of the board, P/Se with Se = 3·Ve·Ie (Buchholz–Goodhue)',
  vector: 'vector power factor of the board, P/|ΣS| over the lines (what a kWh/kvarh meter averages to)',
  arithmetic: 'arithmetic power factor of the board, P/Σ|S| over the lines',
  'positive-sequence': 'fundamental positive-sequence power factor of the board, P1+/S1+ (IEEE Std 1459)',
};

/** The per-line target where the board has a neutral, and on a three-phase 3-wire board: the voltage each line's power is taken on. */
export const PER_LINE_STATEMENTS = {
  neutral: 'displacement power factor of every line at the board, P/|S| with S = V·I* per line (voltage to the neutral bar)',
  threeWire: 'displacement power factor of every line at the board, P/|S| with S = V·I* per line (voltage to the virtual neutral: the board has no neutral)',
} as const;

/** The per-line target on a single-phase (2-wire) board: its one line, to the neutral. */
export const SINGLE_LINE_STATEMENT = 'displacement power factor at the board, P/|S| with S = V·I* (the line to the neutral)';

/** A target's statement when it is measured away from the equipment's board (see meteringPoint.ts). */
export const meteredStatement = (statement: string): string => statement.replace(' at the board', ' at the metering point').replace(' of the board', ' at the metering point');

export const targetShortfall = {
  lineBelow: (phase: PhaseLabel, pf: number | null, sense: PowerFactorSense, min: number) => {
    if (pf === null) return `line ${phase} carries no current (no PF)`;
    const [v, m] = distinctDigits(pf, min);
    return `line ${phase} is at ${sense === 'unity' ? v : `${v} ${sense}`}, below the target ${m} lagging`;
  },
  lineLeadsMore: (phase: PhaseLabel, pf: number | null, pfBefore: number | null) => {
    if (pf === null || pfBefore === null) return `line ${phase} led before and the equipment makes it lead more`;
    const [v, b] = distinctDigits(pf, pfBefore);
    return `line ${phase} led at ${b} before and the equipment makes it lead more (${v} leading)`;
  },
  lineBeyond: (phase: PhaseLabel, pf: number | null, sense: PowerFactorSense, t: TargetWords) =>
    t.maxLaggingPf !== null && t.definition === 'per-line'
      ? `line ${phase} is at ${pfText(pf, sense)}, past the upper bound ${f3(t.maxLaggingPf)} lagging`
      : t.leading === 'never'
        ? `line ${phase} is leading (${pfText(pf, sense)}) and leading is not allowed`
        : `line ${phase} leads at ${pfText(pf, sense)}, below the lowest allowed leading PF ${f3(t.minLeadingPf ?? t.pf)}`,
  boardBelow: (t: TargetWords, pf: number | null) => {
    if (pf === null) return `the ${t.definition} power factor is not defined for this board`;
    const [v, m] = distinctDigits(pf, t.pf);
    return `the board's ${t.definition} power factor is ${v}, below the target ${m}`;
  },
  boardBeyond: (t: TargetWords, pf: number | null) => {
    const [v, m] = distinctDigits(pf ?? 0, t.maxLaggingPf ?? 1);
    return `the board's ${t.definition} power factor ${v} is past the upper bound ${m}`;
  },
};

export const infeasibleReason = {
  alreadyLeading: (phases: readonly PhaseLabel[]) =>
    `line${phases.length > 1 ? 's' : ''} ${phases.join(', ')} already lead${phases.length > 1 ? '' : 's'} before correction: capacitors cannot help there, a reactor would be needed`,
  exporting: 'the board exports active power, so a power-factor target has no meaning for it',
  exportingMet: 'the board exports active power, and every figure the target reads already meets it (per line: the size of Q against |P|)',
  noLoad: 'the board draws no active power (every load is zero or off), so there is nothing to correct',
  capacitorsCannotReach: (shortfalls: readonly string[]) =>
    `no capacitor-only bank of this arrangement meets the target without breaking a bound; even sized exactly (before units are chosen) the best it reaches leaves: ${shortfalls.join('; ')}`,
  notConverged: (iterations: number, change: number) =>
    `the sizing did not settle in ${iterations} re-solves (last change ${change.toExponential(2)} of the board's apparent power)`,
  needsReactors: (branches: readonly PhaseLabel[], all: readonly { branch: PhaseLabel; element: string; kvarAtNominalV: number }[]) =>
    `the ideal (Steinmetz/Gyugyi) compensator balances it with ${all
      .filter((b) => b.element !== 'none')
      .map((b) => `${b.element === 'reactor' ? 'a reactor' : 'a capacitor'} of ${Math.abs(b.kvarAtNominalV).toFixed(2)} kvar on ${b.branch}`)
      .join(', ')}: reactors on ${branches.join(', ')} are needed, which a capacitor-only build cannot give`,
  capacitorsCannotBalance: (shortfalls: readonly string[]) =>
    `capacitors alone cannot bring the unbalance down without making a line lead: ${shortfalls.join('; ')}`,
  capacitorsRoundedDownBesideReactors: (built: number, ideal: number, reactor: number, resizing: ResizingWords | null, verdictUp: BuildVerdict | null) => {
    const up = verdictUp === null ? '' : `; rounded up, with the reactors sized again around them, the board ${BUILD_VERDICT_WORDS[verdictUp]} too`;
    const head = `the capacitors are rounded down to their requirement beside the reactors (past it, with the reactors as sized, the balance tips and lines lead${up}), so the units fall short of the ideal capacitors: ${built.toFixed(2)} kvar built against ${ideal.toFixed(2)} kvar sized`;
    if (resizing?.used) {
      const sum = (key: 'sizedKvar' | 'resizedKvar') => resizing.reactors.reduce((s, r) => s + r[key], 0);
      return `${head}. The reactors were re-sized to the capacitors as built (${reactorChanges(resizing.reactors)}; ${sum('sizedKvar').toFixed(2)} → ${sum('resizedKvar').toFixed(2)} kvar in all, at nominal voltage), which is the build verified here, and it still misses the target`;
    }
    const tried = resizing ? '; re-sizing the reactors to the capacitors as built did not bring the board closer to the targets, so they stay as sized' : '';
    return `${head}; the net compensation, capacitors less the ${reactor.toFixed(2)} kvar of reactors, falls from ${(ideal - reactor).toFixed(2)} to ${(built - reactor).toFixed(2)} kvar${tried}`;
  },
  unitsMissTarget: (shortfalls: readonly string[]) => `with the units chosen the corrected board misses the target: ${shortfalls.join('; ')}`,
  /** A build with a step below the least switched step would fit the capacitance ranges; it is not built. */
  stepHeldBack: (step: { branches: readonly string[]; kvarAtNominalV: number; responseThresholdA: number }, least: { responseThresholdA: number; ct: string; detuned: boolean }) =>
    `a build with a ${step.kvarAtNominalV.toFixed(2)} kvar switched step on ${step.branches.join(', ')} (C/k ${step.responseThresholdA.toFixed(3)} A) would fit the capacitance ranges, but that is below the least switched step (C/k ${least.responseThresholdA.toFixed(3)} A on the ${least.ct} CT${
      least.detuned ? ', with its own detuning reactor' : ''
    }), so it is not built: the bank as built stops short there; correction at the loads, or a fixed part where the light load allows it, closes the gap`,
  widthlessTarget: (pf: number, leadingAllowed: boolean) =>
    `the target leaves no band to land in (${
      leadingAllowed ? 'PF 1.000, and with leading allowed no further than PF 1.000 leading: the leading limit is the target unless target.minLeadingPf is given' : pf >= 1 ? 'PF 1.000 and never leading' : `PF at least and at most ${f3(pf)} lagging`
    }): units come in fixed sizes and a bank switches in steps, so a build meets it only by chance; give a lower PF target${leadingAllowed ? ' or a lower target.minLeadingPf' : pf >= 1 ? '' : ' or a higher upper bound'}`,
};

/** What the wording needs of a reactor re-sizing (see ReactorResizing). */
interface ResizingWords {
  readonly used: boolean;
  readonly reactors: readonly { readonly branch: PhaseLabel; readonly sizedKvar: number; readonly resizedKvar: number }[];
}
/** Each branch with a reactor before or after, as printed (a branch with none either side is not a change). */
export const reactorChanges = (reactors: ResizingWords['reactors']): string => {
  checkListArgument(reactors, 'reactors', 'a list of { branch, sizedKvar, resizedKvar } (a reactor re-sizing\'s reactors)', (r) => typeof r === 'object' && r !== null && typeof (r as { sizedKvar?: unknown }).sizedKvar === 'number' && typeof (r as { resizedKvar?: unknown }).resizedKvar === 'number');
  return reactors
    .filter((r) => r.sizedKvar.toFixed(2) !== '0.00' || r.resizedKvar.toFixed(2) !== '0.00')
    .map((r) => `${r.branch} ${r.sizedKvar.toFixed(2)} → ${r.resizedKvar.toFixed(2)} kvar`)
    .join(', ');
};

/** The bound a bank's units must stay within on the leading side, in words, by how the target bounds it. */
export const NO_LEADING_LIMIT = 'no-leading limit';
export const limitWords = (target: { readonly leading?: string | undefined; readonly maxLaggingPf?: number | undefined }): string =>
  target.leading === 'allowed' ? 'leading limit' : target.maxLaggingPf !== undefined ? 'upper PF bound' : NO_LEADING_LIMIT;

/**
 * The resonance estimate is of the state with all the added capacitance in. Less capacitance (fewer steps in)
 * raises every order of the LC network, so a switched state can sit near an order the full bank misses.
 */
const STEP_STATES_WORDS =
  '. The estimate is for every step in: with fewer steps in the orders rise and can fall near other harmonic orders (the harmonic check, run where the board has a harmonics section, scans every step combination)';

/** A switched step as a warning names it: its output, the branches it serves, kvar at nominal voltage and C/k. */
export interface StepWords {
  readonly output: number;
  readonly branches: string;
  readonly kvar: number;
  readonly responseA: number;
}
const stepWords = (s: StepWords) => `${s.output} (${s.branches}, ${s.kvar.toFixed(2)} kvar, C/k ${s.responseA.toFixed(3)} A)`;

/** A CT as written on its plate: 400/5 A, 12.5/5 A. */
export const ctRatingWords = (primaryA: number, secondaryA: number) => `${Number(primaryA.toFixed(2))}/${Number(secondaryA.toFixed(2))} A`;

const STEP_KIND_WORDS = { 'three-phase': 'three-phase', 'line-pair': 'across a line pair', 'single-phase': 'single-phase' } as const;

/**
 * The least switched step in words: its C/k on the CT and why, the kvar at nominal voltage that gives
 * for each kind of step the bank may have, and the least nameplate.
 */
export function leastStepWords(least: Omit<LeastSwitchedStep, 'ratio' | 'heldBack' | 'words'>): string {
  const share = `${trimmed(100 * least.shareOfSecondary)} % of its ${trimmed(least.ctSecondaryA)} A secondary`;
  const why = least.detuned ? `${share} for a detuned step, and ${trimmed(least.detunedKvar ?? 0)} kvar at nominal voltage: a reactor per step is not built for less` : `${share}: a smaller step's reactive current is lost in the CT's error`;
  // The voltage once where every kind is read at the same one.
  const oneVoltage = least.floors.every((f) => Math.abs(f.voltageV - least.floors[0]!.voltageV) < 0.5);
  const at = (v: number) => ` at ${v.toFixed(0)} V`;
  const kinds = least.floors.map((f) => `${f.kvarAtNominalV.toFixed(2)} kvar ${STEP_KIND_WORDS[f.kind]}${oneVoltage ? '' : at(f.voltageV)}`);
  return `C/k ${least.responseThresholdA.toFixed(3)} A on the ${ctRatingWords(least.ctPrimaryA, least.ctSecondaryA)} CT (${why}; common practice, no source)${
    kinds.length ? `, i.e. ${kinds.join(' or ')}${oneVoltage ? `${at(least.floors[0]!.voltageV)} nominal` : ''}` : ''
  }, and ${trimmed(least.nameplateKvar)} kvar nameplate`;
}

/**
 * What the every-step-in warning says of the other states: unknown (the steps were not given), none (no switched
 * step: the one state), or how many other states the controller can reach and how many of them lie near too.
 */
export type OtherStepStates = 'unknown' | null | { readonly others: number; readonly othersNear: number };

const otherStatesWords = (states: OtherStepStates): string =>
  states === 'unknown'
    ? STEP_STATES_WORDS
    : states === null || states.others === 0
      ? ''
      : states.othersNear > 0
        ? '. That is with every step in; states with fewer steps in lie near harmonic orders too (next warning)'
        : `. That is with every step in; none of the ${states.others} other step state${states.others === 1 ? '' : 's'} the controller can reach lies within 10 % of a watched order`;

/** A combination of outputs in, in words: "outputs 1 and 2", "output 3". */
const outputsWords = (outputs: readonly number[]): string =>
  outputs.length === 1 ? `output ${outputs[0]}` : `outputs ${outputs.slice(0, -1).join(', ')} and ${outputs.at(-1)}`;

/** A state the controller can reach, by what is in: "with outputs 1 and 2 in", "with only the fixed part in". */
export function stepStateInWords(st: Pick<StepStateOrders, 'outputsIn'>, fixedPart: StepStateResonance['fixedPart']): string {
  const kept = fixedPart.reactors && fixedPart.capacitors ? 'the reactors and the fixed capacitors' : fixedPart.reactors ? 'the reactors' : fixedPart.capacitors ? 'the fixed part' : null;
  if (!st.outputsIn.length) return `with only ${kept ?? 'the fixed part'} in`;
  return `with ${kept ? `${kept} and ` : ''}${outputsWords(st.outputsIn)} in`;
}

/**
 * The verdict's "but" where the supply resonance lies near a watched order with every step in or in another state
 * the controller can reach (CorrectionVerification.resonanceNearHarmonic); empty where it does not.
 */
export function resonanceSummaryClause(
  v: {
    readonly resonanceNearHarmonic: boolean;
    readonly resonanceNearOrders: readonly number[];
    readonly resonanceHeadlineOrders: readonly number[];
    readonly resonanceStepStates: StepStateResonance | null;
  },
  /** 'and' where the summary already has its "but" (an overload); null for the clause alone (a headline of its own). */
  joined: 'but' | 'and' | null = 'but',
): string {
  if (!v.resonanceNearHarmonic) return '';
  // Only the orders that headline (significant, able to reach the bank); the warnings name the others.
  const orders = v.resonanceHeadlineOrders;
  const headlines = (near: readonly number[]) => near.some((h) => orders.includes(h));
  const partial = v.resonanceStepStates?.states.slice(1).filter((st) => headlines(st.nearOrders)) ?? [];
  const where = [...(headlines(v.resonanceNearOrders) ? ['with every step in'] : []), ...(partial.length ? [`in ${partial.length} state${partial.length === 1 ? '' : 's'} with fewer steps in`] : [])];
  const named = orders.map(ordinal);
  const list = named.length === 1 ? `the ${named[0]} harmonic` : `the ${named.slice(0, -1).join(', ')} and ${named.at(-1)} harmonics`;
  const clause = `its supply resonance lies within 10 % of ${list} ${where.join(' and ')} (see the warnings)`;
  return joined === null ? clause : `; ${joined} ${clause}`;
}

/** The verdict's qualification where the CT given is below the current it must carry (ControllerSettings.ctNeeded); empty where it is not. */
export function ctNeededClause(c: Pick<ControllerSettings, 'ctNeeded' | 'ctPrimaryA' | 'ctSecondaryA' | 'ctBasis'>): string {
  if (!c.ctNeeded) return '';
  const amps = (a: number) => String(Number(a.toFixed(2)));
  return `; met with a controller CT of at least ${amps(c.ctNeeded.primaryA)}/${amps(c.ctSecondaryA)} A: the ${amps(c.ctPrimaryA)}/${amps(c.ctSecondaryA)} A given is below the ${f1(c.ctBasis.currentA)} A it must carry and saturates (see the warnings)`;
}

/** At most this many states are named in a warning; the rest are counted (the step-state table lists them). */
const NAMED_STATES = 4;

export const warningText = {
  reactorsResized: (reactors: ResizingWords['reactors']) =>
    `the reactors were sized again beside the capacitors as built from units (${reactorChanges(reactors)} at nominal voltage): the build verified here has the re-sized reactors`,
  alreadyMet: 'the board already meets the target: nothing to add',
  unitFrequency: (name: string, ratedHz: number, hz: number) =>
    `unit ${quoteText(name)} is rated for ${ratedHz} Hz and used at ${hz} Hz: its output and current scale by ${f3(hz / ratedHz)}`,
  unitsBelowTarget: (branch: PhaseLabel, limit: string = NO_LEADING_LIMIT) =>
    `branch ${branch}: the units cannot reach the requirement without passing the ${limit}; the design stays below the limit and short of the target`,
  unitsPastLimit: (branch: PhaseLabel, limit: string = NO_LEADING_LIMIT) => `branch ${branch}: no build of the available units stays within the ${limit}; the smallest that reaches the target is used`,
  windowMissed: (branch: PhaseLabel, limit: string = NO_LEADING_LIMIT) =>
    `branch ${branch}: no combination of units guarantees the target at the lowest capacitance tolerance without exceeding the ${limit} at the highest; the choice meets the target at nominal capacitance`,
  toleranceLow: (shortfalls: readonly string[]) => `with capacitance at the low end of its tolerance the target is missed: ${shortfalls.join('; ')}`,
  toleranceHigh: (phases: readonly PhaseLabel[]) => `with capacitance at the high end of its tolerance ${phases.length > 1 ? `lines ${phases.join(', ')} lead` : `line ${phases[0]} leads`}`,
  lightLoadLagging: (reactorKvar: number, lines: readonly { phase: PhaseLabel; pf: number; before: number | null }[]) =>
    `at light load the fixed part, ${reactorKvar.toFixed(2)} kvar inductive net (its reactors stay connected), leaves ${lines.map((l) => `line ${l.phase} at PF ${f3(l.pf)} lagging${l.before === null ? '' : ` (${f3(l.before)} without the equipment)`}`).join(', ')}: switch the reactors with the load, or expect this reactive draw whenever the board runs light`,
  lightLoadLeading: (phases: readonly PhaseLabel[]) =>
    `at light load the fixed part makes line${phases.length > 1 ? 's' : ''} ${phases.join(', ')} lead (checked at the high end of the capacitance tolerance)`,
  /** @param reading what the rise does on the board (voltageRiseFlag.ts), where it was read */
  voltageRise: (what: string, percent: number, level: number, reading?: string) =>
    `${what} raises the board voltage by about ${distinctDigits(percent, level, 2)[0]} %, above the ${trimmed(level)} % flag level${reading ? ` (a level for a second look, not a limit the verdict is judged on): ${reading}` : ''}`,
  /** @param capacitance what resonates: the bank, the leading loads already on the board, or both */
  lowResonance: (orders: readonly number[], capacitance: 'bank' | 'board' | 'both' = 'bank', near: readonly number[] = [], states: OtherStepStates = 'unknown') =>
    `${capacitance === 'bank' ? 'the bank' : capacitance === 'board' ? "the board's own leading loads (capacitance already in service)" : "the bank with the board's own leading loads"} and the supply inductance resonate near harmonic order${orders.length > 1 ? 's' : ''} ${orderFigures(orders).join(' and ')}${near.length ? ` (within 10 % of the ${near.map(ordinal).join(' and the ')})` : ''}, estimated from the supply path's reactances and the capacitances: with harmonic-producing loads on the board this needs a harmonic study and probably a detuned bank${
      capacitance === 'board' ? '' : otherStatesWords(states)
    }`,
  /**
   * The states with fewer steps in whose resonance lies near a watched order: each named by what is in (and the
   * combinations alike in capacitance), with its order; what to do about it, deferring to a study and licensed practice.
   * @param allInNear true where the every-step-in state is near too (its own warning says so)
   * @param scanned where the harmonic check of the same study scanned every step combination of the plain bank: whether it passed (the scan decides)
   */
  stepStateResonance: (
    states: readonly Pick<StepStateOrders, 'outputsIn' | 'alike' | 'capacitorKvarAtNominalV' | 'resonancesNear' | 'nearOrders'>[],
    fixedPart: StepStateResonance['fixedPart'],
    allInNear: boolean,
    scanned: { readonly passes: boolean } | null = null,
    /** True where the board's own leading loads are counted with the bank (in every state). */
    withBoardLoads = false,
  ) => {
    checkListArgument(states, 'states', 'the step states near a watched order (StepStateResonance.states)', (x) => typeof x === 'object' && x !== null && Array.isArray((x as StepStateOrders).outputsIn));
    const named = states.slice(0, NAMED_STATES).map((st) => {
      const alike = !st.alike.length
        ? ''
        : st.alike.length <= 3
          ? ` (or ${st.alike.map((o) => o.join('+')).join(', ')}: the same capacitance)`
          : ` (or any of ${st.alike.length} other combinations with the same capacitance)`;
      return `${stepStateInWords(st, fixedPart)}${alike}, ${st.capacitorKvarAtNominalV.toFixed(1)} kvar, near ${orderFigures(st.resonancesNear).join(' and ')} (the ${st.nearOrders.map(ordinal).join(' and the ')})`;
    });
    const more = states.length > NAMED_STATES ? `; and ${states.length - NAMED_STATES} more state${states.length - NAMED_STATES === 1 ? '' : 's'} (see the step-state table)` : '';
    if (scanned)
      return `the estimate from the supply path's reactances also puts the resonance near a harmonic order with fewer steps in: ${named.join('; ')}${more}; the harmonic check of this study scanned every step combination and ${scanned.passes ? 'passes the plain bank (the spectra are typical or entered ones: measure the real spectrum before installing)' : 'fails the plain bank (see the harmonic check)'}`;
    return `${allInNear ? 'also ' : ''}with fewer steps in, ${withBoardLoads ? "the bank with the board's own leading loads" : 'the bank'} and the supply inductance resonate within 10 % of a harmonic order: ${named.join('; ')}${more}. The controller reaches these states as it follows the load: with harmonic-producing loads on the board this needs a harmonic study, and then detuning reactors on the steps, or a switching programme that never leaves the bank in ${states.length === 1 ? 'that combination' : 'those combinations'}, decided with that study by a licensed professional to the local codes`;
  },
  /** The same resonance where the harmonic check scanned the plain bank in the same study: the estimate defers to the scan. */
  lowResonanceScanned: (orders: readonly number[], near: readonly number[], lowestPeak: number | null, passes: boolean) =>
    `the estimate from the supply path's reactances puts the resonance of the capacitance with the supply near harmonic order${orders.length > 1 ? 's' : ''} ${orderFigures(orders).join(' and ')}${near.length ? ` (within 10 % of the ${near.map(ordinal).join(' and the ')})` : ''}; the harmonic check of this study ${lowestPeak === null ? 'found no resonance peak in its range' : `scanned its lowest peak at h = ${lowestPeak.toFixed(2)}`} and ${passes ? 'passes the plain bank: no order in the spectra entered lies near a peak. The spectra are typical or entered ones: measure the real spectrum of the board before installing, and again when harmonic-producing loads are added' : 'fails the plain bank (see the harmonic check)'}`,
  partialBalance: (negative: number, zero: number, reactors: readonly PhaseLabel[]) =>
    `the capacitor-only compensator meets the power-factor target but balances only partly (|I2|/|I1| = ${negative.toFixed(1)} %, |I0|/|I1| = ${zero.toFixed(1)} %)${reactors.length ? `; full balance needs reactors on ${reactors.join(', ')}` : ''}`,
  /** @param suggestedA the primary trivar would choose for that current (1.25 × it, next standard rating) */
  ctBelowLineCurrent: (primaryA: number, basis: Pick<CtBasis, 'currentA' | 'sizedOn' | 'placeWords' | 'stepState'> & { readonly capacitance?: CtBasis['capacitance'] }, suggestedA: number) => {
    // One decimal where it shows the figure above the primary; two where one would print them equal.
    const lineA = Number(f1(basis.currentA)) > primaryA ? f1(basis.currentA) : basis.currentA.toFixed(2);
    const when =
      basis.sizedOn === 'given'
        ? ''
        : basis.sizedOn === 'before'
          ? ' before correction'
          : basis.sizedOn === 'step-state' && basis.stepState
            ? ` on line ${basis.stepState.lineLabel} ${stepStateWords(basis.stepState)}`
            : ' after correction';
    const end = basis.capacitance && (basis.sizedOn === 'after' || basis.sizedOn === 'step-state') ? `, with the capacitors at the ${capacitanceEndWords(basis.capacitance.capacitanceFactor)} end of their tolerance` : '';
    return `the CT primary (${primaryA} A) is below the largest line current (${lineA} A)${when} at ${basis.placeWords}${end}: the CT runs past its rating and saturates, and the controller misreads the reactive current; raise controller.ctPrimaryA to at least ${Math.ceil(basis.currentA)} A (${suggestedA} A is the next standard rating at or above 1.25 × it)`;
  },
  manySmallUnits: (w: {
    units: number;
    nameplateKvar: number;
    unitCostKvar: number;
    branch: PhaseLabel;
    lowUF: number;
    highUF: number;
    widthPercent: number;
    minusPercent: number;
    plusPercent: number;
    perLineTarget: boolean;
    leadingAllowed: boolean;
    upperBound: number | null;
    /** Single-line (trim) steps turned off: allowing them lets a build of a few units per line in. */
    trimsOff?: boolean;
  }) => {
    const bound = w.upperBound !== null ? `stay at or below ${w.upperBound.toFixed(3)} lagging` : w.leadingAllowed ? 'stay within the leading limit' : 'not lead';
    const relax = [
      ...(w.trimsOff ? ['allow single-line steps (correction.bank.trimSteps: auto), which need a controller that measures every line'] : []),
      ...(w.upperBound !== null ? ['raise or drop the upper bound (--upper-pf, target.maxLaggingPf)'] : []),
      ...(!w.leadingAllowed && w.upperBound === null ? ['let lines lead (--allow-leading, target.leading: allowed)'] : []),
      ...(w.perLineTarget ? ['judge one board-wide figure instead of every line (--definition effective or vector)'] : []),
      `give units with a narrower capacitance tolerance (correction.capacitanceTolerance, now −${trimmed(w.minusPercent)} % / +${trimmed(w.plusPercent)} %)`,
      'or cap correction.bank.maxUnitsPerBranch so the search builds from larger units (its verdict then says whether that build still holds the target across the tolerance)',
    ];
    return `the bank takes ${w.units} units, ${f1(w.unitCostKvar * w.units)} kvar-equivalent of per-unit cost beside ${f1(w.nameplateKvar)} kvar of nameplate, because the capacitance that holds the target across the tolerance is only ${w.widthPercent.toFixed(1)} % wide (${w.branch}: ${w.lowUF.toFixed(1)} – ${w.highUF.toFixed(1)} µF) and only small units land in it: ${w.perLineTarget ? 'every line' : 'the board figure'} must reach its minimum at −${trimmed(w.minusPercent)} % capacitance and ${bound} at +${trimmed(w.plusPercent)} %, and ${w.perLineTarget ? 'a line already near that bound leaves' : 'a board already near it leaves'} little room. To build it from fewer, larger units: ${relax.join('; ')}`;
  },
  /**
   * @param why the cheaper build's re-solved verdict where it is worse, or the warning of the limit it passes
   *   and the build kept does not (a verification warning's message)
   */
  cheaperBuildPassedOver: (units: number, cost: number, why: { verdict: 'meets-at-nominal' | 'misses' | 'withheld' | 'no-units' } | { limit: string }, builtUnits: number, builtCost: number, equalStepsOnly: boolean) =>
    `a cheaper build of ${units} unit${units === 1 ? '' : 's'} (cost ${f1(cost)}) fits the capacitance ranges, but re-solved with it ${
      'limit' in why ? why.limit : why.verdict === 'meets-at-nominal' ? 'the board meets the target only at nominal capacitance' : why.verdict === 'withheld' ? 'the board is worse off than without it' : 'the board misses the target'
    }: the bank is built from ${equalStepsOnly ? 'equal steps' : 'the next-best build'} instead (${builtUnits} unit${builtUnits === 1 ? '' : 's'}, cost ${f1(builtCost)})`,
  ckBelowResolution: (settingA: number, resolutionA: number, chosen: boolean) =>
    `the C/k setting (${settingA.toFixed(3)} A) is below about ${resolutionA} A, finer than controllers usually resolve (common practice, no source): ${chosen ? 'the smallest step is small for this CT' : 'a smaller CT primary'} or a larger smallest step brings it up`,
  outputsShort: (branches: readonly PhaseLabel[], outputs: number) =>
    `${branches.join(', ')}: no build fits in ${outputs} controller output${outputs === 1 ? '' : 's'}; steps were merged beyond what the controller allows`,
  stepSeriesWide: (ratio: number, smallest: StepWords, largest: StepWords, widest: number) =>
    `the switched steps span 1:${trimmed(ratio)} in C/k, from step ${stepWords(smallest)} to step ${stepWords(largest)}: wider than 1:${widest}, the largest step moves the reactive current by ${trimmed(ratio)} times the smallest's threshold, so the controller must take such a step series (binary 1:2:4:8 is the widest common one, common practice) or its band must hold that swing without hunting`,
  stepsBelowLeastOnCt: (steps: readonly StepWords[], ct: string, leastA: number) =>
    `on the ${ct} CT, chosen on the bank as built, step${steps.length === 1 ? '' : 's'} ${steps.map(stepWords).join(', ')} ${steps.length === 1 ? 'reads' : 'read'} below the least C/k of ${leastA.toFixed(3)} A the steps were chosen for: the controller may not tell ${steps.length === 1 ? 'it' : 'them'} from the CT's error; a CT of lower primary where the line current allows, or larger steps`,
  starPointShift: (shiftV: number, percent: number, lowV: number, highV: number, star: StarWord = 'star') =>
    `the floating ${star} point of the bank sits ${f1(shiftV)} V (${percent.toFixed(0)} % of line-to-neutral) from the centroid of the line voltages, so its elements see ${f1(lowV)}–${f1(highV)} V: a ${star} bank with unequal branches on a board without a neutral works against itself; consider a delta bank`,
  reactorsNeeded: (branches: readonly PhaseLabel[], capacitorShortfalls: readonly string[]) =>
    `with capacitors alone ${capacitorShortfalls.join('; ') || 'the target is not met'}: the recommended compensator includes reactors on ${branches.join(', ')} (Steinmetz/Gyugyi); set compensator.reactors: none for capacitors only`,
  reactorsNotSelected: 'reactors are given as continuous values only (kvar, mH); choosing reactor hardware is not part of this study',
  unbalanceWorse: (before: number, after: number, points: number) =>
    `the equipment makes the current unbalance worse: |I2|/|I1| rises from ${f1(before)} % to ${f1(after)} % (flagged above a rise of ${points} percentage points); the supply transformer and upstream motors carry the extra negative-sequence current`,
  neutralWorse: (before: number, after: number, ratingA: number | null) =>
    `the equipment raises the neutral current from ${f1(before)} A to ${f1(after)} A (flagged above a rise of 10 % and 1 A): ${
      ratingA === null
        ? 'check the neutral conductor against its rating (none is given in the file)'
        : after > ratingA
          ? `above the neutral's ${f1(ratingA)} A rating, as it already was without the equipment, and further now`
          : `within the neutral's ${f1(ratingA)} A rating, with less margin`
    }`,
  overloadCaused: (boardWords: string) => `with the equipment in, ${boardWords}; without it this does not happen — a larger conductor or supply, or another arrangement, is needed before this equipment is installed`,
  idealSource: 'the source impedance is zero, so the steady voltage rise and the resonance order cannot be estimated',
  /**
   * The target is measured upstream (`target.measuredAt`) and the equipment leaves its own board leading:
   * what solve says of a board led by its own capacitors, with where the target was judged.
   */
  equipmentBoardLeading: (board: string, point: string, lines: readonly { phase: PhaseLabel; pf: number }[], limit: number, kvar: { before: number; after: number }, lightLoadChecked: boolean) =>
    `the target is judged at ${meteringPointWords(point)}, but ${board} itself, where the equipment is connected, ends up leading: ${lines
      .map((l) => `line ${l.phase} at PF ${f3(l.pf)} leading`)
      .join(', ')} (below ${limit.toFixed(2)} leading, common practice, as solve flags a board led by its own capacitors); its lines go from ${kvar.before.toFixed(2)} to ${kvar.after.toFixed(2)} kvar, so its feeder carries capacitive current and the voltage there rises${
      lightLoadChecked ? '' : `; at light load it leads further (give a light-load condition, --light-load or the correction section's lightLoad, to check it)`
    }. Where that board's lines must not lead, size the equipment for a PF measured there, or split it between the boards`,
};

const kvarText = (x: number) => x.toFixed(2);
const listWords = (xs: readonly string[]) => (xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs.at(-1)}`);

/** What the words of a withheld build read (WithheldBuild with its idle lines labelled). */
type WithheldWordsOf = Omit<WithheldBuild, 'reasons' | 'idleLinesLoaded'> & {
  readonly reasons: readonly string[];
  readonly idleLinesLoaded: readonly { readonly line: string; readonly currentA: number }[];
};

/** The words of a study that ends with nothing to build (nothingToBuild.ts holds the figures). */
export const nothingToBuildWords = {
  why: (w: {
    readonly needs: readonly { readonly line: string; readonly kW: number; readonly kvar: number; readonly pfBefore: number | null; readonly pfTarget: number; readonly neededKvar: number }[];
    readonly minStepKvar: number;
    readonly smallestUnits: readonly { readonly branchLabel: string; readonly line: string; readonly unitName: string; readonly capacitanceUF: number; readonly kvarAtAppliedV: number; readonly minimumUF: number; readonly maximumUF: number | null }[];
    readonly tolerance: { readonly minusPercent: number; readonly plusPercent: number } | null;
    readonly withheld: WithheldWordsOf | null;
    readonly definitionWords: string;
  }): string => {
    const parts: string[] = [];
    for (const n of w.needs) {
      // tan φ of the band the target sets on Q/|P| (correctionTarget.ts): an exporting line is written with |P|.
      const exporting = n.kW < 0;
      const tan1 = n.kvar / Math.abs(n.kW);
      const tan2 = Math.tan(Math.acos(n.pfTarget));
      parts.push(
        `line ${n.line} needs ${kvarText(n.neededKvar)} kvar to go from PF ${n.pfBefore === null ? '-' : f3(n.pfBefore)} to ${f3(n.pfTarget)} (Q = ${exporting ? '|P|' : 'P'}·(tan φ1 − tan φ2) = ${kvarText(Math.abs(n.kW))} kW × (${f3(tan1)} − ${f3(tan2)})${exporting ? '; the line exports active power' : ''})`,
      );
      if (n.neededKvar < w.minStepKvar)
        parts.push(
          `that is below the least step the bank may switch, ${kvarText(w.minStepKvar)} kvar (bank.minStepKvar)${w.minStepKvar > n.kvar ? `, and a step that size would make line ${n.line} lead: its whole lagging demand is ${kvarText(n.kvar)} kvar` : ''}`,
        );
    }
    for (const u of w.smallestUnits) {
      const tol = w.tolerance;
      const short = u.capacitanceUF < u.minimumUF;
      const past = u.maximumUF !== null && u.capacitanceUF > u.maximumUF;
      const twoPast = u.maximumUF !== null && 2 * u.capacitanceUF > u.maximumUF;
      const unit = `the smallest unit that suits ${u.branchLabel}, ${u.unitName} (${u.capacitanceUF.toFixed(1)} µF, ${kvarText(u.kvarAtAppliedV)} kvar at the solved voltage)`;
      if (u.maximumUF !== null && u.maximumUF < u.minimumUF)
        parts.push(
          `no capacitance on ${u.branchLabel} holds the target${tol ? ` at −${trimmed(tol.minusPercent)} %` : ''} (at least ${u.minimumUF.toFixed(1)} µF) and keeps line ${u.line} within its bound${tol ? ` at +${trimmed(tol.plusPercent)} %` : ''} (at most ${u.maximumUF.toFixed(1)} µF); the smallest unit that suits it, ${u.unitName}, is ${u.capacitanceUF.toFixed(1)} µF (${kvarText(u.kvarAtAppliedV)} kvar at the solved voltage)`,
        );
      else if (past) parts.push(`${unit} is above the ${u.maximumUF!.toFixed(1)} µF past which line ${u.line} passes its bound${tol ? ` at +${trimmed(tol.plusPercent)} % capacitance` : ''}: it would make the line lead`);
      else if (short)
        parts.push(
          `${unit} is below the ${u.minimumUF.toFixed(1)} µF the target needs${tol ? ` at −${trimmed(tol.minusPercent)} % capacitance` : ''}${twoPast ? `, and two (${(2 * u.capacitanceUF).toFixed(1)} µF) are above the ${u.maximumUF!.toFixed(1)} µF past which line ${u.line} leads` : ''}`,
        );
    }
    if (w.withheld) parts.push(nothingToBuildWords.withheld(w.withheld, w.definitionWords));
    return parts.length ? parts.join('; ') : 'no build of the available units brings the board nearer the target';
  },
  /** A build verified and not offered, and what it would have done. */
  withheld: (
    h: WithheldWordsOf,
    definitionWords: string,
  ): string => {
    const what = h.reasons.includes('reactors-alone')
      ? `its reactors alone (${kvarText(h.reactorKvar)} kvar; none of its capacitors could be built, and the reactors are there to balance what the capacitors correct)`
      : `${kvarText(h.capacitorKvar)} kvar of capacitors${h.reactorKvar > 0 ? ` and ${kvarText(h.reactorKvar)} kvar of reactors` : ''}`;
    const effects = [
      ...(h.targetPfBefore !== null && h.targetPfWithBuild !== null && h.targetPfWithBuild < h.targetPfBefore ? [`lower the ${definitionWords} from ${f3(h.targetPfBefore)} to ${f3(h.targetPfWithBuild)}`] : []),
      ...h.idleLinesLoaded.map((l) => `load line ${l.line}, which carried nothing, with ${l.currentA.toFixed(1)} A`),
    ];
    return `the best build of the available units, ${what}, was re-solved and is not offered${effects.length ? `: it would ${listWords(effects)}` : ''}`;
  },
  advice: (lines: readonly { readonly line: string; readonly loads: readonly { readonly name: string; readonly kvar: number }[] }[], boardKvar: number, boardPf: number | null) => {
    // A load on several lines (a three-phase motor) is named once, with its lines: its kvar is the whole load's.
    const byLoad = new Map<string, { kvar: number; lines: string[] }>();
    for (const l of lines)
      for (const x of l.loads) {
        const seen = byLoad.get(x.name);
        if (seen) seen.lines.push(l.line);
        else byLoad.set(x.name, { kvar: x.kvar, lines: [l.line] });
      }
    const unique = [...byLoad].map(([name, x]) => `${quoteText(name)} (${kvarText(x.kvar)} kvar lagging, ${x.lines.length > 1 ? `lines ${listWords(x.lines)}` : `line ${x.lines[0]}`})`);
    return `nothing is to be built at the board. Either correct at the equipment — a capacitor at the terminals of ${unique.length ? listWords(unique) : 'the loads drawing the lagging current'}, switched with it; beside a motor keep it below the motor's no-load reactive power, or the motor can self-excite when it is switched off (common practice) — or accept the PF as it is: the board draws ${kvarText(boardKvar)} kvar${boardPf === null ? '' : ` (vector PF ${f3(boardPf)})`}, which matters only where the supply charges for reactive energy or a conductor is near its rating`;
  },
};

/** Cautions for a study with nothing to build: the model's, and the one for a capacitor added at the equipment as advised. */
export const nothingToBuildCautions = (ground: 'earth' | 'ground'): readonly string[] => [correctionCautions(ground)[0]!, MODEL_CAUTION];

/** The caution that holds with or without equipment to install. */
export const MODEL_CAUTION =
  'These figures come from the model you entered. Any bank or compensator must be designed to the local codes and checked by a licensed professional before it is installed.';

/** Shown with every correction result that adds equipment, in the region's words ("earth" or "ground"). */
export const correctionCautions = (ground: 'earth' | 'ground'): readonly string[] => [
  `Capacitors hold their charge after they are switched off. Each unit needs a discharge device that is always connected (IEC 60831-1: down to 75 V or less within 3 minutes; NEC 460.6: 50 V or less within 1 minute); wait at least that long, prove the terminals dead, then short them together and to ${ground} before touching.`,
  'Switching a capacitor step on draws a short, high inrush current, far higher when other steps are already energised: use contactors rated for capacitor duty with damping resistors or reactors, and let a step discharge before it is switched on again.',
  'Adding capacitance moves the supply resonance down in frequency. This study does not check harmonics: check resonance and capacitor duty against the harmonic spectrum of the board separately before installing.',
  MODEL_CAUTION,
];

/** A capacitor branch from a line to the neutral, as the lost-neutral wording names it. */
export interface NeutralTiedBranch {
  readonly branch: PhaseLabel;
  /** Output at the solved voltage, kvar. */
  readonly kvar: number;
}

/** What the equipment's own line-to-neutral capacitors do with the neutral lost and nothing else on the board (Millman). */
export interface FloatingBankFigures {
  /** The branch that sees the most, and the voltage across it, V. */
  readonly branch: PhaseLabel;
  readonly volts: number;
  /** The line-to-neutral voltage it is judged against, V. */
  readonly lineToNeutralV: number;
  /** The lowest unit rating on that branch, V (across the branch); null where no unit was chosen. */
  readonly ratedV: number | null;
}

/**
 * The caution for equipment that puts capacitors from a line to the neutral: the broken-neutral study's
 * own words (openNeutralWording.ts), after a sentence naming the branches, so `trivar correct` and the
 * study say the same of the same capacitors.
 */
export const lostNeutralCaution = (what: string, branches: readonly NeutralTiedBranch[], basis: string, phasesWord: string, star: StarWord): string =>
  `The ${what} puts capacitors from line to neutral (${branchKvars(branches, basis)}): a lost neutral leaves them in series with the loads of the other ${phasesWord}. ${lineToNeutralCapacitorsCaution(phasesWord, star)}`;
/** "A-N 8.33, B-N 1.00, C-N 5.00 kvar nameplate". */
const branchKvars = (branches: readonly NeutralTiedBranch[], basis: string) => `${branches.map((b) => `${b.branch} ${b.kvar.toFixed(2)}`).join(', ')} kvar ${basis}`;

/**
 * Said as a warning where the branches are unequal: the bank's own star point floats even with no load,
 * before any resonance with the loads, and the figure shows by how much.
 */
export const lostNeutralUnequal = (what: string, branches: readonly NeutralTiedBranch[], basis: string, f: FloatingBankFigures, star: StarWord, between: string): string => {
  const rated = f.ratedV === null ? '' : `, ${(f.volts / f.ratedV).toFixed(2)} × their ${f.ratedV.toFixed(0)} V rating`;
  return `the ${what}'s line-to-neutral branches are unequal (${branchKvars(branches, basis)}): with the neutral lost, even with nothing else on the board its ${star} point floats and the ${f.branch} capacitors see ${f1(f.volts)} V (${(f.volts / f.lineToNeutralV).toFixed(2)} × line-to-neutral${rated}); with the loads in series it can be far more (see the cautions). Where a lost neutral is credible, correct between lines (${between}), or run the broken-neutral study (studies: openNeutral) with the bank written as loads`;
};

/** The correction cautions in IEC words (the library's constant; reports use the board's region). */
export const CORRECTION_CAUTIONS: readonly string[] = correctionCautions('earth');

export const sizingMethod = {
  perLine:
    'least total kvar such that every line meets its target and none passes its upper bound: a linear programme in the branch ratings, re-linearised on the solved board until the ratings settle',
  equal: (definition: string) =>
    `equal kvar in every branch (one three-phase bank), the smallest that brings the board's ${definition} power factor to the target with no line passing its upper bound; the board is re-solved at every trial size`,
  proportional: (definition: string) =>
    `branch ratings in proportion to what each branch needs to bring the lines to their upper bound, scaled to the smallest total that brings the board's ${definition} power factor to the target; the board is re-solved at every trial size`,
};

export const compensatorWording = {
  objective: (w: { negativeSequence: number; zeroSequence: number; reactive: number }, zero: boolean, ridge: number, leadingBound: boolean) =>
    `minimise ${w.negativeSequence}·|I2|²${zero ? ` + ${w.zeroSequence}·|I0|²` : ''} + ${w.reactive}·(Q1 − Q1,target)², currents per unit of the uncorrected |I1| and Q per unit of 3·V·|I1|, plus ${ridge}·Σ(branch kvar per unit)² to pick the smallest bank among equals; subject to every branch being a capacitor (B ≥ 0)${leadingBound ? ' and no line passing its lower power-factor bound (leading)' : ''}. The currents are linear in the susceptances, so this is a convex QP, solved exactly at each re-linearisation of the solved board`,
  leadingDropped: 'the capacitor-only compensator could not keep every line from leading while balancing; the leading bound was dropped for it and the result reports which lines lead',
  notConverged: (kind: string, iterations: number) => `the ${kind} compensator did not settle in ${iterations} iterations`,
};

const TARGET_WORDS: Record<TargetName, string> = { 'power-factor': 'the power-factor target', balance: 'the balance target' };

/** PF1+, |I2|/|I1| and the neutral with the small branch and without it; a PF that misses the target without it shows the digits that tell the two apart. */
function effectFigures(e: SmallBranch['effect']): string {
  const pf = (x: number | null) => (x === null ? 'none' : f3(x));
  const pfMissed = e.missedWithout.includes('power-factor') && e.with.positiveSequencePf !== null && e.without.positiveSequencePf !== null;
  const [pfWithout] = pfMissed ? distinctDigits(e.without.positiveSequencePf!, e.with.positiveSequencePf!) : [pf(e.without.positiveSequencePf)];
  const neutral = e.with.neutralPercent === null || e.without.neutralPercent === null ? '' : `, neutral ${e.with.neutralPercent.toFixed(2)} → ${e.without.neutralPercent.toFixed(2)} % of |I1|`;
  return `PF1+ ${pf(e.with.positiveSequencePf)} → ${pfWithout}, |I2|/|I1| ${e.with.negativeSequenceCurrentPercent.toFixed(2)} → ${e.without.negativeSequenceCurrentPercent.toFixed(2)} %${neutral}`;
}

/** A branch of the exact ideal solution below the negligible share (`percent` of the compensator), what became of it and why. */
export function smallBranchWords(b: Omit<SmallBranch, 'branch'> & { branch: PhaseLabel }, percent: number): string {
  checkObjectArgument(b, 'b', "a compensator's small branch (sizing.smallBranches[i]) with its branch label", ['kvarAtNominalV', 'effect', 'branch']);
  checkNumberArgument(percent, 'percent', 'a share, %: a finite number');
  const what = `${b.kvarAtNominalV > 0 ? 'a capacitor' : 'a reactor'} of ${Math.abs(b.kvarAtNominalV).toFixed(2)} kvar on ${b.branch}, below ${f1(percent)} % of the compensator`;
  const without = `without it (the other branches re-sized by at most ${b.effect.largestResizeKvar.toFixed(2)} kvar, the board re-solved)`;
  const has = b.afterOthersLeftOut ? `sized again around the branches left out, the compensator has ${what}` : `the exact solution ${b.leftOut ? 'also ' : ''}has ${what}`;
  return b.leftOut
    ? `${has}: left out, because ${without} every target it met is still met — ${effectFigures(b.effect)}`
    : `${has}, kept: ${without} the board misses ${b.effect.missedWithout.map((t) => TARGET_WORDS[t]).join(' and ')} — ${effectFigures(b.effect)}`;
}

/**
 * The branches the capacitor-only compensator does without, in one sentence: what the programme spread
 * onto them and the board with them and without them (all left out, the rest solved again).
 * @example
 * sparedBranchesWords([{ branch: 'A-N', kvarAtNominalV: 7.17, effect }, …], 6)
 * //=> 'fewer branches: the programme spread the output over 6 branches; A-N (7.17 kvar), … left out and the others sized again, every target still met — PF1+ 0.950 → 0.950, |I2|/|I1| 0.00 → 0.03 %'
 */
export function sparedBranchesWords(spared: readonly (Omit<SparedBranch, 'branch'> & { branch: PhaseLabel })[], spreadOver: number, allowancePercent: number): string {
  checkListArgument(spared, 'spared', "a non-empty list of a compensator's spared branches with their labels", (x) => typeof x === 'object' && x !== null);
  if (spared.length === 0) throw argumentIssueError('spared', "a non-empty list of a compensator's spared branches with their labels", spared);
  const first = spared[0]!.effect.with;
  const last = spared[spared.length - 1]!.effect.without;
  const effect = effectFigures({ with: first, without: last, largestResizeKvar: 0, missedWithout: [] });
  const names = spared.map((b) => `${b.branch} (${b.kvarAtNominalV.toFixed(2)} kvar)`).join(', ');
  return `fewer branches: the programme spread the output over ${spreadOver} branches; ${names} left out and the others sized again, because without ${spared.length === 1 ? 'it' : 'them'} every target is still met and the balance is within ${f1(allowancePercent)} % of |I1| of what it was — ${effect}`;
}

/** How a build from units fares when re-solved, as a clause after "the board". */
export const BUILD_VERDICT_WORDS: Readonly<Record<BuildVerdict, string>> = {
  meets: 'meets the target',
  'meets-at-nominal': 'meets the target at nominal capacitance only',
  misses: 'misses the target',
  withheld: 'is made worse (that build is not offered)',
  'no-units': 'finds no units that fit',
};

export const selectionWording = {
  typicalNote:
    'typical ratings, not any vendor\'s range: check the real ratings, tolerance and discharge time of the units you buy',
  userNote: 'units from the catalogue given',
  /**
   * @param ratings the catalogue's ratings, each with its frequency factor f/f_r (a 60 Hz unit on a 50 Hz
   *   board gives 5/6 of its output), which the delivery rule counts as well as (V/V_r)²
   */
  noUnit: (
    branches: readonly PhaseLabel[],
    neededV: number,
    nominalV: number,
    floating: boolean,
    catalogue: string,
    floorPercent: number,
    units: readonly { readonly ratedV: number; readonly hzFactor: number }[],
    star: StarWord = 'star',
  ) => {
    const ratings = [...new Set(units.map((u) => u.ratedV))].sort((a, b) => a - b);
    // The way out the user controls: the lowest rating the voltage rule allows, and the floor that would take it.
    const nearest = ratings.find((v) => v >= neededV);
    const hzFactor = units.find((u) => u.ratedV === nearest)?.hzFactor ?? units[0]?.hzFactor ?? 1;
    const highestV = nominalV * Math.sqrt(hzFactor / (floorPercent / 100));
    const delivers = nearest === undefined ? 0 : 100 * (nominalV / nearest) ** 2 * hzFactor;
    const frequencyWords = hzFactor === 1 ? "" : ", the frequency counted";
    const remedy =
      neededV > highestV
        ? `; no rating meets both at this voltage: only a lower deliveryFloorPercent in the correction does (${Math.floor(100 * (nominalV / neededV) ** 2)} for a ${f1(neededV)} V unit)`
        : nearest !== undefined && Math.floor(delivers) >= 1
        ? `; the nearest, ${nearest} V, delivers ${delivers.toFixed(1)} % there${frequencyWords} (a deliveryFloorPercent of ${Math.floor(delivers)} in the correction accepts it), or give a catalogue with units rated ${f1(neededV)}–${f1(highestV)} V`
        : `; give a catalogue with units rated ${f1(neededV)}–${f1(highestV)} V`;
    return `no unit in the ${catalogue} fits ${branches.join(', ')}: a unit there must be rated at least ${f1(neededV)} V and still deliver ${floorPercent.toFixed(0)} % of its nameplate at ${floating ? `the ${f1(nominalV)} V across it as solved (the ${star} point floats)` : `the nominal ${f1(nominalV)} V across it`}${hzFactor === 1 ? '' : `, its output scaled by ${f3(hzFactor)} for running at the board's frequency instead of its rated one`}, i.e. be rated at most ${f1(highestV)} V; the catalogue has ${ratings.map((v) => `${v}`).join(', ')} V${remedy}`;
  },
  /**
   * @param preference `equal-steps`: equal steps wherever one fits (the study's second candidate)
   * @param singleLineStepsKvar what single-line steps must save to be chosen over equal ones; null where none were weighed
   */
  costStatement: (unitCostKvar: number, preference: 'least-cost' | 'equal-steps' = 'least-cost', singleLineStepsKvar: number | null = null) =>
    `least cost = nameplate kvar + ${unitCostKvar} kvar-equivalent per unit bought${
      preference === 'least-cost' && singleLineStepsKvar !== null ? ` (single-line steps ranked ${trimmed(singleLineStepsKvar)} dearer: every line measured, coarser steps)` : ''
    }, among the builds ${preference === 'equal-steps' ? 'of equal steps (single-line steps only where none fits) ' : ''}that best fit the tolerance window and the controller outputs with no switched step below the least step`,
  /** The cost of a detuned bank: its capacitors' real nameplate and its detuning reactors, counted as a compensator's reactors are. */
  detunedCostStatement: (unitCostKvar: number, percent: number, reactorFactor: number) =>
    `cost = nameplate kvar of the capacitors + ${unitCostKvar} kvar-equivalent per unit bought + the ${percent} % detuning reactors at ${reactorFactor} × their kvar (${percent} % of the capacitors' nameplate); the units were chosen as their fundamental equivalents behind the reactors`,
};

/**
 * The lines a target holds only to "lead no more than before": they led before correction, and adding
 * capacitors can only add to a lead, so the target's PF and "never leading" cannot apply there.
 * @example exemptLeadingWords([{ line: 'B', pfBefore: 0.864, pfAfter: 0.866 }])
 */
export const exemptLeadingWords = (lines: readonly { line: PhaseLabel; pfBefore: number | null; pfAfter: number | null }[]): string => {
  checkListArgument(lines, 'lines', 'the exempt lines, at least one { line, pfBefore, pfAfter }', (l) => typeof l === 'object' && l !== null && typeof (l as { line?: unknown }).line === 'string');
  if (lines.length === 0) throw argumentIssueError('lines', 'the exempt lines, at least one { line, pfBefore, pfAfter }', lines);
  const many = lines.length > 1;
  const figures = lines.map((l) => `${many ? `${l.line} ` : ''}${l.pfBefore === null ? 'no current' : `PF ${f3(l.pfBefore)} leading`}${l.pfAfter === null ? '' : ` before, ${f3(l.pfAfter)} after`}`).join('; ');
  return `line${many ? 's' : ''} ${lines.map((l) => l.line).join(', ')} already led before correction (${figures}): capacitors cannot stop a leading line leading, so ${many ? 'they are' : 'it is'} held only to lead no more than before, not to the PF or "never leading" of the target`;
};

/**
 * Where the losses a correction compares are: the source and feeder of a main (or single) board; on a
 * sub-board only its own feeder from the board feeding it (the installation's total is the installation
 * effect's). `incomer` is the sub-board's `BoardResult.incomer`, null on a main board.
 */
export const lossesPlaceWords = (incomer: { readonly fedFrom: string } | null): string => {
  if (incomer !== null) {
    checkObjectArgument(incomer, 'incomer', 'a sub-board\'s incomer { fedFrom } (verification.before.incomer), or null for a main board', ['fedFrom']);
    checkTextArgument(incomer.fedFrom, 'incomer.fedFrom', 'the name of the board feeding it');
  }
  return incomer ? `its feeder from ${incomer.fedFrom}` : 'source + feeder';
};

/**
 * How a controller whose steps serve single lines reads every line: one CT per line, or, where its CT's place
 * has three lines and no neutral, two CTs, the third line's current being minus the sum of the other two
 * (Blondel: n − 1 measuring elements on n wires). `reading`: the solved board where the CT reads (the
 * equipment's board, or the metering point's).
 */
export function everyLineReadingWords(reading: { readonly phases: readonly unknown[]; readonly neutral: unknown }): string {
  checkObjectArgument(reading, 'reading', 'a solved board { phases, neutral } where the CT reads (verification.before, or verification.metering.before)', ['phases', 'neutral']);
  checkListArgument(reading.phases, 'reading.phases', 'the board\'s lines as solved');
  const threeWire = reading.phases.length === 3 && reading.neutral === null;
  return threeWire ? "two CTs do on a board without a neutral: the third line's current is minus the sum of the other two, Blondel's n − 1 elements on n wires; or one CT per line" : 'one CT per line';
}

/** The lines a verdict passes only under the "lead no more than before" rule: they led before correction and still lead. */
export const exemptLeadingLines = (check: { readonly leadingBefore: readonly PhaseId[]; readonly lines: readonly { readonly phase: PhaseId; readonly sense: string }[] }): PhaseId[] => {
  checkObjectArgument(check, 'check', 'a correction check (verification.check) with leadingBefore and lines', ['leadingBefore', 'lines']);
  checkListArgument(check.leadingBefore, 'check.leadingBefore', 'the lines that led before correction');
  checkListArgument(check.lines, 'check.lines', 'the lines judged', (l) => typeof l === 'object' && l !== null);
  return check.leadingBefore.filter((p) => check.lines.find((l) => l.phase === p)?.sense === 'leading');
};

const bankWords = (delivered: number, nameplate: number) => `${delivered.toFixed(2)} kvar delivered (${nameplate.toFixed(2)} kvar nameplate)`;

export const reportSummary = {
  'meets-target': (what: string, delivered: number, nameplate: number) => `${what}: ${bankWords(delivered, nameplate)} meets the target`,
  'meets-target-at-nominal-capacitance': (what: string, delivered: number, nameplate: number) =>
    `${what}: ${bankWords(delivered, nameplate)} meets the target at nominal capacitance but not at every end of the tolerance`,
  'already-meets-target': (what: string) => `${what}: the board already meets the target, nothing to add`,
  'misses-target-with-available-units': (what: string, delivered: number, nameplate: number) =>
    `${what}: the best build of the available units, ${bankWords(delivered, nameplate)}, misses the target`,
  /** With `unbuilt`, the branches no unit suits while the rest was built (`delivered`, `nameplate`). */
  'no-suitable-units': (what: string, delivered = 0, nameplate = 0, unbuilt: readonly string[] = []) =>
    unbuilt.length && nameplate > 0
      ? `${what}: no unit of the catalogue suits ${unbuilt.join(', ')}; the rest, ${bankWords(delivered, nameplate)}, is built without ${unbuilt.length === 1 ? 'it' : 'them'} below`
      : `${what}: no unit of the catalogue suits the voltage across the bank`,
  infeasible: (what: string, delivered: number, nameplate: number) =>
    `${what}: the target cannot be met with capacitors in this arrangement; the best reachable build is ${bankWords(delivered, nameplate)}`,
  'nothing-to-build': (what: string) => `${what}: no build of the available units brings the board nearer the target, so nothing is to be built (see why below)`,
};

/** A three-phase board's names: the star bank in the region's word (a wye bank in North America). */
const THREE_PHASE_NAMES: Readonly<Record<StarWord, Readonly<Record<Arrangement, string>>>> = {
  star: { 'star-bank': 'star bank', 'delta-bank': 'delta bank', 'balancing-compensator': 'balancing compensator' },
  wye: { 'star-bank': 'wye bank', 'delta-bank': 'delta bank', 'balancing-compensator': 'balancing compensator' },
};
/**
 * Star and delta need three phases: on a split-phase or single-phase board the same equipment is
 * capacitors from a line to the neutral, and across the two lines. Only the words change; the
 * arrangement's value (`star-bank`, `delta-bank`) is the same on every board.
 */
const TWO_LINE_NAMES: Readonly<Record<Arrangement, string>> = { 'star-bank': 'line-to-neutral bank', 'delta-bank': 'line-to-line bank', 'balancing-compensator': 'balancing compensator' };
/**
 * A single-phase (2-wire) board has one line and the neutral: the one bank that fits is capacitors
 * across the supply, so "line-to-neutral" tells nothing apart. The other names appear only where
 * the file asks for an arrangement that does not fit.
 */
const SINGLE_PHASE_NAMES: Readonly<Record<Arrangement, string>> = { ...TWO_LINE_NAMES, 'star-bank': 'capacitor bank' };
/** The arguments of the naming helpers: a board's system and region, never a guess for anything else. */
const checkedSystem = (system: unknown, region: unknown): true => {
  checkWordArgument(system, 'system', SYSTEMS);
  checkWordArgument(region, 'region', REGIONS);
  return true;
};
const threePhase = (system: string): boolean => system === 'three-phase-4wire' || system === 'three-phase-3wire';

/** What each arrangement is called in sentences and tables on a board of this system, in its region's words (conventions.region). */
export const arrangementNames = (system: string, region: Region): Readonly<Record<Arrangement, string>> =>
  checkedSystem(system, region) && threePhase(system) ? THREE_PHASE_NAMES[starWordOf(region)] : system === 'single-phase' ? SINGLE_PHASE_NAMES : TWO_LINE_NAMES;

/** Each arrangement said in full, for a report's heading line, on a board of this system, in its region's words. */
export const arrangementDescriptions = (system: string, region: Region): Readonly<Record<Arrangement, string>> =>
  checkedSystem(system, region) && threePhase(system)
    ? {
        'star-bank': `${starWordOf(region)}-connected capacitor bank (one capacitor per phase)`,
        'delta-bank': 'delta-connected capacitor bank (one capacitor per line pair)',
        'balancing-compensator': 'balancing compensator (Steinmetz/Gyugyi reactive branches)',
      }
    : system === 'single-phase'
      ? {
          'star-bank': 'capacitor bank across the supply (line to neutral)',
          'delta-bank': 'line-to-line capacitor bank (needs two lines)',
          'balancing-compensator': 'balancing compensator (Steinmetz/Gyugyi reactive branches)',
        }
      : {
          'star-bank': 'line-to-neutral capacitor bank (capacitors from each line to the neutral)',
          'delta-bank': 'line-to-line capacitor bank (capacitors across the two lines)',
          'balancing-compensator': 'balancing compensator (Steinmetz/Gyugyi reactive branches)',
        };

const STATUS_SHORT: Record<string, string> = {
  'meets-target': 'meets the target across the capacitance tolerance',
  'meets-target-at-nominal-capacitance': 'meets the target at nominal capacitance only',
  'already-meets-target': 'has nothing to add',
  'misses-target-with-available-units': 'misses the target with the available units',
  infeasible: 'cannot reach the target with capacitors',
  'no-suitable-units': 'has no unit that suits the voltage across its branches (some or all)',
  'nothing-to-build': 'has no build of the available units that brings the board nearer the target',
};

export const comparisonWording = {
  rule: 'first an arrangement that meets the target across the capacitance tolerance, then at nominal capacitance, then one that meets it but overloads a conductor or the supply; among those the least cost (nameplate kvar + 2 kvar-equivalent per unit, a reactor counted at twice its kvar); costs within 5 % are equal and the lower losses decide',
  noneStudied: 'no arrangement could be studied with these settings',
  why: (
    name: string,
    status: string,
    f: { cost: number; lossesKW: number },
    others: readonly { name: string; status: string; cost: number; lossesKW: number; overloads: boolean; withheld?: string | null; resonates?: boolean }[],
    tieOnCost: boolean,
  ) => {
    // Nothing bought (no unit, no reactor) has no cost to quote: say so in words instead of "cost 0.0".
    const nothingAdded = (cost: number) => cost < 1e-9;
    const head =
      status === 'already-meets-target'
        ? `${name}: the board already meets the target, nothing to add`
        : status === 'meets-target' || status === 'meets-target-at-nominal-capacitance'
          ? nothingAdded(f.cost)
            ? `${name}: ${STATUS_SHORT[status]} with nothing added to the board`
            : `${name}: ${STATUS_SHORT[status]} at ${tieOnCost ? 'about the least cost and with the lowest losses' : 'the least cost'} (cost ${f.cost.toFixed(1)})`
          : status === 'nothing-to-build'
            ? `nothing to build: ${others.length ? 'no arrangement meets the target; the ' : 'the '}${name} ${STATUS_SHORT[status]}`
          : others.length
            ? `${name}: no arrangement meets the target; this one comes closest (${STATUS_SHORT[status]})`
            : `${name}: the only arrangement studied ${STATUS_SHORT[status]}`;
    if (status === 'already-meets-target') return head;
    const rest = others.map((o) =>
      o.overloads
        ? `${o.name} ${STATUS_SHORT[o.status]} but overloads what feeds it${nothingAdded(o.cost) ? '' : ` (cost ${o.cost.toFixed(1)})`}`
        : o.withheld
          ? `${o.name}: ${o.withheld}`
          : o.resonates
            ? `${o.name} ${STATUS_SHORT[o.status]} but resonates with the supply near a harmonic order in a step state (cost ${o.cost.toFixed(1)})`
            : o.status !== status
          ? `${o.name} ${STATUS_SHORT[o.status]}`
          : nothingAdded(o.cost)
            ? `${o.name} also adds nothing`
            : `${o.name} costs ${o.cost.toFixed(1)}`,
    );
    return rest.length ? `${head}; ${rest.join('; ')}` : head;
  },
  /** Said where the recommended build resonates near a harmonic order in a step state: none meets the target clear of one. */
  resonates: (name: string, clearOnes: readonly string[]) =>
    `note: the recommended ${name}'s supply resonance lies near a harmonic order in a step state its controller can reach (an estimate: the board's harmonic currents are not given); it needs the harmonic study its warnings name, and a detuned bank where the board has harmonic-producing loads${clearOnes.length ? ` (the ${clearOnes.join(' and the ')}, dearer, ${clearOnes.length > 1 ? 'are' : 'is'} clear of one; the estimate alone does not rank)` : ''}`,
  /** What a compared arrangement overloads, said beside the recommendation. */
  overloads: (name: string, recommended: boolean, messages: readonly string[]) =>
    `${recommended ? 'note: no arrangement meets the target without an overload; with the recommended' : 'with the'} ${name} in, ${messages.join('; ')}`,
  /**
   * Said first where the board leads because of its own capacitive loads (the `line-leading` warning): the
   * usual remedy is to switch or reduce them, and any equipment sized here only works against them.
   */
  ownCapacitorsLead: (warning: string) =>
    `note: ${warning.replace(/; switch or reduce the capacitors to follow the load$/, '')}; switching or reducing those capacitors (an automatic bank that follows the load) is the usual remedy, and equipment sized here would only work against them`,
  /** What a compared arrangement makes notably worse, said beside the recommendation. */
  balanceWorse: (name: string, recommended: boolean, changes: readonly { code: string; before: number; after: number }[]) =>
    `${recommended ? 'note: the recommended' : 'the'} ${name} ${changes
      .map((c) => (c.code === 'unbalance-worse' ? `raises |I2|/|I1| from ${f1(c.before)} % to ${f1(c.after)} %` : `raises the neutral current from ${f1(c.before)} A to ${f1(c.after)} A`))
      .join(' and ')}`,
};

/** Where a target is measured, in words: the origin of the installation, or a board's incomer (see meteringPoint.ts). */
export function meteringPointWords(point: string): string {
  // null read "the incomer of null".
  if (typeof point !== 'string' || point.length === 0) throw argumentIssueError('point', '"origin" or the name of a board', point);
  return point === 'origin' ? "the origin of the installation (the supply's terminals, where the service cable starts)" : `the incomer of ${point}`;
}

/**
 * A target measured away from the bank: its controller must read there (the CT of the controller's
 * settings is for that point), or hold a band set for where it reads, on a CT for the currents there.
 * @param boardA the largest line current at the equipment's board before and after correction, A
 */
export const meteringWarning = (point: string, board: string, ctChosen: boolean, boardA: { readonly before: number; readonly after: number }): string =>
  `the target is measured at ${meteringPointWords(point)}, not at ${board}: the controller's CT is ${ctChosen ? 'chosen' : 'checked'} for that point, so put it there and the controller holds its band where the target is judged; a controller reading a CT at ${board} holds its band at ${board} instead, so set that band for the PF at ${board} that gives the target at the metering point (the PF reached at ${board} is in the lines table), and choose that CT on the line currents at ${board} (up to ${f1(boardA.before)} A before and ${f1(boardA.after)} A after correction)`;

/** Where a controller's CT goes, in words (CtBasis.placeWords). */
export function ctPlaceWords(place: CtBasis['place'], point: string | null): string {
  if (place === 'metering-point') return `${meteringPointWords(point!)}, where the target is measured`;
  return point === null ? 'the incomer of the board the equipment is on' : `the incomer of ${point}, the board the equipment is on`;
}

/** A state of the switched steps in words: "with the reactors in and every switched step out", "with outputs 1 and 3 in, the others out". */
export function stepStateWords(st: Pick<StepStateCurrent, 'outputsIn' | 'outputsOut' | 'fixedPart'>): string {
  const kept = st.fixedPart.reactors && st.fixedPart.capacitors ? 'the reactors and the fixed capacitors' : st.fixedPart.reactors ? 'the reactors' : st.fixedPart.capacitors ? 'the fixed part' : null;
  const list = (xs: readonly number[]) => (xs.length === 1 ? `${xs[0]}` : `${xs.slice(0, -1).join(', ')} and ${xs.at(-1)}`);
  const outputs = !st.outputsIn.length
    ? 'every switched step out'
    : `output${st.outputsIn.length === 1 ? '' : 's'} ${list(st.outputsIn)} in and ${st.outputsOut.length === 1 ? `output ${st.outputsOut[0]}` : `outputs ${list(st.outputsOut)}`} out`;
  return kept ? `with ${kept} in and ${outputs}` : `with ${outputs}`;
}

/** The current a controller's CT is chosen on or checked against, in words (CtBasis.currentWords). */
export function ctCurrentWords(b: Pick<CtBasis, 'sizedOn' | 'currentA' | 'largestLineCurrentA' | 'afterFrom' | 'stepState' | 'capacitance'>): string {
  if (b.sizedOn === 'given' || b.largestLineCurrentA === null) return `${f1(b.currentA)} A, the line current given (lineCurrentA)`;
  const sized = b.afterFrom === 'as-sized' ? ', as sized' : '';
  const c = b.capacitance ?? null;
  // The tolerance end the figure is read at, where it was: the one that draws more where the CT reads.
  const atEnd = c === null ? '' : `, with the capacitors at the ${capacitanceEndWords(c.capacitanceFactor)} end of their tolerance, the end that draws more there`;
  const afterAtEnd = c === null ? b.largestLineCurrentA.after : c.afterA[c.end];
  // A state of the steps between the ends draws more than either: it is the figure, and the state is named.
  if (b.sizedOn === 'step-state' && b.stepState) {
    // A state with no capacitor in (reactors alone) draws the same at either end: no end to name for it.
    const capacitorsIn = b.stepState.outputsIn.length > 0 || b.stepState.fixedPart.capacitors;
    return `${f1(b.currentA)} A on line ${b.stepState.lineLabel} ${stepStateWords(b.stepState)}${capacitorsIn ? atEnd : ''}, the largest line current there in any state of the steps${
      b.stepState.solved ? '' : ' (by superposition of the steps\' currents: that state did not solve)'
    } (${f1(b.largestLineCurrentA.before)} A before correction, ${f1(afterAtEnd)} A with every step in${c === null ? '' : ` at ${capacitanceEndWords(c.capacitanceFactor)} capacitance`}${sized})`;
  }
  // Two figures that print alike are one: "after correction (20.1 A before)" would read as a contradiction.
  if (f1(b.largestLineCurrentA.before) === f1(afterAtEnd) && c === null) return `${f1(b.currentA)} A, the largest line current there before and after correction${sized}`;
  if (b.sizedOn === 'before') return `${f1(b.currentA)} A, the largest line current there before correction (${f1(afterAtEnd)} A after${c === null ? '' : `, capacitance at ${capacitanceEndWords(c.capacitanceFactor)}`}${sized})`;
  const nominal = c === null ? '' : `${f1(b.largestLineCurrentA.after)} A at nominal capacitance; `;
  return `${f1(b.currentA)} A, the largest line current there after correction${sized}${atEnd} (${nominal}${f1(b.largestLineCurrentA.before)} A before)`;
}

/** A capacitance tolerance end in words: "+10 %", "−5 %". */
export const capacitanceEndWords = (factor: number): string => `${factor >= 1 ? '+' : '−'}${Number((Math.abs(factor - 1) * 100).toFixed(2))} %`;

/** At most this many rows in a step-state table: the states near a watched order first, then the others as room allows. */
const TABLE_STATES = 12;

/** The supply resonance of every step state as a small table (`trivar correct`'s checks, the report's harmonics section). */
export interface StepStateTable {
  readonly header: readonly string[];
  readonly rows: readonly (readonly string[])[];
  /** What the rows are of, and the states left out. */
  readonly note: string;
}

/** A combination of outputs in, for a table cell: "1+2", "1+2 or 1+3", "1+2 (+4 alike)", "fixed part only". */
function stepsInCell(st: StepStateOrders, every: boolean): string {
  if (!st.outputsIn.length) return 'fixed part only';
  const own = st.outputsIn.join('+');
  if (every) return `${own} (every step)`;
  return st.alike.length === 0 ? own : st.alike.length <= 2 ? [own, ...st.alike.map((o) => o.join('+'))].join(' or ') : `${own} (+${st.alike.length} alike)`;
}

/** The near resonances of a state, each with the watched order it lies near: "11th", "9th at h 9.31" where it is not the lowest. */
function nearCell(st: StepStateOrders): string {
  if (!st.nearOrders.length) return '-';
  return st.resonancesNear
    .map((h) => {
      const near = st.nearOrders.filter((w) => Math.abs(h - w) <= CORRECTION_DEFAULTS.resonanceNearFraction * w).map(ordinal).join(', ');
      return h === st.lowestOrder ? near : `${near} at h ${h.toFixed(2)}`;
    })
    .join('; ');
}

/**
 * The step states where any lies near a watched order: steps in, their kvar at nominal voltage, the lowest order
 * and the watched orders near. Every state near is a row; the others fill up to TABLE_STATES, most capacitance first.
 */
export function stepStateTable(r: StepStateResonance): StepStateTable {
  checkObjectArgument(r, 'r', "a verification's step-state resonance (resonanceStepStates)", ['states', 'combinations', 'fixedPart', 'nearStates']);
  const near = r.states.filter((st, k) => k === 0 || st.nearOrders.length > 0);
  const room = Math.max(0, TABLE_STATES - near.length);
  const others = r.states.filter((st, k) => k > 0 && st.nearOrders.length === 0);
  const shown = new Set([...near, ...others.slice(0, room)]);
  const rows = r.states.filter((st) => shown.has(st)).map((st) => [stepsInCell(st, st === r.states[0]), st.capacitorKvarAtNominalV.toFixed(1), st.lowestOrder === null ? '-' : st.lowestOrder.toFixed(2), nearCell(st)]);
  const left = others.slice(room);
  const kept = r.fixedPart.reactors || r.fixedPart.capacitors ? ' (the fixed part always in)' : '';
  const leftWords = left.length
    ? `; ${left.length} more state${left.length === 1 ? '' : 's'}, none near, lowest order ${Math.min(...left.map((s) => s.lowestOrder ?? Infinity)).toFixed(2)} to ${Math.max(...left.map((s) => s.lowestOrder ?? 0)).toFixed(2)}`
    : '';
  return {
    header: ['steps in', 'kvar in', 'lowest h', 'near'],
    rows,
    note: `controller outputs in${kept}; kvar of the bank's capacitors in, at nominal voltage; near: the harmonic orders within 10 % of an order of that state${leftWords}`,
  };
}

/** Every step state in one line, where none lies near a watched order: the range of their lowest orders. */
export function stepStatesClearWords(r: StepStateResonance): string {
  checkObjectArgument(r, 'r', "a verification's step-state resonance (resonanceStepStates)", ['states', 'combinations', 'fixedPart', 'nearStates']);
  const withOrder = r.states.filter((s) => s.lowestOrder !== null);
  const top = withOrder.reduce((a, b) => (b.lowestOrder! > a.lowestOrder! ? b : a), withOrder[0]!);
  const distinct = r.states.length === r.combinations ? '' : `, ${r.states.length} distinct`;
  const topWords = top === r.states[0] ? '' : ` to ${top.lowestOrder!.toFixed(2)} (${stepStateInWords(top, r.fixedPart)})`;
  return `every step state the controller can reach (${r.combinations} combination${r.combinations === 1 ? '' : 's'} of the switched outputs${distinct}): lowest order ${r.states[0]!.lowestOrder?.toFixed(2) ?? '-'} with every step in${topWords}; none within 10 % of a watched harmonic order`;
}
