/**
 * The harmonic study's displacement power factors carry their sense: a board that its bank, every step
 * on, pushes leading reads "lead" in the report, the JSON keeps the unsigned figure and adds the sense,
 * and a warning says the studied state over-corrects.
 */
import { describe, expect, it } from 'vitest';
import { displacementPfText, studyHarmonics, studyInstallationHarmonics } from '@trivar/core';
import { runTrivar } from './runTrivar.js';

/** An invented laundry on a stiff 1000 kVA supply, so the hand figures below need no voltage drop. */
const laundry = (stepsKvar: number[]) => ({
  name: 'Ashgrove laundry',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 1000, impedancePercent: 5, xOverR: 5 } },
  loads: [
    { name: 'Tumble dryers', connection: 'ABC-delta', kW: 30, pf: 0.85 },
    { name: 'Pressing', connection: 'A-N', kW: 6, pf: 0.8 },
    { name: 'Tills', connection: 'B-N', kW: 2, pf: 0.95, spectrum: 'switch-mode' },
  ],
  harmonics: { bank: { connection: 'delta', ratedV: 440, stepsKvar } },
});

describe("a board whose lines lag and lead at once", () => {
  it('gives the board no sense: its arithmetic PF falls short of 1 by the lines\' opposing vars, not by ΣQ1', () => {
    // Invented: a pottery yard whose star bank, every step on, leaves line C leading while A and B still lag.
    const yard = {
      name: 'Kiln yard sheds',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 200, impedancePercent: 4.5, xOverR: 3 } },
      loads: [
        { name: 'Pug mill', connection: 'ABC-delta', kW: 22, pf: 0.74, spectrum: 'six-pulse-drive' },
        { name: 'Glaze mixer', connection: 'A-N', kW: 4, pf: 0.7 },
        { name: 'Blower', connection: 'B-N', kW: 3, pf: 0.75 },
        { name: 'Lights', connection: 'C-N', kW: 2, pf: 0.95, spectrum: 'led-driver' },
      ],
      harmonics: { bank: { connection: 'star', ratedV: 250, detuningPercent: 7, stepsKvar: [10, 10, 10] } },
    };
    const r = studyHarmonics(yard);
    const senses = r.lines.map((l) => l.displacementSense);
    expect(senses).toContain('lagging');
    expect(senses).toContain('leading');
    // ΣQ1 is a few tens of var against 31 kW: printed as 0.0 kvar, so neither a sense nor "sends … back" is data.
    expect(Math.abs(r.powerFactor.fundamentalKvar)).toBeLessThan(0.05);
    expect(r.powerFactor.displacementSense).toBe('none');
    expect(r.powerFactor.displacement!).toBeLessThan(0.995);
    expect(r.warnings.map((w) => w.message).join(' ')).not.toMatch(/sends 0\.0 kvar/);
  });
});

