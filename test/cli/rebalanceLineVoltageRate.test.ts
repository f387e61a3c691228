/**
 * On a North-American board `trivar rebalance` shows the NEMA MG 1 line-voltage unbalance rate (the figure
 * motors there are judged by) beside |V2|/|V1|, from the network re-solve; it showed |V2|/|V1| only. The
 * figures must be those `trivar solve` prints for the board as it stands and for the file written with the moves.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { RebalanceReport } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';
import { expectClose } from '../support/tolerance.js';

const printShop = 'examples/cedar-falls-print-shop.yaml';
const bakery = 'examples/corner-bakery.yaml';

// An invented 208Y/120 V strip mall: a house panel feeding a laundromat whose washers sit on line A.
const stripMall = `name: Birchwood strip mall
supply:
  system: three-phase-4wire
  voltage: { lineToLine: 208 }
  frequencyHz: 60
  transformer: { kVA: 150, impedancePercent: 3.5, xOverR: 3 }
boards:
  - name: House panel
    feeder: { lengthM: 20, line: { awg: "4/0", ratingA: 230 }, neutral: { awg: "4/0" } }
    loads:
      - { name: Rooftop unit, connection: ABC-delta, kW: 12, pf: 0.84 }
      - { name: Parking lights, connection: A-N, kW: 2.4, pf: 0.95 }
  - name: Laundromat
    fedFrom: House panel
    feeder: { lengthM: 30, line: { awg: "1", ratingA: 130 }, neutral: { awg: "1" } }
    loads:
      - { name: Washers row 1, connection: A-N, kW: 5.5, pf: 0.8 }
      - { name: Washers row 2, connection: A-N, kW: 4.5, pf: 0.8 }
      - { name: Dryer bank, connection: A-B, kW: 9, pf: 0.98 }
      - { name: Counter and lights, connection: B-N, kW: 1.2, pf: 0.95 }
`;

/** The NEMA figure `trivar solve` prints for a board file, as printed. */
function solvePrints(file: string): string {
  const r = runTrivar(['solve', file]);
  expect(r.code).toBe(0);
  return /line-voltage unbalance rate \(NEMA MG 1\)\s+(\S+) %/.exec(r.stdout)![1]!;
}

/** Each board's "V unbal. %" (the line-to-line deviation on a North-American installation) as `trivar solve` prints it. */
function solveBoardsPrint(file: string): Record<string, string> {
  const r = runTrivar(['solve', file]);
  expect(r.code).toBe(0);
  return Object.fromEntries(
    ['House panel', 'Laundromat'].map((board) => [board, new RegExp(`${board}\\s+\\S+\\s+\\S+\\s+\\S+\\s+(\\S+)`).exec(r.stdout)![1]!]),
  );
}

function workDir(file: string, text: string): { input: string; out: string } {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-rebalance-nema-'));
  const input = join(dir, file);
  writeFileSync(input, text);
  return { input, out: join(dir, `moved-${file}`) };
}

