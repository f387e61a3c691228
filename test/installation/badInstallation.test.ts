/**
 * Malformed installations and unequal-impedance supplies: each gives an
 * InputError naming the field (code and path exact, wording loosely).
 */
import { describe, expect, it } from 'vitest';
import { InputError, readBoardText, solveBoard, solveInstallation, validateBoard, validateInstallation } from '@trivar/core';

type Mutable = Record<string, any>;
const installation = () => ({
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  boards: [
    { name: 'Main', loads: [{ name: 'lift', connection: 'ABC-delta', kW: 7, pf: 0.8 }] },
    { name: 'Floor 1', fedFrom: 'Main', feeder: { lengthM: 12, line: { mm2: 25 }, neutral: { mm2: 25 } }, loads: [{ name: 'flat 1', connection: 'A-N', kW: 5, pf: 0.95 }] },
    { name: 'Floor 2', fedFrom: 'Floor 1', feeder: { lengthM: 3, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [] },
  ],
});
const editInstallation = (f: (b: Mutable) => void) => {
  const b = installation() as Mutable;
  f(b);
  return b;
};
const board = () => ({
  supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [{ name: 'press', connection: 'ABC-delta', kW: 20, pf: 0.85 }],
});
const editBoard = (f: (b: Mutable) => void) => {
  const b = board() as Mutable;
  f(b);
  return b;
};

const installationCases: [string, unknown, string, string, RegExp][] = [
  ['a feeder to an unknown board', editInstallation((b) => (b.boards[2].fedFrom = 'Floor 9')), 'unknown_board', 'boards[2].fedFrom', /"Main", "Floor 1", "Floor 2"/],
  ['a loop in the tree', editInstallation((b) => {
    b.boards[1].fedFrom = 'Floor 2';
  }), 'loop', 'boards[1].fedFrom', /Floor 1 → Floor 2 → Floor 1/],
  ['a board feeding itself', editInstallation((b) => (b.boards[2].fedFrom = 'Floor 2')), 'loop', 'boards[2].fedFrom', /loop/],
  ['two boards fed from the supply', editInstallation((b) => delete b.boards[2].fedFrom), 'two_supplies', 'boards[2].fedFrom', /only one board takes the supply/],
  ['no main board', editInstallation((b) => (b.boards[0].fedFrom = 'Floor 2')), 'missing', 'boards', /one main board/],
  ['duplicate board names', editInstallation((b) => (b.boards[2].name = 'Floor 1')), 'duplicate', 'boards[2].name', /boards\[1\]/],
  // The sizes listed smallest first, as the tables print them (IEC 60228; NEC Chapter 9 Table 8).
  ['an unknown conductor size', editInstallation((b) => (b.boards[1].feeder.line.mm2 = 17)), 'unknown_size', 'boards[1].feeder.line.mm2', /: 1\.5, 2\.5, 4, 6, 10, 16, 25, .*, 500, 630 \(received/],
  ['an unknown AWG size', editInstallation((b) => (b.boards[1].feeder.line = { awg: '5' })), 'unknown_size', 'boards[1].feeder.line.awg', /: 14, 12, 10, 8, 6, 4, 3, 2, 1, 1\/0, 2\/0, 3\/0, 4\/0; AWG sizes are text .* \(received/],
  ['an unknown kcmil size', editInstallation((b) => (b.boards[1].feeder.line = { kcmil: 450 })), 'unknown_size', 'boards[1].feeder.line.kcmil', /: 250, 300, 350, 400, 500, 600, 700, 750, 800, 900, 1000; AWG sizes are text .* \(received/],
  ['aluminium below the table', editInstallation((b) => (b.boards[1].feeder.neutral = { mm2: 4, material: 'aluminium' })), 'unknown_size', 'boards[1].feeder.neutral.mm2', /aluminium/],
  ['a size without a length', editInstallation((b) => delete b.boards[1].feeder.lengthM), 'missing', 'boards[1].feeder.line.lengthM', /length/],
  ['a size and ohm/km both', editInstallation((b) => (b.boards[1].feeder.line.rOhmPerKm = 0.7)), 'conflict', 'boards[1].feeder.line', /not both/],
  ['a bad load on a sub-board', editInstallation((b) => (b.boards[1].loads[0].pf = 1.5)), 'out_of_range', 'boards[1].loads[0].pf', /1/],
  ['a missing phase in a per-phase feeder', editInstallation((b) => (b.boards[1].feeder.line = { A: { mm2: 25 }, B: { mm2: 25 } })), 'missing', 'boards[1].feeder.line.C', /every phase/],
  ['both boards and loads', editInstallation((b) => (b.loads = [])), 'unknown_key', 'loads', /keys taken here \(.*"boards"/],
  // A feeder missing some conductors would give them no impedance: a silently low drop.
  ['a feeder with a length and no conductor', editInstallation((b) => (b.boards[1].feeder = { lengthM: 30 })), 'missing', 'boards[1].feeder.line', /r: 0, x: 0/],
  ['a feeder with a neutral and no line conductor', editInstallation((b) => delete b.boards[1].feeder.line), 'missing', 'boards[1].feeder.line', /line conductors/],
  ['line conductors without the neutral a load returns through', editInstallation((b) => delete b.boards[1].feeder.neutral), 'missing', 'boards[1].feeder.neutral', /"flat 1" on Floor 1/],
  // Names head table rows and drawing boxes.
  ['a board name of 101 characters', editInstallation((b) => (b.boards[2].name = 'F'.repeat(101))), 'out_of_range', 'boards[2].name', /at most 100 characters/],
  ['a blank board name', editInstallation((b) => (b.boards[2].name = '   ')), 'invalid_format', 'boards[2].name', /visible character/],
  ['a circuit name of 101 characters', editInstallation((b) => (b.boards[1].loads[0].name = 'f'.repeat(101))), 'out_of_range', 'boards[1].loads[0].name', /at most 100 characters/],
  // Names alike but for spaces or case read alike in every table and to --board; "supply" is the reports' word for the source.
  ['board names differing only in spaces', editInstallation((b) => (b.boards[2].name = 'Floor  1')), 'duplicate', 'boards[2].name', /differs from the other boards' in more than spaces or letter case \(boards\[1\] is "Floor 1"\)/],
  ['board names differing only in letter case', editInstallation((b) => (b.boards[2].name = 'FLOOR 1 ')), 'duplicate', 'boards[2].name', /boards\[1\] is "Floor 1"/],
  ['a board named supply', editInstallation((b) => ((b.boards[0].name = 'Supply'), (b.boards[1].fedFrom = 'Supply'))), 'reserved_name', 'boards[0].name', /a name other than "Supply": the reports name the main board's source "supply"/],
  ['fedFrom differing only in spaces and case', editInstallation((b) => (b.boards[2].fedFrom = 'floor  1 ')), 'unknown_board', 'boards[2].fedFrom', /"Floor 1" differs only in spaces or letter case/],
  // A conductor written flat or per phase: the issue names the field and its own fault, not "unknown key".
  ['a size written as text', editInstallation((b) => (b.boards[1].feeder.line = { mm2: '25' })), 'invalid_type', 'boards[1].feeder.line.mm2', /a number/],
  ['a rating written as text beside a good size', editInstallation((b) => (b.boards[1].feeder.line = { mm2: 25, ratingA: '100 A' })), 'invalid_type', 'boards[1].feeder.line.ratingA', /a number/],
  ['a per-phase size written as text', editInstallation((b) => (b.boards[1].feeder.line = { A: { mm2: '25' }, B: { mm2: 25 }, C: { mm2: 25 } })), 'invalid_type', 'boards[1].feeder.line.A.mm2', /a number/],
  ['an unknown key beside a size', editInstallation((b) => (b.boards[1].feeder.line = { mm2: 25, colour: 'brown' })), 'unknown_key', 'boards[1].feeder.line.colour', /keys taken here \(.*"mm2".*"awg"/],
  ['a line conductor that is a number', editInstallation((b) => (b.boards[1].feeder.line = 25)), 'invalid_type', 'boards[1].feeder.line', /an object/],
  ['an AWG size as a long text', editInstallation((b) => (b.boards[1].feeder.line = { awg: '4/0 AWG copper THHN' })), 'out_of_range', 'boards[1].feeder.line.awg', /text of at most 12 characters/],
  [
    'a YAML merge key into a board',
    readBoardText(
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }\nboards:\n  - { name: Main, loads: [] }\n  - &floor { name: Floor 1, fedFrom: Main, loads: [] }\n  - { <<: *floor, name: Floor 2 }\n',
    ),
    'unknown_key',
    'boards[2].<<',
    /merge key.*YAML 1\.2/,
  ],
];

const supplyCases: [string, unknown, string, string][] = [
  ['open delta with three units', editBoard((b) => (b.supply.openDelta = { 'A-B': { r: 0.01, x: 0.02 }, 'B-C': { r: 0.01, x: 0.02 }, 'C-A': { r: 0.01, x: 0.02 } })), 'out_of_range', 'supply.openDelta'],
  ['open delta on a 4-wire supply', editBoard((b) => {
    b.supply.system = 'three-phase-4wire';
    b.supply.openDelta = { 'A-B': { r: 0.01, x: 0.02 }, 'B-C': { r: 0.01, x: 0.02 } };
  }), 'not_applicable', 'supply.openDelta'],
  ['zero sequence on a 3-wire supply', editBoard((b) => {
    b.supply.impedance = { r: 0.01, x: 0.02 };
    b.supply.zeroSequence = { r: 0.03, x: 0.05 };
  }), 'not_applicable', 'supply.zeroSequence'],
  ['zero sequence without Z1', editBoard((b) => {
    b.supply.system = 'three-phase-4wire';
    b.supply.zeroSequence = { r: 0.03, x: 0.05 };
  }), 'missing', 'supply.impedance'],
  ['bank missing a unit', editBoard((b) => (b.supply.bank = { A: { kVA: 50, impedancePercent: 3, xOverR: 2 }, B: { kVA: 50, impedancePercent: 3, xOverR: 2 } })), 'missing', 'supply.bank.C'],
  ['bank and transformer both', editBoard((b) => {
    b.supply.transformer = { kVA: 150, impedancePercent: 4, xOverR: 3 };
    b.supply.bank = { A: { r: 0.01, x: 0.01 }, B: { r: 0.01, x: 0.01 }, C: { r: 0.01, x: 0.01 } };
  }), 'conflict', 'supply'],
  ['per-phase impedance with a phase missing', editBoard((b) => (b.supply.impedance = { A: { r: 0.01, x: 0.02 }, C: { r: 0.01, x: 0.02 } })), 'missing', 'supply.impedance.B'],
  ['a source resistance written as text', editBoard((b) => (b.supply.impedance = { r: '0.01', x: 0.02 })), 'invalid_type', 'supply.impedance.r'],
  ['a negative per-phase resistance', editBoard((b) => (b.supply.impedance = { A: { r: -0.01, x: 0.02 }, B: { r: 0.01, x: 0.02 }, C: { r: 0.01, x: 0.02 } })), 'out_of_range', 'supply.impedance.A.r'],
];

describe('bad installation input', () => {
  it('a line-only (three-core) feeder stays valid where no load returns through a neutral', () => {
    const input = editInstallation((b) => {
      delete b.boards[2].feeder.neutral;
      b.boards[2].loads = [{ name: 'pump', connection: 'ABC-delta', kW: 4, pf: 0.85 }];
    });
    expect(validateInstallation(input).ok).toBe(true);
  });
  it('the service feeder keeps the board-file rule for a neutral alone: accepted there, as in a board file', () => {
    const feeder = { neutral: { r: 0.05, x: 0.01 } };
    expect(validateInstallation(editInstallation((b) => (b.boards[0].feeder = feeder))).ok).toBe(true);
    expect(validateBoard({ ...editBoard((b) => (b.supply.system = 'three-phase-4wire')), feeder }).ok).toBe(true);
  });
  it('lines without a neutral: one rule for every feeder, refused where loads return through it (the service feeder, a board file, a sub-board)', () => {
    // Taken as written the neutral would have no impedance: half the drop and loss of a real one on a single-phase load.
    const feeder = { lengthM: 20, line: { mm2: 95 } };
    const expected = /expected the neutral conductor, which .+ return through: its size with the length \(e\.g\. neutral: \{ mm2: … \}\), or r: 0, x: 0 for a neutral of no impedance/;
    const service = validateInstallation(editInstallation((b) => (b.boards[0].feeder = feeder)));
    expect(service.ok).toBe(false);
    // The service feeder carries the neutral current of every board beyond it: the flats on the floors.
    if (!service.ok) expect(service.issues.find((i) => i.path === 'boards[0].feeder.neutral')?.message).toMatch(/^boards\[0\]\.feeder\.neutral: expected the neutral conductor, which "flat 1" on Floor 1 return through/);
    const file = validateBoard({ ...editBoard((b) => (b.supply.system = 'three-phase-4wire')), feeder, loads: [{ name: 'kettle', connection: 'B-N', kW: 3 }] });
    expect(file.ok).toBe(false);
    if (!file.ok) expect(file.issues).toEqual([expect.objectContaining({ code: 'missing', path: 'feeder.neutral', message: expect.stringMatching(expected) })]);
    if (!file.ok) expect(file.issues[0]!.message).toContain('which "kettle" return through');
    // A board of three-phase loads only needs no neutral: a three-core feeder stays valid.
    expect(validateBoard({ ...editBoard((b) => (b.supply.system = 'three-phase-4wire')), feeder }).ok).toBe(true);
  });
  it.each(installationCases)('%s', (_, input, code, path, wording) => {
    const result = validateInstallation(input);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const issue = result.issues.find((i) => i.path === path);
    expect(issue, JSON.stringify(result.issues)).toMatchObject({ code, path });
    expect(issue!.message).toMatch(wording);
    expect(() => solveInstallation(input)).toThrow(InputError);
  });
  it('two boards of one name: the duplicate alone, not a "loop" that only echoes it', () => {
    // Floor 2 renamed Main and fed from Floor 1: read by name, Main → Floor 1 → Main looks like a loop.
    const result = validateInstallation(editInstallation((b) => (b.boards[2].name = 'Main')));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues.map((i) => [i.code, i.path])).toEqual([['duplicate', 'boards[2].name']]);
  });
  it.each(supplyCases)('%s', (_, input, code, path) => {
    const result = validateBoard(input);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues, JSON.stringify(result.issues)).toContainEqual(expect.objectContaining({ code, path }));
    expect(() => solveBoard(input)).toThrow(InputError);
  });
});
