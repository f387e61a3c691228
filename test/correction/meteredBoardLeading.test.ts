/**
 * A target measured upstream (`target.measuredAt`) can leave the equipment's own board leading: the
 * bank is sized for the PF at the origin, and the board it sits on carries the difference. Warned as
 * solve warns of a board led by its own capacitors (below 0.90 leading), and the Checks line says where
 * its tolerance verdicts were judged, so "no line leads" is not read against the board's lines table.
 */
import { describe, expect, it } from 'vitest';
import { correctInstallation, normaliseInstallation, parseInstallation, readBoardText } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// A market hall: a refrigerated main hall near the intake, and a row of stalls 60 m away whose bank is
// asked to correct the whole hall's PF at the origin.
const MARKET = `name: Fennick market hall
supply:
  system: three-phase-4wire
  voltage: { lineToLine: 400 }
  frequencyHz: 50
  transformer: { kVA: 250, impedancePercent: 4.5, xOverR: 4 }
boards:
  - name: Hall board
    feeder:
      lengthM: 15
      line: { mm2: 120, ratingA: 280 }
      neutral: { mm2: 120, ratingA: 280 }
    loads:
      - { name: Cold store compressors, connection: ABC-delta, kW: 35, pf: 0.8 }
  - name: Stall row
    fedFrom: Hall board
    feeder: { lengthM: 60, line: { mm2: 35, ratingA: 110 }, neutral: { mm2: 35, ratingA: 110 } }
    loads:
      - { name: Bakery ovens, connection: A-N, kW: 10, pf: 0.95 }
      - { name: Butcher chillers, connection: B-N, kW: 8, pf: 0.9 }
      - { name: Flower stall lights, connection: C-N, kW: 6, pf: 1 }
      - { name: Canopy extract, connection: ABC-star, kW: 12, pf: 0.72 }
`;
const model = () => normaliseInstallation(parseInstallation(readBoardText(MARKET))).installation;

describe('a bank on a sub-board sized for the PF at the origin', () => {
  const metered = correctInstallation(model(), { arrangement: 'star-bank', target: { measuredAt: 'origin' } }, { board: 'Stall row' });
  const v = metered.report.verification;

  it('meets the target at the origin while line C of its own board leads at 0.852', () => {
    expect(metered.report.status).toBe('meets-target');
    const c = v.after.phases.find((p) => p.phase === 'C')!;
    expect(c.sense).toBe('leading');
    expect(c.pf!).toBeCloseTo(0.852, 3);
    // The board's lines turn from 18.73 kvar drawn to 10.94 kvar given back.
    expect(v.before.phases.reduce((s, p) => s + p.kvar, 0)).toBeCloseTo(18.73, 2);
    expect(v.after.phases.reduce((s, p) => s + p.kvar, 0)).toBeCloseTo(-10.94, 2);
  });

  it('warns that its own board leads, with the figures and where the target was judged', () => {
    const w = metered.report.warnings.find((x) => x.code === 'equipment-board-leading')!;
    expect(w.value!).toBeCloseTo(0.852, 3);
    expect(w.threshold).toBe(0.9);
    expect(w.message).toContain('the target is judged at the origin of the installation');
    expect(w.message).toContain('Stall row itself, where the equipment is connected, ends up leading: line C at PF 0.852 leading');
    expect(w.message).toContain('from 18.73 to -10.94 kvar');
    expect(w.message).toContain('at light load it leads further');
  });

  it('measured at its own board, the same equipment question raises no such warning', () => {
    const local = correctInstallation(model(), { arrangement: 'star-bank' }, { board: 'Stall row' });
    expect(local.report.warnings.some((x) => x.code === 'equipment-board-leading')).toBe(false);
    expect(local.report.verification.after.phases.every((p) => p.sense !== 'leading')).toBe(true);
  });

  it('the Checks line says its tolerance verdicts were judged at the origin, and that the board leads', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-metered-'));
    const file = join(dir, 'market.yaml');
    writeFileSync(file, MARKET);
    const out = runTrivar(['correct', file, '--board', 'Stall row', '--measured-at', 'origin', '--arrangement', 'star-bank']);
    const flat = out.stdout.replace(/\s+/g, ' ');
    expect(flat).toContain('×1.1: no line leads — judged at the origin, where the target is measured; at Stall row itself lines A, B, C already lead at nominal capacitance (lines table)');
    expect(flat).toContain('ends up leading: line C at PF 0.852 leading');
  });
});
