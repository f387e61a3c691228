import { describe, expect, it } from 'vitest';
import { InputError, NumericalError, normaliseBoard, parseBoard, solveBoard, solveNetwork } from '@trivar/core';

const supply4 = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
const vln = 400 / Math.sqrt(3);

describe('solveBoard: known answers on simple boards', () => {
  it('balanced delta motor: I = P/(√3·V·pf), no neutral current (ideal source)', () => {
    const r = solveBoard({ supply: supply4, loads: [{ name: 'm', connection: 'ABC-delta', kW: 30, pf: 0.8 }] });
    for (const p of r.phases) expect(p.current.magnitude).toBeCloseTo(30_000 / (Math.sqrt(3) * 400 * 0.8), 9);
    expect(r.neutral!.current.magnitude).toBeLessThan(1e-9);
    expect(r.powerFactor.effective!.pf).toBeCloseTo(0.8, 9);
    expect(r.solve.iterations).toBeGreaterThan(1); // constant power is iterated, even if it settles at once
  });
  it('single-phase 2-wire: line current P/V returns in the neutral', () => {
    const r = solveBoard({ supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 }, loads: [{ name: 'k', connection: 'A-N', kW: 2.3, pf: 1, model: 'constant-impedance' }] });
    expect(r.phases[0]!.current.magnitude).toBeCloseTo(10, 9);
    expect(r.neutral!.current.magnitude).toBeCloseTo(10, 9);
    expect(r.sequences).toBeNull();
  });
  it('split-phase: equal 120 V loads on both legs leave the neutral idle; a 240 V load never uses it', () => {
    const r = solveBoard({
      supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2, xOverR: 1.5 } },
      loads: [
        { name: 'a', connection: 'A-N', ohms: { r: 12, x: 3 } },
        { name: 'b', connection: 'B-N', ohms: { r: 12, x: 3 } },
        { name: 'h', connection: 'A-B', kW: 4.8, pf: 0.95 },
      ],
    });
    expect(r.neutral!.current.magnitude).toBeLessThan(1e-9);
    expect(r.phases[0]!.current.magnitude).toBeCloseTo(r.phases[1]!.current.magnitude, 9);
  });
  it('a purely reactive load draws no active power', () => {
    const r = solveBoard({ supply: supply4, loads: [{ name: 'choke', connection: 'B-N', ohms: { r: 0, x: 23.094 } }] });
    expect(Math.abs(r.loads[0]!.kW)).toBeLessThan(1e-12);
    expect(r.loads[0]!.kvar).toBeCloseTo((vln * vln) / 23.094 / 1000, 9);
    expect(r.loads[0]!.sense).toBe('lagging');
  });
  it('generation exports: negative kW, line current in antiphase with the voltage', () => {
    const r = solveBoard({ supply: supply4, loads: [{ name: 'pv', connection: 'B-N', kW: -4.6, pf: 1 }] });
    const b = r.phases[1]!;
    expect(b.kW).toBeCloseTo(-4.6, 9);
    expect(Math.abs(((b.current.angleDeg - b.voltage.angleDeg + 720) % 360) - 180)).toBeLessThan(1e-6);
  });
  it('constant-current load draws its rated current whatever the voltage', () => {
    const r = solveBoard({
      supply: { ...supply4, impedance: { r: 0.3, x: 0.2 } },
      loads: [{ name: 'drive', connection: 'A-N', A: 20, pf: 0.9, model: 'constant-current' }],
    });
    expect(r.loads[0]!.currentA).toBeCloseTo(20, 8);
    expect(r.phases[0]!.voltage.magnitude).toBeLessThan(vln - 5); // the drop is real
  });
  it('constant-power load draws its rated power at the depressed voltage', () => {
    const r = solveBoard({
      supply: { ...supply4, impedance: { r: 0.3, x: 0.2 } },
      loads: [{ name: 'smps', connection: 'C-N', kW: 3, pf: 0.95, model: 'constant-power' }],
    });
    expect(r.loads[0]!.kW).toBeCloseTo(3, 8);
    expect(r.loads[0]!.pf).toBeCloseTo(0.95, 8);
  });
  it('leaves a load with nothing connected to it dead instead of failing', () => {
    const r = solveBoard({ supply: { ...supply4, system: 'three-phase-3wire' }, loads: [{ name: 'spare', connection: 'ABC-star', kW: 0, kvar: 0, model: 'constant-impedance' }, { name: 'o', connection: 'A-B', kW: 1, pf: 1 }] });
    expect(r.loads[0]!.energised).toBe(false);
    expect(r.loads[1]!.kW).toBeCloseTo(1, 9);
  });
  it('warns above 2 % voltage unbalance and outside ±10 % voltage', () => {
    const r = solveBoard({
      supply: { ...supply4, impedance: { r: 0.4, x: 0.3 } },
      loads: [{ name: 'welder', connection: 'A-B', kW: 40, pf: 0.7, model: 'constant-impedance' }],
    });
    const codes = r.warnings.map((w) => w.code);
    expect(r.unbalance!.voltageFactorPercent).toBeGreaterThan(2);
    expect(codes).toContain('voltage-unbalance');
    expect(codes).toContain('undervoltage');
  });
});

