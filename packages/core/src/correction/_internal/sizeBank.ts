/**
 * Sizing shared by the star and the delta bank: the same targets, the same
 * loops, only the branch layout differs.
 */
import type { Board } from '../../board/boardModel.js';
import { arrangementNames } from '../correctionWording.js';
import { conventionsOf } from '../../board/conventions/boardConventions.js';
import type { SolveOptions } from '../../network/solveNetwork.js';
import { judgeTarget, type BoardTargetDefinition, type ResolvedTarget } from '../correctionTarget.js';
import { lineBands } from './lineBands.js';
import type { BankSizing } from '../correctionResult.js';
import { deltaSlots, susceptanceFromKvar, type BranchSlot } from '../equipment.js';
import { deltaKvarToStarKvar, MIN_DELTA_SHARE } from './floatingStar.js';
import { infeasibleReason, sizingMethod } from '../correctionWording.js';
import { createProbe, type ProbeState } from './boardProbe.js';
import { sizeForLineTargets, type LoopSettings } from './sizeForLineTargets.js';
import { sizeAlongDirection } from './sizeAlongDirection.js';
import { equalShareWindow, type EqualShareWindow } from './equalShareWindow.js';
import { branchSizings, lineComparisons } from './branchReadings.js';
import { roundingWindows, type RoundingWindows } from './roundingWindows.js';
import { meteringPlace } from '../meteringPoint.js';

export interface ResolvedBankOptions {
  readonly target: ResolvedTarget;
  readonly share: 'equal' | 'proportional';
  readonly solve: SolveOptions;
  readonly loop: LoopSettings;
  /**
   * A light-load sizing, read only for its limits and applied voltages (selectBankUnits' `lightLoad`):
   * an equal bank's window is then found up to its limit only (`equalShare.minKvar` null).
   */
  readonly limitsOnly?: boolean;
  /** The capacitance tolerance units will be chosen across, fractions (`roundingWindows`). @defaultValue none: no rounding windows */
  readonly capacitanceTolerance?: { readonly minus: number; readonly plus: number };
}

