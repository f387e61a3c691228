import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard } from '@trivar/core';
import { closesToTarget, sizeBankSteps } from '../../packages/core/src/profile/sizeBankSteps.js';
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
  const options = { targetPf: 1, coverShare: 0.95, stepCount: 6, perPhase: false, responseShare: 0.67 };
  it('a 4.5 kvar need takes two 2.5 kvar steps, not six (15 kvar)', () => {
    // The second closes: 2.0 kvar left after the first > 0.67 × 2.5 = 1.675 kvar.
    const { steps, needKvar, reaches } = sizeBankSteps(board, figures(0, 1.5), options);
    expect(needKvar.ABC).toBeCloseTo(4.5, 9);
    expect(steps.map((s) => s.kvar)).toEqual([2.5, 2.5]);
    expect(reaches).toEqual({ ABC: true });
  });
  it('a large need takes all six steps, each rounded up to 2.5 kvar', () => {
    const { steps } = sizeBankSteps(board, figures(0, 10), options);
    expect(steps.map((s) => s.kvar)).toEqual([5, 5, 5, 5, 5, 5]);
  });
  it('per phase: 0.5 kvar units, at most stepCount per phase', () => {
    // 1.4 kvar a phase: 0.4 kvar left for the third step > 0.67 × 0.5 = 0.335 kvar.
    const { steps } = sizeBankSteps(board, figures(0, 1.4), { ...options, perPhase: true });
    expect(steps.filter((s) => s.channel === 'A').map((s) => s.kvar)).toEqual([0.5, 0.5, 0.5]);
    expect(steps).toHaveLength(9);
  });
});

describe('sizeBankSteps: steps whose last one the controller closes (C/k threshold 0.67 × the smallest step)', () => {
  const options = { targetPf: 0.95, coverShare: 0.95, stepCount: 6, perPhase: false, responseShare: 0.67 };
  it('a steady 2.77 kvar need: not two 2.5 kvar steps (0.27 kvar left after one, under 1.68 kvar) but one 3 kvar step', () => {
    // 20 kW at 9.34 kvar (PF 0.906): 9.34 − 20·tan(acos 0.95) = 9.34 − 6.574 = 2.77 kvar.
    const { steps, needKvar, reaches } = sizeBankSteps(board, figures(20 / 3, 9.34 / 3), options);
    expect(needKvar.ABC).toBeCloseTo(2.766, 3);
    // 3 × 1 kvar closes too (2.77, 1.77, 0.77 > 0.67) and holds every interval as well: fewer steps win.
    expect(steps.map((s) => s.kvar)).toEqual([3]);
    expect(reaches).toEqual({ ABC: true });
    expect(closesToTarget(2.766, 3, 1, 0.67)).toBe(true);
    expect(closesToTarget(2.766, 1, 3, 0.67)).toBe(true);
    expect(closesToTarget(2.766, 2.5, 2, 0.67)).toBe(false);
  });
  it('a need that varies: of the sizes that close up to the sized need, the one leaving the fewest intervals short', () => {
    // Needs 0.8, 1.2, 1.6, 2.0, 2.4, 2.77 kvar; sized for 2.77 (the top one). 2.5 kvar steps do not close up to
    // it. Of those that do, by the controller's rule: 3 × 1 kvar leaves 1.2, 1.6 and 2.4 short (0.2, 0.6, 0.4
    // kvar left, under 0.67); 2 × 1.5 leaves 0.8, 1.6, 2.0, 2.4 short (under 1.005 kvar); 1 × 3 leaves the
    // four needs up to 2.0 short (under 2.01 kvar). Three 1 kvar steps.
    const needs = [0.8, 1.2, 1.6, 2.0, 2.4, 2.77];
    const f = figures(0, 0, needs.length);
    needs.forEach((q, i) => f.phaseVar.forEach((col) => ((col as Float64Array)[i] = (q / 3) * 1000)));
    const { steps, needKvar, reaches } = sizeBankSteps(board, f, { ...options, targetPf: 1, coverShare: 1 });
    expect(needKvar.ABC).toBeCloseTo(2.77, 9);
    expect(reaches).toEqual({ ABC: true });
    expect(steps.map((s) => s.kvar)).toEqual([1, 1, 1]);
  });
  it('a 3.3 kvar need at targetPf 1: 2.5, 1, 1.5, 2 and 3 kvar steps all leave the last one under its threshold; one 3.5 kvar step closes', () => {
    const { steps } = sizeBankSteps(board, figures(0, 1.1), { ...options, targetPf: 1 });
    expect(steps.map((s) => s.kvar)).toEqual([3.5]);
  });
  it('per phase 1.2 kvar: 0.5 and 1 kvar steps leave 0.2 kvar, under the threshold; one 1.5 kvar step per phase', () => {
    const { steps } = sizeBankSteps(board, figures(0, 1.2), { ...options, targetPf: 1, perPhase: true });
    expect(steps.filter((s) => s.channel === 'B').map((s) => s.kvar)).toEqual([1.5]);
  });
  it('a need below every step\'s threshold (0.3 kvar; the smallest three-phase step 1 kvar closes above 0.67): the catalogue step, flagged as out of reach', () => {
    const { steps, reaches } = sizeBankSteps(board, figures(0, 0.1), { ...options, targetPf: 1 });
    expect(steps.map((s) => s.kvar)).toEqual([2.5]);
    expect(reaches).toEqual({ ABC: false });
  });
});

