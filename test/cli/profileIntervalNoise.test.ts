/**
 * The per-interval CSV of `trivar profile` carries data, not round-off: an interval with no power has no
 * power factor (an empty cell), and a figure that rounds to zero prints as 0.000, never −0.000. The rule
 * is the general solve's noise floor (analysis/noiseFloor.ts), interval by interval.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

let dir = '';
const rowsOf = (file: string) => readFileSync(file, 'utf8').trim().split('\n').map((l) => l.split(','));

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-interval-noise-'));
  writeFileSync(
    join(dir, 'motor.yaml'),
    `name: One motor
supply: { voltage: 400/230, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }
loads:
  - { name: Motor, connection: ABC-delta, kW: 30, pf: 0.7 }
profile:
  bank: { delaySeconds: 1200 }
`,
  );
  writeFileSync(join(dir, 'motor.csv'), 'time,Motor [x]\n2026-01-05T00:00,0\n2026-01-05T00:15,1\n2026-01-05T00:30,1\n2026-01-05T00:45,0\n2026-01-05T01:00,0\n');
  writeFileSync(
    join(dir, 'house.yaml'),
    `name: Split house
supply: { voltage: 120/240, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.2, xOverR: 1.8 } }
boards:
  - name: Service panel
    feeder: { lengthFt: 60, line: { awg: "2/0", material: aluminum, ratingA: 175 }, neutral: { awg: "1/0", material: aluminum } }
    loads:
      - { name: Range, connection: L1-L2, kW: 8, model: constant-impedance }
      - { name: Kitchen, connection: L1-N, kW: 1.8, pf: 0.95 }
  - name: PV only
    fedFrom: Service panel
    loads:
      - { name: Inverter, connection: L1-L2, kW: -7.6, pf: 1 }
`,
  );
  writeFileSync(join(dir, 'house.csv'), 'time,Range [x],Kitchen [kW],Inverter [x]\n2026-06-01T10:00,0.5,1.0,1\n2026-06-01T10:15,0,0,0\n');
});

describe('the per-interval CSV of a profile', () => {
  it('an idle interval has zero current and power and no power factor, with and without the bank', () => {
    const out = join(dir, 'motor-out.csv');
    const r = runTrivar(['profile', join(dir, 'motor.yaml'), '--data', join(dir, 'motor.csv'), '--bank', '--intervals-csv', out]);
    expect(r.code).toBe(0);
    const [head, ...rows] = rowsOf(out);
    const col = (name: string) => head!.indexOf(name);
    // 00:00: nothing on, no bank.
    expect([rows[0]![col('line A A')], rows[0]![col('P kW')], rows[0]![col('Q kvar')], rows[0]![col('PF')]]).toEqual(['0.00', '0.000', '0.000', '']);
    expect([rows[0]![col('P with bank kW')], rows[0]![col('Q with bank kvar')], rows[0]![col('PF with bank')]]).toEqual(['0.000', '0.000', '']);
    // 00:45: the motor off but the 22.5 kvar step still in (the 1200 s delay has not run out): a capacitor alone,
    // P 0.000 (not −0.000) and PF 0 — a real figure of a purely reactive interval. (One 22.5 kvar step for the
    // 20.7 kvar need, which the controller closes; its own rise through the transformer puts it at 100.9 %
    // voltage: 22.5 × 1.0086² = 22.889 kvar.)
    expect(rows[3]![col('bank kvar')]).toBe('22.5');
    expect(rows[3]![col('P with bank kW')]).toBe('0.000');
    expect(Number(rows[3]![col('Q with bank kvar')])).toBeCloseTo(-22.889, 3);
    expect(rows[3]![col('PF with bank')]).toBe('0.0000');
    expect(readFileSync(out, 'utf8')).not.toMatch(/(^|,)-0\.0*(,|$)/m);
  });

  it('on a split-phase installation: no −0.000, and a board with nothing on has no power factor', () => {
    const out = join(dir, 'house-out.csv');
    const r = runTrivar(['profile', join(dir, 'house.yaml'), '--data', join(dir, 'house.csv'), '--intervals-csv', out]);
    expect(r.code).toBe(0);
    const [head, ...rows] = rowsOf(out);
    const col = (name: string) => head!.indexOf(name);
    // The inverter at unity PF: its reactive power is round-off, printed as 0.000.
    expect(rows[0]![col('PV only: Q kvar')]).toBe('0.000');
    expect(rows[0]![col('PV only: PF')]).toBe('1.0000');
    // 10:15: every load off.
    for (const board of ['Service panel', 'PV only']) {
      expect(rows[1]![col(`${board}: P kW`)]).toBe('0.000');
      expect(rows[1]![col(`${board}: Q kvar`)]).toBe('0.000');
      expect(rows[1]![col(`${board}: PF`)]).toBe('');
    }
    expect(readFileSync(out, 'utf8')).not.toMatch(/(^|,)-0\.0*(,|$)/m);
  });
});
