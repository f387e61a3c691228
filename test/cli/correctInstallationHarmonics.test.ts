/**
 * `trivar correct` on an installation file with harmonic data (built binary): the bank on its board is
 * checked against the installation's harmonics with detuned variants beside it, as on a board file;
 * without harmonic data the report is as before; a bank of harmonics.banks that does not fit is named at its path.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { correctInstallationWithHarmonics, normaliseInstallation, parseInstallation, readBoardText, type InstallationHarmonicCorrection } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

const joinery = 'examples/ferrybank-joinery.yaml';
const args = ['correct', joinery, '--board', 'Machine shop', '--arrangement', 'delta-bank'];

describe('trivar correct on an installation file with harmonic data', () => {
  it('--json is the library result exactly: the bank on Machine shop with its harmonic check', () => {
    const r = runTrivar([...args, '--json']);
    expect(r.stderr).toBe('');
    const spec = parseInstallation(readBoardText(readFileSync(`${ROOT}${joinery}`, 'utf8')));
    const expected = correctInstallationWithHarmonics(spec, normaliseInstallation(spec).installation, { arrangement: 'delta-bank' }, { board: 'Machine shop' });
    expect(r.code).toBe(expected.report.harmonics.chosen === null ? 5 : 0);
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
    // The other bank (Finishing shop) is scanned switched; the file's Machine shop bank gives way to the designed one.
    const scan = expected.report.harmonics.check!.scans[0]!;
    expect(scan.board).toBe('Machine shop');
    expect(scan.jointScan!.otherBanks.map((o) => o.board)).toEqual(['Finishing shop']);
  }, 120_000);

  it('the text report shows the check, its verdict in the figures, and no caution that harmonics were not checked', () => {
    const r = runTrivar(args);
    const json = JSON.parse(runTrivar([...args, '--json']).stdout) as InstallationHarmonicCorrection;
    const h = json.report.harmonics;
    expect(r.stdout).toContain('Harmonic check: plain and detuned banks');
    const words = r.stdout.replace(/\s+/g, ' ');
    expect(words).not.toContain('does not check harmonics');
    expect(words).toContain('The harmonic check of this correction covers the spectra entered in the installation file');
    for (const v of h.variants) {
      const row = r.stdout.split('\n').find((l) => l.trimStart().startsWith(`${v.name}${v.name === h.chosen ? ' *' : ''} `))!;
      expect(row, v.name).toBeDefined();
      expect(row).toContain(v.passes ? 'passes' : 'FAILS');
      expect(row).toContain(v.lowestResonanceOrder!.toFixed(2));
    }
    // A variant that fails says why, with the orders it resonates near.
    for (const v of h.variants.filter((x) => !x.passes)) for (const o of v.resonantOrders) expect(v.reasons.join(' ')).toContain(`${o} (`);
    for (const line of r.stdout.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  }, 120_000);

  it('without harmonic data the installation report is as before: it says harmonics were not checked', () => {
    const r = runTrivar(['correct', 'examples/tannery-lane-works.yaml', '--board', 'Press shop', '--arrangement', 'star-bank']);
    expect(r.code).toBe(0);
    expect(r.stdout).not.toContain('Harmonic check');
    expect(r.stdout.replace(/\s+/g, ' ')).toContain('This study does not check harmonics');
  });

  it('a bank of harmonics.banks on a board the installation does not have: exit 3, naming its path', () => {
    const text = readFileSync(`${ROOT}${joinery}`, 'utf8').replace('board: Finishing shop, connection', 'board: Paint shop, connection');
    const r = runTrivar(['correct', '-', '--board', 'Machine shop', '--arrangement', 'delta-bank'], text);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('  - harmonics.banks[1].board: expected the name of a board in this installation');
    expect(r.stderr).not.toContain('correction.harmonics');
    expect(r.stderr).toContain('"Finishing shop"');
    expect(r.stderr).not.toMatch(/\bat .*\.js:\d+/);
  });
});
