import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseBoardText, solveBoard } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

// Board files; installation files (with boards:) have their own tests in installationCommand.test.ts.
const examples = readdirSync(`${ROOT}examples`).filter((f) => f.endsWith('.yaml') && !/^boards:/m.test(readFileSync(`${ROOT}examples/${f}`, 'utf8')));

describe('trivar solve (built binary)', () => {
  it.each(examples)('solves examples/%s and prints the report', (file) => {
    const r = runTrivar(['solve', `examples/${file}`]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const board = solveBoard(parseBoardText(readFileSync(`${ROOT}examples/${file}`, 'utf8')));
    expect(r.stdout).toContain(board.board.name);
    // The phase-A line current printed matches the library to the shown precision.
    const row = r.stdout.split('\n').find((l) => /^\s+A\s/.test(l))!;
    expect(row).toContain(board.phases[0]!.current.magnitude.toFixed(1));
    expect(r.stdout).toContain('licensed professional');
  });

  it('a balanced board: the N row shows no angle for a bar voltage of round-off size or for no neutral current', () => {
    const board = `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }\nfeeder: { line: { r: 0.02, x: 0.01 }, neutral: { r: 0.02, x: 0.01 } }\nloads: [{ name: heater, connection: ABC-star, kW: 9, pf: 1, model: constant-impedance }]\n`;
    const r = runTrivar(['solve', '-'], board);
    expect(r.code).toBe(0);
    const n = r.stdout.split('\n').find((l) => /^\s+N\s/.test(l))!;
    // "N", the bar voltage 0.0 and the neutral current 0.0, nothing else (no angles).
    expect(n.trim().split(/\s+/)).toEqual(['N', '0.0', '0.0']);
  });
  it('the note on loads across two lines comes with such a load only, not with a balanced delta motor', () => {
    const head = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }\nloads:\n';
    const motor = '  - { name: fan motor, connection: ABC-delta, kW: 11, pf: 0.8 }\n';
    const note = /A load across two lines splits its power unevenly/;
    expect(runTrivar(['solve', '-'], head + motor).stdout).not.toMatch(note);
    const welder = runTrivar(['solve', '-'], `${head}${motor}  - { name: welder, connection: A-B, kW: 6, pf: 0.98 }\n`).stdout;
    expect(welder.replace(/\s+/g, ' ')).toMatch(note);
  });

  it('a line whose vars print as 0.00 and PF as 1.000 gets no lead or lag tag (noise), one with vars does', () => {
    const head = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }\nloads:\n';
    const loads = [
      '  - { name: heater A, connection: A-N, kW: 10, pf: 1 }',
      '  - { name: indicator lamp, connection: A-N, kW: 0.001, pf: 0.5, sense: leading }',
      '  - { name: motor B, connection: B-N, kW: 3, pf: 0.8 }',
      '',
    ].join('\n');
    const rows = runTrivar(['solve', '-'], head + loads).stdout.split('\n');
    const lineA = rows.find((l) => /^\s+A\s/.test(l))!;
    expect(lineA).toMatch(/0\.00\s+1\.000(\s|$)/);
    expect(lineA).not.toMatch(/1\.000 (lead|lag)/);
    expect(rows.find((l) => /^\s+B\s/.test(l))!).toMatch(/0\.800 lag/);
    // Line C carries nothing: no angle beside its 0.0 A (it read 0.0°, a round-off current's angle).
    // 230.9 V from a 400 V source is 100.4 % of the 230 V nominal (IEC 60038 230/400).
    expect(rows.find((l) => /^\s+C\s/.test(l))!.trim().split(/\s+/)).toEqual(['C', '230.9', '120.0', '100.4', '0.0', '0.0', '0.00', '0.00', '-']);
  });

  it('--json prints exactly the library result', () => {
    const r = runTrivar(['solve', 'examples/corner-bakery.yaml', '--json']);
    expect(r.code).toBe(0);
    const expected = solveBoard(parseBoardText(readFileSync(`${ROOT}examples/corner-bakery.yaml`, 'utf8')));
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
  });

  it('reads the board from standard input with -', () => {
    const text = readFileSync(`${ROOT}examples/harbour-cottages.yaml`, 'utf8');
    const r = runTrivar(['solve', '-', '--json'], text);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).board.system).toBe('split-phase');
  });

  it('--open-neutral adds the broken-neutral study with its caution', () => {
    const r = runTrivar(['solve', 'examples/hillside-workshop.yaml', '--open-neutral']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('If the neutral conductor broke');
    expect(r.stdout).toMatch(/hazardous/);
  });

  it('exits 3 with every problem and its field path for an invalid board', () => {
    const r = runTrivar(['solve', '-'], 'supply:\n  system: three-phase-4wire\n  voltage: { lineToLine: 0 }\n  frequencyHz: 50\nloads:\n  - { name: x, connection: A-N, kW: 1, pf: 1.5 }\n');
    expect(r.code).toBe(3);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('supply.voltage.lineToLine');
    expect(r.stderr).toContain('loads[0].pf');
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('exits 3 for a missing file, 2 for a wrong command line', () => {
    expect(runTrivar(['solve', 'examples/no-such-board.yaml']).code).toBe(3);
    expect(runTrivar(['solve', 'examples/corner-bakery.yaml', '--no-such-option']).code).toBe(2);
    expect(runTrivar(['solve']).code).toBe(2);
  });

  it('exits 4 when the network has no solution (resonant neutral bar)', () => {
    // The neutral conductor's −j0.1 S and the capacitor's +j0.1 S meet at the bar and cancel.
    const board = [
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'feeder: { neutral: { r: 0, x: 10 } }',
      'loads:',
      '  - { name: cap, connection: A-N, ohms: { r: 0, x: -10 } }',
    ].join('\n');
    const r = runTrivar(['solve', '-'], board);
    expect(r.code).toBe(4);
    expect(r.stderr).toContain('the board neutral bar');
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('help text lists the options and exit codes', () => {
    const r = runTrivar(['solve', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });

  it('schema prints the JSON Schema shipped with core', () => {
    const r = runTrivar(['schema']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(readFileSync(`${ROOT}packages/core/board.schema.json`, 'utf8')));
  });

  it('schema --installation prints the installation JSON Schema shipped with core', () => {
    const r = runTrivar(['schema', '--installation']);
    expect(r.code).toBe(0);
    const schema = JSON.parse(r.stdout);
    expect(schema).toEqual(JSON.parse(readFileSync(`${ROOT}packages/core/installation.schema.json`, 'utf8')));
    expect(schema.required).toEqual(['supply', 'boards']);
    expect(schema.properties.boards.items.properties.loads.items.properties.connection.enum).toContain('L1-N');
  });
});
