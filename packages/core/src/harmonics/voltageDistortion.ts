/**
 * The board's bus voltages against the IEEE 519 voltage limits: every order
 * above the individual limit and the THD against its limit, for each phase
 * voltage and each line-to-line voltage, as % of the fundamental of that voltage.
 * A board without a neutral (3-wire) is judged on its line-to-line voltages only: its
 * "phase" voltages are to the mean of the three, a point no conductor or equipment reaches.
 */
import type { BusVoltageDistortion, DistortionReading, HarmonicLineReading, VoltageDistortionCheck } from './harmonicsResult.js';
import { IEEE_519_VOLTAGE_LIMITS, IEEE_519_VOLTAGE_SOURCE } from './ieee519.js';

function busCheck(bus: string, voltage: DistortionReading): BusVoltageDistortion {
  const { individualPercent, thdPercent } = IEEE_519_VOLTAGE_LIMITS;
  const orders = voltage.orders.flatMap((o) => (o.percentOfFundamental === null ? [] : [{ order: o.order, percent: o.percentOfFundamental }]));
  const largest = orders.reduce<{ order: number; percent: number } | null>((best, o) => (best === null || o.percent > best.percent ? o : best), null);
  const ordersAbove = orders.filter((o) => o.percent > individualPercent);
  return { bus, thdPercent: voltage.thdPercent, largest, ordersAbove, ok: ordersAbove.length === 0 && (voltage.thdPercent === null || voltage.thdPercent <= thdPercent) };
}

export function checkVoltageDistortion(lines: readonly HarmonicLineReading[], lineToLine: readonly { pair: string; voltage: DistortionReading }[], hasNeutral: boolean): VoltageDistortionCheck {
  const toNeutral = hasNeutral || !lineToLine.length ? lines.map((l) => busCheck(`${l.phase}-N`, l.voltage)) : [];
  const buses = [...toNeutral, ...lineToLine.map((p) => busCheck(p.pair, p.voltage))];
  return {
    individualLimitPercent: IEEE_519_VOLTAGE_LIMITS.individualPercent,
    thdLimitPercent: IEEE_519_VOLTAGE_LIMITS.thdPercent,
    buses,
    ok: buses.every((b) => b.ok),
    source: IEEE_519_VOLTAGE_SOURCE,
  };
}
