/**
 * Warnings with their thresholds stated, and the cautions shown with results.
 * All wording for board results lives here.
 */
import type { BoardWarning, NeutralReading, PhaseReading, LoadReading, SourceUnitReading, TransformerReading, UnbalanceReading, LineToLineReading } from './boardResult.js';
import { regionWords } from '../board/conventions/regionWords.js';
import { boardVoltagePoints } from './voltageCheck.js';
import { bandWords, customLimits, judgeVoltage, presetLimits, type VoltageLimits } from '../board/conventions/voltageLimits.js';
import { voltageBesideBand } from '../board/conventions/voltageBesideBand.js';
import type { Region } from '../board/conventions/region.js';
import { unbalanceFigure, VOLTAGE_UNBALANCE_LIMITS } from '../board/conventions/unbalanceLimits.js';
import { circuitNumberMismatches, circuitsAtPositionZero, overlappingCircuitPositions, sharedCircuitNumbers } from './panelNumbering.js';
import { unitWords } from './sourceUnitsWords.js';
import { lengthFigure, type FeederRouteLengths, type LengthUnit } from '../board/feederModel.js';
import { quoteText } from '../errors.js';

export const WARNING_THRESHOLDS = {
  /** Supply band of the open-neutral study's flags: ±10 % of nominal (EN 50160 LV band). Board voltages follow the board's `conventions.voltageLimits`. */
  voltageBandPercent: 10,
  /**
   * Share of its breaker rating a continuous load (3 h or more, NEC Article 100) may draw on a
   * North-American board: NEC 210.20(A) sizes the breaker at no less than the noncontinuous load plus
   * 125 % of the continuous load, i.e. 80 % loading, unless the assembly is listed for 100 % operation
   * (confirmed secondary: a manufacturer's data bulletin quoting 210.20(A) and its exception;
   * 210.19(A)(1) the same for the conductors). IEC practice judges the design current against the
   * device's rated current, I_B ≤ I_n (IEC 60364-4-43, 433.1; from memory): 100 %.
   */
  continuousBreakerShare: 0.8,
  /**
   * A line drawing active power at a leading PF below this, on a board with loads of its own that draw
   * leading vars (a fixed capacitor bank written as a load), is warned: the capacitance is more than
   * the board's loads need, so the voltage rises and the supply sees capacitive vars. Common practice,
   * no source (many supply agreements ask for a PF of 0.9 or better, lagging or leading).
   */
  leadingLinePf: 0.9,
} as const;

/** The open-neutral study's band as limits: its flags judged, and its figures printed, as every voltage verdict's are. */
export const OPEN_NEUTRAL_BAND: VoltageLimits = {
  ...customLimits(WARNING_THRESHOLDS.voltageBandPercent, WARNING_THRESHOLDS.voltageBandPercent),
  source: `the open-neutral study's flags: ±${WARNING_THRESHOLDS.voltageBandPercent} % of nominal (EN 50160 LV band)`,
};

/**
 * Relative margin a comparison of two currents allows for round-off. Quantities equal in
 * exact arithmetic (a single-phase board's line and neutral currents) come out of different
 * solve paths a few units of 1e-16 apart; a verdict must not turn on that.
 */
export const ROUND_OFF_MARGIN = 1e-9;

const fmt = (x: number, digits = 1) => x.toFixed(digits);
/** A value above `limit` with the digits that show it is above (16.04 A beside 16 A, not 16.0). */
const above = (x: number, limit: number) => {
  for (let digits = 1; digits < 4; digits++) if (+x.toFixed(digits) > limit) return x.toFixed(digits);
  return x.toFixed(4);
};
/**
 * Amps to 0.1 A, or to 2 significant figures when that would print a non-zero current as 0.0 (0.031, not 0.0):
 * the rule of every current these warnings and the current-triangle drawing print. A signed part keeps its sign.
 */
export const ampsFigure = (x: number): string => (x === 0 ? '0.0' : Math.abs(x) >= 0.05 ? x.toFixed(1) : x.toPrecision(2));
const amps = ampsFigure;

