/**
 * The supply resonance in every state the controller can put a bank in. Closed form for a balanced delta
 * bank behind a purely inductive path: h = √(S_sc,X / Q_state), S_sc,X = U_LL²/X_line, Q_state the kvar of
 * the steps in at nominal voltage (the parallel-resonance rule h = √(S_sc/Q_C), IEEE 1036 and every PFC
 * application guide; X alone, as the path has no resistance). And the law that makes the states worth
 * checking: taking capacitance out never lowers the lowest order. Invented boards throughout.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { normaliseBoard, parseBoard, verifyCorrection, type EquipmentGroup } from '@trivar/core';
import type { BankStep } from '../../packages/core/src/correction/correctionResult.js';
import { stepStateResonance } from '../../packages/core/src/correction/stepStateResonance.js';
import { expectClose } from '../support/tolerance.js';
import { runs } from './support/arbitraries.js';

const OMEGA = 2 * Math.PI * 50;
type Branch = 'A-B' | 'B-C' | 'C-A' | 'A-N' | 'B-N' | 'C-N';
const volts = (b: Branch) => (b.endsWith('-N') ? 400 / Math.sqrt(3) : 400);

/** A switched step (output null: fixed) of `kvarPerBranch` at nominal voltage on each of `branches`. */
function step(output: number | null, branches: readonly Branch[], kvarPerBranch: number): BankStep {
  const v = volts(branches[0]!);
  const uF = ((kvarPerBranch * 1000) / (OMEGA * v * v)) * 1e6;
  const kvar = kvarPerBranch * branches.length;
  return {
    output,
    part: output === null ? 'fixed' : branches.length === 3 ? 'balanced' : 'trim',
    kind: branches.length === 3 ? 'three-phase' : 'single-phase',
    branches,
    nameplateKvar: kvar,
    kvarAtNominalV: kvar,
    deliveredKvar: kvar,
    capacitancePerBranchUF: uF,
    detuningFactor: 0,
    responseThresholdA: 1,
    thresholdBasis: branches.length === 3 ? 'three-phase' : 'single-phase',
    onAtDesign: true,
  } as unknown as BankStep;
}

/** One group per branch holding the capacitance of every step on it. */
function equipmentOf(steps: readonly BankStep[]): EquipmentGroup[] {
  const branches = [...new Set(steps.flatMap((s) => s.branches as Branch[]))];
  return branches.map((branch) => {
    const [from, to] = branch.split('-') as ['A' | 'B' | 'C', 'A' | 'B' | 'C' | 'N'];
    const susceptanceS = steps.reduce((sum, s) => sum + (s.branches.includes(branch) ? OMEGA * s.capacitancePerBranchUF * 1e-6 : 0), 0);
    const fixedSusceptanceS = steps.reduce((sum, s) => sum + (s.output === null && s.branches.includes(branch) ? OMEGA * s.capacitancePerBranchUF * 1e-6 : 0), 0);
    return { name: `bank ${branch}`, connection: branch, branches: [{ branch, from, to, vNominal: volts(branch), susceptanceS, fixedSusceptanceS }] } as EquipmentGroup;
  });
}

/** A 400 V, 50 Hz board behind a feeder of reactance x per line (and xN in the neutral), no resistance. */
const boardBehind = (x: number, xN = x) =>
  normaliseBoard(
    parseBoard({
      name: 'Weir Road sawmill',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
      feeder: { line: { r: 0, x, ratingA: 400 }, neutral: { r: 0, x: xN, ratingA: 400 } },
      loads: [
        { name: 'Log saw', connection: 'ABC-delta', kW: 45, pf: 0.78 },
        { name: 'Kiln fans', connection: 'ABC-delta', kW: 11, pf: 0.8 },
      ],
    }),
  );

