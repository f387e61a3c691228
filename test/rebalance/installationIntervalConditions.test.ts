/**
 * Load conditions from interval data on an installation: the picks are the board rule's over every
 * board's loads (the incomer) plus each sub-board feeder's own peak, found here by a plain scan of
 * test-side currents; the installation comes back board by board with each condition's factors
 * carrying that interval's powers; and `rebalanceInstallation` takes them and re-solves.
 */
import { describe, expect, it } from 'vitest';
import {
  conditionsFromInstallationIntervals,
  driverColumns,
  normaliseInstallation,
  parseInstallation,
  planDrivers,
  planInstallationColumns,
  rebalanceInstallation,
  type ComplexValue,
  type InstallationSpec,
} from '@trivar/core';
import { seeded } from './support/rebalanceBoards.js';
import { C0, c, cAbs, cAdd, cConj, cDiv, cMul, cPolarDeg, cSum } from '../support/complexMath.js';
import { expectClose } from '../support/tolerance.js';

/** An invented boatyard: a main board, a paint shed fed from it, and a chandlery fed from the paint shed (written first). */
const spec: InstallationSpec = {
  name: 'Slipway boatyard',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  boards: [
    { name: 'Chandlery', fedFrom: 'Paint shed', feeder: { line: { r: 0.05, x: 0.01 }, neutral: { r: 0.05, x: 0.01 } }, loads: [{ name: 'Till and lights', connection: 'C-N', kW: 2, pf: 0.95 }] },
    {
      name: 'Yard',
      loads: [
        { name: 'Travel hoist', connection: 'A-N', kW: 7, pf: 0.85 },
        { name: 'Office', connection: 'B-N', kW: 3, pf: 1 },
      ],
    },
    {
      name: 'Paint shed',
      fedFrom: 'Yard',
      feeder: { line: { r: 0.03, x: 0.01 }, neutral: { r: 0.03, x: 0.01 } },
      loads: [
        { name: 'Extract fan', connection: 'A-N', kW: 4, pf: 0.8 },
        { name: 'Heaters', connection: 'A-N', kW: 6, pf: 1 },
      ],
    },
  ],
} as InstallationSpec;
const header = ['time', 'Travel hoist [x]', 'Office [kW]', 'Extract fan [x]', 'Heaters [x]', 'Chandlery/Till and lights [kW]', 'Paint shed/phase B [kW]'];

const N = 96;
const random = seeded(7);
const values = [0, 1, 2, 3, 4, 5].map(() => new Float64Array(N));
for (let i = 0; i < N; i++) {
  const hour = (i / 4) % 24;
  values[0]![i] = hour > 8 && hour < 11 ? random() : 0.05 * random();
  values[1]![i] = 0.5 + 2 * random();
  values[2]![i] = hour > 13 && hour < 17 ? 0.5 + 0.5 * random() : 0;
  values[3]![i] = hour > 5 && hour < 7 ? random() : 0;
  values[4]![i] = 0.3 + 1.5 * random();
  values[5]![i] = 0.4 * random();
}
const utcMs = Float64Array.from({ length: N }, (_, i) => Date.UTC(2026, 2, 2) + i * 15 * 60_000);

/** Test-side powers of interval i, VA: [board, phase, power] of every load with data. */
function powers(i: number): [string, string, ComplexValue][] {
  const q = (p: number, pf: number) => c(p, p * Math.tan(Math.acos(pf)));
  return [
    ['Yard', 'A', q(7000 * values[0]![i]!, 0.85)],
    ['Yard', 'B', c(values[1]![i]! * 1000, 0)],
    ['Paint shed', 'A', q(4000 * values[2]![i]!, 0.8)],
    ['Paint shed', 'A', c(6000 * values[3]![i]!, 0)],
    ['Chandlery', 'C', q(values[4]![i]! * 1000, 0.95)],
    ['Paint shed', 'B', c(values[5]![i]! * 1000, 0)],
  ];
}
const V: Record<string, ComplexValue> = { A: cPolarDeg(400 / Math.sqrt(3), 0), B: cPolarDeg(400 / Math.sqrt(3), -120), C: cPolarDeg(400 / Math.sqrt(3), 120) };
/** Line currents of interval i in the fast model (nominal voltages) from the loads on `boards`. */
function lines(i: number, boards: readonly string[]): ComplexValue[] {
  const I: Record<string, ComplexValue> = { A: C0, B: C0, C: C0 };
  for (const [board, p, s] of powers(i)) if (boards.includes(board)) I[p] = cAdd(I[p]!, cConj(cDiv(s, V[p]!)));
  return [I.A!, I.B!, I.C!];
}

