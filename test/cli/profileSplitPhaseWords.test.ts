/**
 * `trivar profile` on a 120/240 V split-phase service speaks of its two lines: a simulated bank's steps are
 * line-to-neutral on L1 and L2 (as simulateBank places them), never "three-phase", and the unbalance column
 * is "-" — |V2|/|V1| needs three phases, and solve leaves it blank there too.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

let dir = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-split-words-'));
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
  - name: Garage subpanel
    fedFrom: Service panel
    feeder: { lengthFt: 120, line: { awg: "6" }, neutral: { awg: "6" } }
    loads:
      - { name: Welder, connection: L1-L2, kW: 5, pf: 0.7 }
      - { name: Compressor, connection: L1-N, kW: 1.5, pf: 0.8 }
`,
  );
  writeFileSync(join(dir, 'house.csv'), 'time,Range [x],Kitchen [kW],Welder [x],Compressor [x]\n2026-06-01T10:00,0.5,1.0,0,1\n2026-06-01T10:15,0.5,1.2,1,1\n2026-06-01T10:30,0,0.3,0,0\n2026-06-01T10:45,1,1.5,1,1\n');
});

describe('profile on a split-phase installation', () => {
  const args = () => ['profile', join(dir, 'house.yaml'), '--data', join(dir, 'house.csv'), '--bank', '--board', 'Garage subpanel'];

  it('names the bank\'s steps line-to-neutral on L1 and L2, never three-phase', () => {
    const r = runTrivar(args());
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const bank = r.stdout.slice(r.stdout.indexOf('Automatic bank on Garage subpanel'));
    expect(bank).not.toContain('three-phase');
    expect(bank.replace(/\s+/g, ' ')).toMatch(/sized from the profile to cover the kvar the target needs in 95 % of intervals: [\d.]+ kvar line-to-neutral on L1 and L2 at that percentile/);
    expect(bank).toMatch(/^ {5}1 {2}line-to-neutral on L1 and L2 /m);
    const json = JSON.parse(runTrivar([...args(), '--json']).stdout);
    expect(json.bank.placeWords).toEqual({ ABC: 'line-to-neutral on L1 and L2' });
  });

  it('shows no unbalance figure where sequence components do not exist, and says why', () => {
    const r = runTrivar(args());
    const worst = r.stdout.slice(r.stdout.indexOf('Intervals with the highest neutral current'));
    const rows = worst.split('\n').filter((l) => /^ {2}2026-06-01/.test(l));
    // A table for each board with a neutral (the main panel's supply and the subpanel's feeder), 4 intervals each.
    expect(worst.match(/^Intervals with the highest neutral current at /gm)).toHaveLength(2);
    expect(rows).toHaveLength(8);
    for (const row of rows) expect(row.trimEnd().endsWith(' -')).toBe(true);
    expect(worst).toContain('(unbalance %: defined for three phases only; - on this board)');
    const json = JSON.parse(runTrivar([...args(), '--json']).stdout);
    expect(json.boards[0].before.worstByNeutral.map((w: { unbalancePercent: number | null }) => w.unbalancePercent)).toEqual([null, null, null, null]);
  });
});
