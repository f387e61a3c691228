/**
 * The automatic-bank controller on a synthetic step profile whose switching
 * sequence is worked out by hand (in the comments below), on a stiff supply so
 * that every step gives exactly its rated kvar.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, solveBoard } from '@trivar/core';
import { simulateBank } from '../../packages/core/src/profile/simulateBank.js';
import { hoursBelowTarget } from '../../packages/core/src/profile/belowTargetHours.js';
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

describe('bank controller with an upper PF limit (a band from 0.95 to 0.99 lagging)', () => {
  // P = 30 kW throughout. Band in Q: from 30·tan(acos 0.99) = 4.275 kvar up to 30·tan(acos 0.95) = 9.861 kvar.
  // Steps 20, 5, 5 kvar; threshold 0.67 × 5 = 3.35 kvar; delay 60 s, reconnect 120 s.
  // Q before correction (kvar): 9 for minutes 0–4, 23.861 for 5–14, 12 for 15–19, 5 for 20–24, 30 for 25–29.
  const qBefore = Array.from({ length: 30 }, (_, m) => (m < 5 ? 9 : m < 15 ? 23.861 : m < 20 ? 12 : m < 25 ? 5 : 30) * 1000);
  const tanUpper = Math.tan(Math.acos(0.99));
  const run = (upperPf: number | undefined) =>
    simulateBank({
      board,
      drivers: [{ name: 'compressors', loads: [{ load: 0, coefficient: { re: 1, im: 0 } }] }],
      columns: { count: 30, re: [new Float64Array(30).fill(P)], im: [Float64Array.from(qBefore)] },
      utcMs: Float64Array.from(qBefore, (_, m) => t0 + m * 60_000),
      intervalMs: 60_000,
      steps: [20, 5, 5].map((kvar) => ({ kvar, channel: 'ABC' as const })),
      settings: { targetPf: 0.95, responseShare: 0.67, delaySeconds: 60, reconnectSeconds: 120, ...(upperPf !== undefined ? { upperPf } : {}) },
    });
  const banded = run(0.99);

  it('switches in the hand-worked order and never past the upper limit by its own choice', () => {
    // Minute 5: need 14.0, room to the upper edge 19.59: the 20 kvar step (0.67·20 = 13.4 < 14, so
    // the single-target rule would take it) does not fit the room; a 5 kvar step (first listed) in at
    // 6:00. Minute 6: need 9.0, room 14.59: the other 5 kvar step in at 7:00. Minutes 7–14: need 4.0
    // > 3.35 but only the 20 kvar step is free and it does not fit (room 9.59): hold.
    // Minute 15: Q = 12 − 10 = 2 < 4.275 (past 0.99): after the delay the longer-connected 5 kvar step
    // (in since 6:00) out at 16:00; Q = 7, in the band. Minute 20: Q = 5 − 5 = 0 < 4.275: the last
    // 5 kvar step out at 21:00. Minute 25: need 20.14, room 25.7: the 20 kvar step in at 26:00 (Q 10).
    const expected = [0, 0, 0, 0, 0, 0, 5, 10, 10, 10, 10, 10, 10, 10, 10, 10, 5, 5, 5, 5, 5, 0, 0, 0, 0, 0, 20, 20, 20, 20];
    expect([...banded.connectedKvar]).toEqual(expected);
    expect(banded.closings).toEqual([1, 1, 1]);
    expect(banded.openings).toEqual([0, 1, 1]);
  });

  it('holds Q at or above the upper-limit edge except during the switching delay, and never leading with a step in', () => {
    for (let m = 0; m < 30; m++) {
      const q = banded.figures.phaseVar.reduce((s, col) => s + col[m]!, 0);
      const pastUpper = q < P * tanUpper - 1e-6;
      if (pastUpper && m > 0) {
        const qPrev = banded.figures.phaseVar.reduce((s, col) => s + col[m - 1]!, 0);
        // Only the first interval past the edge (the delay) may be so, never two in a row.
        expect(qPrev, `minute ${m}`).toBeGreaterThanOrEqual(P * tanUpper - 1e-6);
      }
      if (banded.connectedKvar[m]! > 0) expect(q, `minute ${m}`).toBeGreaterThanOrEqual(-1e-6);
    }
  });

  it('without the upper limit the same profile takes the 20 kvar step and passes 0.99', () => {
    const single = run(undefined);
    expect(single.connectedKvar[6]).toBe(20);
    const q = single.figures.phaseVar.reduce((s, col) => s + col[6]!, 0);
    expect(P / Math.hypot(P, q)).toBeGreaterThan(0.99);
  });
});

describe('a fixed (always-on) part in the simulator', () => {
  it('takes its kvar off every interval on a stiff supply, and the controller reads the board with it in', () => {
    const qBefore = Array.from({ length: 10 }, (_, m) => (m < 5 ? 12 : 20) * 1000);
    const run = simulateBank({
      board,
      drivers: [{ name: 'compressors', loads: [{ load: 0, coefficient: { re: 1, im: 0 } }] }],
      columns: { count: 10, re: [new Float64Array(10).fill(P)], im: [Float64Array.from(qBefore)] },
      utcMs: Float64Array.from(qBefore, (_, m) => t0 + m * 60_000),
      intervalMs: 60_000,
      steps: [{ kvar: 5, channel: 'ABC' }],
      fixed: [{ kvar: 4, channel: 'ABC' }],
      settings: { targetPf: 0.95, responseShare: 0.67, delaySeconds: 60, reconnectSeconds: 120, upperPf: 1 },
    });
    // Minutes 0–4: Q = 12 − 4 = 8 kvar < 9.861 (the 0.95 edge): no step. Without the fixed part the
    // controller would have seen 12 (need 2.1 < 3.35, no step either); minutes 5–9: Q = 16, need 6.14
    // > 3.35, room 16 ≥ 5: the step in at 6:00, Q = 11 (need 1.14, hold).
    expect([...run.connectedKvar]).toEqual([0, 0, 0, 0, 0, 0, 5, 5, 5, 5]);
    for (let m = 0; m < 10; m++) {
      const q = run.figures.phaseVar.reduce((s, col) => s + col[m]!, 0);
      expectClose(q, qBefore[m]! - 4000 - run.connectedKvar[m]! * 1000, { rel: 1e-12, abs: 1e-6 }, `Q at minute ${m}`);
    }
  });
});

describe('hours below the target with a banded bank', () => {
  const tenAndTen = [{ kvar: 10, channel: 'ABC' as const }, { kvar: 10, channel: 'ABC' as const }];
  it('counts importing intervals under the target PF, and those where the smallest step would pass the upper limit', () => {
    // Four 15-minute intervals on one phase column each (board totals): P, Q in kW, kvar.
    // tan(acos 0.97) = 0.2506 → Q above 7.52 kvar at 30 kW is below target; tan(acos 0.995) = 0.1002 → 3.01 kvar.
    // 30/5: in target. 30/10: below, 10 − 10 = 0 < 3.01: coarse. 30/20: below, 20 − 10 = 10: not coarse. −5/10: export, not counted.
    const col = (xs: number[]) => Float64Array.from(xs, (x) => x * 1000);
    const zero = new Float64Array(4);
    const f = { count: 4, lineA: [zero], neutralA: zero, phaseV: [zero], lineToLineV: [], phaseW: [col([30, 30, 30, -5])], phaseVar: [col([5, 10, 20, 10])], unbalancePercent: zero, lineDeviationPercent: zero };
    // Two 10 kvar steps, both open. 30/20: room 17 kvar, need 12.5 > 6.7: a step may close, the controller on its way.
    const open = [new Uint8Array(4), new Uint8Array(4)];
    expect(hoursBelowTarget(f, { targetPf: 0.97, upperPf: 0.995, responseShare: 0.67 }, { steps: tenAndTen, stepOn: open, phases: ['A'] }, 900_000)).toEqual({
      hours: 0.5,
      allStepsInHours: 0,
      shortOfStepsHours: 0,
      shortOfStepsOpenKvar: 0,
      underResponseHours: 0,
      underResponseChannels: [],
      stepTooCoarseHours: 0.25,
      // The open 10 kvar steps against the 10 − 30·tan(acos 0.995) = 6.99 kvar of room before the upper limit.
      stepTooCoarseChannels: [{ channel: 'ABC', smallestOpenKvar: 10, mostRoomKvar: expect.closeTo(10 - 30 * Math.tan(Math.acos(0.995)), 9) }],
      openStepsTooLargeHours: 0,
      onTheWayHours: 0.25,
      openStepsTooLarge: null,
    });
  });
  it('without a band: the hours with every step in, and those with the shortfall under the switching threshold', () => {
    // 30 kW; tan(acos 0.97) = 0.2506 → the target at 7.52 kvar. Threshold 0.67 × 10 kvar = 6.7 kvar.
    // 30/5: in target. 30/10 (shortfall 2.48 < 6.7, 10 kvar of 20 in): under the threshold. 30/40 with all
    // 20 kvar in: the bank too small. 30/20 with 10 kvar in (shortfall 12.5 > 6.7): the controller on its way.
    const col = (xs: number[]) => Float64Array.from(xs, (x) => x * 1000);
    const zero = new Float64Array(4);
    const f = { count: 4, lineA: [zero], neutralA: zero, phaseV: [zero], lineToLineV: [], phaseW: [col([30, 30, 30, 30])], phaseVar: [col([5, 10, 40, 20])], unbalancePercent: zero, lineDeviationPercent: zero };
    const stepOn = [Uint8Array.from([1, 1, 1, 1]), Uint8Array.from([0, 0, 1, 0])];
    expect(hoursBelowTarget(f, { targetPf: 0.97, upperPf: null, responseShare: 0.67 }, { steps: tenAndTen, stepOn, phases: ['A'] }, 900_000)).toEqual({
      hours: 0.75,
      allStepsInHours: 0.25,
      shortOfStepsHours: 0,
      shortOfStepsOpenKvar: 0,
      underResponseHours: 0.25,
      // The board's channel, short by 2.48 kvar, under its own 0.67 × 10 kvar threshold.
      underResponseChannels: [{ channel: 'ABC', smallestKvar: 10 }],
      stepTooCoarseHours: 0,
      stepTooCoarseChannels: [],
      openStepsTooLargeHours: 0,
      onTheWayHours: 0.25,
      openStepsTooLarge: null,
    });
  });
});

describe('a step across two lines', () => {
  // A welder between A and B on a board with a real supply impedance: a 6 kvar step across A-B.
  const weak = normaliseBoard(
    parseBoard({
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 50, impedancePercent: 4, xOverR: 3 } },
      loads: [
        { name: 'welder', connection: 'A-B', kW: 8, pf: 0.6 },
        { name: 'lamps', connection: 'C-N', kW: 1, pf: 1 },
      ],
    }),
  );
  const n = 6;
  const run = simulateBank({
    board: weak,
    drivers: [
      { name: 'welder', loads: [{ load: 0, coefficient: { re: 1, im: 0 } }] },
      { name: 'lamps', loads: [{ load: 1, coefficient: { re: 1, im: 0 } }] },
    ],
    columns: { count: n, re: [new Float64Array(n).fill(8000), new Float64Array(n).fill(1000)], im: [new Float64Array(n).fill(8000 * (0.8 / 0.6)), new Float64Array(n)] },
    utcMs: Float64Array.from({ length: n }, (_, m) => t0 + m * 60_000),
    intervalMs: 60_000,
    steps: [{ kvar: 6, channel: 'A-B' }],
    settings: { targetPf: 0.95, responseShare: 0.67, delaySeconds: 60, reconnectSeconds: 120, upperPf: 1 },
  });

  it('switches in on the need of lines A and B together, once', () => {
    // Lines A and B carry the welder's 10.67 kvar against 8 kW·tan(acos 0.95) = 2.63 kvar: need 8.0 > 0.67 × 6.
    // The bank starts settled at the first interval's load: in from the start, that start-up closing not counted.
    expect([...run.connectedKvar]).toEqual([6, 6, 6, 6, 6, 6]);
    expect(run.closings).toEqual([0]);
  });

  it('each interval with the step in is the board solved with a 6 kvar capacitor from A to B (solveBoard, the general solver)', () => {
    const withStep = solveBoard({
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 50, impedancePercent: 4, xOverR: 3 } },
      loads: [
        { name: 'welder', connection: 'A-B', kW: 8, pf: 0.6 },
        { name: 'lamps', connection: 'C-N', kW: 1, pf: 1 },
        { name: 'step', connection: 'A-B', kW: 0, kvar: -6, model: 'constant-impedance' },
      ],
    });
    for (let k = 0; k < 3; k++) {
      expectClose(run.figures.phaseVar[k]![3]!, withStep.phases[k]!.kvar * 1000, { rel: 1e-9, abs: 1e-6 }, `line ${k} var`);
      expectClose(run.figures.phaseW[k]![3]!, withStep.phases[k]!.kW * 1000, { rel: 1e-9, abs: 1e-6 }, `line ${k} W`);
    }
  });
});

describe('the controller settles within an interval longer than its delay', () => {
  // The stiff board above at P = 30 kW; on: Q = 30.606 kvar (PF 0.70), off: nothing. Five 5 kvar steps,
  // threshold 0.67 × 5 = 3.35 kvar, delay 30 s. Need when on: 30.606 − 9.861 = 20.745 kvar.
  const Q_ON = 30_606;
  const fifteen = (pattern: number[], reconnectSeconds: number, intervalMs = 900_000) =>
    simulateBank({
      board,
      drivers: [{ name: 'compressors', loads: [{ load: 0, coefficient: { re: 1, im: 0 } }] }],
      columns: { count: pattern.length, re: [Float64Array.from(pattern, (x) => x * P)], im: [Float64Array.from(pattern, (x) => x * Q_ON)] },
      utcMs: Float64Array.from(pattern, (_, m) => t0 + m * intervalMs),
      intervalMs,
      steps: [0, 1, 2, 3, 4].map(() => ({ kvar: 5, channel: 'ABC' as const })),
      settings: { targetPf: 0.95, responseShare: 0.67, delaySeconds: 30, reconnectSeconds },
    });

  it('15-minute data: the bank is on in every loaded interval and off in every idle one', () => {
    // On: steps in at 30, 60, 90 and 120 s (need 20.7 → 15.7 → 10.7 → 5.7 → 0.7 < 3.35, hold): 20 kvar
    // for 780 of the 900 s. Off: Q = −20 kvar, the four out at 30…120 s: none for 780 s.
    const run = fifteen([0, 1, 1, 0, 1, 0, 0, 1], 60);
    expect([...run.connectedKvar]).toEqual([0, 20, 20, 0, 20, 0, 0, 20]);
    expect(run.closings.reduce((a, b) => a + b)).toBe(12);
    expect(run.openings.reduce((a, b) => a + b)).toBe(8);
    for (const m of [1, 2, 4, 7]) {
      const q = run.figures.phaseVar.reduce((s, col) => s + col[m]!, 0);
      expectClose(q, Q_ON - 20_000, { rel: 1e-12, abs: 1e-6 }, `Q at interval ${m}`);
    }
    for (const m of [0, 3, 5, 6]) expect(Math.abs(run.figures.phaseVar.reduce((s, col) => s + col[m]!, 0))).toBeLessThan(1e-6);
  });

  it('a step goes back in only after its discharge time, and the interval shows what held longest', () => {
    // On, off, on with a 1500 s discharge. Interval 1 (900 s): steps 1–4 out at 930, 960, 990, 1020 s.
    // Interval 2 (1800 s): step 5, never used, in at 1830; step 1 is free at 930 + 1500 = 2430, then
    // 2460, 2490: 0 kvar for 30 s, 5 for 600 s, 10 and 15 for 30 s each, 20 for the last 210 s → 5 shown.
    const run = fifteen([1, 0, 1, 1], 1500);
    expect([...run.connectedKvar]).toEqual([20, 0, 5, 20]);
  });

  it('1-minute data: two moves a minute, the minute shown with what held longest (the earlier on a tie)', () => {
    // Minute 1: 0 kvar for 30 s, 5 for 30 s, the second move at its end → 0 shown; minute 2 starts at
    // 10: 10 for 30 s, 15 for 30 s → 10 shown; minute 3 starts at 20, need 0.7: hold.
    const run = fifteen([0, 1, 1, 1, 1], 60, 60_000);
    expect([...run.connectedKvar]).toEqual([0, 0, 10, 20, 20]);
  });
});