describe('displacement PF sense in the harmonic study', () => {
  // Hand figures at 400 V: dryers 30 × tan(acos 0.85) = 18.59 kvar, 6.20 per line; pressing 6 × 0.75 = 4.50 kvar on A;
  // tills 2 × tan(acos 0.95) = 0.66 kvar on B; the bank 50 × (400/440)² = 41.32 kvar, 13.77 per line.
  // Line A 6.20 + 4.50 − 13.77 = −3.08 kvar with 16 kW (0.982 lead); B 6.20 + 0.66 − 13.77 = −6.92 kvar with
  // 12 kW (0.866 lead); C 6.20 − 13.77 = −7.58 kvar with 10 kW (0.797 lead); board 23.75 − 41.32 = −17.57 kvar.
  const over = studyHarmonics(laundry([25, 25]));

  it('each line: the unsigned figure, its sense and the fundamental kvar', () => {
    expect(over.lines.map((l) => l.displacementSense)).toEqual(['leading', 'leading', 'leading']);
    expect(over.lines.map((l) => l.fundamentalKvar)).toEqual([expect.closeTo(-3.08, 1), expect.closeTo(-6.92, 1), expect.closeTo(-7.58, 1)]);
    expect(over.lines.map((l) => l.displacementPf)).toEqual([expect.closeTo(0.982, 3), expect.closeTo(0.866, 3), expect.closeTo(0.797, 3)]);
  });

  it('the board: ΣQ1 below zero reads leading', () => {
    expect(over.powerFactor.displacementSense).toBe('leading');
    expect(over.powerFactor.fundamentalKvar).toBeCloseTo(-17.6, 1);
    expect(over.powerFactor.displacement).toBeCloseTo(0.89, 2);
  });

  it('a warning says the studied state over-corrects, naming the leading lines', () => {
    const w = over.warnings.find((x) => x.code === 'bank-state-leads');
    expect(w?.value).toBeCloseTo(-17.6, 1);
    expect(w?.message).toContain('with every bank step on (steps 1+2) the bank (41.3 kvar at nominal voltage) over-corrects: lines A 0.982, B 0.866, C 0.797 lead at the fundamental, and the board sends 17.6 kvar capacitive back up its supply');
  });

  it('a bank smaller than the loads: lagging, and no such warning', () => {
    const under = studyHarmonics(laundry([5, 5]));
    expect(under.lines.map((l) => l.displacementSense)).toEqual(['lagging', 'lagging', 'lagging']);
    expect(under.powerFactor.displacementSense).toBe('lagging');
    expect(under.warnings.map((w) => w.code)).not.toContain('bank-state-leads');
  });

  it('the text report marks lead and lag as solve does', () => {
    const r = runTrivar(['harmonics', '-'], JSON.stringify(laundry([25, 25])));
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/B-N\s+231\.1\s+.*0\.866 lead/);
    expect(r.stdout).toContain('displacement PF 0.890 lead (ΣP / Σ V·I over the lines)');
    expect(r.stdout).toContain('over-corrects');
    expect(runTrivar(['harmonics', '-'], JSON.stringify(laundry([5, 5]))).stdout).toContain('displacement PF 0.924 lag');
  });

  it('displacementPfText: no tag at 1.000 with 0.00 kvar, export where power flows back', () => {
    expect(displacementPfText(0.894, { sense: 'leading', kW: 20, kvar: -10 })).toBe('0.894 lead');
    expect(displacementPfText(1, { sense: 'leading', kW: 20, kvar: -0.001 })).toBe('1.000');
    expect(displacementPfText(-0.95, { sense: 'lagging', kW: -5, kvar: 1.6 })).toBe('0.950 export');
    expect(displacementPfText(null, { sense: 'none', kW: 0, kvar: 0 })).toBe('-');
  });
});

describe('displacement PF sense on an installation', () => {
  /** An invented depot: a yard board fed from the intake, its star bank far larger than its loads. */
  const depot = (stepsKvar: number[]) => ({
    name: 'Kilnsey bus depot',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 1000, impedancePercent: 5, xOverR: 5 } },
    boards: [
      { name: 'Intake', feeder: { lengthM: 5, line: { mm2: 240 }, neutral: { mm2: 240 } }, loads: [{ name: 'Wash plant', connection: 'ABC-delta', kW: 20, pf: 0.9 }] },
      {
        name: 'Yard',
        fedFrom: 'Intake',
        feeder: { lengthM: 30, line: { mm2: 70 }, neutral: { mm2: 70 } },
        loads: [
          { name: 'Chargers', connection: 'ABC-star', kW: 24, pf: 0.9, spectrum: 'switch-mode' },
          { name: 'Lighting', connection: 'A-N', kW: 3, pf: 0.95 },
        ],
      },
    ],
    harmonics: { banks: [{ board: 'Yard', connection: 'star', ratedV: 250, stepsKvar }] },
  });

  it("the bank's board reads leading at its feeder, with the warning on that board", () => {
    // Hand figure: chargers 24 × tan(acos 0.9) = 11.62 kvar, lighting 3 × tan(acos 0.95) = 0.99 kvar; the bank
    // 30 × (230.9/250)² = 25.6 kvar at 400 V; the feeder 12.61 − 25.6 ≈ −13 kvar (its own reactance adds a little).
    const r = studyInstallationHarmonics(depot([15, 15]));
    const yard = r.boards.find((b) => b.board === 'Yard')!;
    expect(yard.powerFactor.displacementSense).toBe('leading');
    expect(yard.powerFactor.fundamentalKvar).toBeGreaterThan(-14);
    expect(yard.powerFactor.fundamentalKvar).toBeLessThan(-12);
    const w = r.warnings.find((x) => x.code === 'bank-state-leads');
    expect(w?.board).toBe('Yard');
    expect(w?.message).toContain('with every step of its bank on (steps 1+2) the bank (25.6 kvar at nominal voltage) over-corrects');
    const small = studyInstallationHarmonics(depot([2, 2]));
    expect(small.boards[1]!.powerFactor.displacementSense).toBe('lagging');
    expect(small.warnings.map((x) => x.code)).not.toContain('bank-state-leads');
  });
});
