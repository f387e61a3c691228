/**
 * Laws of every rebalancing answer, over random boards (fast-check):
 * - a pinned circuit never moves (a circuit pinned to a connection ends on it);
 * - a two-pole circuit always sits across two distinct lines;
 * - the move limit holds, for the exact search and the local search alike;
 * - the rewritten board file, solved by the network solver, reproduces the
 *   reported after-currents;
 * - a board already wired as the proven best gets zero moves;
 * - on a stiff supply (no source or feeder impedance) with constant-power
 *   circuits the fast model and the network solver agree;
 * - the move table never gets worse with more moves allowed, and fewest-moves
 *   mode picks its first row within the asked % of the best.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  normaliseBoard,
  parseBoard,
  readBoardText,
  rebalanceBoard,
  rewriteBoardText,
  solveBoard,
  type BoardSpec,
  type RebalanceReport,
} from '@trivar/core';
import { randomBoard, seeded, smallBoardArb } from './support/rebalanceBoards.js';
import { expectClose } from '../support/tolerance.js';

const LINE_PAIRS = ['A-B', 'B-C', 'C-A'];

const caseArb = fc.record({
  spec: smallBoardArb(12),
  method: fc.constantFrom<'exact' | 'local-search'>('exact', 'local-search'),
  moveLimit: fc.option(fc.integer({ min: 0, max: 5 }), { nil: undefined }),
  pinCount: fc.integer({ min: 0, max: 3 }),
  pinTo: fc.boolean(),
});

function studyFor(spec: BoardSpec, moveLimit: number | undefined, pinCount: number, pinTo: boolean) {
  const pinned = spec.loads.slice(0, pinCount).map((l, k) => {
    // Every other pin names the connection the circuit must end on (a forced move when it differs).
    if (!pinTo || k % 2 === 1 || !l.connection.endsWith('-N')) return l.name;
    return { circuit: l.name, on: spec.supply.system === 'split-phase' ? 'B-N' : 'C-N' };
  });
  const forced = pinned.filter((p) => typeof p !== 'string' && spec.loads.find((l) => l.name === p.circuit)!.connection !== p.on).length;
  return { pinned, ...(moveLimit !== undefined ? { moveLimit: Math.max(moveLimit, forced) } : {}) };
}

const run = (spec: BoardSpec, study: unknown, method: 'exact' | 'local-search' = 'exact'): RebalanceReport =>
  rebalanceBoard(normaliseBoard(parseBoard(spec)), study, { method, kicks: 20 });

describe('rebalance: laws of every answer', () => {
  it('pins hold, two-pole circuits span two lines, the move limit holds', () => {
    fc.assert(
      fc.property(caseArb, ({ spec, method, moveLimit, pinCount, pinTo }) => {
        const study = studyFor(spec, moveLimit, pinCount, pinTo);
        const report = run(spec, study, method);
        const after = new Map(spec.loads.map((l) => [l.name, l.connection as string]));
        for (const m of report.moves) after.set(m.name, m.to);
        for (const pin of study.pinned) {
          if (typeof pin === 'string') expect(report.moves.map((m) => m.name)).not.toContain(pin);
          else expect(after.get(pin.circuit)).toBe(pin.on);
        }
        spec.loads.forEach((l) => {
          if (LINE_PAIRS.includes(l.connection)) {
            const to = after.get(l.name)!;
            expect(LINE_PAIRS).toContain(to);
            const [a, b] = to.split('-');
            expect(a).not.toBe(b);
          }
        });
        if (study.moveLimit !== undefined) expect(report.moves.length).toBeLessThanOrEqual(study.moveLimit);
        // Moves are real moves, numbered as in the file.
        for (const m of report.moves) {
          expect(m.from).not.toBe(m.to);
          expect(spec.loads[m.listPosition - 1]!.name).toBe(m.name);
        }
      }),
      { numRuns: 30 },
    );
  });

  it('the rewritten board re-solves to the reported currents, and a proven best board gets zero moves', () => {
    fc.assert(
      fc.property(smallBoardArb(12), (spec) => {
        const report = run(spec, {});
        const written = rewriteBoardText(JSON.stringify(spec), report.moves);
        const solved = solveBoard(readBoardText(written));
        const reported = report.conditions[0]!.solved.after;
        const scale = Math.max(...reported.lineA, 1);
        solved.phases.forEach((p, k) => expectClose(p.current.magnitude, reported.lineA[k]!, { rel: 1e-9, abs: 1e-9 * scale }, `line ${p.phase}`));
        if (reported.neutralA !== null) expectClose(solved.neutral!.current.magnitude, reported.neutralA, { rel: 1e-9, abs: 1e-9 * scale }, 'neutral');
        const again = run(JSON.parse(written) as BoardSpec, {});
        expect(again.proven).toBe(true);
        expect(again.moves).toEqual([]);
        expectClose(again.score.after, report.score.after, { rel: 1e-9, abs: 1e-12 }, 'same best score');
      }),
      { numRuns: 30 },
    );
  });

  it('on a stiff supply the fast model and the network solver agree', () => {
    fc.assert(
      fc.property(smallBoardArb(12), (spec) => {
        const report = run(spec, {});
        for (const c of report.conditions)
          for (const side of ['before', 'after'] as const) {
            const scale = Math.max(...c.solved[side].lineA, 1);
            c.model[side].lineA.forEach((x, k) => expectClose(x, c.solved[side].lineA[k]!, { rel: 1e-7, abs: 1e-7 * scale }, `line ${k}`));
          }
      }),
      { numRuns: 20 },
    );
  });

  it('the move table never gets worse with more moves; fewest-moves mode takes the first row near the best', () => {
    fc.assert(
      fc.property(smallBoardArb(11), fc.double({ min: 0, max: 20, noNaN: true }), (spec, percent) => {
        const report = run(spec, { nearBestPercent: percent });
        const table = report.moveTable!;
        for (let k = 1; k < table.length; k++) expect(table[k]!.score).toBeLessThanOrEqual(table[k - 1]!.score * (1 + 1e-12) + 1e-12);
        const best = Math.min(...table.map((r) => r.score));
        const first = table.find((r) => r.score <= best * (1 + percent / 100) + 1e-9 * Math.max(best, 1e-6))!;
        expect(report.moves.length).toBeLessThanOrEqual(first.moves);
        expect(report.score.after).toBeLessThanOrEqual(best * (1 + percent / 100) + 1e-9 * Math.max(best, 1));
      }),
      { numRuns: 20 },
    );
  });

  it('a custom objective: the library scores with it and proves it on a small board', () => {
    const spec = randomBoard({ system: 'three-phase-4wire', circuits: 9 }, seeded(7));
    // Neutral current squared plus the spread of the line currents: grows with every figure it reads.
    const objective = (conditions: readonly { lineA: readonly number[]; neutralA: number | null }[]) =>
      conditions.reduce((s, c) => s + (c.neutralA ?? 0) ** 2 + Math.max(...c.lineA), 0);
    const report = rebalanceBoard(normaliseBoard(parseBoard(spec)), {}, { objective, method: 'exact' });
    expect(report.aim).toBe('custom');
    expect(report.proven).toBe(true);
    const a = report.conditions[0]!.model.after;
    expectClose(report.score.after, a.neutralA! ** 2 + Math.max(...a.lineA), { rel: 1e-9, abs: 1e-9 }, 'custom score of the answer');
    expect(report.score.after).toBeLessThanOrEqual(report.score.before);
  });
});