describe('low-voltage threshold of voltage-dependent loads', () => {
  it('warns when a constant-power load is below 70 % and no longer draws its rating', () => {
    const r = solveBoard({
      supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50, impedance: { r: 0.5, x: 0.2 } },
      loads: [{ name: 'big', connection: 'A-N', kW: 30, pf: 0.95 }],
    });
    expect(r.loads[0]!.kW).toBeLessThan(30);
    const w = r.warnings.find((x) => x.code === 'load-below-model-threshold');
    expect(w?.threshold).toBe(70);
    expect(w!.value).toBeCloseTo(r.loads[0]!.branches[0]!.voltagePercent, 9);
    // Below the threshold the load is an impedance: P scales with V² from the threshold point.
    const v = r.loads[0]!.branches[0]!.voltagePercent / 100;
    expect(r.loads[0]!.kW).toBeCloseTo(30 * (v / 0.7) ** 2, 6);
  });
});

describe('solveNetwork: numerical trouble is an error, not an answer', () => {
  const heavy = normaliseBoard(parseBoard({ supply: { ...supply4, impedance: { r: 0.5, x: 0.5 } }, loads: [{ name: 'h', connection: 'A-N', kW: 20, pf: 0.9 }] }));
  it('reports non-convergence with the iteration count', () => {
    expect(() => solveNetwork(heavy, { maxIterations: 2 })).toThrow(NumericalError);
    expect(() => solveNetwork(heavy, { maxIterations: 2 })).toThrow(/did not settle after 2 iterations/);
  });
  it('rejects nonsense options naming them', () => {
    // An InputError naming the option's path and its range, as every other option of the library.
    expect(() => solveNetwork(heavy, { maxIterations: 0 })).toThrow(InputError);
    expect(() => solveNetwork(heavy, { maxIterations: 0 })).toThrow(/options\.maxIterations: expected a whole number of iterations, at least 1 \(received 0\)/);
    expect(() => solveNetwork(heavy, { tolerance: 0 })).toThrow(/options\.tolerance: expected a number above 0 and below 0\.1/);
  });
  it('names the node of a resonant (singular) network', () => {
    const board = normaliseBoard(parseBoard({ supply: supply4, feeder: { neutral: { r: 0, x: 10 } }, loads: [{ name: 'cap', connection: 'A-N', ohms: { r: 0, x: -10 } }] }));
    try {
      solveNetwork(board);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(NumericalError);
      expect((e as NumericalError).reason).toBe('singular');
      expect((e as Error).message).toContain('the board neutral bar');
    }
  });
});
