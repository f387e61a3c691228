/**
 * Newton–Raphson solve of a board from a given starting state.
 *
 * `solveNetwork`'s fixed-point iteration (re-solve with each load's admittance
 * at the last voltage) only settles on states where a load's power demand does
 * not feed back on itself. Constant-power loads in series — the line-to-neutral
 * loads of a board whose neutral is broken or very resistive — form states it
 * runs away from, although they satisfy the circuit equations exactly. Newton's
 * method converges to a state near its start whatever its stability under that
 * iteration, which is what following a state along a changing parameter needs.
 *
 * Unknowns are the real and imaginary parts of every live node voltage except
 * the EMF terminals; the residual is Kirchhoff's current law at each node. The
 * Jacobian is real (|V| in a load's admittance is not complex-differentiable).
 */
import { abs, add, conj, mul, scale, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, LoadBranch } from '../board/boardModel.js';
import { buildTopology, REFERENCE, type NetworkTopology } from './networkTopology.js';
import type { BranchState, NetworkSolution } from './solveNetwork.js';

export interface NewtonOptions {
  /**
   * Converged when the largest node-voltage update is below this fraction of the
   * nominal line-to-neutral voltage.
   * @defaultValue 1e-10
   */
  readonly tolerance?: number;
  /** @defaultValue 40 */
  readonly maxIterations?: number;
  /**
   * Per-unit branch voltage below which current and power parts of a load are
   * held at their threshold admittance (as in `solveNetwork`).
   * @defaultValue 0.7
   */
  readonly lowVoltageThreshold?: number;
  /**
   * Largest voltage change allowed in one update, fraction of nominal; a longer
   * update is shortened. Keeps the search near its start.
   * @defaultValue 0.25
   */
  readonly maxUpdate?: number;
}

export type NewtonOutcome =
  | { readonly converged: true; readonly solution: NetworkSolution }
  | { readonly converged: false; readonly iterations: number };

/** Branch current and its derivatives with respect to the real and imaginary parts of the branch voltage. */
function branchCurrent(branch: LoadBranch, v: ComplexValue, threshold: number) {
  const v0 = branch.vNominal;
  const m = abs(v);
  const held = m <= threshold * v0;
  const mc = held ? threshold * v0 : m;
  const { z, i, p } = branch.zip;
  const f = z + (i * v0) / mc + (p * v0 * v0) / (mc * mc);
  const df = held || m === 0 ? 0 : (-i * v0) / (m * m) - (2 * p * v0 * v0) / (m * m * m);
  const y0 = scale(conj(branch.sNominal), 1 / (v0 * v0));
  const admittance = scale(y0, f);
  const current = mul(admittance, v);
  // ∂I/∂x = Y0·(f + f'·(x/m)·V), ∂I/∂y = Y0·(j·f + f'·(y/m)·V).
  const dx = mul(y0, add({ re: f, im: 0 }, scale(v, m === 0 ? 0 : (df * v.re) / m)));
  const dy = mul(y0, add({ re: 0, im: f }, scale(v, m === 0 ? 0 : (df * v.im) / m)));
  return { current, admittance, dx, dy };
}

