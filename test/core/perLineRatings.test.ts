/**
 * A feeder whose line conductors differ carries a rating per line: each line is judged against its
 * own conductor, not against the weakest. (Before, a 95 mm² line rated 250 A carrying 87 A was
 * flagged "above the line rating of 40 A" because its 16 mm² neighbour is rated 40 A.)
 */
import { describe, expect, it } from 'vitest';
import { solveBoard, solveInstallation } from '@trivar/core';

// A bakery's back room (invented): the oven line was re-cabled in 95 mm², the heater line kept its 16 mm².
const supply = { voltage: '400/230', frequencyHz: 50 };
const line = { A: { mm2: 16, ratingA: 40 }, B: { mm2: 95, ratingA: 250 }, C: { mm2: 95, ratingA: 250 } };
const loads = [
  { name: 'proofer heater', connection: 'A-N', kW: 11 },
  { name: 'deck oven', connection: 'B-N', kW: 20 },
];

describe('ratings per line conductor', () => {
  const r = solveBoard({ name: 'back room', supply, feeder: { lengthM: 20, line, neutral: { mm2: 95, ratingA: 250 } }, loads });

  it('each line reads against its own rating, and only the overloaded one is warned', () => {
    const [a, b, c] = r.phases;
    expect(a!.loadingPercent!).toBeCloseTo((100 * a!.current.magnitude) / 40, 9);
    expect(b!.loadingPercent!).toBeCloseTo((100 * b!.current.magnitude) / 250, 9);
    expect(c!.loadingPercent).toBe(0);
    expect(a!.current.magnitude).toBeGreaterThan(40); // 11 kW at ~230 V: about 48 A
    expect(b!.current.magnitude).toBeGreaterThan(40);
    const over = r.warnings.filter((w) => w.code === 'line-over-rating');
    expect(over.map((w) => w.threshold)).toEqual([40]);
    expect(over[0]!.message).toMatch(/^line A carries 4\d\.\d A, above its rating of 40\.0 A$/);
  });

  it('a sub-board fed by such a feeder: feeder loading per line, and its incomer against the line most loaded for its rating', () => {
    const inst = solveInstallation({
      name: 'bakery',
      supply,
      boards: [
        { name: 'main', loads: [] },
        { name: 'back room', fedFrom: 'main', feeder: { lengthM: 20, line, neutral: { mm2: 95, ratingA: 250 } }, loads },
      ],
    });
    const sub = inst.boards[1]!.result;
    expect(sub.warnings.filter((w) => w.code === 'line-over-rating').map((w) => w.threshold)).toEqual([40]);
    const feeder = inst.feeders.find((f) => f.board === 'back room')!;
    expect(feeder.lines.map((l) => l.loadingPercent)).toEqual(sub.phases.map((p) => p.loadingPercent));
    expect(sub.incomer!.ratingA).toBe(40);
    expect(sub.incomer!.loadingPercent!).toBeCloseTo(sub.phases[0]!.loadingPercent!, 9);
  });

  it('one rating for every line stays the short form', () => {
    const even = solveBoard({ name: 'even', supply, feeder: { lengthM: 20, line: { mm2: 16, ratingA: 40 }, neutral: { mm2: 16 } }, loads });
    expect(even.warnings.filter((w) => w.code === 'line-over-rating').map((w) => w.threshold)).toEqual([40, 40]);
  });
});
