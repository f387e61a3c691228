/**
 * Rebalancing on installations (a main board and sub-boards in a radial tree):
 * - exhaustive enumeration over every board's circuits (test-side model: each
 *   incomer carries the sum of the boards under it): branch-and-bound reaches
 *   the brute-force best, for the score at every incomer, at the main incomer
 *   and at one sub-board;
 * - laws of every answer: pins hold (names repeat across boards, so pins name
 *   the board), two-pole circuits span two lines, the move limit holds, only the
 *   chosen boards' circuits move, the rewritten installation file re-solves to
 *   the reported currents at every board, and a proven best gets zero moves;
 * - with no supply or feeder impedance the fast model equals the network solver
 *   at every incomer (the composition up the tree is KCL);
 * - capacity: the least-exceeding answer with its statement, and the input errors;
 * - a custom objective sees one entry per condition and measured board.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  InputError,
  normaliseInstallation,
  parseInstallation,
  readBoardText,
  rebalanceInstallation,
  rewriteBoardText,
  solveInstallation,
  type ConditionFigures,
  type ConnectionSpec,
  type InstallationSpec,
  type RebalanceReport,
} from '@trivar/core';
import { boardsUnder, enumerateInstallation, incomerFigures, randomInstallation, smallInstallationArb } from './support/rebalanceInstallations.js';
import { expectClose } from '../support/tolerance.js';

const LINE_PAIRS = ['A-B', 'B-C', 'C-A'];

const model = (spec: InstallationSpec) => normaliseInstallation(parseInstallation(spec)).installation;
const run = (spec: InstallationSpec, study: unknown, method: 'exact' | 'local-search' = 'exact'): RebalanceReport =>
  rebalanceInstallation(model(spec), study, { method, kicks: 20, moveTable: false });

/** Test-side score: largest line + neutral (4-wire) at each measured incomer, added. */
function scoreOf(spec: InstallationSpec, connections: readonly (readonly ConnectionSpec[])[], measured: readonly number[]): number {
  const fourWire = spec.supply.system === 'three-phase-4wire';
  return measured.reduce((s, b) => {
    const f = incomerFigures(spec, connections, b);
    return s + Math.max(...f.lines) + (fourWire ? f.neutral : 0);
  }, 0);
}

const wiringAfter = (spec: InstallationSpec, report: RebalanceReport): ConnectionSpec[][] =>
  spec.boards.map((b) => b.loads.map((l, i) => report.moves.find((m) => m.board === b.name && m.listPosition === i + 1)?.to ?? l.connection));

const whereArb = fc.constantFrom<'each' | 'main' | 'sub'>('each', 'main', 'sub');
const measuredFor = (spec: InstallationSpec, where: 'each' | 'main' | 'sub') =>
  where === 'each' ? spec.boards.map((_, b) => b) : where === 'main' ? [0] : [spec.boards.length - 1];
const measureAt = (spec: InstallationSpec, where: 'each' | 'main' | 'sub') => (where === 'sub' ? spec.boards.at(-1)!.name : where);

