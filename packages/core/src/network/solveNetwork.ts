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
import { add, conj, mul, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, Installation, Terminal } from '../board/boardModel.js';
import { REFERENCE, type NetworkTopology } from './networkTopology.js';
import { buildInstallationCircuit, type InstallationCircuit } from './installationCircuit.js';
import { boardOfInstallation, installationOf } from './installationModel.js';
import { resolveSolveOptions, SOLVE_OPTION_KEYS, type SolveOptions } from './solveOptions.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';
import { compileCircuit, type CompiledNetwork } from './compiledNetwork.js';
import { assertBoardModel, assertInstallationModel } from '../board/modelGuards.js';

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
  /**
   * For a board of an installation: the power its feeder takes at the sending end
   * (the feeding board's bus), VA, which includes the boards it feeds in turn.
   * Absent for a main board, whose supply is its source EMFs.
   */
  readonly suppliedPower?: ComplexValue;
}

export interface BranchState {
  readonly voltage: ComplexValue;
  readonly current: ComplexValue;
  readonly admittance: ComplexValue;
  /** False when a terminal is connected to nothing else, so the branch carries no current. */
  readonly energised: boolean;
}

/** An installation compiled once for repeated solves (see `compileInstallation`). */
export interface CompiledInstallation {
  readonly installation: Installation;
  readonly layout: InstallationCircuit;
  readonly network: CompiledNetwork;
}

/** Compiles an installation (or a single board's one-board installation) once. */
export function compileInstallation(installation: Installation): CompiledInstallation {
  assertInstallationModel(installation);
  const layout = buildInstallationCircuit(installation);
  return { installation, layout, network: compileCircuit(layout.circuit) };
}

/** Per board of a solved installation: the board's solution, read as a single board's is. */
export interface InstallationSolution {
  readonly installation: Installation;
  /** Index = board number (0 = main board, i + 1 = `subBoards[i]`). */
  readonly boards: readonly NetworkSolution[];
}

/** A board compiled for repeated solves, with its topology (see `compileBoard`). */
export interface CompiledBoard {
  readonly board: Board;
  readonly boardIndex: number;
  readonly topology: NetworkTopology;
  readonly installation: CompiledInstallation;
  /** The compiled circuit: `network.solve()` is the allocation-free hot path. */
  readonly network: CompiledNetwork;
}

/**
 * Compiles a board once; `solveCompiledBoard` then solves it as often as needed.
 * A board of an installation compiles the whole installation.
 * @param compile how the installation is compiled, e.g. through a CompiledNetworkCache
 */
export function compileBoard(board: Board, compile: (installation: Installation) => CompiledInstallation = compileInstallation): CompiledBoard {
  assertBoardModel(board);
  const { installation, boardIndex } = installationOf(board);
  const compiled = compile(installation);
  return { board, boardIndex, topology: compiled.layout.topologies[boardIndex]!, installation: compiled, network: compiled.network };
}

/**
 * Solves a compiled board and reads the solution in the board's terms.
 * @throws {NumericalError} when the network is singular or the load iteration does not settle.
 */
export function solveCompiledBoard(compiled: CompiledBoard, options?: SolveOptions): NetworkSolution {
  const solution = solveCompiledInstallation(compiled.installation, options);
  return { ...solution.boards[compiled.boardIndex]!, board: compiled.board };
}

/**
 * Solves a compiled installation: every board's node voltages, feeder and
 * neutral currents and load branches.
 * @throws {NumericalError} when the network is singular or the load iteration does not settle.
 */
