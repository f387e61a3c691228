/**
 * A balancing compensator built from catalogue units: the capacitors come out
 * in unit steps (rounded down where passing the requirement would tip the
 * balance), while the reactors were sized beside the exact capacitors. Here the
 * reactors are sized again beside the capacitors as built: the capacitor-only
 * solution's Gauss–Newton/QP loop (same weighted residual I2, I0, Q1 − target,
 * same no-leading bounds) with the reactor outputs as its only unknowns, each
 * ≥ 0 as an inductive output, on the solved board — and the balance target
 * (|I2|/|I1|, neutral) held as constraints where the reactors can hold it.
 * A re-sized reactor whose removal meets more of the targets is removed.
 * Where the build as sized misses a target, the re-sized reactors are built
 * when they meet more of the targets (PF, balance), or as many with a lower
 * residual.
 */
import type { Board } from '../../board/boardModel.js';
import { judgeTarget, type ResolvedTarget } from '../correctionTarget.js';
import { judgeBalance, type BalanceTarget } from '../balanceTarget.js';
import type { SolveOptions } from '../../network/solveNetwork.js';
import type { BankSelection, BranchSizing, ReactorResizing } from '../correctionResult.js';
import { kvarFromSusceptance, susceptanceFromKvar, addCorrectionEquipment, type BranchSlot, type EquipmentGroup } from '../equipment.js';
import { CORRECTION_DEFAULTS } from '../correctionDefaults.js';
import { createProbe, type BoardProbe, type ProbeState } from './boardProbe.js';
import { lineBands } from './lineBands.js';
import { compensatorResidual, residualBasesFor, residualWeights } from './compensatorResidual.js';
import { solveCapacitorOnlyCompensator } from './capacitorOnlyCompensator.js';
import { negligibleKvar } from './negligibleBranches.js';

export interface ReactorRefitInput {
  readonly target: ResolvedTarget;
  /** Held as constraints where the reactors can hold it; the weighted residual decides within it. */
  readonly balance: BalanceTarget;
  readonly includeZeroSequence: boolean;
  readonly weights: { readonly negativeSequence: number; readonly zeroSequence: number; readonly reactive: number };
  readonly maxIterations: number;
  readonly solve?: SolveOptions;
}

export interface RefitOutcome extends ReactorResizing {
  /** The compensator as built with the reactors re-sized (a reactor's fixed part is itself). */
  readonly equipment: EquipmentGroup[];
}

/** A probe state read with the given outputs; its analysis and sequence reading stay lazy (a spread would run them). */
function withOutputs(state: ProbeState, kvar: readonly number[]): ProbeState {
  return {
    kvar: [...kvar],
    board: state.board,
    get result() {
      return state.result;
    },
    get metered() {
      return state.metered;
    },
    get sequences() {
      return state.sequences;
    },
    lineP: state.lineP,
    lineQ: state.lineQ,
    lineS: state.lineS,
  };
}

/**
 * The least-squares re-sizing trades the PF target against the balance, so it can put in a reactor
 * that costs the PF target while the balance target holds without it. Smallest first, a reactor
 * whose removal meets more of the targets is removed (re-solved each time): it is not bought.
 */
function withoutHarmfulReactors(probe: BoardProbe, state: ProbeState, targetsMet: (s: ProbeState) => number): { kvar: number[]; state: ProbeState } {
  let kvar = [...state.kvar];
  let current = state;
  let met = targetsMet(current);
  const order = kvar.map((q, i) => [q, i] as const).filter(([q]) => q > 0).sort((a, b) => a[0] - b[0]);
  for (const [, i] of order) {
    if (met === 2) break; // both targets met: nothing to gain
    const without = kvar.map((q, j) => (j === i ? 0 : q));
    const trial = probe.at(without);
    const metWithout = targetsMet(trial);
    if (metWithout > met) [kvar, current, met] = [without, trial, metWithout];
  }
  return { kvar, state: current };
}

