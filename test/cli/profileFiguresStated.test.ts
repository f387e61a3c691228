/**
 * `trivar profile` says what its figures rest on: no "-0" printed, and (further down) the cases where a
 * figure could mislead are stated in words.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const SHED = 'test/fixtures/profile/orchard-packing-shed.yaml';
const SHED_DATA = 'test/fixtures/profile/orchard-packing-shed.csv';

describe('trivar profile figures', () => {
  it('a line whose reactive energy nets to a small negative figure prints 0, never "-0"', () => {
    // Line A: +0.2 kvar then -0.6 kvar for half an hour each: -0.2 kvarh. A table of figures under 100 takes
    // one decimal (whole units would round a visible share away), so it reads -0.2, never "-0".
    const r = runTrivar(['profile', SHED, '--data', SHED_DATA]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^ {2}line A +3\.0 +-0\.2$/m);
    expect(r.stdout).not.toMatch(/(^|[\s(])-0(?![.\d])/m);
    const json = JSON.parse(runTrivar(['profile', SHED, '--data', SHED_DATA, '--json']).stdout);
    expect(json.before.energy.phases[0].kvarh).toBeCloseTo(-0.2, 6);
  });

  describe('--bank: a bank sized from the profile reaches the target, and where a bank misses it the hours say why', () => {
    const SHOP = 'test/fixtures/profile/print-shop.yaml';
    const BUSY = 'test/fixtures/profile/print-shop-busy.csv';
    it('a 2.77 kvar need: one 3 kvar step that closes, not two 2.5 kvar steps of which the second never does', () => {
      // 20 kW at 9.34 kvar (PF 0.906): 9.34 − 20·tan(acos 0.95) = 2.77 kvar. Two 2.5 kvar steps would leave
      // 0.27 kvar after the first, under the 0.65 × 2.5 = 1.63 kvar threshold: PF 0.946, below the target.
      const json = JSON.parse(runTrivar(['profile', SHOP, '--data', BUSY, '--bank', '--json']).stdout);
      expect(json.bank.needKvar.ABC).toBeCloseTo(2.77, 2);
      // The bank starts settled at the first interval's load: the step is in from the start, no closing counted.
      expect(json.bank.steps.map((s: { kvar: number; closings: number }) => [s.kvar, s.closings])).toEqual([[3, 0]]);
      // 9.34 − 3.02 (3 kvar at 100.4 % voltage) = 6.32 kvar → 20/√(20² + 6.32²) = 0.9535.
      expect(json.bank.after.energy.billingPf).toBeCloseTo(0.9535, 3);
      expect(json.bank.belowTarget).toEqual({ hours: 0, allStepsInHours: 0, shortOfStepsHours: 0, shortOfStepsOpenKvar: 0, underResponseHours: 0, underResponseChannels: [], stepTooCoarseHours: 0, stepTooCoarseChannels: [], openStepsTooLargeHours: 0, onTheWayHours: 0, openStepsTooLarge: null });
      expect(json.bank.targetOutOfReach).toBeNull();
    });

    it('steps as built that leave the target missed: the hours below it and the reason, in text and JSON', () => {
      const args = ['profile', 'test/fixtures/profile/print-shop-coarse-steps.yaml', '--data', BUSY, '--bank'];
      const text = runTrivar(args).stdout.replace(/\s+/g, ' ');
      expect(text).toContain('billing power factor 0.906 → 0.946');
      expect(text).toContain('board PF below 0.95 with the bank: 4.00 h of import — 4.00 h with the shortfall under the switching threshold (0.65 × 2.5 kvar = 1.63 kvar: no step closes for it)');
      const json = JSON.parse(runTrivar([...args, '--json']).stdout);
      // Settled at the first interval's load (one step in, its start-up closing not counted), then steady.
      expect(json.bank.steps.map((s: { closings: number }) => s.closings)).toEqual([0, 0]);
      expect(json.bank.belowTarget).toEqual({ hours: 4, allStepsInHours: 0, shortOfStepsHours: 0, shortOfStepsOpenKvar: 0, underResponseHours: 4, underResponseChannels: [{ channel: 'ABC', smallestKvar: 2.5 }], stepTooCoarseHours: 0, stepTooCoarseChannels: [], openStepsTooLargeHours: 0, onTheWayHours: 0, openStepsTooLarge: null });
    });

    it('a need under every step size\'s threshold is warned, not passed silently', () => {
      // 20 kW at PF 0.945: 20·(0.34611 − 0.32868) = 0.348 kvar, under 0.67 × the smallest 1 kvar step (and 1 − 0.67 of it).
      const r = runTrivar(['profile', 'test/fixtures/profile/laundry-near-target.yaml', '--data', 'test/fixtures/profile/laundry-near-target.csv', '--bank', '--json']);
      const bank = JSON.parse(r.stdout).bank;
      expect(bank.targetOutOfReach).toMatchObject({ channel: 'ABC', needKvar: expect.closeTo(0.348, 3) });
      expect(bank.targetOutOfReach.words).toContain('cannot hold PF 0.95 at the 0.3 kvar need');
      expect(bank.belowTarget.hours).toBe(2);
    });

    it('no bank sized: the reason, in text and JSON, exit 0', () => {
      const cases = [
        ['print-shop-closed.csv', 'no-current', 'no current flows in any interval of the data'],
        ['print-shop-kettles.csv', 'no-lagging-reactive-power', 'the loads draw no lagging reactive power in any interval'],
      ] as const;
      for (const [data, reason, words] of cases) {
        const args = ['profile', SHOP, '--data', `test/fixtures/profile/${data}`, '--bank'];
        const text = runTrivar(args);
        expect(text.code).toBe(0);
        expect(text.stdout.replace(/\s+/g, ' ')).toContain(`Automatic bank over the profile no bank sized or simulated: ${words}`);
        const json = JSON.parse(runTrivar([...args, '--json']).stdout);
        expect(json.bank).toBeNull();
        expect(json.bankNotSized.reason).toBe(reason);
      }
    });
  });

  describe('scenario hours share out one year', () => {
    const farm = (dairy: number, night: number) => `name: Hazel Farm dairy
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }
loads:
  - { name: Milking pump, connection: ABC-delta, kW: 7.5, pf: 0.82 }
  - { name: Water heater, connection: A-N, kW: 3, pf: 1 }
profile:
  scenarios:
    - { name: milking, hours: ${dairy}, loads: { Milking pump: 1, Water heater: 1 } }
    - { name: night, hours: ${night}, loads: { Water heater: 0.5 } }
`;
    it('more than 8784 h in all is refused, naming the field, the total and each scenario', () => {
      const r = runTrivar(['profile', '-'], farm(5000, 4000));
      expect(r.code).toBe(3);
      expect(r.stderr).toContain('profile.scenarios: expected scenario hours that share out one year, 8784 h at most');
      expect(r.stderr).toContain('they sum to 9000 h (milking 5000 h + night 4000 h)');
      expect(r.stderr).not.toMatch(/\bat \S+\.js:\d+/);
    });
    it('a leap year in all is accepted, and its energy is the scenarios\' own', () => {
      const r = runTrivar(['profile', '-', '--json'], farm(4784, 4000));
      expect(r.code).toBe(0);
      const json = JSON.parse(r.stdout);
      expect(json.hours).toBe(8784);
      // 4784 h × 10.5 kW + 4000 h × 1.5 kW = 56,232 kWh (losses: no source impedance).
      expect(json.kWhImport).toBeCloseTo(56_232, 0);
    });
  });

  describe('the report\'s load-over-time section states the data\'s gaps and repeated clock times as profile does', () => {
    const SHOP = 'test/fixtures/profile/print-shop.yaml';
    const cases = [
      ['print-shop-gap.csv', [], '1 gap, 2 intervals (1.00 h) missing: left out of every figure'],
      ['print-shop-clocks-back.csv', ['--time-zone', 'Europe/Dublin'], '4 wall-clock times fall in the repeated hour when clocks go back: placed in row order'],
    ] as const;
    it.each(cases)('%s', (data, zone, words) => {
      const csv = `test/fixtures/profile/${data}`;
      const profile = runTrivar(['profile', SHOP, '--data', csv, ...zone]);
      expect(profile.stdout).toContain(words);
      const dir = mkdtempSync(join(tmpdir(), 'trivar-report-data-'));
      for (const file of ['r.md', 'r.html']) {
        const r = runTrivar(['report', SHOP, '--profile-data', csv, ...zone, '-o', join(dir, file)]);
        expect(r.code).toBe(0);
        const text = readFileSync(join(dir, file), 'utf8');
        expect(text).toContain('Interval data');
        expect(text).toContain(words);
        // The report has no --fill-gaps: it does not point at one.
        expect(text).not.toContain('--fill-gaps');
      }
    });
  });

  describe('a neutral above its rating is warned in words, on every board', () => {
    it('an installation: the sub-board whose feeder neutral is overloaded, hours and peak; worst intervals for every board with a neutral', () => {
      // Boat shed: 6 kW hull heaters on A-N alone at full output for 07:30 and 08:00 (1 h of the 2 h): 230² / 6000
      // = 8.82 Ω at about 223 V → 25.3 A in a neutral rated 20 A.
      const args = ['profile', 'test/fixtures/profile/marina-sheds.yaml', '--data', 'test/fixtures/profile/marina-sheds.csv'];
      const r = runTrivar(args);
      expect(r.code).toBe(0);
      const text = r.stdout.replace(/\s+/g, ' ');
      expect(text).toContain('Warnings ! Boat shed: neutral current above its 20 A rating for 1.00 h of the 2.00 h, peak 25.3 A at 2026-02-02 07:30');
      expect(text).not.toContain('! Harbour office');
      expect(r.stdout).toContain('Intervals with the highest neutral current at Harbour office\n');
      expect(r.stdout).toContain('Intervals with the highest neutral current at Boat shed (its feeder from Harbour office)\n');
      const json = JSON.parse(runTrivar([...args, '--json']).stdout);
      expect(json.warnings).toHaveLength(1);
      expect(json.warnings[0]).toMatch(/^Boat shed: neutral current above its 20 A rating for 1\.00 h/);
    });
    it('a board file: the warning names the limit the study judged against', () => {
      const board = `name: Kiln room
supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }
feeder:
  line: { lengthM: 25, rOhmPerKm: 1.15, xOhmPerKm: 0.09, ratingA: 40 }
  neutral: { lengthM: 25, rOhmPerKm: 1.15, xOhmPerKm: 0.09, ratingA: 32 }
loads:
  - { name: Kiln, connection: A-N, kW: 5, pf: 1, model: constant-impedance }
profile: { limits: { neutralA: 16 } }
`;
      const r = runTrivar(['profile', '-', '--data', 'test/fixtures/profile/kiln-room.csv'], board);
      expect(r.code).toBe(0);
      // 5 kW (21.7 A at 230 V) through 25 m of 1.15 Ω/km line and neutral: 21.5 A against the study's 16 A
      // limit, for one half-hour of two; under the neutral's 32 A rating, so no word of overheating.
      const text = r.stdout.replace(/\s+/g, ' ');
      expect(text).toContain("! neutral current above the study's 16 A neutral limit (profile.limits.neutralA) for 0.50 h of the 1.00 h, peak 21.5 A at 2026-03-09 18:00 Cautions");
    });
  });

  describe('a metered phase total and a load on that phase are not both counted', () => {
    const SHOP = 'test/fixtures/profile/print-shop.yaml';
    it('a column for a load on the metered phase is refused, naming both columns', () => {
      const r = runTrivar(['profile', SHOP, '--data', 'test/fixtures/profile/print-shop-phase-and-dryers.csv']);
      expect(r.code).toBe(3);
      expect(r.stderr).toContain('header ("phase A" and "Dryers"): expected a metered phase total or columns for the loads on that phase, not both');
      expect(r.stderr).toContain('"Dryers" (A-N)');
      expect(r.stderr).not.toContain('"Compressor"');
    });
    it('--unlisted-at-rating would keep a load of the metered phase on: refused; the other phases\' loads are not', () => {
      const data = 'test/fixtures/profile/print-shop-phase-a-metered.csv';
      const r = runTrivar(['profile', SHOP, '--data', data, '--unlisted-at-rating']);
      expect(r.code).toBe(3);
      expect(r.stderr).toContain('--unlisted-at-rating holds "Dryers" (A-N) on at its rating');
      expect(r.stderr).not.toContain('Kettle room');
      // Without it the dryers count as off, and phase A carries the metered 8 and 9 kW alone: 8.5 kWh.
      const json = JSON.parse(runTrivar(['profile', SHOP, '--data', data, '--json']).stdout);
      expect(json.before.energy.phases[0].kWh).toBeCloseTo(8.5, 6);
    });
  });
});
