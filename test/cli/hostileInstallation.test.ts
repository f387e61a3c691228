/**
 * Installation files a user could write by mistake (or on purpose), through the
 * built binary: a collapsed sub-board, a 500-board chain, a broken-neutral study
 * asked of the whole installation, the same file as JSON on stdin.
 */
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from './runTrivar.js';
import { readFileSync } from 'node:fs';
import { readBoardText } from '@trivar/core';

const SUPPLY = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }';
const noStack = (stderr: string) => expect(stderr).not.toMatch(/\n\s+at .+[:(]\d+/);

describe('hostile installations through the CLI', () => {
  it('a sub-board whose feeder cannot carry its load: figures printed, SUPPLY COLLAPSE named at the board, exit 4', () => {
    const text = `${SUPPLY}\nboards:\n  - { name: Main, loads: [] }\n  - { name: Far shed, fedFrom: Main, feeder: { lengthM: 500, line: { mm2: 2.5 }, neutral: { mm2: 2.5 } }, loads: [{ name: plant, connection: ABC-delta, kW: 200, pf: 0.9 }] }\n`;
    const r = runTrivar(['solve', '-'], text);
    expect(r.code).toBe(4);
    noStack(r.stderr);
    expect(r.stderr).toMatch(/no viable operating point.*Far shed: the board voltage has collapsed/);
    expect(r.stdout).toMatch(/SUPPLY COLLAPSE[^\n]*\n {2}! Far shed: /);
    expect(r.stdout).toMatch(/Feeders/);
  });

  it('a board with limits of its own is judged and named against them, not against the main board\'s', () => {
    const text = `${SUPPLY}\nboards:\n  - { name: Main, loads: [{ name: ovens, connection: ABC-delta, kW: 40, pf: 1 }] }\n  - { name: Lab, fedFrom: Main, voltageLimits: { underPercent: 0.5, overPercent: 0.5 }, feeder: { lengthM: 40, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: rig, connection: A-N, kW: 6 }] }\n`;
    const r = runTrivar(['solve', '-'], text);
    expect(r.code).toBe(0);
    const line = r.stdout.slice(r.stdout.indexOf('voltage limits')).split('\n\n')[0]!.replace(/\s+/g, ' ');
    // under from the feeder drop, over where the 230.9 V source and the neutral shift lift a phase above 100.5 % of 230 V.
    expect(line).toMatch(/^voltage limits ±10 % \(en50160-supply\), 1 board with limits of its own: outside at Lab \(under\+over, against its own ±0\.5 % \(custom\)\)/);
  });
  it('a board that feeds others: its power balance adds up as printed, and a sub-board is fed from its board, not the supply', () => {
    const r = runTrivar(['solve', 'examples/maple-court-riser.yaml', '--board', 'Floor 3']);
    expect(r.code).toBe(0);
    const block = r.stdout.slice(r.stdout.indexOf('Power balance'));
    const kW = (label: string) => Number(new RegExp(`\\n {2}${label} +(-?[\\d.]+) kW`).exec(block)![1]);
    const sum = kW('loads') + kW('losses') + kW('boards beyond');
    expect(Math.abs(sum - kW('from Floor 2'))).toBeLessThanOrEqual(0.002); // three figures rounded to 0.001 kW
    expect(block).toMatch(/losses +[\d.]+ kW \(its feeder: line conductors/);
    expect(block.slice(0, block.indexOf('incomer'))).not.toMatch(/from the supply|source 0\.000/);
  });
  it('a 500-board chain solves, and the board table indents no deeper than six levels', () => {
    const boards = ['  - { name: B0, loads: [] }'];
    for (let k = 1; k < 500; k++)
      boards.push(`  - { name: B${k}, fedFrom: B${k - 1}, feeder: { lengthM: 2, line: { mm2: 95 }, neutral: { mm2: 95 } }, loads: [{ name: l${k}, connection: A-N, kW: 0.05 }] }`);
    const r = runTrivar(['solve', '-'], `${SUPPLY}\nboards:\n${boards.join('\n')}\n`);
    expect(r.code, r.stderr).toBe(0);
    const table = r.stdout.slice(r.stdout.indexOf('Boards'), r.stdout.indexOf('Feeders'));
    expect(table).toMatch(/\n {14}└ B7 \(level 8\) /);
    expect(table).toMatch(/\n {14}└ B499 \(level 500\) /);
    expect(Math.max(...table.split('\n').map((l) => l.length))).toBeLessThan(120);
  });

  it('--open-neutral on the whole installation shows a row per board and the cautions, not nothing', () => {
    const r = runTrivar(['solve', 'examples/maple-court-riser.yaml', '--open-neutral']);
    expect(r.code, r.stderr).toBe(0);
    const block = r.stdout.slice(r.stdout.indexOf("If a board's neutral broke"));
    for (const board of ['Main switchboard', 'Plant room', 'Floor 1', 'Floor 4']) expect(block).toMatch(new RegExp(`\\n  ${board} +\\d+\\.\\d +\\d+\\.\\d +\\d+\\.\\d +reached`));
    expect(block).toMatch(/A broken neutral is a hazardous condition/);
    expect(block).toMatch(/Never switch, fuse or disconnect the neutral/);
    // Without the study, no such section.
    expect(runTrivar(['solve', 'examples/maple-court-riser.yaml']).stdout).not.toMatch(/neutral broke/);
  });

  it('a caution every board gives with its own example figure is said once, naming whose break it quotes', () => {
    // Invented: a lab board behind a main board; either board's neutral breaking puts the magnet supply above the line-to-line voltage.
    const lab = [
      'name: Lab wing',
      'supply: { voltage: 230/400, frequencyHz: 50, transformer: { kVA: 160, impedancePercent: 4, xOverR: 3 } }',
      'boards:',
      '  - name: Main board',
      '    feeder: { lengthM: 15, line: { mm2: 70 }, neutral: { mm2: 70 } }',
      '    loads: [{ name: Compressor, connection: ABC-delta, kW: 15, pf: 0.85 }]',
      '  - name: Lab board',
      '    fedFrom: Main board',
      '    feeder: { lengthM: 35, line: { mm2: 16 }, neutral: { mm2: 6 } }',
      '    loads:',
      '      - { name: Furnace, connection: A-N, kW: 9 }',
      '      - { name: UPS, connection: B-N, kW: 7, pf: 0.7, sense: leading }',
      '      - { name: Magnet supply, connection: C-N, kW: 3, pf: 0.6 }',
    ].join('\n');
    const r = runTrivar(['solve', '-', '--open-neutral'], lab);
    expect(r.code, r.stderr).toBe(0);
    const block = r.stdout.slice(r.stdout.indexOf("If a board's neutral broke"), r.stdout.indexOf('\nNotes'));
    expect(block.match(/A broken neutral is a hazardous condition/g)).toHaveLength(1);
    expect(block.replace(/\s+/g, ' ')).toMatch(/\(here, with the neutral broken at (Main|Lab) board, "Magnet supply( \(Lab board\))?" would see 399\.\d V/);
    expect(block.match(/Never switch, fuse or disconnect the neutral/g)).toHaveLength(1);
  });

  it('the same installation as JSON on stdin gives the same figures as the YAML file', () => {
    const json = JSON.stringify(readBoardText(readFileSync(`${ROOT}examples/tannery-lane-works.yaml`, 'utf8')));
    const fromJson = runTrivar(['solve', '-', '--json'], json);
    const fromYaml = runTrivar(['solve', 'examples/tannery-lane-works.yaml', '--json']);
    expect(fromJson.code, fromJson.stderr).toBe(0);
    expect(JSON.parse(fromJson.stdout)).toEqual(JSON.parse(fromYaml.stdout));
  });
});
