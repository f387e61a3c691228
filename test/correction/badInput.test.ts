/**
 * Bad correction input: every problem is an `InputError` issue with a code and
 * the field path, or — where the input is legal but pointless — a warning.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, InputError, sizeStarBank, validateCorrectionSpec, type Board } from '@trivar/core';
import { makeBoard } from './support/boards.js';

const fourWire = makeBoard('three-phase-4wire', [
  { name: 'ovens', connection: 'A-N', kW: 6, pf: 0.8 },
  { name: 'fans', connection: 'B-N', kW: 3, pf: 0.75 },
]);
const threeWire = makeBoard('three-phase-3wire', [{ name: 'compressor', connection: 'ABC-delta', kW: 15, pf: 0.8 }]);
const splitPhase = makeBoard('split-phase', [{ name: 'well pump', connection: 'A-B', kW: 2, pf: 0.75 }], { lineToNeutral: 120, frequencyHz: 60 });

function issuesOf(run: () => unknown): { code: string; path: string; message: string }[] {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error.issues.map((i) => ({ code: i.code, path: i.path, message: i.message }));
    throw error;
  }
  return expect.fail('expected an InputError');
}

const cases: { name: string; board: Board; spec: unknown; code: string; path: string }[] = [
  { name: 'PF above 1', board: fourWire, spec: { arrangement: 'star-bank', target: { pf: 1.2 } }, code: 'out_of_range', path: 'target.pf' },
  { name: 'PF of 0', board: fourWire, spec: { arrangement: 'star-bank', target: { pf: 0 } }, code: 'out_of_range', path: 'target.pf' },
  { name: 'per-phase PF above 1', board: fourWire, spec: { arrangement: 'star-bank', target: { perPhase: { B: 1.05 } } }, code: 'out_of_range', path: 'target.perPhase.B' },
  { name: 'upper bound below the target', board: fourWire, spec: { arrangement: 'star-bank', target: { pf: 0.95, maxLaggingPf: 0.9 } }, code: 'conflict', path: 'target.maxLaggingPf' },
  { name: 'upper bound with leading allowed', board: fourWire, spec: { arrangement: 'star-bank', target: { leading: 'allowed', maxLaggingPf: 0.99 } }, code: 'conflict', path: 'target.maxLaggingPf' },
  { name: 'leading PF without leading allowed', board: fourWire, spec: { arrangement: 'star-bank', target: { minLeadingPf: 0.9 } }, code: 'not_applicable', path: 'target.minLeadingPf' },
  { name: 'empty catalogue', board: fourWire, spec: { arrangement: 'star-bank', catalogue: [] }, code: 'out_of_range', path: 'catalogue' },
  { name: 'unit with no rating', board: fourWire, spec: { arrangement: 'star-bank', catalogue: [{ ratedV: 440, ratedHz: 50 }] }, code: 'missing', path: 'catalogue[0].ratedKvar' },
  { name: 'unit at 55 Hz', board: fourWire, spec: { arrangement: 'star-bank', catalogue: [{ ratedKvar: 5, ratedV: 440, ratedHz: 55 }] }, code: 'invalid_value', path: 'catalogue[0].ratedHz' },
  { name: 'balancing compensator on a split-phase board', board: splitPhase, spec: { arrangement: 'balancing-compensator' }, code: 'not_applicable', path: 'arrangement' },
  { name: 'effective PF on a split-phase board', board: splitPhase, spec: { arrangement: 'star-bank', target: { definition: 'effective' } }, code: 'not_applicable', path: 'target.definition' },
  { name: 'per-phase target for a missing phase', board: splitPhase, spec: { arrangement: 'star-bank', target: { perPhase: { C: 0.9 } } }, code: 'unknown_phase', path: 'target.perPhase.C' },
  { name: 'per-phase targets with a board-wide definition', board: fourWire, spec: { arrangement: 'star-bank', target: { definition: 'vector', perPhase: { A: 0.9 } } }, code: 'not_applicable', path: 'target.perPhase' },
  { name: 'per-phase targets for a compensator', board: fourWire, spec: { arrangement: 'balancing-compensator', target: { perPhase: { A: 0.9 } } }, code: 'not_applicable', path: 'target.perPhase' },
  { name: 'star point on the neutral of a 3-wire board', board: threeWire, spec: { arrangement: 'star-bank', starPoint: 'neutral' }, code: 'no_neutral', path: 'starPoint' },
  { name: 'line-to-neutral compensator branches on a 3-wire board', board: threeWire, spec: { arrangement: 'balancing-compensator', compensator: { branches: 'delta-and-star' } }, code: 'no_neutral', path: 'compensator.branches' },
  { name: 'share with per-line targets', board: fourWire, spec: { arrangement: 'delta-bank', share: 'equal' }, code: 'not_applicable', path: 'share' },
  { name: 'unknown light-load name', board: fourWire, spec: { arrangement: 'star-bank', lightLoad: { fraction: 0.3, perLoad: { dishwasher: 0 } } }, code: 'unknown_load', path: 'lightLoad.perLoad.dishwasher' },
  { name: 'light-load fraction above 1', board: fourWire, spec: { arrangement: 'star-bank', lightLoad: { fraction: 1.5 } }, code: 'out_of_range', path: 'lightLoad.fraction' },
  { name: 'unknown key', board: fourWire, spec: { arrangement: 'star-bank', colour: 'red' }, code: 'unknown_key', path: 'colour' },
  { name: 'unknown arrangement', board: fourWire, spec: { arrangement: 'triangle' }, code: 'invalid_value', path: 'arrangement' },
];

describe('correction spec: table of bad inputs (code and path exact, wording loose)', () => {
  for (const c of cases) {
    it(c.name, () => {
      const issues = issuesOf(() => correctBoard(c.board, c.spec));
      expect(issues.map(({ code, path }) => ({ code, path }))).toContainEqual({ code: c.code, path: c.path });
      const issue = issues.find((i) => i.path === c.path)!;
      if (c.path !== '') expect(issue.message.startsWith(c.path)).toBe(true);
      // validateCorrectionSpec reports the same without throwing.
      const result = validateCorrectionSpec(c.spec, c.board);
      expect(result.ok).toBe(false);
    });
  }

  it('correctBoard needs an arrangement (a study without one is for compareCorrections)', () => {
    expect(issuesOf(() => correctBoard(fourWire, {}))).toEqual([expect.objectContaining({ code: 'missing', path: 'arrangement' })]);
    expect(validateCorrectionSpec({}, fourWire).ok).toBe(true);
  });

  it('every problem is reported in one pass', () => {
    const issues = issuesOf(() => correctBoard(fourWire, { arrangement: 'star-bank', target: { pf: 0.95, maxLaggingPf: 0.9, minLeadingPf: 0.8 }, share: 'equal' }));
    expect(issues.map((i) => i.path).sort()).toEqual(['share', 'target.maxLaggingPf', 'target.minLeadingPf']);
  });

  it('the options of a public sizing function are checked the same way', () => {
    const issues = issuesOf(() => sizeStarBank(fourWire, { target: { pf: 1.5 } }));
    expect(issues).toContainEqual(expect.objectContaining({ code: 'out_of_range', path: 'target.pf' }));
  });
});

describe('units that cannot take the applied voltage', () => {
  it('a catalogue rated below the nominal voltage plus margin: no suitable units, and the reason names the voltage and the catalogue', () => {
    // A delta bank on 400 V (IEC practice, 50 Hz) needs ≥ 440 V units with the 10 % margin.
    const report = correctBoard(threeWire, { arrangement: 'delta-bank', catalogue: [{ name: 'C-400-5', ratedKvar: 5, ratedV: 400, ratedHz: 50 }] });
    expect(report.status).toBe('no-suitable-units');
    expect(report.selection!.unbuildable!.requiredRatedV).toBeCloseTo(440, 9);
    expect(report.reasons.join(' ')).toMatch(/no unit in the catalogue given in the correction fits A-B, B-C, C-A: a unit there must be rated at least 440\.0 V/);
    // No rating at or above 440 V to name: the way out is a catalogue with units in the window.
    expect(report.reasons.join(' ')).toMatch(/the catalogue has 400 V; give a catalogue with units rated 440\.0–\d{3}\.\d V/);
  });

  it('units rated too low next to usable ones are left out', () => {
    const report = correctBoard(threeWire, {
      arrangement: 'delta-bank',
      catalogue: [
        { name: 'C-400-5', ratedKvar: 5, ratedV: 400, ratedHz: 50 },
        { name: 'C-480-2', ratedKvar: 2, ratedV: 480, ratedHz: 50 },
      ],
    });
    expect(report.selection!.steps.length).toBeGreaterThan(0);
    expect(report.selection!.steps.every((s) => s.unit.name === 'C-480-2')).toBe(true);
  });

  it('a smaller voltage margin may be asked for explicitly', () => {
    // A compressor large enough for 5 kvar units (on the 15 kW one any 5 kvar branch makes the lines lead: nothing to build).
    const larger = makeBoard('three-phase-3wire', [{ name: 'compressor', connection: 'ABC-delta', kW: 60, pf: 0.8 }]);
    const report = correctBoard(larger, { arrangement: 'delta-bank', voltageMarginPercent: 0, catalogue: [{ name: 'C-400-5', ratedKvar: 5, ratedV: 400, ratedHz: 50 }] });
    // With no margin the rating covers the nominal voltage, and the solved voltage stays within 110 % of it.
    expect(report.selection!.selections[0]!.requiredRatedV).toBeCloseTo(400, 6);
    expect(report.selection!.unbuildable).toBeNull();
  });
});

describe('targets with nothing to do', () => {
  it('a target below the present PF (never leading): no error, the report says nothing is needed', () => {
    const report = correctBoard(fourWire, { arrangement: 'star-bank', target: { pf: 0.7 } });
    expect(report.status).toBe('already-meets-target');
    expect(report.warnings).toContainEqual(expect.objectContaining({ code: 'nothing-to-do', path: 'target' }));
  });
});
