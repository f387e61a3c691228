/**
 * The supply resonance a correction estimates is worked from the reactance of the supply path,
 * h = √(X_C/X_path): behind a long, small cable feeder R is not small, and the classic √(S_sc/Q_C)
 * with S_sc from |Z| names too low an order. Checked against the harmonic study's own scan of the
 * same bank on the same board, and by hand.
 */
import { describe, expect, it } from 'vitest';
import { correctInstallation, normaliseInstallation, parseInstallation, studyInstallationHarmonics, type InstallationSpec } from '@trivar/core';

// A pottery's kiln shed fed over a long 16 mm² run from the yard board; 250 kVA, 4.5 %, X/R 4 transformer.
const kilnShed = (extra: Record<string, unknown> = {}): InstallationSpec =>
  parseInstallation({
    name: 'Tern quay pottery',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4.5, xOverR: 4 } },
    boards: [
      {
        name: 'Yard board',
        feeder: { line: { r: 0.002, x: 0.001, ratingA: 280 }, neutral: { r: 0.002, x: 0.001, ratingA: 280 } },
        loads: [{ name: 'Clay mixer', connection: 'ABC-delta', kW: 30, pf: 0.8 }],
      },
      {
        name: 'Kiln shed',
        fedFrom: 'Yard board',
        feeder: { line: { r: 0.032, x: 0.005, ratingA: 110 }, neutral: { r: 0.032, x: 0.005, ratingA: 110 } },
        loads: [
          { name: 'Glaze booth fans', connection: 'ABC-star', kW: 46, pf: 0.68 },
          // Resistive and equal, so the star bank comes out equal: its current meets X_path on the lines alone
          // (an unequal bank puts a return current in the neutral, and its estimate weighs that too).
          { name: 'Pug mill', connection: 'A-N', kW: 7, pf: 1 },
          { name: 'Wheel room', connection: 'B-N', kW: 7, pf: 1 },
          { name: 'Drying racks', connection: 'C-N', kW: 7, pf: 1 },
        ],
      },
    ],
    ...extra,
  });

// By hand: Z_T = 0.045 × 400²/250 kVA = 0.0288 Ω, X_T = 0.0288 × 4/√17 = 0.027940 Ω, R_T = 0.006985 Ω.
const X_PATH = (0.045 * 400 ** 2) / 250e3 * (4 / Math.sqrt(17)) + 0.001 + 0.005;
const R_PATH = (0.045 * 400 ** 2) / 250e3 * (1 / Math.sqrt(17)) + 0.002 + 0.032;

describe('supply resonance from the path reactance, behind a cable feeder', () => {
  const study = correctInstallation(normaliseInstallation(kilnShed()).installation, { arrangement: 'star-bank' }, { board: 'Kiln shed' });
  const v = study.report.verification;
  const qC = v.resonanceCapacitance.totalKvar;

  it('takes X_path = 0.03394 Ω, and h = √(V²/(X_path·Q_C)), not √(S_sc/Q_C) from |Z|', () => {
    expect(v.resonanceCapacitance.supplyReactanceOhm!).toBeCloseTo(X_PATH, 9);
    expect(X_PATH).toBeCloseTo(0.03394, 5);
    const byHand = Math.sqrt(400 ** 2 / X_PATH / (qC * 1000));
    expect(v.resonanceOrder!).toBeCloseTo(byHand, 9);
    // |Z| = 0.0530 Ω here (R 0.0410, X 0.0339): the old estimate sits 20 % lower.
    const fromZ = Math.sqrt(400 ** 2 / Math.hypot(R_PATH, X_PATH) / (qC * 1000));
    expect(v.resonanceOrder! / fromZ).toBeCloseTo(Math.sqrt(Math.hypot(R_PATH, X_PATH) / X_PATH), 9);
    expect(v.resonanceOrder! / fromZ).toBeGreaterThan(1.2);
  });

  it('lands near the scanned peak of the same bank in the harmonic study, and both name the 11th', () => {
    expect(qC).toBeGreaterThan(35);
    expect(qC).toBeLessThan(45);
    expect(v.resonanceOrder!).toBeGreaterThan(10);
    expect(v.resonanceOrder!).toBeLessThan(11.5);
    expect(v.resonanceNearOrders).toEqual([11]);
    expect(study.report.warnings.find((w) => w.code === 'resonance')?.message).toMatch(/resonate near harmonic order 1\d\.\d \(within 10 % of the 11th\), estimated as √\(X_C\/X_path\)/);
    // The same capacitance as a 280 V star bank in service: 3 × Q_r (230.94/280)² = Q_C.
    const ratedKvar = qC / (400 / Math.sqrt(3) / 280) ** 2;
    const scan = studyInstallationHarmonics(kilnShed({ harmonics: { scan: { maxOrder: 20, step: 0.02 }, banks: [{ board: 'Kiln shed', connection: 'star', ratedV: 280, stepsKvar: [ratedKvar] }] } }))
      .scans.find((s) => s.board === 'Kiln shed')!.scan;
    const on = scan.combinations.find((c) => c.capacitorKvar > 0)!;
    expect(on.formulaOrder!).toBeCloseTo(v.resonanceOrder!, 1);
    for (const peak of on.peaks) expect(Math.abs(peak.order - v.resonanceOrder!) / v.resonanceOrder!).toBeLessThan(0.04);
    expect(on.nearOrders).toContain(11);
  });
});
