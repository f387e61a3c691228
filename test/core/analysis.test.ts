import { describe, expect, it } from 'vitest';
import { boardPowerDefinitions, polar, sequenceComponents, formatPath, solveBoard, toPhasor } from '@trivar/core';

const deg = (d: number) => (d * Math.PI) / 180;

describe('sequenceComponents (Fortescue)', () => {
  it('a positive-sequence ABC set has only a positive component', () => {
    const s = sequenceComponents([polar(1, 0), polar(1, deg(-120)), polar(1, deg(120))]);
    expect(Math.hypot(s.positive.re - 1, s.positive.im)).toBeLessThan(1e-15);
    expect(Math.hypot(s.negative.re, s.negative.im)).toBeLessThan(1e-15);
    expect(Math.hypot(s.zero.re, s.zero.im)).toBeLessThan(1e-15);
  });
  it('for an ACB board the ACB set is "positive"', () => {
    const set = [polar(1, 0), polar(1, deg(120)), polar(1, deg(-120))] as const;
    expect(Math.hypot(sequenceComponents(set, 'ACB').negative.re, sequenceComponents(set, 'ACB').negative.im)).toBeLessThan(1e-15);
    expect(Math.hypot(sequenceComponents(set, 'ABC').positive.re, sequenceComponents(set, 'ABC').positive.im)).toBeLessThan(1e-15);
  });
  it('equal in-phase currents are pure zero sequence', () => {
    const s = sequenceComponents([polar(5, 0.3), polar(5, 0.3), polar(5, 0.3)]);
    expect(toPhasor(s.zero).magnitude).toBeCloseTo(5, 12);
  });
});

describe('boardPowerDefinitions (IEEE 1459)', () => {
  it('all definitions agree on a balanced board', () => {
    const r = solveBoard({ supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads: [{ name: 'b', connection: 'ABC-star', kW: 12, pf: 0.85 }] });
    const pf = r.powerFactor;
    for (const x of [pf.arithmetic.pf, pf.vector.pf, pf.effective!.pf, pf.positiveSequence!.pf]) expect(x).toBeCloseTo(0.85, 9);
    expect(pf.unbalancedKVA!).toBeLessThan(1e-6);
  });
  it('orders Se ≥ S_A ≥ S_V under unbalance (Emanuel 2004)', () => {
    const r = solveBoard({ supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads: [{ name: 'a', connection: 'A-N', kW: 5, pf: 0.9 }, { name: 'bc', connection: 'B-C', kW: 3, pf: 1 }] });
    const pf = r.powerFactor;
    expect(pf.effective!.kVA).toBeGreaterThan(pf.arithmetic.kVA);
    expect(pf.arithmetic.kVA).toBeGreaterThan(pf.vector.kVA);
  });
  it('four-wire Ve and Ie by the ρ = ξ = 1 formulas', () => {
    const d = boardPowerDefinitions({
      phasePowers: [{ re: 1000, im: 0 }, { re: 0, im: 0 }, { re: 0, im: 0 }],
      phaseVoltages: [230, 230, 230],
      phaseCurrents: [4.3478, 0, 0],
      lineToLine: [398.4, 398.4, 398.4],
      neutralCurrent: 4.3478,
      threePhase: true,
      sequence: { V1: { re: 230, im: 0 }, I1: { re: 4.3478 / 3, im: 0 } },
    });
    const ve = Math.sqrt((3 * 3 * 230 ** 2 + 3 * 398.4 ** 2) / 18);
    const ie = Math.sqrt((2 * 4.3478 ** 2) / 3);
    expect(d.effective!.Ve).toBeCloseTo(ve, 9);
    expect(d.effective!.Ie).toBeCloseTo(ie, 9);
  });
});

describe('formatPath', () => {
  it('renders paths as people read them', () => {
    expect(formatPath(['loads', 3, 'pf'])).toBe('loads[3].pf');
    expect(formatPath([])).toBe('');
  });
});
