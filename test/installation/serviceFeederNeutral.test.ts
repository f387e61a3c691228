/**
 * One rule for every feeder: line conductors without a neutral, where loads return current through
 * the neutral, are refused with the field path and what is accepted — on a board file's feeder and an
 * installation's service feeder as on a sub-board's. Taken as written the neutral would have no
 * impedance, which on a single-phase load halves the drop and the loss.
 * Invented scenario: a ferry ticket office at the end of 100 m of 0.3 Ω/km cable, one 5 kW, PF 0.95
 * single-phase load on an ideal 230/400 V supply.
 */
import { describe, expect, it } from 'vitest';
import { InputError, readBoardText, solveBoard, solveInstallation } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const CABLE = '{ lengthM: 100, rOhmPerKm: 0.3, xOhmPerKm: 0.08 }';
const office = (feeder: string) =>
  ['name: Ferry ticket office', 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }', `feeder: ${feeder}`, 'loads:', '  - { name: Ticket desk, connection: A-N, kW: 5, pf: 0.95, model: constant-impedance }', ''].join('\n');
const pier = (feeder: string) =>
  ['name: Ferry pier', 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }', 'boards:', '  - name: Ticket office', `    feeder: ${feeder}`, '    loads: [ { name: Ticket desk, connection: A-N, kW: 5, pf: 0.95, model: constant-impedance } ]', ''].join('\n');

const refusal = (solve: () => unknown) => {
  try {
    solve();
  } catch (error) {
    if (error instanceof InputError) return error.issues;
    throw error;
  }
  throw new Error('accepted');
};

describe('a feeder with lines and no neutral', () => {
  it('a board file: refused at feeder.neutral, naming the load and what is accepted', () => {
    expect(refusal(() => solveBoard(readBoardText(office(`{ line: ${CABLE} }`))))).toEqual([
      expect.objectContaining({
        code: 'missing',
        path: 'feeder.neutral',
        message: 'feeder.neutral: expected the neutral conductor, which "Ticket desk" return through: its size with the length (e.g. neutral: { mm2: … }), or r: 0, x: 0 for a neutral of no impedance',
      }),
    ]);
  });

  it("an installation's service feeder: refused the same way at its path", () => {
    expect(refusal(() => solveInstallation(readBoardText(pier(`{ line: ${CABLE} }`))))).toEqual([
      expect.objectContaining({
        code: 'missing',
        path: 'boards[0].feeder.neutral',
        message: 'boards[0].feeder.neutral: expected the neutral conductor, which "Ticket desk" on Ticket office return through: its size with the length (e.g. neutral: { mm2: … }), or r: 0, x: 0 for a neutral of no impedance',
      }),
    ]);
  });

  it('the command line: exit 3 with the field path, no stack trace', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-service-neutral-'));
    const file = join(dir, 'office.yaml');
    writeFileSync(file, office(`{ line: ${CABLE} }`));
    const r = runTrivar(['solve', file]);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('  - feeder.neutral: expected the neutral conductor, which "Ticket desk" return through');
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('with the neutral written, the drop and loss are the two conductors’ (hand figures, series loop)', () => {
    // Hand check: a single-phase load as an impedance at its rating, Z = V²/S* with V = 400/√3, in series with
    // the line and the neutral, each (0.03 + j0.008) Ω. I = E / (Z + 2 Z_c); loss = 2 |I|² R_c.
    const ln = 400 / Math.sqrt(3);
    const s = { re: 5000, im: 5000 * Math.tan(Math.acos(0.95)) };
    const z = { re: (ln * ln * s.re) / (s.re ** 2 + s.im ** 2), im: (ln * ln * s.im) / (s.re ** 2 + s.im ** 2) };
    const loop = { re: z.re + 0.06, im: z.im + 0.016 };
    const current = ln / Math.hypot(loop.re, loop.im);
    const lossKW = (2 * current ** 2 * 0.03) / 1000;
    const loadV = current * Math.hypot(z.re, z.im);
    const both = solveBoard(readBoardText(office(`{ line: ${CABLE}, neutral: ${CABLE} }`)));
    expect(both.losses.totalKW).toBeCloseTo(lossKW, 5);
    expect(lossKW).toBeCloseTo(0.0308, 4);
    expect(both.loads[0]!.branches[0]!.voltage.magnitude).toBeCloseTo(loadV, 6);
    // The neutral of no impedance, written as such, is accepted and gives half the loss.
    const ideal = solveBoard(readBoardText(office(`{ line: ${CABLE}, neutral: { r: 0, x: 0 } }`)));
    expect(ideal.losses.totalKW / both.losses.totalKW).toBeCloseTo(0.5, 2);
  });

  it('a board of three-phase loads only needs no neutral: a three-core feeder stays valid', () => {
    const motor = office(`{ line: ${CABLE} }`).replace('{ name: Ticket desk, connection: A-N,', '{ name: Ramp winch, connection: ABC-delta,');
    expect(solveBoard(readBoardText(motor)).loads[0]!.kW).toBeGreaterThan(4.9);
  });
});
