/**
 * `trivar rebalance` on a board whose load no arrangement carries within its feeder's ratings (built binary): the
 * local-search answer over a limit is stated with a lower bound on the least largest loading (rebalance/loadingBound.ts).
 * Invented board: a boatyard of 24 single-phase circuits, 58.5 kW, on a 400 V feeder rated 80 A.
 *
 * Checks from outside the search: the Parseval figure (a spread load still draws |I1| on every line, METHODS) puts every
 * arrangement at or above |I1| over the largest line limit; with at most 3 moves (17 345 wirings) exhaustive enumeration
 * in the test-side model (test/rebalance/support/rebalanceBoards.ts) gives the least largest loading itself.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseBoard, readBoardText, type RebalanceReport } from '@trivar/core';
import { runTrivar } from './runTrivar.js';
import { boardFigures, circuitOptions, lineCurrents } from '../rebalance/support/rebalanceBoards.js';
import type { ConnectionSpec } from '@trivar/core';
import { cAbs, cPolarDeg, cSum } from '../support/complexMath.js';
import { expectClose } from '../support/tolerance.js';

const boatyard = `name: Gull Point boatyard
supply:
  system: three-phase-4wire
  voltage: { lineToLine: 400 }
  frequencyHz: 50
feeder:
  line: { lengthM: 25, rOhmPerKm: 0.32, xOhmPerKm: 0.08, ratingA: 80 }
  neutral: { lengthM: 25, rOhmPerKm: 0.32, xOhmPerKm: 0.08, ratingA: 80 }
loads:
  - { name: Hull dryer 1, connection: L1-N, kW: 4.2, pf: 1 }
  - { name: Hull dryer 2, connection: L1-N, kW: 4.2, pf: 1 }
  - { name: Resin oven, connection: L1-N, kW: 3.6, pf: 1 }
  - { name: Compressor, connection: L1-N, kW: 3.0, pf: 0.82 }
  - { name: Sander bank, connection: L1-N, kW: 2.4, pf: 0.88 }
  - { name: Mast crane, connection: L1-N, kW: 2.8, pf: 0.8 }
  - { name: Berth 1 charger, connection: L1-N, kW: 2.3, pf: 0.97 }
  - { name: Berth 2 charger, connection: L1-N, kW: 2.3, pf: 0.97 }
  - { name: Berth 3 charger, connection: L2-N, kW: 2.3, pf: 0.97 }
  - { name: Berth 4 charger, connection: L2-N, kW: 2.3, pf: 0.97 }
  - { name: Berth 5 charger, connection: L2-N, kW: 2.3, pf: 0.97 }
  - { name: Berth 6 charger, connection: L1-N, kW: 2.3, pf: 0.97 }
  - { name: Paint booth fan, connection: L2-N, kW: 1.8, pf: 0.85 }
  - { name: Paint booth heat, connection: L1-N, kW: 3.2, pf: 1 }
  - { name: Office, connection: L2-N, kW: 1.5, pf: 0.95 }
  - { name: Canteen, connection: L3-N, kW: 2.9, pf: 0.99 }
  - { name: Yard lights, connection: L3-N, kW: 1.2, pf: 0.93 }
  - { name: Slipway winch, connection: L1-N, kW: 2.6, pf: 0.8 }
  - { name: Welding outlet, connection: L2-N, kW: 2.0, pf: 0.75 }
  - { name: Chandlery, connection: L3-N, kW: 1.4, pf: 0.96 }
  - { name: Sail loft, connection: L1-N, kW: 1.1, pf: 0.95 }
  - { name: Wash-down pump, connection: L1-N, kW: 1.9, pf: 0.83 }
  - { name: Bilge heaters, connection: L2-N, kW: 2.2, pf: 1 }
  - { name: Drying room, connection: L1-N, kW: 2.7, pf: 1 }
`;

const dir = mkdtempSync(join(tmpdir(), 'trivar-overlimit-'));
const file = join(dir, 'boatyard.yaml');
writeFileSync(file, boatyard);
const spec = parseBoard(readBoardText(boatyard));
const flat = (text: string) => text.replace(/\s+/g, ' ');

function rebalanceJson(args: readonly string[]): RebalanceReport {
  const r = runTrivar(['rebalance', file, '--json', '--no-table', ...args]);
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.stdout) as RebalanceReport;
}

/**
 * The 80 A rating in the fast model: scaled by how far the fast model reads the present wiring's line currents,
 * added, above or below their network re-solve (buildAssignmentProblem.ts modelOverSolved), read off the report's own
 * figures; one scale for every conductor of the board.
 */
const ratingInModel = (r: RebalanceReport) => {
  const c = r.conditions[0]!;
  const sum = (xs: readonly number[]) => xs.reduce((t, x) => t + x, 0);
  return (80 * sum(c.model.before.lineA)) / sum(c.solved.before.lineA);
};
const lineLimits = (r: RebalanceReport) => [0, 1, 2].map(() => ratingInModel(r));