export function boardWarnings(input: {
  /** Loads whose current/power part fell below the solver's low-voltage threshold: name and lowest per-unit voltage. */
  readonly belowThreshold: readonly { readonly name: string; readonly pu: number; readonly threshold: number; readonly ratingV?: number }[];
  readonly phases: readonly PhaseReading[];
  readonly neutral: NeutralReading | null;
  readonly unbalance: UnbalanceReading | null;
  readonly loads: readonly LoadReading[];
  /** Each line's rating, A, in the order of `phases` (null: none given). */
  readonly lineRatingsA: readonly (number | null)[];
  readonly transformer?: TransformerReading | null;
  readonly sourceUnits?: readonly SourceUnitReading[] | null;
  /** The limits voltages are judged against; default EN 50160's ±10 %. */
  readonly limits?: VoltageLimits;
  /** Report label of a phase or line pair (`A` → `L1`); default as is. */
  readonly label?: (phaseOrPair: string) => string;
  /** Board voltages judged against the limits: line-to-line on a board without a neutral. */
  readonly lineToLine?: readonly LineToLineReading[];
  readonly hasNeutral?: boolean;
  /** The board's region: North America judges continuous loads at 80 % of their breaker (IEC: 100 %) and voltage unbalance by ANSI C84.1's index; default IEC. */
  readonly region?: Region;
  /** Resistance of the feeder into the board, ohm: each line conductor (in the order of `phases`) and the neutral. */
  readonly feederResistance?: { readonly lines: readonly number[]; readonly neutral: number } | null;
  /** The route lengths of the feeder's conductors, where the file gives them unalike. */
  readonly feederLengths?: FeederRouteLengths;
}): BoardWarning[] {
  const out: BoardWarning[] = [];
  const { phases, neutral, unbalance, loads, lineRatingsA } = input;
  const label = input.label ?? ((t: string) => t);
  const limits = input.limits ?? presetLimits('en50160-supply');
  const heaviest = phases.reduce<PhaseReading | undefined>((h, p) => (h === undefined || p.current.magnitude > h.current.magnitude ? p : h), undefined);
  const largest = heaviest?.current.magnitude ?? 0;
  // Above the heaviest phase, not the lightest: a neutral that carries only the unbalance of its
  // phases is bounded by their currents, which their breakers limit, and is not counted as a
  // current-carrying conductor (NEC 310.15(E)(1), METHODS §6). Above every phase, nothing limits it.
  if (heaviest && neutral && phases.length > 1 && neutral.current.magnitude > largest * (1 + ROUND_OFF_MARGIN))
    out.push({
      code: 'neutral-above-phase',
      message: `neutral carries ${amps(neutral.current.magnitude)} A, more than the heaviest phase (${label(heaviest.phase)}, ${amps(largest)} A): no phase breaker limits it, so the neutral must be rated for this current`,
      value: neutral.current.magnitude,
      threshold: largest,
    });
  // A reduced neutral with no rating given: judged by heat per metre against the heaviest phase's
  // conductor (I²R, same cable and surroundings), which that phase's breaker limits. Above it the
  // neutral runs hotter than any protected conductor (common practice, no source). A full-size
  // neutral reduces to the rule above. On a single-phase board the neutral carries the line current
  // itself: the line breaker limits it, but that breaker is chosen for the line conductor, and the
  // rules ask for a neutral of the line's size there (below), whatever it carries.
  const feeder = input.feederResistance;
  const heaviestIndex = heaviest ? phases.indexOf(heaviest) : -1;
  const rLine = feeder && heaviestIndex >= 0 ? (feeder.lines[heaviestIndex] ?? 0) : 0;
  const reduced = Boolean(heaviest && neutral && feeder && rLine > 0 && feeder.neutral > rLine * (1 + ROUND_OFF_MARGIN));
  if (reduced && phases.length === 1) {
    const ratio = feeder!.neutral / rLine;
    const rule =
      input.region === 'north-america'
        ? "the neutral of a two-wire circuit needs the line conductor's ampacity; the NEC lets a neutral be smaller only where it carries the unbalance of a multiwire feeder or service (220.61, from memory)"
        : "IEC 60364-5-52 asks for a neutral of the line conductor's cross-section on single-phase two-wire circuits, whatever the size (524.2.1, from memory)";
    out.push({
      code: 'neutral-reduced-single-phase',
      message: `the neutral of this single-phase feeder is reduced (${fmt(ratio, 2)} × the line conductor's resistance): on two wires it carries the whole line current, ${amps(neutral!.current.magnitude)} A now, up to what the line's breaker, chosen for the line conductor, lets through; ${rule}: give it the line's size`,
      value: ratio,
      threshold: 1,
    });
  } else if (
    reduced &&
    neutral!.ratingA == null &&
    neutral!.current.magnitude <= largest * (1 + ROUND_OFF_MARGIN) &&
    neutral!.current.magnitude ** 2 * feeder!.neutral > largest ** 2 * rLine * (1 + ROUND_OFF_MARGIN)
  )
    out.push({
      code: 'neutral-reduced-heating',
      message: `the reduced neutral (${fmt(feeder!.neutral / rLine, 2)} × a line conductor's resistance) carries ${amps(neutral!.current.magnitude)} A: it heats more per metre than the heaviest phase (${label(heaviest!.phase)}, ${amps(largest)} A), which its breaker limits, and nothing limits it; ${
        phases.length === 2 && input.region === 'north-america'
          ? "a 120/240 feeder's neutral may be smaller than its lines only where sized for the largest unbalanced load (NEC 220.61) at its ampacity (NEC 310.16; both from memory); "
          : ''
      }give the neutral's ratingA to judge it`,
      value: neutral!.current.magnitude,
      threshold: largest * Math.sqrt(rLine / feeder!.neutral),
    });
  const lengths = input.feederLengths && unequalRouteLengths(input.feederLengths, phases.map((p) => label(p.phase)));
  if (lengths) out.push(lengths);
  if (neutral?.ratingA != null && neutral.current.magnitude > neutral.ratingA)
    out.push({
      code: 'neutral-over-rating',
      message: `neutral current ${fmt(neutral.current.magnitude)} A exceeds the neutral rating of ${fmt(neutral.ratingA)} A`,
      value: neutral.current.magnitude,
      threshold: neutral.ratingA,
    });
  phases.forEach((p, k) => {
    const rating = lineRatingsA[k] ?? null;
    if (rating !== null && p.current.magnitude > rating)
      out.push({
        code: 'line-over-rating',
        message: `line ${label(p.phase)} carries ${fmt(p.current.magnitude)} A, above its rating of ${fmt(rating)} A`,
        value: p.current.magnitude,
        threshold: rating,
      });
  });
  // The region's own index and limit: |V2|/|V1| against 2 % (IEC), the line-to-line deviation against 3 % (ANSI C84.1).
  const unbalanceLimit = VOLTAGE_UNBALANCE_LIMITS[input.region ?? 'iec'];
  const unbalanceValue = unbalance ? unbalanceFigure(unbalanceLimit, unbalance) : null;
  if (unbalanceValue !== null && unbalanceValue > unbalanceLimit.percent)
    out.push({
      code: 'voltage-unbalance',
      message: `${unbalanceLimit.name} ${fmt(unbalanceValue, 2)} % is above ${unbalanceLimit.percent} % (${unbalanceLimit.source}${unbalanceLimit.definition ? `; ${unbalanceLimit.definition}` : ''}); three-phase motors need derating`,
      value: unbalanceValue,
      threshold: unbalanceLimit.percent,
    });
  const band = bandWords(limits);
  const limitOf = (side: 'under' | 'over') => (side === 'under' ? 100 - limits.underPercent : 100 + limits.overPercent);
  const boardVoltages = boardVoltagePoints(phases, input.lineToLine ?? [], input.hasNeutral ?? true, label);
  for (const v of boardVoltages) {
    const side = judgeVoltage(limits, v.percent);
    if (side !== 'within') {
      // Printed with the decimals that show it outside: 253.1 V is 110.04 %, not a "110.0 %" on the edge.
      const shown = voltageBesideBand(limits, v);
      out.push({
        code: side === 'over' ? 'board-overvoltage' : 'board-undervoltage',
        message: `${v.at} at the board is ${shown.volts} V, ${shown.percent} % of nominal, outside ${band} (${limits.preset})`,
        value: v.percent,
        threshold: limitOf(side),
      });
    }
  }
  for (const load of loads)
    for (const b of load.branches) {
      const side = judgeVoltage(limits, b.voltagePercent);
      if (load.energised && side !== 'within') {
        const shown = voltageBesideBand(limits, { volts: b.voltage.magnitude, percent: b.voltagePercent });
        out.push({
          code: side === 'over' ? 'overvoltage' : 'undervoltage',
          message: `load ${quoteText(load.name)} (${label(b.from)}-${label(b.to)}) sees ${shown.volts} V, ${shown.percent} % of nominal, outside ${band} (${limits.preset})`,
          value: b.voltagePercent,
          threshold: limitOf(side),
        });
      }
    }
  // A circuit drawing more than its breaker allows: the schedule would show the two side by side.
  // A circuit that generates (negative kW, PV or a generator) is judged by the output-circuit rule, not the load rule.
  for (const load of loads) {
    if (load.breakerA === null || !load.energised) continue;
    const rating = +load.breakerA.toFixed(1);
    const generates = load.kW < 0;
    const rule = generates ? outputCircuitRule(input.region ?? 'iec') : breakerRule(input.region ?? 'iec', load.continuous);
    const allowed = load.breakerA * rule.share;
    const flows = generates ? 'feeds back' : 'draws';
    if (load.currentA > load.breakerA)
      out.push({
        code: 'circuit-over-breaker',
        message: generates
          ? `circuit ${quoteText(load.name)} feeds back ${above(load.currentA, load.breakerA)} A, above its ${rating} A breaker (${rule.words}): the breaker and conductors are too small for what the source sends back, or its output in the file is too high; check the source's rated output current and the breaker`
          : `circuit ${quoteText(load.name)} draws ${above(load.currentA, load.breakerA)} A, above its ${rating} A breaker (${rule.words}): the circuit is overloaded; a small overload can run for hours before a breaker trips, heating the cable meanwhile; check the load and the rating in the file`,
        value: load.currentA,
        threshold: load.breakerA,
      });
    else if (load.currentA > allowed)
      out.push({
        code: generates ? 'output-circuit-over-breaker-share' : 'continuous-load-over-breaker-share',
        message: `circuit ${quoteText(load.name)} ${flows} ${fmt(load.currentA)} A, above ${fmt(allowed)} A, ${fmt(rule.share * 100, 0)} % of its ${rating} A breaker (${rule.words}): give it a larger breaker and conductors${generates ? '' : ', or mark it continuous: false if it never runs 3 h at a time'}`,
        value: load.currentA,
        threshold: allowed,
      });
  }
  // North-American panel numbering only: IEC boards number their ways otherwise.
  if (input.region === 'north-america')
    for (const m of circuitNumberMismatches(loads, phases.length)) {
      const rotation = phases.map((p) => label(p.phase)).join(', ');
      const numbering = `the usual panel numbering (odd circuits down the left, even down the right, phases ${rotation} by row)`;
      // As the file wrote it: every position where it listed them (a range as the positions it spans), else the first.
      const written = m.with.length ? String(m.circuit) : m.positions.join(',');
      const stacked = Array.from({ length: m.poles }, (_, k) => m.circuit + 2 * k);
      const column = m.poles === 1 ? `${m.circuit} alone for a 1-pole breaker` : `${stacked.slice(0, -1).join(', ')} and ${stacked.at(-1)} for a ${m.poles}-pole breaker at ${m.circuit}`;
      const message =
        m.kind === 'pole-count'
          ? `load ${quoteText(m.name)} on circuit ${written} has a ${m.poles}-pole breaker, but the circuit names ${m.positions.length} positions: a breaker takes one position per pole (${column}); check the schedule or the poles`
          : m.kind === 'not-stacked'
            ? `load ${quoteText(m.name)} on circuit ${written}: the poles of one breaker sit one above the other in a column (${column}), not at ${written}; check the schedule`
          : `load ${quoteText(m.name)} on circuit ${written} is written ${label(m.connection)}, but ${numbering} puts circuit ${written}${m.with.length ? ` (with ${m.with.join(' and ')})` : ''} on ${m.implied.length > 1 ? m.implied.map(label).join('-') : `phase ${label(m.implied[0]!)}`}: check the schedule or the connection`;
      out.push({
        code: m.kind === 'phases' ? 'circuit-number-phase' : 'circuit-number-poles',
        message,
        // The first position, and the number of phases the numbering rotates through.
        value: m.circuit,
        threshold: phases.length,
      });
    }
  if (input.region === 'north-america')
    for (const z of circuitsAtPositionZero(loads))
      out.push({
        code: 'circuit-number-zero',
        message: `load ${quoteText(z.name)} on circuit ${z.circuit}: panel positions are numbered from 1 (odd down the left, even down the right), so 0 is no position on the panel; check the schedule`,
        value: 0,
        threshold: 1,
      });
  if (input.region === 'north-america')
    for (const o of overlappingCircuitPositions(loads, phases.length)) {
      const [a, b] = o.names;
      const at = (p: readonly number[]) => (p.length === 1 ? `position ${p[0]}` : `positions ${p.join(', ')}`);
      out.push({
        code: 'circuit-positions-overlap',
        message: `loads ${quoteText(a)} (${at(o.positions[0])}) and ${quoteText(b)} (${at(o.positions[1])}) both need ${at(o.common)}: a breaker position holds one pole of one breaker; check the schedule or the poles`,
        value: o.common[0]!,
        threshold: phases.length,
      });
    }
  for (const shared of sharedCircuitNumbers(loads)) {
    const names = shared.names.map((n) => `${quoteText(n)}`);
    out.push({
      code: 'circuit-number-shared',
      message: `loads ${names.slice(0, -1).join(', ')} and ${names.at(-1)} ${names.length === 2 ? 'both' : 'all'} give circuit ${shared.circuit}: one breaker position holds one circuit; check the schedule`,
      value: shared.names.length,
      threshold: 1,
    });
  }
  for (const b of input.belowThreshold)
    out.push({
      code: 'load-below-model-threshold',
      message: `load ${quoteText(b.name)} sees ${fmt(b.pu * 100)} % of ${b.ratingV === undefined ? 'its nominal voltage' : `the ${fmt(b.ratingV)} V its rating is taken at`}, below the ${fmt(b.threshold * 100, 0)} % at which its constant-current/constant-power part is taken as an impedance: it draws less than its rating here, and a real device may stall or trip`,
      value: b.pu * 100,
      threshold: b.threshold * 100,
    });
  for (const u of input.sourceUnits ?? [])
    if (u.loadingPercent > 100)
      out.push({
        code: 'source-unit-overload',
        message: `the supply's single-phase unit on ${unitWords(u.winding, label)} is loaded to ${fmt(u.loadingPercent, 0)} % of its ${fmt(u.ratedKVA, 1)} kVA rating (${fmt(u.currentA)} A through it against ${fmt(u.ratedCurrentA)} A rated): it will overheat, and its protection should trip`,
        value: u.loadingPercent,
        threshold: 100,
      });
  out.push(...leadingLineWarnings(phases, loads, label));
  const t = input.transformer;
  if (t && t.loadingPercent > 100)
    out.push({
      code: 'transformer-overload',
      message: `the supply transformer is loaded to ${fmt(t.loadingPercent, 0)} % of its ${fmt(t.ratedKVA, 0)} kVA rating (most loaded line ${fmt(t.largestLineCurrentA)} A against ${fmt(t.ratedCurrentA)} A rated; ${fmt(t.kVA, 1)} kVA at its terminals): it will overheat, and its protection should trip`,
      value: t.loadingPercent,
      threshold: 100,
    });
  return out;
}

