/**
 * Figures that have no meaning are not shown as data: a conductor that never carries current has no
 * peak time; a contactor life far past any service life is said to lie beyond the horizon; scores read
 * side by side share one precision. An invented 208 V cafe with every load on one line.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { checkIntervalSequence, contactorLifeWords, createRowReader, driverColumns, normaliseBoard, parseBoard, planColumns, planDrivers, PROFILE_DEFAULTS, studyProfile } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const CAFE = {
  name: 'Lantern Row cafe',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 208 }, frequencyHz: 60 },
  loads: [
    { name: 'espresso machine', connection: 'A-N', kW: 4 },
    { name: 'panini grill', connection: 'A-N', kW: 3.5 },
    { name: 'dish warmer', connection: 'A-N', kW: 2.5 },
  ],
};
const CAFE_YAML = `name: Lantern Row cafe
supply: { system: three-phase-4wire, voltage: { lineToLine: 208 }, frequencyHz: 60 }
loads:
  - { name: espresso machine, connection: A-N, kW: 4 }
  - { name: panini grill, connection: A-N, kW: 3.5 }
  - { name: dish warmer, connection: A-N, kW: 2.5 }
`;

describe('no figure where there is nothing to show', () => {
  it('a line that never carries current has no peak time (null; "-" in the report)', () => {
    const board = normaliseBoard(parseBoard(CAFE));
    const plan = planColumns(board, ['time', 'espresso machine [x]'], { undrivenAtRating: true });
    const reader = createRowReader(plan, { timeZone: 'UTC' });
    reader.push(['2026-05-04T07:00:00Z', '0.2'], 2);
    reader.push(['2026-05-04T07:15:00Z', '1'], 3);
    const table = checkIntervalSequence(reader.finish(), 'none');
    const r = studyProfile({ board: plan.board, drivers: planDrivers(plan), columns: driverColumns(plan, table.values, table.count), utcMs: table.utcMs, intervalMs: table.intervalMs }).result;
    const by = Object.fromEntries(r.before.conductors.map((c) => [c.conductor, c]));
    expect(by.A!.maxAt).toBe('2026-05-04 07:15');
    expect(by.N!.maxAt).toBe('2026-05-04 07:15');
    expect(by.B).toMatchObject({ maxA: 0, maxAt: null });
    expect(by.C).toMatchObject({ maxA: 0, maxAt: null });

    const dir = mkdtempSync(join(tmpdir(), 'trivar-peaks-'));
    writeFileSync(join(dir, 'cafe.yaml'), CAFE_YAML);
    writeFileSync(join(dir, 'cafe.csv'), 'time,espresso machine [x]\n2026-05-04T07:00Z,0.2\n2026-05-04T07:15Z,1\n');
    const out = runTrivar(['profile', join(dir, 'cafe.yaml'), '--data', join(dir, 'cafe.csv'), '--unlisted-at-rating']);
    expect(out.code).toBe(0);
    expect(out.stdout).toMatch(/^ {2}line B +0\.0 +- +0\.0 +0\.0 /m);
    expect(out.stdout).toMatch(/^ {2}line A +[\d.]+ +2026-05-04 07:15 /m);
  });

  it(`a contactor life past ${PROFILE_DEFAULTS.contactorLifeHorizonYears} years is said to lie beyond it`, () => {
    expect(PROFILE_DEFAULTS.contactorLifeHorizonYears).toBe(50);
    expect(contactorLifeWords(273.8)).toBe('does not reach that within 50 years');
    expect(contactorLifeWords(11.43)).toBe('reaches that in 11.4 years');
    expect(contactorLifeWords(50)).toBe('reaches that in 50.0 years');
    expect(contactorLifeWords(null)).toBeNull();
  });

  it('rebalance scores side by side in one precision', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-scores-'));
    writeFileSync(join(dir, 'cafe.yaml'), CAFE_YAML);
    const out = runTrivar(['rebalance', join(dir, 'cafe.yaml')]);
    expect(out.code).toBe(0);
    // 166.54 now (the three loads on A: line and neutral), 44.32 after: both with two decimals.
    expect(out.stdout).toMatch(/fast model: +now 166\.54 +→ +after 44\.32 +lower bound 44\.32/);
    expect(out.stdout).toMatch(/network re-solve: now 166\.54 +→ +after 44\.32/);
  });
});
