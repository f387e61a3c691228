/**
 * `trivar profile` and `trivar report --profile-data` on a day when clocks go back: every local time carries
 * its UTC offset, so the two 02:00s of the repeated hour read apart in the text, the JSON and both CSV files;
 * the summary CSV prices in the tariff's currency; the report's section says where its unbalance limit comes
 * from and groups digits as profile does.
 *
 * The day: the Harbour cold store's blast freezer (60 kW, PF 0.8, star) runs all 25 hours of 26 October 2025
 * in Europe/Berlin (clocks back from 03:00 CEST to 02:00 CET), the loading bay heater (6 kW on A-N) in the first
 * 02:00–02:59 only, the ice maker (4 kW at PF 0.8 on B-N) in the second only; 1-minute rows, ideal source.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const BOARD = 'test/fixtures/profile/harbour-cold-store.yaml';
const HEADER = 'time,Blast freezer [x],Loading bay heater [x],Ice maker [x]';
let dir = '';
let data = '';

const pad = (x: number) => String(x).padStart(2, '0');

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-clock-offsets-'));
  data = join(dir, 'cold-store-day.csv');
  const rows = [HEADER];
  const row = (h: number, m: number, heater: number, ice: number) => rows.push(`2025-10-26 ${pad(h)}:${pad(m)},1,${heater},${ice}`);
  for (let h = 0; h < 3; h++) for (let m = 0; m < 60; m++) row(h, m, h === 2 ? 1 : 0, 0);
  for (let m = 0; m < 60; m++) row(2, m, 0, 1); // the repeated hour, now CET
  for (let h = 3; h < 24; h++) for (let m = 0; m < 60; m++) row(h, m, 0, 0);
  writeFileSync(data, rows.join('\n') + '\n');
});

describe('local times across the autumn clock change carry their offset', () => {
  it('text: the peaks of line A (heater, CEST) and line B (ice maker, CET) at 02:00 read apart', () => {
    const r = runTrivar(['profile', BOARD, '--data', data, '--time-zone', 'Europe/Berlin']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('1,500 intervals of 60 s, 2025-10-26 00:00+02:00 to 2025-10-26 23:59+01:00 (Europe/Berlin)');
    // Line A: |(20 + 6) − j15| kVA / 230.94 V = 129.98 A; line B: |24 − j18| / 230.94 = 129.90 A.
    expect(r.stdout).toMatch(/^ {2}line A +130\.0 +2025-10-26 02:00\+02:00 /m);
    expect(r.stdout).toMatch(/^ {2}line B +129\.9 +2025-10-26 02:00\+01:00 /m);
    // The neutral carries the heater's 6 kW / 230.94 V = 25.98 A, in the first 02:00.
    expect(r.stdout).toMatch(/^ {2}neutral +26\.0 +2025-10-26 02:00\+02:00 /m);
  });

  it('JSON, summary CSV and intervals CSV: the same offsets; the charges in EUR', () => {
    const summary = join(dir, 'summary.csv');
    const intervals = join(dir, 'intervals.csv');
    const r = runTrivar(['profile', BOARD, '--data', data, '--time-zone', 'Europe/Berlin', '--summary-csv', summary, '--intervals-csv', intervals, '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.intervals.first).toBe('2025-10-26 00:00+02:00');
    expect(json.intervals.last).toBe('2025-10-26 23:59+01:00');
    expect(json.before.conductors.map((c: { maxAt: string }) => c.maxAt)).toEqual(['2025-10-26 02:00+02:00', '2025-10-26 02:00+01:00', '2025-10-26 00:00+02:00', '2025-10-26 02:00+02:00']);
    // The month's highest 15-min demand is the ice maker's hour: |64 − j48| = 80 kVA, from 02:00 CET = 01:00 UTC.
    expect(json.before.months[0].peakKVA).toBeCloseTo(80, 6);
    expect(json.before.months[0].peakAt).toBe('2025-10-26 02:00+01:00');
    expect(json.before.months[0].peakAtUtcMs).toBe(Date.UTC(2025, 9, 26, 1, 0));

    const sum = readFileSync(summary, 'utf8');
    expect(sum).toContain('peak current at,line A,2025-10-26 02:00+02:00,,local time in Europe/Berlin\n');
    expect(sum).toContain('peak current at,line B,2025-10-26 02:00+01:00,,local time in Europe/Berlin\n');
    // (1,128 kvarh − 0.5 × 1,510 kWh) × 0.03 = 11.19; 80 kVA × 3 = 240: in the file's currency, not a placeholder.
    expect(sum).toContain('reactive charge,2025-10,11.19,,EUR\n');
    expect(sum).toContain('demand charge,2025-10,240,,EUR\n');
    expect(sum).not.toContain('currency');

    const lines = readFileSync(intervals, 'utf8').trimEnd().split('\n');
    expect(lines).toHaveLength(1 + 1500);
    expect(lines[121]).toMatch(/^2025-10-26 02:00\+02:00,129\.98,108\.25,108\.25,25\.98,/);
    expect(lines[181]).toMatch(/^2025-10-26 02:00\+01:00,108\.25,129\.90,108\.25,21\.65,/);
    expect(new Set(lines.slice(1).map((l) => l.split(',')[0])).size).toBe(1500);
  });

  it('times written as the intervals CSV writes them read back to the same instants, none ambiguous', () => {
    const first = join(dir, 'first.csv');
    const again = join(dir, 'again.csv');
    expect(runTrivar(['profile', BOARD, '--data', data, '--time-zone', 'Europe/Berlin', '--intervals-csv', first]).code).toBe(0);
    const times = readFileSync(first, 'utf8').trimEnd().split('\n').slice(1).map((l) => l.split(',')[0]);
    const cells = readFileSync(data, 'utf8').trimEnd().split('\n').slice(1).map((l) => l.slice(l.indexOf(',')));
    const labelled = join(dir, 'labelled.csv');
    writeFileSync(labelled, [HEADER, ...times.map((t, i) => `${t}${cells[i]}`)].join('\n') + '\n');
    const r = runTrivar(['profile', BOARD, '--data', labelled, '--time-zone', 'Europe/Berlin', '--intervals-csv', again, '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).sequence.ambiguousTimes).toBe(0);
    expect(readFileSync(again, 'utf8')).toBe(readFileSync(first, 'utf8'));
  });

  it('Europe/London, half-hourly: the two 01:00s are +01:00 (BST) and +00:00 (GMT)', () => {
    const london = join(dir, 'london.csv');
    const rows = ['00:30,1,0,0', '01:00,1,1,0', '01:30,1,1,0', '01:00,1,0,1', '01:30,1,0,1', '02:00,1,0,0'];
    writeFileSync(london, [HEADER, ...rows.map((r) => `2025-10-26 ${r}`)].join('\n') + '\n');
    const intervals = join(dir, 'london-intervals.csv');
    const r = runTrivar(['profile', BOARD, '--data', london, '--time-zone', 'Europe/London', '--intervals-csv', intervals, '--json']);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.stdout);
    expect(json.sequence.ambiguousTimes).toBe(4);
    expect(json.before.conductors[0].maxAt).toBe('2025-10-26 01:00+01:00');
    expect(json.before.conductors[1].maxAt).toBe('2025-10-26 01:00+00:00');
    expect(readFileSync(intervals, 'utf8').trimEnd().split('\n').slice(1).map((l) => l.slice(0, 22))).toEqual([
      '2025-10-26 00:30+01:00',
      '2025-10-26 01:00+01:00',
      '2025-10-26 01:30+01:00',
      '2025-10-26 01:00+00:00',
      '2025-10-26 01:30+00:00',
      '2025-10-26 02:00+00:00',
    ]);
  });

  it('in UTC the times stay as they were written, with no offset', () => {
    // The first three hours only: in UTC the repeated 02:00s would be out of order.
    const early = join(dir, 'early.csv');
    writeFileSync(early, readFileSync(data, 'utf8').split('\n').slice(0, 1 + 180).join('\n') + '\n');
    const summary = join(dir, 'early-summary.csv');
    const json = JSON.parse(runTrivar(['profile', BOARD, '--data', early, '--summary-csv', summary, '--json']).stdout);
    expect(readFileSync(summary, 'utf8')).toContain('peak current at,line A,2025-10-26 02:00,,UTC\n');
    expect(json.intervals.first).toBe('2025-10-26 00:00');
    expect(json.intervals.last).toBe('2025-10-26 02:59');
    expect(json.before.conductors[0].maxAt).toBe('2025-10-26 02:00');
  });
});

describe('trivar report --profile-data', () => {
  it('the unbalance limit is credited to profile.limits where the file sets it; counts and energies grouped', () => {
    const out = join(dir, 'cold-store.md');
    const r = runTrivar(['report', BOARD, '--profile-data', data, '--time-zone', 'Europe/Berlin', '-o', out]);
    expect(r.code).toBe(0);
    const md = readFileSync(out, 'utf8');
    expect(md).toContain('**Intervals:** 1,500 of 1 min, 2025-10-26 00:00+02:00 to 2025-10-26 23:59+01:00 (Europe/Berlin)');
    // 60 kW × 25 h + 6 kW × 1 h + 4 kW × 1 h = 1,510 kWh; 45 kvar × 25 h + 3 kvar × 1 h = 1,128 kvarh.
    expect(md).toContain('**Energy imported / exported:** 1,510 kWh / 0 kWh');
    expect(md).toContain('**Reactive energy lagging / leading:** 1,128 kvarh / 0 kvarh');
    expect(md).toContain('Voltage unbalance factor |V2|/|V1| (profile.limits), highest / 95th percentile / hours above 0.5 %');
    expect(md).not.toContain('EN 50160 / IEC 61000-2-2 level, from memory), highest');
    expect(md).toMatch(/\| A \| 130\.0 \| 2025-10-26 02:00\+02:00 \|/);
    expect(md).toMatch(/\| B \| 129\.9 \| 2025-10-26 02:00\+01:00 \|/);
  });

  it('without profile.limits the limit is the region\'s, credited to its standard', () => {
    const own = join(dir, 'no-limits.yaml');
    writeFileSync(own, readFileSync(BOARD, 'utf8').replace('  limits: { unbalancePercent: 0.5 }\n', ''));
    const out = join(dir, 'no-limits.md');
    expect(runTrivar(['report', own, '--profile-data', data, '--time-zone', 'Europe/Berlin', '-o', out]).code).toBe(0);
    expect(readFileSync(out, 'utf8')).toContain('Voltage unbalance factor |V2|/|V1| (EN 50160 / IEC 61000-2-2 level, from memory), highest / 95th percentile / hours above 2 %');
  });
});
