/**
 * Installation figures against hand calculations on small cases, each worked
 * here independently of the solver (its own phasor algebra, no nodal matrix).
 *
 * - Voltage drop on a feeder: ΔV ≈ I(R cos φ + X sin φ), the approximate drop
 *   formula of every cable-sizing text (IEC 60364-5-52 Annex G writes the same
 *   b(ρ1 L/S cos φ + λ L sin φ) I_B; NEC Chapter 9 Table 9 note 2 uses
 *   Z_eff = R cos θ + X sin θ). Exact drop: |E| − |E − I·Z_f| with I = E/(Z_f + Z_load).
 * - Losses: Σ|I|²R over the conductors (Joule).
 * - Reduced neutral, unequal line-to-neutral loads: Millman's theorem for the
 *   board neutral (the star point of three branches of admittance 1/(Z_line + Z_load)
 *   and the neutral 1/Z_N).
 * - Open delta: KVL round each winding, V_AB = E_AB − Z_w·I_A and V_CB = E_CB − Z_w·I_C
 *   (corner B), then Fortescue on the line-to-line voltages; first order,
 *   |V2| ≈ |Z_w|·|I_line|/√3 for balanced line currents (derived below).
 */
import { describe, expect, it } from 'vitest';
import { solveBoard, solveInstallation, type ComplexValue } from '@trivar/core';
import { c, cAbs, cAdd, cDiv, cInv, cMul, cPolarDeg, cScale, cSub, cSum } from '../support/complexMath.js';
import { expectClose, expectComplexClose } from '../support/tolerance.js';

const V_LN = 400 / Math.sqrt(3);
/** Percentages are of the system nominal, 230 V for a 400 V system (IEC 60038 230/400), not of the source's 230.9 V. */
const V_NOMINAL = 230;
const E = [cPolarDeg(V_LN, 0), cPolarDeg(V_LN, -120), cPolarDeg(V_LN, 120)] as const;
const SUPPLY_4W = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
const TIGHT = { rel: 1e-9, abs: 1e-9 };

