/**
 * An error in a file written in L1/L2/L3 speaks L1/L2/L3 throughout: the path, the phases and
 * connections it lists, and the phase term it received (schema word lists, board rules, the
 * correction and rebalancing studies). A file in A/B/C keeps A/B/C.
 */
import { describe, expect, it } from 'vitest';
import { validateBoard, validateInstallation, type InputIssue } from '@trivar/core';
import { runCli } from '../../packages/cli/src/program.js';
import type { CliIo } from '../../packages/cli/src/io.js';

type Mutable = Record<string, any>;
const splitPhase = (): Mutable => ({
  name: 'Cabin panel',
  supply: { system: 'split-phase', voltage: '120/240', frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2, xOverR: 2 } },
  loads: [
    { name: 'water heater', connection: 'L1-L2', kW: 4.5 },
    { name: 'kitchen', connection: 'L1-N', kW: 1.2, pf: 0.95 },
    { name: 'laundry', connection: 'L2-N', kW: 0.9, pf: 0.9 },
  ],
});
const edit = (f: (b: Mutable) => void): Mutable => {
  const b = splitPhase();
  f(b);
  return b;
};
const issuesOf = (input: unknown): InputIssue[] => {
  const result = validateBoard(input);
  expect(result.ok).toBe(false);
  return result.ok ? [] : result.issues;
};
/** A/B/C phase words: a lone capital A, B or C, or one in a connection or line pair. */
const LETTERED = /\b[ABC]-[ABCN]\b|\bABC-(star|delta)\b|(?<![\w[])[ABC](?=[,)"]|$)/;

/** What the CLI writes to standard error for a file it refuses (exit 3), the file given as text. */
async function errorsOf(argv: string[], text: string): Promise<string> {
  const err: string[] = [];
  const io: CliIo = { stdout: () => undefined, stderr: (t) => void err.push(t), readSource: async () => text, isTty: false };
  expect(await runCli(argv, io)).toBe(3);
  return err.join('');
}

describe('issues in a file written in L1/L2/L3', () => {
  it('a per-phase field on a phase the supply lacks: path, listed phases and the key received', () => {
    const issues = issuesOf(edit((b) => (b.supply.emf = { L1: { V: 120, angleDeg: 0 }, L2: { V: 120, angleDeg: 180 }, L3: { V: 120, angleDeg: 90 } })));
    const emf = issues.find((i) => i.path === 'supply.emf.L3')!;
    expect(emf.message).toBe('supply.emf.L3: expected only phases L1, L2 on a split-phase supply (received "L3")');
    expect(emf.received).toBe('"L3"');
  });

  it('a per-phase feeder conductor and source impedance', () => {
    const z = { r: 0.01, x: 0.01 };
    const issues = issuesOf(edit((b) => {
      b.feeder = { line: { L1: z, L2: z, L3: z }, neutral: z };
      delete b.supply.transformer;
      b.supply.impedance = { L1: z, L2: z, L3: z };
    }));
    expect(issues.map((i) => i.message)).toEqual([
      'supply.impedance.L3: expected only phases L1, L2 on a split-phase supply (received "L3")',
      'feeder.line.L3: expected only phases L1, L2 on a split-phase supply (received "L3")',
    ]);
  });

  it('a load on a phase the supply lacks', () => {
    const [issue] = issuesOf(edit((b) => (b.loads[2].connection = 'L3-N')));
    expect(issue!.message).toBe('loads[2].connection: expected one of L1-N, L2-N, L1-L2 on a split-phase supply (received "L3-N")');
  });

  it('a connection the schema does not know: its word list in L1/L2/L3', () => {
    const [issue] = issuesOf(edit((b) => (b.loads[0].connection = 'L1-L1')));
    expect(issue!.message).toBe(
      'loads[0].connection: expected one of "L1-N", "L2-N", "L3-N", "L1-L2", "L2-L3", "L3-L1", "L1L2L3-star", "L1L2L3-delta" (received "L1-L1")',
    );
  });

  it('a breaker pole count and a star point name the connection in L1/L2/L3', () => {
    const issues = issuesOf(edit((b) => {
      b.loads[0].poles = 1;
      b.loads[1].starPoint = 'floating';
    }));
    expect(issues.find((i) => i.path === 'loads[0].poles')!.message).toContain('for a line-to-line load (L1-L2)');
    expect(issues.find((i) => i.path === 'loads[1].starPoint')!.expected).toBe('starPoint only on L1L2L3-star loads');
    for (const i of issues) expect(i.message).not.toMatch(LETTERED);
  });

  it('the same faults in a file written A/B/C stay A/B/C', () => {
    const lettered = edit((b) => {
      b.loads = [{ name: 'water heater', connection: 'A-B', kW: 4.5, poles: 1 }, { name: 'laundry', connection: 'C-N', kW: 0.9 }];
    });
    const messages = issuesOf(lettered).map((i) => i.message);
    expect(messages).toContainEqual(expect.stringContaining('for a line-to-line load (A-B)'));
    expect(messages).toContainEqual('loads[1].connection: expected one of A-N, B-N, A-B on a split-phase supply (received "C-N")');
  });

  it('an installation file: a sub-board feeder conductor on a missing phase', () => {
    const z = { r: 0.01, x: 0.01 };
    const main = splitPhase();
    const result = validateInstallation({
      name: 'Cabin and shed',
      supply: main.supply,
      boards: [
        { name: 'panel', loads: main.loads },
        { name: 'shed', fedFrom: 'panel', feeder: { line: { L1: z, L2: z, L3: z }, neutral: z }, loads: [{ name: 'saw', connection: 'L1-N', kW: 1 }] },
      ],
    });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.issues.map((i) => i.message)).toContain('boards[1].feeder.line.L3: expected only phases L1, L2 on a split-phase supply (received "L3")');
  });
  it('a load with no connection lists the connections in L1/L2/L3, with nothing received', () => {
    const issues = issuesOf(edit((b) => b.loads.push({ name: 'dryer', kW: 5 })));
    const missing = issues.find((i) => i.path === 'loads[3].connection')!;
    expect(missing.code).toBe('missing');
    expect(missing.message).toBe('loads[3].connection: expected one of "L1-N", "L2-N", "L3-N", "L1-L2", "L2-L3", "L3-L1", "L1L2L3-star", "L1L2L3-delta"');
    expect(missing.received).toBeUndefined();
  });
});

describe('study sections of a file written in L1/L2/L3', () => {
  const yaml = (extra: string) =>
    [
      'name: Cabin panel',
      'supply: { system: split-phase, voltage: "120/240", frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2, xOverR: 2 } }',
      'loads:',
      '  - { name: water heater, connection: L1-L2, kW: 4.5, pf: 0.9 }',
      '  - { name: kitchen, connection: L1-N, kW: 1.2, pf: 0.8 }',
      '  - { name: laundry, connection: L2-N, kW: 0.9, pf: 0.8 }',
      extra,
    ].join('\n');

  it('a per-line correction target on a phase the board lacks', async () => {
    const err = await errorsOf(['correct', 'b.yaml'], yaml('correction: { target: { definition: per-line, perPhase: { L3: 0.95 } } }'));
    expect(err).toContain('correction.target.perPhase.L3: expected only phases L1, L2 of this board (received "L3")');
  });

  it('a rebalancing pin and line capacity', async () => {
    const capacity = await errorsOf(['rebalance', 'b.yaml'], yaml('rebalance: { lineCapacityA: { L1: 100, L3: 100 } }'));
    expect(capacity).toContain('rebalance.lineCapacityA.L3: expected only lines L1, L2 on a split-phase supply (received 100)');
    const pin = await errorsOf(['rebalance', 'b.yaml'], yaml('rebalance: { pinned: [ { circuit: water heater, on: L1-N } ] }'));
    expect(pin).toContain('rebalance.pinned[0].on: expected one of L1-L2 (the circuit is line-to-line, wired L1-L2 now) (received "L1-N")');
  });
});

describe('names the user gave stay as written in a file in L1/L2/L3', () => {
  // Loads literally named A, B and C: only phase references turn into L1/L2/L3, never these names.
  const lines = (extra: string[]) =>
    [
      'name: Elm Row shop',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'loads:',
      '  - { name: A, connection: L1-N, kW: 3.0, pf: 0.9 }',
      '  - { name: B, connection: L1-N, kW: 2.0, pf: 0.9 }',
      '  - { name: C, connection: L2-N, kW: 1.0, pf: 0.9 }',
      ...extra,
    ].join('\n');

  it('a rebalancing condition keyed by a circuit named B', async () => {
    const err = await errorsOf(['rebalance', 'b.yaml'], lines(['rebalance:', '  conditions: [ { name: evening, circuits: { B: -0.5, C: 1 } } ]']));
    expect(err).toContain('rebalance.conditions[0].circuits.B: expected a number >= 0 (received -0.5)');
    expect(err).not.toMatch(/circuits\.L\d/);
  });

  it('a scenario and a group keyed by a load named C or B', async () => {
    const err = await errorsOf(['solve', 'b.yaml'], lines(['profile:', '  groups: { B: [] }', '  scenarios: [ { name: evening, hours: 100, loads: { C: 20 } } ]']));
    expect(err).toContain('profile.scenarios[0].loads.C: expected a number <= 10 (received 20)');
    expect(err).toMatch(/profile\.groups\.B: /);
    expect(err).not.toMatch(/loads\.L3|groups\.L2/);
  });

  it('a light-load fraction keyed by a load named A', async () => {
    const err = await errorsOf(['correct', 'b.yaml'], lines(['correction: { arrangement: delta-bank, lightLoad: { fraction: 0.3, perLoad: { A: 2 } } }']));
    expect(err).toContain('correction.lightLoad.perLoad.A: expected a number <= 1 (received 2)');
  });

  it("a load's current field A is a field, not phase L1", () => {
    const text = lines([]).replace('kW: 3.0', 'A: -3');
    const err = errorsOf(['solve', 'b.yaml'], text);
    return expect(err).resolves.toContain('loads[0].A: expected a number above 0 and at most 100,000 A (received -3)');
  });

  it('phase keys in the same file are still in L1/L2/L3', async () => {
    const err = await errorsOf(['rebalance', 'b.yaml'], lines(['rebalance:', '  lineCapacityA: { L2: -1 }', '  conditions: [ { name: evening, circuits: { B: -0.5 } } ]']));
    expect(err).toMatch(/rebalance\.lineCapacityA\.L2: /);
    expect(err).toContain('rebalance.conditions[0].circuits.B: ');
  });
});