describe('rebalance on installations: exhaustive enumeration', () => {
  it('branch-and-bound reaches the brute-force best wherever the score is measured', () => {
    fc.assert(
      fc.property(smallInstallationArb(9), whereArb, (spec, where) => {
        const measured = measuredFor(spec, where);
        let best = Infinity;
        enumerateInstallation(spec, new Set(spec.boards.map((_, b) => b)), (conn) => (best = Math.min(best, scoreOf(spec, conn, measured))));
        const report = run(spec, { measureAt: measureAt(spec, where) });
        expect(report.proven).toBe(true);
        const tol = { rel: 1e-9, abs: 1e-9 };
        expectClose(report.score.after, best, tol, 'exact score = brute-force best');
        expectClose(scoreOf(spec, wiringAfter(spec, report), measured), best, tol, 'the work order reaches it');
      }),
      { numRuns: 25 },
    );
  });

  it('the local search lies within its reported gap (the bound adds each incomer\'s own least term)', () => {
    fc.assert(
      fc.property(smallInstallationArb(9, true), fc.constantFrom<'each' | 'main' | 'sub'>('each', 'each', 'main'), fc.integer({ min: 0, max: 2 }), (spec, where, conditions) => {
        const study = {
          measureAt: measureAt(spec, where),
          combine: conditions === 2 ? 'weighted' : 'worst',
          ...(conditions > 0 ? { conditions: [{ name: 'full' }, { name: 'light', factor: 0.4, weight: 3 }] } : {}),
        };
        const exact = run(spec, study, 'exact');
        const local = run(spec, study, 'local-search');
        expect(exact.proven).toBe(true);
        const best = exact.score.after;
        const tol = 1e-9 * Math.max(best, 1);
        expect(local.score.lowerBound!).toBeLessThanOrEqual(best + tol);
        expect(local.score.after).toBeGreaterThanOrEqual(best - tol);
        expect(local.score.after - best).toBeLessThanOrEqual(local.score.gap! + tol);
      }),
      { numRuns: 30 },
    );
  });

  it('only the chosen board moves, and its answer is the best over that board alone', () => {
    fc.assert(
      fc.property(smallInstallationArb(12), (spec) => {
        const chosen = spec.boards.length - 1;
        let best = Infinity;
        enumerateInstallation(spec, new Set([chosen]), (conn) => (best = Math.min(best, scoreOf(spec, conn, [0]))));
        const report = run(spec, { boards: [spec.boards[chosen]!.name], measureAt: 'main' });
        for (const m of report.moves) expect(m.board).toBe(spec.boards[chosen]!.name);
        expectClose(report.score.after, best, { rel: 1e-9, abs: 1e-9 }, 'best over the chosen board');
      }),
      { numRuns: 20 },
    );
  });
});

describe('rebalance on installations: laws of every answer', () => {
  it('pins hold, two-pole circuits span two lines, the move limit holds', () => {
    fc.assert(
      fc.property(smallInstallationArb(14, true), fc.constantFrom<'exact' | 'local-search'>('exact', 'local-search'), fc.integer({ min: 0, max: 4 }), (spec, method, moveLimit) => {
        // "Circuit 1" is on every board: a pin must name its board.
        const pinned = spec.boards.map((b) => ({ circuit: b.loads[0]!.name, board: b.name }));
        const report = run(spec, { pinned, moveLimit }, method);
        expect(report.moves.length).toBeLessThanOrEqual(moveLimit);
        for (const pin of pinned) expect(report.moves.some((m) => m.board === pin.board && m.name === pin.circuit)).toBe(false);
        const after = wiringAfter(spec, report);
        spec.boards.forEach((b, bi) =>
          b.loads.forEach((l, i) => {
            if (!LINE_PAIRS.includes(l.connection)) return;
            const [x, y] = after[bi]![i]!.split('-');
            expect(LINE_PAIRS).toContain(after[bi]![i]);
            expect(x).not.toBe(y);
          }),
        );
        for (const m of report.moves) expect(spec.boards.find((b) => b.name === m.board)!.loads[m.listPosition - 1]!.name).toBe(m.name);
      }),
      { numRuns: 25 },
    );
  });

  it('the rewritten installation file re-solves to the reported currents at every board; a proven best gets zero moves', () => {
    fc.assert(
      fc.property(smallInstallationArb(12, true), (spec) => {
        const report = run(spec, {});
        const written = rewriteBoardText(JSON.stringify(spec), report.moves);
        const solved = solveInstallation(readBoardText(written));
        for (const c of report.conditions) {
          const board = solved.boards.find((b) => b.name === c.board)!.result;
          const scale = Math.max(...c.solved.after.lineA, 1);
          board.phases.forEach((p, k) => expectClose(p.current.magnitude, c.solved.after.lineA[k]!, { rel: 1e-9, abs: 1e-9 * scale }, `${c.board} line ${p.phase}`));
          if (c.solved.after.neutralA !== null) expectClose(board.neutral!.current.magnitude, c.solved.after.neutralA, { rel: 1e-9, abs: 1e-9 * scale }, `${c.board} neutral`);
        }
        const again = run(JSON.parse(written) as InstallationSpec, {});
        expect(again.proven).toBe(true);
        expect(again.moves).toEqual([]);
      }),
      { numRuns: 15 },
    );
  });

  it('with no supply or feeder impedance the fast model equals the network solver at every incomer', () => {
    fc.assert(
      fc.property(smallInstallationArb(12), (spec) => {
        const report = run(spec, { measureAt: 'each' });
        expect(report.conditions.map((c) => c.board)).toEqual(spec.boards.map((b) => b.name));
        for (const c of report.conditions)
          for (const side of ['before', 'after'] as const) {
            const scale = Math.max(...c.solved[side].lineA, 1);
            c.model[side].lineA.forEach((x, k) => expectClose(x, c.solved[side].lineA[k]!, { rel: 1e-7, abs: 1e-7 * scale }, `${c.board} line ${k}`));
          }
        // And the test-side composition agrees with the model at each incomer.
        report.conditions.forEach((c) => {
          const b = spec.boards.findIndex((x) => x.name === c.board);
          const f = incomerFigures(spec, wiringAfter(spec, report), b);
          f.lines.forEach((x, k) => expectClose(c.model.after.lineA[k]!, x, { rel: 1e-9, abs: 1e-9 * Math.max(...f.lines, 1) }, `${c.board} line ${k} (test side)`));
          expect(boardsUnder(spec, b)).toContain(b);
        });
      }),
      { numRuns: 15 },
    );
  });
});

