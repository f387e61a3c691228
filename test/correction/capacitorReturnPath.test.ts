/**
 * The supply path a capacitor's current meets, for the resonance order h = √(X_C/X_path), the rise
 * estimate ΔV/V ≈ Q_C·X/V² = Q_C/S_sc,X and the short-circuit power: on a single-phase 2-wire board
 * the current goes out on the line and back on the neutral, so the neutral is in every one of them;
 * on split-phase and three-phase boards only the part of the capacitor current that does not cancel
 * on the neutral returns there. Hand figures beside every assertion.
 */
import { describe, expect, it } from 'vitest';
import { buildBoardReport, correctBoard, normaliseBoard, parseBoard, renderReportMarkdown, shortCircuitVA, solveBoardModel, studyHarmonics, verifyCorrection, type EquipmentGroup } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

type Pair = 'A-N' | 'B-N' | 'C-N' | 'A-B';
const capacitor = (pair: Pair, vNominal: number, susceptanceS: number): EquipmentGroup => {
  const [from, to] = pair.split('-') as ['A' | 'B' | 'C', 'B' | 'N'];
  return {
    name: `test capacitor ${pair}`,
    connection: pair,
    branches: [{ branch: pair, from, to, vNominal, susceptanceS, fixedSusceptanceS: susceptanceS }],
  };
};

// An invented orchard pump hut: 230 V single-phase, ideal source, line and neutral each 60 m at
// 0.3 + j0.1 Ω/km (R 0.018, X 0.006 Ω per conductor), a 14 kW irrigation pump at PF 0.70.
const pumpHutSpec = (extra: Record<string, unknown> = {}) => ({
  name: 'Larkspur orchard pump hut',
  supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 },
  feeder: {
    line: { lengthM: 60, rOhmPerKm: 0.3, xOhmPerKm: 0.1, ratingA: 100 },
    neutral: { lengthM: 60, rOhmPerKm: 0.3, xOhmPerKm: 0.1, ratingA: 100 },
  },
  loads: [{ name: 'Irrigation pump', connection: 'A-N', model: 'constant-impedance', kW: 14, pf: 0.7 }],
  ...extra,
});
const pumpHut = normaliseBoard(parseBoard(pumpHutSpec()));
// The loop: line out, neutral back.
const LOOP_R = 2 * 0.018;
const LOOP_X = 2 * 0.006;

