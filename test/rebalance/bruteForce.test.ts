/**
 * Exhaustive enumeration on small random boards (≤ 10 circuits, every option of
 * every circuit, scored by the test-side model in support/rebalanceBoards.ts):
 * - branch-and-bound's answer has the brute-force best score, with the fewest
 *   moves among the assignments that reach it;
 * - the local search's answer lies within its reported gap: its lower bound is
 *   at or below the true best and its score at most `gap` above it;
 * - the report's fast-model figures match the test-side figures of the chosen wiring.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError, normaliseBoard, parseBoard, rebalanceBoard, type BoardSpec, type ConnectionSpec, type RebalanceReport } from '@trivar/core';
import { boardFigures, enumerateAssignments, movesBetween, smallBoardArb, type Figures } from './support/rebalanceBoards.js';
import { expectClose } from '../support/tolerance.js';
import { FigureLog } from '../support/figureLog.js';

const figures = new FigureLog(new URL('./.brute-force-gaps.json', import.meta.url));
afterAll(() => figures.write());

interface Study {
  aim: { largestLine?: number; neutral?: number; currentUnbalance?: number };
  combine: 'worst' | 'weighted';
  moveLimit?: number;
  pinned: string[];
  lineCapacityA?: number;
  conditions: { name: string; weight: number; factor: number; circuits: Record<string, number> }[];
}

const studyArb = (spec: BoardSpec): fc.Arbitrary<Study> => {
  const names = spec.loads.map((l) => l.name);
  const threePhase = spec.supply.system !== 'split-phase';
  const hasNeutral = spec.supply.system !== 'three-phase-3wire';
  return fc.record({
    aim: fc.oneof(
      fc.constant({ largestLine: 1, ...(hasNeutral ? { neutral: 1 } : {}) }),
      fc.constant({ largestLine: 1 }),
      hasNeutral ? fc.constant({ neutral: 1 }) : fc.constant({ largestLine: 2 }),
      threePhase ? fc.constant({ currentUnbalance: 1, largestLine: 0.2 }) : fc.constant({ largestLine: 1 }),
    ),
    combine: fc.constantFrom<'worst' | 'weighted'>('worst', 'weighted'),
    moveLimit: fc.option(fc.integer({ min: 0, max: 4 }), { nil: undefined }),
    pinned: fc.subarray(names, { maxLength: 2 }),
    lineCapacityA: fc.constant(undefined),
    conditions: fc.array(
      fc.record({
        name: fc.constant(''),
        weight: fc.double({ min: 0.5, max: 3, noNaN: true }),
        factor: fc.double({ min: 0.2, max: 1, noNaN: true }),
        circuits: fc.dictionary(fc.constantFrom(...names), fc.double({ min: 0, max: 1, noNaN: true }), { maxKeys: 2 }),
      }),
      { minLength: 1, maxLength: 2 },
    ).map((cs) => cs.map((x, k) => ({ ...x, name: `condition ${k + 1}` }))),
  }) as unknown as fc.Arbitrary<Study>;
};

/** The study's score from test-side figures (the definition in the rebalance spec, restated). */
function scoreOf(study: Study, figures: readonly (Figures & { positive: number })[]): number {
  const per = figures.map((f) => {
    const w = study.aim;
    // With every circuit off (a condition may switch them all off) there is no unbalance to weigh; as in
    // the fast model, a positive-sequence current below 1e-12 A counts as 1e-12 A, so a condition scaled
    // to nothing (a factor of 1e-163) weighs no unbalance instead of the ratio of two round-off currents.
    const unbalance = w.currentUnbalance ? (w.currentUnbalance * 100 * f.negative) / Math.max(f.positive, 1e-12) : 0;
    return (w.largestLine ?? 0) * Math.max(...f.lines) + (w.neutral ?? 0) * f.neutral + unbalance;
  });
  if (study.combine === 'worst') return Math.max(...per);
  const total = study.conditions.reduce((s, c) => s + c.weight, 0);
  return per.reduce((s, x, k) => s + (study.conditions[k]!.weight * x) / total, 0);
}

function factorsOf(spec: BoardSpec, condition: Study['conditions'][number]): number[] {
  return spec.loads.map((l) => condition.circuits[l.name] ?? condition.factor);
}

/** |I1| on a three-phase board (same for every assignment): from Parseval, mean square = I0² + I1² + I2². */
function positiveOf(f: Figures): number {
  const meanSquare = f.lines.reduce((s, x) => s + x * x, 0) / f.lines.length;
  return Math.sqrt(Math.max(meanSquare - (f.neutral / 3) ** 2 - f.negative ** 2, 0));
}

