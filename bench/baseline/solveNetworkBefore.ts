/**
 * The network solver as it was before compilation (dense MNA of {re, im} objects, rebuilt on
 * every call), kept only so bench/solver.bench.ts can measure the compiled path against it
 * in the same run. Not part of the library.
 */
/**
 * Modified nodal analysis of a board, with an outer fixed-point iteration for
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
import { abs, add, conj, mul, neg, scale, sub, ZERO, isFiniteComplex, type ComplexValue } from '../../packages/core/src/complex.js';
import { NumericalError } from '../../packages/core/src/errors.js';
import { leastDeterminedUnknown, solveComplexSystem } from '../../packages/core/src/_internal/complexLu.js';
import type { Board, LoadBranch, Terminal } from '../../packages/core/src/board/boardModel.js';
import { buildTopology, REFERENCE, type NetworkTopology } from './networkTopologyBefore.js';

export interface SolveOptions {
  /**
   * Stop when the estimated remaining error of every node voltage is below this
   * fraction of the nominal line-to-neutral voltage.
   * @defaultValue 1e-10
   */
  readonly tolerance?: number;
  /** @defaultValue 100 */
  readonly maxIterations?: number;
  /**
   * Per-unit branch voltage below which constant-current and constant-power
   * parts of a load behave as constant impedance.
   * @defaultValue 0.7
   */
  readonly lowVoltageThreshold?: number;
}

interface ResolvedSolveOptions {
  readonly tolerance: number;
  readonly maxIterations: number;
  readonly lowVoltageThreshold: number;
}

function resolveSolveOptions(options: SolveOptions = {}): ResolvedSolveOptions {
  const resolved = {
    tolerance: options.tolerance ?? 1e-10,
    maxIterations: options.maxIterations ?? 100,
    lowVoltageThreshold: options.lowVoltageThreshold ?? 0.7,
  };
  if (!(resolved.tolerance > 0 && resolved.tolerance < 0.1))
    throw new RangeError(`solveNetwork: tolerance must be in (0, 0.1) (received ${resolved.tolerance})`);
  if (!Number.isInteger(resolved.maxIterations) || resolved.maxIterations < 1)
    throw new RangeError(`solveNetwork: maxIterations must be a positive integer (received ${resolved.maxIterations})`);
  if (!(resolved.lowVoltageThreshold > 0 && resolved.lowVoltageThreshold <= 1))
    throw new RangeError(`solveNetwork: lowVoltageThreshold must be in (0, 1] (received ${resolved.lowVoltageThreshold})`);
  return resolved;
}

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

/** A voltage change (fraction of nominal) this small is round-off: the iteration has settled. */
const ROUND_OFF_CHANGE = 1e-14;

/** Admittance that draws the modelled power of `branch` at voltage magnitude `v`. */
function branchAdmittance(branch: LoadBranch, v: number, threshold: number): ComplexValue {
  const v0 = branch.vNominal;
  const ratio = v0 / Math.max(v, threshold * v0);
  const factor = branch.zip.z + branch.zip.i * ratio + branch.zip.p * ratio * ratio;
  return scale(conj(branch.sNominal), factor / (v0 * v0));
}

/** Nodes that have some path of non-zero admittance to the star point. */
function connectedNodes(board: Board, topo: NetworkTopology): boolean[] {
  const n = topo.nodeNames.length;
  const adjacency: number[][] = Array.from({ length: n + 1 }, () => []);
  const at = (node: number) => (node === REFERENCE ? n : node);
  const link = (a: number, b: number) => {
    adjacency[at(a)]!.push(at(b));
    adjacency[at(b)]!.push(at(a));
  };
  topo.sourceNode.forEach((s, k) => {
    link(REFERENCE, s);
    if (topo.lineAdmittance) link(s, topo.busNode[k]!);
  });
  if (topo.neutralAdmittance && topo.neutralNode !== undefined) link(topo.neutralNode, REFERENCE);
  for (const load of board.loads)
    for (const b of load.branches)
      if (abs(b.sNominal) > 0) link(topo.terminalNode.get(b.from)!, topo.terminalNode.get(b.to)!);
  const seen = new Array<boolean>(n + 1).fill(false);
  const stack = [n];
  seen[n] = true;
  while (stack.length) {
    for (const next of adjacency[stack.pop()!]!) {
      if (!seen[next]) {
        seen[next] = true;
        stack.push(next);
      }
    }
  }
  return seen.slice(0, n);
}