export function sizeBank(board: Board, arrangement: BankSizing['arrangement'], slots: readonly BranchSlot[], options: ResolvedBankOptions): BankSizing {
  const { target } = options;
  const name = arrangementNames(board.system, conventionsOf(board).region)[arrangement];
  const floating = slots.some((s) => s.to === 'star');
  // The loops run on `probe`; a floating star is sized as its equivalent delta (see floatingStar.ts).
  // Where the target is measured: the board itself, or a point the feeders lead up to (meteringPoint.ts).
  const meter = meteringPlace(board, target.measuredAt);
  const probe = createProbe(board, floating ? deltaSlots(board) : slots, name, options.solve, meter);
  const built = floating ? createProbe(board, slots, name, options.solve, meter) : probe;
  const toBuilt = (kvar: readonly number[]) => (floating ? deltaKvarToStarKvar(board, kvar) : [...kvar]);
  const loop = floating ? { ...options.loop, minShare: MIN_DELTA_SHARE } : options.loop;
  const zeros = slots.map(() => 0);
  const start = probe.at(zeros);
  const checkBefore = judgeTarget(start.metered, target);
  const limitBands = lineBands(target, start, 'limit');

  const perLineTarget = target.definition === 'per-line';
  // An equal bank's own window (per-line targets; with a board-wide target the equal share is the sizing itself).
  // Equal delta and equal star branches of the same kvar are Y–Δ equivalents, so the window carries over.
  let equalShare: EqualShareWindow | null = null;
  const equalWindow = () => {
    if (perLineTarget && slots.length === 3 && start.result.totals.kW > 0) equalShare = equalShareWindow(probe, start, lineBands(target, start, 'target'), limitBands, options.limitsOnly);
  };

  const finish = (
    sized: ProbeState,
    sizedLimit: readonly number[] | null,
    method: string,
    forced?: { status: BankSizing['status']; reasons: string[] },
    windows: RoundingWindows | null = null,
  ): BankSizing => {
    const state = floating ? built.at(toBuilt(sized.kvar)) : sized;
    const limitKvar = sizedLimit && toBuilt(sizedLimit);
    const equipment = built.groups(state.kvar);
    const check = judgeTarget(state.metered, target, start.metered);
    const reasons = forced?.reasons ?? [];
    const status = forced?.status ?? (check.met ? 'meets-target' : 'infeasible');
    if (!forced && !check.met) {
      reasons.push(infeasibleReason.capacitorsCannotReach(check.shortfalls));
    }
    const star = state.result.loads.at(-1)?.starPointShift ?? null;
    return {
      arrangement,
      method,
      target,
      status,
      reasons,
      frequencyHz: board.frequencyHz,
      branches: branchSizings(
        equipment,
        state.board,
        state.result,
        limitKvar ? limitKvar.map((q, i) => susceptanceFromKvar(q, slots[i]!.vNominal)) : [],
      ),
      equipment,
      totalKvarAtNominalV: state.kvar.reduce((a, b) => a + b, 0),
      check,
      lines: lineComparisons(start.result, state.result),
      starPointShift: slots.some((s) => s.to === 'star') ? star : null,
      equalShare,
      roundingWindows: windows,
      solves: probe.solves() + (floating ? built.solves() : 0),
    };
  };

  const perLine = target.definition === 'per-line';
  const method = perLine ? sizingMethod.perLine : options.share === 'equal' ? sizingMethod.equal(target.definition) : sizingMethod.proportional(target.definition);
  // An exporting board that already meets the target (a PV array at unity PF) has nothing to add; one that does not gets no bank sized for it.
  if (start.result.totals.kW < 0)
    return finish(start, null, method, checkBefore.met ? { status: 'already-meets-target', reasons: [infeasibleReason.exportingMet] } : { status: 'infeasible', reasons: [infeasibleReason.exporting] });
  // Nothing drawn, nothing to correct: the verdict the balancing compensator gives the same board (it was 'not reachable').
  if (start.result.totals.kW === 0) return finish(start, null, method, { status: 'already-meets-target', reasons: [infeasibleReason.noLoad] });
  // The limit (most compensation before a line passes its upper bound) is wanted
  // even when nothing is needed: a light-load sizing caps the fixed part with it.
  if (perLine) {
    equalWindow();
    const limit = sizeForLineTargets(probe, limitBands, loop);
    if (checkBefore.met) return finish(start, limit.kvar, method, { status: 'already-meets-target', reasons: [] });
    const targetBands = lineBands(target, start, 'target');
    const outcome = sizeForLineTargets(probe, targetBands, loop);
    // Each branch's window ([requirement, limit] across the tolerance) is what units are rounded in; where
    // one is empty, windows that hold together are found instead (not on a floating star: its elements
    // are not proportional to the equivalent delta's the loops size).
    const tol = options.capacitanceTolerance;
    const crossed = tol && outcome.kvar.some((q, i) => q > 0 && limit.kvar[i]! / (1 + tol.plus) < q / (1 - tol.minus));
    const windows = crossed && !floating && !options.limitsOnly ? roundingWindows(probe, outcome.state, targetBands, limitBands, tol) : null;
    const sized = finish(outcome.state, limit.kvar, method, undefined, windows);
    if (!outcome.converged && sized.status === 'infeasible')
      return { ...sized, reasons: [...sized.reasons, infeasibleReason.notConverged(outcome.iterations, outcome.lastChange)] };
    return sized;
  }
  const definition = target.definition as BoardTargetDefinition;
  const direction = options.share === 'equal' ? zeros.map(() => 1) : sizeForLineTargets(probe, limitBands, loop).kvar;
  const outcome = sizeAlongDirection(probe, direction, target, definition, limitBands.map((b) => b.low));
  if (checkBefore.met) return finish(start, outcome.limitKvar, method, { status: 'already-meets-target', reasons: [] });
  return finish(outcome.state, outcome.limitKvar, method);
}
