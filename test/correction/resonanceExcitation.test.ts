/**
 * Which watched orders headline a resonance, per capacitance connection. Triplen currents of alike
 * line-to-neutral loads are zero sequence and have no path into a delta or floating-star bank (Dugan et al.,
 * Electrical Power Systems Quality, on triplens and delta windings; from memory); a branch to the neutral, a
 * split-phase board, or a non-resistive load across two lines gives them one. The significant orders are those
 * a built-in typical spectrum gives at least 5 % (common practice, no source), checked here against the table
 * itself, so the two cannot drift apart. Invented boards.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard } from '@trivar/core';
import { CORRECTION_DEFAULTS } from '../../packages/core/src/correction/correctionDefaults.js';
import { headlineResonanceOrders, triplenPath } from '../../packages/core/src/correction/resonanceExcitation.js';
import { TYPICAL_SPECTRA } from '../../packages/core/src/harmonics/typicalSpectra.js';

const board = (system: string, loads: string[]) =>
  normaliseBoard(
    parseBoard({
      name: 'Gorse Lane kiln shed',
      supply: { system, voltage: system.startsWith('three') ? { lineToLine: 400 } : { lineToNeutral: 120 }, frequencyHz: 50 },
      loads: loads.map((l, k) => ({ name: `load ${k + 1}`, ...JSON.parse(l) })),
    }),
  );
const DELTA = [
  { from: 'A', to: 'B' },
  { from: 'B', to: 'C' },
  { from: 'C', to: 'A' },
];
const STAR_N = [
  { from: 'A', to: 'N' },
  { from: 'B', to: 'N' },
  { from: 'C', to: 'N' },
];
const FLOATING = [
  { from: 'A', to: 'star' },
  { from: 'B', to: 'star' },
  { from: 'C', to: 'star' },
];
const MOTORS = ['{"connection":"ABC-delta","kW":30,"pf":0.8}', '{"connection":"A-N","kW":3,"pf":0.9}'];

describe('the orders that can headline a supply resonance', () => {
  it('the significant orders are exactly the watched ones some typical spectrum gives at least 5 %', () => {
    const strongest = new Map<number, number>();
    for (const s of Object.values(TYPICAL_SPECTRA)) for (const [h, pct] of s.orders) strongest.set(h, Math.max(strongest.get(h) ?? 0, pct));
    const significant = CORRECTION_DEFAULTS.resonanceWatchedOrders.filter((h) => (strongest.get(h) ?? 0) >= 5);
    expect([...CORRECTION_DEFAULTS.resonanceHeadlineOrders]).toEqual(significant);
    // The 17th and 19th (six-pulse drives, 4 % and 3 %) are watched but do not headline.
    expect(strongest.get(17)).toBe(4);
    expect(CORRECTION_DEFAULTS.resonanceHeadlineOrders).not.toContain(17);
  });

  it.each([
    ['delta bank, three-phase and line-to-neutral loads', 'three-phase-4wire', MOTORS, DELTA, 'none', [5, 7, 11, 13]],
    ['floating-star bank, same board', 'three-phase-4wire', MOTORS, FLOATING, 'none', [5, 7, 11, 13]],
    ['star bank on the neutral', 'three-phase-4wire', MOTORS, STAR_N, 'neutral-branch', [3, 5, 7, 9, 11, 13, 15]],
    ['delta bank, a welder across B-C', 'three-phase-4wire', [...MOTORS, '{"connection":"B-C","kW":8,"pf":0.7}'], DELTA, 'line-to-line-loads', [3, 5, 7, 9, 11, 13, 15]],
    ['delta bank, a heater across B-C (constant impedance)', 'three-phase-4wire', [...MOTORS, '{"connection":"B-C","kW":8,"pf":1,"model":"constant-impedance"}'], DELTA, 'none', [5, 7, 11, 13]],
    ['split-phase, capacitor line to line', 'split-phase', ['{"connection":"A-N","kW":2,"pf":0.9}'], [{ from: 'A', to: 'B' }], 'not-three-phase', [3, 5, 7, 9, 11, 13, 15]],
  ] as const)('%s', (_what, system, loads, capacitance, path, orders) => {
    const b = board(system, [...loads]);
    expect(triplenPath(b, capacitance)).toBe(path);
    expect(headlineResonanceOrders(b, capacitance)).toEqual(orders);
  });
});
