/**
 * The board's bus voltages against the levels of a basis (voltageDistortionLimits.ts): every order
 * above its level and the THD against its limit, for each phase voltage and each line-to-line voltage,
 * as % of the fundamental of that voltage. An order the basis gives no level for (EN 50160 above the
 * 25th) counts through THD only.
 * A board without a neutral (3-wire) is judged on its line-to-line voltages only: its
 * "phase" voltages are to the mean of the three, a point no conductor or equipment reaches.
 */
import type { BusVoltageDistortion, DistortionReading, HarmonicLineReading, VoltageDistortionCheck } from './harmonicsResult.js';
import type { HarmonicModel } from './harmonicModel.js';
import { ROUND_OFF_MARGIN } from '../analysis/boardWarnings.js';
import { VOLTAGE_DISTORTION_LIMITS, type VoltageDistortionLimits } from './voltageDistortionLimits.js';

/** Above a level by more than round-off: a voltage written at exactly its level is within it. */
const over = (x: number, limit: number) => x > limit * (1 + ROUND_OFF_MARGIN);

function busCheck(bus: string, voltage: DistortionReading, limits: VoltageDistortionLimits): BusVoltageDistortion {
  const orders = voltage.orders.flatMap((o) => (o.percentOfFundamental === null ? [] : [{ order: o.order, percent: o.percentOfFundamental }]));
  const largest = orders.reduce<{ order: number; percent: number } | null>((best, o) => (best === null || o.percent > best.percent ? o : best), null);
  const ordersAbove = orders.flatMap((o) => {
    const limitPercent = limits.orderPercent(o.order);
    return limitPercent !== null && over(o.percent, limitPercent) ? [{ ...o, limitPercent }] : [];
  });
  return { bus, thdPercent: voltage.thdPercent, largest, ordersAbove, ok: ordersAbove.length === 0 && (voltage.thdPercent === null || !over(voltage.thdPercent, limits.thdPercent)) };
}

export function checkVoltageDistortion(
  lines: readonly HarmonicLineReading[],
  lineToLine: readonly { pair: string; voltage: DistortionReading }[],
  hasNeutral: boolean,
  basis: HarmonicModel['voltageDistortionLimits'],
): VoltageDistortionCheck {
  const limits = VOLTAGE_DISTORTION_LIMITS[basis.basis];
  const toNeutral = hasNeutral || !lineToLine.length ? lines.map((l) => busCheck(`${l.phase}-N`, l.voltage, limits)) : [];
  const buses = [...toNeutral, ...lineToLine.map((p) => busCheck(p.pair, p.voltage, limits))];
  const solved = [...new Set([...lines, ...lineToLine].flatMap((x) => x.voltage.orders.map((o) => o.order)))].sort((a, b) => a - b);
  return {
    basis: basis.basis,
    basisFrom: basis.from,
    basisName: limits.name,
    individualLimitPercent: limits.flatPercent,
    orderLimits: solved.map((order) => ({ order, limitPercent: limits.orderPercent(order) })),
    thdLimitPercent: limits.thdPercent,
    buses,
    ok: buses.every((b) => b.ok),
    source: limits.source,
  };
}
