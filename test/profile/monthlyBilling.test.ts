/**
 * Billing power factor and tariff charges against a month worked by hand
 * (figures in the comments; the tariff numbers are invented).
 */
import { describe, expect, it } from 'vitest';
import { billMonths } from '../../packages/core/src/profile/monthlyBilling.js';

const q15 = 900_000;
const t0 = Date.UTC(2025, 2, 31, 23, 0); // 2025-03-31 23:00 UTC, taken as local time too
const utc = Float64Array.from([0, 1, 2, 3, 4], (k) => t0 + k * q15 + (k === 4 ? 3_600_000 : 0));
const march = 2025 * 12 + 2;

describe('monthly billing', () => {
  const months = billMonths(
    {
      count: 5,
      utcMs: utc,
      localMs: utc,
      monthKey: Int32Array.from([march, march, march, march, march + 1]),
      intervalMs: q15,
      totalW: Float64Array.from([40e3, 40e3, -8e3, 20e3, 10e3]),
      totalVar: Float64Array.from([30e3, 30e3, 4e3, -10e3, 0]),
    },
    { reactive: { tanPhiAllowance: 0.4, pricePerKvarh: 0.02 }, demand: { windowMinutes: 30, pricePerKVA: 4 } },
  );

  it('matches the hand-worked month', () => {
    const m = months[0]!;
    // Imported (40 + 40 + 20) kW × 0.25 h = 25 kWh; exported 8 × 0.25 = 2 kWh.
    expect(m.kWhImport).toBeCloseTo(25, 12);
    expect(m.kWhExport).toBeCloseTo(2, 12);
    // Lagging (30 + 30 + 4) × 0.25 = 16 kvarh; leading 10 × 0.25 = 2.5 kvarh (not netted).
    expect(m.kvarhLagging).toBeCloseTo(16, 12);
    expect(m.kvarhLeading).toBeCloseTo(2.5, 12);
    // 25 / √(25² + 16²) = 25 / √881 = 0.842272...
    expect(m.billingPf).toBeCloseTo(0.8422714, 6);
    expect(m.tanPhi).toBeCloseTo(0.64, 12);
    // Allowance 0.4 × 25 = 10 kvarh; 6 kvarh charged at 0.02 = 0.12.
    expect(m.chargeableKvarh).toBeCloseTo(6, 12);
    expect(m.reactiveCharge).toBeCloseTo(0.12, 12);
    // 30-minute windows: mean (40, 30) → 50 kVA; mean (6, −3) → 6.71 kVA. Peak 50 kVA × 4 = 200.
    expect(m.peakKVA).toBeCloseTo(50, 12);
    expect(m.peakAtUtcMs).toBe(t0);
    expect(m.demandCharge).toBeCloseTo(200, 12);
    expect(m.hours).toBe(1);
  });

  it('starts a new month at the month key and reads unity PF without reactive energy', () => {
    expect(months.map((m) => m.month)).toEqual(['2025-03', '2025-04']);
    expect(months[1]).toMatchObject({ kWhImport: 2.5, kvarhLagging: 0, billingPf: 1, chargeableKvarh: 0 });
  });
});
