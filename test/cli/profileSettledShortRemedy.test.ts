/**
 * `trivar profile --bank`: the remedy offered for hours the bank settles short of its target is rehearsed
 * over the profile by the same controller, not read off the one step that would close. A further step that
 * closes can still leave the need above its threshold (the open steps too large again), and it changes which
 * step the controller takes first elsewhere; the words say how many of those hours it brings to the target.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const TAN_095 = Math.tan(Math.acos(0.95)); // 0.328684

/** The board file with its steps replaced (and its threshold share, if given), and the PF with the bank in each interval of its run. */
function pfWithSteps(board: string, data: string, steps: number[], responseShare?: number): number[] {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-remedy-'));
  const file = join(dir, 'board.yaml');
  const share = responseShare === undefined ? '' : `\n    responseShare: ${responseShare}`;
  writeFileSync(file, readFileSync(board, 'utf8').replace(/steps: \[.*\]/, `steps: [${steps.map((k) => `{ kvar: ${k} }`).join(', ')}]${share}`));
  const intervals = join(dir, 'intervals.csv');
  const r = runTrivar(['profile', file, '--data', data, '--bank', '--intervals-csv', intervals]);
  expect(r.stderr).toBe('');
  const [head, ...rows] = readFileSync(intervals, 'utf8').trim().split('\n').map((l) => l.split(','));
  const pf = head!.indexOf('PF with bank');
  return rows.map((row) => Number(row[pf]));
}