/**
 * Lines that lead below WARNING_THRESHOLDS.leadingLinePf because the board's own loads draw leading
 * vars. A line a line-to-line load alone makes lead (its PF per line is a matter of the phase angle,
 * not of capacitance) is not warned: nothing on the board is capacitive then.
 */
function leadingLineWarnings(phases: readonly PhaseReading[], loads: readonly LoadReading[], label: (t: string) => string): BoardWarning[] {
  const capacitive = loads.filter((l) => l.origin === 'board' && l.energised && l.sense === 'leading' && l.kvar < 0);
  if (capacitive.length === 0) return [];
  const leadingKvar = capacitive.reduce((s, l) => s - l.kvar, 0);
  const limit = WARNING_THRESHOLDS.leadingLinePf;
  // The capacitive loads' vars on each line (a line-to-line branch half to each of its lines): a line is
  // warned only where it would not lead without them, so a small capacitor beside a line that a
  // line-to-line load makes lead is not blamed for it.
  const capacitiveOn = (phase: string) =>
    capacitive.reduce((sum, l) => sum + l.branches.reduce((t, b) => t + (b.kvar < 0 && (b.from === phase || b.to === phase) ? (-b.kvar * (b.to === 'N' || b.to.startsWith('star') ? 1 : 0.5)) : 0), 0), 0);
  // Without them the line would draw p.kvar + capacitiveOn: zero on a line whose only reactive load is the
  // capacitor (a single-phase heater beside its capacitor), which round-off may put a few 1e-14 kvar below.
  const roundOff = (p: PhaseReading) => 1e-9 * Math.max(1, p.kVA);
  const leading = phases.filter((p) => p.kW > 0 && p.sense === 'leading' && p.pf !== null && p.pf < limit && p.kvar + capacitiveOn(p.phase) >= -roundOff(p));
  if (leading.length === 0) return [];
  const lines = leading.map((p) => `${label(p.phase)} at PF ${p.pf!.toFixed(3)}`);
  const names = capacitive.map((l) => `"${l.name}"`).join(', ');
  return [
    {
      code: 'line-leading',
      message: `line${leading.length > 1 ? 's' : ''} ${lines.join(', ')} lead${leading.length > 1 ? '' : 's'} (below ${limit.toFixed(2)} leading, common practice): the board's leading loads (${names}, ${fmt(leadingKvar, 1)} kvar) give more reactive power than its other loads draw. The voltage rises, the supply sees capacitive vars, and capacitance with the supply inductance can resonate with harmonics; switch or reduce the capacitors to follow the load`,
      value: Math.min(...leading.map((p) => p.pf!)),
      threshold: limit,
    },
  ];
}

