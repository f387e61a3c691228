import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, studyHarmonics, studyInstallationHarmonics } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

const offices = 'examples/mill-street-offices.yaml';

describe('trivar harmonics (built binary)', () => {
  it('reports currents, neutral, resonance and duty with cautions', () => {
    const r = runTrivar(['harmonics', offices]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    for (const heading of ['Currents (rms with harmonics', 'Neutral conductor', 'Current distortion at the feed (IEEE 519)', 'Resonance with the supply', 'Capacitor duty with harmonics'])
      expect(r.stdout).toContain(heading);
    expect(r.stdout).toMatch(/resonance with the supply at h ≈ 6\.9\d, within ±10 % of order 7/);
    expect(r.stdout).toContain('licensed professional');
  });

  it('--json is the library report, scan data included', () => {
    const r = runTrivar(['harmonics', offices, '--json']);
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout);
    const expected = studyHarmonics(readBoardText(readFileSync(`${ROOT}${offices}`, 'utf8')));
    expect(report).toEqual(JSON.parse(JSON.stringify(expected)));
    expect(report.scan.combinations).toHaveLength(16);
    expect(report.scan.combinations[15].impedanceOhm).toHaveLength(6);
    expect(report.scan.combinations[15].impedanceOhm[0]).toHaveLength(report.scan.orders.length);
  });

  it('bad spectra exit 3 naming the field, without a stack trace', () => {
    const board = readFileSync(`${ROOT}${offices}`, 'utf8').replace('spectrum: led-driver }', 'spectrum: [{ order: 3.5, percent: 20 }] }');
    const r = runTrivar(['harmonics', '-'], board);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('loads[3].spectrum[0].order');
    expect(r.stderr).not.toMatch(/\bat .*\.js:\d+/);
  });
});

describe('trivar harmonics: what the bus voltages are judged against (built binary)', () => {
  const board = readFileSync(`${ROOT}${offices}`, 'utf8');
  const judged = (stdout: string) => stdout.replace(/\n\s+/g, ' ').match(/bus voltages against the (.*?): (within on every bus voltage|EXCEEDED on [^(]*)/);

  it('an IEC board: the IEC 61000-2-2 level of every order solved, and the warning names the level a failing order exceeds', () => {
    const r = runTrivar(['harmonics', offices]);
    expect(r.code).toBe(0);
    expect(judged(r.stdout)![1]).toBe(
      'IEC 61000-2-2 compatibility levels (the default of the board’s region): h3 5 %, h5 6 %, h7 5 %, h9 1.5 %, h11 3.5 %, h13 3 %, h15 0.4 %, h17 2 %, h19 1.76 %, 8 % THD',
    );
    expect(r.stdout.replace(/\n\s+/g, ' ')).toMatch(/above its level \(IEC 61000-2-2 compatibility levels; % of the fundamental\): A-N h7 6\.4 % \(level 5 %\)/);
  });

  it('harmonics.voltageDistortionLimits switches the basis: EN 50160, then IEEE 519', () => {
    const en = runTrivar(['harmonics', '-'], board.replace('harmonics:\n', 'harmonics:\n  voltageDistortionLimits: en50160\n'));
    expect(en.code).toBe(0);
    expect(judged(en.stdout)![1]).toMatch(/^EN 50160 supply levels \(named in the board file\): h3 5 %, h5 6 %, h7 5 %, h9 1\.5 %, h11 3\.5 %, h13 3 %, h15 0\.5 %/);
    const ieee = runTrivar(['harmonics', '-'], board.replace('harmonics:\n', 'harmonics:\n  voltageDistortionLimits: ieee-519\n'));
    expect(judged(ieee.stdout)![1]).toBe('IEEE 519 limits for ≤ 1 kV (named in the board file): 5 % one order, 8 % THD');
  });

  it('a THD just over 8 % is printed with the decimals to read over it, in the table, the verdict and the warning alike; a 5th at its 6 % level is within', () => {
    // A stiff 230/400 V supply carrying 6 % at h5, 5 % at h7 and 1.8221 % at h11: THD √(36 + 25 + 3.3200) = 8.0200 %.
    const plant = [
      'name: quay ice plant',
      'supply: { system: three-phase-4wire, voltage: "230/400", frequencyHz: 50 }',
      'loads:',
      '  - { name: brine pumps, connection: L1L2L3-delta, kW: 15, pf: 0.9 }',
      'harmonics:',
      '  background: [{ order: 5, percent: 6 }, { order: 7, percent: 5 }, { order: 11, percent: 1.8221 }]',
      '',
    ].join('\n');
    const r = runTrivar(['harmonics', '-'], plant);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^ {2}L1-N +231\.7 +8\.02 +h5 6\.0 %/m);
    expect(judged(r.stdout)![2]).toMatch(/^EXCEEDED on L1-N, L2-N, L3-N, L1-L2, L2-L3, L3-L1/);
    expect(r.stdout.replace(/\n\s+/g, ' ')).toContain('voltage THD at the board on L1-N is 8.02 %, above 8 % (IEC 61000-2-2 compatibility levels)');
    expect(r.stdout).not.toMatch(/h5 6\.0+\d* % \(level 6 %\)/);
  });

  it('a wrong basis exits 3 naming the field and the words it takes', () => {
    const r = runTrivar(['harmonics', '-'], board.replace('harmonics:\n', 'harmonics:\n  voltageDistortionLimits: iec-61000\n'));
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('harmonics.voltageDistortionLimits');
    expect(r.stderr).toMatch(/iec-61000-2-2.*en50160.*ieee-519/s);
    expect(r.stderr).not.toMatch(/\bat .*\.js:\d+/);
  });
});

