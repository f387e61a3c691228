/**
 * The bound on the least largest loading (rebalance/loadingBound.ts) against exhaustive enumeration:
 * - on random assignment problems (complex contributions, limits, move limits, circuits that must move), the bound is
 *   at or below the least largest loading |q_j| / L_j of every assignment within the move limit (the lemma itself);
 * - on small random boards with a line capacity, through rebalanceBoard's local-search path (so the bound is not the
 *   exact search's proof), the reported bound is at or below the brute-force least largest loading, scored by the
 *   test-side model (support/rebalanceBoards.ts), and a bound above 100 % only where no wiring keeps the capacity;
 * - on a spread board its bound reaches the closed-form Parseval figure |I1| / L (METHODS: a spread load still
 *   draws |I1| per line), which is the least largest loading there.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError, normaliseBoard, parseBoard, rebalanceBoard, type BoardSpec, type ConnectionSpec } from '@trivar/core';
import { leastLoadingBound, LOADING_BOUND_STEPS } from '../../packages/core/src/rebalance/loadingBound.js';
import { MAX_OPTIONS, type AssignmentProblem } from '../../packages/core/src/rebalance/assignmentProblem.js';
import { sumOfLargest } from '../../packages/core/src/rebalance/assignmentBounds.js';
import { boardFigures, enumerateAssignments, movesBetween, smallBoardArb } from './support/rebalanceBoards.js';
import { expectClose } from '../support/tolerance.js';
import { FigureLog } from '../support/figureLog.js';

const figures = new FigureLog(new URL('./.loading-bound.json', import.meta.url));
afterAll(() => figures.write());

interface RawProblem {
  readonly optionCounts: number[];
  readonly home: number[];
  readonly base: number[];
  readonly contributions: number[][][];
  readonly limits: number[];
}

const problemArb: fc.Arbitrary<RawProblem> = fc
  .record({ circuits: fc.integer({ min: 1, max: 7 }), quantities: fc.integer({ min: 1, max: 4 }) })
  .chain(({ circuits, quantities }) =>
    fc.record({
      optionCounts: fc.array(fc.integer({ min: 1, max: 3 }), { minLength: circuits, maxLength: circuits }),
      homeDraw: fc.array(fc.integer({ min: -1, max: 2 }), { minLength: circuits, maxLength: circuits }),
      base: fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: 2 * quantities, maxLength: 2 * quantities }),
      contributions: fc.array(
        fc.array(fc.array(fc.double({ min: -40, max: 40, noNaN: true }), { minLength: 2 * quantities, maxLength: 2 * quantities }), { minLength: 3, maxLength: 3 }),
        { minLength: circuits, maxLength: circuits },
      ),
      limits: fc.array(fc.oneof(fc.double({ min: 1, max: 80, noNaN: true }), fc.constant(Infinity)), { minLength: quantities, maxLength: quantities }),
    }),
  )
  .map(({ optionCounts, homeDraw, base, contributions, limits }) => ({
    optionCounts,
    // A circuit that must move (home −1) has more than one option to move to.
    home: homeDraw.map((h, i) => (h < 0 && optionCounts[i]! > 1 ? -1 : Math.max(0, h) % optionCounts[i]!)),
    base,
    contributions,
    limits,
  }));

function problemOf(raw: RawProblem): AssignmentProblem {
  const n = raw.optionCounts.length;
  const q = raw.limits.length;
  const contributions = new Float64Array(n * MAX_OPTIONS * 2 * q);
  raw.contributions.forEach((options, i) => options.forEach((values, k) => contributions.set(values, (i * MAX_OPTIONS + k) * 2 * q)));
  return {
    circuitCount: n,
    quantityCount: q,
    optionCounts: Int32Array.from(raw.optionCounts),
    home: Int32Array.from(raw.home),
    base: Float64Array.from(raw.base),
    contributions,
    limits: Float64Array.from(raw.limits),
    score: () => 0,
  };
}

/** The least largest loading over every assignment with at most `moveLimit` moves (a circuit that must move counts one), by enumeration. */
function bruteLeastLoading(raw: RawProblem, moveLimit: number): { least: number; choice: number[] } | null {
  const n = raw.optionCounts.length;
  const q = raw.limits.length;
  let least = Infinity;
  let best: number[] = [];
  const choice = new Array<number>(n).fill(0);
  const walk = (i: number, moves: number) => {
    if (moves > moveLimit) return;
    if (i === n) {
      let largest = 0;
      for (let j = 0; j < q; j++) {
        if (!Number.isFinite(raw.limits[j]!)) continue;
        let re = raw.base[2 * j]!;
        let im = raw.base[2 * j + 1]!;
        choice.forEach((k, c) => {
          re += raw.contributions[c]![k]![2 * j]!;
          im += raw.contributions[c]![k]![2 * j + 1]!;
        });
        largest = Math.max(largest, Math.hypot(re, im) / raw.limits[j]!);
      }
      if (largest < least) {
        least = largest;
        best = [...choice];
      }
      return;
    }
    for (let k = 0; k < raw.optionCounts[i]!; k++) {
      choice[i] = k;
      walk(i + 1, moves + (k === raw.home[i] ? 0 : 1));
    }
  };
  walk(0, 0);
  return Number.isFinite(least) ? { least, choice: best } : null;
}

describe('the sum of the r largest savings (the move limit in every bound)', () => {
  it('equals the sum of the top r of the sorted values, for r below, at and above the short-list length', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 0, max: 100, noNaN: true }), { maxLength: 60 }), fc.integer({ min: -1, max: 40 }), (values, r) => {
        const expected = [...values].sort((a, b) => b - a).slice(0, Math.max(r, 0)).reduce((s, x) => s + x, 0);
        const got = sumOfLargest(Float64Array.from(values), values.length, r, new Float64Array(16));
        expectClose(got, expected, { rel: 1e-12, abs: 1e-9 }, `sum of the ${r} largest`);
      }),
      { numRuns: 300 },
    );
  });
});

