/**
 * Boards a hostile or careless user writes: extreme magnitudes, names that are
 * Object.prototype members, several kinds of mistake at once. Each must end in
 * an InputError naming the field (and the accepted range) or in a correct answer.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, InputError, normaliseBoard, parseBoard, PHYSICAL_RANGES, solveBoard, validateBoard } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 };
const good = () => ({ supply: structuredClone(supply) as Record<string, any>, loads: [{ name: 'oven', connection: 'A-N', kW: 2, pf: 0.9 } as Record<string, any>] });

const issuesOf = (board: unknown) => {
  const v = validateBoard(board);
  if (v.ok) throw new Error('expected the board to be refused');
  return v.issues;
};

describe('physical numbers outside their stated range name the field and the range', () => {
  const cases: [string, (b: ReturnType<typeof good>) => void, string, RegExp][] = [
    ['kW 1e308', (b) => (b.loads[0]!.kW = 1e308), 'loads[0].kW', /from -100,000 to 100,000 kW/],
    ['pf 1e-320', (b) => (b.loads[0]!.pf = 1e-320), 'loads[0].pf', /from 0\.01 to 1\b/],
    ['kVA 1e300', (b) => (b.loads[0] = { name: 'x', connection: 'A-N', kVA: 1e300, pf: 1 }), 'loads[0].kVA', /above 0 and at most 100,000 kVA/],
    ['lineToLine 1e308', (b) => (b.supply.voltage.lineToLine = 1e308), 'supply.voltage.lineToLine', /from 10 to 1,000 V/],
    ['lineToLine 1 V', (b) => (b.supply.voltage.lineToLine = 1), 'supply.voltage.lineToLine', /from 10 to 1,000 V/],
    ['transformer 1e-6 kVA', (b) => (b.supply.transformer = { kVA: 1e-6, impedancePercent: 4, xOverR: 3 }), 'supply.transformer.kVA', /from 0\.1 to 10,000 kVA/],
    ['transformer 1e9 kVA', (b) => (b.supply.transformer = { kVA: 1e9, impedancePercent: 4, xOverR: 3 }), 'supply.transformer.kVA', /from 0\.1 to 10,000 kVA/],
    ['load ohms 1e308', (b) => (b.loads[0] = { name: 'x', connection: 'A-N', ohms: { r: 1e308, x: 0 } }), 'loads[0].ohms.r', /ohm/],
    ['source reactance -1e300', (b) => (b.supply.impedance = { r: 0.1, x: -1e300 }), 'supply.impedance.x', /from -1,000 to 1,000 ohm/],
    ['EMF 1e200 V', (b) => (b.supply.emf = { A: { V: 1e200, angleDeg: 0 }, B: { V: 230, angleDeg: -120 }, C: { V: 230, angleDeg: 120 } }), 'supply.emf.A.V', /above 0 and at most 1,000 V/],
  ];
  it.each(cases)('%s', (_, edit, path, range) => {
    const b = good();
    edit(b);
    const issues = issuesOf(b);
    const issue = issues.find((i) => i.path === path);
    expect(issue, JSON.stringify(issues)).toBeDefined();
    expect(issue!.code).toBe('out_of_range');
    expect(issue!.expected).toMatch(range);
  });
  it('the ranges are the ones documented in PHYSICAL_RANGES', () => {
    expect(PHYSICAL_RANGES.voltage).toEqual({ min: 10, max: 1000, unit: 'V' });
    expect(PHYSICAL_RANGES.pf.min).toBe(0.01);
  });
});

describe('validation lists schema and cross-field problems in one pass', () => {
  it('a bad supply field does not hide duplicate names or a missing rating', () => {
    const b = good();
    b.supply.frequencyHz = 45;
    b.loads.push({ name: 'oven', connection: 'B-N', kW: 1, pf: 1 }, { name: 'lamp', connection: 'C-N' }, { name: 'bad', connection: 'A-N', kW: 'two' });
    const issues = issuesOf(b).map((i) => `${i.code} ${i.path}`);
    expect(issues).toEqual(
      expect.arrayContaining(['invalid_value supply.frequencyHz', 'duplicate loads[1].name', 'rating loads[2]', 'invalid_type loads[3].kW']),
    );
  });
  it('with a valid supply, connections are checked too; indices stay the file\'s', () => {
    const b = good();
    b.loads.push({ name: 'x', connection: 'A-N', kW: 1e9, pf: 1 }, { name: 'y', connection: 'A-N', kW: 1, pf: 1, starPoint: 'floating' });
    const issues = issuesOf(b).map((i) => `${i.code} ${i.path}`);
    expect(issues).toEqual(['out_of_range loads[1].kW', 'not_applicable loads[2].starPoint']);
  });
});

describe('load names that are Object.prototype members', () => {
  const names = ['constructor', 'toString', '__proto__', 'hasOwnProperty', 'valueOf'];
  const board = () =>
    normaliseBoard(
      parseBoard({
        supply: { ...supply, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
        loads: names.map((name, k) => ({ name, connection: ['A-N', 'B-N', 'C-N', 'A-B', 'ABC-delta'][k], kW: 5, pf: 0.75 })),
      }),
    );
  it('solve and correct with light-load scaling like any other names', () => {
    expect(solveBoard({ supply, loads: names.map((name) => ({ name, connection: 'A-N', kW: 1, pf: 1 })) }).loads.map((l) => l.name)).toEqual(names);
    const report = correctBoard(board(), { arrangement: 'delta-bank', target: { pf: 0.95 }, lightLoad: { fraction: 0.3, perLoad: {} } });
    expect(report.status).toBe('meets-target');
    for (const line of report.verification.lightLoad!.lines) expect(Number.isFinite(line.pf)).toBe(true);
  });
  it('perLoad names them by own keys only, and refuses a __proto__ key instead of dropping it', () => {
    const report = correctBoard(board(), { arrangement: 'delta-bank', target: { pf: 0.95 }, lightLoad: { fraction: 0.3, perLoad: { constructor: 0 } } });
    expect(report.status).toBe('meets-target');
    let error: unknown;
    try {
      correctBoard(board(), { arrangement: 'delta-bank', lightLoad: { fraction: 0.3, perLoad: JSON.parse('{"__proto__": 0}') } });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).issues.map((i) => `${i.code} ${i.path}`)).toEqual(['reserved_key lightLoad.perLoad.__proto__']);
  });
});
