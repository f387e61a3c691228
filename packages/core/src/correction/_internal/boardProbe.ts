/**
 * Solves a board with trial equipment: the sizing loops call this for every
 * candidate, so sizing always works on solved voltages, never on a formula.
 * Unknowns are branch outputs in kvar at the nominal element voltage
 * (+ capacitive), which keeps star (V_LN) and delta (V_LL) branches on one scale.
 */
import type { Board } from '../../board/boardModel.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import { analyseSolution, linePowersAbove, sequenceCurrentsAbove, type SequenceReading } from '../../analysis/analyseSolution.js';
import { noiseFloorFor } from '../../analysis/noiseFloor.js';
import { readBoardCurrents, type SolvedArrays } from '../../network/readBoardCurrents.js';
import { boardOfInstallation } from '../../network/installationModel.js';
import { compileBoard, readInstallationSolution, type CompiledBoard, type NetworkSolution, type SolveOptions } from '../../network/solveNetwork.js';
import { resolveSolveOptions } from '../../network/solveOptions.js';
import { REFERENCE } from '../../network/networkTopology.js';
import { abs, type ComplexValue } from '../../complex.js';
import type { MeteringPlace } from '../meteringPoint.js';
import { conventionsOf } from '../../board/conventions/boardConventions.js';
import { starWordOf } from '../../board/conventions/regionWords.js';
import { RememberedStates } from './rememberedStates.js';
import { addCorrectionEquipment, cleanSusceptance, equipmentGroups, equipmentPower, susceptanceFromKvar, type BranchSlot, type EquipmentGroup } from '../equipment.js';

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

/** Trial states a probe keeps for repeated questions (a Jacobian at a point two loops both linearise around). */
const REMEMBERED_STATES = 32;

export function createProbe(board: Board, slots: readonly BranchSlot[], name: string, solveOptions: SolveOptions = {}, meter: MeteringPlace | null = null): BoardProbe {
  // With a metering point elsewhere every trial solves the installation the point is a board of.
  const base = meter ? meter.inFrame(board) : board;
  const solve = { ...PROBE_SOLVE, ...solveOptions };
  let count = 0;
  const { phaseNames: naming, region } = conventionsOf(board);
  const star = starWordOf(region);
  const groups = (kvar: readonly number[]) =>
    equipmentGroups(
      name,
      slots,
      kvar.map((q, i) => susceptanceFromKvar(q, slots[i]!.vNominal)),
      { naming, star },
    );
  const solveTrial = trialSolver(base, slots, groups, solve, meter);
  // A trial's solve depends on its outputs alone (every solve starts from the same state), so a
  // repeated question is answered from the state kept, bit for bit what solving again gives.
  const remembered = new RememberedStates<ProbeState>(REMEMBERED_STATES);
  return {
    slots,
    base,
    groups,
    solves: () => count,
    at(kvar) {
      const known = remembered.find(kvar);
      if (known) return known;
      count++;
      const state = solveTrial(kvar);
      remembered.add(state);
      return state;
    },
  };
}

/** A network compiled for trials: the first added branch is circuit branch `first`. */
interface CompiledTrial {
  readonly c: CompiledBoard;
  readonly first: number;
  /** Board `b` of the compiled installation, as its solution names it (its layout and supply are what the line readings take), and its noise floor. */
  readonly boardAt: (b: number) => { readonly board: Board; readonly floor: (largestCurrent: number) => number };
}

/**
 * Solves the base board with trial equipment, compiling once per sizing loop instead of once
 * per candidate. Candidates differ only in the added branches' values, which a compiled network
 * takes as new branch powers (see `networkFor` for when another network is needed).
 * Every candidate's solve is the one `solveNetwork` would do: same network, same start.
 * A trial writes its branch powers straight into the network; the equipped `Board`, the
 * board's whole solution and its analysis are built only when a caller reads them.
 */
