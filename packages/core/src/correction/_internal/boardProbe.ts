/**
 * Solves a board with trial equipment: the sizing loops call this for every
 * candidate, so sizing always works on solved voltages, never on a formula.
 * Unknowns are branch outputs in kvar at the nominal element voltage
 * (+ capacitive), which keeps star (V_LN) and delta (V_LL) branches on one scale.
 */
import type { Board } from '../../board/boardModel.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import { analyseSolution } from '../../analysis/analyseSolution.js';
import { solveNetwork, type SolveOptions } from '../../network/solveNetwork.js';
import { addCorrectionEquipment, equipmentGroups, susceptanceFromKvar, type BranchSlot, type EquipmentGroup } from '../equipment.js';

export interface ProbeState {
  readonly kvar: readonly number[];
  readonly board: Board;
  readonly result: BoardResult;
  /** Per line at the board: active power kW, reactive power kvar (+ lagging), apparent power kVA. */
  readonly lineP: readonly number[];
  readonly lineQ: readonly number[];
  readonly lineS: readonly number[];
}

export interface BoardProbe {
  readonly slots: readonly BranchSlot[];
  readonly base: Board;
  at(kvar: readonly number[]): ProbeState;
  groups(kvar: readonly number[]): EquipmentGroup[];
  /** Board solves so far. */
  solves(): number;
}

/**
 * Sizing differentiates solved boards numerically (steps of 1e-4 of the board's
 * kVA), which turns the load iteration's leftover error ε into Jacobian noise of
 * about ε/1e-4. The default solve tolerance (1e-10) would give 1e-6; this gives
 * about 1e-9, below the loops' convergence step. Callers' options still win.
 */
const PROBE_SOLVE: SolveOptions = { tolerance: 1e-13, maxIterations: 400 };

export function createProbe(base: Board, slots: readonly BranchSlot[], name: string, solveOptions: SolveOptions = {}): BoardProbe {
  const solve = { ...PROBE_SOLVE, ...solveOptions };
  let count = 0;
  const groups = (kvar: readonly number[]) =>
    equipmentGroups(
      name,
      slots,
      kvar.map((q, i) => susceptanceFromKvar(q, slots[i]!.vNominal)),
    );
  return {
    slots,
    base,
    groups,
    solves: () => count,
    at(kvar) {
      count++;
      const board = addCorrectionEquipment(base, groups(kvar));
      const result = analyseSolution(solveNetwork(board, solve));
      return {
        kvar: [...kvar],
        board,
        result,
        lineP: result.phases.map((p) => p.kW),
        lineQ: result.phases.map((p) => p.kvar),
        lineS: result.phases.map((p) => p.kVA),
      };
    },
  };
}

/**
 * Forward-difference Jacobian of `measure` (a vector read off a solved state)
 * with respect to the branch outputs. Exact up to rounding where the board is
 * linear in the equipment (ideal source); the outer loops re-solve, so a small
 * error here only costs an iteration.
 */
export function probeJacobian(
  probe: BoardProbe,
  state: ProbeState,
  measure: (s: ProbeState) => readonly number[],
  stepKvar: number,
): number[][] {
  const f0 = measure(state);
  const columns = state.kvar.map((_, i) => {
    const x = [...state.kvar];
    x[i] = x[i]! + stepKvar;
    const f1 = measure(probe.at(x));
    return f1.map((v, r) => (v - f0[r]!) / stepKvar);
  });
  return f0.map((_, r) => columns.map((col) => col[r]!));
}
