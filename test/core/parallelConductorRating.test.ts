/**
 * A conductor's `ratingA` is one conductor's (the schema says so); a parallel set is rated `parallel` ×
 * that, as a designer rates it, and every loading and warning judges the set. Invented: a ferry terminal
 * kitchen with a doubled 16 mm² neutral and its line conductors run two to a phase.
 */
import { describe, expect, it } from 'vitest';
import { boardJsonSchema, normaliseBoard, parseBoard, solveBoardModel } from '@trivar/core';
import { conductorWords } from '../../packages/core/src/render/report/boardSections.js';

const kitchen = (neutralRatingA: number) =>
  solveBoardModel(
    normaliseBoard(
      parseBoard({
        name: 'Ferry terminal kitchen',
        supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 160, impedancePercent: 4, xOverR: 3 } },
        feeder: { lengthM: 35, line: { mm2: 25, parallel: 2, ratingA: 80 }, neutral: { mm2: 16, parallel: 2, ratingA: neutralRatingA } },
        loads: [
          { name: 'Steam ovens', connection: 'A-N', kW: 20, pf: 0.98 },
          { name: 'Pot wash', connection: 'B-N', kW: 5, pf: 0.95 },
          { name: 'Cold room', connection: 'ABC-delta', kW: 9, pf: 0.8 },
        ],
      }),
    ),
  );

describe('the rating of conductors in parallel', () => {
  it('two 16 mm² neutrals rated 45 A each carry the neutral current against 90 A: no overload at about 70 A', () => {
    const r = kitchen(45);
    const n = r.neutral!;
    expect(n.current.magnitude).toBeGreaterThan(60);
    expect(n.current.magnitude).toBeLessThan(90);
    expect(n.ratingA).toBe(90);
    expect(n.loadingPercent).toBeCloseTo((100 * n.current.magnitude) / 90, 9);
    expect(r.warnings.some((w) => /neutral current .* exceeds the neutral rating/.test(w.message))).toBe(false);
  });

  it('rated 30 A each, the set of two is 60 A, and the warning quotes 60.0 A', () => {
    const r = kitchen(30);
    const w = r.warnings.find((x) => /exceeds the neutral rating/.test(x.message))!;
    expect(w.message).toMatch(/exceeds the neutral rating of 60\.0 A$/);
  });

  it('line conductors two to a phase rated 80 A each: each line is judged against 160 A', () => {
    const a = kitchen(45).phases[0]!;
    expect(a.loadingPercent).toBeCloseTo((100 * a.current.magnitude) / 160, 9);
  });

  it('the schema and the report say it: per conductor, and the set', () => {
    const text = JSON.stringify(boardJsonSchema());
    expect(text).toContain('current rating of one conductor, A (derated for its installation); with parallel conductors the set is rated parallel × this');
    expect(text).not.toContain('current rating of this conductor');
    expect(conductorWords({ mm2: 16, parallel: 2, ratingA: 45, lengthM: 35 })).toMatch(/×2, 35(\.0)? m .*, rated 45 A each, 90 A the set of 2$/);
  });
});