describe('trivar harmonics on an installation (built binary)', () => {
  const yard = 'examples/harrow-yard-studios.yaml';
  it('one summary row per board, the supply intake, the bank seen from its board, warnings naming their board', () => {
    const r = runTrivar(['harmonics', yard]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const table = r.stdout.slice(r.stdout.indexOf('Boards ('), r.stdout.indexOf('Current distortion at the supply intake'));
    for (const board of ['Main switchboard', '└ Workshop', '└ Studios ground', '  └ Studios upper']) expect(table).toContain(board);
    // The shared riser neutral: 178 A of a 110 A rating, almost all of it triplen current.
    expect(table).toMatch(/└ Studios ground .* 178\.3 +177\.5 +162 OVER/);
    expect(r.stdout).toContain('Resonance with the supply seen from Workshop (S_sc');
    expect(r.stdout).toContain('Capacitor duty with harmonics, bank on Workshop');
    expect(r.stdout).toContain('! Studios ground: the neutral carries 178.3 A rms');
    expect(r.stdout).toContain('! supply intake: line A: TDD');
    expect(r.stdout).toContain('--board "<name>"');
    expect(r.stdout).not.toContain('━━');
    expect(r.stdout).toContain('licensed professional');
  });

  it('two banks: each scanned with every other bank on, then with the other banks switched, the state named under each row', () => {
    const r = runTrivar(['harmonics', 'examples/ferrybank-joinery.yaml']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Resonance with the supply seen from Machine shop, every other bank fully on (S_sc');
    const joint = r.stdout.slice(r.stdout.indexOf('Resonance seen from Machine shop with the other banks switched'), r.stdout.indexOf('Capacitor duty with harmonics, bank on Machine shop'));
    // The full bank: 6.0 … 7.2 over the finishing shop's states, on the 7th with that bank off.
    expect(joint).toMatch(/steps 1\+2\+3 +99\.2 +6\.0 … 7\.2 +7 +h 7\.01, 0\.1 % from 7\n +with Finishing shop bank off\n/);
    expect(joint).toContain('other banks scanned at Finishing shop: off, step 1, steps 1+2');
    // Warnings are wrapped to the report width: read them as one line each.
    expect(r.stdout.replace(/\n {4}/g, ' ')).toContain('! Machine shop: Machine shop bank steps 1+2+3 with Finishing shop bank off: resonance with the supply at h ≈ 7.01, within ±10 % of order 7');
    const unwrapped = r.stdout.replace(/\n {4}/g, ' ');
    expect(unwrapped).toContain('other banks on, out of service and in any state the joint scan finds near a checked order: steps 1+2, capacitance +10 %, every load off, other banks on');
    // Finishing shop's worst duty is with Machine shop at steps 1+3, a state the joint scan found near a checked order.
    expect(unwrapped).toContain('near a checked order: step 1, capacitance +10 %, every load off, Machine shop bank steps 1+3');
  });

  it('--board prints that board’s full figures; --all-boards every board’s', () => {
    const one = runTrivar(['harmonics', yard, '--board', 'Studios upper']);
    expect(one.code).toBe(0);
    expect(one.stdout).toContain('━━ Studios upper (fed from Studios ground) ━━');
    expect(one.stdout).toContain('Currents in the feeder into Studios upper');
    expect(one.stdout).toContain('Neutral of the feeder into Studios upper');
    expect(one.stdout.match(/━━ /g)).toHaveLength(1);
    const all = runTrivar(['harmonics', yard, '--all-boards']);
    expect(all.stdout.match(/━━ /g)).toHaveLength(4);
  });

  it('--json is the library report', () => {
    const r = runTrivar(['harmonics', yard, '--json']);
    expect(r.code).toBe(0);
    const expected = studyInstallationHarmonics(readBoardText(readFileSync(`${ROOT}${yard}`, 'utf8')));
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
  });

  it('an unknown --board exits 2 (a command-line problem, as rebalance --boards) with the boards there are; --board on a board file exits 3', () => {
    const unknown = runTrivar(['harmonics', yard, '--board', 'Loft']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toContain('"Main switchboard", "Workshop"');
    expect(unknown.stderr).toContain('"Loft"');
    const onBoard = runTrivar(['harmonics', offices, '--all-boards']);
    expect(onBoard.code).toBe(3);
    expect(onBoard.stderr).toContain('apply to installation files');
  });

  it('a bank on a board the file does not have exits 3 naming harmonics.banks[0].board', () => {
    const text = readFileSync(`${ROOT}${yard}`, 'utf8').replace('{ board: Workshop,', '{ board: Workshops,');
    const r = runTrivar(['harmonics', '-'], text);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('harmonics.banks[0].board');
    expect(r.stderr).toContain('"Workshops"');
    expect(r.stderr).not.toMatch(/\bat .*\.js:\d+/);
  });
});

describe('trivar correct with harmonic data (built binary)', () => {
  const works = 'examples/quayside-print-works.yaml';
  it('compares the plain bank with detuned variants and reports the chosen detuned bank', () => {
    const r = runTrivar(['correct', works]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('MEETS THE TARGET — delta bank with 7 % detuning reactors');
    expect(r.stdout).toContain('Harmonic check: plain and detuned banks');
    expect(r.stdout).toMatch(/plain .* FAILS/);
    expect(r.stdout).toMatch(/detuned 7 % \* .* passes/);
    expect(r.stdout).toContain('a detuned bank keeps it below its tuning order');
  });
  it('--json carries the comparison and the chosen bank’s harmonic study', () => {
    const report = JSON.parse(runTrivar(['correct', works, '--json']).stdout);
    expect(report.harmonics.chosen).toBe('detuned 7 %');
    expect(report.harmonics.check.scan.combinations.length).toBe(2 ** report.selection.controller.outputsUsed);
    expect(report.selection.steps.every((s: { detuningFactor: number }) => s.detuningFactor === 0.07)).toBe(true);
  });
});

describe('trivar harmonics --help', () => {
  it('help text', () => {
    const r = runTrivar(['harmonics', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});

describe('trivar correct without an arrangement on a board with harmonic data (built binary)', () => {
  it('compares the arrangements, each with its plain and detuned variants', () => {
    const board = readFileSync(`${ROOT}examples/quayside-print-works.yaml`, 'utf8').replace('  arrangement: delta-bank\n', '');
    const r = runTrivar(['correct', '-'], board);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Arrangements compared');
    expect(r.stdout).toContain('Harmonic check of every arrangement: plain and detuned banks');
    expect(r.stdout).toMatch(/delta bank\s+plain .* FAILS/);
  });
});

describe('trivar correct comparing arrangements on a split-phase board with harmonic data (built binary)', () => {
  it('says why each failing variant fails, the ones the table cannot show included (no unit fits)', () => {
    // A cabin whose well pump pulls the lines to PF 0.93 lagging: only a line-to-line bank fits the
    // North-American catalogue, and no unit suits the raised capacitor voltage of a detuned one.
    const board = readFileSync(`${ROOT}examples/pine-hollow-cabin.yaml`, 'utf8')
      .replace('kW: 1.1, pf: 0.78', 'kW: 3.5, pf: 0.6')
      .replace('kW: 1.5, pf: 0.95 }', 'kW: 1.5, pf: 0.95, spectrum: switch-mode }')
      .replace('studies:', 'harmonics:\n  background: [{ order: 5, percent: 2 }]\nstudies:');
    const r = runTrivar(['correct', '-'], board);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/L-L bank\s+plain \*.* passes/);
    expect(r.stdout).toMatch(/detuned 7 % .* FAILS/);
    expect(r.stdout).toContain('L-L bank, detuned 5.67 %, detuned 7 %, detuned 14 %: no unit of the catalogue suits its capacitor');
  });
});
