/**
 * Installation files a hostile user or a practising engineer writes, through the built binary:
 * control characters in board names on every text report, and the faults found in that pass.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const IDLE = 'test/fixtures/hostile/idle-plant-room.yaml';
const IDLE_DATA = 'test/fixtures/hostile/idle-plant-room.csv';
const noStack = (stderr: string) => expect(stderr).not.toMatch(/\n\s+at .+[:(]\d+/);
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/;

/** A riser whose sub-board's name holds a bell, a right-to-left override and a NUL. */
const controlNamed = JSON.stringify({
  name: 'Riser',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
  boards: [
    { name: 'Main', loads: [{ name: 'Lights', connection: 'A-N', kW: 2, pf: 0.95 }] },
    { name: 'Plant\u0007room\u202e\u0000x', fedFrom: 'Main', feeder: { lengthM: 18, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: 'Pump\u001b[2J', connection: 'C-N', kW: 6 }] },
  ],
});

describe('control characters in board names', () => {
  // Names may not hold control characters or direction overrides: every study refuses the file at the
  // names' paths, the received text escaped in the message.
  it('solve, harmonics and rebalance refuse the file at boards[1].name and boards[1].loads[0].name', () => {
    for (const args of [['solve', '-', '--all-boards'], ['harmonics', '-'], ['harmonics', '-', '--all-boards'], ['rebalance', '-']]) {
      const r = runTrivar(args, controlNamed);
      noStack(r.stderr);
      expect(r.code).toBe(3);
      expect(r.stderr).not.toMatch(CONTROL);
      expect(r.stderr).toMatch(/^ {2}- boards\[1\]\.name: expected text without control characters .* \(received "Plant\\u0007room\\u202e\\u0000x"\)$/m);
      expect(r.stderr).toMatch(/^ {2}- boards\[1\]\.loads\[0\]\.name: expected text without control characters/m);
    }
  });
});

describe('a sub-board with nothing on: round-off is not data', () => {
  it('solve --json: its feeder carries exactly 0 A and the board takes exactly 0 kW from its feeder', () => {
    const r = runTrivar(['solve', IDLE, '--json']);
    expect(r.code).toBe(0);
    const result = JSON.parse(r.stdout);
    const feeder = result.feeders.find((f: { board: string }) => f.board === 'Plant room');
    expect(feeder.lines.map((l: { current: { magnitude: number } }) => l.current.magnitude)).toEqual([0, 0, 0]);
    expect(feeder.lines.map((l: { loadingPercent: number }) => l.loadingPercent)).toEqual([0, 0, 0]);
    expect(feeder.neutral.current.magnitude).toBe(0);
    const board = result.boards.find((b: { name: string }) => b.name === 'Plant room').result;
    expect(board.source).toEqual({ kW: 0, kvar: 0 });
    // The loaded boards keep their figures: the main board's feeder carries what its board reads.
    const main = result.boards[0].result;
    expect(result.feeders[0].lines[0].current).toEqual(main.phases[0].current);
    expect(main.source.kW).toBeGreaterThan(14.9);
  });
  it('profile: no current, energy, reactive energy or leading hours through it in any interval', () => {
    const r = runTrivar(['profile', IDLE, '--data', IDLE_DATA, '--json']);
    expect(r.code).toBe(0);
    const plant = JSON.parse(r.stdout).boards.find((b: { board: string }) => b.board === 'Plant room').before;
    expect(plant.conductors.map((c: { maxA: number }) => c.maxA)).toEqual([0, 0, 0, 0]);
    expect(plant.energy.phases.map((p: { kWh: number; kvarh: number }) => [p.kWh, p.kvarh])).toEqual([[0, 0], [0, 0], [0, 0]]);
    expect([plant.energy.kWhImport, plant.energy.kWhExport, plant.energy.kvarhLagging, plant.energy.kvarhLeading]).toEqual([0, 0, 0, 0]);
    expect(plant.leadingHours).toBe(0);
    // Nothing imported: no billing power factor (it read 1 before, a perfect figure beside 0 kWh), in the data and the text.
    expect(plant.energy.billingPf).toBeNull();
    expect(plant.months.every((m: { billingPf: number | null }) => m.billingPf === null)).toBe(true);
    const text = runTrivar(['profile', IDLE, '--data', IDLE_DATA]).stdout;
    const block = text.slice(text.indexOf('Plant room'));
    expect(block).toMatch(/billing power factor none \(no energy imported\)/);
    expect(text).not.toMatch(/billing power factor 1\.000/);
    // The flats' board is untouched: its feeder carries real current.
    const floor = JSON.parse(r.stdout).boards.find((b: { board: string }) => b.board === 'Floor 1').before;
    expect(floor.conductors[0].maxA).toBeGreaterThan(5);
  });
});