describe('the resonance of each step state, balanced delta bank, purely inductive path', () => {
  const x = 0.012;
  const board = boardBehind(x);
  // Three balanced delta steps of 5, 10 and 20 kvar (per branch 5/3, 10/3, 20/3): eight combinations, seven with a capacitor in.
  const steps = [step(1, ['A-B', 'B-C', 'C-A'], 5 / 3), step(2, ['A-B', 'B-C', 'C-A'], 10 / 3), step(3, ['A-B', 'B-C', 'C-A'], 20 / 3)];
  const v = verifyCorrection(board, { equipment: equipmentOf(steps), steps });
  const sscX = 400 ** 2 / x; // 13.33 MVA

  it('h = √(S_sc,X / Q_state) in every state, to 1e-9', () => {
    const r = v.resonanceStepStates!;
    expect(r.combinations).toBe(7);
    expect(r.states).toHaveLength(7);
    for (const st of r.states) {
      const q = [5, 10, 20].reduce((sum, kvar, k) => sum + (st.outputsIn.includes(k + 1) ? kvar : 0), 0);
      expectClose(st.capacitorKvarAtNominalV, q, { rel: 1e-12, abs: 0 }, `kvar with ${st.outputsIn.join('+')} in`);
      expectClose(st.lowestOrder!, Math.sqrt(sscX / (q * 1000)), { rel: 1e-9, abs: 0 }, `order with ${st.outputsIn.join('+')} in`);
    }
    // By hand: 35 kvar in → √(13.33 MVA / 35 kvar) = 19.52; 5 kvar alone → 51.64.
    expectClose(r.states[0]!.lowestOrder!, 19.518, { rel: 1e-4, abs: 0 }, 'every step in');
    expect(r.states[0]!.outputsIn).toEqual([1, 2, 3]);
    expectClose(r.states.at(-1)!.lowestOrder!, 51.64, { rel: 1e-4, abs: 0 }, 'output 1 alone');
    // The every-step-in state is the estimate the check has always given.
    expectClose(r.states[0]!.lowestOrder!, v.resonanceOrder!, { rel: 1e-12, abs: 0 }, 'the same as resonanceOrder');
  });

  it('the states near a watched order are named: 30 kvar (2+3) at 21.08 is clear, 25 kvar (1+3) at 23.09 too, 35 kvar at 19.52 is near the 19th', () => {
    const r = v.resonanceStepStates!;
    expect(r.states[0]!.nearOrders).toEqual([19]);
    expect(r.nearStates).toBe(1);
    // The 19th carries 3–4 % in the typical spectra: warned, not headlined.
    expect(v.resonanceHeadlineOrders).toEqual([]);
    expect(v.resonanceNearHarmonic).toBe(false);
    expect(v.warnings.map((w) => w.code)).toContain('resonance');
    expect(v.warnings.map((w) => w.code)).not.toContain('resonance-step-state');
    expect(v.warnings.find((w) => w.code === 'resonance')!.message).toContain('none of the 6 other step states the controller can reach lies within 10 % of a watched order');
  });
});

