/**
 * Solves a board with trial equipment: the sizing loops call this for every
 * candidate, so sizing always works on solved voltages, never on a formula.
 * Unknowns are branch outputs in kvar at the nominal element voltage
 * (+ capacitive), which keeps star (V_LN) and delta (V_LL) branches on one scale.
 */
import type { Board } from '../../board/boardModel.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import { analyseSolution, readLinePowers, readSequenceCurrents, type SequenceReading } from '../../analysis/analyseSolution.js';
import { compileBoard, solveCompiledBoard, solveCompiledInstallation, type CompiledBoard, type NetworkSolution, type SolveOptions } from '../../network/solveNetwork.js';
import type { MeteringPlace } from '../meteringPoint.js';
import { conventionsOf } from '../../board/conventions/boardConventions.js';
import { addCorrectionEquipment, equipmentGroups, susceptanceFromKvar, type BranchSlot, type EquipmentGroup } from '../equipment.js';

export interface ProbeState {
  readonly kvar: readonly number[];
  readonly board: Board;
  /** The equipment's board. */
  readonly result: BoardResult;
  /** Where the target is measured: the equipment's board, or the metering point (see meteringPoint.ts). */
  readonly metered: BoardResult;
  /** Per line where the target is measured: active power kW, reactive power kvar (+ lagging), apparent power kVA. */
  readonly lineP: readonly number[];
  readonly lineQ: readonly number[];
  readonly lineS: readonly number[];
  /** The equipment's board: sequence currents and positive-sequence power (what a balancing compensator reads); null without three phases. */
  readonly sequences: SequenceReading | null;
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

export function createProbe(board: Board, slots: readonly BranchSlot[], name: string, solveOptions: SolveOptions = {}, meter: MeteringPlace | null = null): BoardProbe {
  // With a metering point elsewhere every trial solves the installation the point is a board of.
  const base = meter ? meter.inFrame(board) : board;
  const solve = { ...PROBE_SOLVE, ...solveOptions };
  let count = 0;
  const naming = conventionsOf(board).phaseNames;
  const groups = (kvar: readonly number[]) =>
    equipmentGroups(
      name,
      slots,
      kvar.map((q, i) => susceptanceFromKvar(q, slots[i]!.vNominal)),
      { naming },
    );
  const solveEquipped = equippedSolver(base);
  return {
    slots,
    base,
    groups,
    solves: () => count,
    at(kvar) {
      count++;
      const board = addCorrectionEquipment(base, groups(kvar));
      const { solution, metering } = solveEquipped(board, solve, meter);
      // Most trial solves are read for line powers (or the bank board's sequence currents) only: the whole analysis waits until asked for.
      const lines = readLinePowers(metering ?? solution);
      let result: BoardResult | undefined;
      let metered: BoardResult | undefined;
      let sequences: SequenceReading | null | undefined;
      const bankResult = () => (result ??= analyseSolution(solution));
      return {
        kvar: [...kvar],
        board,
        get result() {
          return bankResult();
        },
        get metered() {
          return metering ? (metered ??= analyseSolution(metering)) : bankResult();
        },
        get sequences() {
          return sequences === undefined ? (sequences = readSequenceCurrents(solution)) : sequences;
        },
        lineP: lines.map((p) => p.kW),
        lineQ: lines.map((p) => p.kvar),
        lineS: lines.map((p) => p.kVA),
      };
    },
  };
}

/**
 * Solves the base board with equipment added, compiling once per sizing loop instead of once
 * per candidate. Candidates differ only in the added branches' values, which a compiled network
 * takes as new branch powers; it is recompiled only when the set of zero-valued branches
 * changes, since a zero branch joins nothing (an all-zero floating star point is a dead node).
 * Every candidate's solve is the one `solveNetwork` would do: same network, same start.
 */
function equippedSolver(base: Board): (board: Board, options: SolveOptions, meter: MeteringPlace | null) => { solution: NetworkSolution; metering: NetworkSolution | null } {
  const compiled = new Map<string, CompiledBoard>();
  const baseLoads = base.loads.length;
  return (board, options, meter) => {
    const added = board.loads.slice(baseLoads).flatMap((l) => l.branches);
    const zeros = added.map((b) => (b.sNominal.re === 0 && b.sNominal.im === 0 ? '0' : '1')).join('');
    let c = compiled.get(zeros);
    if (!c) {
      c = compileBoard(board);
      compiled.set(zeros, c);
    } else {
      const net = c.network;
      let k = c.installation.layout.branchOffset[c.boardIndex]!;
      for (let l = 0; l < baseLoads; l++) k += board.loads[l]!.branches.length;
      for (const b of added) {
        net.powerRe[k] = b.sNominal.re;
        net.powerIm[k] = b.sNominal.im;
        k++;
      }
    }
    if (!meter) return { solution: solveCompiledBoard({ ...c, board }, options), metering: null };
    const boards = solveCompiledInstallation(c.installation, options).boards;
    return { solution: { ...boards[c.boardIndex]!, board }, metering: boards[meter.meterIndex]! };
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