describe('rebalance on installations: capacity and custom objectives', () => {
  const riser = randomInstallation({ system: 'three-phase-4wire', circuits: [4, 6, 6], parents: [0, 1], impedance: true, seed: 5 });

  it('a capacity the move limit cannot meet gives the least-exceeding answer and says which line is over by how much', () => {
    const aim = { largestLine: 1 };
    const largest = (r: RebalanceReport) => Math.max(...r.conditions[0]!.model.after.lineA);
    const oneMove = largest(run(riser, { aim, measureAt: 'main', moveLimit: 1 }));
    const anyMoves = largest(run(riser, { aim, measureAt: 'main' }));
    expect(oneMove).toBeGreaterThan(anyMoves + 1);
    // Reachable with enough moves, proven out of reach with one.
    const cap = (oneMove + anyMoves) / 2;
    const limited = run(riser, { aim, measureAt: 'main', moveLimit: 1, lineCapacityA: cap });
    expect(limited.capacityExceeded.length).toBeGreaterThan(0);
    const worst = limited.capacityExceeded[0]!;
    expect(worst.board).toBe('Main board');
    expectClose(worst.overA, worst.currentA - cap, { rel: 1e-12, abs: 1e-12 }, 'excess');
    const note = limited.notes.find((n) => n.startsWith('No assignment'))!;
    expect(note).toContain('with at most 1 move keeps every line within its capacity (proven by the lower bound)');
    // The note quotes the network re-solve's current, as the before-and-after table does (the excess itself is the fast model's).
    const solvedA = limited.conditions.find((c) => c.board === 'Main board')!.solved.after.lineA['ABC'.indexOf(worst.line!)]!;
    expect(solvedA).toBeGreaterThan(cap);
    expect(note).toContain(`line ${worst.line} at "Main board" in "as rated" carries ${solvedA.toFixed(1)} A, ${(solvedA - cap).toFixed(1)} A over its ${cap.toFixed(0)} A capacity`);
    // Least exceeding: the one-move answer with the smallest largest line exceeds no less.
    const overOf = (r: RebalanceReport) => r.conditions[0]!.model.after.lineA.reduce((s, a) => s + Math.max(a - cap, 0), 0);
    expect(overOf(limited)).toBeLessThanOrEqual(overOf(run(riser, { aim, measureAt: 'main', moveLimit: 1 })) + 1e-9);
    const unlimited = run(riser, { aim, measureAt: 'main', lineCapacityA: cap });
    expect(unlimited.capacityExceeded).toEqual([]);
    expect(largest(unlimited)).toBeLessThanOrEqual(cap + 1e-9);
  });

  it('capacity below the pinned load, or below the perfectly spread load, is an input error naming the field', () => {
    const pinnedAll = riser.boards.flatMap((b) => b.loads.map((l) => ({ circuit: l.name, board: b.name })));
    const fixed = run(riser, { measureAt: 'main', pinned: pinnedAll });
    const present = Math.max(...fixed.conditions[0]!.model.before.lineA);
    const attempt = (study: unknown) => {
      try {
        run(riser, study);
      } catch (error) {
        expect(error).toBeInstanceOf(InputError);
        return (error as InputError).issues[0]!;
      }
      throw new Error('expected an InputError');
    };
    const pinnedIssue = attempt({ measureAt: 'main', pinned: pinnedAll, lineCapacityA: present * 0.9 });
    expect(pinnedIssue).toMatchObject({ code: 'capacity_unreachable', path: 'lineCapacityA' });
    expect(pinnedIssue.message).toMatch(/circuits that cannot move draw/);
    const spreadIssue = attempt({ measureAt: 'main', lineCapacityA: 1 });
    expect(spreadIssue.message).toMatch(/^lineCapacityA: expected a capacity of at least [\d.]+ A on some line in "as rated": spread perfectly/);
  });

  it('names repeat across boards: a bare ambiguous pin or an unknown board is an input error', () => {
    expect(() => run(riser, { pinned: ['Circuit 1'] })).toThrow(/pinned\[0\]: expected one circuit: "Circuit 1" is on boards Main board, Board 1, Board 2; name the board too/);
    expect(() => run(riser, { boards: ['Board 9'] })).toThrow(/boards\[0\]: expected one of "Main board", "Board 1", "Board 2"/);
    expect(() => run(riser, { measureAt: 'Basement' })).toThrow(/measureAt: expected "each", "main" or a board name/);
    expect(() => run(riser, { conditions: [{ name: 'night', circuits: { 'Board 1/Circuit 2': 0.5, 'Circuit 9': 1 } }] })).toThrow(/conditions\[0\]\.circuits\.Circuit 9/);
  });

  it('a custom objective sees one entry per condition and measured board, and is proven', () => {
    const seen: string[][] = [];
    // The neutral of the most loaded sub-board feeder, squared, plus the main incomer's largest line.
    const objective = (figures: readonly ConditionFigures[]) => {
      if (seen.length === 0) seen.push(figures.map((f) => `${f.name}@${f.board}`));
      const main = figures.find((f) => f.board === 'Main board')!;
      return main.largestLineA + Math.max(...figures.filter((f) => f.board !== 'Main board').map((f) => f.neutralA ?? 0)) ** 2;
    };
    const report = rebalanceInstallation(model(riser), { conditions: [{ name: 'day' }, { name: 'night', factor: 0.3 }] }, { objective, method: 'exact', moveTable: false });
    expect(seen[0]).toEqual(['day@Main board', 'day@Board 1', 'day@Board 2', 'night@Main board', 'night@Board 1', 'night@Board 2']);
    expect(report.aim).toBe('custom');
    expect(report.proven).toBe(true);
    expect(report.score.after).toBeLessThanOrEqual(report.score.before);
    const recomputed = objective(report.conditions.map((c) => c.model.after));
    expectClose(report.score.after, recomputed, { rel: 1e-9, abs: 1e-9 }, 'custom score of the answer');
  });

  it('voltage unbalance at a sub-board: the fast model (drop of every feeder on the path) tracks the network solver', () => {
    const text = readFileSync(new URL('../../examples/maple-court-riser.yaml', import.meta.url), 'utf8');
    const spec = parseInstallation(readBoardText(text));
    const report = rebalanceInstallation(normaliseInstallation(spec).installation, { aim: { voltageUnbalance: 1 }, measureAt: 'Floor 4', moveLimit: 3 }, { moveTable: false });
    const c = report.conditions[0]!;
    expect(c.board).toBe('Floor 4');
    // Nominal-voltage currents against the solved ones: agreement to 0.05 percentage points (a first-order model).
    for (const side of ['before', 'after'] as const)
      expectClose(c.model[side].voltageUnbalancePercent!, c.solved[side].voltageUnbalancePercent!, { rel: 0, abs: 0.05 }, `|V2|/|V1| ${side}`);
    expect(c.solved.after.voltageUnbalancePercent!).toBeLessThan(0.25 * c.solved.before.voltageUnbalancePercent!);
  });
});
