/**
 * Round-off is not data (analysis/noiseFloor.ts): a power factor never leaves [−1, 1], and a
 * balanced board reads every unbalance index, S_U1 and, at unity, Q1+ as exactly 0. Before, one
 * purely resistive board in five read an arithmetic PF of 1.0000000000000002, and a balanced board
 * a current deviation of 3.8e-13 %, S_U1 of 9e-7 kVA and Q1+ of ±1e-13 kvar.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveBoard, type BoardResult, type BoardSpec } from '@trivar/core';
import { beforeAfter, pfBeforeAfter } from '../../packages/core/src/correction/_internal/branchReadings.js';
import { balancedBoardSpecArb, boardSpecArb } from './arbitraries/boardSpec.js';

function everyPowerFactor(r: BoardResult): number[] {
  const pf = r.powerFactor;
  const board = [pf.arithmetic.pf, pf.vector.pf, pf.effective?.pf, pf.positiveSequence?.pf];
  return [...board, ...r.phases.map((p) => p.pf), ...r.loads.map((l) => l.pf)].filter((x): x is number => typeof x === 'number');
}

// An invented workshop on a 400 V service: resistive heaters and kilns, each phase at random.
const resistiveLoadArb = fc.record({
  connection: fc.constantFrom('A-N', 'B-N', 'C-N', 'ABC-star'),
  kW: fc.integer({ min: 50, max: 950 }).map((x) => x / 100),
  model: fc.constantFrom('constant-impedance', 'constant-current', 'constant-power'),
});
const resistiveBoardArb = fc.array(resistiveLoadArb, { minLength: 1, maxLength: 5 }).map(
  (loads): BoardSpec =>
    ({
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.03, x: 0.08 } },
      feeder: { lengthM: 40, line: { mm2: 16 }, neutral: { mm2: 16 } },
      loads: loads.map((l, i) => ({ name: `heater ${i + 1}`, pf: 1, ...l })),
    }) as BoardSpec,
);

describe('round-off is not shown as data', () => {
  it('a purely resistive board reads every power factor at most 1, the vector PF exactly 1, and Q1+ 0 when balanced', () => {
    fc.assert(
      fc.property(resistiveBoardArb, (spec) => {
        const r = solveBoard(spec);
        for (const pf of everyPowerFactor(r)) expect(Math.abs(pf)).toBeLessThanOrEqual(1);
        expect(r.powerFactor.vector.pf).toBe(1);
        // Balanced (three-phase heaters only): Q1+ is the round-off of V1·conj(I1), read as 0 kvar.
        if (spec.loads.every((l) => l.connection === 'ABC-star')) expect(r.powerFactor.positiveSequence!.kvar).toBe(0);
      }),
      { numRuns: 150 },
    );
  });

  it('any board reads every power factor within [−1, 1]', () => {
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        for (const pf of everyPowerFactor(solveBoard(spec))) expect(Math.abs(pf)).toBeLessThanOrEqual(1);
      }),
      { numRuns: 150 },
    );
  });

  it('a balanced three-phase board reads every unbalance index and S_U1 as exactly 0', () => {
    fc.assert(
      fc.property(balancedBoardSpecArb(), (spec) => {
        const r = solveBoard(spec);
        if (r.unbalance === null) return; // split-phase: no three-phase indices
        const u = r.unbalance;
        expect([u.voltageFactorPercent, u.zeroSequenceVoltagePercent, u.lineVoltageRatePercent, u.phaseVoltageRatePercent]).toEqual([0, 0, 0, 0]);
        expect([u.currentNegativePercent, u.currentZeroPercent, u.currentDeviationPercent]).toEqual([0, 0, 0]);
        expect(r.powerFactor.unbalancedKVA).toBe(0);
      }),
      { numRuns: 150 },
    );
  });

  it('keeps a real small unbalance: 50 W more on one of three 10 kW heaters', () => {
    const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.03, x: 0.08 } } as const;
    const loads = ['A-N', 'B-N', 'C-N'].map((connection, i) => ({ name: `oven ${i + 1}`, connection, kW: i === 0 ? 10.05 : 10, model: 'constant-impedance' }));
    const r = solveBoard({ supply, loads } as BoardSpec);
    // Line currents about 43.5 and 43.3 A: largest deviation ≈ 2/3 × 0.5 % of the mean ≈ 0.33 %.
    expect(r.unbalance!.currentDeviationPercent).toBeCloseTo(0.33, 2);
    expect(r.unbalance!.currentNegativePercent).toBeGreaterThan(0.1);
    expect(r.powerFactor.unbalancedKVA).toBeGreaterThan(0.01);
  });

  it('an A-B load alone on three wires reads |I2|/|I1| as exactly 100 %', () => {
    const supply = { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.02, x: 0.06 } } as const;
    for (const kW of [3, 8, 12.5, 17])
      expect(solveBoard({ supply, loads: [{ name: 'welder', connection: 'A-B', kW, pf: 0.6 }] } as BoardSpec).unbalance!.currentNegativePercent).toBe(100);
  });

  it('a before→after change of two equal figures but for their last bits is 0, a real one kept', () => {
    expect(beforeAfter(16.49999999999977, 16.499999999999883).change).toBe(0);
    expect(beforeAfter(40.18327306216253, 40.17773498228822).change).toBeCloseTo(-0.005538, 6);
    expect(pfBeforeAfter(0.9999999999999998, 1).change).toBe(0);
    expect(pfBeforeAfter(0.93, 0.96).change).toBeCloseTo(0.03, 12);
  });
});
