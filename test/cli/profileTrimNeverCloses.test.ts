/**
 * `trivar profile --correction-bank` on an invented gravel pit crusher board whose recommended delta bank has a
 * 33.1 kvar trim across B-C, sized for the welding outlet at full rating. Over the invented week the trim never
 * closes: at these loads it would carry lines B and C past unity. The hours below the target must say so — not
 * "every step in", which they said while a third of the bank stood open — and the step that never closed is
 * named with its kvar and why. The same file without its correction section runs with the correction study's
 * defaults, as `trivar correct` does, and gives the same bank.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const BOARD = 'test/fixtures/profile/gravel-pit-crusher.yaml';
const NO_SECTION = 'test/fixtures/profile/gravel-pit-crusher-no-correction.yaml';
const WEEK = 'test/fixtures/profile/gravel-pit-crusher-week.csv';
const TAN_095 = Math.tan(Math.acos(0.95)); // 0.328684
const tanOf = (pf: number) => Math.tan(Math.acos(pf));

interface Bank {
  steps: { step: number; channel: string; kvar: number; closings: number }[];
  totalKvar: number;
  belowTarget: Record<string, unknown> & { hours: number; stepTooCoarseChannels: { channel: string; smallestOpenKvar: number; mostRoomKvar: number }[] };
  neverClosed: { step: number; channel: string; kvar: number; shortHours: number; pastLimitHours: number; mostRoomKvar: number; underThresholdHours: number; waitingHours: number; words: string }[];
  design: { arrangement: string; recommended: boolean; defaultsWords?: string };
}

const bankOf = (file: string): Bank => {
  const r = runTrivar(['profile', file, '--data', WEEK, '--correction-bank', '--json']);
  expect(r.stderr).toBe('');
  return JSON.parse(r.stdout).bank as Bank;
};

describe('a delta bank whose B-C trim never closes over the data', () => {
  const bank = bankOf(BOARD);
  const trim = bank.steps.find((s) => s.channel === 'B-C')!;

  it('the trim is the 33.1 kvar step 2, and it never closes', () => {
    expect(bank.design).toMatchObject({ arrangement: 'delta-bank', recommended: true });
    expect(trim).toMatchObject({ step: 2, kvar: expect.closeTo(33.06, 2), closings: 0 });
  });

  // Hand check, from the nameplates alone. Working hours without the welder: crusher 0.9 × 55 kW at PF 0.68,
  // conveyors 22 kW at PF 0.7 (both delta, balanced: a third of their kvar on each line), heaters on A (PF 1),
  // pump 0.2 × 3 kW at PF 0.75 on C.
  const motorsPerLine = (0.9 * 55 * tanOf(0.68) + 22 * tanOf(0.7)) / 3; // 25.27 kvar
  const pumpOnC = 0.2 * 3 * tanOf(0.75); // 0.53 kvar
  const loadsBC = 2 * motorsPerLine + pumpOnC; // 51.07 kvar
  // The three-phase step (33.1 kvar, a third per line) and the C-A trim (13.8 kvar, half on C) are in: at
  // their full rating (nominal voltage, the most they can take off) lines B and C are left with
  const left = loadsBC - (2 / 3) * 33.06 - 13.77 / 2; // 22.1 kvar lagging

  it('hand check, from the nameplates alone: lines B and C carry less lagging kvar than the trim with the other steps in', () => {
    expect(loadsBC).toBeCloseTo(51.07, 2);
    expect(left).toBeCloseTo(22.1, 1);
    // …and the trim would put 33.1 kvar on those two lines: 11 kvar leading even at its rating. At the board's
    // ~94 % voltage it delivers 33.1 × 0.94² ≈ 29.2 kvar and the two steps in deliver less, so the lines keep at
    // most about 51.08 − 0.94² × 28.9 = 25.5 kvar: still leading with the trim in.
    expect(33.06 - left).toBeGreaterThan(10);
    expect(loadsBC - 0.94 ** 2 * ((2 / 3) * 33.06 + 13.77 / 2)).toBeLessThan(0.94 ** 2 * 33.06);
    // The whole board would not lead: its own reading with 46.8 kvar in is 32.3 kvar at 74.8 kW (the
    // interval CSV), more than the trim delivers. The controller judges the trim on its own two lines.
    const boardQ = 74.8 * tanOf(0.918);
    expect(boardQ).toBeCloseTo(32.3, 1);
    expect(boardQ - 74.8 * TAN_095).toBeCloseTo(7.7, 1);
  });

  it('the hours below the target: none "with every step in"; the open steps too coarse, with their figures; the parts add up', () => {
    const t = bank.belowTarget;
    // 175 working quarter hours (43.75 h) with the three-phase step and the C-A trim in, the B-C trim open; 20
    // light-load quarter hours (5 h) with every step past the band; 5 (1.25 h) with the controller on its way.
    expect(t).toMatchObject({ hours: 50, allStepsInHours: 0, shortOfStepsHours: 0, underResponseHours: 0, openStepsTooLargeHours: 0, stepTooCoarseHours: 48.75, onTheWayHours: 1.25 });
    const parts = ['allStepsInHours', 'shortOfStepsHours', 'underResponseHours', 'stepTooCoarseHours', 'openStepsTooLargeHours', 'onTheWayHours'].reduce((a, k) => a + (t[k] as number), 0);
    expect(parts).toBeCloseTo(t.hours, 12);
    const bc = t.stepTooCoarseChannels.find((c) => c.channel === 'B-C')!;
    // The most lagging kvar lines B and C read with the trim open: the welder's hours (its 12 kW at PF 0.6 at
    // half load adds 8 kvar to the 25.5 above, less what the voltage takes off the two steps in).
    expect(bc.smallestOpenKvar).toBeCloseTo(33.06, 2);
    expect(bc.mostRoomKvar).toBeLessThan(bc.smallestOpenKvar);
    expect(bc.mostRoomKvar).toBeGreaterThan(left + 0.5 * 12 * tanOf(0.6) - 1);
  });

  it('the text: the hours with their reason and figures, the step that never closed, never "every step in"', () => {
    const text = runTrivar(['profile', BOARD, '--data', WEEK, '--correction-bank']).stdout.replace(/\s+/g, ' ');
    // The hours below the target (up to the voltage-rise line): the resonance check after it names "every step in" as a step state.
    const hours = text.slice(text.indexOf('board PF below'), text.indexOf('largest voltage rise'));
    expect(hours.length).toBeGreaterThan(0);
    expect(hours).not.toContain('every step in');
    expect(text).toContain('board PF below 0.95 with the bank: 50.0 h of import — 48.8 h with the steps still open on lines short of the target too large for them, at their rated kvar carrying those lines past unity into leading (33.1 kvar three-phase against at most 18.9 kvar lagging on the board, 33.1 kvar across B-C against at most 32.4 kvar lagging on its lines and 13.8 kvar across C-A against at most 13.2 kvar lagging on its lines): steps too coarse for that load');
    expect(text).toContain('33.1 kvar across B-C against at most 32.4 kvar lagging on its lines');
    expect(text).toContain('1.25 h with the controller on its way');
    expect(text).toContain(
      "! step 2 (33.1 kvar across B-C) never closed over the data: of the 168.0 h its lines read short of the target, in 166.8 h closing it would have carried them past unity into leading at its rated 33.1 kvar (at most 32.4 kvar lagging there); in 1.25 h it could have closed but waited (the delay, its discharge, or another step first) — 33.1 of the bank's 79.9 kvar unused at these loads",
    );
    const [never] = bank.neverClosed;
    expect(bank.neverClosed).toHaveLength(1);
    expect(never).toMatchObject({ step: 2, channel: 'B-C', shortHours: 168, underThresholdHours: 0 });
    expect(never!.pastLimitHours + never!.underThresholdHours + never!.waitingHours).toBeCloseTo(never!.shortHours, 9);
  });

  it('the interval record agrees: the bank never delivers more than the two steps without the trim', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-trim-'));
    const intervals = join(dir, 'intervals.csv');
    expect(runTrivar(['profile', BOARD, '--data', WEEK, '--correction-bank', '--intervals-csv', intervals]).stderr).toBe('');
    const [head, ...rows] = readFileSync(intervals, 'utf8').trim().split('\n').map((l) => l.split(','));
    const kvar = rows.map((r) => Number(r[head!.indexOf('bank kvar')]));
    expect(Math.max(...kvar)).toBeCloseTo(33.06 + 13.77, 1);
    // 175 quarter hours at 46.8 kvar: the 43.75 h of the working day the old words put down to "every step in".
    expect(kvar.filter((k) => Math.abs(k - 46.8) < 0.05)).toHaveLength(175);
  });
});

describe('no correction section: the correction study\'s defaults, as trivar correct takes them', () => {
  it('runs, says so, and simulates the same bank as the file whose section asks only for PF 0.95', () => {
    const text = runTrivar(['profile', NO_SECTION, '--data', WEEK, '--correction-bank']);
    expect(text.stderr).toBe('');
    expect(text.code).toBe(0);
    expect(text.stdout.replace(/\s+/g, ' ')).toContain(
      "the delta bank trivar correct designs and recommends for this board with the correction study's defaults (the file has no correction section): target PF 0.95 on every line, never leading, every arrangement compared",
    );
    const withDefaults = bankOf(NO_SECTION);
    const withSection = bankOf(BOARD);
    expect(withDefaults.steps).toEqual(withSection.steps);
    expect(withDefaults.belowTarget).toEqual(withSection.belowTarget);
    expect(withDefaults.design.defaultsWords).toBe('target PF 0.95 on every line, never leading, every arrangement compared');
    expect(withSection.design.defaultsWords).toBeUndefined();
  });

  it('trivar correct recommends that same delta bank on the file', () => {
    const r = runTrivar(['correct', NO_SECTION, '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).recommended).toBe('delta-bank');
  });
});
