/**
 * The sizing loops' trial solves (boardProbe.ts) re-use one compiled network, write only the
 * equipment's values into it and read line powers and sequence currents straight off the
 * solved arrays (readBoardCurrents.ts). What they read must be, to the bit, what a fresh
 * solve of the board with the equipment added reads: checked on random lagging boards
 * (star, delta and compensator slots, random outputs including zeros) and on every board of
 * the shipped installation examples, with the target measured at the board and at the origin.
 */
import { readFileSync, readdirSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  addCorrectionEquipment,
  analyseSolution,
  boardOfInstallation,
  normaliseInstallation,
  parseInstallation,
  readBoardText,
  solveNetwork,
  type Board,
} from '@trivar/core';
import { createProbe, type BoardProbe } from '../../packages/core/src/correction/_internal/boardProbe.js';
import { deltaSlots, starSlots, type BranchSlot } from '../../packages/core/src/correction/equipment.js';
import { readLinePowers, readSequenceCurrents } from '../../packages/core/src/analysis/analyseSolution.js';
import { meteringPlace, solveMeter } from '../../packages/core/src/correction/meteringPoint.js';
import { laggingBoardArb, runs } from './support/arbitraries.js';

const TRIAL_SOLVE = { tolerance: 1e-13, maxIterations: 400 };

/** What a fresh solve of the equipped board reads, as the probe reports it. */
function freshReading(board: Board, probe: BoardProbe, kvar: readonly number[], metered: boolean) {
  const equipped = addCorrectionEquipment(probe.base, probe.groups(kvar));
  const solved = solveNetwork(equipped, TRIAL_SOLVE);
  const place = metered ? meteringPlace(board, 'origin') : null;
  const lines = place ? solveMeter(equipped, place, TRIAL_SOLVE).phases : readLinePowers(solved);
  return {
    lineP: lines.map((p) => p.kW),
    lineQ: lines.map((p) => p.kvar),
    lineS: lines.map((p) => p.kVA),
    sequences: readSequenceCurrents(solved),
    result: analyseSolution(solved),
  };
}

function expectSameReadings(board: Board, slots: readonly BranchSlot[], outputs: readonly (readonly number[])[], metered = false) {
  const probe = createProbe(board, slots, 'trial bank', {}, metered ? meteringPlace(board, 'origin') : null);
  for (const kvar of outputs) {
    const state = probe.at(kvar);
    const fresh = freshReading(board, probe, kvar, metered);
    // toStrictEqual on numbers is Object.is: the same bits (−0 apart from 0).
    expect([state.lineP, state.lineQ, state.lineS]).toStrictEqual([fresh.lineP, fresh.lineQ, fresh.lineS]);
    expect(state.sequences).toStrictEqual(fresh.sequences);
    expect(state.result.phases).toStrictEqual(fresh.result.phases);
    expect(state.board).toStrictEqual(addCorrectionEquipment(probe.base, probe.groups(kvar)));
  }
  // A repeated question is answered from the state kept, without another solve.
  const solves = probe.solves();
  const again = probe.at(outputs[0]!);
  expect(probe.solves()).toBe(solves);
  expect(again.lineQ).toStrictEqual(probe.at([...outputs[0]!]).lineQ);
}

const kvarArb = (n: number) => fc.array(fc.oneof(fc.constant(0), fc.double({ min: 0, max: 30, noNaN: true })), { minLength: n, maxLength: n });

describe('trial solves read what a fresh solve reads', () => {
  it('on random lagging boards: star, delta and compensator slots, zeros among the outputs', () => {
    fc.assert(
      fc.property(
        laggingBoardArb({ source: 'any' }),
        fc.constantFrom('star', 'delta', 'compensator'),
        fc.array(kvarArb(6), { minLength: 2, maxLength: 4 }),
        (board, kind, outputs) => {
          const slots = kind === 'star' ? starSlots(board, board.hasNeutral ? 'neutral' : 'floating') : kind === 'delta' ? deltaSlots(board) : [...deltaSlots(board), ...starSlots(board, 'neutral')];
          if (kind === 'compensator' && !board.hasNeutral) return;
          expectSameReadings(board, slots, [slots.map(() => 0), ...outputs.map((o) => o.slice(0, slots.length))]);
        },
      ),
      { numRuns: runs(25) },
    );
  });

  it('on every board of the shipped installations, measured at the board and at the origin', () => {
    const files = readdirSync(new URL('../../examples/', import.meta.url)).filter((f) => f.endsWith('.yaml'));
    let boards = 0;
    for (const file of files) {
      const text = readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8');
      if (!/^boards:/m.test(text)) continue;
      const { installation } = normaliseInstallation(parseInstallation(readBoardText(text)));
      for (let b = 0; b <= installation.subBoards.length; b++) {
        const board = boardOfInstallation(installation, b);
        if (board.phases.length !== 3) continue;
        boards++;
        const slots = board.hasNeutral ? starSlots(board, 'neutral') : deltaSlots(board);
        const outputs = [
          [0, 0, 0],
          [2, 0, 0],
          [3.5, 1.25, 7],
        ];
        expectSameReadings(board, slots, outputs);
        expectSameReadings(board, slots, outputs, true);
      }
    }
    expect(boards).toBeGreaterThan(4);
  });
});
