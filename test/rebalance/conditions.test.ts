/**
 * Load conditions from the board file's profile scenarios: each scenario is one
 * condition, weighted by its hours, with groups expanded and unnamed loads at
 * `others`. The fast-model figures of every condition are checked against the
 * test-side model with the same per-circuit fractions; the weighted and
 * worst-case combinations against their definitions.
 */
import { describe, expect, it } from 'vitest';
import { conditionsFromScenarios, normaliseBoard, parseBoard, rebalanceBoard, type BoardSpec, type ConnectionSpec } from '@trivar/core';
import { boardFigures } from './support/rebalanceBoards.js';
import { expectClose } from '../support/tolerance.js';

/** An invented bakery-and-flats board with day and night states. */
const board: BoardSpec = {
  name: 'Linden Yard',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'Oven', connection: 'A-N', kW: 9, pf: 1 },
    { name: 'Proofer', connection: 'A-N', kW: 2.5, pf: 0.9 },
    { name: 'Flat 1', connection: 'B-N', kW: 5, pf: 0.95 },
    { name: 'Flat 2', connection: 'B-N', kW: 4.2, pf: 0.96 },
    { name: 'Flat 3', connection: 'C-N', kW: 3.1, pf: 0.97 },
    { name: 'Roof PV', connection: 'C-N', kW: -6, pf: 1 },
    { name: 'Chiller', connection: 'ABC-delta', kW: 7, pf: 0.82 },
  ],
  profile: {
    groups: { flats: ['Flat 1', 'Flat 2', 'Flat 3'] },
    scenarios: [
      { name: 'baking', hours: 1800, loads: { Oven: 1, Proofer: 1, Chiller: 0.6 }, others: 0.1 },
      { name: 'sunny noon', hours: 1200, loads: { 'Roof PV': 0.9, flats: 0.2, Chiller: 0.8 } },
      { name: 'evening', hours: 2400, loads: { flats: 0.9, Chiller: 0.3 } },
    ],
  },
};

const fractions = (scenario: number): number[] => {
  const s = board.profile!.scenarios![scenario]!;
  const named: Record<string, number> = {};
  for (const [name, f] of Object.entries(s.loads)) for (const m of board.profile!.groups![name] ?? [name]) named[m] = f;
  return board.loads.map((l) => named[l.name] ?? s.others ?? 0);
};

describe('rebalance: profile scenarios as load conditions', () => {
  const model = normaliseBoard(parseBoard(board));

  it('one condition per scenario, weighted by its hours, groups expanded, the rest at "others"', () => {
    expect(conditionsFromScenarios(board.profile!)).toEqual([
      { name: 'baking', weight: 1800, factor: 0.1, circuits: { Oven: 1, Proofer: 1, Chiller: 0.6 } },
      { name: 'sunny noon', weight: 1200, factor: 0, circuits: { 'Roof PV': 0.9, 'Flat 1': 0.2, 'Flat 2': 0.2, 'Flat 3': 0.2, Chiller: 0.8 } },
      { name: 'evening', weight: 2400, factor: 0, circuits: { 'Flat 1': 0.9, 'Flat 2': 0.9, 'Flat 3': 0.9, Chiller: 0.3 } },
    ]);
  });

  it.each(['worst', 'weighted'] as const)('%s: before and after of every condition match the test-side model; the score is its definition', (combine) => {
    const report = rebalanceBoard(model, { conditions: 'scenarios', combine }, { method: 'exact', moveTable: false, profile: board.profile });
    expect(report.conditions.map((c) => [c.name, c.weight])).toEqual([['baking', 1800], ['sunny noon', 1200], ['evening', 2400]]);
    const after = board.loads.map((l, i) => report.moves.find((m) => m.listPosition === i + 1)?.to ?? l.connection) as ConnectionSpec[];
    const perCondition = report.conditions.map((c, k) => {
      for (const [side, wiring] of [['before', board.loads.map((l) => l.connection)], ['after', after]] as const) {
        const f = boardFigures(board, wiring, fractions(k));
        f.lines.forEach((x, j) => expectClose(c.model[side].lineA[j]!, x, { rel: 1e-9, abs: 1e-9 }, `${c.name} ${side} line ${j}`));
        expectClose(c.model[side].neutralA!, f.neutral, { rel: 1e-9, abs: 1e-9 }, `${c.name} ${side} neutral`);
      }
      const f = boardFigures(board, after, fractions(k));
      return Math.max(...f.lines) + f.neutral;
    });
    const expected = combine === 'worst' ? Math.max(...perCondition) : (1800 * perCondition[0]! + 1200 * perCondition[1]! + 2400 * perCondition[2]!) / 5400;
    expectClose(report.score.after, expected, { rel: 1e-9, abs: 1e-9 }, 'score');
    expect(report.proven).toBe(true);
    expect(report.score.after).toBeLessThan(report.score.before);
  });

  it('"scenarios" without scenarios in the file is an input error naming the field', () => {
    const { profile: _p, ...bare } = board;
    expect(() => rebalanceBoard(normaliseBoard(parseBoard(bare)), { conditions: 'scenarios' })).toThrow(
      /conditions: expected scenarios under profile\.scenarios in the board file when conditions is "scenarios"/,
    );
  });
});
