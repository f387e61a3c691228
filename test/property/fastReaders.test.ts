/**
 * The shortcuts the correction's sizing loops take give exactly what the general path gives:
 * line powers, sequence currents and the target figures (the verification's tolerance ends) read without the whole analysis, and trial banks solved on a network compiled
 * once per loop (new branch values only) against a fresh `solveNetwork` of the same board.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addCorrectionEquipment, analyseSolution, normaliseBoard, solveNetwork, type BoardSpec } from '@trivar/core';
import { readLinePowers, readSequenceCurrents, readTargetFigures } from '../../packages/core/src/analysis/analyseSolution.js';
import { createProbe } from '../../packages/core/src/correction/_internal/boardProbe.js';
import { deltaSlots, starSlots } from '../../packages/core/src/correction/equipment.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';

const threePhase = (spec: BoardSpec) => spec.supply.system === 'three-phase-4wire' || spec.supply.system === 'three-phase-3wire';

describe('fast readers of the sizing loops', () => {
  it('readLinePowers equals the analysis line by line, to the last bit', () => {
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const solution = solveNetwork(normaliseBoard(spec));
        const phases = analyseSolution(solution).phases;
        expect(readLinePowers(solution).map((p) => [p.kW, p.kvar, p.kVA])).toEqual(phases.map((p) => [p.kW, p.kvar, p.kVA]));
      }),
      { numRuns: 60 },
    );
  });

  it('readSequenceCurrents equals the analysis’ sequence currents and positive-sequence power, to the last bit', () => {
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const solution = solveNetwork(normaliseBoard(spec));
        const result = analyseSolution(solution);
        const read = readSequenceCurrents(solution);
        if (!result.sequences) {
          expect(read).toBeNull();
          return;
        }
        const plain = (x: { re: number; im: number }) => [x.re, x.im];
        const current = result.sequences.current;
        expect([read!.current.zero, read!.current.positive, read!.current.negative].map(plain)).toEqual([current.zero, current.positive, current.negative].map(plain));
        expect(read!.positiveSequence).toEqual({ kW: result.powerFactor.positiveSequence!.kW, kvar: result.powerFactor.positiveSequence!.kvar });
      }),
      { numRuns: 60 },
    );
  });

  it('readTargetFigures equals the analysis’ phases, power factors and conventions, to the last bit', () => {
    fc.assert(
      fc.property(boardSpecArb(), (spec) => {
        const solution = solveNetwork(normaliseBoard(spec));
        const result = analyseSolution(solution);
        const read = readTargetFigures(solution);
        expect(Object.keys(read).sort()).toEqual(['conventions', 'phases', 'powerFactor']);
        expect(read.phases).toEqual(result.phases);
        expect(read.powerFactor).toEqual(result.powerFactor);
        expect(read.conventions).toEqual(result.conventions);
      }),
      { numRuns: 60 },
    );
  });

  it('a probe re-solving one compiled network equals a fresh solve of each trial board, zero branches included', () => {
    fc.assert(
      fc.property(
        boardSpecArb({ systems: ['three-phase-4wire', 'three-phase-3wire'] }),
        fc.array(fc.array(fc.oneof(fc.constant(0), fc.double({ min: 0.1, max: 30, noNaN: true })), { minLength: 3, maxLength: 3 }), { minLength: 2, maxLength: 4 }),
        fc.constantFrom('delta', 'floating-star'),
        (spec, trials, kind) => {
          if (!threePhase(spec)) return;
          const board = normaliseBoard(spec);
          const slots = kind === 'delta' ? deltaSlots(board) : starSlots(board, 'floating');
          const probe = createProbe(board, slots, 'trial bank');
          for (const kvar of trials) {
            let state;
            try {
              state = probe.at(kvar);
            } catch {
              // A board the solver refuses is refused either way: the fresh solve below must refuse it too.
              const trial = addCorrectionEquipment(board, probe.groups(kvar));
              expect(() => solveNetwork(trial, { tolerance: 1e-13, maxIterations: 400 })).toThrow();
              continue;
            }
            const fresh = analyseSolution(solveNetwork(state.board, { tolerance: 1e-13, maxIterations: 400 }));
            expect(state.lineP).toEqual(fresh.phases.map((p) => p.kW));
            expect(state.lineQ).toEqual(fresh.phases.map((p) => p.kvar));
            expect(state.result).toEqual(fresh);
            expect(state.sequences!.current.negative).toEqual({ re: fresh.sequences!.current.negative.re, im: fresh.sequences!.current.negative.im });
          }
        },
      ),
      { numRuns: 40 },
    );
  });
});