describe('trivar rebalance on a North-American board: the NEMA MG 1 line-voltage unbalance rate beside |V2|/|V1|', () => {
  it('aiming at voltage unbalance: the row and the note under the score give what trivar solve prints now and for the written file', () => {
    const { input, out } = workDir('print-shop.yaml', readFileSync(`${ROOT}${printShop}`, 'utf8'));
    const r = runTrivar(['rebalance', input, '--aim', 'voltage-unbalance', '--no-table', '--write', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const [, now, after, fast] = /line-voltage unbalance, NEMA MG 1 \(%\)\s+(\S+)\s+(\S+)\s+(\S+)/.exec(r.stdout)!;
    // 0.42 % as it stands and 0.07 % with the lighting moved to C-N (|V2|/|V1| 0.45 % → 0.08 %).
    expect([now, after, fast]).toEqual(['0.42', '0.07', '-']);
    expect(now).toBe(solvePrints(input));
    expect(after).toBe(solvePrints(out));
    expect(r.stdout).toMatch(/\|V2\|\/\|V1\| \(%\)\s+0\.45\s+0\.08/);
    expect(r.stdout.replace(/\s+/g, ' ')).toContain(
      'The score weighs |V2|/|V1|; the NEMA MG 1 line-voltage unbalance rate, which agrees closely with it while the unbalance is small, is now 0.42 % → after 0.07 % (network re-solve).',
    );

    // The JSON's figures to the last digit: the solved ones equal trivar solve's, the fast model's are null.
    const json = runTrivar(['rebalance', input, '--aim', 'voltage-unbalance', '--no-table', '--json']);
    const report = JSON.parse(json.stdout) as RebalanceReport;
    const c = report.conditions[0]!;
    const solvedRate = (file: string) => (JSON.parse(runTrivar(['solve', file, '--json']).stdout) as { unbalance: { lineVoltageRatePercent: number } }).unbalance.lineVoltageRatePercent;
    expectClose(c.solved.before.lineVoltageRatePercent!, solvedRate(input), { rel: 1e-9, abs: 1e-12 }, 'now');
    expectClose(c.solved.after.lineVoltageRatePercent!, solvedRate(out), { rel: 1e-9, abs: 1e-12 }, 'after');
    expectClose(c.solved.before.lineVoltageRatePercent!, 0.4161, { rel: 0, abs: 5e-5 }, 'now, %');
    expect([c.model.before.lineVoltageRatePercent, c.model.after.lineVoltageRatePercent]).toEqual([null, null]);
    expect(report.board.region).toBe('north-america');
  });

  it('with the default aim the row is there, the note is not (the score weighs no voltage)', () => {
    const { input, out } = workDir('print-shop.yaml', readFileSync(`${ROOT}${printShop}`, 'utf8'));
    const r = runTrivar(['rebalance', input, '--no-table', '--write', out]);
    expect(r.code).toBe(0);
    const [, now, after] = /line-voltage unbalance, NEMA MG 1 \(%\)\s+(\S+)\s+(\S+)\s+-/.exec(r.stdout)!;
    expect([now, after]).toEqual([solvePrints(input), solvePrints(out)]);
    expect(now).toBe('0.42');
    expect(r.stdout).not.toContain('The score weighs |V2|/|V1|');
  });

  it('an installation: a NEMA MG 1 column per incomer, what trivar solve prints for each board now and for the written file', () => {
    const { input, out } = workDir('strip-mall.yaml', stripMall);
    const r = runTrivar(['rebalance', input, '--aim', 'voltage-unbalance', '--no-table', '--write', out]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/\|V2\|\/\|V1\|\s+NEMA MG 1\n/);
    const shown = (board: string) => {
      const at = r.stdout.split('\n').findIndex((l) => new RegExp(`^\\s+\\*?\\s*${board}\\s+now`).test(l));
      const last = (line: string) => line.trim().split(/\s+/).at(-1)!;
      return { now: last(r.stdout.split('\n')[at]!), after: last(r.stdout.split('\n')[at + 1]!) };
    };
    const before = solveBoardsPrint(input);
    const moved = solveBoardsPrint(out);
    for (const board of ['House panel', 'Laundromat']) expect(shown(board)).toEqual({ now: before[board], after: moved[board] });
    // The laundromat's 1.10 % (|V2|/|V1| 1.18 %) is the largest now; 0.20 % after.
    expect(shown('Laundromat')).toEqual({ now: '1.10', after: '0.20' });
    expect(r.stdout.replace(/\s+/g, ' ')).toContain('is now 1.10 % → after 0.20 % (network re-solve, the largest over the conditions and incomers scored)');
  });
});

describe('trivar rebalance on an IEC board shows |V2|/|V1| alone', () => {
  it('no NEMA row or note, even aiming at voltage unbalance (the figure is in the JSON all the same)', () => {
    const r = runTrivar(['rebalance', bakery, '--aim', 'voltage-unbalance', '--no-table']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/\|V2\|\/\|V1\| \(%\)/);
    expect(r.stdout).not.toContain('NEMA');
    const report = JSON.parse(runTrivar(['rebalance', bakery, '--aim', 'voltage-unbalance', '--no-table', '--json']).stdout) as RebalanceReport;
    expect(report.board.region).toBe('iec');
    expect(report.conditions[0]!.solved.before.lineVoltageRatePercent).toBeGreaterThan(0);
  });

  it('an IEC installation: no NEMA column', () => {
    const r = runTrivar(['rebalance', 'examples/maple-court-riser.yaml', '--aim', 'voltage-unbalance', '--measure-at', 'Floor 4', '--no-table']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/\|I2\|\/\|I1\|\s+\|V2\|\/\|V1\|\n/);
    expect(r.stdout).not.toContain('NEMA');
  });
});
