/**
 * Laws on the open-neutral continuation path (followNeutralBreak and its Newton
 * solver): whatever state it ends on — the open neutral, or the last state
 * before a collapse — obeys Kirchhoff's current law, Ohm's law on every element
 * and every load's voltage-dependence model, on random boards of every load model.
 * The continuation's solver, its circuit built once (neutralFaultNewton.ts), is held to
 * solveNetworkByNewton on each faulted board to the bit.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type Board,
  type BoardSpec,
  boardOfInstallation,
  type ComplexValue,
  followNeutralBreak,
  normaliseBoard,
  normaliseInstallation,
  parseInstallation,
  readBoardText,
  solveBoard,
  solveNetwork,
  solveNetworkByNewton,
  withNeutralFault,
} from '@trivar/core';
import { neutralFaultNewton } from '../../packages/core/src/network/neutralFaultNewton.js';
import { cAbs, cScale, cSub } from '../support/complexMath.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';
import { assertCurrentLawHolds, assertElementLawsHold, assertLoadModelsHold } from './laws.js';

const arb = boardSpecArb({ systems: ['three-phase-4wire', 'split-phase'], generation: false, maxLoads: 5 });

describe('open-neutral continuation', () => {
  it('ends on a true solution of the board (KCL, element laws, load models)', () => {
    fc.assert(
      fc.property(arb, (spec) => {
        const path = followNeutralBreak(normaliseBoard(spec));
        assertCurrentLawHolds(path.state);
        assertElementLawsHold(path.state);
        assertLoadModelsHold(path.state, 1e-8);
        if (path.reachedOpen) expect(path.state.board.neutralOpen).toBe(true);
        else expect(path.stateAtOhms).not.toBeNull();
      }),
      { numRuns: 60 },
    );
  });

  it('on constant-impedance boards reaches open and agrees with the direct linear solve', () => {
    const linear = boardSpecArb({ systems: ['three-phase-4wire', 'split-phase'], models: 'constant-impedance', generation: false, maxLoads: 5 });
    fc.assert(
      fc.property(linear, (spec) => {
        const study = solveBoard(spec, { openNeutral: true }).openNeutral!;
        if (!study.applicable) return;
        expect(study.reachedFromIntact).toBe(true);
        expect(study.multipleStates).toBe(false);
        study.loads.forEach((l, k) => expect(Math.abs(l.voltage - study.impedanceModel!.loads[k]!.voltage)).toBeLessThanOrEqual(1e-6 * l.voltage + 1e-9));
      }),
      { numRuns: 40 },
    );
  });

  it('Newton started near the fixed-point solution of any board returns to it, and it obeys the laws', () => {
    fc.assert(
      fc.property(boardSpecArb(), fc.double({ min: -0.03, max: 0.03, noNaN: true }), (spec, nudge) => {
        const board = normaliseBoard(spec);
        const reference = solveNetwork(board);
        const start = reference.nodeVoltages.map((v) => (v ? cScale(v, 1 + nudge) : null));
        const out = solveNetworkByNewton(board, start);
        expect(out.converged).toBe(true);
        if (!out.converged) return;
        out.solution.nodeVoltages.forEach((v, k) => {
          const w = reference.nodeVoltages[k];
          if (v && w) expect(cAbs(cSub(v, w))).toBeLessThan(1e-8 * board.nominalLineToNeutralV);
        });
        assertCurrentLawHolds(out.solution);
        assertElementLawsHold(out.solution);
        assertLoadModelsHold(out.solution, 1e-8);
      }),
      { numRuns: 80 },
    );
  });
});

describe('open-neutral continuation, regression', () => {
  it('a lone light line-to-neutral load on a heavy line-to-line board still reaches open (seed 1542195499)', () => {
    // The sweep once ended at 1e3 × the board's impedance, where the 0.15 kW A-N load
    // still held about 5 % of nominal: the final jump to open was taken for a collapse.
    const spec: BoardSpec = {
      name: 'heavy B-C capacitive load, one light A-N load',
      supply: { system: 'three-phase-4wire', voltage: { lineToNeutral: 230 }, frequencyHz: 50, impedance: { r: 0.103, x: 0 } },
      feeder: { line: { lengthM: 5, rOhmPerKm: 18.5, xOhmPerKm: 0 }, neutral: { r: 0, x: 0 } },
      loads: [
        { name: 'L1', connection: 'B-C', kW: 7.4, pf: 0.5, sense: 'leading', model: 'constant-impedance' },
        { name: 'L2', connection: 'C-A', kW: 0.15, pf: 0.5, model: 'constant-impedance' },
        { name: 'L3', connection: 'A-N', kW: 0.15, pf: 0.5, model: 'constant-impedance' },
      ],
    };
    const path = followNeutralBreak(normaliseBoard(spec));
    expect(path.reachedOpen).toBe(true);
    const study = solveBoard(spec, { openNeutral: true }).openNeutral!;
    expect(study.reachedFromIntact).toBe(true);
    // With the neutral open the A-N load has no return path: it sees no voltage.
    expect(study.loads[0]!.voltage).toBeLessThan(1e-6);
  });
});

describe('neutral-fault Newton, circuit built once', () => {
  /** solveNetworkByNewton on the faulted board, and the shared-circuit solver, from one start: the same bits. */
  function assertSameAsRebuilt(board: Board, ohms: number | null, start: readonly (ComplexValue | null)[]) {
    const options = { lowVoltageThreshold: 0.7, maxIterations: 40 };
    const rebuilt = solveNetworkByNewton(withNeutralFault(board, ohms), start, options);
    const shared = neutralFaultNewton(board).solve(ohms, start, options);
    expect(shared.converged).toBe(rebuilt.converged);
    if (!shared.converged || !rebuilt.converged) return;
    expect(shared.voltages.length).toBe(rebuilt.solution.nodeVoltages.length);
    shared.voltages.forEach((v, k) => {
      const w = rebuilt.solution.nodeVoltages[k]!;
      expect(v === null).toBe(w === null);
      if (v && w) expect(Object.is(v.re, w.re) && Object.is(v.im, w.im)).toBe(true);
    });
    // The whole solution read from the shared solver's state is the one the rebuilt solve reads.
    expect(neutralFaultNewton(board).read(ohms, shared, options)).toEqual(rebuilt.solution);
  }

  it('gives solveNetworkByNewton’s voltages on the faulted board to the bit (random boards, fault from 1 mΩ to open)', () => {
    fc.assert(
      fc.property(arb, fc.option(fc.double({ min: -3, max: 3, noNaN: true }), { nil: null }), (spec, decade) => {
        const board = normaliseBoard(spec);
        if (!board.hasNeutral) return;
        const start = solveNetwork(withNeutralFault(board, 1e-3)).nodeVoltages;
        assertSameAsRebuilt(board, decade === null ? null : 10 ** decade, start);
      }),
      { numRuns: 80 },
    );
  });

  it('does so on the sub-boards of the shipped installations, whose neutral fault sits in their feeder', () => {
    for (const file of ['maple-court-riser.yaml', 'tannery-lane-works.yaml']) {
      const { installation } = normaliseInstallation(parseInstallation(readBoardText(readFileSync(`examples/${file}`, 'utf8'))));
      for (let b = 0; b <= installation.subBoards.length; b++) {
        const board = boardOfInstallation(installation, b);
        if (!board.hasNeutral) continue;
        const start = solveNetwork(withNeutralFault(board, 1e-3)).nodeVoltages;
        for (const ohms of [0.05, 2, 40, null]) assertSameAsRebuilt(board, ohms, start);
      }
    }
  });
});
