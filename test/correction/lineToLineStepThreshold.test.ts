/**
 * C/k of a step across two lines. On a three-phase board a per-line controller reads each line's current
 * against that line's voltage to the neutral: the branch current of an A-B capacitor lies 120° from V_AN
 * and 60° from V_BN, so each line sees sin 60° = √3/2 of it as reactive current (controllerSettings.ts).
 * On a split-phase board V_1N and V_2N lie along V_12: the whole branch current is reactive in each line.
 * Boards are invented for these tests.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard, readBoardText, responseThresholdA } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const boardOf = (lines: readonly string[]) => normaliseBoard(parseBoard(readBoardText(lines.join('\n'))));

describe('C/k of a step across two lines', () => {
  it('three 5 kvar 480 V units across A-B of a 400 V board behind a 100/5 CT: 1.128 A, not the branch current 1.302 A', () => {
    // By hand: 15 × (400/480)² = 10.417 kvar; I = 10417/400 = 26.04 A; × sin 60° = 22.55 A; / 20 = 1.1276 A.
    const kvar = 15 * (400 / 480) ** 2;
    expectClose(responseThresholdA(kvar, 'line-pair', 400, 20), 1.1276, { rel: 2e-4, abs: 0 }, 'line-pair C/k');
    expectClose(responseThresholdA(kvar, 'single-phase', 400, 20), 1.3021, { rel: 2e-4, abs: 0 }, 'branch current / k');
  });

  it('a per-line reading of the branch current: both lines see √3/2 of it in quadrature with their voltage to the neutral', () => {
    const deg = Math.PI / 180;
    const iAngle = 120 * deg; // jωC·V_AB with V_AN at 0°, V_AB at 30°
    const quadratureA = Math.sin(iAngle - 0); // line A carries +I, against V_AN at 0°
    const quadratureB = Math.sin(iAngle - Math.PI - -120 * deg); // line B carries −I, against V_BN at −120°
    expect(quadratureA).toBeCloseTo(Math.sqrt(3) / 2, 12);
    expect(quadratureB).toBeCloseTo(Math.sqrt(3) / 2, 12);
  });

  it('a joinery with a moulder across A-B: the trim steps across two lines carry the per-line C/k, said so in the report', () => {
    const board = boardOf([
      'name: Wren joinery',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 160, impedancePercent: 4, xOverR: 3 } }',
      'loads:',
      '  - { name: Planer, connection: ABC-delta, kW: 18, pf: 0.8 }',
      '  - { name: Spindle moulder, connection: A-B, kW: 11, pf: 0.62 }',
      '  - { name: Office, connection: C-N, kW: 3, pf: 0.97 }',
    ]);
    const sel = correctBoard(board, { arrangement: 'delta-bank' }).selection!;
    const trims = sel.steps.filter((s) => s.part === 'trim');
    expect(trims.length).toBeGreaterThan(0);
    const k = sel.controller!.ctRatio;
    for (const s of trims) {
      expect(s.thresholdBasis).toBe('line-pair');
      expectClose(s.responseThresholdA, ((Math.sqrt(3) / 2) * s.kvarAtNominalV * 1000) / (400 * k), { rel: 1e-12, abs: 0 }, `C/k of ${s.branches.join(',')}`);
    }
    // The A-B trim: 14.876 kvar at 400 V behind a 100/5 CT → 37.19 A × 0.866 / 20 = 1.610 A.
    const ab = trims.find((s) => s.branches[0] === 'A-B')!;
    expect(k).toBe(20);
    expectClose(ab.responseThresholdA, 1.6104, { rel: 1e-3, abs: 0 }, 'A-B trim C/k');
    expect(sel.controller!.thresholdBasis).toBe('line-pair');
  });

  it('a split-phase step across L1-L2 keeps the whole branch current as its C/k (exact there)', () => {
    const board = boardOf([
      'name: Linnet farm shop',
      'supply: { system: split-phase, voltage: 120/240, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.5, xOverR: 2 } }',
      'loads:',
      '  - { name: Well pump, connection: A-B, kW: 6, pf: 0.7 }',
      '  - { name: Cooler, connection: A-N, kW: 2, pf: 0.8 }',
      '  - { name: Lights, connection: B-N, kW: 1, pf: 0.95 }',
    ]);
    const sel = correctBoard(board, { arrangement: 'delta-bank' }).selection!;
    const k = sel.controller!.ctRatio;
    for (const s of sel.steps.filter((x) => x.output !== null)) {
      expect(s.thresholdBasis).toBe('single-phase');
      expectClose(s.responseThresholdA, (s.kvarAtNominalV * 1000) / (240 * k), { rel: 1e-12, abs: 0 }, 'split-phase C/k');
    }
    // 2 kvar at 240 V behind a 75/5 CT: 8.333 A / 15 = 0.556 A.
    expectClose(sel.controller!.responseThresholdA, 0.5556, { rel: 1e-3, abs: 0 }, 'smallest step');
  });

  it('refuses a kind it does not know, naming the three it does', () => {
    expect(() => responseThresholdA(10, 'two-lines' as never, 400, 20)).toThrow(/"three-phase", "single-phase" or "line-pair"/);
  });
});
