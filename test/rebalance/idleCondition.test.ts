/** A condition in which the board draws nothing: |I2|/|I1| is 0/0, reported as null (the text shows "-"), not 0 %. */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, rebalanceBoard, type BoardSpec } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const spec = {
  name: 'Idle at night',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'L1', connection: 'A-N', kW: 5, pf: 0.95 },
    { name: 'L2', connection: 'A-N', kW: 4, pf: 0.9 },
    { name: 'L3', connection: 'B-N', kW: 3, pf: 1 },
  ],
} as BoardSpec;
const study = { conditions: [{ name: 'day' }, { name: 'night', factor: 0 }] };

describe('rebalance: an idle condition', () => {
  it('has no current unbalance figure, solved or modelled; the busy one keeps its own', () => {
    const r = rebalanceBoard(normaliseBoard(parseBoard(spec)), study, { moveTable: false });
    const night = r.conditions.find((c) => c.name === 'night')!;
    expect([night.solved.before, night.solved.after, night.model.before, night.model.after].map((f) => [f.largestLineA, f.currentUnbalancePercent])).toEqual([
      [0, null],
      [0, null],
      [0, null],
      [0, null],
    ]);
    const day = r.conditions.find((c) => c.name === 'day')!;
    expect(day.solved.before.currentUnbalancePercent).toBeCloseTo(60.4, 1);
    expect(r.solvedScore.after).toBeCloseTo(29.51, 2);
  });

  it('the text shows "-" for it (it showed 0.00)', () => {
    const text = `name: Idle at night
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }
loads:
  - { name: L1, connection: A-N, kW: 5, pf: 0.95 }
  - { name: L2, connection: A-N, kW: 4, pf: 0.9 }
  - { name: L3, connection: B-N, kW: 3, pf: 1 }
rebalance:
  conditions: [{ name: day }, { name: night, factor: 0 }]
`;
    const r = runTrivar(['rebalance', '-', '--no-table'], text);
    expect(r.code).toBe(0);
    const night = r.stdout.split('Condition "night"')[1]!;
    expect(night).toMatch(/\|I2\|\/\|I1\| \(%\) +- +- +-\n/);
    expect(r.stdout.split('Condition "night"')[0]).toMatch(/\|I2\|\/\|I1\| \(%\) +60\.40 +25\.42 +25\.42\n/);
  });
});
