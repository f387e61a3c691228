import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard } from '@trivar/core';
import { sizeBankSteps } from '../../packages/core/src/profile/sizeBankSteps.js';
import type { IntervalFigures } from '../../packages/core/src/profile/solveBatch.js';

// A board only supplies its phases here; the need comes from the interval figures given.
const board = normaliseBoard(
  parseBoard({ supply: { system: 'three-phase-4wire', voltage: { lineToNeutral: 230 }, frequencyHz: 50 }, loads: [{ name: 'x', connection: 'A-N', kW: 1 }] }),
);

/** Every interval draws `kw` and `kvar` on each phase (three-phase totals 3×). */
function figures(kw: number, kvar: number, count = 10): IntervalFigures {
  const col = (v: number) => new Float64Array(count).fill(v * 1000);
  return { count, phaseW: [col(kw), col(kw), col(kw)], phaseVar: [col(kvar), col(kvar), col(kvar)] } as unknown as IntervalFigures;
}

describe('sizeBankSteps: equal steps up to stepCount, only as many as the need calls for', () => {
  const options = { targetPf: 1, coverShare: 0.95, stepCount: 6, perPhase: false };
  it('a 3.3 kvar need takes two 2.5 kvar steps, not six (15 kvar)', () => {
    const { steps, needKvar } = sizeBankSteps(board, figures(0, 1.1), options);
    expect(needKvar.ABC).toBeCloseTo(3.3, 9);
    expect(steps.map((s) => s.kvar)).toEqual([2.5, 2.5]);
  });
  it('a large need takes all six steps, each rounded up to 2.5 kvar', () => {
    const { steps } = sizeBankSteps(board, figures(0, 10), options);
    expect(steps.map((s) => s.kvar)).toEqual([5, 5, 5, 5, 5, 5]);
  });
  it('per phase: 0.5 kvar units, at most stepCount per phase', () => {
    const { steps } = sizeBankSteps(board, figures(0, 1.2), { ...options, perPhase: true });
    expect(steps.filter((s) => s.channel === 'A').map((s) => s.kvar)).toEqual([0.5, 0.5, 0.5]);
    expect(steps).toHaveLength(9);
  });
});
