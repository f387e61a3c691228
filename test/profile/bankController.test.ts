/**
 * The automatic-bank controller on a synthetic step profile whose switching
 * sequence is worked out by hand (in the comments below), on a stiff supply so
 * that every step gives exactly its rated kvar.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard } from '@trivar/core';
import { simulateBank } from '../../packages/core/src/profile/simulateBank.js';
import { expectClose } from '../support/tolerance.js';

const board = normaliseBoard(
  parseBoard({
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [{ name: 'compressors', connection: 'ABC-star', kW: 30, pf: 0.8 }],
  }),
);
const tanTarget = Math.tan(Math.acos(0.95)); // 0.3287
const P = 30_000;
const base = P * tanTarget; // Q at which the need is zero
// Need per minute (kvar): 0 for minutes 0–4, 25 for 5–14, 0 for 15–16, 25 for 17–29.
const need = Array.from({ length: 30 }, (_, m) => (m >= 5 && m < 15) || m >= 17 ? 25_000 : 0);
const t0 = Date.UTC(2025, 5, 2, 8, 0);

describe('bank controller on a step profile', () => {
  const run = simulateBank({
    board,
    drivers: [{ name: 'compressors', loads: [{ load: 0, coefficient: { re: 1, im: 0 } }] }],
    columns: { count: 30, re: [new Float64Array(30).fill(P)], im: [Float64Array.from(need, (n) => base + n)] },
    utcMs: Float64Array.from(need, (_, m) => t0 + m * 60_000),
    intervalMs: 60_000,
    steps: [0, 1, 2].map(() => ({ kvar: 10, channel: 'ABC' as const })),
    settings: { targetPf: 0.95, responseShare: 0.67, delaySeconds: 60, reconnectSeconds: 120 },
  });

  it('switches in, out and back in the hand-worked order, honouring the reconnect time', () => {
    // Threshold 0.67 × 10 = 6.7 kvar. Minute 5: need 25 → step 1 in at 6:00; minute 6: need 15 →
    // step 2 in at 7:00; need 5 < 6.7: hold. Minute 15: need −20 → step 1 (on longest) out at 16:00;
    // minute 16: −10 → step 2 out at 17:00. Minute 17: need 25 → step 1 has waited 2 min (ok), step 2
    // only 1 min, step 3 never used: the longest-waiting, step 3, in at 18:00; minute 18: need 15 →
    // step 1 (off since 16:00) in at 19:00; then need 5: hold.
    const expectedKvar = [0, 0, 0, 0, 0, 0, 10, 20, 20, 20, 20, 20, 20, 20, 20, 20, 10, 0, 10, 20, 20, 20, 20, 20, 20, 20, 20, 20, 20, 20];
    expect([...run.connectedKvar]).toEqual(expectedKvar);
    expect(run.closings).toEqual([2, 1, 1]);
    expect(run.openings).toEqual([1, 1, 0]);
  });

  it('each connected step takes exactly its rated kvar off the measured Q on a stiff supply', () => {
    for (let m = 0; m < 30; m++) {
      const q = run.figures.phaseVar.reduce((s, col) => s + col[m]!, 0);
      expectClose(q, base + need[m]! - run.connectedKvar[m]! * 1000, { rel: 1e-12, abs: 1e-6 }, `Q at minute ${m}`);
    }
  });
});