/** The reactors of `built` re-sized to its capacitors; null when it has no reactor. */
export function refitReactors(board: Board, built: readonly EquipmentGroup[], input: ReactorRefitInput): RefitOutcome | null {
  const slots: BranchSlot[] = [];
  const sizedKvar: number[] = [];
  for (const g of built)
    for (const b of g.branches)
      // Every branch without a capacitor may take a reactor (an empty one too: the balance may need it).
      if (b.susceptanceS <= 0) {
        slots.push({ branch: b.branch, from: b.from, to: b.to, vNominal: b.vNominal });
        sizedKvar.push(-kvarFromSusceptance(b.susceptanceS, b.vNominal));
      }
  if (!sizedKvar.some((q) => q > 0)) return null;
  const slotOf = (branch: string) => slots.findIndex((s) => s.branch === branch);
  const withReactors = (kvar: readonly number[]): EquipmentGroup[] =>
    built.map((g) => ({
      ...g,
      branches: g.branches.map((b) => {
        const i = slotOf(b.branch);
        if (i < 0) return b;
        const s = kvar[i]! === 0 ? 0 : susceptanceFromKvar(-kvar[i]!, b.vNominal);
        return { ...b, susceptanceS: s, fixedSusceptanceS: s };
      }),
    }));
  const capacitorsOnly = built.map((g) => ({ ...g, branches: g.branches.filter((b) => slotOf(b.branch) < 0) })).filter((g) => g.branches.length > 0);
  const base = addCorrectionEquipment(board, capacitorsOnly);
  // Unknowns are reactor outputs ≥ 0; the probe adds them as negative (inductive) outputs.
  const inner = createProbe(base, slots, 'compensator reactors', input.solve);
  const probe: BoardProbe = {
    slots,
    base,
    at: (kvar) => withOutputs(inner.at(kvar.map((q) => -q)), kvar),
    groups: (kvar) => inner.groups(kvar.map((q) => -q)),
    solves: inner.solves,
  };
  const start = createProbe(board, [], 'nothing', input.solve).at([]);
  const bases = residualBasesFor(start.result, board, input.target, input.includeZeroSequence);
  const weights = residualWeights(bases, input.weights);
  const objectiveOf = (state: ProbeState) => compensatorResidual(state, bases).reduce((s, r, k) => s + weights[k]! * r * r, 0);
  // Targets met (the PF target, the balance target): more is better, then the lower residual.
  const targetsMet = (state: ProbeState) => Number(judgeTarget(state.result, input.target, start.result).met) + Number(judgeBalance(state.result, input.balance).met);
  const sizedState = probe.at(sizedKvar);
  const objectiveSized = objectiveOf(sizedState);
  const metSized = targetsMet(sizedState);
  const reactors = (resized: readonly number[]) => slots.map((s, i) => ({ branch: s.branch, sizedKvar: sizedKvar[i]!, resizedKvar: resized[i]! }));
  // A build that meets both targets as sized stays as it is: nothing is re-sized (re-sized = as sized).
  if (metSized === 2)
    return { equipment: withReactors(sizedKvar), reactors: reactors(sizedKvar), objectiveSized, objectiveResized: objectiveSized, converged: true, used: false, solves: inner.solves() };
  const outcome = solveCapacitorOnlyCompensator(probe, bases, {
    weights,
    ridge: CORRECTION_DEFAULTS.compensatorRidge,
    lineLowerTan: lineBands(input.target, start, 'limit').map((b) => b.low),
    maxIterations: input.maxIterations,
    convergence: CORRECTION_DEFAULTS.convergence,
    balanceLimits: {
      negativeSequence: input.balance.maxNegativeSequencePercent / 100,
      // The neutral carries 3·I0.
      zeroSequence: input.balance.maxNeutralPercent === null ? null : input.balance.maxNeutralPercent / 300,
    },
  });
  // A negligible reactor is not worth building (as in the sizing, negligibleBranches.ts) unless a target needs it.
  const floor = negligibleKvar(built.flatMap((g) => g.branches).map((b) => kvarFromSusceptance(b.susceptanceS, b.vNominal)));
  const trimmed = outcome.state.kvar.map((q) => (q < floor ? 0 : q));
  const trimmedState = trimmed.every((q, i) => q === outcome.state.kvar[i]) ? outcome.state : probe.at(trimmed);
  const keepSmall = targetsMet(trimmedState) < targetsMet(outcome.state);
  const { kvar: resized, state: resizedState } = withoutHarmfulReactors(probe, keepSmall ? outcome.state : trimmedState, targetsMet);
  const objectiveResized = objectiveOf(resizedState);
  const metResized = targetsMet(resizedState);
  return {
    equipment: withReactors(resized),
    reactors: reactors(resized),
    objectiveSized,
    objectiveResized,
    converged: outcome.converged,
    used: metResized > metSized || (metResized === metSized && objectiveResized < objectiveSized),
    solves: inner.solves(),
  };
}

/** The selection with its reactors as re-sized: equipment, and each reactor row's output and current as verified. */
export function selectionWithResizedReactors(selection: BankSelection, refit: RefitOutcome, verified: readonly BranchSizing[]): BankSelection {
  const reactor = new Set(refit.reactors.map((r) => r.branch));
  return {
    ...selection,
    equipment: refit.equipment,
    selections: selection.selections.map((row) => {
      const v = verified.find((b) => b.branch === row.branch);
      return reactor.has(row.branch) && v ? { ...row, designKvarAtAppliedV: v.kvarAtAppliedV, designCurrentA: v.currentA } : row;
    }),
  };
}