/** Branch, line and neutral currents from solved node voltages, in `solveNetwork`'s result shape. */
function assembleSolution(
  board: Board,
  topology: NetworkTopology,
  nodeVoltages: readonly (ComplexValue | null)[],
  threshold: number,
  iterations: number,
  lastChange: number,
): NetworkSolution {
  const at = (node: number) => (node === REFERENCE ? ZERO : nodeVoltages[node]);
  const branches = board.loads.map((load) =>
    load.branches.map((b): BranchState => {
      const vf = at(topology.terminalNode.get(b.from)!);
      const vt = at(topology.terminalNode.get(b.to)!);
      if (!vf || !vt || abs(b.sNominal) === 0) {
        const voltage = vf && vt ? sub(vf, vt) : ZERO;
        return { voltage, current: ZERO, admittance: ZERO, energised: Boolean(vf && vt) };
      }
      const voltage = sub(vf, vt);
      const { current, admittance } = branchCurrent(b, voltage, threshold);
      return { voltage, current, admittance, energised: true };
    }),
  );
  const lineCurrents = topology.sourceNode.map((s, k) => {
    if (topology.lineAdmittance) return mul(topology.lineAdmittance, sub(nodeVoltages[s]!, nodeVoltages[topology.busNode[k]!]!));
    // No line impedance: the line carries what the loads draw from the bus.
    let total = ZERO;
    const phase = board.phases[k]!;
    board.loads.forEach((l, li) =>
      l.branches.forEach((b, bi) => {
        if (b.from === phase) total = add(total, branches[li]![bi]!.current);
        if (b.to === phase) total = sub(total, branches[li]![bi]!.current);
      }),
    );
    return total;
  });
  let neutralCurrent: ComplexValue | null = null;
  if (board.hasNeutral) {
    neutralCurrent = ZERO;
    if (topology.neutralAdmittance && topology.neutralNode !== undefined)
      neutralCurrent = mul(topology.neutralAdmittance, at(topology.neutralNode) ?? ZERO);
    else if (!board.neutralOpen)
      board.loads.forEach((l, li) =>
        l.branches.forEach((b, bi) => {
          if (b.to === 'N') neutralCurrent = add(neutralCurrent!, branches[li]![bi]!.current);
          if (b.from === 'N') neutralCurrent = sub(neutralCurrent!, branches[li]![bi]!.current);
        }),
      );
  }
  return { board, topology, nodeVoltages, lineCurrents, neutralCurrent, branches, iterations, lastChange, lowVoltageThreshold: threshold };
}

/**
 * Dense real solve with partial pivoting, in place on a row-major `a` (n × n) and `b`.
 * The system is a few dozen unknowns; the project's LU (`_internal/complexLu.ts`)
 * is complex-only, and this Jacobian is not complex-analytic.
 */
function solveReal(a: Float64Array, b: Float64Array, n: number): Float64Array | null {
  let scaleOf = 1e-300;
  for (let k = 0; k < a.length; k++) scaleOf = Math.max(scaleOf, Math.abs(a[k]!));
  for (let c = 0; c < n; c++) {
    let pivot = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r * n + c]!) > Math.abs(a[pivot * n + c]!)) pivot = r;
    if (!(Math.abs(a[pivot * n + c]!) > 1e-13 * scaleOf)) return null;
    if (pivot !== c) {
      for (let j = 0; j < n; j++) [a[c * n + j], a[pivot * n + j]] = [a[pivot * n + j]!, a[c * n + j]!];
      [b[c], b[pivot]] = [b[pivot]!, b[c]!];
    }
    const d = a[c * n + c]!;
    for (let r = c + 1; r < n; r++) {
      const k = a[r * n + c]! / d;
      if (k === 0) continue;
      for (let j = c; j < n; j++) a[r * n + j]! -= k * a[c * n + j]!;
      b[r]! -= k * b[c]!;
    }
  }
  const x = new Float64Array(n);
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r]!;
    for (let j = r + 1; j < n; j++) s -= a[r * n + j]! * x[j]!;
    x[r] = s / a[r * n + r]!;
  }
  return x.every(Number.isFinite) ? x : null;
}

/**
 * Solves `board` by Newton's method from `start` (node voltages in the node
 * order of `buildTopology(board)`, null for a dead node — e.g. a
 * `NetworkSolution.nodeVoltages` of a board with the same nodes).
 * Returns `converged: false` rather than throwing: a search that finds no state
 * near its start is an answer for the callers (a fold, where a state ceases to exist).
 */
