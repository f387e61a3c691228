/**
 * Per-interval figures → the summary people read: peaks and percentiles with
 * when they happen, hours beyond thresholds, energy, calendar months.
 */
import type { VoltageUnbalanceLimit } from '../board/conventions/unbalanceLimits.js';
import { SUPPLY_LIMITS } from '../analysis/readSupplyState.js';
import { aboveBandEdge, belowBandEdge, type VoltageLimits } from '../board/conventions/voltageLimits.js';
import { lineRatingOf, type Board } from '../board/boardModel.js';
import { lineToLinePairs, type IntervalFigures } from './solveBatch.js';
import { countWhere, maximumOf, minimumOf, percentilesOf, topIndices } from './intervalStatistics.js';
import { billMonths, type MonthReading } from './monthlyBilling.js';
import type { TariffSpec } from './profileSpec.js';
import { billingPowerFactor } from './billingPowerFactor.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';

export interface ConductorSummary {
  /** A, B, C or N. */
  readonly conductor: string;
  readonly maxA: number;
  /** When the peak was; null for a conductor that carries no current in any interval (it has no peak). */
  readonly maxAt: string | null;
  readonly p95A: number;
  readonly p95At: string;
  readonly p99A: number;
  readonly p99At: string;
  readonly ratingA: number | null;
  /** Hours above the rating, or above the neutral threshold for N; null without one. */
  readonly hoursAboveLimit: number | null;
}

export interface VoltageSummary {
  /** The voltage: a phase ("A", to the neutral bar) or a line pair ("A-B"). */
  readonly phase: string;
  readonly minPercent: number;
  readonly minAt: string;
  readonly maxPercent: number;
  readonly maxAt: string;
}

export interface WorstInterval {
  readonly at: string;
  readonly neutralA: number;
  readonly maxLineA: number;
  /** Voltage unbalance at the board on the region's index (ResolvedLimits.unbalance), %; null on a board of fewer than three phases. */
  readonly unbalancePercent: number | null;
}

export interface ResolvedLimits {
  /** Voltage unbalance above this counts, on the index of `unbalance` (the board region's, unbalanceLimits.ts). */
  readonly unbalancePercent: number;
  /** The index judged (|V2|/|V1|, or the line-to-line deviation from the average), its name, definition and the limit's source. */
  readonly unbalance: VoltageUnbalanceLimit;
  /** Where the threshold comes from: the region's default, or the file's `profile.limits.unbalancePercent`. */
  readonly unbalanceFrom: 'region' | 'profile.limits';
  readonly neutralA: number | null;
  /** Voltages below this (% of their nominal, judged as printed to 0.1 %) count as low: line-to-neutral and line-to-line, as `voltages` lists them. */
  readonly voltageLowPercent: number;
  readonly voltageHighPercent: number;
  /** Where the voltage band comes from: the board's own limits (their preset, or `custom`), or the study's `profile.limits`. */
  readonly voltageLimitsFrom: VoltageLimits['preset'] | 'profile.limits';
}

export interface ProfileSummary {
  readonly hours: number;
  readonly conductors: readonly ConductorSummary[];
  /**
   * The voltages the board's limits judge (as voltageCheck.ts does for one solve): each phase to the neutral
   * bar where there is a neutral (or no line pair), then each line pair, % of the matching nominal.
   */
  readonly voltages: readonly VoltageSummary[];
  readonly hoursVoltageLow: number;
  readonly hoursVoltageHigh: number;
  /**
   * Hours in which a phase voltage is below SUPPLY_LIMITS.collapsedVoltagePercent (50 %) of nominal: past
   * the nose of the supply's P–V curve, where `trivar solve` reports a collapse. Those intervals' figures
   * describe a state the real loads would not settle in.
   */
  readonly hoursCollapsed: number;
  readonly unbalance: { readonly maxPercent: number; readonly maxAt: string; readonly p95Percent: number; readonly hoursAbove: number } | null;
  readonly energy: {
    readonly phases: readonly { readonly phase: string; readonly kWh: number; readonly kvarh: number }[];
    readonly kWhImport: number;
    readonly kWhExport: number;
    readonly kvarhLagging: number;
    readonly kvarhLeading: number;
    /** kWhImport / √(kWhImport² + kvarhLagging²); null when nothing was imported. */
    readonly billingPf: number | null;
  };
  /** Hours in which the board imports power at a leading power factor. */
  readonly leadingHours: number;
  readonly months: readonly (MonthReading & { readonly peakAt: string })[];
  readonly worstByNeutral: readonly WorstInterval[];
  readonly worstByLine: readonly WorstInterval[];
}