/** The bound's figure as the report states it: rounded down at its decimals. */
const shownBound = (b: NonNullable<NonNullable<RebalanceReport['overload']>['bound']>) =>
  (Math.floor(b.leastPercent * 10 ** b.decimals + 1e-9) / 10 ** b.decimals).toFixed(b.decimals);

/** Every wiring with at most `limit` circuits moved from where they are (Σ C(24, k)·2^k for k ≤ 3: 17 345 of them). */
function wiringsWithin(limit: number, visit: (connections: readonly ConnectionSpec[]) => void): void {
  const current = spec.loads.map((l) => l.connection);
  const walk = (from: number, left: number) => {
    visit(current);
    if (left === 0) return;
    for (let i = from; i < current.length; i++) {
      const home = spec.loads[i]!.connection;
      for (const to of circuitOptions(spec, i)) {
        if (to === home) continue;
        current[i] = to;
        walk(i + 1, left - 1);
      }
      current[i] = home;
    }
  };
  walk(0, limit);
}

describe('trivar rebalance over the ratings on a 24-circuit board (local search)', () => {
  it('the bound proves no arrangement keeps the 80 A ratings: at or above the Parseval figure, at or below the answer', () => {
    const r = rebalanceJson([]);
    expect(r.method).toBe('local-search');
    expect(r.proven).toBe(false);
    const b = r.overload!.bound!;
    expect(b.limitsUnreachable).toBe(true);
    // |I1| = |Σ S*| / (3 · 230.94 V): the same on every line however the circuits are spread (stiff nominal voltages).
    const s = cSum(spec.loads.map((l) => cPolarDeg((l.kW! * 1000) / l.pf!, (Math.acos(l.pf!) * 180) / Math.PI)));
    const i1 = cAbs(s) / (3 * (400 / Math.sqrt(3)));
    // By hand: ΣP = 58.5 kW, ΣQ = 17.2 kvar (P·tan φ of each circuit), |S| = 61.0 kVA, / (√3 · 400 V) = 88.0 A.
    expectClose(i1, 88.0, { rel: 0, abs: 0.05 }, '|I1| by hand');
    const parseval = (100 * i1) / Math.max(...lineLimits(r));
    expect(b.leastPercent).toBeGreaterThanOrEqual(parseval - 1e-6);
    expect(b.leastPercent).toBeLessThanOrEqual(b.answerPercent);
    // The answer's own figure, recomputed test-side from the work order.
    const after = spec.loads.map((l) => r.moves.find((m) => m.name === l.name)?.to ?? l.connection);
    const lines = boardFigures(spec, after).lines;
    expectClose(b.answerPercent, 100 * Math.max(...lines.map((a, k) => a / lineLimits(r)[k]!)), { rel: 1e-9, abs: 0 }, 'answer loading, test-side model');
  });

  it('the text verdict states the proof with both figures, the note agrees, and nothing says "not proven"', () => {
    const json = rebalanceJson([]);
    const b = json.overload!.bound!;
    const r = runTrivar(['rebalance', file, '--no-table']);
    expect(r.code).toBe(0);
    const text = flat(r.stdout);
    expect(text).toContain(
      `no arrangement keeps every limit (proven by a lower bound: in the fast model none has its largest loading below ${shownBound(b)} %, this answer ${b.answerPercent.toFixed(b.decimals)} %)`,
    );
    expect(Number(shownBound(b))).toBeGreaterThan(100);
    expect(Number(shownBound(b))).toBeLessThan(Number(b.answerPercent.toFixed(b.decimals)));
    expect(text).toContain('Every arrangement leaves something over its rating (proven by a lower bound)');
    expect(text).not.toContain('not proven');
    expect(text).toContain('qualified electrician');
  });

  it('with at most 3 moves: the bound meets the enumerated least largest loading, and the verdict calls it proven', () => {
    const r = rebalanceJson(['--move-limit', '3']);
    const limits = lineLimits(r);
    let count = 0;
    wiringsWithin(3, () => count++);
    expect(count).toBe(1 + 24 * 2 + 276 * 4 + 2024 * 8);
    let least = Infinity;
    wiringsWithin(3, (connections) => {
      const lines = lineCurrents(spec, connections).map(cAbs);
      const neutral = cAbs(cSum(lineCurrents(spec, connections)));
      // The neutral is rated 80 A too, scaled alike.
      least = Math.min(least, Math.max(...lines.map((a, k) => a / limits[k]!), neutral / ratingInModel(r)));
    });
    const b = r.overload!.bound!;
    expectClose(b.answerPercent, 100 * least, { rel: 1e-9, abs: 0 }, 'the answer is the enumerated least');
    expect(b.leastPercent).toBeLessThanOrEqual(100 * least * (1 + 1e-9));
    expect(b.answerLeast).toBe(true);
    const text = flat(runTrivar(['rebalance', file, '--no-table', '--move-limit', '3']).stdout);
    expect(text).toContain(`no arrangement with at most 3 moves has a lower largest loading (proven by a lower bound: ${b.answerPercent.toFixed(b.decimals)} % in the fast model)`);
    expect(text).not.toContain('not proven');
  });
});