describe('the remedy for hours settled short', () => {
  it('a tannery drum on 2 + 10 kvar: not "a step under 4.5 kvar" (which leaves PF 0.920) but 6.5 kvar, which brings all 12 h to 0.95', () => {
    const board = 'test/fixtures/profile/tannery-drum.yaml';
    const data = 'test/fixtures/profile/tannery-drum-day.csv';
    const r = runTrivar(['profile', board, '--data', data, '--bank']);
    expect(r.stderr).toBe('');
    const text = r.stdout.replace(/\s+/g, ' ');
    // Full-load need 15 − 20·0.3287 = 8.43 kvar. At 0.6: 5.06, the 2 kvar step in, 3.06 left; at 1.0 (from
    // that state) 6.43 left; the 10 kvar step closes only above 6.5 (0.65 × 10).
    expect(text).toContain(
      '12.0 h settled short of the target with the steps still open each too large for what is left: 3.06 to 6.43 kvar still needed, while a step closes only for a need above 0.65 × its kvar, 6.50 kvar for the smallest step still open (10.0 kvar) — tried over the profile with the same controller: a further 6.5 kvar step brings them all to the target (8.00 h below the target in all with it, 20.0 h without)',
    );
    expect(text).not.toContain('would close for it');
    // By hand with 6.5 kvar added: at 0.6 (need 5.06) it closes alone (0.65 × 6.5 = 4.23), leaving Q 9 − 6.5 =
    // 2.5 kvar, PF 12/√(12² + 2.5²) = 0.979; at 1.0 the 2 kvar step joins it (8.43 − 6.5 = 1.93 > 1.30): Q 15 − 8.5
    // = 6.5 kvar, PF 20/√(20² + 6.5²) = 0.951. At 1.5 (need 12.65) the 8.5 kvar in leave 4.15 kvar: below.
    const withIt = pfWithSteps(board, data, [2, 6.5, 10]);
    const stretch = (k: number) => withIt.slice(8 * k, 8 * k + 8);
    for (const k of [1, 2, 4]) for (const pf of stretch(k)) expect(pf).toBeGreaterThanOrEqual(0.95);
    expect(stretch(1)[0]).toBeCloseTo(12 / Math.hypot(12, 2.5), 2);
    expect(stretch(2)[0]).toBeCloseTo(20 / Math.hypot(20, 6.5), 2);
    expect(withIt.filter((pf) => pf < 0.95)).toHaveLength(16); // the 0.1 and 1.5 stretches: 8.00 h
    // The step the old words offered, 4.5 kvar: at 0.6 it closes first (0.56 kvar left, under 1.30); at 1.0 the
    // 2 kvar step joins it and 8.43 − 6.5 = 1.93 kvar is still needed with the 10 kvar step held out (6.5):
    // Q 15 − 6.5 = 8.5 kvar, PF 20/√(20² + 8.5²) = 0.920.
    const withOld = pfWithSteps(board, data, [2, 4.5, 10]);
    expect(withOld[16]).toBeCloseTo(20 / Math.hypot(20, 8.5), 2);

    const bank = JSON.parse(runTrivar(['profile', board, '--data', data, '--bank', '--json']).stdout).bank;
    expect(bank.settledShortTrial).toMatchObject({ settledShortHours: 12, furtherSteps: [{ channel: 'ABC', kvar: 6.5 }], reachedHours: 12, hoursBelowWith: 8, lowerShare: null });
  });

  it('a slate saw on 2.5 + 15 kvar: no single further step brings both stretches to the target; the best brings 2 of 4 h', () => {
    const board = 'test/fixtures/profile/slate-saw-house.yaml';
    const data = 'test/fixtures/profile/slate-saw-house-shifts.csv';
    const r = runTrivar(['profile', board, '--data', data, '--bank']);
    expect(r.stderr).toBe('');
    const text = r.stdout.replace(/\s+/g, ' ');
    // At 0.45: 13.5 kW, 10.125 kvar, need 10.125 − 4.437 = 5.69; the 2.5 kvar step in leaves 3.19. At 0.95 (from
    // there) 21.375 − 9.367 − 2.5 = 9.51 left, under the 15 kvar step's 9.75 threshold (0.65 × 15).
    expect(text).toContain('3.19 to 9.51 kvar still needed');
    expect(text).toMatch(
      /— tried over the profile with the same controller: none of the \d+ further step sizes tried \(3\.2 to 14\.3 kvar\) brings them all to the target; a further 3\.2 kvar step brings 2\.00 of the 4\.00 h to the target \(2\.00 h below the target in all with it, 4\.00 h without\)/,
    );
    // By hand, why no one size does: at 0.45 only X in [3.19, 4.01] (X, then 2.5 kvar) or X in [5.69, 8.49)
    // alone reaches 0.95; at 0.95 either leaves 12.01 − X − 2.5 ≥ 5.5 or 12.01 − X − 2.5 ≥ 1.0 kvar with the
    // 15 kvar step still held out (its 9.75 kvar threshold). With 3.2: Q 10.125 − 5.7 = 4.425, PF 0.950; then
    // Q 21.375 − 5.7 = 15.675, PF 28.5/√(28.5² + 15.675²) = 0.876.
    const withIt = pfWithSteps(board, data, [2.5, 3.2, 15]);
    expect(withIt.slice(0, 4).every((pf) => pf >= 0.95)).toBe(true);
    expect(withIt[4]).toBeCloseTo(28.5 / Math.hypot(28.5, 15.675), 3);
    expect(10.125 - 13.5 * TAN_095).toBeCloseTo(5.688, 3);
  });

  it('a cheese dairy stuck on two phases at once: a further step on each, together, rehearsed and then checked by adding them', () => {
    const board = 'test/fixtures/profile/cheese-dairy-phase-steps.yaml';
    const data = 'test/fixtures/profile/cheese-dairy-day.csv';
    const text = runTrivar(['profile', board, '--data', data, '--bank']).stdout.replace(/\s+/g, ' ');
    // Mixer at 0.5: 5 kW, 4.41 kvar, need 4.41 − 1.64 = 2.77; the 1 kvar step leaves 1.77 under the 8 kvar
    // step's 5.36 (the file sets the controller at 0.67 × the step). Chiller at 0.6: 7.2 kW, 5.78 kvar, need 3.41; the 1.5 kvar step
    // leaves 1.91 under 6.7. (At the default 0.65 the light-load stretch would sit on the edge: mixer at 0.3 leaves
    // 0.66 kvar after the 1 kvar step, just above 0.65 × 1.)
    expect(7.2 * Math.tan(Math.acos(0.78)) - 7.2 * TAN_095 - 1.5).toBeCloseTo(1.91, 2);
    expect(text).toContain(
      '4.00 h settled short of the target with the steps still open each too large for what is left: 1.77 to 4.18 kvar still needed, while a step closes only for a need above 0.67 × its kvar, 5.36 kvar for the smallest step still open (8.0 kvar) — tried over the profile with the same controller: further steps of 4.0 kvar (on phase A) and 4.2 kvar (on phase B) bring them all to the target (2.00 h below the target in all with them, 6.00 h without)',
    );
    // Both added to the file: the 2 h left below are the light-load stretch under the small steps' thresholds.
    const dir = mkdtempSync(join(tmpdir(), 'trivar-remedy-'));
    const file = join(dir, 'dairy.yaml');
    writeFileSync(
      file,
      readFileSync(board, 'utf8').replace(/steps: \[.*\]/, 'steps: [{ kvar: 1, phase: A }, { kvar: 4.0, phase: A }, { kvar: 8, phase: A }, { kvar: 1.5, phase: B }, { kvar: 4.2, phase: B }, { kvar: 10, phase: B }]'),
    );
    const withThem = runTrivar(['profile', file, '--data', data, '--bank', '--json']);
    expect(withThem.stderr).toBe('');
    expect(JSON.parse(withThem.stdout).bank.belowTarget).toMatchObject({ hours: 2, underResponseHours: 2, openStepsTooLargeHours: 0 });
  });

  it('a lower threshold, where one of at least 0.5 is offered, is rehearsed too: the drum light, then at 0.9', () => {
    const text = runTrivar(['profile', 'test/fixtures/profile/tannery-drum.yaml', '--data', 'test/fixtures/profile/tannery-drum-light-then-heavy.csv', '--bank']).stdout.replace(/\s+/g, ' ');
    // At 0.3 the 2 kvar step closes (need 2.53), 0.53 left. At 0.9: 7.59 − 2 = 5.59 kvar left, under 6.5; 5.59/10 =
    // 0.559, so a threshold of 0.55 lets the 10 kvar step close (5.50 < 5.59), and 0.55 is what is simulated. It
    // over-corrects by 4.41, the 2 kvar step goes out (0.55 × 2 = 1.10 < 4.41) and 2.41 kvar of over-correction stays: Q 13.5 − 10 = 3.5 kvar,
    // PF 18/√(18² + 3.5²) = 0.982, at the target in all 4 h.
    expect(text).toContain(
      '5.59 kvar still needed, while a step closes only for a need above 0.65 × its kvar, 6.50 kvar for the smallest step still open (10.0 kvar) — tried over the profile with the same controller: a further 5.6 kvar step brings them all to the target (4.00 h below the target in all with it, 8.00 h without); a switching threshold of 0.55 × the step (profile.bank.responseShare; 0.5 at the least, lower and it hunts) brings them all to the target (4.00 h below the target in all with it, 8.00 h without)',
    );
    // The share printed, set in the file: 4 of the 16 half hours (the 0.3 stretch, under 0.55 × 2 = 1.10) stay below.
    const atShare = pfWithSteps('test/fixtures/profile/tannery-drum.yaml', 'test/fixtures/profile/tannery-drum-light-then-heavy.csv', [2, 10], 0.55);
    expect(atShare.filter((pf) => pf < 0.95)).toHaveLength(8);
  });

  it('a propagation house on 3 + 12 + 7.9 kvar: no step that cures the 2 h settled short but breaks 10 others, and no threshold under 0.5', () => {
    const board = 'test/fixtures/profile/propagation-house.yaml';
    const data = 'test/fixtures/profile/propagation-house-day.csv';
    const r = runTrivar(['profile', board, '--data', data, '--bank']);
    expect(r.stderr).toBe('');
    const text = r.stdout.replace(/\s+/g, ' ');
    // Evening (mist pumps 0.1, air movers 0.9): the 3 and 12 kvar steps in, 3.99 kvar left under 0.65 × 7.9 = 5.14.
    // 3.99/7.9 = 0.505: a threshold of 0.50 would let the step close, but it does not hold the target there.
    expect(text).toMatch(
      /3\.99 kvar still needed, while a step closes only for a need above 0\.65 × its kvar, 5\.14 kvar for the smallest step still open \(7\.9 kvar\) — tried over the profile with the same controller: none of the \d+ further step sizes tried \(4\.0 to 6\.1 kvar\) lowers the hours below the target \(2\.00 h without, at least 10\.0 h with any of them\)/,
    );
    expect(text).not.toMatch(/switching threshold (under|of) 0\.[0-4]/);
    expect(text).not.toContain('switching threshold of 0.50');
    expect(text).not.toContain('brings them all to the target');
    const bank = JSON.parse(runTrivar(['profile', board, '--data', data, '--bank', '--json']).stdout).bank;
    expect(bank.belowTarget.hours).toBe(2);
    expect(bank.settledShortTrial).toMatchObject({ settledShortHours: 2, hoursBelowWithout: 2, hoursBelowWith: 10, lowersHoursBelow: false, lowerShare: null });
    // Checked by changing the file: the 4 kvar step the old words offered leaves 40 quarter hours (10 h) below,
    // and the least threshold accepted, 0.5, still leaves the 8 evening quarter hours (2 h) below.
    expect(pfWithSteps(board, data, [3, 12, 7.9, 4]).filter((pf) => pf < 0.95)).toHaveLength(40);
    expect(pfWithSteps(board, data, [3, 12, 7.9], 0.5).filter((pf) => pf < 0.95)).toHaveLength(8);
  });
});

