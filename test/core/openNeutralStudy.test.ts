/**
 * The open-neutral study on boards with a closed-form answer.
 *
 * Two resistive constant-power loads on a split-phase supply with no source or
 * feeder impedance: the heavier P_H on one leg, the lighter P_L on the other,
 * r = P_L/P_H, E = 120 V, line-to-line 2E. All figures below are derived here
 * (series circuit, [derived, verified] against the numbers in the comments):
 * - both loads at constant power, in series: V_L/V_H = P_L/P_H, so V_L = 2E·P_L/(P_L + P_H);
 * - all loads as impedances at nominal: V_L = 2E·P_H/(P_L + P_H) (the lighter load has the larger impedance);
 * - heavier side below the low-voltage rule t (held at admittance P_H/(t·E)²), lighter at
 *   constant power: V_L + t²E²·r/V_L = 2E, V_L = E·(1 + √(1 − t²·r));
 * - a fault resistance R in the neutral moves the bar by v toward the heavier leg:
 *   P_H/(E − v) − P_L/(E + v) = v/R, so R(v) = v / h(v); the state followed from the
 *   intact board (v from 0 up) exists only while R ≤ max R(v): beyond it, voltage collapse.
 *   For R > 0 no state has v in [v*, 0] (h > 0 there while v/R ≤ 0), so the constant-power
 *   balance v* < 0 is never reached from the intact board.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { normaliseBoard, parseBoard, readBoardText, solveBoard, followNeutralBreak, type BoardSpec } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const E = 120;
const P_H = 3000;
const P_L = 2400;
const r = P_L / P_H;
const t = 0.7;

const twoLegs = (model: 'constant-power' | 'constant-impedance'): BoardSpec => ({
  supply: { system: 'split-phase', voltage: { lineToNeutral: E }, frequencyHz: 60 },
  loads: [
    { name: 'light', connection: 'A-N', kW: P_L / 1000, pf: 1, model },
    { name: 'heavy', connection: 'B-N', kW: P_H / 1000, pf: 1, model },
  ],
});

const tight = { rel: 1e-9, abs: 1e-9 * E };
const volts = (study: { loads: readonly { name: string; voltage: number }[] }, name: string) => study.loads.find((l) => l.name === name)!.voltage;

/** Largest fault resistance at which the intact state still exists: max over v of v/h(v), by a fine scan then golden section. */
function collapseResistance(): number {
  const rOf = (v: number) => v / (P_H / (E - v) - P_L / (E + v));
  let best = 0;
  for (let v = 0.01; v < E; v += 0.01) if (rOf(v) > rOf(best || 0.01)) best = v;
  let [a, b] = [best - 0.02, best + 0.02];
  const g = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 100; k++) {
    const c = b - g * (b - a);
    const d = a + g * (b - a);
    if (rOf(c) > rOf(d)) b = d;
    else a = c;
  }
  return rOf((a + b) / 2);
}

