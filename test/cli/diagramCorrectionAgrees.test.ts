/**
 * `diagram --with-correction` draws the bank `trivar correct` recommends: on a board with harmonic data
 * that is the variant its harmonic check chooses (here a detuned one), not the plain bank.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const works = 'examples/quayside-print-works.yaml';

describe('diagram with the correction of a board with harmonic data', () => {
  it('shows the line PFs after of the bank correct recommends', () => {
    interface Report {
      verification: { lines: { pf: { after: number } }[] };
      selection: { steps: { detuningFactor: number }[] };
    }
    // The file's correction section names its arrangement: correct gives that one report.
    const chosen = JSON.parse(runTrivar(['correct', works, '--json']).stdout) as Report;
    expect(chosen.selection.steps.some((s) => s.detuningFactor > 0)).toBe(true);
    const svg = runTrivar(['diagram', works, '--with-correction', '--view', 'triangles']).stdout;
    const shown = [...svg.matchAll(/PF (\d\.\d{3})/g)].map((m) => m[1]);
    // Each line: PF before, then PF after.
    const after = shown.filter((_, k) => k % 2 === 1);
    expect(after).toEqual(chosen.verification.lines.map((l) => l.pf.after.toFixed(3)));
  }, 120_000);
});
