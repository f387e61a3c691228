/**
 * `checkHandFigures`: the textbook figures, the solved board, and the effects
 * between them, checked against closed forms worked out here from S = V·I*
 * (per-phase equivalents of balanced boards; the 30° shift of a line-to-line
 * branch), and with zero difference where the textbook method is exact.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkHandFigures, normaliseBoard, parseBoard, type Board, type BoardSpec, type HandCheckResult } from '@trivar/core';
import { balancedBoardSpecArb } from '../property/arbitraries/boardSpec.js';

const ln = 400 / Math.sqrt(3);

function board(loads: BoardSpec['loads'], extra: Partial<BoardSpec> = {}): Board {
  return normaliseBoard(parseBoard({ name: 'test board', supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads, ...extra }));
}

/** Largest |value| among every difference and every effect of a check. */
function largestDifference(r: HandCheckResult): number {
  const values = [
    ...r.lines.flatMap((l) => [l.currentA.difference, l.pf.difference]),
    r.neutralA?.difference ?? 0,
    r.boardPf.difference,
    ...r.effects.flatMap((e) => [...e.lines.flatMap((l) => [l.currentA, l.pf]), e.neutralA ?? 0, e.boardPf]),
  ];
  return Math.max(...values.map(Math.abs));
}

describe('where the textbook method is exact', () => {
  it('a balanced board on an ideal source with a balanced bank shows zero difference (random boards, fast-check)', () => {
    fc.assert(
      fc.property(balancedBoardSpecArb({ maxLoads: 3 }), fc.double({ min: 0.5, max: 40, noNaN: true }), fc.boolean(), (spec, kvar, delta) => {
        // Ideal source: no transformer, source impedance or feeder.
        const { transformer: _t, impedance: _i, ...supply } = spec.supply;
        const b = normaliseBoard(parseBoard({ ...spec, supply, feeder: undefined }));
        const pairs = b.phases.length === 3 ? ['A-B', 'B-C', 'C-A'] : ['A-B'];
        const stars = b.phases.map((p) => `${p}-N`);
        const branches = delta || !b.hasNeutral ? pairs : stars;
        const r = checkHandFigures(b, { capacitors: branches.map((branch) => ({ branch, kvar })) });
        const scale = Math.max(1, ...r.lines.map((l) => l.currentA.solved));
        expect(largestDifference(r)).toBeLessThan(1e-9 * scale);
      }),
      { numRuns: 40 },
    );
  });
});

describe('a line-pair capacitor on an ideal source', () => {
  it('moves Q/(2√3) of active power from its first line to its second, as S = V·I* gives', () => {
    // Balanced 10 kW resistive star load per phase plus one 12 kvar capacitor on A-B.
    const p = 10_000;
    const q = 12_000;
    const b = board([{ name: 'heaters', connection: 'ABC-star', kW: 30, pf: 1, model: 'constant-impedance' }]);
    const r = checkHandFigures(b, { capacitors: [{ branch: 'A-B', kvar: 12 }] });
    // Line A: S_A = P + (−jQ)·(1/√3)∠−30° ⇒ P_A = P − Q/(2√3), Q_A = −Q/2; line B: P_B = P + Q/(2√3), Q_B = −Q/2.
    const shift = q / (2 * Math.sqrt(3));
    const hand = Math.hypot(p, q / 2) / ln;
    const exact = { A: Math.hypot(p - shift, q / 2) / ln, B: Math.hypot(p + shift, q / 2) / ln, C: p / ln };
    const split = r.effects.find((e) => e.effect === 'line-pair-split')!;
    for (const l of split.lines) {
      const expected = exact[l.phase as 'A' | 'B' | 'C'] - (l.phase === 'C' ? p / ln : hand);
      expect(l.currentA).toBeCloseTo(expected, 9);
    }
    // No other effect on an ideal source with constant-impedance loads at nominal voltage.
    for (const e of r.effects.filter((x) => x.effect !== 'line-pair-split')) for (const l of e.lines) expect(Math.abs(l.currentA)).toBeLessThan(1e-9);
    expect(r.lines.map((l) => l.currentA.solved)).toEqual([expect.closeTo(exact.A, 9), expect.closeTo(exact.B, 9), expect.closeTo(exact.C, 9)]);
  });
});

/**
 * Per-phase equivalent of a balanced board (independent of the nodal solver):
 * V = E − Z·I with I = (S/V)* + jB·V, solved by fixed-point iteration.
 */
function perPhaseVoltage(e: number, z: { re: number; im: number }, sVA: { re: number; im: number }, susceptanceS: number): { re: number; im: number } {
  let v = { re: e, im: 0 };
  for (let k = 0; k < 200; k++) {
    const m2 = v.re * v.re + v.im * v.im;
    // (S/V)* = S*·V/|V|²
    const iLoad = { re: (sVA.re * v.re + sVA.im * v.im) / m2, im: (sVA.re * v.im - sVA.im * v.re) / m2 };
    const i = { re: iLoad.re - susceptanceS * v.im, im: iLoad.im + susceptanceS * v.re };
    v = { re: e - (z.re * i.re - z.im * i.im), im: -(z.re * i.im + z.im * i.re) };
  }
  return v;
}