export function solveCompiledInstallation(compiled: CompiledInstallation, options?: SolveOptions): InstallationSolution {
  const opts = resolveSolveOptions(options);
  const { installation, layout, network: net } = compiled;
  net.solve(opts);
  const nodeVoltages = Array.from({ length: net.nodeCount }, (_, v): ComplexValue | null => (net.live[v] ? { re: net.voltageRe[v]!, im: net.voltageIm[v]! } : null));
  const admittances = Array.from({ length: net.branchCount }, (_, k): ComplexValue => ({ re: net.admittanceRe[k]!, im: net.admittanceIm[k]! }));
  const sourceCurrents = net.sourceCurrents();
  return readInstallationSolution(installation, layout, { nodeVoltages, admittances, sourceCurrents, iterations: net.iterations, lastChange: net.lastChange, lowVoltageThreshold: opts.lowVoltageThreshold });
}

/** A solved state of an installation's circuit, however it was reached (fixed point, Newton). */
export interface CircuitState {
  /** Per circuit node; null for a dead node. */
  readonly nodeVoltages: readonly (ComplexValue | null)[];
  /** Per circuit branch, the admittance it had at the solution. */
  readonly admittances: readonly ComplexValue[];
  /** Per circuit source, the current it delivers out of its plus terminal. */
  readonly sourceCurrents: readonly ComplexValue[];
  readonly iterations: number;
  readonly lastChange: number;
  readonly lowVoltageThreshold: number;
  /**
   * Per circuit branch, an ideal current source beside it (from → to), A, counted in the
   * branch's current: a non-linear load at a harmonic order. Absent or null for none.
   */
  readonly branchSources?: readonly (ComplexValue | null)[];
}

const loadsOf = (installation: Installation, b: number) => (b === 0 ? installation.main.loads : installation.subBoards[b - 1]!.loads);

/**
 * Every load branch of a solved circuit state, per board, per load: voltage, current, admittance
 * (the part of `readInstallationSolution` a harmonic order starts from).
 */
export function readBranchStates(installation: Installation, layout: InstallationCircuit, state: Pick<CircuitState, 'nodeVoltages' | 'admittances' | 'branchSources'>): BranchState[][][] {
  const { nodeVoltages } = state;
  const live = (node: number) => node === REFERENCE || nodeVoltages[node] !== null;
  const at = (node: number): ComplexValue => (node === REFERENCE ? ZERO : (nodeVoltages[node] ?? ZERO));
  const count = installation.subBoards.length + 1;
  const branchStates: BranchState[][][] = [];
  for (let b = 0; b < count; b++) {
    let k = layout.branchOffset[b]!;
    branchStates.push(
      loadsOf(installation, b).map((l) =>
        l.branches.map((): BranchState => {
          const admittance = state.admittances[k]!;
          const cb = layout.circuit.branches[k]!;
          k++;
          if (!live(cb.from) || !live(cb.to)) return { voltage: ZERO, current: ZERO, admittance, energised: false };
          const voltage = sub(at(cb.from), at(cb.to));
          const source = state.branchSources?.[k - 1];
          const current = mul(admittance, voltage);
          return { voltage, current: source ? add(current, source) : current, admittance, energised: true };
        }),
      ),
    );
  }
  return branchStates;
}

