/**
 * `trivar profile` as a user runs it on data that leaves something to the model (boards and data invented
 * here): a phase metered in kW alone, rows closer than one interval, a record mostly filled in, bank settings
 * that need a neutral on a board without one, a semicolon-separated export.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

let dir = '';
const file = (name: string, text: string) => {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
};

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-columns-'));
});

const FOUR_WIRE = 'supply:\n  system: three-phase-4wire\n  voltage: { lineToLine: 400 }\n  frequencyHz: 50\n';

describe('trivar profile reading interval data', () => {
  it('a phase in kW alone: at its loads’ rated power factor, said in the text and the JSON', () => {
    const board = file('bakery.yaml', `name: Bakery back room\n${FOUR_WIRE}loads:\n  - { name: Dough mixer, connection: A-N, kW: 3, pf: 0.7 }\n  - { name: Proofer fan, connection: A-N, kW: 2, pf: 0.72 }\n`);
    const data = file('bakery.csv', 'time,phase A [kW]\n2025-02-03T05:00Z,5\n2025-02-03T05:15Z,5\n');
    const text = runTrivar(['profile', board, '--data', data]);
    expect(text.code).toBe(0);
    // I_A = √(5² + 4.988²) kVA / 230.94 V = 30.6 A (21.7 A at PF 1).
    expect(text.stdout).toMatch(/line A\s+30\.6\s/);
    expect(text.stdout).toContain('"phase A [kW]" has no kvar or pf column: taken at PF 0.708 lagging, the rated power factor of the');
    expect(text.stdout).not.toContain('taken as off');
    const json = JSON.parse(runTrivar(['profile', board, '--data', data, '--json']).stdout);
    expect(json.columnNotes).toHaveLength(1);
    // Billing PF = 5 / √(5² + 4.988²) = 0.708, the phase's own: the only phase drawing power.
    const q = 3 * Math.tan(Math.acos(0.7)) + 2 * Math.tan(Math.acos(0.72));
    expect(json.before.energy.billingPf).toBeCloseTo(5 / Math.hypot(5, q), 9);
    expect(json.before.energy.billingPf).toBeCloseTo(0.708, 3);
  });

  it('irregular rows: energy over the clock, and the note says how rows count', () => {
    const board = file('joinery.yaml', `name: Joinery shop\n${FOUR_WIRE}loads:\n  - { name: Spindle moulder, connection: ABC-star, kW: 7.5, pf: 0.8 }\n  - { name: Glue pot, connection: C-N, kW: 2, pf: 1 }\n`);
    const data = file(
      'joinery.csv',
      'time,Spindle moulder [x],Glue pot [x]\n2025-02-03T07:00Z,1,0\n2025-02-03T07:15Z,1,0\n2025-02-03T07:22Z,1,1\n2025-02-03T07:30Z,1,0\n2025-02-03T07:45Z,1,0\n',
    );
    const r = runTrivar(['profile', board, '--data', data, '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    // 7.5 kW × 1 h + 2 kW × 8 min = 7.767 kWh over 1 h.
    expect(json.before.energy.kWhImport).toBeCloseTo(7.7667, 4);
    expect(json.before.hours).toBeCloseTo(1, 9);
    const text = runTrivar(['profile', board, '--data', data]).stdout;
    expect(text.replace(/\s+/g, ' ')).toContain('2 steps between rows are not a whole number of intervals: each row counts for the time from its stamp to the next row');
  });

  it('a record mostly filled in: a warning with the counts, in the text and the JSON', () => {
    const board = file('shed.yaml', `name: Potting shed\n${FOUR_WIRE}loads:\n  - { name: Heater, connection: A-N, kW: 2, pf: 1 }\n`);
    const data = file('shed.csv', 'time,Heater [x]\n2025-02-03T00:00Z,1\n2025-02-03T01:00Z,1\n2025-02-03T22:00Z,0\n');
    const text = runTrivar(['profile', board, '--data', data, '--fill-gaps', 'hold']);
    expect(text.code).toBe(0);
    expect(text.stdout.replace(/\s+/g, ' ')).toContain('! 20 of the 23 intervals (87.0 %) are made up by the gap fill (the last reading held) and 3 were read');
    const json = JSON.parse(runTrivar(['profile', board, '--data', data, '--fill-gaps', 'hold', '--json']).stdout);
    expect(json.warnings[0]).toMatch(/^20 of the 23 intervals \(87\.0 %\) are made up/);
  });

  it('perPhase on a board without a neutral is refused by its field', () => {
    const board = file(
      'screen.yaml',
      'name: Gravel screen house\nsupply:\n  system: three-phase-3wire\n  voltage: { lineToLine: 400 }\n  frequencyHz: 50\nloads:\n  - { name: Screen drive, connection: ABC-delta, kW: 22, pf: 0.8 }\nprofile:\n  bank: { perPhase: true }\n',
    );
    const data = file('screen.csv', 'time,Screen drive [x]\n2025-02-03T07:00Z,1\n2025-02-03T07:15Z,0.5\n');
    const r = runTrivar(['profile', board, '--data', data, '--bank']);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('profile.bank.perPhase: expected false or left out on a board without a neutral');
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('a semicolon-separated file: the error says the separator must be a comma', () => {
    const board = file('kettle.yaml', `name: Tea room\n${FOUR_WIRE}loads:\n  - { name: Kettle, connection: A-N, kW: 2, pf: 1 }\n`);
    const data = file('kettle.csv', '\ufefftime;Kettle [x]\n2025-02-03T07:00Z;0,5\n');
    const r = runTrivar(['profile', board, '--data', data]);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain("header: expected columns separated by commas, with a point for decimals (1.25): the header's columns are separated by semicolons");
  });
});
