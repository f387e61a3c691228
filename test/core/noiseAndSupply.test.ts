/**
 * Noise is not data (round-off currents are zero, an idle line has no PF), and a
 * supply pushed past what it can carry says so: transformer loading against its
 * rating, and a collapse verdict instead of figures read as a working board.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, NOISE_FLOOR_RELATIVE, normaliseBoard, parseBoard, solveBoard, SUPPLY_LIMITS } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
const withTransformer = (kVA: number) => ({ ...supply, transformer: { kVA, impedancePercent: 4, xOverR: 3 } });

describe('noise floor', () => {
  it('a line with no load on it carries exactly zero and has no PF (null, sense none)', () => {
    const r = solveBoard({
      supply: withTransformer(250),
      loads: [
        { name: 'kettle', connection: 'A-N', kW: 2.2, pf: 1 },
        { name: 'fridge', connection: 'B-N', kW: 0.4, pf: 0.8 },
      ],
    });
    const c = r.phases[2]!;
    expect(c.current.magnitude).toBe(0);
    expect(c.pf).toBeNull();
    expect(c.sense).toBe('none');
    expect(r.phases[0]!.pf).toBeCloseTo(1, 12);
    expect(NOISE_FLOOR_RELATIVE).toBe(1e-9);
  });
  it('a resistive load reports 0 kvar, not the round-off of V·I* (about 1e-16 of its kVA), on its branches and in total', () => {
    // Constant-current and constant-power heaters: their current is computed from the voltage, in phase to round-off.
    for (const model of [{ zip: { z: 0, i: 1, p: 0 } }, { zip: { z: 0, i: 0, p: 1 } }, {}]) {
      const r = solveBoard({
        supply: withTransformer(100),
        loads: [
          { name: 'heater', connection: 'A-N', kW: 3.1, pf: 1, ...model },
          { name: 'motor', connection: 'ABC-delta', kW: 7.5, pf: 0.83 },
          { name: 'oven', connection: 'ABC-star', kW: 9, pf: 1, ...model },
        ],
      });
      for (const name of ['heater', 'oven']) {
        const load = r.loads.find((l) => l.name === name)!;
        expect(load.kvar).toBe(0);
        expect(load.sense).toBe('unity');
        for (const b of load.branches) expect(b.kvar).toBe(0);
      }
      expect(r.loads[1]!.kvar).toBeGreaterThan(5);
    }
  });
  it('a capacitor-only load reports 0 kW (P round-off within 1e-9 of its kVA) and PF 0', () => {
    const r = solveBoard({ supply: withTransformer(100), loads: [{ name: 'caps', connection: 'ABC-delta', kW: 0, kvar: -10 }, { name: 'oven', connection: 'A-N', kW: 2, pf: 1 }] });
    expect(r.loads[0]!.kW).toBe(0);
    expect(r.loads[0]!.pf).toBe(0);
    expect(r.loads[0]!.kvar).toBeLessThan(-9);
  });
  it('a board without a neutral has exactly zero zero-sequence current; a balanced one exactly zero negative- and zero-sequence voltage', () => {
    const r = solveBoard({
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
      loads: [
        { name: 'welder', connection: 'A-B', kW: 6.3, pf: 0.7 },
        { name: 'motor', connection: 'ABC-delta', kW: 11, pf: 0.85 },
      ],
    });
    expect(r.sequences!.current.zero.magnitude).toBe(0);
    expect(r.unbalance!.currentZeroPercent).toBe(0);
    expect(r.sequences!.current.negative.magnitude).toBeGreaterThan(1);
    const balanced = solveBoard({ supply: withTransformer(100), loads: [{ name: 'motor', connection: 'ABC-delta', kW: 11, pf: 0.85 }] });
    expect(balanced.sequences!.voltage.negative.magnitude).toBe(0);
    expect(balanced.sequences!.voltage.zero.magnitude).toBe(0);
    expect(balanced.sequences!.current.negative.magnitude).toBe(0);
    expect(balanced.unbalance!.voltageFactorPercent).toBe(0);
    // Real unbalance is kept: 1e-9 of the board's current is far below what one small load makes.
    const slight = solveBoard({ supply: withTransformer(100), loads: [{ name: 'motor', connection: 'ABC-delta', kW: 11, pf: 0.85 }, { name: 'lamp', connection: 'A-N', kW: 0.01, pf: 1 }] });
    // The lamp's current alone is zero-sequence-bearing (a delta motor has none): I0 = I_lamp / 3.
    expect(slight.sequences!.current.zero.magnitude / (slight.loads[1]!.branches[0]!.current.magnitude / 3)).toBeCloseTo(1, 9);
  });
  it('an all-zero board reads as zero everywhere, without PFs and without warnings', () => {
    const r = solveBoard({ supply, loads: [{ name: 'spare', connection: 'A-N', kW: 0, pf: 1 }, { name: 'spare 2', connection: 'ABC-delta', kW: 0, kvar: 0 }] });
    for (const p of r.phases) {
      expect(p.current.magnitude).toBe(0);
      expect(p.pf).toBeNull();
    }
    expect(r.totals.pf).toBeNull();
    expect(r.warnings).toEqual([]);
  });
  it('correcting an all-zero board says it draws no power, not that it exports', () => {
    const board = normaliseBoard(parseBoard({ supply, loads: [{ name: 'spare', connection: 'A-N', kW: 0, pf: 1 }] }));
    const report = correctBoard(board, { arrangement: 'delta-bank' });
    expect(report.reasons.join(' ')).toMatch(/draws no active power/);
    expect(report.reasons.join(' ')).not.toMatch(/exports/);
  });
  it('a neutral equal to a phase in exact arithmetic (A–N beside a B–C load, A the heaviest) never reads as above it, whichever round-off the solve path leaves', () => {
    // Common practice, no source: the neutral carries phase A's current back, so "more than the
    // heaviest phase" is a tie that only round-off could break where A is the heaviest.
    let ties = 0;
    for (let k = 1; k <= 40; k++) {
      const loads = [
        { name: 'lamps', connection: 'A-N', kW: 0.74 * k + 4.1, pf: 0.93 },
        { name: 'welder', connection: 'B-C', kW: 0.37 * k, pf: 0.71 },
      ] as const;
      for (const r of [solveBoard({ supply: withTransformer(160), loads }), solveBoard({ supply, loads })]) {
        const a = r.phases[0]!.current.magnitude;
        expect(Math.max(...r.phases.map((p) => p.current.magnitude))).toBe(a);
        expect(Math.abs(r.neutral!.current.magnitude - a)).toBeLessThanOrEqual(1e-12 * a);
        if (r.neutral!.current.magnitude !== a) ties++;
        expect(r.warnings.map((w) => w.code)).not.toContain('neutral-above-phase');
      }
    }
    // The loop exercised round-off: some ties come out unequal in the last digit.
    expect(ties).toBeGreaterThan(0);
  });
  it('a 1e-9 kW board prints its tiny neutral current in significant figures, not as 0.0 A', () => {
    // A leading load on B beside a resistive one on A: the neutral is √3 × either current, above both.
    const r = solveBoard({ supply, loads: [{ name: 'indicator', connection: 'A-N', kW: 1e-9, pf: 1 }, { name: 'other', connection: 'B-N', kW: 0.5e-9, pf: 0.5, sense: 'leading' }] });
    const w = r.warnings.find((x) => x.code === 'neutral-above-phase');
    expect(w?.message).not.toMatch(/ 0\.0 A/);
    expect(w?.message).toMatch(/carries \d\.\de-\d+ A/);
  });
});

describe('transformer loading and supply collapse', () => {
  it('a 240 kW delta heater on a 100 kVA transformer: loading figure and an overload warning, not "none"', () => {
    const r = solveBoard({ supply: withTransformer(100), loads: [{ name: 'heater', connection: 'ABC-delta', kW: 240, pf: 1, model: 'constant-impedance' }] });
    const ratedA = 100_000 / (Math.sqrt(3) * 400);
    expect(r.transformer!.ratedCurrentA).toBeCloseTo(ratedA, 9);
    expect(r.transformer!.loadingPercent).toBeCloseTo((100 * r.phases[0]!.current.magnitude) / ratedA, 9);
    expect(r.transformer!.loadingPercent).toBeGreaterThan(200);
    expect(r.warnings.map((w) => w.code)).toContain('transformer-overload');
    expect(r.operatingPoint.collapsed).toBe(false);
  });
  it('kVA at the terminals is Σ|E − Z·I|·|I| (equals the load kVA plus the transformer\'s own share)', () => {
    const r = solveBoard({ supply: withTransformer(100), loads: [{ name: 'heater', connection: 'ABC-delta', kW: 60, pf: 1, model: 'constant-impedance' }] });
    // No feeder: the terminals are the board, so Σ|V||I| of the lines.
    const arithmetic = r.phases.reduce((s, p) => s + p.voltage.magnitude * p.current.magnitude, 0) / 1000;
    expect(r.transformer!.kVA).toBeCloseTo(arithmetic, 6);
    expect(r.warnings.map((w) => w.code)).not.toContain('transformer-overload');
  });
  it('5000 kW of constant-power load on 100 kVA is a collapse, not an answer', () => {
    const r = solveBoard({ supply: withTransformer(100), loads: [{ name: 'plant', connection: 'ABC-delta', kW: 5000, pf: 0.9 }] });
    expect(r.operatingPoint.collapsed).toBe(true);
    expect(r.operatingPoint.findings.join(' ')).toMatch(/below 50 %/);
    expect(SUPPLY_LIMITS.collapsedVoltagePercent).toBe(50);
  });
  it('5000 kW of PV on 100 kVA is a collapse, not "8.4 % undervoltage"', () => {
    const r = solveBoard({ supply: withTransformer(100), loads: [{ name: 'array', connection: 'ABC-delta', kW: -5000, pf: 1 }] });
    expect(r.operatingPoint.collapsed).toBe(true);
  });
  it('a tiny transformer with one heavy single-phase heater collapses that phase', () => {
    const r = solveBoard({ supply: withTransformer(0.1), loads: [{ name: 'heater', connection: 'A-N', kW: 50, pf: 1, model: 'constant-impedance' }] });
    expect(r.operatingPoint.collapsed).toBe(true);
    expect(r.operatingPoint.findings[0]).toMatch(/A-N \d+\.\d %/);
  });
  it('a healthy board is not a collapse, and a deliberately broken neutral is the what-if, not a collapse', () => {
    const loads = [
      { name: 'a', connection: 'A-N', kW: 8, pf: 1, model: 'constant-impedance' },
      { name: 'b', connection: 'B-N', kW: 0.5, pf: 1, model: 'constant-impedance' },
    ] as const;
    expect(solveBoard({ supply: withTransformer(250), loads }).operatingPoint).toEqual({ collapsed: false, findings: [] });
    const open = solveBoard({ supply: withTransformer(250), loads }, { openNeutral: true });
    expect(open.operatingPoint.collapsed).toBe(false);
  });
});