describe('hand calculation: one feeder of known R + jX carrying a balanced load', () => {
  // Feeder 0.05 + j0.04 ohm per conductor; a balanced star of 8 + j6 ohm per phase (pf 0.8 lagging).
  const zf = c(0.05, 0.04);
  const zl = c(8, 6);
  const installation = (load: object) => ({
    supply: SUPPLY_4W,
    boards: [
      { name: 'Main', loads: [] },
      { name: 'Annexe', fedFrom: 'Main', feeder: { line: { r: zf.re, x: zf.im }, neutral: { r: zf.re, x: zf.im } }, loads: [load] },
    ],
  });

  it('constant impedance: exact phasor drop and 3·I²·R losses; ΔV = I(R cos φ + X sin φ) agrees to second order', () => {
    const r = solveInstallation(installation({ name: 'heaters', connection: 'ABC-star', ohms: { r: zl.re, x: zl.im } }));
    const feeder = r.feeders[1]!;
    // I = E / (Z_f + Z_L) = 230.94 / |8.05 + j6.04| = 230.94 / 10.064 = 22.947 A; V = I·|Z_L| = 229.47 V.
    const i = cDiv(E[0], cAdd(zf, zl));
    expect(cAbs(i)).toBeCloseTo(22.947, 3);
    expectComplexClose(feeder.lines[0]!.current, i, TIGHT, 'line A current');
    const vBoard = cAbs(cMul(i, zl));
    const dropV = V_LN - vBoard;
    for (const line of feeder.lines) expectClose(line.voltageDropPercent, (100 * dropV) / V_NOMINAL, TIGHT, `drop ${line.phase}`);
    // Losses: 3·I²·R = 3 · 22.947² · 0.05 = 78.99 W (no neutral current in a balanced star).
    expectClose(feeder.lossesKW, (3 * cAbs(i) ** 2 * zf.re) / 1000, TIGHT, 'losses');
    expect(feeder.lossesKW * 1000).toBeCloseTo(78.99, 1);
    expect(feeder.neutral!.current.magnitude).toBeLessThan(1e-9 * cAbs(i));
    // The textbook approximation: ΔV ≈ I(R cos φ + X sin φ) = 22.947 · (0.05·0.8 + 0.04·0.6) = 1.4686 V;
    // the neglected term is about (I(X cos φ − R sin φ))²/(2V) ≈ 5e-6 V.
    const approx = cAbs(i) * (zf.re * 0.8 + zf.im * 0.6);
    expect(approx).toBeCloseTo(1.4686, 4);
    expectClose(dropV, approx, { rel: 1e-4, abs: 0 }, 'exact drop against I(R cos φ + X sin φ)');
  });

  it('constant power (30 kW at pf 0.8): the reported current gives the drop by I(R cos φ + X sin φ) and the losses by 3·I²·R', () => {
    const r = solveInstallation(installation({ name: 'plant', connection: 'ABC-star', kW: 30, pf: 0.8 }));
    const feeder = r.feeders[1]!;
    const board = r.boards[1]!.result;
    const i = feeder.lines[0]!.current.magnitude;
    // At the board the load draws exactly 10 kW per phase at pf 0.8: I = 10 000 / (0.8 · V_board).
    expectClose(i, 10_000 / (0.8 * board.phases[0]!.voltage.magnitude), TIGHT, 'I from P = V·I·cos φ');
    expectClose((feeder.voltageDropPercent / 100) * V_NOMINAL, i * (zf.re * 0.8 + zf.im * 0.6), { rel: 1e-4, abs: 0 }, 'drop');
    expectClose(feeder.lossesKW, (3 * i * i * zf.re) / 1000, { rel: 1e-9, abs: 1e-12 }, 'losses');
    // Power balance: what the supply sends = the load + the feeder's losses.
    expectClose(r.totals.sourceKW, 30 + feeder.lossesKW, { rel: 1e-9, abs: 1e-9 }, 'source kW');
  });
});

