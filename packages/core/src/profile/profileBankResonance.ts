/**
 * The supply resonance of the bank a profile study simulates, in every state its controller can reach: the
 * same check `trivar correct` makes of the bank it builds (correction/stepStateResonance.ts for the orders,
 * resonanceExcitation.ts for the orders that headline, correctionWording.ts for the warnings and the table).
 *
 * A correction study's bank (--correction-bank) is checked as that study built it: its branches, connection and
 * detuning. Steps sized here or written in profile.bank.steps are placed as the simulation places them
 * (simulateBank.ts stepEdges: a three-phase step a star to the neutral where the board has one, else a delta),
 * each at its kvar at nominal voltage, without detuning.
 * The board's own loads are driven by the data and change from interval to interval, so their capacitance is
 * not counted: the orders are the bank's with the supply.
 */
import type { Board } from '../board/boardModel.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import type { BankStep, StepStateResonance } from '../correction/correctionResult.js';
import { resonanceSummaryClause, stepStatesClearWords, stepStateTable, warningText, type StepStateTable } from '../correction/correctionWording.js';
import { equipmentGroups, susceptanceFromKvar, type BranchSlot, type EquipmentGroup } from '../correction/equipment.js';
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

/** A switched step as the simulation places it (simulateBank.ts stepEdges), at its kvar at nominal voltage, undetuned. */
function placedAsSimulated(board: Board, s: SwitchedStep, output: number | null): SwitchableStep {
  const omega = 2 * Math.PI * board.frequencyHz;
  const edges = stepEdges(board, s.channel);
  // Every branch of a step carries the same share at the same voltage: one capacitance per branch.
  const { edge, share } = edges[0]!;
  return { output, branches: edges.map((e) => `${e.edge.from}-${e.edge.to}`), capacitancePerBranchUF: (susceptanceFromKvar(s.kvar * share, edge.vNominal) / omega) * 1e6, detuningFactor: 0 };
}

/** The bank's branches with every step in (and the fixed part's share), as correct's equipment groups. */
function equipmentOfSteps(board: Board, steps: readonly SwitchableStep[]): EquipmentGroup[] {
  const omega = 2 * Math.PI * board.frequencyHz;
  const ll = board.nominalLineToLineV ?? board.nominalLineToNeutralV;
  const slots = new Map<string, BranchSlot & { susceptanceS: number; fixedSusceptanceS: number }>();
  for (const s of steps)
    for (const branch of s.branches) {
      const [from, to] = branch.split('-') as [BranchSlot['from'], BranchSlot['to']];
      const b = (omega * s.capacitancePerBranchUF * 1e-6) / (1 - s.detuningFactor);
      const vNominal = to === 'N' || to === 'star' ? board.nominalLineToNeutralV : ll;
      const slot = slots.get(branch) ?? { branch, from, to, vNominal, susceptanceS: 0, fixedSusceptanceS: 0 };
      slots.set(branch, { ...slot, susceptanceS: slot.susceptanceS + b, fixedSusceptanceS: slot.fixedSusceptanceS + (s.output === null ? b : 0) });
    }
  const all = [...slots.values()];
  return equipmentGroups(
    'bank',
    all.map(({ susceptanceS: _s, fixedSusceptanceS: _f, ...slot }) => slot),
    all.map((s) => s.susceptanceS),
    { fixedSusceptances: all.map((s) => s.fixedSusceptanceS), naming: conventionsOf(board).phaseNames },
  );
}

/**
 * The resonance check of a simulated bank's steps. Null where there is no switched step, or no estimate (an
 * ideal source, a path without reactance).
 * @param steps the switched steps, in the controller's order (output: the step's number where a designed bank gives one)
 * @param fixed the always-connected part
 * @param built the correction study's steps as built, where the bank is its design: checked in their own connection (a delta stays a delta)
 */
export function profileBankResonance(board: Board, steps: readonly SwitchedStep[], fixed: readonly SwitchedStep[], built?: readonly BankStep[]): ProfileBankResonance | null {
  if (!steps.length && !built?.some((s) => s.output !== null)) return null;
  const bankSteps: readonly SwitchableStep[] = built ?? [...steps.map((s, k) => placedAsSimulated(board, s, s.output ?? k + 1)), ...fixed.map((s) => placedAsSimulated(board, s, null))];
  const equipment = equipmentOfSteps(board, bankSteps);
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
    ? resonanceSummaryClause({ resonanceNearHarmonic: true, resonanceNearOrders: allIn!.nearOrders, resonanceHeadlineOrders: headlineOrders, resonanceStepStates: states }, null)
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