/** A riser on a 10 kVA, 25 % transformer: every board's voltage collapses. Flats draw switch-mode current. */
const collapsedRiser = `name: Collapsed riser
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 10, impedancePercent: 25, xOverR: 2 } }
boards:
  - { name: Main, loads: [{ name: Lift, connection: ABC-delta, kW: 11, pf: 0.82 }] }
  - name: Floor 1
    fedFrom: Main
    feeder: { lengthM: 12, line: { mm2: 70 }, neutral: { mm2: 70 } }
    loads:
      - { name: Flat 1A, connection: A-N, kW: 6.2, pf: 0.96, spectrum: switch-mode }
      - { name: Flat 1B, connection: B-N, kW: 3.1, pf: 0.97, spectrum: switch-mode }
`;
const collapsedBoard = `name: Collapsed board
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 10, impedancePercent: 25, xOverR: 2 } }
loads:
  - { name: a, connection: A-N, kW: 30, pf: 0.9, spectrum: switch-mode }
  - { name: b, connection: B-N, kW: 20, pf: 0.9 }
correction: { arrangement: delta-bank, target: { pf: 0.95 } }
`;

describe('a collapsed supply: studies refuse it, as correct does, and report still writes the report', () => {
  it('diagram of a collapsed installation or board: the drawing is written, then exit 4 naming the collapse, as solve does', () => {
    for (const [text, args] of [
      [collapsedRiser, ['--view', 'one-line']],
      [collapsedRiser, ['--board', 'Floor 1']],
      [collapsedBoard, []],
    ] as const) {
      const r = runTrivar(['diagram', '-', ...args], text);
      noStack(r.stderr);
      expect(r.code).toBe(4);
      expect(r.stdout).toMatch(/^<svg[\s\S]*<\/svg>\s*$/);
      expect(r.stderr).toMatch(/^error: no viable operating point: the supply cannot carry these loads/);
    }
  });
  it('rebalance of a collapsed installation or board: exit 4, no work order for a state that cannot exist', () => {
    const inst = runTrivar(['rebalance', '-'], collapsedRiser);
    noStack(inst.stderr);
    expect(inst.code).toBe(4);
    expect(inst.stderr).toMatch(/no viable operating point.*Main, as it stands: the board voltage has collapsed.*Floor 1, as it stands: the board voltage has collapsed/);
    expect(inst.stdout).toBe('');
    const board = runTrivar(['rebalance', '-'], collapsedBoard);
    expect(board.code).toBe(4);
    expect(board.stderr).toMatch(/^error: no viable operating point: the supply cannot carry these loads: as it stands: the board voltage has collapsed/);
    expect(board.stdout).toBe('');
  });
  it('harmonics of a collapsed installation or board: exit 4, the collapse named per board, no figures', () => {
    const inst = runTrivar(['harmonics', '-'], collapsedRiser);
    noStack(inst.stderr);
    expect(inst.code).toBe(4);
    expect(inst.stderr).toMatch(/no viable operating point.*Main: the board voltage has collapsed.*Floor 1: the board voltage has collapsed/);
    expect(inst.stdout).toBe('');
    const board = runTrivar(['harmonics', '-'], collapsedBoard);
    expect(board.code).toBe(4);
    expect(board.stderr).toMatch(/^error: no viable operating point: the supply cannot carry these loads: the board voltage has collapsed/);
    expect(board.stdout).toBe('');
  });
  it('report of a collapsed file with harmonic data or a correction section: written, collapse stated first, exit 4', () => {
    for (const text of [collapsedRiser, collapsedBoard]) {
      const r = runTrivar(['report', '-'], text);
      noStack(r.stderr);
      expect(r.code).toBe(4);
      expect(r.stdout).toContain('Supply collapse: the supply cannot carry these loads');
      expect(r.stdout).toMatch(/<\/html>\s*$/);
    }
  });
});