describe('sizeBankSteps: sizes judged by the kvarh they leave short of the target and leading, over the profile', () => {
  const options = { targetPf: 1, coverShare: 1, stepCount: 8, perPhase: false, responseShare: 0.67 };
  /** Intervals whose three-phase lagging kvar are `needs` (no real power, so at PF 1 the need is the kvar). */
  const profile = (needs: readonly number[]) => {
    const f = figures(0, 0, needs.length);
    needs.forEach((q, i) => f.phaseVar.forEach((col) => ((col as Float64Array)[i] = (q / 3) * 1000)));
    return f;
  };

  it('a load spread evenly up to 99.5 kvar: every step stepCount allows, not a few coarse ones', () => {
    // Sized for 99.5 kvar in at most 8 steps: the catalogue's 8 × 12.5 kvar leave 99.5 − 7 × 12.5 = 12 kvar for the
    // last, above 0.67 × 12.5 = 8.4, so they close up to it: all eight.
    const needs = Array.from({ length: 200 }, (_, i) => 0.5 + i * 0.5);
    const { steps, fewerSteps } = sizeBankSteps(board, profile(needs), { ...options, delayShare: 0 });
    expect(steps.map((s) => s.kvar)).toEqual(Array(8).fill(12.5));
    expect(fewerSteps).toEqual({});
  });

  it('fewer steps than allowed where that many of the catalogue size cover the need, and why', () => {
    // 101 kvar at most, 8 steps: 101 / 8 = 12.6 rounds up to 15 kvar, of which 7 cover it (ceil(101 / 15)), and the
    // last closes (101 − 6 × 15 = 11 > 0.67 × 15 = 10.05).
    const needs = Array.from({ length: 202 }, (_, i) => 0.5 + i * 0.5);
    const { steps, fewerSteps, reaches } = sizeBankSteps(board, profile(needs), { ...options, delayShare: 0 });
    expect(reaches).toEqual({ ABC: true });
    expect(steps.map((s) => s.kvar)).toEqual(Array(7).fill(15));
    expect(fewerSteps).toEqual({ ABC: 'need-covered' });
  });

  it('a load switching on and off while the controller moves one step per delay: fewer, larger steps, and why', () => {
    // 20.7 kvar on, 0 off; a move every 1/30 of an interval. 3 × 7.5 kvar close up to it as one step does, but take
    // three delays to get there and three to leave (short, then leading, meanwhile): one step wins. At unity every
    // kvar past the need leads: 22.5 kvar by 1.8 kvar whenever on, 21 kvar (finer grid) by 0.3: 7.9 against 19.9
    // kvar-intervals short and leading in all, so the 21 kvar step.
    const needs = [0, 20.7, 20.7, 0, 20.7, 0, 0, 20.7, 20.7, 20.7, 0, 0, 0, 20.7, 20.7, 0];
    const { steps, fewerSteps } = sizeBankSteps(board, profile(needs), { ...options, stepCount: 6, coverShare: 0.95, delayShare: 1 / 30 });
    expect(steps.map((s) => s.kvar)).toEqual([21]);
    expect(fewerSteps).toEqual({ ABC: 'rehearsed' });
  });
});