interface BruteBest {
  score: number;
  moves: number;
  feasible: boolean;
}

function bruteForce(spec: BoardSpec, study: Study): BruteBest {
  const pins = new Map<number, ConnectionSpec>();
  study.pinned.forEach((name) => {
    const i = spec.loads.findIndex((l) => l.name === name);
    pins.set(i, spec.loads[i]!.connection);
  });
  const scores: { score: number; moves: number }[] = [];
  enumerateAssignments(spec, pins, (connections) => {
    const moves = movesBetween(spec, connections);
    if (study.moveLimit !== undefined && moves > study.moveLimit) return;
    const figures = study.conditions.map((c) => {
      const f = boardFigures(spec, connections, factorsOf(spec, c));
      return { ...f, positive: positiveOf(f) };
    });
    if (study.lineCapacityA !== undefined && figures.some((f) => f.lines.some((x) => x > study.lineCapacityA!))) return;
    scores.push({ score: scoreOf(study, figures), moves });
  });
  if (!scores.length) return { score: NaN, moves: NaN, feasible: false };
  const best = Math.min(...scores.map((s) => s.score));
  const tie = 1e-9 * Math.max(best, 1e-6);
  // The exact search counts scores within its tie tolerance as equal; give it the same slack.
  const fewest = Math.min(...scores.filter((s) => s.score <= best + 1e-12 * Math.max(best, 1)).map((s) => s.moves));
  return { score: best, moves: fewest, feasible: scores.some((s) => s.score <= best + tie) };
}

/**
 * Where no wiring keeps the capacity: the least overload over every wiring, ranked as the study ranks it (the
 * definition restated): the largest line current over the capacity, per unit of it, then those overs added, then
 * the score; with the fewest moves among the wirings that reach it (within the same tolerances).
 */
function bruteLeastOverload(spec: BoardSpec, study: Study & { lineCapacityA: number }): { largest: number; sum: number; score: number; moves: number } {
  const pins = new Map<number, ConnectionSpec>();
  study.pinned.forEach((name) => {
    const i = spec.loads.findIndex((l) => l.name === name);
    pins.set(i, spec.loads[i]!.connection);
  });
  const cap = study.lineCapacityA;
  const all: { largest: number; sum: number; score: number; moves: number }[] = [];
  enumerateAssignments(spec, pins, (connections) => {
    const moves = movesBetween(spec, connections);
    if (study.moveLimit !== undefined && moves > study.moveLimit) return;
    const figures = study.conditions.map((c) => {
      const f = boardFigures(spec, connections, factorsOf(spec, c));
      return { ...f, positive: positiveOf(f) };
    });
    const overs = figures.flatMap((f) => f.lines.map((x) => Math.max(0, x / cap - 1)));
    all.push({ largest: Math.max(...overs), sum: overs.reduce((t, x) => t + x, 0), score: scoreOf(study, figures), moves });
  });
  const tie = 1e-9;
  const largest = Math.min(...all.map((x) => x.largest));
  const atLargest = all.filter((x) => x.largest <= largest + tie);
  const sum = Math.min(...atLargest.map((x) => x.sum));
  const atSum = atLargest.filter((x) => x.sum <= sum + tie);
  const score = Math.min(...atSum.map((x) => x.score));
  const moves = Math.min(...atSum.filter((x) => x.score <= score + 1e-9 * Math.max(score, 1e-6)).map((x) => x.moves));
  return { largest, sum, score, moves };
}

function run(spec: BoardSpec, study: Study, method: 'exact' | 'local-search'): RebalanceReport {
  return rebalanceBoard(normaliseBoard(parseBoard(spec)), study, { method, moveTable: false, kicks: 20 });
}

const boardAndStudy = smallBoardArb(10).chain((spec) => studyArb(spec).map((study) => ({ spec, study })));