describe('single-phase board: the neutral is half the supply loop', () => {
  // X_C = 4.0 Ω: 13.2 kvar at 230 V.
  const xC = 4;
  const v = verifyCorrection(pumpHut, { equipment: [capacitor('A-N', 230, 1 / xC)] });

  it('short-circuit power 230²/|Z_line + Z_neutral| = 1394 kVA (not 2788 kVA from the line alone)', () => {
    expectClose(shortCircuitVA(pumpHut)!, 230 ** 2 / Math.hypot(LOOP_R, LOOP_X), { rel: 1e-12, abs: 0 }, 'S_sc');
    expect(shortCircuitVA(pumpHut)! / 1000).toBeCloseTo(1394.0, 1);
    expectClose(v.voltageRise.shortCircuitKVA!, 230 ** 2 / Math.hypot(LOOP_R, LOOP_X) / 1000, { rel: 1e-12, abs: 0 }, 'S_sc in the rise');
  });

  it('X_path = 0.012 Ω (line 0.006 + neutral 0.006), S_sc,X = 230²/0.012 = 4408 kVA', () => {
    const c = v.resonanceCapacitance;
    expectClose(c.supplyReactanceOhm!, LOOP_X, { rel: 1e-12, abs: 0 }, 'X_path');
    expectClose(c.neutralReactanceOhm!, 0.006, { rel: 1e-12, abs: 0 }, 'X_N');
    expectClose(c.reactanceShortCircuitKVA!, 230 ** 2 / LOOP_X / 1000, { rel: 1e-12, abs: 0 }, 'S_sc,X');
  });

  it('h = √(X_C/X_path) = √(4/0.012) = 18.3, near the 17th and the 19th, and warned (the line alone gave 25.8, no warning)', () => {
    // From X and C alone, whatever voltage the board settles at: exactly √(X_C/X_path), one loop, one order.
    expectClose(v.resonanceOrder!, Math.sqrt(xC / LOOP_X), { rel: 1e-12, abs: 0 }, 'h by hand');
    expect(v.resonanceOrders).toHaveLength(1);
    expect(v.resonanceNearOrders).toEqual([17, 19]);
    expect(v.warnings.map((w) => w.code)).toContain('resonance');
  });

  it('the rise estimate Q_C·X_path/V² agrees with the solved rise (Q_C/S_sc from the line’s |Z| alone said 1.6 times it)', () => {
    const q = v.voltageRise.capacitorKvar * 1000;
    expectClose(v.voltageRise.estimatePercent!, (100 * q * LOOP_X) / 230 ** 2, { rel: 1e-12, abs: 0 }, 'rise estimate');
    expectClose(v.voltageRise.reactanceShortCircuitKVA!, 230 ** 2 / LOOP_X / 1000, { rel: 1e-12, abs: 0 }, 'S_sc,X of the rise');
    // 13 kvar × 0.012 Ω / 230² ≈ 0.30 %; the solve agrees within a tenth.
    expect(v.voltageRise.estimatePercent!).toBeCloseTo(0.3, 1);
    expectClose(v.voltageRise.solvedPercent, v.voltageRise.estimatePercent!, { rel: 0.1, abs: 0 }, 'solved rise');
  });

  it('a correction sized on the board warns of the resonance its bank makes with the loop', () => {
    const report = correctBoard(pumpHut, { arrangement: 'star-bank', target: { pf: 0.95 } });
    const r = report.verification;
    expectClose(r.resonanceCapacitance.supplyReactanceOhm!, LOOP_X, { rel: 1e-12, abs: 0 }, 'X_path');
    // The bank as built, X_C = V²/Q_C at nominal voltage: h = √(X_C/X_path).
    const built = report.verification.equipment.flatMap((g) => g.branches).reduce((s, b) => s + b.susceptanceS, 0);
    expectClose(r.resonanceOrder!, Math.sqrt(1 / built / LOOP_X), { rel: 1e-12, abs: 0 }, 'h');
  });

  it('the report gives the loop: S_sc 1394 kVA, X_path 0.0120 Ω of line and neutral', () => {
    const spec = parseBoard(pumpHutSpec());
    const correction = correctBoard(pumpHut, { arrangement: 'star-bank', target: { pf: 0.95 } });
    const text = renderReportMarkdown(buildBoardReport({ spec, result: solveBoardModel(pumpHut), correction }), 'pump-hut').markdown.replace(/\\_/g, '_');
    expect(text).toContain('**Short-circuit power at the board:** 1394 kVA');
    expect(text).toContain('**Reactance of the supply path:** 0.0120 Ω, the loop out on the line and back on the neutral (S_sc,X = 4408 kVA)');
  });

  it('the harmonic scan of the same capacitor peaks where the estimate says, and its S_sc is the loop’s', () => {
    // 13.2 kvar at 230 V as a 230 V bank across line and neutral.
    const kvar = 230 ** 2 / xC / 1000;
    const study = studyHarmonics(
      pumpHutSpec({
        loads: [
          { name: 'Irrigation pump', connection: 'A-N', model: 'constant-impedance', kW: 14, pf: 0.7 },
          { name: 'Dosing controller', connection: 'A-N', kW: 0.6, pf: 0.95, spectrum: 'switch-mode' },
        ],
        harmonics: { scan: { maxOrder: 25, step: 0.02 }, bank: { connection: 'star', ratedV: 230, stepsKvar: [kvar] } },
      }),
    );
    const scan = study.scan!;
    expectClose(scan.shortCircuitKVA!, 230 ** 2 / Math.hypot(LOOP_R, LOOP_X) / 1000, { rel: 1e-12, abs: 0 }, 'S_sc of the scan');
    const on = scan.combinations.find((c) => c.capacitorKvar > 0)!;
    expectClose(on.formulaOrder!, Math.sqrt(xC / LOOP_X), { rel: 1e-9, abs: 0 }, '√(X_C/X_path)');
    expect(on.peaks.length).toBeGreaterThan(0);
    // The pump's own admittance sits across the capacitor: the peak within 3 % of the lossless estimate.
    expect(Math.abs(on.peaks[0]!.order - on.formulaOrder!) / on.formulaOrder!).toBeLessThan(0.03);
  });

  it('the IEEE 519 short-circuit ratio takes the loop too: I_sc = 230/|Z_loop|', () => {
    const study = studyHarmonics(
      pumpHutSpec({
        loads: [
          { name: 'Irrigation pump', connection: 'A-N', model: 'constant-impedance', kW: 14, pf: 0.7 },
          { name: 'Dosing controller', connection: 'A-N', kW: 0.6, pf: 0.95, spectrum: 'switch-mode' },
        ],
        harmonics: { pcc: { demandCurrentA: 100 } },
      }),
    );
    expectClose(study.tdd!.shortCircuitRatio, 230 / Math.hypot(LOOP_R, LOOP_X) / 100, { rel: 1e-12, abs: 0 }, 'I_sc/I_L');
  });
});

