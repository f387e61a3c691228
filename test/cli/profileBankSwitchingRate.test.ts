/**
 * `trivar profile --bank`: the switching threshold the controller can hold without hunting, closings a year
 * counted from a bank already settled and scaled over the data's own hours, a warning past the operations a
 * year a capacitor step is rated for, and no voltage rise reported where the bank raises none.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const WINCH = 'test/fixtures/profile/ropewalk-winch.yaml';
const STEADY = 'test/fixtures/profile/ropewalk-winch-steady.csv';
const CYCLING = 'test/fixtures/profile/ropewalk-winch-cycling.csv';
let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-bank-rate-'));
  // A whole 365-day year, hourly: the winch works 08:00 to 16:00 every day.
  const rows = ['time,Winch [x]'];
  for (let h = 0; h < 8760; h++) rows.push(`${new Date(Date.UTC(2025, 0, 1, h)).toISOString().slice(0, 16)}Z,${h % 24 >= 8 && h % 24 < 16 ? 1 : 0}`);
  writeFileSync(join(dir, 'year.csv'), `${rows.join('\n')}\n`);
});

const withThreshold = (share: number) => {
  const file = join(dir, `winch-${share}.yaml`);
  writeFileSync(file, readFileSync(WINCH, 'utf8').replace('delaySeconds: 30', `responseShare: ${share}, delaySeconds: 30`));
  return file;
};

describe('profile.bank.responseShare', () => {
  it('below half a step is refused, naming the field, the accepted range and why', () => {
    // 30 kW at PF 0.896 needs 14.86 − 9.86 = 5.0 kvar: above 0.3 × 10 kvar it closes, leaving −5.0 kvar, past −3 kvar: it opens again.
    const r = runTrivar(['profile', withThreshold(0.3), '--data', STEADY, '--bank']);
    expect(r.code).not.toBe(0);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain('profile.bank.responseShare: expected a number from 0.5 to 1.5 (× the smallest step)');
    expect(r.stderr).toContain('the controller hunts on a steady load (common practice, no source) (received 0.3)');
    expect(r.stderr).not.toMatch(/at .*\.js:\d+/);
  });
  it('half a step is accepted', () => {
    const r = runTrivar(['profile', withThreshold(0.5), '--data', STEADY, '--bank', '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).bank.settings.responseShare).toBe(0.5);
  });
});

describe('closings a year', () => {
  it('a steady hour: the bank starts settled, so no closing is counted, and the rate is said to be an extrapolation', () => {
    // 30 kW at PF 0.85: need 18.59 − 9.86 = 8.7 kvar > 0.67 × 10: the step is in from the first interval.
    const r = runTrivar(['profile', WINCH, '--data', STEADY, '--bank', '--json']);
    expect(r.code).toBe(0);
    const bank = JSON.parse(r.stdout).bank;
    expect(bank.steps.map((s: { closings: number; closingsPerYear: number }) => [s.closings, s.closingsPerYear])).toEqual([[0, 0]]);
    expect(bank.yearsToContactorLife).toBeNull();
    expect(bank.closingsBasis).toMatchObject({ dataHours: 1, extrapolated: true });
    expect(bank.closingsBasis.words).toMatch(/^per year: extrapolated from only 1\.00 h of data, under a week/);
    expect(bank.warnings).toEqual([]);
    // A step in service from the start: every interval at 10 kvar.
    expect(bank.belowTarget.hours).toBe(0);
  });

  it('a full 365-day year: the closings are the rate, not divided by 365.25 days', () => {
    // Idle at the first hour, so nothing is in at the start; one closing each morning: 365.
    const r = runTrivar(['profile', WINCH, '--data', join(dir, 'year.csv'), '--bank', '--json']);
    expect(r.code).toBe(0);
    const bank = JSON.parse(r.stdout).bank;
    expect(bank.steps[0].closings).toBe(365);
    expect(bank.steps[0].closingsPerYear).toBe(365);
    expect(bank.closingsBasis).toMatchObject({ dataHours: 8760, extrapolated: false });
    expect(bank.closingsBasis.words).toMatch(/^per year: the closings over the 8,760 h of data \(365 days\)/);
  });

  it('a step closing more often than 5,000 times a year is a prominent warning, in text and JSON', () => {
    // The winch starts every 10 minutes for a day: 144 closings, × 365 = 52,560 a year.
    const json = JSON.parse(runTrivar(['profile', WINCH, '--data', CYCLING, '--bank', '--json']).stdout);
    expect(json.bank.steps[0].closings).toBe(144);
    expect(json.bank.steps[0].closingsPerYear).toBeCloseTo(52_560, 6);
    expect(json.bank.warnings).toHaveLength(1);
    expect(json.bank.warnings[0]).toMatch(/^closings a year above the 5,000 operations a year a capacitor step is commonly rated for \(IEC 60831-1 practice\): step 1 \(10\.0 kvar\) 52,560 \(extrapolated from 24 h of data\)/);
    const text = runTrivar(['profile', WINCH, '--data', CYCLING, '--bank']).stdout;
    expect(text).toMatch(/^ {2}! warning: closings a year above the 5,000 operations/m);
    // Under the limit, no such warning: the year above has 365.
    const year = JSON.parse(runTrivar(['profile', WINCH, '--data', join(dir, 'year.csv'), '--bank', '--json']).stdout);
    expect(year.bank.warnings).toEqual([]);
  });
});

describe('voltage rise from the bank', () => {
  it('on an ideal source there is none, and no time is given for it', () => {
    const json = JSON.parse(runTrivar(['profile', WINCH, '--data', STEADY, '--bank', '--json']).stdout);
    expect(json.bank.voltageRisePercent).toBe(0);
    expect(json.bank.voltageRiseAt).toBeNull();
    expect(json.bank.voltageRiseWords).toMatch(/^no voltage rise from the bank: the board's voltage does not move with its load here \(the supply is taken as ideal/);
    const text = runTrivar(['profile', WINCH, '--data', STEADY, '--bank']).stdout;
    expect(text).not.toContain('largest voltage rise');
    expect(text).toContain('no voltage rise from the bank');
  });
});