describe('hand calculation: a reduced neutral under unequal line-to-neutral loads (Millman)', () => {
  // 40 m of 16 mm² copper lines and a 10 mm² copper neutral at 20 °C: IEC 60228 class 2 gives
  // 1.15 and 1.83 ohm/km, reactance 0.08 ohm/km (the library's default). Linear loads only
  // (no triplen harmonics): A-N 8 + j2 ohm, B-N 20 ohm, C unloaded.
  const length = 0.04; // km
  const zLine = c(1.15 * length, 0.08 * length);
  const zNeutral = c(1.83 * length, 0.08 * length);
  const za = c(8, 2);
  const zb = c(20, 0);
  const result = solveInstallation({
    supply: SUPPLY_4W,
    boards: [
      { name: 'Main', loads: [] },
      {
        name: 'Workshop',
        fedFrom: 'Main',
        feeder: { lengthM: 40, line: { mm2: 16, temperatureC: 20 }, neutral: { mm2: 10, temperatureC: 20 } },
        loads: [
          { name: 'kiln', connection: 'A-N', ohms: { r: za.re, x: za.im } },
          { name: 'heater', connection: 'B-N', ohms: { r: zb.re, x: zb.im } },
        ],
      },
    ],
  });
  // Millman: V_N' = (E_A·Y_a + E_B·Y_b) / (Y_a + Y_b + Y_N), Y_x = 1/(Z_line + Z_x), Y_N = 1/Z_N.
  const ya = cInv(cAdd(zLine, za));
  const yb = cInv(cAdd(zLine, zb));
  const yn = cInv(zNeutral);
  const vN = cDiv(cAdd(cMul(E[0], ya), cMul(E[1], yb)), cSum([ya, yb, yn]));
  const ia = cMul(cSub(E[0], vN), ya);
  const ib = cMul(cSub(E[1], vN), yb);
  const iN = cMul(vN, yn);
  const board = result.boards[1]!.result;
  const feeder = result.feeders[1]!;

  it('neutral current, line currents and the voltage each load sees', () => {
    // |V_N'| = 1.96 V; |I_A| = 27.66 A, |I_B| = 11.51 A, |I_N| = |I_A + I_B| = 26.71 A; the kiln sees 228.09 V.
    expect(cAbs(vN)).toBeCloseTo(1.957, 3);
    expect(cAbs(ia)).toBeCloseTo(27.66, 2);
    expect(cAbs(ib)).toBeCloseTo(11.51, 2);
    expect(cAbs(iN)).toBeCloseTo(26.71, 2);
    expectComplexClose(feeder.lines[0]!.current, ia, TIGHT, 'I_A');
    expectComplexClose(feeder.lines[1]!.current, ib, TIGHT, 'I_B');
    expectComplexClose(board.neutral!.current, iN, TIGHT, 'I_N');
    expectComplexClose(cAdd(ia, ib), iN, TIGHT, 'KCL at the board neutral');
    expectClose(board.phases[0]!.voltage.magnitude, cAbs(cMul(ia, za)), TIGHT, 'V at the kiln');
    expectClose(board.phases[1]!.voltage.magnitude, cAbs(cMul(ib, zb)), TIGHT, 'V at the heater');
  });

  it('the unloaded phase rises by the neutral shift, and the drops and losses follow', () => {
    // C carries nothing, so at the board V_CN = E_C − V_N' = 232.72 V: the neutral's own drop shows as a rise on C.
    const vc = cAbs(cSub(E[2], vN));
    expect(vc).toBeCloseTo(232.72, 2);
    expect(vc).toBeGreaterThan(V_LN);
    expectClose(board.phases[2]!.voltage.magnitude, vc, TIGHT, 'V_CN');
    expectClose(feeder.lines[2]!.voltageDropPercent, (100 * (V_LN - vc)) / V_NOMINAL, TIGHT, 'C drop (negative: a rise)');
    expect(feeder.lines[2]!.voltageDropPercent).toBeLessThan(0);
    const dropA = (100 * (V_LN - cAbs(cMul(ia, za)))) / V_NOMINAL;
    expectClose(feeder.lines[0]!.voltageDropPercent, dropA, TIGHT, 'A drop');
    // The phase that changes most, sign kept: here A's drop outweighs C's rise.
    const most = feeder.lines.reduce((m, l) => (Math.abs(l.voltageDropPercent) > Math.abs(m) ? l.voltageDropPercent : m), 0);
    expect(most).toBeGreaterThan(0);
    expectClose(feeder.voltageDropPercent, most, TIGHT, 'the phase that changes most');
    // Joule: |I_A|²R_line + |I_B|²R_line + |I_N|²R_N = 93.5 W.
    const watts = (cAbs(ia) ** 2 + cAbs(ib) ** 2) * zLine.re + cAbs(iN) ** 2 * zNeutral.re;
    expectClose(feeder.lossesKW, watts / 1000, TIGHT, 'feeder losses');
    expect(watts).toBeCloseTo(93.5, 1);
    // The reduced neutral's share: |I_N|²R_N is 56 % of the feeder's losses here.
    expect((cAbs(iN) ** 2 * zNeutral.re) / watts).toBeCloseTo(0.5585, 3);
  });
});

