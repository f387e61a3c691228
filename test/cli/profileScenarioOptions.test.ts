/**
 * `trivar profile` without --data runs the file's scenarios: the tariff is priced on their hours, and the
 * options that only interval data gives a meaning to are refused by name (exit 2, no file written) rather
 * than left unused. --pf with data but no bank is refused the same way.
 *
 * The Harbour cold store's year: "night" 3,000 h with the blast freezer at half (30 kW, 22.5 kvar), "day shift"
 * 2,500 h with everything on (60 + 6 + 4 = 70 kW, 45 + 3 = 48 kvar).
 */
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const BOARD = 'test/fixtures/profile/harbour-cold-store.yaml';
let dir = '';
let data = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-scenario-options-'));
  data = join(dir, 'two-readings.csv');
  writeFileSync(data, 'time,Blast freezer [x],Loading bay heater [x],Ice maker [x]\n2025-03-04 10:00,1,1,0\n2025-03-04 10:15,1,0,1\n');
});

describe('scenarios priced with the file\'s tariff', () => {
  it('the reactive charge on the year\'s totals, the demand charge of a month with the largest scenario', () => {
    const r = runTrivar(['profile', BOARD]);
    expect(r.code).toBe(0);
    const text = r.stdout.replace(/\s+/g, ' ');
    // 30 × 3,000 + 70 × 2,500 = 265,000 kWh; 22.5 × 3,000 + 48 × 2,500 = 187,500 kvarh.
    expect(text).toContain('over the year: 265,000 kWh imported, 187,500 kvarh lagging');
    // (187,500 − 0.5 × 265,000) × 0.03 = 55,000 kvarh × 0.03 = 1,650.00 EUR.
    expect(text).toContain('reactive charge 1650.00 EUR a year: 55,000 kvarh lagging above the allowance (187,500 kvarh − 0.5 × 265,000 kWh)');
    // Day shift: √(70² + 48²) = 84.88 kVA × 3 EUR/kVA = 254.63 EUR.
    expect(text).toContain('demand charge 254.63 EUR in each month in which "day shift" (84.9 kVA, the largest scenario) lasts a whole 15-min window');
    const json = JSON.parse(runTrivar(['profile', BOARD, '--json']).stdout);
    expect(json.tariff.currency).toBe('EUR');
    expect(json.tariff.reactive.chargeableKvarh).toBeCloseTo(55_000, 6);
    expect(json.tariff.reactive.charge).toBeCloseTo(1650, 6);
    expect(json.tariff.demand).toMatchObject({ scenario: 'day shift', windowMinutes: 15 });
    expect(json.tariff.demand.peakKVA).toBeCloseTo(Math.hypot(70, 48), 6);
    expect(json.tariff.demand.chargePerMonth).toBeCloseTo(3 * Math.hypot(70, 48), 6);
  });

  it('an installation: priced at the main board, where the supply is billed', () => {
    // Osier Mill: 23,224 kvarh lagging is under 0.4 × 82,231 kWh, so no reactive charge; the studio day is the
    // largest state at the intake, √(19.65² + 7.46²) = 21.02 kVA × 3.1 EUR/kVA = 65.15 EUR a month.
    const r = runTrivar(['profile', 'examples/osier-mill-studios.yaml']);
    expect(r.code).toBe(0);
    const text = r.stdout.replace(/\s+/g, ' ');
    expect(text).toContain('Tariff at Mill intake, where the supply is billed');
    expect(text).toContain('no reactive charge: 23,224 kvarh lagging is within the allowance (0.4 × 82,231 kWh = 32,893 kvarh), on the year\'s totals');
    expect(text).toContain('demand charge 65.15 EUR in each month in which "studio day" (21.0 kVA, the largest scenario) lasts a whole 30-min window');
    const json = JSON.parse(runTrivar(['profile', 'examples/osier-mill-studios.yaml', '--json']).stdout);
    const day = json.boards[0].scenarios.find((s: { name: string }) => s.name === 'studio day');
    expect(json.tariff.demand.peakKVA).toBeCloseTo(Math.hypot(day.kW, day.kvar), 9);
    expect(json.tariff.demand.chargePerMonth).toBeCloseTo(3.1 * Math.hypot(day.kW, day.kvar), 9);
    const zone = runTrivar(['profile', 'examples/osier-mill-studios.yaml', '--time-zone', 'Europe/Dublin']);
    expect(zone.code).toBe(2);
    expect(zone.stderr).toContain('--time-zone works on interval data');
  });

  it('a file with no tariff has none priced, and no heading for one', () => {
    const bare = join(dir, 'no-tariff.yaml');
    const text = `name: Net loft\nsupply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }\nloads:\n  - { name: Winch, connection: ABC-star, kW: 5, pf: 0.8 }\nprofile:\n  scenarios:\n    - { name: hauling, hours: 400, loads: { Winch: 1 } }\n`;
    writeFileSync(bare, text);
    const r = runTrivar(['profile', bare]);
    expect(r.code).toBe(0);
    expect(r.stdout).not.toMatch(/^Tariff/m);
    expect(JSON.parse(runTrivar(['profile', bare, '--json']).stdout).tariff).toBeNull();
  });
});

describe('options for interval data, beside scenarios', () => {
  const cases: [string, string[]][] = [
    ['--bank', ['--bank']],
    ['--correction-bank', ['--correction-bank']],
    ['--pf', ['--pf', '0.97']],
    ['--charts', ['--charts', 'CHARTS']],
    ['--summary-csv', ['--summary-csv', 'SUMMARY']],
    ['--intervals-csv', ['--intervals-csv', 'INTERVALS']],
    ['--fill-gaps', ['--fill-gaps', 'hold']],
    ['--time-zone', ['--time-zone', 'Europe/Lisbon']],
    ['--unlisted-at-rating', ['--unlisted-at-rating']],
  ];
  for (const [option, args] of cases)
    it(`${option} is refused by name, exit 2, nothing written`, () => {
      const paths = { CHARTS: join(dir, `charts${option}`), SUMMARY: join(dir, `summary${option}.csv`), INTERVALS: join(dir, `intervals${option}.csv`) };
      const given = args.map((a) => paths[a as keyof typeof paths] ?? a);
      const r = runTrivar(['profile', BOARD, ...given]);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toContain(`${option} works on interval data (it `);
      expect(r.stderr).toContain('give --data <file.csv>');
      for (const p of Object.values(paths)) expect(existsSync(p)).toBe(false);
    });

  it('--pf with data but without --bank is refused, naming what it needs', () => {
    const r = runTrivar(['profile', BOARD, '--data', data, '--pf', '0.97']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--pf sets the target of the bank --bank sizes and simulates over the data: give --bank too');
    const withBank = runTrivar(['profile', BOARD, '--data', data, '--pf', '0.97', '--bank', '--json']);
    expect(withBank.code).toBe(0);
    expect(JSON.parse(withBank.stdout).bank.settings.targetPf).toBe(0.97);
  });
});