/** Reads a solved circuit state board by board: line, neutral and branch currents in each board's terms. */
export function readInstallationSolution(installation: Installation, layout: InstallationCircuit, state: CircuitState): InstallationSolution {
  const { nodeVoltages } = state;
  const at = (node: number): ComplexValue => (node === REFERENCE ? ZERO : (nodeVoltages[node] ?? ZERO));
  const count = installation.subBoards.length + 1;
  const branchStates = readBranchStates(installation, layout, state);
  const sourceCurrents = state.sourceCurrents;
  const phases = installation.main.phases;
  const hasNeutral = installation.main.hasNeutral;
  const lineCurrents: ComplexValue[][] = new Array(count);
  const neutralCurrents: (ComplexValue | null)[] = new Array(count).fill(null);
  const elementCurrent = (e: number) => {
    const el = layout.circuit.elements[e]!;
    return mul(el.admittance, sub(at(el.from), at(el.to)));
  };
  // Children first: where a conductor has no impedance its current is found by KCL at the board.
  for (let o = layout.order.length - 1; o >= 0; o--) {
    const b = layout.order[o]!;
    const own = (terminal: Terminal) => {
      let total = ZERO;
      loadsOf(installation, b).forEach((l, li) =>
        l.branches.forEach((br, bi) => {
          const i = branchStates[b]![li]![bi]!.current;
          if (br.from === terminal) total = add(total, i);
          if (br.to === terminal) total = sub(total, i);
        }),
      );
      return total;
    };
    const downstream = (pick: (c: number) => ComplexValue) => layout.children[b]!.reduce((t, c) => add(t, pick(c)), ZERO);
    const feeder = layout.feederElements[b];
    lineCurrents[b] = phases.map((phase, k) => {
      if (b === 0) return sourceCurrents[layout.mainSources[k]!]!;
      const e = feeder!.lines[k];
      return e !== null && e !== undefined ? elementCurrent(e) : add(own(phase), downstream((c) => lineCurrents[c]![k]!));
    });
    if (!hasNeutral) continue;
    const open = b === 0 ? installation.main.neutralOpen : installation.subBoards[b - 1]!.feeder.neutralOpen;
    const topo = layout.topologies[b]!;
    if (open) neutralCurrents[b] = ZERO;
    else if (b === 0 && topo.neutralAdmittance) neutralCurrents[b] = mul(topo.neutralAdmittance, at(topo.neutralNode!));
    else if (b > 0 && feeder!.neutral !== null) neutralCurrents[b] = elementCurrent(feeder!.neutral);
    else neutralCurrents[b] = sub(downstream((c) => neutralCurrents[c]!), own('N'));
  }
  const boards = Array.from({ length: count }, (_, b): NetworkSolution => {
    const topo = layout.topologies[b]!;
    const base = {
      board: boardOfInstallation(installation, b),
      topology: topo,
      nodeVoltages,
      lineCurrents: lineCurrents[b]!,
      // A board no neutral reaches has none to read (its bar is the parent's, carrying nothing from it).
      neutralCurrent: b > 0 && installation.subBoards[b - 1]!.feeder.withoutNeutral ? null : neutralCurrents[b]!,
      branches: branchStates[b]!,
      iterations: state.iterations,
      lastChange: state.lastChange,
      lowVoltageThreshold: state.lowVoltageThreshold,
    };
    if (b === 0) return base;
    const parent = layout.topologies[installation.subBoards[b - 1]!.fedFrom]!;
    let supplied = ZERO;
    phases.forEach((_, k) => (supplied = add(supplied, mul(at(parent.busNode[k]!), conj(lineCurrents[b]![k]!)))));
    if (hasNeutral && neutralCurrents[b]) supplied = sub(supplied, mul(at(parent.neutralNode!), conj(neutralCurrents[b]!)));
    return { ...base, suppliedPower: supplied };
  });
  return { installation, boards };
}

/** Solves an installation once (compiles it first). */
export function solveInstallationNetwork(installation: Installation, options?: SolveOptions): InstallationSolution {
  assertInstallationModel(installation);
  checkOptionKeys(options as unknown, 'options', SOLVE_OPTION_KEYS);
  resolveSolveOptions(options);
  return solveCompiledInstallation(compileInstallation(installation), options);
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
  assertBoardModel(board);
  checkOptionKeys(options as unknown, 'options', SOLVE_OPTION_KEYS);
  resolveSolveOptions(options);
  return solveCompiledBoard(compileBoard(board), options);
}

/** Voltage of a terminal in a solution (null when it is connected to nothing). */
export function terminalVoltage(solution: Pick<NetworkSolution, 'topology' | 'nodeVoltages'>, terminal: Terminal): ComplexValue | null {
  const node = solution.topology.terminalNode.get(terminal);
  if (node === undefined) return null;
  return voltageOf(solution.nodeVoltages, node);
}
