/**
 * `trivar correct` on a board whose need is below anything the catalogue builds (an invented dosing
 * kiosk: 0.25 kW at PF 0.5 on line A, a heater on B, line C idle): the text and the JSON give one
 * verdict — nothing to build — with the same figures, no bank report for an empty bank, and no
 * compensator built from its reactors alone.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const KIOSK = 'test/fixtures/correction/dosing-kiosk.yaml';
const flat = (s: string) => s.replace(/\s+/g, ' ');

describe('nothing to build, as a user runs it', () => {
  const text = runTrivar(['correct', KIOSK]);
  const json = runTrivar(['correct', KIOSK, '--json']);
  const c = JSON.parse(json.stdout);
  const chosen = c.outcomes.find((o: { arrangement: string }) => o.arrangement === c.recommended).report;

  it('exits 5 (target not met) in text and JSON, with one verdict', () => {
    expect(text.code).toBe(5);
    expect(json.code).toBe(5);
    expect(c.meetsTarget).toBe(false);
    expect(chosen.status).toBe('nothing-to-build');
    expect(chosen.selection).toBeNull();
    expect(flat(text.stdout)).toContain('Recommendation nothing to build: no arrangement meets the target');
    expect(text.stdout).toContain('Why nothing is built: the star bank studied');
    expect(text.stdout).not.toMatch(/The recommended|Bank as built|C\/k|CT \d|switched step|costs \d/);
  });

  it('the need per line in the text is the JSON\'s, and the JSON\'s is the hand figure', () => {
    const a = chosen.nothingToBuild.needs.find((n: { phase: string }) => n.phase === 'A');
    // Q = P·(tan φ1 − tan φ2) = 0.25 × (1.7321 − 0.3287) = 0.351 kvar (hand, at the rated 0.25 kW).
    expect(a.neededKvar).toBeCloseTo(0.25 * (Math.sqrt(3) - Math.tan(Math.acos(0.95))), 3);
    const row = text.stdout.split('\n').find((l) => /^ {2}A +0\.25 /.test(l))!;
    expect(row.trim().split(/ +/)).toEqual(['A', a.kW.toFixed(2), a.kvar.toFixed(2), a.pfBefore.toFixed(3), '0.950', a.neededKvar.toFixed(2)]);
    expect(flat(text.stdout)).toContain(`line A needs ${a.neededKvar.toFixed(2)} kvar to go from PF 0.500 to 0.950`);
    expect(flat(text.stdout)).toContain('What to do Nothing is to be built at the board. Either correct at the equipment');
  });

  it('the compensator: no reactors alone, no "met" balance, its withheld build in words with the JSON\'s figures', () => {
    const comp = c.outcomes.find((o: { arrangement: string }) => o.arrangement === 'balancing-compensator').report;
    expect(comp.status).toBe('nothing-to-build');
    expect(comp.balance).toBeNull();
    const w = comp.nothingToBuild.withheld;
    expect(w.reasons).toContain('reactors-alone');
    const row = text.stdout.split('\n').find((l) => l.startsWith('  compensator '))!;
    expect(row).toMatch(/nothing to build +- +- +- +- +- +- +- +-$/);
    expect(flat(text.stdout)).toContain(`it would lower the lowest line PF from ${w.targetPfBefore.toFixed(3)} to ${w.targetPfWithBuild.toFixed(3)}`);
    const alone = runTrivar(['correct', KIOSK, '--arrangement', 'balancing-compensator']);
    expect(alone.code).toBe(5);
    expect(alone.stdout).toContain('NOTHING TO BUILD');
    expect(alone.stdout).not.toMatch(/— met|reactor on|Compensator sizing/);
    expect(flat(alone.stdout)).toMatch(/lower the positive-sequence PF from 0\.832 to 0\.\d{3} and load line C, which carried nothing/);
  });
});