describe('hand calculation: open-delta supply (two single-phase units) under a balanced load', () => {
  // Units on A-B and B-C (corner B), each 0.1 + j0.3 ohm referred to the 400 V side;
  // a balanced delta of 24 + j18 ohm per branch, constant impedance.
  const zw = c(0.1, 0.3);
  const zd = c(24, 18);
  const r = solveBoard({
    supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, openDelta: { 'A-B': { r: zw.re, x: zw.im }, 'B-C': { r: zw.re, x: zw.im } } },
    loads: [{ name: 'furnace', connection: 'ABC-delta', ohms: { r: zd.re, x: zd.im } }],
  });
  const eab = cSub(E[0], E[1]);
  const ecb = cSub(E[2], E[1]);
  // Node voltages to the corner B: unknowns V_A, V_C. Winding currents leave A and return at C:
  //   (E_AB − V_A)/Z_w = V_A/Z + (V_A − V_C)/Z
  //   (E_CB − V_C)/Z_w = V_C/Z + (V_C − V_A)/Z
  // → [[1/Z_w + 2/Z, −1/Z], [−1/Z, 1/Z_w + 2/Z]]·[V_A, V_C] = [E_AB/Z_w, E_CB/Z_w], by Cramer's rule.
  const yw = cInv(zw);
  const y = cInv(zd);
  const d = cAdd(yw, cScale(y, 2));
  const det = cSub(cMul(d, d), cMul(y, y));
  const va = cDiv(cAdd(cMul(d, cMul(eab, yw)), cMul(y, cMul(ecb, yw))), det);
  const vc = cDiv(cAdd(cMul(d, cMul(ecb, yw)), cMul(y, cMul(eab, yw))), det);
  const vLL = { 'A-B': va, 'B-C': cScale(vc, -1), 'C-A': cSub(vc, va) } as Record<string, ComplexValue>;

  it('line-to-line voltages by KVL round each winding', () => {
    for (const ll of r.lineToLine) expectComplexClose(ll.voltage, vLL[ll.pair]!, TIGHT, `V_${ll.pair}`);
    // and the reported line currents satisfy each winding's KVL: V_AB = E_AB − Z_w·I_A, V_CB = E_CB − Z_w·I_C.
    const iA = r.phases[0]!.current;
    const iC = r.phases[2]!.current;
    expectComplexClose(vLL['A-B']!, cSub(eab, cMul(zw, iA)), TIGHT, 'KVL winding A-B');
    expectComplexClose(cScale(vLL['B-C']!, -1), cSub(ecb, cMul(zw, iC)), TIGHT, 'KVL winding C-B');
  });

  it('voltage unbalance factor by Fortescue, and the first-order formula |V2| ≈ |Z_w|·I/√3', () => {
    const a = cPolarDeg(1, 120);
    const a2 = cPolarDeg(1, 240);
    const v1 = cScale(cSum([vLL['A-B']!, cMul(a, vLL['B-C']!), cMul(a2, vLL['C-A']!)]), 1 / 3);
    const v2 = cScale(cSum([vLL['A-B']!, cMul(a2, vLL['B-C']!), cMul(a, vLL['C-A']!)]), 1 / 3);
    const vuf = (100 * cAbs(v2)) / cAbs(v1);
    expectClose(r.unbalance!.voltageFactorPercent, vuf, { rel: 1e-9, abs: 1e-9 }, 'VUF');
    // Balanced currents I_B = a²I_A, I_C = a·I_A drop −Z_w·I_A on A-B and +Z_w·I_C on B-C, so
    // V2 = Z_w·I_A·(−1 + a³ + a − a²)/3 = j·Z_w·I_A/√3: |V2| ≈ 0.316 · 22.49 / 1.732 = 4.11 V, 1.044 % of
    // |V1| = 393.17 V; the exact figure (currents slightly unbalanced by the voltages) is 4.07 V, 1.036 %.
    const iLine = r.phases[0]!.current.magnitude;
    const firstOrder = (100 * cAbs(zw) * iLine) / Math.sqrt(3) / cAbs(v1);
    expect(vuf).toBeCloseTo(1.036, 3);
    expect(firstOrder).toBeCloseTo(1.044, 3);
    expectClose(vuf, firstOrder, { rel: 0.02, abs: 0 }, 'VUF against |Z_w|·I/√3');
    // A closed bank of three equal windings leaves a balanced load balanced: the unbalance is the open delta's.
    const closed = solveBoard({
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: zw.re / 3, x: zw.im / 3 } },
      loads: [{ name: 'furnace', connection: 'ABC-delta', ohms: { r: zd.re, x: zd.im } }],
    });
    expect(closed.unbalance!.voltageFactorPercent).toBeLessThan(1e-9);
  });
});
