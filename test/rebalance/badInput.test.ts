/**
 * Bad rebalancing studies: every problem is an InputError naming the field
 * (paths relative to the study; the CLI restates them under `rebalance.`),
 * what was wrong and what is accepted.
 */
import { describe, expect, it } from 'vitest';
import { InputError, normaliseBoard, parseBoard, rebalanceBoard, rewriteBoardText, type BoardSpec } from '@trivar/core';

const fourWire: BoardSpec = {
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'Kiln', connection: 'A-N', kW: 11.5, pf: 1 },
    { name: 'Glaze mixer', connection: 'A-N', kW: 1.5, pf: 0.8 },
    { name: 'Studio lights', connection: 'B-N', kW: 0.8, pf: 0.95 },
    { name: 'Wheel bench', connection: 'C-N', kW: 2.2, pf: 0.85 },
    { name: 'Extractor', connection: 'A-B', kW: 3, pf: 0.85 },
  ],
};
const splitPhase: BoardSpec = {
  supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 },
  loads: [
    { name: 'Range', connection: 'A-B', kW: 8, pf: 1 },
    { name: 'Fridge', connection: 'A-N', kW: 0.4, pf: 0.8 },
    { name: 'Lights', connection: 'B-N', kW: 0.6, pf: 0.95 },
  ],
};

function issuesOf(spec: BoardSpec, study: unknown) {
  try {
    rebalanceBoard(normaliseBoard(parseBoard(spec)), study, { moveTable: false });
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return (error as InputError).issues;
  }
  throw new Error('expected an InputError');
}

describe('rebalance: bad studies', () => {
  it.each([
    ['a circuit pinned to a phase the supply lacks', splitPhase, { pinned: [{ circuit: 'Fridge', on: 'C-N' }] }, 'unknown_phase', 'pinned[0].on', /A-N, B-N, A-B on a split-phase supply/],
    ['a negative move limit', fourWire, { moveLimit: -1 }, 'out_of_range', 'moveLimit', /a number >= 0/],
    ['a fractional move limit', fourWire, { moveLimit: 1.5 }, 'invalid_type', 'moveLimit', /expected a whole number/],
    ['capacity below the pinned load', fourWire, { pinned: ['Kiln'], lineCapacityA: 40 }, 'capacity_unreachable', 'lineCapacityA', /capacity of at least 49\.8 A for line A.*circuits that cannot move draw 49\.8 A/],
    ['a per-line capacity below the pinned load', fourWire, { pinned: ['Kiln'], lineCapacityA: { A: 30 } }, 'capacity_unreachable', 'lineCapacityA.A', /line A/],
    ['a capacity for a line the supply lacks', splitPhase, { lineCapacityA: { C: 30 } }, 'not_applicable', 'lineCapacityA.C', /only lines A, B/],
    ['a pinned name that is no circuit', fourWire, { pinned: ['Kettle'] }, 'unknown_circuit', 'pinned[0]', /name of a circuit/],
    ['a circuit pinned twice', fourWire, { pinned: ['Kiln', { circuit: 'Kiln', on: 'B-N' }] }, 'duplicate', 'pinned[1].circuit', /pinned once/],
    ['a line-to-neutral circuit pinned across two lines', fourWire, { pinned: [{ circuit: 'Kiln', on: 'B-C' }] }, 'wrong_kind', 'pinned[0].on', /line-to-neutral, wired A-N/],
    ['a move limit below the forced moves', fourWire, { pinned: [{ circuit: 'Kiln', on: 'B-N' }], moveLimit: 0 }, 'out_of_range', 'moveLimit', /at least 1/],
    ['a condition naming no circuit', fourWire, { conditions: [{ name: 'night', circuits: { Kettle: 0.5 } }] }, 'unknown_circuit', 'conditions[0].circuits.Kettle', /name of a circuit/],
    ['an unbalance aim on a split-phase board', splitPhase, { aim: { currentUnbalance: 1 } }, 'not_applicable', 'aim.currentUnbalance', /three-phase/],
    ['an aim of all zeros', fourWire, { aim: { largestLine: 0 } }, 'out_of_range', 'aim', /at least one figure/],
    ['an unknown key', fourWire, { movelimit: 2 }, 'unknown_key', 'movelimit', /nearest: "moveLimit"/],
  ] as const)('%s', (_, spec, study, code, path, wording) => {
    const issues = issuesOf(spec, study);
    expect(issues[0]).toMatchObject({ code, path });
    expect(issues[0]!.message).toMatch(wording);
    expect(issues[0]!.message.startsWith(`${path}: `)).toBe(true);
  });

  it('options of the library call are checked too', () => {
    expect(() => rebalanceBoard(normaliseBoard(parseBoard(fourWire)), {}, { nodeBudget: -5 } as never)).toThrow(/nodeBudget/);
  });
});