describe('a board with a feeder and a delta bank', () => {
  const spec = (): Board =>
    board([{ name: 'process motors', connection: 'ABC-star', kW: 60, pf: 0.8 }], {
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: 0.01, x: 0.03 } },
      feeder: { line: { r: 0.04, x: 0.012 }, neutral: { r: 0.04, x: 0.012 } },
    });
  const kvarPerBranch = 10;
  const result = () => checkHandFigures(spec(), { capacitors: ['A-B', 'B-C', 'C-A'].map((branch) => ({ branch, kvar: kvarPerBranch })), expected: { pf: 0.95 } });

  it('names every effect, and their sizes add up to the whole difference', () => {
    const r = result();
    expect(r.effects.map((e) => e.effect)).toEqual(['line-pair-split', 'board-voltage', 'neutral-return', 'capacitor-voltage', 'voltage-dependent-loads']);
    r.lines.forEach((l, k) => {
      expect(r.effects.reduce((s, e) => s + e.lines[k]!.currentA, 0)).toBeCloseTo(l.currentA.difference, 10);
      expect(r.effects.reduce((s, e) => s + e.lines[k]!.pf, 0)).toBeCloseTo(l.pf.difference, 12);
    });
    expect(r.boardPf.yours).toBe(0.95);
  });

  it('voltage drop and the capacitor square law have the sizes the per-phase equivalent gives', () => {
    const r = result();
    const z = { re: 0.05, im: 0.042 };
    const sLoad = { re: 20_000, im: 15_000 };
    const qBankPerPhase = kvarPerBranch * 1000; // a balanced delta of 3 × Q is Q per phase
    const vn = ln;
    const hand = Math.hypot(sLoad.re, sLoad.im - qBankPerPhase) / vn;
    // Bank held at its hand kvar (constant power): only the voltage changes.
    const vDrop = perPhaseVoltage(vn, z, { re: sLoad.re, im: sLoad.im - qBankPerPhase }, 0);
    const withDrop = Math.hypot(sLoad.re, sLoad.im - qBankPerPhase) / Math.hypot(vDrop.re, vDrop.im);
    // Bank as its capacitance: B per phase = Q/Vn².
    const b = qBankPerPhase / (vn * vn);
    const vCap = perPhaseVoltage(vn, z, sLoad, b);
    const m = Math.hypot(vCap.re, vCap.im);
    const withCapLaw = Math.hypot(sLoad.re, sLoad.im - b * m * m) / m;
    const effect = (id: string) => r.effects.find((e) => e.effect === id)!;
    for (const l of effect('board-voltage').lines) expect(l.currentA).toBeCloseTo(withDrop - hand, 6);
    for (const l of effect('capacitor-voltage').lines) expect(l.currentA).toBeCloseTo(withCapLaw - withDrop, 6);
    for (const id of ['line-pair-split', 'neutral-return', 'voltage-dependent-loads']) for (const l of effect(id).lines) expect(Math.abs(l.currentA)).toBeLessThan(1e-6);
    expect(effect('board-voltage').lines[0]!.currentA).toBeGreaterThan(0.5); // a real, visible effect on this board
    // Each capacitor's output at its solved voltage follows Q = Qn·(V/Vn)².
    for (const c of r.capacitors) expect(c.kvarAtAppliedV).toBeCloseTo(c.handKvar * (c.appliedV / c.nominalV) ** 2, 9);
  });

  it('an unbalanced delta bank on the same board shows the line-pair effect and says how big it is', () => {
    const r = checkHandFigures(spec(), { capacitors: [{ branch: 'A-B', kvar: 20 }, { branch: 'B-C', kvar: 5 }] });
    const split = r.effects.find((e) => e.effect === 'line-pair-split')!;
    expect(Math.max(...split.lines.map((l) => Math.abs(l.currentA)))).toBeGreaterThan(1);
    expect(split.explanation).toContain('25.0 kvar of your capacitors sit across line pairs');
    const capLaw = r.effects.find((e) => e.effect === 'capacitor-voltage')!;
    expect(capLaw.explanation).toMatch(/give \d+\.\d\d kvar, not the 25\.00 kvar counted by hand \(-\d\.\d %\)/);
  });
});

