/**
 * The single-arrangement correction reads as the comparison does, and labels its figures with the voltage
 * they are taken at. Invented boards: the Larkspur Road launderette (208Y/120 V, resistive dryers and a
 * water heater: every line at PF 0.97 or better) and the Millrace workshop (230/400 V, lagging single-phase loads).
 */
import { describe, expect, it } from 'vitest';
import { compareCorrections, correctBoard, normaliseBoard, parseBoard, type BankSizing, type BoardSpec } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';

const launderette = {
  name: 'Larkspur Road launderette',
  supply: { system: 'three-phase-4wire', voltage: '208Y/120', frequencyHz: 60, transformer: { kVA: 75, impedancePercent: 3.5, xOverR: 2 } },
  loads: [
    { name: 'Dryers north', connection: 'A-B', kW: 5, model: 'constant-impedance' },
    { name: 'Dryers south', connection: 'B-C', kW: 5, model: 'constant-impedance' },
    { name: 'Water heater', connection: 'ABC-delta', kW: 15, model: 'constant-impedance' },
    { name: 'Washers', connection: 'A-N', kW: 3, pf: 0.9 },
    { name: 'Vending and lights', connection: 'C-N', kW: 1, pf: 0.9 },
  ],
};

const workshop: BoardSpec = {
  name: 'Millrace workshop',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
  loads: [
    { name: 'Saw bench', connection: 'A-N', kW: 6, pf: 0.8 },
    { name: 'Dust extractor', connection: 'B-N', kW: 5, pf: 0.78 },
    { name: 'Planer', connection: 'C-N', kW: 7, pf: 0.82 },
  ],
};

describe('a board that already meets the target, one arrangement asked for', () => {
  const board = normaliseBoard(parseBoard(launderette));
  for (const arrangement of ['star-bank', 'delta-bank'] as const)
    it(`${arrangement}: "nothing to do", as the comparison says, without the capacitor cautions`, () => {
      const r = correctBoard(board, { arrangement });
      expect(r.verification.check.met).toBe(true);
      expect(r.status).toBe('already-meets-target');
      expect(r.summary).toMatch(/the board already meets the target, nothing to add$/);
      expect(r.cautions).toHaveLength(1);
      const text = renderCorrectionReport(r);
      expect(text).toContain('NOTHING TO DO: the board already meets the target');
      expect(text).not.toContain('0.00 kvar delivered');
      expect(text).not.toContain('Capacitors hold their charge');
      const compared = compareCorrections(board, {}).outcomes.find((o) => o.arrangement === arrangement)!;
      expect(compared.report!.status).toBe(r.status);
    });
});

describe('the sizing table names the voltage its kvar is taken at', () => {
  it('star bank on 230/400 V: kvar at the model’s 230.9 V, while the unit table reads 230 V', () => {
    const r = correctBoard(normaliseBoard(parseBoard(workshop)), { arrangement: 'star-bank' });
    const text = renderCorrectionReport(r);
    expect(text).toContain('kvar@230.9 V');
    expect(text).not.toContain('kvar@nom V');
    const a = (r.sizing as BankSizing).branches[0]!;
    // kvar = B·V² at 400/√3 = 230.94 V; at 230 V it would be 0.8 % less.
    expect(a.kvarAtNominalV).toBeCloseTo((a.susceptanceS * (400 / Math.sqrt(3)) ** 2) / 1000, 12);
    expect(r.selection!.selections[0]!.nominalV).toBe(230);
    expect(text).toMatch(/A-N .* 230 \/ \d+ \/ 253/);
  });

  it('a compensator with star and delta branches names both voltages in a note', () => {
    const r = correctBoard(normaliseBoard(parseBoard(workshop)), { arrangement: 'balancing-compensator' });
    const text = renderCorrectionReport(r);
    expect(text).toContain('(kvar@nom V: at 230.9 V across a line-to-neutral branch, 400 V across a line-to-line branch)');
  });
});

describe('a line that led before correction is named where the verdict passes it', () => {
  // Invented: the Fernhill pottery, a resistive B-C kiln makes line B lead near cos 30° = 0.866 whatever is added.
  const pottery: BoardSpec = {
    name: 'Fernhill pottery',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
    loads: [
      { name: 'Kiln', connection: 'B-C', kW: 9, pf: 1, model: 'constant-impedance' },
      { name: 'Glaze heater', connection: 'A-N', kW: 8, pf: 0.85 },
      { name: 'Pug-mill coil', connection: 'C-N', ohms: { r: 7, x: 5 } },
    ],
  };
  const board = normaliseBoard(parseBoard(pottery));

  it('the star bank meets the per-line target with line B at about 0.866 leading, and says line B is held to another rule', () => {
    const r = correctBoard(board, { arrangement: 'star-bank' });
    expect(r.status).toBe('meets-target');
    expect(r.verification.check.leadingBefore).toEqual(['B']);
    const b = r.verification.lines[1]!.pf;
    expect(Math.abs(b.after! - 0.866)).toBeLessThan(0.01);
    expect(r.summary).toContain(`; line B already led before correction (PF ${b.before!.toFixed(3)} leading before, ${b.after!.toFixed(3)} after): capacitors cannot stop a leading line leading, so it is held only to lead no more than before`);
    const text = renderCorrectionReport(r).replace(/\s+/g, ' ');
    expect(text).toContain('PF ≥ 0.950, never leading (except line B, which already led before correction: held to lead no more than before)');
  });

  it('the comparison keeps "never leading" in its target and names line B under the table', async () => {
    const { renderComparisonReport } = await import('../../packages/cli/src/format/comparisonReport.js');
    const c = compareCorrections(board, {});
    const text = renderComparisonReport(c).replace(/\s+/g, ' ');
    expect(text).toMatch(/target: displacement power factor of every line .*; PF ≥ 0\.950, never leading Arrangements compared/);
    const before = c.outcomes.find((o) => o.arrangement === 'star-bank')!.report!.verification.lines[1]!.pf.before!;
    expect(text).toContain(`exempt (star bank, delta bank`);
    expect(text).toContain(`line B already led before correction (PF ${before.toFixed(3)} leading): capacitors cannot stop a leading line leading`);
  });

  it('a board where no line led before has no such words', () => {
    const r = correctBoard(normaliseBoard(parseBoard(workshop)), { arrangement: 'star-bank' });
    expect(r.verification.check.leadingBefore).toEqual([]);
    expect(r.summary).not.toContain('already led');
    expect(renderCorrectionReport(r)).not.toContain('except line');
  });
});