// An invented hillside cabin: 120/240 V split-phase, ideal source, each line 40 m at 0.25 + j0.1 Ω/km
// (X 0.004 Ω), the neutral 40 m at 0.25 + j0.15 Ω/km (X 0.006 Ω).
const cabin = normaliseBoard(
  parseBoard({
    name: 'Bramble hill cabin',
    supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 },
    feeder: {
      line: { lengthM: 40, rOhmPerKm: 0.25, xOhmPerKm: 0.1, ratingA: 100 },
      neutral: { lengthM: 40, rOhmPerKm: 0.25, xOhmPerKm: 0.15, ratingA: 100 },
    },
    loads: [
      { name: 'Well pump', connection: 'A-B', model: 'constant-impedance', kW: 3, pf: 0.75 },
      { name: 'Kitchen', connection: 'A-N', model: 'constant-impedance', kW: 1.5, pf: 0.9 },
      { name: 'Workshop', connection: 'B-N', model: 'constant-impedance', kW: 1, pf: 0.85 },
    ],
  }),
);
const X_LINE = 0.004;
const X_N = 0.006;

describe('split-phase board: the neutral only for the capacitor current that returns on it', () => {
  it('short-circuit power stays the 240 V loop of the two lines: 2·120²/|Z_line|', () => {
    expectClose(shortCircuitVA(cabin)!, (2 * 120 ** 2) / Math.hypot(0.01, X_LINE), { rel: 1e-12, abs: 0 }, 'S_sc');
  });

  it('a 240 V capacitor across the lines: the two lines, no neutral (S_sc,X = 240²/(2·0.004) = 7200 kVA)', () => {
    const v = verifyCorrection(cabin, { equipment: [capacitor('A-B', 240, 240 ** -2 * 3000)] });
    const c = v.resonanceCapacitance;
    expectClose(c.reactanceShortCircuitKVA!, 240 ** 2 / (2 * X_LINE) / 1000, { rel: 1e-12, abs: 0 }, 'S_sc,X');
    expectClose(c.supplyReactanceOhm!, X_LINE, { rel: 1e-12, abs: 0 }, 'X per line');
    expect(c.neutralReactanceOhm).toBeNull();
    // 240²/(2X) = 2·120²/X: the balanced figure, nothing unequal to say.
    expect(c.unequalCurrents).toBe(false);
  });

  it('a 120 V capacitor on line A alone: line and neutral (S_sc,X = 120²/(0.004 + 0.006) = 1440 kVA)', () => {
    const xC = 10;
    const v = verifyCorrection(cabin, { equipment: [capacitor('A-N', 120, 1 / xC)] });
    const c = v.resonanceCapacitance;
    expectClose(c.reactanceShortCircuitKVA!, 120 ** 2 / (X_LINE + X_N) / 1000, { rel: 1e-12, abs: 0 }, 'S_sc,X');
    expectClose(c.neutralReactanceOhm!, X_N, { rel: 1e-12, abs: 0 }, 'X_N');
    expect(c.unequalCurrents).toBe(true);
    // h = √(X_C/(X_A + X_N)) = √(10/0.010) = 31.6 at nominal voltage.
    expectClose(v.resonanceOrder!, Math.sqrt(xC / (X_LINE + X_N)), { rel: 0.02, abs: 0 }, 'h');
    // Rise ≈ Q_C·(X_A + X_N)/120².
    expectClose(v.voltageRise.estimatePercent!, (100 * v.voltageRise.capacitorKvar * 1000 * (X_LINE + X_N)) / 120 ** 2, { rel: 1e-12, abs: 0 }, 'rise');
  });

  it('equal 120 V capacitors on both lines cancel on the neutral: the two lines alone', () => {
    const v = verifyCorrection(cabin, { equipment: [capacitor('A-N', 120, 0.1), capacitor('B-N', 120, 0.1)] });
    const c = v.resonanceCapacitance;
    expectClose(c.reactanceShortCircuitKVA!, (2 * 120 ** 2) / X_LINE / 1000, { rel: 1e-9, abs: 0 }, 'S_sc,X');
    expect(c.neutralReactanceOhm).toBeNull();
  });
});