export function solveNetworkByNewton(board: Board, start: readonly (ComplexValue | null)[], options: NewtonOptions = {}): NewtonOutcome {
  const tolerance = options.tolerance ?? 1e-10;
  const maxIterations = options.maxIterations ?? 40;
  const threshold = options.lowVoltageThreshold ?? 0.7;
  const maxUpdate = options.maxUpdate ?? 0.25;
  const topo = buildTopology(board);
  const vBase = board.nominalLineToNeutralV;
  const voltages = start.map((v) => v);
  const fixed = new Set<number>();
  topo.sourceNode.forEach((s, k) => {
    fixed.add(s);
    voltages[s] = board.emf[k]!;
  });
  const index = new Array<number>(voltages.length).fill(-1);
  let n = 0;
  voltages.forEach((v, node) => {
    if (v && !fixed.has(node)) index[node] = n++;
  });
  const at = (node: number) => (node === REFERENCE ? ZERO : (voltages[node] ?? ZERO));
  const live = (node: number) => node === REFERENCE || voltages[node] !== null;
  const size = 2 * n;
  // Rows/columns of a node (−1: reference or fixed EMF terminal, not an unknown).
  const slot = (node: number) => (node === REFERENCE ? -1 : index[node]!);
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    const jac = new Float64Array(size * size);
    const residual = new Float64Array(size);
    // Current `current` leaves p and enters q; its derivatives are with respect to V(p) − V(q).
    const stamp = (p: number, q: number, current: ComplexValue, dx: ComplexValue, dy: ComplexValue) => {
      const rp = slot(p);
      const rq = slot(q);
      for (let side = 0; side < 2; side++) {
        const row = side === 0 ? rp : rq;
        if (row < 0) continue;
        const sign = side === 0 ? 1 : -1;
        residual[2 * row]! += sign * current.re;
        residual[2 * row + 1]! += sign * current.im;
        for (let other = 0; other < 2; other++) {
          const col = other === 0 ? rp : rq;
          if (col < 0) continue;
          const k = other === 0 ? sign : -sign;
          const at = 2 * row * size + 2 * col;
          jac[at]! += k * dx.re;
          jac[at + size]! += k * dx.im;
          jac[at + 1]! += k * dy.re;
          jac[at + size + 1]! += k * dy.im;
        }
      }
    };
    const stampLinear = (p: number, q: number, y: ComplexValue) =>
      stamp(p, q, mul(y, sub(at(p), at(q))), y, { re: -y.im, im: y.re });
    if (topo.lineAdmittance) topo.sourceNode.forEach((s, k) => stampLinear(s, topo.busNode[k]!, topo.lineAdmittance!));
    if (topo.neutralAdmittance && topo.neutralNode !== undefined) stampLinear(topo.neutralNode, REFERENCE, topo.neutralAdmittance);
    for (const load of board.loads)
      for (const b of load.branches) {
        const p = topo.terminalNode.get(b.from)!;
        const q = topo.terminalNode.get(b.to)!;
        if (abs(b.sNominal) === 0 || !live(p) || !live(q)) continue;
        const { current, dx, dy } = branchCurrent(b, sub(at(p), at(q)), threshold);
        stamp(p, q, current, dx, dy);
      }
    for (let k = 0; k < size; k++) residual[k] = -residual[k]!;
    const step = solveReal(jac, residual, size);
    if (!step) return { converged: false, iterations: iteration };
    let largest = 0;
    for (let k = 0; k < n; k++) largest = Math.max(largest, Math.hypot(step[2 * k]!, step[2 * k + 1]!) / vBase);
    const shorten = largest > maxUpdate ? maxUpdate / largest : 1;
    voltages.forEach((v, node) => {
      const k = index[node]!;
      if (v && k >= 0) voltages[node] = add(v, scale({ re: step[2 * k]!, im: step[2 * k + 1]! }, shorten));
    });
    if (largest <= tolerance)
      return { converged: true, solution: assembleSolution(board, topo, voltages, threshold, iteration, largest) };
  }
  return { converged: false, iterations: maxIterations };
}