describe('capacitor ratings', () => {
  it('a unit rated at 440 V gives (400/440)² of its nameplate on a 400 V line pair; µF figures use ωCV²', () => {
    const b = board([{ name: 'load', connection: 'ABC-star', kW: 30, pf: 0.8 }]);
    const r = checkHandFigures(b, { capacitors: [{ branch: 'A-B', kvar: 10, ratedV: 440 }, { branch: 'C-N', uF: 100 }] });
    expect(r.capacitors[0]!.kvarAtAppliedV).toBeCloseTo(10 * (400 / 440) ** 2, 9);
    expect(r.capacitors[1]!.handKvar).toBeCloseTo((2 * Math.PI * 50 * 100e-6 * ln * ln) / 1000, 12);
    expect(r.effects.find((e) => e.effect === 'capacitor-voltage')!.explanation).toContain('(400/440)² = 82.6 %');
  });
});

describe('textbook working', () => {
  it('Qc = P(tan φ1 − tan φ2) per phase, with line-to-line loads split half to each line', () => {
    const b = board([
      { name: 'motor', connection: 'A-N', kW: 8, pf: 0.75 },
      { name: 'welder', connection: 'B-C', kW: 10, pf: 0.6 },
    ]);
    const r = checkHandFigures(b, { targetPf: 0.95, capacitors: [{ branch: 'A-N', kvar: 4 }] });
    const tan2 = Math.tan(Math.acos(0.95));
    const a = r.textbook.find((p) => p.phase === 'A')!;
    expect(a.kW).toBeCloseTo(8, 12);
    expect(a.requiredKvar).toBeCloseTo(8 * (Math.tan(Math.acos(0.75)) - tan2), 9);
    const bPhase = r.textbook.find((p) => p.phase === 'B')!;
    expect(bPhase.kW).toBeCloseTo(5, 12);
    expect(bPhase.kvarBefore).toBeCloseTo(5 * Math.tan(Math.acos(0.6)), 9);
    expect(a.currentAfterA).toBeCloseTo(Math.hypot(8000, 8000 * Math.tan(Math.acos(0.75)) - 4000) / ln, 9);
  });
});

describe('bad hand figures', () => {
  const threeWire = normaliseBoard(parseBoard({ supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads: [{ name: 'm', connection: 'ABC-delta', kW: 5, pf: 0.8 }] }));
  const split = normaliseBoard(parseBoard({ supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 }, loads: [{ name: 'm', connection: 'A-B', kW: 5, pf: 0.8 }] }));
  it.each([
    ['no capacitors', threeWire, {}, 'missing', 'capacitors'],
    ['kvar and uF together', threeWire, { capacitors: [{ branch: 'A-B', kvar: 5, uF: 100 }] }, 'custom', 'capacitors[0]'],
    ['a capacitor to a neutral the board lacks', threeWire, { capacitors: [{ branch: 'A-N', kvar: 5 }] }, 'no-neutral', 'capacitors[0].branch'],
    ['a phase the board lacks', split, { capacitors: [{ branch: 'B-C', kvar: 5 }] }, 'not-on-board', 'capacitors[0].branch'],
    ['an expected line the board lacks', split, { capacitors: [{ branch: 'A-B', kvar: 5 }], expected: { lines: { C: { currentA: 3 } } } }, 'not-on-board', 'expected.lines.C'],
    ['an unknown key', threeWire, { capacitors: [{ branch: 'A-B', kvar: 5 }], colour: 'red' }, 'unknown_key', 'colour'],
    ['a negative kvar', threeWire, { capacitors: [{ branch: 'A-B', kvar: -5 }] }, 'out_of_range', 'capacitors[0].kvar'],
    // A gigavar printed 2.5 GA line currents: the physical ranges the board file has hold here too.
    ['a capacitor of 1e9 kvar', threeWire, { capacitors: [{ branch: 'A-B', kvar: 1e9 }] }, 'out_of_range', 'capacitors[0].kvar'],
    ['a capacitance of 1e12 µF', threeWire, { capacitors: [{ branch: 'A-B', uF: 1e12 }] }, 'out_of_range', 'capacitors[0].uF'],
    // JSON.parse makes an own __proto__ key; it was reported by the keys of its value (expected.lines.currentA).
    ['expected lines keyed __proto__', threeWire, { capacitors: [{ branch: 'A-B', kvar: 5 }], expected: { lines: JSON.parse('{"__proto__":{"currentA":3}}') } }, 'unknown_key', 'expected.lines.__proto__'],
    ['expected lines keyed constructor', threeWire, { capacitors: [{ branch: 'A-B', kvar: 5 }], expected: { lines: { constructor: { currentA: 3 } } } }, 'unknown_key', 'expected.lines.constructor'],
  ])('%s', (_what, b, figures, code, path) => {
    try {
      checkHandFigures(b, figures);
      expect.unreachable('accepted bad figures');
    } catch (error) {
      const issues = (error as { issues: { code: string; path: string }[] }).issues;
      expect(issues).toContainEqual(expect.objectContaining({ code, path }));
      expect(issues.every((i) => !i.path.endsWith('.currentA'))).toBe(true);
    }
  });
});