describe('rebalance: load conditions from interval data on an installation', () => {
  const installation = normaliseInstallation(parseInstallation(spec)).installation;
  const plan = planInstallationColumns(installation, header);
  const columns = driverColumns(plan, values, N);
  const picked = conditionsFromInstallationIntervals(installation, plan, planDrivers(plan), columns, utcMs, 15 * 60_000, { spread: 4 });
  const all = ['Yard', 'Paint shed', 'Chandlery'];

  it('picks the incomer rule and each sub-board feeder’s peak (its board and the boards it feeds), found by a plain scan', () => {
    const argMax = (f: (i: number) => number) => Array.from({ length: N }, (_, i) => i).reduce((b, i) => (f(i) > f(b) ? i : b), 0);
    const kW = (i: number) => powers(i).reduce((s, [, , x]) => s + x.re, 0) / 1000;
    const kVA = (i: number) => cAbs(cSum(powers(i).map(([, , x]) => x))) / 1000;
    const expected = new Map<number, string[]>();
    const add = (i: number, why: string) => expected.set(i, [...(expected.get(i) ?? []), why]);
    ['A', 'B', 'C'].forEach((p, k) => add(argMax((i) => cAbs(lines(i, all)[k]!)), `peak line ${p}`));
    add(argMax((i) => cAbs(cSum(lines(i, all)))), 'peak neutral');
    // Sub-boards in file order: Chandlery (its own loads), Paint shed (its loads and the Chandlery's).
    add(argMax((i) => Math.max(...lines(i, ['Chandlery']).map(cAbs))), 'peak current at Chandlery');
    add(argMax((i) => Math.max(...lines(i, ['Paint shed', 'Chandlery']).map(cAbs))), 'peak current at Paint shed');
    add(argMax(kW), 'peak import');
    const order = Array.from({ length: N }, (_, i) => i).sort((a, b) => kVA(a) - kVA(b));
    for (let b = 0; b < 4; b++) add(order[Math.floor(((b + 0.5) * N) / 4)]!, `quantile ${Math.round((100 * (b + 0.5)) / 4)} %`);
    expect(Object.fromEntries(picked.picks.map((p) => [p.interval, p.reasons]))).toEqual(Object.fromEntries(expected));
    expectClose(picked.conditions.reduce((s, x) => s + x.weight, 0), N * 0.25, { rel: 1e-12, abs: 1e-12 }, 'hours');
  });

  it('gives the installation back board by board, the metered phase total on its board, each factor times rating that interval’s power', () => {
    const boards = [picked.installation.main, ...picked.installation.subBoards];
    expect(boards.map((b) => [b.name, b.loads.map((l) => l.name)])).toEqual([
      ['Yard', ['Travel hoist', 'Office']],
      ['Chandlery', ['Till and lights']],
      ['Paint shed', ['Extract fan', 'Heaters', 'metered phase B']],
    ]);
    const flat = boards.flatMap((b) => b.loads);
    // Test-side powers in that order: Yard (hoist, office), Chandlery (till), Paint shed (fan, heaters, phase B).
    const inOrder = (i: number) => {
      const p = powers(i).map(([, , s]) => s);
      return [p[0]!, p[1]!, p[4]!, p[2]!, p[3]!, p[5]!];
    };
    picked.picks.forEach((pick, k) => {
      const expected = inOrder(pick.interval);
      flat.forEach((load, l) => {
        const rating = load.branches.reduce((s, b) => cAdd(s, b.sNominal), C0);
        const power = cMul(picked.conditions[k]!.factors[l]!, rating);
        expectClose(power.re, expected[l]!.re, { rel: 1e-12, abs: 1e-9 }, `${load.name} P`);
        expectClose(power.im, expected[l]!.im, { rel: 1e-12, abs: 1e-9 }, `${load.name} Q`);
      });
    });
  });

  it('rebalanceInstallation takes them: one condition per pick, named by its time and reasons, metered phases never moved', () => {
    const report = rebalanceInstallation(picked.installation, {}, { loadConditions: picked.conditions });
    // The report compares each condition at every board's incomer.
    expect([...new Set(report.conditions.map((x) => x.name))]).toEqual(picked.conditions.map((x) => x.name));
    expect(report.conditions.some((x) => x.name.includes('peak current at Paint shed'))).toBe(true);
    expect(report.moves.every((m) => !m.name.includes('metered'))).toBe(true);
  });
});