describe('a bank whose every-step-in order is clear but a state with fewer steps in is not', () => {
  // Three equal 10 kvar delta steps behind 0.085 Ω: S_sc,X = 400²/0.085 = 1.882 MVA. Every step in:
  // √(1.882 MVA / 30 kvar) = 7.92, in the clear gap between the 7th's band (6.3–7.7) and the 9th's (8.1–9.9);
  // two steps in: √(1.882 MVA / 20 kvar) = 9.70, inside the 9th's; one step: 13.72, inside the 13th's (11.7–14.3).
  const x = 0.085;
  const board = boardBehind(x);
  const steps = [1, 2, 3].map((k) => step(k, ['A-B', 'B-C', 'C-A'], 10 / 3));
  const v = verifyCorrection(board, { equipment: equipmentOf(steps), steps });
  const h = (kvar: number) => Math.sqrt(400 ** 2 / x / (kvar * 1000));

  it('every step in at 7.92 is clear, two steps in at 9.70 and one at 13.72 are near the 9th and the 13th', () => {
    const r = v.resonanceStepStates!;
    expectClose(h(30), 7.921, { rel: 1e-4, abs: 0 }, 'hand figure, 30 kvar');
    expectClose(h(20), 9.701, { rel: 1e-4, abs: 0 }, 'hand figure, 20 kvar');
    expectClose(h(10), 13.72, { rel: 1e-4, abs: 0 }, 'hand figure, 10 kvar');
    // Equal steps: three networks for seven combinations.
    expect(r.combinations).toBe(7);
    expect(r.states.map((s) => [s.outputsIn, s.alike])).toEqual([
      [[1, 2, 3], []],
      [[1, 2], [[1, 3], [2, 3]]],
      [[1], [[2], [3]]],
    ]);
    // 13.72 lies within 10 % of the 15th as well (13.5–16.5).
    expect(r.states.map((s) => s.nearOrders)).toEqual([[], [9], [13, 15]]);
    r.states.forEach((s, k) => expectClose(s.lowestOrder!, h([30, 20, 10][k]!), { rel: 1e-9, abs: 0 }, `state ${k}`));
    expect(v.resonanceNearOrders).toEqual([]);
    expect(v.resonanceNearHarmonic).toBe(true);
    const w = v.warnings.find((x) => x.code === 'resonance-step-state')!;
    expect(v.warnings.map((x) => x.code)).not.toContain('resonance');
    expect(w.message).toContain('with outputs 1 and 2 in (or 1+3, 2+3: the same capacitance), 20.0 kvar, near 9.7 (the 9th)');
    expect(w.message).toContain('with output 1 in (or 2, 3: the same capacitance), 10.0 kvar, near 13.7 (the 13th and the 15th)');
    expect(w.message).toMatch(/detuning reactors on the steps, or a switching programme that never leaves the bank in those combinations, decided with that study by a licensed professional to the local codes$/);
  });

  it('without the steps (equipment alone) only the every-step-in state is judged, as before', () => {
    const alone = verifyCorrection(board, { equipment: equipmentOf(steps) });
    expect(alone.resonanceStepStates).toBeNull();
    expect(alone.resonanceNearHarmonic).toBe(false);
  });
});

describe('taking steps out never lowers the lowest order (the capacitance only falls)', () => {
  const branchArb = fc.constantFrom<Branch>('A-B', 'B-C', 'C-A', 'A-N', 'B-N', 'C-N');
  const stepArb = fc.oneof(
    fc.record({ branches: fc.constantFrom<Branch[]>(['A-B', 'B-C', 'C-A'], ['A-N', 'B-N', 'C-N']), kvar: fc.double({ min: 0.5, max: 30, noNaN: true }) }),
    fc.record({ branches: branchArb.map((b) => [b]), kvar: fc.double({ min: 0.5, max: 30, noNaN: true }) }),
  );
  it('holds on random banks of 1 to 5 steps (trim and balanced, delta and star on the neutral, with or without a fixed part)', () => {
    fc.assert(
      fc.property(fc.array(stepArb, { minLength: 1, maxLength: 5 }), fc.boolean(), fc.double({ min: 0.002, max: 0.2, noNaN: true }), fc.double({ min: 0, max: 0.2, noNaN: true }), (specs, withFixed, x, xN) => {
        const steps = specs.map((s, k) => step(withFixed && k === 0 ? null : k + 1, s.branches, s.kvar));
        const board = boardBehind(x, xN);
        const r = stepStateResonance({ board, equipment: equipmentOf(steps), steps, boardCapacitors: [] });
        if (!steps.some((s) => s.output !== null)) {
          expect(r).toBeNull();
          return;
        }
        const lowest = new Map<string, number | null>();
        for (const st of r!.states) for (const outs of [st.outputsIn, ...st.alike]) lowest.set(outs.join('+'), st.lowestOrder);
        for (const [combination, h] of lowest) {
          if (h === null || combination === '') continue;
          const outs = combination.split('+').map(Number);
          for (const o of outs) {
            const fewer = outs.filter((x) => x !== o).join('+');
            // Every step out without a fixed part is the board as it was: not one of the bank's states.
            if (!lowest.has(fewer)) {
              expect(fewer === '' && !withFixed).toBe(true);
              continue;
            }
            const hFewer = lowest.get(fewer)!;
            if (hFewer !== null) expect(hFewer).toBeGreaterThanOrEqual(h * (1 - 1e-9));
          }
        }
      }),
      { numRuns: runs(60) },
    );
  });
});
