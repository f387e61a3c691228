/**
 * Nodal analysis of a board (compiled once, see compiledNetwork.ts), with an outer fixed-point iteration for
 * voltage-dependent loads.
 *
 * Each load branch is replaced by the admittance that draws its modelled power
 * at the present voltage, Y = conj(S(V)) / |V|²; the linear network is solved;
 * the admittances are updated from the new voltages; repeat until the remaining
 * error of every node voltage, estimated from the last step and the rate the steps
 * shrink, is below `tolerance` × nominal. Constant-impedance-only
 * boards need a single solve. Below `lowVoltageThreshold` the current and power
 * parts of a load are held at their threshold admittance (they behave as
 * impedances), the usual way load-flow programs keep collapsing voltages solvable.
 */
import { add, mul, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, Terminal } from '../board/boardModel.js';
import { buildTopology, REFERENCE, type NetworkTopology } from './networkTopology.js';
import { resolveSolveOptions, type SolveOptions } from './solveOptions.js';
import type { Circuit, CircuitBranch, CircuitElement, CircuitSource } from './circuit.js';
import { compileCircuit, type CompiledNetwork } from './compiledNetwork.js';

export type { SolveOptions } from './solveOptions.js';

export interface NetworkSolution {
  readonly board: Board;
  readonly topology: NetworkTopology;
  /** Voltage of each node to the source star point; null for a node connected to nothing. */
  readonly nodeVoltages: readonly (ComplexValue | null)[];
  /** Per phase, current in the line from the source to the board, A. */
  readonly lineCurrents: readonly ComplexValue[];
  /**
   * Current in the neutral conductor from the board back to the source star
   * point, A; zero when the neutral is open; null on a board with no neutral.
   * With this sign, KCL reads ΣI_line = I_N.
   */
  readonly neutralCurrent: ComplexValue | null;
  /** Per load, per branch: voltage across (from − to), current (from → to), admittance used. */
  readonly branches: readonly (readonly BranchState[])[];
  readonly iterations: number;
  /** Largest node-voltage change in the last iteration, fraction of nominal. */
  readonly lastChange: number;
  /** The per-unit voltage below which current and power parts of loads were held as impedances. */
  readonly lowVoltageThreshold: number;
}

export interface BranchState {
  readonly voltage: ComplexValue;
  readonly current: ComplexValue;
  readonly admittance: ComplexValue;
  /** False when a terminal is connected to nothing else, so the branch carries no current. */
  readonly energised: boolean;
}

/**
 * The board as a circuit for the compiled solver, numbered like its topology.
 * A source terminal node is folded into its line (Norton), so it carries no
 * element; its voltage is the EMF.
 */
export function boardCircuit(board: Board, topo: NetworkTopology = buildTopology(board)): Circuit {
  const elements: CircuitElement[] = [];
  if (topo.neutralAdmittance && topo.neutralNode !== undefined) elements.push({ from: topo.neutralNode, to: REFERENCE, admittance: topo.neutralAdmittance });
  const sources: CircuitSource[] = topo.busNode.map((bus, k) => ({ plus: bus, minus: REFERENCE, emf: board.emf[k]!, admittance: topo.lineAdmittance }));
  const branches: CircuitBranch[] = board.loads.flatMap((load) =>
    load.branches.map((b) => ({ from: topo.terminalNode.get(b.from)!, to: topo.terminalNode.get(b.to)!, sNominal: b.sNominal, vNominal: b.vNominal, zip: b.zip })),
  );
  return { nodeNames: topo.nodeNames, elements, sources, branches, voltageBase: board.nominalLineToNeutralV };
}

/** A board compiled for repeated solves, with its topology (see `compileBoard`). */
export interface CompiledBoard {
  readonly board: Board;
  readonly topology: NetworkTopology;
  readonly network: CompiledNetwork;
}

/** Compiles a board once; `solveCompiledBoard` then solves it as often as needed. */
export function compileBoard(board: Board): CompiledBoard {
  const topology = buildTopology(board);
  return { board, topology, network: compileCircuit(boardCircuit(board, topology)) };
}

/**
 * Solves a compiled board and reads the solution in the board's terms.
 * @throws {NumericalError} when the network is singular or the load iteration does not settle.
 */
export function solveCompiledBoard(compiled: CompiledBoard, options?: SolveOptions): NetworkSolution {
  const opts = resolveSolveOptions(options);
  const { board, topology: topo, network: net } = compiled;
  net.solve(opts);
  const nodeVoltages = Array.from({ length: net.nodeCount }, (_, v): ComplexValue | null => (net.live[v] ? { re: net.voltageRe[v]!, im: net.voltageIm[v]! } : null));
  // Folded source terminals sit at their EMF.
  if (topo.lineAdmittance) topo.sourceNode.forEach((s, k) => (nodeVoltages[s] = board.emf[k]!));
  let k = 0;
  const branches = board.loads.map((l) =>
    l.branches.map((): BranchState => {
      const admittance = { re: net.admittanceRe[k]!, im: net.admittanceIm[k]! };
      const active = net.isBranchActive(k);
      const voltage = { re: net.branchVoltageRe(k), im: net.branchVoltageIm(k) };
      k++;
      if (!active) return { voltage: ZERO, current: ZERO, admittance, energised: false };
      return { voltage, current: mul(admittance, voltage), admittance, energised: true };
    }),
  );
  const lineCurrents = net.sourceCurrents();
  let neutralCurrent: ComplexValue | null = null;
  if (board.hasNeutral) {
    if (board.neutralOpen) neutralCurrent = ZERO;
    else if (topo.neutralAdmittance) neutralCurrent = mul(topo.neutralAdmittance, voltageOf(nodeVoltages, topo.neutralNode!) ?? ZERO);
    else {
      // Solid neutral: the bar's current is what the load branches bring to it.
      let total = ZERO;
      board.loads.forEach((l, li) =>
        l.branches.forEach((b, bi) => {
          const i = branches[li]![bi]!.current;
          if (b.to === 'N') total = add(total, i);
          if (b.from === 'N') total = sub(total, i);
        }),
      );
      neutralCurrent = total;
    }
  }
  return {
    board,
    topology: topo,
    nodeVoltages,
    lineCurrents,
    neutralCurrent,
    branches,
    iterations: net.iterations,
    lastChange: net.lastChange,
    lowVoltageThreshold: opts.lowVoltageThreshold,
  };
}

const voltageOf = (voltages: readonly (ComplexValue | null)[], node: number): ComplexValue | null =>
  node === REFERENCE ? ZERO : voltages[node]!;

/**
 * Solves a board: every node voltage, line, neutral and branch current.
 * Compiles the board each call; to solve one board many times, `compileBoard` once
 * and call `solveCompiledBoard`.
 * @throws {NumericalError} when the network is singular or the load iteration does not settle.
 */
export function solveNetwork(board: Board, options?: SolveOptions): NetworkSolution {
  resolveSolveOptions(options);
  return solveCompiledBoard(compileBoard(board), options);
}

/** Voltage of a terminal in a solution (null when it is connected to nothing). */
export function terminalVoltage(solution: NetworkSolution, terminal: Terminal): ComplexValue | null {
  const node = solution.topology.terminalNode.get(terminal);
  if (node === undefined) return null;
  return voltageOf(solution.nodeVoltages, node);
}
