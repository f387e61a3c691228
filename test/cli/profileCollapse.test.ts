/**
 * Intervals in which the supply cannot carry the load: the profile counts them and says what their
 * figures are worth, and exits 4 after its report, as `trivar solve` refuses the same state (exit 4) —
 * checked interval by interval.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runTrivar } from './runTrivar.js';

// A 10 kVA, 25 % transformer and 50 kW of heaters on two phases: at full load it collapses; at 5 % it does not.
const supply = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 10, impedancePercent: 25, xOverR: 2 } }';
const board = (scale: number) => `${supply}\nloads:\n  - { name: a, connection: A-N, kW: ${30 * scale}, pf: 0.9 }\n  - { name: b, connection: B-N, kW: ${20 * scale}, pf: 0.9 }\n`;

describe('a profile with intervals past the supply\'s limit', () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-collapse-'));
  const file = join(dir, 'board.yaml');
  writeFileSync(file, board(1));
  const data = join(dir, 'data.csv');
  writeFileSync(data, 'time,a [x],b [x]\n2025-06-01 12:00,1,1\n2025-06-01 12:15,0.05,0.05\n2025-06-01 12:30,0,0\n');

  it('counts the hours with a phase below 50 % and warns; solve agrees interval by interval', () => {
    // The report is written, then the command fails as solve does (exit 4), naming the hours.
    const json = runTrivar(['profile', file, '--data', data, '--json']);
    expect(json.code).toBe(4);
    expect(json.stderr).toContain('the supply cannot carry the load in some intervals: a phase below 50 % of nominal for 0.25 h');
    const before = JSON.parse(json.stdout).before;
    // Only the first 15-minute interval: solve refuses the board at full load and solves it at 5 %.
    expect(before.hoursCollapsed).toBe(0.25);
    expect(runTrivar(['solve', '-'], board(1)).code).toBe(4);
    expect(runTrivar(['solve', '-'], board(0.05)).code).toBe(0);
    const text = runTrivar(['profile', file, '--data', data]).stdout.replace(/\s+/g, ' ');
    expect(text).toContain('! a phase voltage below 50 % of nominal for 0.25 h: there the supply cannot carry the load');
  });

  it('on an installation: the same exit, naming the boards whose intervals collapsed', () => {
    const installation = join(dir, 'installation.yaml');
    writeFileSync(
      installation,
      `name: weak yard\n${supply}\nboards:\n  - { name: Main, loads: [ { name: lamp, connection: C-N, kW: 0.1 } ] }\n  - name: Shed\n    fedFrom: Main\n    loads:\n      - { name: a, connection: A-N, kW: 30, pf: 0.9 }\n      - { name: b, connection: B-N, kW: 20, pf: 0.9 }\n`,
    );
    const shedData = join(dir, 'shed.csv');
    writeFileSync(shedData, 'time,Shed/a [x],Shed/b [x]\n2025-06-01 12:00,1,1\n2025-06-01 12:15,0.05,0.05\n');
    const r = runTrivar(['profile', installation, '--data', shedData, '--json']);
    expect(r.code).toBe(4);
    expect(JSON.parse(r.stdout).boards.map((b: { before: { hoursCollapsed: number } }) => b.before.hoursCollapsed)).toEqual([0.25, 0.25]);
    expect(r.stderr).toContain('the supply cannot carry the load in some intervals (Main, Shed): a phase below 50 % of nominal for 0.25 h');
  });

  it('says nothing of it where no interval is past the limit', () => {
    const light = join(dir, 'light.csv');
    writeFileSync(light, 'time,a [x],b [x]\n2025-06-01 12:00,0.05,0.05\n2025-06-01 12:15,0,0\n');
    const r = runTrivar(['profile', file, '--data', light, '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).before.hoursCollapsed).toBe(0);
    expect(runTrivar(['profile', file, '--data', light]).stdout).not.toMatch(/below 50 %/);
  });
});