interface LinearStep {
  readonly voltages: (ComplexValue | null)[];
  readonly sourceCurrents: ComplexValue[];
}

function solveLinearStep(board: Board, topo: NetworkTopology, live: boolean[], admittances: ComplexValue[][]): LinearStep {
  // Unknowns: live nodes, then one current per EMF.
  const index = new Array<number>(live.length).fill(-1);
  let size = 0;
  live.forEach((ok, node) => {
    if (ok) index[node] = size++;
  });
  const sources = topo.sourceNode.length;
  const dim = size + sources;
  const a: ComplexValue[][] = Array.from({ length: dim }, () => new Array<ComplexValue>(dim).fill(ZERO));
  const rhs = new Array<ComplexValue>(dim).fill(ZERO);
  const stamp = (p: number, q: number, y: ComplexValue) => {
    const i = p === REFERENCE ? -1 : index[p]!;
    const j = q === REFERENCE ? -1 : index[q]!;
    if (i >= 0) a[i]![i] = add(a[i]![i]!, y);
    if (j >= 0) a[j]![j] = add(a[j]![j]!, y);
    if (i >= 0 && j >= 0) {
      a[i]![j] = sub(a[i]![j]!, y);
      a[j]![i] = sub(a[j]![i]!, y);
    }
  };
  topo.sourceNode.forEach((s, k) => {
    if (topo.lineAdmittance) stamp(s, topo.busNode[k]!, topo.lineAdmittance);
    const row = size + k;
    const col = index[s]!;
    a[col]![row] = { re: 1, im: 0 };
    a[row]![col] = { re: 1, im: 0 };
    rhs[row] = board.emf[k]!;
  });
  if (topo.neutralAdmittance && topo.neutralNode !== undefined) stamp(topo.neutralNode, REFERENCE, topo.neutralAdmittance);
  board.loads.forEach((load, l) =>
    load.branches.forEach((b, k) => {
      const p = topo.terminalNode.get(b.from)!;
      const q = topo.terminalNode.get(b.to)!;
      if ((p === REFERENCE || live[p]) && (q === REFERENCE || live[q])) stamp(p, q, admittances[l]![k]!);
    }),
  );
  const result = solveComplexSystem(a, rhs);
  if (!result.ok) {
    const node = index.indexOf(leastDeterminedUnknown(a));
    const what = node >= 0 ? topo.nodeNames[node] : 'a source terminal';
    throw new NumericalError(
      'singular',
      `the network has no unique solution: the voltage of ${what} is not fixed — the admittances meeting there cancel (series resonance of L and C) or form a loop of ideal sources`,
    );
  }
  const voltages = live.map((ok, node) => (ok ? result.x[index[node]!]! : null));
  // MNA's source unknown is the current entering the source's + terminal; the source delivers its negative.
  const sourceCurrents = topo.sourceNode.map((_, k) => neg(result.x[size + k]!));
  return { voltages, sourceCurrents };
}

const voltageOf = (voltages: readonly (ComplexValue | null)[], node: number): ComplexValue | null =>
  node === REFERENCE ? ZERO : voltages[node]!;

/**
 * Solves a board: every node voltage, line, neutral and branch current.
 * @throws {NumericalError} when the network is singular or the load iteration does not settle.
 */