function trialSolver(
  base: Board,
  slots: readonly BranchSlot[],
  groups: (kvar: readonly number[]) => EquipmentGroup[],
  options: SolveOptions,
  meter: MeteringPlace | null,
): (kvar: readonly number[]) => ProbeState {
  // The added loads' branches in the order `addCorrectionEquipment` adds them: slot indices.
  const order = groups(slots.map(() => 1)).flatMap((g) => g.branches.map((b) => slots.findIndex((s) => s.branch === b.branch)));
  const toStar = order.map((i) => slots[i]!.to === 'star');
  const opts = resolveSolveOptions(options);
  const power = new Float64Array(order.length);
  const compileWith = (kvar: readonly number[]): CompiledTrial => {
    const c = compileBoard(addCorrectionEquipment(base, groups(kvar)));
    let first = c.installation.layout.branchOffset[c.boardIndex]!;
    for (let l = 0; l < base.loads.length; l++) first += base.loads[l]!.branches.length;
    const boards = new Map<number, { board: Board; floor: (largestCurrent: number) => number }>();
    const boardAt = (b: number) => {
      let known = boards.get(b);
      if (!known) {
        const board = boardOfInstallation(c.installation.installation, b);
        boards.set(b, (known = { board, floor: noiseFloorFor(board) }));
      }
      return known;
    };
    return { c, first, boardAt };
  };
  // A compiled network depends on the branch values only through which nodes are live (reach the
  // source). A branch between two nodes live without it changes none, so one network, compiled with
  // those branches at zero, serves every value of theirs; a floating star point is live only through
  // its own branches, so its zero pattern picks the network. Where an end would be dead without the
  // branch, networks are kept per zero pattern of every branch.
  const shared = new Map<string, CompiledTrial | null>();
  const perPattern = new Map<string, CompiledTrial>();
  const networkFor = (kvar: readonly number[]): CompiledTrial => {
    let starZeros = '';
    let zeros = '';
    for (let j = 0; j < order.length; j++) {
      zeros += power[j] === 0 ? '0' : '1';
      if (toStar[j]) starZeros += power[j] === 0 ? '0' : '1';
    }
    let entry = shared.get(starZeros);
    if (entry === undefined) {
      const trial = compileWith(kvar.map((q, i) => (slots[i]!.to === 'star' ? q : 0)));
      const net = trial.c.network;
      const live = (node: number) => node === REFERENCE || net.live[node] === 1;
      const endsLive = order.every((_, j) => {
        const b = net.circuit.branches[trial.first + j]!;
        return toStar[j] || (live(b.from) && live(b.to));
      });
      shared.set(starZeros, (entry = endsLive ? trial : null));
    }
    if (entry) return entry;
    let exact = perPattern.get(zeros);
    if (!exact) perPattern.set(zeros, (exact = compileWith(kvar)));
    return exact;
  };
  return (kvar) => {
    for (let j = 0; j < order.length; j++) {
      const slot = slots[order[j]!]!;
      // The arithmetic of equipmentGroups + addCorrectionEquipment (design state, factor 1), to the bit.
      power[j] = equipmentPower(cleanSusceptance(susceptanceFromKvar(kvar[order[j]!]!, slot.vNominal), slot.vNominal), slot.vNominal).im;
    }
    const outputs = [...kvar];
    let equipped: Board | undefined;
    const board = () => (equipped ??= addCorrectionEquipment(base, groups(outputs)));
    const entry = networkFor(kvar);
    for (let j = 0; j < order.length; j++) {
      entry.c.network.powerRe[entry.first + j] = 0;
      entry.c.network.powerIm[entry.first + j] = power[j]!;
    }
    const { c } = entry;
    const { installation, layout } = c.installation;
    const net = c.network;
    net.solve(opts);
    // The solved state, kept: the network is re-used by the next trial.
    const nodeVoltages = Array.from({ length: net.nodeCount }, (_, v): ComplexValue | null => (net.live[v] ? { re: net.voltageRe[v]!, im: net.voltageIm[v]! } : null));
    const solved: SolvedArrays = {
      live: net.live,
      voltageRe: net.voltageRe.slice(),
      voltageIm: net.voltageIm.slice(),
      admittanceRe: net.admittanceRe.slice(),
      admittanceIm: net.admittanceIm.slice(),
      sourceCurrents: net.sourceCurrents(),
    };
    const { iterations, lastChange } = net;
    // Every board's whole solution, only when an analysis is asked for.
    let boards: readonly NetworkSolution[] | undefined;
    const solvedBoards = () =>
      (boards ??= readInstallationSolution(installation, layout, {
        nodeVoltages,
        admittances: Array.from({ length: solved.admittanceRe.length }, (_, k): ComplexValue => ({ re: solved.admittanceRe[k]!, im: solved.admittanceIm[k]! })),
        sourceCurrents: solved.sourceCurrents,
        iterations,
        lastChange,
        lowVoltageThreshold: opts.lowVoltageThreshold,
      }).boards);
    // A board's line currents and noise floor read straight off the solved state (the same numbers its solution gives).
    const linesAt = (b: number) => {
      const currents = readBoardCurrents(installation, layout, solved, b);
      let largest = currents.largestBranchCurrent;
      for (const i of currents.lineCurrents) largest = Math.max(largest, abs(i));
      if (currents.neutralCurrent) largest = Math.max(largest, abs(currents.neutralCurrent));
      const atBoard = entry.boardAt(b);
      return { lines: { board: atBoard.board, topology: layout.topologies[b]!, nodeVoltages, lineCurrents: currents.lineCurrents }, floor: atBoard.floor(largest) };
    };
    const meterIndex = meter ? meter.meterIndex : c.boardIndex;
    const read = linesAt(meterIndex);
    let bankLines: typeof read | undefined;
    let solution: NetworkSolution | undefined;
    const bankSolution = () => (solution ??= { ...solvedBoards()[c.boardIndex]!, board: board() });
    // Most trial solves are read for line powers (or the bank board's sequence currents) only: the whole analysis waits until asked for.
    const lines = linePowersAbove(read.lines, read.floor);
    let result: BoardResult | undefined;
    let metered: BoardResult | undefined;
    let sequences: SequenceReading | null | undefined;
    const bankResult = () => (result ??= analyseSolution(bankSolution()));
    return {
      kvar: outputs,
      get board() {
        return board();
      },
      get result() {
        return bankResult();
      },
      get metered() {
        return meter ? (metered ??= analyseSolution(solvedBoards()[meterIndex]!)) : bankResult();
      },
      get sequences() {
        if (sequences === undefined) {
          const bank = meterIndex === c.boardIndex ? read : (bankLines ??= linesAt(c.boardIndex));
          sequences = sequenceCurrentsAbove(bank.lines, bank.floor);
        }
        return sequences;
      },
      lineP: lines.map((p) => p.kW),
      lineQ: lines.map((p) => p.kvar),
      lineS: lines.map((p) => p.kVA),
    };
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
  /** Columns not probed (branches held at zero): left at zero, one solve fewer each. */
  skip?: readonly boolean[],
): number[][] {
  const f0 = measure(state);
  const columns = state.kvar.map((_, i) => {
    if (skip?.[i]) return f0.map(() => 0);
    const x = [...state.kvar];
    x[i] = x[i]! + stepKvar;
    const f1 = measure(probe.at(x));
    return f1.map((v, r) => (v - f0[r]!) / stepKvar);
  });
  return f0.map((_, r) => columns.map((col) => col[r]!));
}
