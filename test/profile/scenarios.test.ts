/** Board-file scenarios: each is the board solved at its load levels; the year weighs them by hours. */
import { describe, expect, it } from 'vitest';
import { InputError, normaliseBoard, parseBoard, solveBoard, studyScenarios } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const spec = {
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.02, x: 0.05 } },
  feeder: { neutral: { r: 0.05, x: 0.01 } },
  loads: [
    { name: 'kiln', connection: 'A-N', kW: 6, pf: 0.9 },
    { name: 'press', connection: 'B-C', kW: 8, pf: 0.8 },
    { name: 'lamps', connection: 'C-N', kW: 2, pf: 1 },
  ],
  profile: {
    groups: { workshop: ['kiln', 'press'] },
    scenarios: [
      { name: 'shift', weight: 3, loads: { workshop: 0.75 }, others: 1 },
      { name: 'night', weight: 1, loads: { lamps: 0.5 } },
    ],
  },
} as const;

describe('scenarios', () => {
  const parsed = parseBoard(spec);
  const board = normaliseBoard(parsed);
  const result = studyScenarios(board, parsed.profile!);

  it('solve each scenario as the board at those levels (agrees with solveBoard to 1e-9)', () => {
    const shift = solveBoard({ ...spec, loads: [{ ...spec.loads[0], kW: 4.5 }, { ...spec.loads[1], kW: 6 }, spec.loads[2]] });
    result.scenarios[0]!.lineA.forEach((a, k) => expectClose(a, shift.phases[k]!.current.magnitude, { rel: 1e-9, abs: 1e-9 }, `line ${k}`));
    expectClose(result.scenarios[0]!.neutralA!, shift.neutral!.current.magnitude, { rel: 1e-9, abs: 1e-9 }, 'neutral');
    expect(result.path).toBe('nodal'); // the B-C press keeps it off the closed-form path
  });

  it('share the year by weight and weigh energy by hours', () => {
    expect(result.scenarios.map((s) => s.hours)).toEqual([6570, 2190]);
    const kWh = result.scenarios.reduce((a, s) => a + s.kW * s.hours, 0);
    expectClose(result.kWhImport, kWh, { rel: 1e-12, abs: 0 }, 'kWh');
    expect(result.billingPf).toBeCloseTo(result.kWhImport / Math.hypot(result.kWhImport, result.kvarhLagging), 12);
  });

  it('name an unknown load by its path', () => {
    try {
      studyScenarios(board, { scenarios: [{ name: 'x', hours: 10, loads: { oven: 1 } }] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).issues.map((i) => [i.code, i.path])).toEqual([['unknown_load', 'profile.scenarios[0].loads.oven']]);
    }
  });
});

describe('a scenario with nothing on', () => {
  it('has zero current and power and no power factor, not the round-off\'s 0.623', () => {
    const board = normaliseBoard(
      parseBoard({
        supply: { voltage: '400/230', frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
        loads: [{ name: 'Motor', connection: 'ABC-delta', kW: 30, pf: 0.7 }],
      }),
    );
    const r = studyScenarios(board, {
      scenarios: [
        { name: 'running', hours: 2000, loads: { Motor: 1 } },
        { name: 'idle', hours: 6760, loads: { Motor: 0 } },
      ],
    });
    const idle = r.scenarios[1]!;
    expect([...idle.lineA, idle.neutralA, idle.kW, idle.kvar, idle.unbalancePercent, idle.pf]).toEqual([0, 0, 0, 0, 0, 0, 0, null]);
    expect(r.scenarios[0]!.pf).toBeCloseTo(0.7, 9);
  });
});

describe('scenario unbalance on the board region\'s index', () => {
  // The same board on a North-American 208Y/120 supply: ANSI C84.1 judges the line-to-line deviation from
  // the average, not |V2|/|V1|, so the scenario column holds that figure (as solve's unbalance reading has it).
  const na = { ...spec, supply: { ...spec.supply, voltage: '208Y/120', frequencyHz: 60 } };
  const shiftLoads = [{ ...spec.loads[0], kW: 4.5 }, { ...spec.loads[1], kW: 6 }, spec.loads[2]];
  it('North America: the line-to-line deviation; IEC: |V2|/|V1|, each equal to the solve of the same loads', () => {
    const parsedNa = parseBoard(na);
    const naResult = studyScenarios(normaliseBoard(parsedNa), parsedNa.profile!);
    const naSolve = solveBoard({ ...na, loads: shiftLoads });
    expect(naResult.unbalance.index).toBe('line-deviation');
    expectClose(naResult.scenarios[0]!.unbalancePercent!, naSolve.unbalance!.lineVoltageRatePercent, { rel: 1e-9, abs: 1e-12 }, 'line deviation');
    // The two indices differ here, so the test tells them apart.
    expect(Math.abs(naSolve.unbalance!.lineVoltageRatePercent - naSolve.unbalance!.voltageFactorPercent)).toBeGreaterThan(1e-4); // far above the 1e-9 the figures agree to
    const parsedIec = parseBoard(spec);
    const iec = studyScenarios(normaliseBoard(parsedIec), parsedIec.profile!);
    const iecSolve = solveBoard({ ...spec, loads: shiftLoads });
    expect(iec.unbalance.index).toBe('negative-sequence');
    expectClose(iec.scenarios[0]!.unbalancePercent!, iecSolve.unbalance!.voltageFactorPercent, { rel: 1e-9, abs: 1e-12 }, '|V2|/|V1|');
  });
});