describe('rebalance: a caller objective that gives no usable score', () => {
  const board = normaliseBoard(parseBoard(fourWire));

  it.each([
    ['NaN', () => NaN, 'NaN'],
    ['a string', () => '3', '"3"'],
    ['minus infinity', () => -Infinity, '-Infinity'],
    ['nothing', () => undefined, 'nothing'],
  ])('%s: InputError at objective (it used to pass as a proven answer)', (_, objective, received) => {
    try {
      rebalanceBoard(board, {}, { objective: objective as never, moveTable: false });
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      const issue = (error as InputError).issues[0]!;
      expect(issue.path).toBe('objective');
      expect(issue.message).toMatch(/^objective: expected a finite number from the objective/);
      expect(issue.message).toContain(`(received ${received})`);
      return;
    }
    throw new Error('expected an InputError');
  });

  it('sees frozen copies: writing into them fails in the callback and leaves the report as solved', () => {
    const neutralBefore = rebalanceBoard(board, {}, { moveTable: false }).conditions[0]!.solved.before.neutralA;
    const seen: boolean[] = [];
    const report = rebalanceBoard(board, {}, {
      moveTable: false,
      objective: (figures) => {
        seen.push(Object.isFrozen(figures) && Object.isFrozen(figures[0]) && Object.isFrozen(figures[0]!.lineA));
        return figures.reduce((s, f) => s + (f.neutralA ?? 0), 0);
      },
    });
    expect(seen.length).toBeGreaterThan(0);
    expect(seen.every(Boolean)).toBe(true);
    expect(report.conditions[0]!.solved.before.neutralA).toBe(neutralBefore);
    expect(() =>
      rebalanceBoard(board, {}, {
        moveTable: false,
        objective: (figures) => {
          (figures[0] as { neutralA: number | null }).neutralA = 99;
          return 1;
        },
      }),
    ).toThrow(TypeError);
  });
});

describe('rewriteBoardText: moves that do not fit the text', () => {
  const yaml = 'loads:\n  - { name: Kettle, connection: A-N, kW: 2 }\n  - { name: Urn, connection: A-N, kW: 3 }\n';
  const json = '{"loads":[{"name":"Kettle","connection":"A-N","kW":2}]}';

  function refusal(call: () => unknown): { path: string; message: string }[] {
    try {
      call();
    } catch (error) {
      expect(error).toBeInstanceOf(InputError);
      return (error as InputError).issues.map((i) => ({ path: i.path, message: i.message }));
    }
    throw new Error('expected an InputError');
  }

  it('refuses a connection no board takes (Z-N used to be written into the file)', () => {
    for (const text of [yaml, json]) {
      const [issue] = refusal(() => rewriteBoardText(text, [{ listPosition: 1, name: 'Kettle', to: 'Z-N' as never }]));
      expect(issue!.path).toBe('moves[0].to');
      expect(issue!.message).toMatch(/^moves\[0\]\.to: expected a connection: one of "A-N", "B-N"/);
      expect(issue!.message).toContain('(received "Z-N")');
    }
  });

  it('names the move whose load is not at its place, with what the text has there (it was a plain Error)', () => {
    expect(refusal(() => rewriteBoardText(yaml, [{ listPosition: 2, name: 'Kettle', to: 'B-N' }]))).toEqual([
      { path: 'moves[0]', message: 'moves[0]: expected load 2 to be "Kettle", as in the file the report was made from (received "Urn")' },
    ]);
    expect(refusal(() => rewriteBoardText(json, [{ listPosition: 5, name: 'Kettle', to: 'B-N' }]))[0]!.message).toContain('(received nothing)');
    expect(refusal(() => rewriteBoardText(yaml, [{ listPosition: 0, name: 'Kettle', to: 'B-N' }]))[0]!.path).toBe('moves[0].listPosition');
    expect(refusal(() => rewriteBoardText('{"loads": [', []))[0]!.path).toBe('text');
  });

  it('writes a good move in the file\'s own naming, L1/L2/L3 included', () => {
    expect(rewriteBoardText(yaml, [{ listPosition: 2, name: 'Urn', to: 'C-N' }])).toBe('loads:\n  - { name: Kettle, connection: A-N, kW: 2 }\n  - { name: Urn, connection: C-N, kW: 3 }\n');
    expect(rewriteBoardText('loads:\n  - { name: Urn, connection: L1-N, kW: 3 }\n', [{ listPosition: 1, name: 'Urn', to: 'B-N' }])).toBe('loads:\n  - { name: Urn, connection: L2-N, kW: 3 }\n');
  });
});
