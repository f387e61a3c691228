/**
 * Load conditions from interval data: the representative intervals are the
 * ones the stated rule names (peak of each line, of the neutral, of import and
 * export, then quantiles of the total apparent power), found here by a plain
 * scan of test-side currents; the weights add up to the data's hours; each
 * condition carries that interval's load powers, and the study re-solves them.
 */
import { describe, expect, it } from 'vitest';
import {
  conditionsFromIntervals,
  driverColumns,
  normaliseBoard,
  parseBoard,
  planColumns,
  planDrivers,
  rebalanceBoard,
  solveBoardModel,
  type BoardSpec,
  type ComplexValue,
} from '@trivar/core';
import { seeded } from './support/rebalanceBoards.js';
import { C0, c, cAbs, cAdd, cConj, cDiv, cPolarDeg, cSum } from '../support/complexMath.js';
import { expectClose } from '../support/tolerance.js';

/** An invented corner of a mixed-use block: a café, two flats, a PV string and a metered landlord supply. */
const spec: BoardSpec = {
  name: 'Weir Lane',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'Cafe oven', connection: 'A-N', kW: 9, pf: 1 },
    { name: 'Flat 1', connection: 'B-N', kW: 5, pf: 0.95 },
    { name: 'Flat 2', connection: 'C-N', kW: 3, pf: 0.9 },
    { name: 'Roof PV', connection: 'C-N', kW: -6, pf: 1 },
    { name: 'Cellar pump', connection: 'A-N', kW: 1.1, pf: 0.8 },
  ],
};
// Phase B is metered whole (the landlord's meter): Flat 1, on phase B, has no column of its own, since a
// metered phase total beside a column for a load on that phase would count it twice.
const header = ['time', 'Cafe oven [x]', 'Flat 2 [kW]', 'Roof PV [x]', 'phase B [kW]'];

const N = 240;
const random = seeded(42);
const values = [0, 1, 2, 3].map(() => new Float64Array(N));
for (let i = 0; i < N; i++) {
  const hour = (i / 10) % 24;
  values[0]![i] = hour > 6 && hour < 15 ? random() : 0;
  values[1]![i] = 0.2 + 3 * random();
  values[2]![i] = hour > 9 && hour < 16 ? random() : 0;
  values[3]![i] = 0.3 + 4 * random() * (hour > 17 ? 1 : 0.4);
}
const utcMs = Float64Array.from({ length: N }, (_, i) => Date.UTC(2025, 5, 1) + i * 6 * 60_000);

/** Test-side load powers of interval i, VA, in the board's load order, plus the metered phase B total. */
function powers(i: number): ComplexValue[] {
  const tan = (pf: number) => Math.tan(Math.acos(pf));
  const p2 = values[1]![i]! * 1000;
  return [
    c(9000 * values[0]![i]!, 0),
    c(0, 0), // Flat 1 has no column: off (phase B's metered total stands for it)
    c(p2, p2 * tan(0.9)),
    c(-6000 * values[2]![i]!, 0),
    c(0, 0), // the cellar pump has no column: off
    // Metered phase B in kW alone: at the rated PF of the file's loads on B, Flat 1's 0.95 (not unity: that hid their kvar).
    c(values[3]![i]! * 1000, values[3]![i]! * 1000 * tan(0.95)),
  ];
}
const phaseOf = ['A', 'B', 'C', 'C', 'A', 'B'];
const V: Record<string, ComplexValue> = { A: cPolarDeg(400 / Math.sqrt(3), 0), B: cPolarDeg(400 / Math.sqrt(3), -120), C: cPolarDeg(400 / Math.sqrt(3), 120) };
function lines(i: number): ComplexValue[] {
  const I: Record<string, ComplexValue> = { A: C0, B: C0, C: C0 };
  powers(i).forEach((s, l) => (I[phaseOf[l]!] = cAdd(I[phaseOf[l]!]!, cConj(cDiv(s, V[phaseOf[l]!]!)))));
  return [I.A!, I.B!, I.C!];
}