describe('rebalance: exhaustive enumeration on small boards', () => {
  it('branch-and-bound finds the brute-force best score with the fewest moves', () => {
    fc.assert(
      fc.property(boardAndStudy, ({ spec, study }) => {
        const brute = bruteForce(spec, study);
        const report = run(spec, study, 'exact');
        expect(report.proven).toBe(true);
        figures.note('exact vs brute force, |difference| / best', Math.abs(report.score.after - brute.score) / Math.max(brute.score, 1e-12));
        expectClose(report.score.after, brute.score, { rel: 1e-9, abs: 1e-9 }, 'best score');
        expect(report.moves.length).toBeLessThanOrEqual(brute.moves);
        // The fast-model figures of the chosen wiring, against the test-side model.
        const after = spec.loads.map((l) => report.moves.find((m) => m.name === l.name)?.to ?? l.connection);
        report.conditions.forEach((c, k) => {
          const f = boardFigures(spec, after, factorsOf(spec, study.conditions[k]!));
          const scale = Math.max(...f.lines, 1);
          c.model.after.lineA.forEach((x, n) => expectClose(x, f.lines[n]!, { rel: 1e-9, abs: 1e-9 * scale }, `line ${n}`));
          if (c.model.after.neutralA !== null) expectClose(c.model.after.neutralA, f.neutral, { rel: 1e-9, abs: 1e-9 * scale }, 'neutral');
        });
      }),
      { numRuns: 25 },
    );
  });

  it('the local search lies within its reported gap of the brute-force best', () => {
    fc.assert(
      fc.property(boardAndStudy, ({ spec, study }) => {
        const brute = bruteForce(spec, study);
        const report = run(spec, study, 'local-search');
        const slack = 1e-9 * Math.max(brute.score, 1);
        figures.note('local search vs brute force, (score - best) / best', (report.score.after - brute.score) / Math.max(brute.score, 1e-12));
        figures.note('local search: stated gap, % of its score', report.score.gapPercent ?? 0);
        expect(report.score.after).toBeGreaterThanOrEqual(brute.score - slack);
        expect(report.score.lowerBound).not.toBeNull();
        expect(report.score.lowerBound!).toBeLessThanOrEqual(brute.score + slack);
        expect(report.score.after - brute.score).toBeLessThanOrEqual(report.score.gap! + slack);
      }),
      { numRuns: 25 },
    );
  });

  it('a line capacity: the answer keeps within it exactly when some wiring does', () => {
    fc.assert(
      fc.property(boardAndStudy, fc.double({ min: 0.5, max: 1.2, noNaN: true }), ({ spec, study }, share) => {
        const home = boardFigures(spec, spec.loads.map((l) => l.connection));
        const capped = { ...study, lineCapacityA: share * Math.max(...home.lines) + 1e-3 };
        const brute = bruteForce(spec, capped);
        let report: RebalanceReport;
        try {
          report = run(spec, capped, 'exact');
        } catch (error) {
          // Refused up front only when the bound proves no wiring fits.
          expect(error).toBeInstanceOf(InputError);
          expect((error as InputError).issues[0]!.path).toBe('lineCapacityA');
          expect(brute.feasible).toBe(false);
          return;
        }
        if (brute.feasible) {
          expectClose(report.score.after, brute.score, { rel: 1e-9, abs: 1e-9 }, 'best score within capacity');
          report.conditions.forEach((c) => c.model.after.lineA.forEach((x) => expect(x).toBeLessThanOrEqual(capped.lineCapacityA * (1 + 1e-9))));
        } else {
          expect(report.notes.join(' ')).toMatch(/capacity/);
          // The least overload, proven by branch-and-bound, is the brute-force least, and so are the score and moves under it.
          const least = bruteLeastOverload(spec, capped);
          const overs = report.conditions.flatMap((c) => c.model.after.lineA.map((x) => Math.max(0, x / capped.lineCapacityA - 1)));
          expect(report.overload).toMatchObject({ within: false, proven: true });
          expectClose(Math.max(...overs), least.largest, { rel: 1e-9, abs: 1e-9 }, 'largest overload');
          expectClose(overs.reduce((t, x) => t + x, 0), least.sum, { rel: 1e-9, abs: 1e-9 }, 'overloads added');
          expectClose(report.score.after, least.score, { rel: 1e-9, abs: 1e-9 }, 'score at the least overload');
          expect(report.moves.length).toBeLessThanOrEqual(least.moves);
        }
      }),
      { numRuns: 25 },
    );
  });

  it('near-best under a capacity: the fewest moves within the share of the best score within it, or no effect where no wiring fits', () => {
    let applied = 0;
    let unused = 0;
    fc.assert(
      fc.property(boardAndStudy, fc.double({ min: 0.6, max: 1.1, noNaN: true }), fc.double({ min: 0, max: 15, noNaN: true }), ({ spec, study }, share, percent) => {
        const home = boardFigures(spec, spec.loads.map((l) => l.connection));
        const capped = { ...study, lineCapacityA: share * Math.max(...home.lines) + 1e-3 };
        let report: RebalanceReport;
        try {
          report = rebalanceBoard(normaliseBoard(parseBoard(spec)), { ...capped, nearBestPercent: percent }, { method: 'exact', kicks: 20 });
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
          return;
        }
        // Test-side: the best score within the capacity with at most m moves (pins stay, the move limit holds).
        const pins = new Map(capped.pinned.map((name) => {
          const i = spec.loads.findIndex((l) => l.name === name);
          return [i, spec.loads[i]!.connection] as const;
        }));
        const bestWithin = Array<number>(spec.loads.length + 1).fill(Infinity);
        enumerateAssignments(spec, pins, (connections) => {
          const moves = movesBetween(spec, connections);
          if (capped.moveLimit !== undefined && moves > capped.moveLimit) return;
          const figs = capped.conditions.map((c) => {
            const f = boardFigures(spec, connections, factorsOf(spec, c));
            return { ...f, positive: positiveOf(f) };
          });
          if (figs.some((f) => f.lines.some((x) => x > capped.lineCapacityA))) return;
          const score = scoreOf(capped, figs);
          for (let m = moves; m < bestWithin.length; m++) bestWithin[m] = Math.min(bestWithin[m]!, score);
        });
        const best = Math.min(...bestWithin);
        if (best === Infinity) {
          // No wiring fits: the rule ranks only answers within the capacity, so it chose nothing, and says so.
          unused++;
          expect(report.nearBest).toEqual({ percent, bestScore: null, applied: false });
          expect(report.notes.join(' ')).toContain('had no effect');
          return;
        }
        applied++;
        const target = best * (1 + percent / 100) + 1e-9 * Math.max(best, 1e-6);
        expect(report.nearBest!.applied).toBe(true);
        expectClose(report.nearBest!.bestScore!, best, { rel: 1e-9, abs: 1e-9 }, 'best score within the capacity');
        expect(report.moves.length).toBe(bestWithin.findIndex((s) => s <= target));
        expect(report.score.after).toBeLessThanOrEqual(target + 1e-9 * Math.max(best, 1));
        report.conditions.forEach((c) => c.model.after.lineA.forEach((x) => expect(x).toBeLessThanOrEqual(capped.lineCapacityA * (1 + 1e-9))));
      }),
      { numRuns: 30 },
    );
    figures.note('near-best under a capacity: runs with a wiring within (of 30)', applied);
    figures.note('near-best under a capacity: runs without any wiring within (of 30)', unused);
    expect(applied).toBeGreaterThan(0);
  });

  it('a capacity below every wiring but above the bound: the least overload with the fewest moves, as brute force finds it', () => {
    // Capacities between the polygon bound's (which refuses the study) and the best wiring's largest line: none fits.
    let infeasibleRuns = 0;
    fc.assert(
      fc.property(boardAndStudy, fc.double({ min: 0.9, max: 1, noNaN: true }), ({ spec, study }, share) => {
        const { moveLimit: _limited, ...free } = study;
        let best: RebalanceReport;
        try {
          best = run(spec, { ...free, aim: { largestLine: 1 }, combine: 'worst' }, 'exact');
        } catch {
          return;
        }
        const largest = Math.max(...best.conditions.flatMap((c) => c.model.after.lineA));
        const capped = { ...study, lineCapacityA: share * largest };
        let report: RebalanceReport;
        try {
          report = run(spec, capped, 'exact');
        } catch (error) {
          expect(error).toBeInstanceOf(InputError);
          return;
        }
        if (report.overload === null || report.overload.within) return;
        infeasibleRuns++;
        const least = bruteLeastOverload(spec, capped);
        const overs = report.conditions.flatMap((c) => c.model.after.lineA.map((x) => Math.max(0, x / capped.lineCapacityA - 1)));
        expect(report.overload.proven).toBe(true);
        expectClose(Math.max(...overs), least.largest, { rel: 1e-9, abs: 1e-9 }, 'largest overload');
        expectClose(overs.reduce((t, x) => t + x, 0), least.sum, { rel: 1e-9, abs: 1e-9 }, 'overloads added');
        expectClose(report.score.after, least.score, { rel: 1e-9, abs: 1e-9 }, 'score at the least overload');
        expect(report.moves.length).toBe(least.moves);
      }),
      { numRuns: 40 },
    );
    figures.note('capacity below every wiring: runs that reached the overload comparison (of 40)', infeasibleRuns);
    expect(infeasibleRuns).toBeGreaterThan(0);
  });
});
