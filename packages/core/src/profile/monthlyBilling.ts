/**
 * Calendar-month energy and the billing power factor, with the tariff forms
 * priced from the user's own figures.
 *
 * A reactive-energy register counts lagging kvarh; leading kvarh (an
 * over-corrected board at night) is shown separately and not netted off
 * (common practice, no source — tariffs differ; check the local one).
 * Billing PF = kWh / √(kWh² + kvarh²) with imported kWh and lagging kvarh.
 */
import type { TariffSpec } from './profileSpec.js';
import { PROFILE_DEFAULTS } from './profileDefaults.js';
import { billingPowerFactor } from './billingPowerFactor.js';

export interface MonthReading {
  /** "2025-03", in the study's time zone. */
  readonly month: string;
  readonly hours: number;
  readonly kWhImport: number;
  readonly kWhExport: number;
  readonly kvarhLagging: number;
  readonly kvarhLeading: number;
  /** kWhImport / √(kWhImport² + kvarhLagging²); null when nothing was imported. */
  readonly billingPf: number | null;
  /** kvarhLagging / kWhImport. */
  readonly tanPhi: number;
  /** Highest window-average kVA of the month. */
  readonly peakKVA: number;
  readonly peakAtUtcMs: number;
  /** kvarh above the allowance and its charge (null without a reactive tariff). */
  readonly chargeableKvarh: number | null;
  readonly reactiveCharge: number | null;
  readonly demandCharge: number | null;
}

export interface MonthlyInput {
  readonly count: number;
  readonly utcMs: Float64Array;
  /** Month key (year·12 + month − 1) of each interval in local time. */
  readonly monthKey: Int32Array;
  /** Local wall-clock ms of each interval (for demand windows). */
  readonly localMs: Float64Array;
  readonly intervalMs: number;
  /** The hours each interval stands for, where rows are not all one interval apart. @defaultValue every row one interval */
  readonly rowHours?: Float64Array | null;
  /** Board totals per interval, W and var (load convention). */
  readonly totalW: Float64Array;
  readonly totalVar: Float64Array;
}

const monthLabel = (key: number) => `${Math.floor(key / 12)}-${String((key % 12) + 1).padStart(2, '0')}`;

export function billMonths(input: MonthlyInput, tariff: TariffSpec | undefined): MonthReading[] {
  const hoursEach = input.intervalMs / 3_600_000;
  const rowHours = input.rowHours ?? null;
  const windowMs = (tariff?.demand?.windowMinutes ?? PROFILE_DEFAULTS.demandWindowMinutes) * 60_000;
  const out: MonthReading[] = [];
  let i = 0;
  while (i < input.count) {
    const key = input.monthKey[i]!;
    let kWhImport = 0;
    let kWhExport = 0;
    let lag = 0;
    let lead = 0;
    let n = 0;
    let hours = 0;
    let peak = 0;
    let peakAt = input.utcMs[i]!;
    // Demand windows aligned to the local clock; a window's kVA is from its mean P and mean Q over the time its rows cover.
    let window = Math.floor(input.localMs[i]! / windowMs);
    let wp = 0;
    let wq = 0;
    let wn = 0;
    let wStart = input.utcMs[i]!;
    const closeWindow = () => {
      if (wn === 0) return;
      const kva = Math.hypot(wp / wn, wq / wn) / 1000;
      if (kva > peak) {
        peak = kva;
        peakAt = wStart;
      }
    };
    for (; i < input.count && input.monthKey[i] === key; i++) {
      const hoursPer = rowHours ? rowHours[i]! : hoursEach;
      const p = input.totalW[i]! * hoursPer / 1000;
      const q = input.totalVar[i]! * hoursPer / 1000;
      if (p >= 0) kWhImport += p;
      else kWhExport -= p;
      if (q >= 0) lag += q;
      else lead -= q;
      n++;
      hours += hoursPer;
      const w = Math.floor(input.localMs[i]! / windowMs);
      if (w !== window) {
        closeWindow();
        window = w;
        wp = wq = wn = 0;
        wStart = input.utcMs[i]!;
      }
      // Weighted by the rows' hours only where they differ: regular rows keep the plain mean to the bit.
      const weight = rowHours ? hoursPer : 1;
      wp += input.totalW[i]! * weight;
      wq += input.totalVar[i]! * weight;
      wn += weight;
    }
    closeWindow();
    const billingPf = billingPowerFactor(kWhImport, lag);
    const reactive = tariff?.reactive;
    const chargeable = reactive ? Math.max(0, lag - reactive.tanPhiAllowance * kWhImport) : null;
    out.push({
      month: monthLabel(key),
      hours: rowHours ? hours : n * hoursEach,
      kWhImport,
      kWhExport,
      kvarhLagging: lag,
      kvarhLeading: lead,
      billingPf,
      tanPhi: kWhImport > 0 ? lag / kWhImport : 0,
      peakKVA: peak,
      peakAtUtcMs: peakAt,
      chargeableKvarh: chargeable,
      reactiveCharge: reactive && chargeable !== null ? chargeable * reactive.pricePerKvarh : null,
      demandCharge: tariff?.demand ? peak * tariff.demand.pricePerKVA : null,
    });
  }
  return out;
}