describe('rebalance: load conditions from interval data', () => {
  const board = normaliseBoard(parseBoard(spec));
  const plan = planColumns(board, header);
  const columns = driverColumns(plan, values, N);
  const picked = conditionsFromIntervals(plan.board, planDrivers(plan), columns, utcMs, 6 * 60_000, { spread: 5 });

  it('picks the intervals the rule names, found by a plain scan', () => {
    const argMax = (f: (i: number) => number) => Array.from({ length: N }, (_, i) => i).reduce((b, i) => (f(i) > f(b) ? i : b), 0);
    const kW = (i: number) => powers(i).reduce((s, x) => s + x.re, 0) / 1000;
    const kVA = (i: number) => cAbs(cSum(powers(i))) / 1000;
    const expected = new Map<number, string[]>();
    const add = (i: number, why: string) => expected.set(i, [...(expected.get(i) ?? []), why]);
    ['A', 'B', 'C'].forEach((p, k) => add(argMax((i) => cAbs(lines(i)[k]!)), `peak line ${p}`));
    add(argMax((i) => cAbs(cSum(lines(i)))), 'peak neutral');
    add(argMax(kW), 'peak import');
    const ex = argMax((i) => -kW(i));
    if (kW(ex) < 0) add(ex, 'peak export');
    const order = Array.from({ length: N }, (_, i) => i).sort((a, b) => kVA(a) - kVA(b));
    for (let b = 0; b < 5; b++) add(order[Math.floor(((b + 0.5) * N) / 5)]!, `quantile ${(100 * (b + 0.5)) / 5} %`);
    expect(Object.fromEntries(picked.picks.map((p) => [p.interval, p.reasons]))).toEqual(Object.fromEntries(expected));
    expect(picked.picks.some((p) => p.reasons.includes('peak export'))).toBe(true);
  });

  it('weights add up to the hours of the data; peaks stand for their own interval', () => {
    expectClose(picked.conditions.reduce((s, c) => s + c.weight, 0), N * 0.1, { rel: 1e-12, abs: 1e-12 }, 'hours');
    for (const p of picked.picks) if (!p.reasons.some((r) => r.startsWith('quantile'))) expectClose(p.hours, 0.1, { rel: 1e-12, abs: 1e-12 }, 'a peak');
  });

  it('each condition carries its interval’s load powers, and the study solves them', () => {
    picked.picks.forEach((p, k) => {
      const factors = picked.conditions[k]!.factors;
      powers(p.interval).forEach((s, l) => {
        const rated = picked.board.loads[l]!.branches.reduce((t, b) => cAdd(t, b.sNominal), C0);
        const got = c(factors[l]!.re * rated.re - factors[l]!.im * rated.im, factors[l]!.re * rated.im + factors[l]!.im * rated.re);
        expectClose(got.re, s.re, { rel: 1e-9, abs: 1e-6 }, `P of load ${l} in interval ${p.interval}`);
        expectClose(got.im, s.im, { rel: 1e-9, abs: 1e-6 }, `Q of load ${l} in interval ${p.interval}`);
      });
    });
    const report = rebalanceBoard(picked.board, {}, { loadConditions: picked.conditions, moveTable: false });
    expect(report.conditions.map((c) => c.name)).toEqual(picked.conditions.map((c) => c.name));
    expect(report.conditions[0]!.name).toMatch(/^2025-06-01 \d\d:\d\d UTC \(/);
    // The metered phase never moves; the "before" re-solve of a condition equals a plain solve of that interval.
    expect(report.moves.map((m) => m.name)).not.toContain('metered phase B');
    const k = picked.picks.findIndex((p) => p.reasons.includes('peak neutral'));
    const scaled = {
      ...picked.board,
      loads: picked.board.loads.map((l, i) => ({ ...l, branches: l.branches.map((b) => ({ ...b, sNominal: powers(picked.picks[k]!.interval)[i]! })) })),
    };
    const direct = solveBoardModel(scaled);
    direct.phases.forEach((p, j) => expectClose(report.conditions[k]!.solved.before.lineA[j]!, p.current.magnitude, { rel: 1e-9, abs: 1e-9 }, `line ${p.phase}`));
    expect(report.conditions[k]!.solved.after.neutralA!).toBeLessThan(report.conditions[k]!.solved.before.neutralA!);
  });
});