// An invented joinery: 400 V three-phase 4-wire, ideal source, lines X 0.005 Ω, neutral X 0.008 Ω.
const joinery = normaliseBoard(
  parseBoard({
    name: 'Weir lane joinery',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    feeder: { line: { r: 0.01, x: 0.005, ratingA: 160 }, neutral: { r: 0.01, x: 0.008, ratingA: 160 } },
    loads: [{ name: 'Planer', connection: 'ABC-delta', model: 'constant-impedance', kW: 15, pf: 0.8 }],
  }),
);
const V_LN = 400 / Math.sqrt(3);

describe('three-phase 4-wire board: a star bank on the neutral sees it only for its unequal part', () => {
  it('a balanced star bank: 3·V²/X_line, no neutral', () => {
    const b = 0.05;
    const v = verifyCorrection(joinery, { equipment: [capacitor('A-N', V_LN, b), capacitor('B-N', V_LN, b), capacitor('C-N', V_LN, b)] });
    expectClose(v.resonanceCapacitance.reactanceShortCircuitKVA!, (3 * V_LN ** 2) / 0.005 / 1000, { rel: 1e-9, abs: 0 }, 'S_sc,X');
    expect(v.resonanceCapacitance.neutralReactanceOhm).toBeNull();
  });

  it('one capacitor from A to the neutral: the loop of line A and the neutral, V²/(0.005 + 0.008)', () => {
    const v = verifyCorrection(joinery, { equipment: [capacitor('A-N', V_LN, 0.05)] });
    expectClose(v.resonanceCapacitance.reactanceShortCircuitKVA!, V_LN ** 2 / 0.013 / 1000, { rel: 1e-12, abs: 0 }, 'S_sc,X');
    expectClose(v.resonanceCapacitance.neutralReactanceOhm!, 0.008, { rel: 1e-12, abs: 0 }, 'X_N');
  });
});

describe('three-phase 3-wire board: a lone line-to-line capacitor loads two lines', () => {
  it('S_sc,X = 400²/(2·X_line), half the balanced 3·V²/X, and the words say why', () => {
    const threeWire = normaliseBoard(
      parseBoard({
        name: 'Weir lane sawmill',
        supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
        feeder: { line: { r: 0.01, x: 0.005, ratingA: 160 } },
        loads: [{ name: 'Saw bench', connection: 'ABC-delta', model: 'constant-impedance', kW: 15, pf: 0.8 }],
      }),
    );
    const v = verifyCorrection(threeWire, { equipment: [capacitor('A-B', 400, 0.05)] });
    const c = v.resonanceCapacitance;
    expectClose(c.reactanceShortCircuitKVA!, 400 ** 2 / (2 * 0.005) / 1000, { rel: 1e-12, abs: 0 }, 'S_sc,X');
    expect(c.unequalCurrents).toBe(true);
    expect(c.neutralReactanceOhm).toBeNull();
    // h = √(X_C/(2·X_line)) = √(20/0.010) = 44.7 at nominal voltage.
    expectClose(v.resonanceOrder!, Math.sqrt(20 / 0.01), { rel: 0.02, abs: 0 }, 'h');
  });
});
