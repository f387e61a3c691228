/**
 * Linearity: on an ideal source (no source, feeder or neutral impedance) the
 * bus voltages are the EMFs whatever the load, so a board of constant-impedance
 * loads whose every admittance is multiplied by k draws k times every current,
 * while every node voltage (floating star points included: they depend only
 * on admittance ratios) stays where it was.
 */
import fc from 'fast-check';
import { describe, it } from 'vitest';
import { normaliseBoard, parseBoard, solveNetwork, type BoardSpec, type LoadSpec } from '@trivar/core';
import { cScale } from '../support/complexMath.js';
import { expectComplexClose } from '../support/tolerance.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';
import { LAW_REL, largestCurrent } from './laws.js';

/** The same load with k times the admittance, in whichever rating form it was written. */
function scaleLoad(load: LoadSpec, k: number): LoadSpec {
  if (load.ohms) return { ...load, ohms: { r: load.ohms.r / k, x: load.ohms.x / k } };
  // kW, kvar, kVA and A all scale the power drawn at nominal voltage; pf stays.
  const scaled: LoadSpec = { ...load };
  for (const key of ['kW', 'kvar', 'kVA', 'A'] as const) {
    const value = load[key];
    if (value !== undefined) Object.assign(scaled, { [key]: value * k });
  }
  return scaled;
}

const scaleBoard = (spec: BoardSpec, k: number): BoardSpec => parseBoard({ ...spec, loads: spec.loads.map((l) => scaleLoad(l, k)) });

describe('constant-impedance loads on an ideal source', () => {
  it('k times every admittance (k = 2, or any k in [0.25, 4]) gives k times every current and the same voltages', () => {
    const arb = fc.tuple(boardSpecArb({ source: 'ideal', models: 'constant-impedance' }), fc.oneof(fc.constant(2), fc.double({ min: 0.25, max: 4, noNaN: true })));
    fc.assert(
      fc.property(arb, ([spec, k]) => {
        const base = solveNetwork(normaliseBoard(spec));
        const scaled = solveNetwork(normaliseBoard(scaleBoard(spec, k)));
        const iTol = { rel: LAW_REL, abs: LAW_REL * k * largestCurrent(base) };
        const vTol = { rel: LAW_REL, abs: LAW_REL * base.board.nominalLineToNeutralV };
        base.lineCurrents.forEach((i, p) => expectComplexClose(scaled.lineCurrents[p]!, cScale(i, k), iTol, `line ${base.board.phases[p]} current`));
        if (base.neutralCurrent) expectComplexClose(scaled.neutralCurrent!, cScale(base.neutralCurrent, k), iTol, 'neutral current');
        base.branches.forEach((states, li) =>
          states.forEach((st, bi) => {
            const got = scaled.branches[li]![bi]!;
            expectComplexClose(got.current, cScale(st.current, k), iTol, `load ${li} branch ${bi} current`);
            expectComplexClose(got.voltage, st.voltage, vTol, `load ${li} branch ${bi} voltage`);
          }),
        );
        base.nodeVoltages.forEach((v, n) => {
          if (v) expectComplexClose(scaled.nodeVoltages[n]!, v, vTol, `node ${base.topology.nodeNames[n]}`);
        });
      }),
    );
  });
});
