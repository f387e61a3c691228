/**
 * All wording of the harmonic study: warnings, the neutral sizing note,
 * assumptions and cautions, in one place.
 */
import { distinctDigits } from '../correction/correctionWording.js';
import type { BusVoltageDistortion, JointScan, NeutralCheck, VoltageDistortionCheck } from './harmonicsResult.js';
import { levelText } from './voltageDistortionLimits.js';
import { ROUND_OFF_MARGIN } from '../analysis/boardWarnings.js';
import { checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

const pct = (x: number) => `${x.toFixed(1)} %`;
/** A figure above its limit, with the decimals it needs to read above it (5.04 %, never "5.0 %, above 5 %"). */
const above = (x: number, limit: number) => `${distinctDigits(x, limit, 1)[0]} %`;

/**
 * A bus voltage figure (%) as every table prints it: one decimal, or, above its level, the decimals it
 * needs to read above it, as the warnings print it — a verdict beside it never contradicts the figure.
 */
export const percentAgainstLevel = (x: number, limit: number | null): string => (limit !== null && x > limit * (1 + ROUND_OFF_MARGIN) ? distinctDigits(x, limit, 1)[0] : x.toFixed(1));

/** The THD and largest order of one bus as printed beside its verdict (`bus` from VoltageDistortionCheck.buses). */
export function busFigureTexts(check: VoltageDistortionCheck, bus: string): { thd: (x: number) => string; order: (order: number, x: number) => string } {
  const b = check.buses.find((x) => x.bus === bus);
  return {
    thd: (x) => percentAgainstLevel(x, b ? check.thdLimitPercent : null),
    order: (order, x) => percentAgainstLevel(x, b?.ordersAbove.find((o) => o.order === order)?.limitPercent ?? null),
  };
}

export const NEUTRAL_PRACTICE =
  'with mostly non-linear single-phase loads the neutral carries the triplen currents of all three phases and is counted as a current-carrying conductor (NEC 310.15, confirmed for the 2008 numbering); a neutral of twice the phase size is the usual practice for such feeders (IEEE Std 1100, from memory)';

/**
 * The same note for a split-phase board, where the two lines are 180° apart: an odd harmonic (triplens
 * included) of like loads on the two lines cancels in the neutral as the fundamental does, and an even
 * one adds (i₂(t) = i₁(t − T/2) gives (−1)ʰ at order h; follows from the waveforms, no standard cited).
 */
export const NEUTRAL_PRACTICE_SPLIT_PHASE =
  'on a split-phase board the two lines are 180° apart, so odd harmonics (triplens included) of like loads on the two lines cancel in the neutral as the fundamentals do and only even harmonics add: the neutral carries the difference between the lines, and non-linear loads alone do not call for a larger neutral here';

/** On a single-phase board the neutral is the line's return: the same current, harmonics and all. */
export const NEUTRAL_PRACTICE_SINGLE_PHASE = 'on a single-phase board the neutral carries the line current back, harmonics and all, and is sized as the line conductor';

/** The neutral sizing note for a board's system: triplens add on a three-phase star, cancel on a split-phase board. */
export const neutralPractice = (system: string): string =>
  system === 'split-phase' ? NEUTRAL_PRACTICE_SPLIT_PHASE : system === 'single-phase' ? NEUTRAL_PRACTICE_SINGLE_PHASE : NEUTRAL_PRACTICE;

export const harmonicsWording = {
  /** The point-of-common-coupling check asked for on a source with no impedance to give the ratio. */
  noShortCircuitRatio:
    'current distortion at the point of common coupling not judged: the source impedance is zero or below 1 µΩ (an ideal source), so the short-circuit ratio has no finite value; give harmonics.pcc.shortCircuitRatio to judge it against IEEE 519',
} as const;

export const harmonicsWarningText = {
  neutralOverload: (rms: number, rating: number) =>
    `the neutral carries ${rms.toFixed(1)} A rms including harmonics, above its ${rating.toFixed(0)} A rating: it overheats without tripping anything (no overcurrent device protects a neutral)`,
  /** `splitPhase`: the two lines are 180° apart, so triplens cancel there and something else makes the neutral large. */
  neutralAbovePhase: (neutral: Pick<NeutralCheck, 'ratioToPhase' | 'aboveLine' | 'current'>, splitPhase = false) => {
    const head = `the neutral current is ${neutral.ratioToPhase!.toFixed(2)} × the largest line current`;
    if (splitPhase) return `${head}: the two lines' currents add in the neutral instead of cancelling (one line exporting while the other imports, or even harmonics)`;
    const a = neutral.aboveLine!;
    const A = (x: number) => `${x.toFixed(1)} A`;
    const loading = `the phase loading: its fundamental alone is ${A(a.neutralFundamentalA)} against ${A(a.lineFundamentalA)} in the most loaded line (the loads sit mostly on one line, and the neutral brings their current back)`;
    const triplen = `triplen harmonics (orders 3, 9, 15…) add in it from several lines instead of cancelling: ${A(a.neutralTriplenA)} of its ${A(neutral.current.rms)} rms, against at most ${A(a.lineTriplenA)} in one line`;
    if (a.cause === 'phase-loading') return `${head}: the cause is ${loading}; the triplen orders in it are ${A(a.neutralTriplenA)}`;
    if (a.cause === 'both') return `${head}: the cause is ${loading}, and ${triplen}`;
    if (a.cause === 'triplen') return `${head}: ${triplen}`;
    return `${head}: the lines' harmonic currents add in it (fundamental ${A(a.neutralFundamentalA)} against ${A(a.lineFundamentalA)} in the most loaded line; triplen orders ${A(a.neutralTriplenA)})`;
  },
  resonance: (states: readonly string[], peak: number, order: number) =>
    `resonance with the supply at h ≈ ${peak.toFixed(2)}, within ±10 % of order ${order}, with the bank at ${states.length > 3 ? `${states.slice(0, 3).join(', ')} and ${states.length - 3} more state(s)` : states.join(', ')}: voltages and capacitor currents are amplified there`,
  /** A resonance near `order` only with other banks switched: `state` names this bank's state and the others'. */
  resonanceOtherBanks: (state: string, others: string, peak: number, order: number, moreStates: number) =>
    `${state} with ${others}: resonance with the supply at h ≈ ${peak.toFixed(2)}, within ±10 % of order ${order}${
      moreStates > 0 ? ` (likewise ${moreStates} more state${moreStates > 1 ? 's' : ''} of this bank)` : ''
    }; with every other bank fully on that state is clear of order ${order}, so voltages and capacitor currents are amplified there when the other banks step down`,
  capacitorDuty: (label: string, branch: string, what: string) => `with ${label} the capacitors of branch ${branch} exceed their limit: ${what}`,
  /**
   * The units at or above the voltage they stand continuously: in the running state, in another state
   * checked, or at the fundamental alone, with the nominal voltage's share of it and the rating that runs within it.
   * @param capacitorV the fundamental across the capacitors at the network's nominal voltage, U/(1 − p), V
   */
  continuousVoltage: (c: { limitPu: number; highestPu: number; label: string; branch: string; anyStatePu: number; anyState: { label: string; branch: string; condition: string }; fundamentalPu: number; nominalPu: number }, ratedV: number, capacitorV: number) => {
    const f3 = (x: number) => x.toFixed(3);
    const running = Number(c.highestPu.toFixed(3)) >= c.limitPu;
    const where = running
      ? `with ${c.label}, at nominal capacitance and the loads as given, the capacitors of branch ${c.branch} run at ${f3(c.highestPu)} × their rated voltage (rms with harmonics)`
      : `with ${c.anyState.label} (${c.anyState.condition}) the capacitors of branch ${c.anyState.branch} reach ${f3(c.anyStatePu)} × their rated voltage (rms with harmonics; ${f3(c.highestPu)} × in the running state)`;
    const fundamental = `the fundamental alone reaches ${f3(c.fundamentalPu)} × (${(c.fundamentalPu * ratedV).toFixed(1)} V across ${ratedV.toFixed(0)} V units), and the nominal voltage alone puts ${capacitorV.toFixed(1)} V across them (${f3(c.nominalPu)} ×), no margin for a supply above nominal`;
    const needed = Math.ceil((Math.max(c.highestPu, c.anyStatePu, c.fundamentalPu) * ratedV) / 5) * 5;
    return `${where}: at or above the ${c.limitPu.toFixed(2)} × they stand continuously (IEC 60831-1, from memory; the 1.10 × the duty check allows is for 8 h in every 24 h), so they are not within their limits in service; ${fundamental}. Units rated at least ${needed} V stand it; IEC practice rates them 10 % above the voltage they see, ${(capacitorV * 1.1).toFixed(1)} V or more here`;
  },
  voltageThd: (bus: string, thd: number, limit: number, basisName: string) => `voltage THD at the board on ${bus} is ${above(thd, limit)}, above ${levelText(limit)} % (${basisName})`,
  /** Each order over its level, with the level: `L1-N h9 2.0 % (level 1.5 %)`; a flat limit is named once. */
  voltageIndividual: (buses: readonly BusVoltageDistortion[], check: Pick<VoltageDistortionCheck, 'basisName' | 'individualLimitPercent'>) => {
    const flat = check.individualLimitPercent;
    const head =
      flat === null
        ? `a single harmonic of the board voltage is above its level (${check.basisName}; % of the fundamental)`
        : `a single harmonic of the board voltage is above ${levelText(flat)} % (${check.basisName}; % of the fundamental)`;
    return `${head}: ${buses
      .map((b) => `${b.bus} ${b.ordersAbove.map((o) => `h${o.order} ${above(o.percent, o.limitPercent)}${flat === null ? ` (level ${levelText(o.limitPercent)} %)` : ''}`).join(' and ')}`)
      .join(', ')}`;
  },
  tdd: (phase: string, tdd: number, limit: number, orders: readonly number[]) =>
    `line ${phase}: TDD ${pct(tdd)} (IEEE 519 limit ${limit} % for this short-circuit ratio)${orders.length ? `; order${orders.length > 1 ? 's' : ''} ${orders.join(', ')} above the individual limits` : ''}`,
  /** `lines`: each leading line with its displacement PF, `L2 0.894`; `boardKvar` the board's ΣQ1, − where it sends kvar back. */
  leadingState: (state: string, lines: readonly string[], bankKvar: number, boardKvar: number) =>
    `with ${state} the bank (${bankKvar.toFixed(1)} kvar at nominal voltage) over-corrects: line${lines.length > 1 ? 's' : ''} ${lines.join(', ')} lead at the fundamental${
      boardKvar <= -0.05 ? `, and the board sends ${(-boardKvar).toFixed(1)} kvar capacitive back up its supply` : ''
    }. A leading board raises its own voltage and pushes capacitive current up its feeder; a controller would hold steps out at these loads, so the state studied here is the bank's largest, not its usual running state`,
  idealSource: 'the supply has no impedance in the board file: harmonic currents make no voltage distortion and no bank can resonate with it — give supply.transformer or supply.impedance for a real answer',
  noBank: 'no bank in harmonics.bank: the scan shows the board as it is',
};

/**
 * What the bus voltages were judged against, in words: `IEC 61000-2-2 compatibility levels (the default of
 * the board's region): h5 6 %, h7 5 %, 8 % THD`. Every order solved with its level, or the one flat level.
 */
export function voltageBasisWords(check: Pick<VoltageDistortionCheck, 'basisName' | 'basisFrom' | 'individualLimitPercent' | 'orderLimits' | 'thdLimitPercent'>): string {
  const from = check.basisFrom === 'board file' ? 'named in the board file' : 'the default of the board’s region';
  const flat = check.individualLimitPercent;
  const orders =
    flat !== null
      ? `${levelText(flat)} % one order`
      : check.orderLimits.length
        ? check.orderLimits.map((o) => `h${o.order} ${o.limitPercent === null ? 'no level (THD only)' : `${levelText(o.limitPercent)} %`}`).join(', ')
        : 'a level per order';
  return `${check.basisName} (${from}): ${orders}, ${levelText(check.thdLimitPercent)} % THD`;
}

/** A bank's state in words: `Workshop bank off`, `Workshop bank steps 1+2`. */
export const bankStateWords = (board: string, label: string): string => `${board} bank ${label === 'bank off' ? 'off' : label}`;

/** What a joint scan covered, in words: each other bank's levels and how they were chosen. */
export function jointCoverageWords(joint: JointScan): string {
  checkObjectArgument(joint, 'joint', "a joint scan (a harmonics report's jointScan)", ['stateLimit']);
  const passing = `their states combined would pass ${joint.stateLimit} networks`;
  const how = {
    'every step combination': 'every state of their steps, whatever order they switch in, combined',
    'controller levels': `each stepped in the order its steps are written: ${passing}`,
    'each off or fully on': `each only off or fully on: ${passing}`,
    'all off or all on together': `only all off together and all fully on together: ${passing}`,
  }[joint.coverage];
  return `other banks scanned at ${joint.otherBanks.map((o) => `${o.board}: ${o.levels.map((l) => l.label).join(', ')}`).join('; ')} (${how}; ${joint.networkStates} networks)`;
}

/** The nearest approach of a peak to a checked order, in words: `h 7.12, 1.7 % from 7`. */
export const nearestWords = (n: { readonly order: number; readonly checkedOrder: number }): string => {
  checkObjectArgument(n, 'n', "a resonance's nearest order { order, checkedOrder } (a scan peak's nearest)", ['order', 'checkedOrder']);
  checkNumberArgument(n.order, 'n.order', 'a harmonic order: a finite number');
  checkNumberArgument(n.checkedOrder, 'n.checkedOrder', 'a checked harmonic order above 0', (x) => x > 0);
  return `h ${n.order.toFixed(2)}, ${((100 * Math.abs(n.order - n.checkedOrder)) / n.checkedOrder).toFixed(1)} % from ${n.checkedOrder}`;
};

export const harmonicsAssumptionText = {
  jointScan:
    'each bank’s scan is repeated with the other banks switched: every combination of its own steps with each other bank in every state of its steps, whatever order a controller switches them in (out of service and fixed part only where it has a fixed part), all combined',
  /** Only for a scan that did not cover every state (coverage other than 'every step combination'). */
  jointScanReduced: (board: string, joint: JointScan) =>
    `${board}: every state of the other banks’ steps combined would make more than ${joint.stateLimit} networks, so they were scanned ${
      joint.coverage === 'controller levels'
        ? 'at the levels a controller reaches stepping in the order the steps are written (off, step 1, steps 1+2, …); other switching orders are'
        : joint.coverage === 'each off or fully on'
          ? 'each only off (out of service) or fully on; intermediate levels are'
          : 'only all off together and all fully on together; intermediate levels are'
    } not covered (${joint.networkStates} networks)`,
};

/** Shown with every harmonics study, in the region's words ("earth" or "ground"); the neutral's only where a board has one. */
export const harmonicsCautions = (ground: 'earth' | 'ground', anyNeutral = true): readonly string[] => [
  'Harmonic resonance can overload capacitors until they fail, rupture or catch fire; check every step combination before energising a bank.',
  ...(anyNeutral ? ['Neutrals of boards with non-linear loads can overheat without any protective device tripping; measure neutral current with a true-rms meter.'] : []),
  'Built-in spectra are typical values, not measurements: measure the real loads (true-rms, per order) before buying or rebuilding a bank.',
  `Capacitors stay charged after disconnection: wait the rated discharge time, then short every terminal together and to ${ground} before touching.`,
  'These results support, and do not replace, the judgement of a licensed professional and the local electrical codes.',
];

/** The harmonics cautions in IEC words (the library's constant; reports use the board's region). */
export const HARMONICS_CAUTIONS: readonly string[] = harmonicsCautions('earth');