/** The share of its breaker rating a load may draw, and that rule in words for the warning. */
function breakerRule(region: Region, continuous: boolean): { share: number; words: string } {
  if (region !== 'north-america') return { share: 1, words: 'IEC 60364-4-43: design current at most the rated current I_n' };
  if (!continuous) return { share: 1, words: 'a noncontinuous load, marked continuous: false: up to 100 % of the rating' };
  return {
    share: WARNING_THRESHOLDS.continuousBreakerShare,
    words: 'NEC 210.20(A): a continuous load — one that may run 3 h or more, as every load is taken unless marked continuous: false — at most 80 % of the rating, unless the breaker is listed for 100 % duty',
  };
}

/**
 * Route lengths of one feeder's conductors that differ by more than terminations explain: above
 * 1.2 × the shortest and more than 1 m apart (common practice, no source; the conductors of a
 * feeder run together). The solve takes each conductor as written, so a slip there moves the
 * neutral's or a line's impedance silently.
 */
export const ROUTE_LENGTH_SPREAD = { ratio: 1.2, metres: 1 } as const;
const METRES_PER_FOOT = 0.3048;

function unequalRouteLengths(lengths: FeederRouteLengths, lineLabels: readonly string[]): BoardWarning | null {
  const given = [...lengths.lines, lengths.neutral].filter((m): m is number => m !== null);
  const shortest = Math.min(...given);
  const longest = Math.max(...given);
  if (given.length < 2 || longest <= shortest * ROUTE_LENGTH_SPREAD.ratio || longest - shortest <= ROUTE_LENGTH_SPREAD.metres) return null;
  const shown = (m: number, unit: LengthUnit) => (unit === 'ft' ? `${lengthFigure(m / METRES_PER_FOOT, 0)} ft` : `${lengthFigure(m, 1)} m`);
  const lines = lengths.lines.filter((m): m is number => m !== null);
  const unit0 = lengths.lineUnits[0] ?? 'm';
  const lineWords =
    lines.length === lengths.lines.length && lines.every((m) => m === lines[0]) && lengths.lineUnits.every((u) => u === unit0)
      ? [`${lines.length > 1 ? 'lines' : 'line'} ${shown(lines[0]!, unit0)}`]
      : lengths.lines.flatMap((m, k) => (m === null ? [] : [`${lineLabels[k]} ${shown(m, lengths.lineUnits[k] ?? 'm')}`]));
  const words = [...lineWords, ...(lengths.neutral === null ? [] : [`neutral ${shown(lengths.neutral, lengths.neutralUnit)}`])].join(', ');
  return {
    code: 'feeder-lengths-unalike',
    message: `the feeder's conductors are given different route lengths (${words}): the conductors of one feeder run together, so one length is likely a slip, and the solve takes each as written; check them`,
    value: longest / shortest,
    threshold: ROUTE_LENGTH_SPREAD.ratio,
  };
}