export interface SummaryContext {
  readonly board: Board;
  readonly utcMs: Float64Array;
  readonly localMs: Float64Array;
  readonly monthKey: Int32Array;
  readonly intervalMs: number;
  /**
   * The hours each interval stands for where rows are not all one interval apart (IntervalTable.rowHours):
   * every hour, energy and demand figure weighs each row by it. @defaultValue every row one interval
   */
  readonly rowHours?: Float64Array | null;
  readonly limits: ResolvedLimits;
  readonly tariff: TariffSpec | undefined;
  /** Wall-clock label of interval i: "2025-10-26 01:30", with its UTC offset ("+01:00") in a zone other than UTC (profileClock). */
  readonly label: (i: number) => string;
  readonly labelUtc: (utcMs: number) => string;
}

/**
 * Reactive power below this share of the board's peak apparent power is round-off of the solve, not a
 * leading power factor: a board of resistive loads, or an idle one, reads about ±1e-14 of it in vars.
 */
const ROUND_OFF_VAR = 1e-9;

export function summariseFigures(f: IntervalFigures, ctx: SummaryContext): ProfileSummary {
  const { board, limits } = ctx;
  const n = f.count;
  const h = ctx.intervalMs / 3_600_000;
  const rowHours = ctx.rowHours ?? null;
  const hoursAt = (i: number) => (rowHours ? rowHours[i]! : h);
  const hoursWhere = (predicate: (i: number) => boolean) => {
    if (!rowHours) return countWhere(n, predicate) * h;
    let sum = 0;
    for (let i = 0; i < n; i++) if (predicate(i)) sum += rowHours[i]!;
    return sum;
  };
  const conductor = (name: string, x: Float64Array, rating: number | null): ConductorSummary => {
    const max = maximumOf(x);
    const [p95, p99] = percentilesOf(x, [0.95, 0.99]);
    return {
      conductor: name,
      maxA: max.value,
      maxAt: max.value > 0 ? ctx.label(max.index) : null,
      p95A: p95!.value,
      p95At: ctx.label(p95!.index),
      p99A: p99!.value,
      p99At: ctx.label(p99!.index),
      ratingA: rating,
      hoursAboveLimit: rating === null ? null : hoursWhere((i) => x[i]! > rating),
    };
  };
  const conductors = board.phases.map((p, k) => conductor(p, f.lineA[k]!, lineRatingOf(board, k)));
  if (board.hasNeutral) conductors.push(conductor('N', f.neutralA, limits.neutralA));
  const nominal = judgedNominalOf(board);
  const vPct = 100 / nominal.ln;
  const pairs = lineToLinePairs(board.phases.length);
  const llNominal = nominal.ll ?? nominal.ln;
  // Each judged voltage as a column in % of its nominal: phase voltages only where a neutral gives them meaning.
  const judged: { name: string; column: Float64Array; toPercent: number }[] = [
    ...(board.hasNeutral || pairs.length === 0 ? board.phases.map((p, k) => ({ name: p as string, column: f.phaseV[k]!, toPercent: vPct })) : []),
    ...pairs.map(([x, y], k) => ({ name: `${board.phases[x]}-${board.phases[y]}`, column: f.lineToLineV[k]!, toPercent: 100 / llNominal })),
  ];
  const voltages = judged.map(({ name, column, toPercent }) => {
    const lo = minimumOf(column);
    const hi = maximumOf(column);
    return { phase: name, minPercent: lo.value * toPercent, minAt: ctx.label(lo.index), maxPercent: hi.value * toPercent, maxAt: ctx.label(hi.index) };
  });
  let low = 0;
  let high = 0;
  let collapsed = 0;
  const collapseV = (SUPPLY_LIMITS.collapsedVoltagePercent / 100) * nominal.ln;
  for (let i = 0; i < n; i++) {
    let lo = Number.POSITIVE_INFINITY;
    let hi = 0;
    for (let j = 0; j < judged.length; j++) {
      const percent = judged[j]!.column[i]! * judged[j]!.toPercent;
      if (percent < lo) lo = percent;
      if (percent > hi) hi = percent;
    }
    // The board verdict's judgement (beyond round-off), so an interval counted here is one a solve of it calls outside.
    if (belowBandEdge(lo, limits.voltageLowPercent)) low += hoursAt(i);
    if (aboveBandEdge(hi, limits.voltageHighPercent)) high += hoursAt(i);
    // A collapse is a phase below half its nominal (the supply's rule), whichever voltages are judged.
    let phaseLow = Number.POSITIVE_INFINITY;
    for (const col of f.phaseV) if (col[i]! < phaseLow) phaseLow = col[i]!;
    if (phaseLow < collapseV) collapsed += hoursAt(i);
  }
  const totalW = new Float64Array(n);
  const totalVar = new Float64Array(n);
  for (let k = 0; k < board.phases.length; k++)
    for (let i = 0; i < n; i++) {
      totalW[i] = totalW[i]! + f.phaseW[k]![i]!;
      totalVar[i] = totalVar[i]! + f.phaseVar[k]![i]!;
    }
  let peakVA = 0;
  for (let i = 0; i < n; i++) peakVA = Math.max(peakVA, Math.hypot(totalW[i]!, totalVar[i]!));
  const varFloor = ROUND_OFF_VAR * peakVA;
  const months = billMonths({ count: n, utcMs: ctx.utcMs, monthKey: ctx.monthKey, localMs: ctx.localMs, intervalMs: ctx.intervalMs, rowHours, totalW, totalVar }, ctx.tariff);
  const sumOf = (pick: (m: MonthReading) => number) => months.reduce((s, m) => s + pick(m), 0);
  const kWhImport = sumOf((m) => m.kWhImport);
  const kvarhLagging = sumOf((m) => m.kvarhLagging);
  // Σ x·hours: energy of a column of W or var, in Wh or varh.
  const sumCol = (x: Float64Array) => (rowHours ? x.reduce((s, v, i) => s + v * rowHours[i]!, 0) : x.reduce((s, v) => s + v, 0) * h);
  // The region's index: |V2|/|V1| (IEC), or the line-to-line deviation from the average (ANSI C84.1).
  const unbalanceColumn = limits.unbalance.index === 'negative-sequence' ? f.unbalancePercent : f.lineDeviationPercent;
  const worst = (i: number): WorstInterval => ({
    at: ctx.label(i),
    neutralA: f.neutralA[i]!,
    maxLineA: Math.max(...f.lineA.map((col) => col[i]!)),
    unbalancePercent: board.phases.length === 3 ? unbalanceColumn[i]! : null,
  });
  const maxLine = new Float64Array(n);
  for (let i = 0; i < n; i++) for (const col of f.lineA) if (col[i]! > maxLine[i]!) maxLine[i] = col[i]!;
  const threePhase = board.phases.length === 3;
  const vuMax = maximumOf(unbalanceColumn);
  return {
    hours: rowHours ? rowHours.reduce((a, b) => a + b, 0) : n * h,
    conductors,
    voltages,
    hoursVoltageLow: low,
    hoursVoltageHigh: high,
    hoursCollapsed: collapsed,
    unbalance: threePhase
      ? {
          maxPercent: vuMax.value,
          maxAt: ctx.label(vuMax.index),
          p95Percent: percentilesOf(unbalanceColumn, [0.95])[0]!.value,
          hoursAbove: hoursWhere((i) => unbalanceColumn[i]! > limits.unbalancePercent),
        }
      : null,
    energy: {
      phases: board.phases.map((p, k) => ({ phase: p, kWh: sumCol(f.phaseW[k]!) / 1000, kvarh: sumCol(f.phaseVar[k]!) / 1000 })),
      kWhImport,
      kWhExport: sumOf((m) => m.kWhExport),
      kvarhLagging,
      kvarhLeading: sumOf((m) => m.kvarhLeading),
      billingPf: billingPowerFactor(kWhImport, kvarhLagging),
    },
    leadingHours: hoursWhere((i) => totalW[i]! > 0 && totalVar[i]! < -varFloor),
    months: months.map((m) => ({ ...m, peakAt: ctx.labelUtc(m.peakAtUtcMs) })),
    worstByNeutral: board.hasNeutral ? topIndices(f.neutralA, 5).map(worst) : [],
    worstByLine: topIndices(maxLine, 5).map(worst),
  };
}