describe('open-neutral study: two constant-power loads in series (closed form)', () => {
  const study = solveBoard(twoLegs('constant-power'), { openNeutral: true }).openNeutral!;

  it('follows the intact board to the state where the heavier side sits below the low-voltage rule', () => {
    expect(study.reachedFromIntact).toBe(true);
    const light = E * (1 + Math.sqrt(1 - t * t * r)); // 213.57 V
    expectClose(volts(study, 'light'), light, tight, 'lighter load');
    expectClose(volts(study, 'heavy'), 2 * E - light, tight, 'heavier load');
    expect(study.loads.find((l) => l.name === 'heavy')!.belowLowVoltageRule).toBe(true);
  });

  it('reports the constant-power balance as another solution, not reached from the intact board', () => {
    expect(study.multipleStates).toBe(true);
    expect(study.otherStates).toHaveLength(1);
    expectClose(volts(study.otherStates[0]!, 'light'), (2 * E * P_L) / (P_L + P_H), tight, 'lighter load, balance'); // 106.67 V
    expectClose(volts(study.otherStates[0]!, 'heavy'), (2 * E * P_H) / (P_L + P_H), tight, 'heavier load, balance');
  });

  it('gives the all-impedance answer beside it and flags the dependence on the load model', () => {
    expectClose(volts(study.impedanceModel!, 'light'), (2 * E * P_H) / (P_L + P_H), tight, 'lighter load as impedance'); // 133.33 V
    expect(study.dependsOnLoadModel).toBe(true);
  });

  it('says the low-voltage rule decides it: without it the intact state collapses at the fold of R(v)', () => {
    expect(study.lowVoltageRuleDecides).toBe(true);
    const free = study.withoutLowVoltageRule!;
    expect(free.reachedOpen).toBe(false);
    // The continuation stops within its step floor of the fold; 1 % is far looser than that.
    expectClose(free.collapseAtOhms!, collapseResistance(), { rel: 0.01, abs: 0 }, 'collapse resistance');
    expect(study.findings.join(' ')).toMatch(/modelling choice/);
    expect(study.findings.join(' ')).toMatch(/2 solutions/);
  });
});

describe('open-neutral study: constant-impedance loads', () => {
  it('has one answer, the voltage divider, and no finding', () => {
    const study = solveBoard(twoLegs('constant-impedance'), { openNeutral: true }).openNeutral!;
    expectClose(volts(study, 'light'), (2 * E * P_H) / (P_L + P_H), tight, 'lighter load');
    expect(study.reachedFromIntact).toBe(true);
    expect(study.multipleStates).toBe(false);
    expect(study.dependsOnLoadModel).toBe(false);
    expect(study.lowVoltageRuleDecides).toBe(false);
    expect(study.withoutLowVoltageRule).toBeNull();
    expect(study.findings).toEqual([]);
  });
});

describe('every line-to-neutral load on one line', () => {
  // With the neutral open such loads have no return path: zero current, 0 V across them, in any
  // load model (derived: one series path, open). A line-to-line load beside them is untouched.
  it.each(['constant-power', 'constant-current', 'constant-impedance'] as const)('%s: dead at 0 V, said plainly, and no modelling-choice finding', (model) => {
    const study = solveBoard(
      {
        supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
        conventions: { phaseNames: 'L1/L2/L3' },
        loads: [
          { name: 'heater', connection: 'L2-N', kW: 3, pf: 1, model },
          { name: 'kettle', connection: 'L2-N', kW: 2, pf: 1, model },
          { name: 'saw', connection: 'L1-L3', kW: 2.2, pf: 0.8 },
        ],
      },
      { openNeutral: true },
    ).openNeutral!;
    expect(study.loads.map((l) => [l.name, l.phase, l.voltage])).toEqual([
      ['heater', 'B', 0],
      ['kettle', 'B', 0],
    ]);
    expect(study.lowVoltageRuleDecides).toBe(false);
    expect(study.findings).toEqual([
      'Every line-to-neutral load is on line L2: with the neutral broken they have no return path, so they go dead (0 V) whatever their load model, and none is left on another line to see a raised voltage.',
    ]);
  });
});

describe('followNeutralBreak', () => {
  it('ends, with the neutral open, on the state the study reports for the house example', () => {
    const spec = readBoardText(readFileSync(new URL('../../examples/maple-lane-house.yaml', import.meta.url), 'utf8'));
    const board = normaliseBoard(parseBoard(spec));
    const path = followNeutralBreak(board);
    const study = solveBoard(spec).openNeutral!;
    expect(path.reachedOpen).toBe(true);
    expect(path.state.board.neutralOpen).toBe(true);
    const kitchen = path.state.branches[0]![0]!.voltage;
    expectClose(Math.hypot(kitchen.re, kitchen.im), volts(study, 'Kitchen'), { rel: 0.01, abs: 0 }, 'Kitchen');
  });
});