describe('correction equipment on a board that draws nothing', () => {
  it('every arrangement says nothing to do, with the reason, as the balancing compensator did (not "not reachable")', () => {
    const r = runTrivar(['correct', IDLE, '--board', 'Plant room', '--json']);
    expect(r.code).toBe(0);
    const { comparison } = JSON.parse(r.stdout);
    expect(comparison.outcomes.map((o: { arrangement: string; report: { status: string } }) => [o.arrangement, o.report.status])).toEqual([
      ['star-bank', 'already-meets-target'],
      ['delta-bank', 'already-meets-target'],
      ['balancing-compensator', 'already-meets-target'],
    ]);
    const star = runTrivar(['correct', IDLE, '--board', 'Plant room', '--arrangement', 'star-bank']);
    expect(star.code).toBe(0);
    expect(star.stdout).toMatch(/NOTHING TO DO[^\n]*\n {2}- the board draws no active power \(every load is zero or off\), so there is nothing to correct/);
    expect(star.stdout).not.toMatch(/NOT REACHABLE/);
  });
  it('no line carries current, so there is no PF after to show (it read 1.000 beside "no current")', () => {
    const r = runTrivar(['correct', IDLE, '--board', 'Plant room', '--json']);
    const { comparison } = JSON.parse(r.stdout);
    for (const o of comparison.outcomes) expect([o.figures.lowestLinePf, o.figures.targetPfAfter]).toEqual([null, null]);
    // Every arrangement has nothing to add: the verdict, the reason and the lines as solved, each without a PF.
    const text = runTrivar(['correct', IDLE, '--board', 'Plant room']).stdout;
    expect(text).toMatch(/NOTHING TO DO: the board already meets the target — every arrangement studied \(star bank, delta\s+bank, balancing\s+compensator\) would add nothing\n {2}- the board draws no active power/);
    expect(text).toMatch(/no line current, so no power factor · neutral 0\.0 A/);
    // Nothing added: no installation table of "x→x" after it.
    expect(text).not.toMatch(/across the installation|→/);
    const rows = text.split('\n').filter((l) => /^ {2}[ABC] {2}/.test(l));
    expect(rows).toHaveLength(3);
    for (const row of rows) expect(row.trim().split(/ {2,}/).slice(1)).toEqual(['0.0', '0.0', '0.0', 'no current']);
    expect(text).not.toMatch(/Arrangements compared|Capacitors hold their charge/);
  });
});

describe('a sub-board written without a feeder', () => {
  it('is said to be taken as of no impedance in the text report and the JSON, not left silent', () => {
    const text = `name: Busbar section
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } }
boards:
  - { name: Main, feeder: { lengthM: 30, line: { mm2: 120 }, neutral: { mm2: 120 } }, loads: [{ name: Lights, connection: A-N, kW: 2 }] }
  - { name: Section 2, fedFrom: Main, loads: [{ name: Heater, connection: B-N, kW: 3 }] }
`;
    const r = runTrivar(['solve', '-'], text);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('  cable to Section 2: none entered (zero impedance)');
    const json = JSON.parse(runTrivar(['solve', '-', '--json'], text).stdout);
    expect(json.feeders.map((f: { description: string | null }) => f.description)).toEqual(['120 mm² Cu, 30 m at 70 °C', 'none entered (zero impedance)']);
    expect(json.feeders[1].lossesKW).toBe(0);
  });
});