export function solveNetwork(board: Board, options?: SolveOptions): NetworkSolution {
  const opts = resolveSolveOptions(options);
  const topo = buildTopology(board);
  const live = connectedNodes(board, topo);
  const linear = board.loads.every((l) => l.branches.every((b) => b.zip.z === 1));
  const vBase = board.nominalLineToNeutralV;
  let admittances = board.loads.map((l) => l.branches.map((b) => branchAdmittance(b, b.vNominal, opts.lowVoltageThreshold)));
  let step = solveLinearStep(board, topo, live, admittances);
  let iterations = 1;
  let lastChange = 0;
  let previousChange = 0;
  const branchVoltage = (s: LinearStep, b: LoadBranch) => {
    const vf = voltageOf(s.voltages, topo.terminalNode.get(b.from)!);
    const vt = voltageOf(s.voltages, topo.terminalNode.get(b.to)!);
    return vf && vt ? sub(vf, vt) : null;
  };
  if (!linear) {
    for (;;) {
      admittances = board.loads.map((l) =>
        l.branches.map((b) => branchAdmittance(b, abs(branchVoltage(step, b) ?? ZERO), opts.lowVoltageThreshold)),
      );
      const next = solveLinearStep(board, topo, live, admittances);
      iterations++;
      lastChange = 0;
      next.voltages.forEach((v, i) => {
        const old = step.voltages[i];
        if (v && old) lastChange = Math.max(lastChange, abs(sub(v, old)) / vBase);
      });
      step = next;
      if (!Number.isFinite(lastChange)) throw new NumericalError('non-finite', `the load iteration produced non-finite voltages at iteration ${iterations}`);
      // A fixed-point step that shrinks by `ratio` each time leaves an error of about
      // change·ratio/(1 − ratio): stop on that estimate, not on the step alone, so slowly
      // contracting boards are as accurate as fast ones. The floor is round-off.
      const ratio = previousChange > 0 ? lastChange / previousChange : 0;
      const settled = lastChange <= opts.tolerance * Math.max(0, 1 - ratio) || lastChange <= ROUND_OFF_CHANGE;
      previousChange = lastChange;
      if (settled) break;
      if (iterations >= opts.maxIterations)
        throw new NumericalError(
          'no-convergence',
          `the voltage-dependent loads did not settle after ${iterations} iterations (last voltage change ${(lastChange * 100).toPrecision(3)} % of nominal, tolerance ${(opts.tolerance * 100).toPrecision(3)} %): the loads may exceed what the supply can deliver`,
        );
    }
  }
  const branches = board.loads.map((l, li) =>
    l.branches.map((b, bi): BranchState => {
      const voltage = branchVoltage(step, b);
      const admittance = admittances[li]![bi]!;
      if (!voltage) return { voltage: ZERO, current: ZERO, admittance, energised: false };
      return { voltage, current: mul(admittance, voltage), admittance, energised: true };
    }),
  );
  const lineCurrents = topo.sourceNode.map((s, k) => {
    if (!topo.lineAdmittance) return step.sourceCurrents[k]!;
    return mul(topo.lineAdmittance, sub(step.voltages[s]!, step.voltages[topo.busNode[k]!]!));
  });
  let neutralCurrent: ComplexValue | null = null;
  if (board.hasNeutral) {
    if (board.neutralOpen) neutralCurrent = ZERO;
    else if (topo.neutralAdmittance) neutralCurrent = mul(topo.neutralAdmittance, voltageOf(step.voltages, topo.neutralNode!) ?? ZERO);
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
  for (const v of step.voltages)
    if (v && !isFiniteComplex(v)) throw new NumericalError('non-finite', 'the solve produced a non-finite voltage; check for extreme impedance values');
  return { board, topology: topo, nodeVoltages: step.voltages, lineCurrents, neutralCurrent, branches, iterations, lastChange, lowVoltageThreshold: opts.lowVoltageThreshold };
}

/** Voltage of a terminal in a solution (null when it is connected to nothing). */
export function terminalVoltage(solution: NetworkSolution, terminal: Terminal): ComplexValue | null {
  const node = solution.topology.terminalNode.get(terminal);
  if (node === undefined) return null;
  return voltageOf(solution.nodeVoltages, node);
}
