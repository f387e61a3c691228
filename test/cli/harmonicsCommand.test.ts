import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, studyHarmonics } from '@trivar/core';
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