describe('the least-loading bound against enumeration', () => {
  it('on random assignment problems: the bound is at or below the least largest loading within the move limit', () => {
    fc.assert(
      fc.property(problemArb, fc.integer({ min: 0, max: 7 }), (raw, moveLimit) => {
        const forced = raw.home.filter((h) => h < 0).length;
        const limit = Math.max(moveLimit, forced);
        const brute = bruteLeastLoading(raw, limit)!;
        const p = problemOf(raw);
        // The climb starts from an assignment that reaches a loading: the brute-force best, the hardest case for it.
        const bound = leastLoadingBound(p, limit, { steps: LOADING_BOUND_STEPS, reached: brute.least, choice: brute.choice });
        figures.note('random problems: (least − bound) / least', brute.least > 0 ? (brute.least - bound) / brute.least : 0);
        expect(bound).toBeGreaterThanOrEqual(0);
        expect(bound).toBeLessThanOrEqual(brute.least * (1 + 1e-9) + 1e-12);
      }),
      { numRuns: 300 },
    );
  });

  it('with every quantity unlimited there is nothing to bound: 0', () => {
    const raw: RawProblem = { optionCounts: [3], home: [0], base: [5, 0], contributions: [[[1, 0], [2, 0], [3, 0]]], limits: [Infinity] };
    expect(leastLoadingBound(problemOf(raw), 1, { steps: 10, reached: 1, choice: [0] })).toBe(0);
  });
});

/** Least largest line loading over every wiring within the move limit, test-side model. */
function bruteBoardLoading(spec: BoardSpec, capacityA: number, moveLimit: number | undefined): number {
  let least = Infinity;
  enumerateAssignments(spec, new Map<number, ConnectionSpec>(), (connections) => {
    if (moveLimit !== undefined && movesBetween(spec, connections) > moveLimit) return;
    least = Math.min(least, Math.max(...boardFigures(spec, connections).lines) / capacityA);
  });
  return least;
}

describe('rebalanceBoard states a valid bound on the least overload (local-search path)', () => {
  it('small random boards with a line capacity: bound ≤ brute-force least loading; over 100 % only where nothing keeps it', () => {
    fc.assert(
      fc.property(smallBoardArb(8), fc.double({ min: 0.3, max: 1.05, noNaN: true }), fc.option(fc.integer({ min: 0, max: 3 }), { nil: undefined }), (spec, share, moveLimit) => {
        const home = boardFigures(spec, spec.loads.map((l) => l.connection));
        const capacity = share * Math.max(...home.lines) + 1e-3;
        let report;
        try {
          report = rebalanceBoard(normaliseBoard(parseBoard(spec)), { lineCapacityA: capacity, aim: { largestLine: 1 }, ...(moveLimit === undefined ? {} : { moveLimit }) }, { method: 'local-search', moveTable: false, kicks: 20 });
        } catch (error) {
          // A capacity no spread of the circuits can meet whatever the moves is refused as a bad study.
          expect(error).toBeInstanceOf(InputError);
          expect((error as InputError).issues[0]!.code).toBe('capacity_unreachable');
          return;
        }
        const least = bruteBoardLoading(spec, capacity, moveLimit);
        const bound = report.overload?.bound ?? null;
        if (bound === null) return;
        figures.note('small boards: (least − bound) / least', (least - bound.leastPercent / 100) / least);
        expect(bound.leastPercent / 100).toBeLessThanOrEqual(least * (1 + 1e-9));
        expect(bound.answerPercent / 100).toBeGreaterThanOrEqual(least * (1 - 1e-9));
        if (bound.limitsUnreachable) expect(least).toBeGreaterThan(1);
      }),
      { numRuns: 60 },
    );
  });
});

describe('the bound on a spread board meets the closed-form Parseval figure', () => {
  it('30 equal 3 kW resistive circuits, lines rated 120 A: no wiring below |I1| / 120 A, and the bound says so', () => {
    // 30 × 3 kW = 90 kW at 230.94 V line to neutral: |I1| = 90000 / (3 · 230.94) = 129.9 A whatever the wiring.
    const v = 400 / Math.sqrt(3);
    const loads = Array.from({ length: 30 }, (_, i) => ({ name: `Kiln ${i + 1}`, connection: (['A-N', 'B-N', 'C-N'] as const)[i % 3], kW: 3, pf: 1 }));
    const spec = { name: 'Pottery kiln room', supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads } as BoardSpec;
    const report = rebalanceBoard(normaliseBoard(parseBoard(spec)), { lineCapacityA: 135 }, { method: 'local-search', moveTable: false });
    expect(report.overload).toBeNull();
    const rated = { ...spec, feeder: { line: { lengthM: 1, rOhmPerKm: 0.1, xOhmPerKm: 0.05, ratingA: 120 }, neutral: { lengthM: 1, rOhmPerKm: 0.1, xOhmPerKm: 0.05, ratingA: 120 } } } as BoardSpec;
    const over = rebalanceBoard(normaliseBoard(parseBoard(rated)), {}, { method: 'local-search', moveTable: false });
    const b = over.overload!.bound!;
    expectClose(b.answerPercent, (100 * 90000) / (3 * v) / 120, { rel: 1e-3, abs: 0 }, 'answer: 10 kilns per line');
    expectClose(b.leastPercent, (100 * 90000) / (3 * v) / 120, { rel: 1e-3, abs: 0 }, 'bound: |I1| / 120 A');
    expect(b.limitsUnreachable).toBe(true);
  });
});
