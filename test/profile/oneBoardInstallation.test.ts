/**
 * An installation of one board is that board: the installation profile of the invented cold store
 * written as an installation file (its one board, the same supply and service cable) gives the
 * single-board study's figures on its nodal path — peaks, percentiles, voltages, energy, months,
 * hours — and with a bank the same switching, to 1e-9.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  driverColumns,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  planColumns,
  planDrivers,
  planInstallationColumns,
  readBoardText,
  studyInstallationProfile,
  studyProfile,
  type ProfileSpec,
} from '@trivar/core';

const file = readBoardText(readFileSync('examples/riverside-cold-store.yaml', 'utf8')) as Record<string, unknown>;
const { supply, feeder, loads, name } = file;
const board = normaliseBoard(parseBoard(file));
const { installation } = normaliseInstallation(parseInstallation({ name: 'one board', supply, boards: [{ name, feeder, loads }] }));
const COUNT = 96;
const STEP_MS = 15 * 60_000;
const header = ['time', ...board.loads.map((l) => `${l.name} [x]`)];
const values = board.loads.map((_, l) => Float64Array.from({ length: COUNT }, (_, i) => Math.max(0, 0.6 + 0.5 * Math.sin((i + 5 * l) / 9))));
const utcMs = Float64Array.from({ length: COUNT }, (_, i) => Date.UTC(2026, 5, 30, 12) + i * STEP_MS);
const profile: ProfileSpec = { tariff: { reactive: { tanPhiAllowance: 0.4, pricePerKvarh: 0.05 } } };

/** Every number of a summary, in order, paired with the other summary's. */
function expectSameFigures(a: unknown, b: unknown, path = ''): void {
  if (typeof a === 'number') {
    expect(typeof b, path).toBe('number');
    expect(Math.abs(a - (b as number)), path).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(a)));
  } else if (a && typeof a === 'object') {
    for (const [k, v] of Object.entries(a)) expectSameFigures(v, (b as Record<string, unknown>)[k], `${path}.${k}`);
  } else expect(b, path).toEqual(a);
}

describe('an installation of one board', () => {
  it.each([false, true])('equals the single-board study (bank: %s)', (bank) => {
    const single = planColumns(board, header);
    const one = studyProfile(
      { board: single.board, drivers: planDrivers(single), columns: driverColumns(single, values, COUNT), utcMs, intervalMs: STEP_MS, profile },
      { bank, solve: { path: 'nodal' } },
    );
    const plan = planInstallationColumns(installation, header);
    const inst = studyInstallationProfile(
      { installation, loads: plan.board.loads, loadBoards: plan.loadBoards, drivers: planDrivers(plan), columns: driverColumns(plan, values, COUNT), utcMs, intervalMs: STEP_MS, profile },
      { bank },
    );
    const main = inst.result.boards[0]!;
    expectSameFigures(one.result.before, main.before);
    expectSameFigures(one.result.limits, main.limits);
    if (bank) {
      expect(inst.result.bank!.steps.length).toBeGreaterThan(0);
      expectSameFigures(one.result.bank, { ...inst.result.bank, board: undefined });
      expectSameFigures(one.result.bank!.after, main.after);
    } else expect(inst.result.bank).toBeNull();
  });
});
