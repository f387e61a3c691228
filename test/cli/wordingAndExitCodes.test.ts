/**
 * Small wording items and exit codes that must agree across commands: an unknown board named on the
 * command line is a usage error (exit 2) for every command; a hand check asked of an installation is
 * the file's problem (exit 3) for check and report alike.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { lengthFigure } from '../../packages/core/src/board/feederModel.js';
import { runTrivar } from './runTrivar.js';

const dir = mkdtempSync(join(tmpdir(), 'trivar-wording-'));
const write = (name: string, text: string): string => {
  const file = join(dir, name);
  writeFileSync(file, text);
  return file;
};

const house = write(
  'house.yaml',
  [
    'name: Split house',
    'supply: { voltage: 120/240, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.2, xOverR: 1.8 } }',
    'boards:',
    '  - name: Service panel',
    '    feeder: { lengthFt: 60, line: { awg: "2/0", material: aluminum, ratingA: 175 }, neutral: { awg: "1/0", material: aluminum } }',
    '    loads:',
    '      - { name: Kitchen, connection: L1-N, kW: 1.8, pf: 0.95 }',
    '  - name: Jumpered panel',
    '    fedFrom: Service panel',
    '    feeder: { lengthFt: 0.001, line: { awg: "8" } }',
    '    loads:',
    '      - { name: Heater, connection: L1-L2, kW: 2 }',
    '  - name: PV only',
    '    fedFrom: Service panel',
    '    loads:',
    '      - { name: Inverter, connection: L1-L2, kW: -7.6 }',
    '',
  ].join('\n'),
);
const figures = write('figures.yaml', 'capacitors: [ { branch: L1-L2, kvar: 2 } ]\n');
const data = write('data.csv', 'time,Kitchen [kW]\n2026-01-01T00:00,1\n2026-01-01T01:00,1\n');

describe('wording', () => {
  it('an exporting board with no vars: "7.600 kW exported, with no reactive power"', () => {
    const r = runTrivar(['solve', house, '--board', 'PV only']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/to Service panel +7\.600 kW exported, with no reactive power\n/);
    expect(r.stdout).not.toContain('the board no reactive power');
  });

  it('a generator without pf is taken as 1 without being called a resistive load', () => {
    const r = runTrivar(['solve', house, '--board', 'PV only']);
    expect(r.stdout).toContain('*: pf not given in the file, taken as 1 (exporting at unity power factor).');
    expect(r.stdout).not.toContain('resistive');
    const consumer = runTrivar(['solve', house, '--board', 'Jumpered panel']);
    expect(consumer.stdout).toContain('*: pf not given in the file, taken as 1 (a resistive load).');
  });

  it('an aluminium size that is not tabulated: "expected an aluminium size"', () => {
    const board = write('al.yaml', 'supply: { voltage: 400/230, frequencyHz: 50 }\nfeeder: { lengthM: 20, line: { mm2: 7, material: aluminium } }\nloads: [ { name: a, connection: A-N, kW: 1 } ]\n');
    const r = runTrivar(['solve', board]);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('feeder.line.mm2: expected an aluminium size in IEC 60228');
  });

  it('--board on a board file: "--board applies to installation files"', () => {
    const r = runTrivar(['diagram', 'examples/corner-bakery.yaml', '--board', 'x', '-o', join(dir, 'd.svg')]);
    expect(r.stderr).toContain('--board applies to installation files (with boards:), and this is a single board');
    const both = runTrivar(['solve', 'examples/corner-bakery.yaml', '--board', 'x']);
    expect(both.stderr).toContain('--board and --all-boards apply to installation files');
  });

  it('a 0.001 ft feeder is not printed as 0 ft', () => {
    const r = runTrivar(['solve', house]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('8 AWG Cu, < 0.01 ft');
    expect(r.stdout).not.toMatch(/\b0 ft/);
    expect([lengthFigure(120, 0), lengthFigure(0.4, 0), lengthFigure(0.001, 0), lengthFigure(12.34, 1), lengthFigure(0.04, 1), lengthFigure(0, 0)]).toEqual(['120', '0.4', '< 0.01', '12.3', '0.04', '0']);
  });
});

describe('exit codes that agree', () => {
  it.each([
    ['solve', ['solve', house, '--board', 'Nope']],
    ['correct', ['correct', house, '--board', 'Nope']],
    ['harmonics', ['harmonics', house, '--board', 'Nope']],
    ['diagram', ['diagram', house, '--board', 'Nope', '-o', join(dir, 'n.svg')]],
    ['profile', ['profile', house, '--data', data, '--bank', '--board', 'Nope']],
    ['rebalance', ['rebalance', house, '--boards', 'Nope']],
  ])('%s with a board name no board has: exit 2, naming the option and the boards', (_, args) => {
    const r = runTrivar(args);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--boards?: expected (a board of this installation: |one of )"Service panel", "Jumpered panel", "PV only" \(received "Nope"\)/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('a hand check asked of an installation: exit 3 from check and from report --hand-figures', () => {
    expect(runTrivar(['check', house, figures]).code).toBe(3);
    expect(runTrivar(['report', house, '--hand-figures', figures, '-o', join(dir, 'r.html')]).code).toBe(3);
  });
});
