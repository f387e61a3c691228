/**
 * The supply resonance of the bank a profile study simulates, in every state its controller can reach: the
 * same check `trivar correct` makes of the bank it builds (correction/stepStateResonance.ts for the orders,
 * resonanceExcitation.ts for the orders that headline, correctionWording.ts for the warnings and the table).
 *
 * The steps are placed as the simulation places them (simulateBank.ts stepEdges: a three-phase step a star to
 * the neutral where the board has one, else a delta), each at its kvar at nominal voltage, without detuning.
 * The board's own loads are driven by the data and change from interval to interval, so their capacitance is
 * not counted: the orders are the bank's with the supply.
 */
import type { Board } from '../board/boardModel.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import type { StepStateResonance } from '../correction/correctionResult.js';
import { resonanceSummaryClause, stepStatesClearWords, stepStateTable, warningText, type StepStateTable } from '../correction/correctionWording.js';
import { equipmentGroups, susceptanceFromKvar, type BranchSlot } from '../correction/equipment.js';
import { headlineResonanceOrders } from '../correction/resonanceExcitation.js';
import { stepStateResonance } from '../correction/stepStateResonance.js';
import type { SwitchableStep } from '../correction/switchedStepStates.js';
import type { SwitchedStep } from './bankController.js';
import { BANK_RESONANCE_CAUTION, bankResonanceHeadline } from './profileWording.js';
import { stepEdges } from './simulateBank.js';

export interface ProfileBankResonance {
  /** Every state the controller can reach, every step in first (StepStateResonance, as `correct` gives it). */
  readonly stepStates: StepStateResonance;
  /** The watched orders near a resonance in any state that can drive it hard (the rule of correct's verdict), ascending. */
  readonly headlineOrders: readonly number[];
  /** One line where some state lies near a watched order: near one that headlines `trivar correct`'s verdict, or only near others; null where none does (`clear` says so). */
  readonly headline: string | null;
  /** A warning for the every-step-in state near a watched order, one naming the states with fewer steps in near one. */
  readonly warnings: readonly string[];
  /** The step states as a table where any lies near a watched order; else null and `clear` says so in a line. */
  readonly table: StepStateTable | null;
  readonly clear: string | null;
  readonly caution: string;
}

/**
 * The resonance check of a simulated bank's steps. Null where there is no switched step, or no estimate (an
 * ideal source, a path without reactance).
 * @param steps the switched steps, in the controller's order (output: the step's number where a designed bank gives one)
 * @param fixed the always-connected part
 */
export function profileBankResonance(board: Board, steps: readonly SwitchedStep[], fixed: readonly SwitchedStep[]): ProfileBankResonance | null {
  if (!steps.length) return null;
  const omega = 2 * Math.PI * board.frequencyHz;
  const slots = new Map<string, BranchSlot & { susceptanceS: number; fixedSusceptanceS: number }>();
  const placed = (s: SwitchedStep, output: number | null): SwitchableStep => {
    const branches = stepEdges(board, s.channel).map(({ edge, share }) => {
      const branch = `${edge.from}-${edge.to}`;
      const b = susceptanceFromKvar(s.kvar * share, edge.vNominal);
      const slot = slots.get(branch) ?? { branch, from: edge.from as BranchSlot['from'], to: edge.to as BranchSlot['to'], vNominal: edge.vNominal, susceptanceS: 0, fixedSusceptanceS: 0 };
      slots.set(branch, { ...slot, susceptanceS: slot.susceptanceS + b, fixedSusceptanceS: slot.fixedSusceptanceS + (output === null ? b : 0) });
      return { branch, b };
    });
    // Every branch of a step carries the same share at the same voltage: one capacitance per branch.
    return { output, branches: branches.map((x) => x.branch), capacitancePerBranchUF: (branches[0]!.b / omega) * 1e6, detuningFactor: 0 };
  };
  const bankSteps = [...steps.map((s, k) => placed(s, s.output ?? k + 1)), ...fixed.map((s) => placed(s, null))];
  const all = [...slots.values()];
  const equipment = equipmentGroups(
    'bank',
    all.map(({ susceptanceS: _s, fixedSusceptanceS: _f, ...slot }) => slot),
    all.map((s) => s.susceptanceS),
    { fixedSusceptances: all.map((s) => s.fixedSusceptanceS), naming: conventionsOf(board).phaseNames },
  );
  const states = stepStateResonance({ board, equipment, steps: bankSteps, boardCapacitors: [] });
  if (states === null) return null;
  const [allIn, ...partial] = states.states;
  const nearPartial = partial.filter((st) => st.nearOrders.length > 0);
  const warnings = [
    ...(allIn!.resonancesNear.length ? [warningText.lowResonance(allIn!.resonancesNear, 'bank', allIn!.nearOrders, { others: partial.length, othersNear: nearPartial.length })] : []),
    ...(nearPartial.length ? [warningText.stepStateResonance(nearPartial, states.fixedPart, allIn!.resonancesNear.length > 0)] : []),
  ];
  const matters = new Set(headlineResonanceOrders(board, equipment.flatMap((g) => g.branches)));
  const headlineOrders = [...new Set(states.states.flatMap((st) => st.nearOrders))].filter((h) => matters.has(h)).sort((a, b) => a - b);
  const clause = headlineOrders.length
    ? resonanceSummaryClause({ resonanceNearHarmonic: true, resonanceNearOrders: allIn!.nearOrders, resonanceHeadlineOrders: headlineOrders, resonanceStepStates: states }).replace(/^; but /, '')
    : null;
  const anyNear = allIn!.nearOrders.length > 0 || nearPartial.length > 0;
  return {
    stepStates: states,
    headlineOrders,
    headline: bankResonanceHeadline(clause, anyNear),
    warnings,
    table: anyNear ? stepStateTable(states) : null,
    clear: anyNear ? null : stepStatesClearWords(states),
    caution: BANK_RESONANCE_CAUTION,
  };
}
