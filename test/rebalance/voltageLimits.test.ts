/**
 * Rebalancing judges every board's voltages against that board's own limits (an installation board's
 * `voltageLimits`, else the installation's `conventions.voltageLimits`), the verdict `solve` gives:
 * an invented two-board installation whose laboratory board, at the end of a long 6 mm² feeder and
 * loaded on one line, is within the installation's ±10 % but not within its own ±2 %.
 */
import { describe, expect, it } from 'vitest';
import { normaliseInstallation, parseInstallation, rebalanceInstallation, solveInstallation } from '@trivar/core';

const installation = (labLimits: { underPercent: number; overPercent: number } | null) => ({
  name: 'Orchard Row test kitchen',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 } },
  boards: [
    {
      name: 'Main board',
      feeder: { lengthM: 15, line: { mm2: 95, ratingA: 200 }, neutral: { mm2: 95 } },
      loads: [{ name: 'Walk-in chiller', connection: 'ABC-star', kW: 6, pf: 0.85 }],
    },
    {
      name: 'Lab',
      fedFrom: 'Main board',
      ...(labLimits ? { voltageLimits: labLimits } : {}),
      feeder: { lengthM: 45, line: { mm2: 6, ratingA: 41 }, neutral: { mm2: 6 } },
      loads: [
        { name: 'Oven', connection: 'A-N', kW: 3.2, pf: 1 },
        { name: 'Proofer', connection: 'A-N', kW: 2.0, pf: 0.98 },
        { name: 'Mixer', connection: 'A-N', kW: 1.5, pf: 0.8 },
      ],
    },
  ],
});

const rebalance = (labLimits: { underPercent: number; overPercent: number } | null) =>
  rebalanceInstallation(normaliseInstallation(parseInstallation(installation(labLimits))).installation, { boards: ['Lab'] }, { moveTable: false });

const TIGHT = { underPercent: 2, overPercent: 2 };

describe("rebalance: voltages against each board's own limits", () => {
  it('the laboratory board is judged against its own ±2 %: below now, within after the moves; the main board keeps ±10 %', () => {
    const r = rebalance(TIGHT);
    expect(r.moves.length).toBeGreaterThan(0);
    const lab = r.voltages.find((v) => v.board === 'Lab')!;
    const main = r.voltages.find((v) => v.board === 'Main board')!;
    expect(lab.limits).toMatchObject({ preset: 'custom', underPercent: 2, overPercent: 2 });
    expect(main.limits.preset).toBe('en50160-supply');
    // All on line A of a 45 m 6 mm² run: phase A sags about 5 % — under −2 %, well within −10 %.
    expect(lab.before.verdict).toBe('under');
    expect(lab.before.lowest.percent).toBeLessThan(98);
    expect(lab.before.lowest.percent).toBeGreaterThan(90);
    expect(lab.after.verdict).toBe('within');
    expect(lab.after.lowest.percent).toBeGreaterThanOrEqual(98);
    expect(main.before.verdict).toBe('within');
    const note = r.notes.find((n) => n.includes('"Lab"'));
    expect(note).toContain('±2 %');
    expect(note).toContain('within');
    expect(note).toContain(`now below (lowest ${lab.before.lowest.percent.toFixed(1)} %`);
  });

  it('the same installation without the board\'s own limits: every verdict within ±10 %, no voltage note', () => {
    const r = rebalance(null);
    expect(r.voltages.map((v) => [v.board, v.limits.preset, v.before.verdict, v.after.verdict])).toEqual([
      ['Main board', 'en50160-supply', 'within', 'within'],
      ['Lab', 'en50160-supply', 'within', 'within'],
    ]);
    expect(r.notes.some((n) => n.includes('voltage limits'))).toBe(false);
  });

  it('the verdicts now are the ones solve gives on the same installation, board by board', () => {
    const r = rebalance(TIGHT);
    const solved = solveInstallation(installation(TIGHT));
    for (const b of solved.boards) {
      const v = r.voltages.find((x) => x.board === b.name)!;
      expect(v.before.verdict).toBe(b.result.voltageCheck.verdict);
      expect(v.before.lowest.percent).toBeCloseTo(b.result.voltageCheck.lowest.percent, 9);
    }
  });

  it('with no move allowed the note states the board is outside its own limits now', () => {
    const r = rebalanceInstallation(normaliseInstallation(parseInstallation(installation(TIGHT))).installation, { boards: ['Lab'], moveLimit: 0 }, { moveTable: false });
    expect(r.moves).toEqual([]);
    const lab = r.voltages.find((v) => v.board === 'Lab')!;
    expect(lab.after.verdict).toBe('under');
    expect(r.notes).toContain(`The voltages at "Lab" are below its voltage limits ±2 % (custom): lowest ${lab.before.lowest.percent.toFixed(1)} % (phase A).`);
  });
});