/**
 * The rule for a circuit that generates. North America: a source's output circuit carries its continuous
 * output current, and its breaker and conductors are sized at 125 % of it (NEC 705.28 and 705.30 for
 * interconnected sources, 690.8(A)/(B) for PV: from memory), whatever `continuous` says. IEC: the
 * design current, the source's rated output current, at most the device's rated current I_n
 * (IEC 60364-4-43, 433.1, as for a load; from memory).
 */
function outputCircuitRule(region: Region): { share: number; words: string } {
  if (region !== 'north-america') return { share: 1, words: "IEC 60364-4-43: a source's output current at most the rated current I_n" };
  return {
    share: WARNING_THRESHOLDS.continuousBreakerShare,
    words: "a generating circuit: NEC 705.28/705.30 (690.8 for PV), from memory: breaker and conductors at 125 % of the source's continuous output current, so at most 80 % of the rating",
  };
}

/**
 * A board whose bank in service (the file's `harmonics.banks`) delivers more than its own circuits draw:
 * the board sends capacitive kvar back up its feeder. Null when its circuits still draw lagging kvar.
 * @param deliveredKvar what the bank's parts in service deliver as solved, kvar
 * @param ownKvar the board's circuits with the bank, kvar (load convention, + lagging)
 */
export function bankOverLoadsWarning(deliveredKvar: number, ownKvar: number): BoardWarning | null {
  if (!(ownKvar < -ROUND_OFF_MARGIN * Math.max(1, deliveredKvar))) return null;
  return {
    code: 'bank-in-service-exceeds-loads',
    message: `its capacitor bank in service (harmonics.banks) delivers ${fmt(deliveredKvar, 2)} kvar, more than the ${fmt(ownKvar + deliveredKvar, 2)} kvar its own circuits draw: ${fmt(-ownKvar, 2)} kvar capacitive goes back up its feeder. A controller would hold steps out at these loads (stepsInService says which steps are in)`,
    value: ownKvar,
    threshold: 0,
  };
}

export const GENERAL_CAUTION =
  'trivar reports what the model you entered predicts. Confirm with measurements, and have any change to the installation designed to local codes and checked by a licensed professional.';

export const NEUTRAL_CAUTION =
  'A neutral carrying more current than a phase conductor, or a reduced neutral carrying more than its size allows, can overheat without tripping any overcurrent device (the neutral is normally unprotected). Check its size and terminations.';

/** The broken-neutral cautions in IEC wording (PEN, TN-C-S); `regionWords` gives each region's. */
export const OPEN_NEUTRAL_CAUTIONS: readonly string[] = regionWords('iec', 'three-phase-4wire').openNeutralCautions;

