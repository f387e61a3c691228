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
 * those an ideal EMF fixes (the board's circuit, as `solveNetwork` builds it); the residual is Kirchhoff's current law at each node. The
 * Jacobian is real (|V| in a load's admittance is not complex-differentiable).
 */
import { abs, add, mul, scale, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, LoadBranch } from '../board/boardModel.js';
import { REFERENCE, type Circuit } from './circuit.js';
import { buildInstallationCircuit, type InstallationCircuit } from './installationCircuit.js';
import { installationOf } from './installationModel.js';
import { readInstallationSolution, type NetworkSolution } from './solveNetwork.js';
import { assertBoardModel } from '../board/modelGuards.js';

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

/**
 * Current each source delivers out of its plus terminal at the given voltages: a source
 * behind an admittance from its own equation, an ideal one by KCL at the node it fixes
 * (the ones fixed last hang from the earlier ones, so they are settled first).
 */
function sourceCurrentsAt(circuit: Circuit, voltages: readonly (ComplexValue | null)[], admittances: readonly ComplexValue[]): ComplexValue[] {
  const at = (node: number) => (node === REFERENCE ? ZERO : (voltages[node] ?? ZERO));
  const live = (node: number) => node === REFERENCE || voltages[node] !== null;
  const out = new Map<number, ComplexValue>();
  const leave = (node: number, i: ComplexValue) => out.set(node, add(out.get(node) ?? ZERO, i));
  for (const e of circuit.elements) {
    if (!live(e.from) || !live(e.to)) continue;
    const i = mul(e.admittance, sub(at(e.from), at(e.to)));
    leave(e.from, i);
    leave(e.to, scale(i, -1));
  }
  circuit.branches.forEach((b, k) => {
    if (!live(b.from) || !live(b.to)) return;
    const i = mul(admittances[k]!, sub(at(b.from), at(b.to)));
    leave(b.from, i);
    leave(b.to, scale(i, -1));
  });
  const currents = new Array<ComplexValue>(circuit.sources.length);
  circuit.sources.forEach((s, k) => {
    if (!s.admittance) return;
    const i = mul(s.admittance, sub(s.emf, sub(at(s.plus), at(s.minus))));
    currents[k] = i;
    leave(s.plus, scale(i, -1));
    leave(s.minus, i);
  });
  for (let k = circuit.sources.length - 1; k >= 0; k--) {
    const s = circuit.sources[k]!;
    if (s.admittance) continue;
    const i = out.get(s.plus) ?? ZERO;
    currents[k] = i;
    leave(s.minus, i);
  }
  return currents;
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

/** Newton's settings with their defaults filled in. */
export interface NewtonSettings {
  readonly tolerance: number;
  readonly maxIterations: number;
  readonly threshold: number;
  readonly maxUpdate: number;
}

export function newtonSettings(options: NewtonOptions): NewtonSettings {
  return { tolerance: options.tolerance ?? 1e-10, maxIterations: options.maxIterations ?? 40, threshold: options.lowVoltageThreshold ?? 0.7, maxUpdate: options.maxUpdate ?? 0.25 };
}

/** Where Newton's iteration ended: the node voltages it settled on, or the iteration it gave up at. */
export type NewtonVoltages =
  | { readonly converged: true; readonly voltages: (ComplexValue | null)[]; readonly iterations: number; readonly lastChange: number }
  | { readonly converged: false; readonly iterations: number };

/**
 * One element's admittance in place of the circuit's (null: the element left out), so that circuits
 * differing only there share one build: the fault in series with a neutral (neutralFaultNewton.ts).
 */
export interface ReplacedElement {
  readonly element: number;
  readonly admittance: ComplexValue | null;
}

/**
 * Newton's iteration on a built circuit (see `solveNetworkByNewton`), from `start`, to node voltages.
 * The voltages, the Jacobian and the residual live on typed arrays, and each stamp is written out
 * with complex.ts's arithmetic in its order (`branchStamp` for the load branches): the same bits as
 * the object-based loop this replaced, without a heap object per product. A neutral-break study
 * runs this some 300 times per board, each `trivar solve` of a board with line-to-neutral loads.
 */
export function newtonVoltages(circuit: Circuit, vBase: number, start: readonly (ComplexValue | null)[], settings: NewtonSettings, replaced: ReplacedElement | null = null): NewtonVoltages {
  const { tolerance, maxIterations, threshold, maxUpdate } = settings;
  if (start.length !== circuit.nodeNames.length) throw new RangeError(`solveNetworkByNewton: the start has ${start.length} node voltages, the board's circuit ${circuit.nodeNames.length}`);
  const nodes = start.length;
  const vr = new Float64Array(nodes);
  const vi = new Float64Array(nodes);
  const live = new Uint8Array(nodes);
  start.forEach((v, node) => {
    if (!v) return;
    vr[node] = v.re;
    vi[node] = v.im;
    live[node] = 1;
  });
  const fixed = new Uint8Array(nodes);
  for (const src of circuit.sources) {
    if (src.admittance) continue;
    fixed[src.plus] = 1;
    const minusLive = src.minus !== REFERENCE && live[src.minus] === 1;
    // add(ZERO or V(minus), emf)
    vr[src.plus] = (minusLive ? vr[src.minus]! : 0) + src.emf.re;
    vi[src.plus] = (minusLive ? vi[src.minus]! : 0) + src.emf.im;
    live[src.plus] = 1;
  }
  const index = new Int32Array(nodes).fill(-1);
  let n = 0;
  for (let node = 0; node < nodes; node++) if (live[node] && !fixed[node]) index[node] = n++;
  const isLive = (node: number) => node === REFERENCE || live[node] === 1;
  // A dead node reads as zero, as `voltages[node] ?? ZERO` did.
  const re = (node: number) => (node === REFERENCE ? 0 : vr[node]!);
  const im = (node: number) => (node === REFERENCE ? 0 : vi[node]!);
  const slot = (node: number) => (node === REFERENCE ? -1 : index[node]!);
  const size = 2 * n;
  const jac = new Float64Array(size * size);
  const residual = new Float64Array(size);
  // Current (cr, ci) leaves p and enters q; its derivatives (dx, dy) are with respect to V(p) − V(q).
  const stamp = (p: number, q: number, cr: number, ci: number, dxr: number, dxi: number, dyr: number, dyi: number) => {
    const rp = slot(p);
    const rq = slot(q);
    for (let side = 0; side < 2; side++) {
      const row = side === 0 ? rp : rq;
      if (row < 0) continue;
      const sign = side === 0 ? 1 : -1;
      residual[2 * row]! += sign * cr;
      residual[2 * row + 1]! += sign * ci;
      for (let other = 0; other < 2; other++) {
        const col = other === 0 ? rp : rq;
        if (col < 0) continue;
        const k = other === 0 ? sign : -sign;
        const at = 2 * row * size + 2 * col;
        jac[at]! += k * dxr;
        jac[at + size]! += k * dxi;
        jac[at + 1]! += k * dyr;
        jac[at + size + 1]! += k * dyi;
      }
    }
  };
  // mul(y, d) with d = V(p) − V(q) (− emf for a source); dx = y, dy = j·y.
  const stampLinear = (p: number, q: number, yr: number, yi: number, dr: number, di: number) => stamp(p, q, yr * dr - yi * di, yr * di + yi * dr, yr, yi, -yi, yr);
  const load = new Float64Array(BRANCH_STAMP);
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    jac.fill(0);
    residual.fill(0);
    const elements = circuit.elements;
    for (let k = 0; k < elements.length; k++) {
      const e = elements[k]!;
      const y = replaced !== null && k === replaced.element ? replaced.admittance : e.admittance;
      if (y !== null && isLive(e.from) && isLive(e.to)) stampLinear(e.from, e.to, y.re, y.im, re(e.from) - re(e.to), im(e.from) - im(e.to));
    }
    // A source behind an admittance draws y·(V+ − V− − E) out of its plus terminal.
    for (const src of circuit.sources) {
      if (!src.admittance || !isLive(src.plus) || !isLive(src.minus)) continue;
      const y = src.admittance;
      stampLinear(src.plus, src.minus, y.re, y.im, re(src.plus) - re(src.minus) - src.emf.re, im(src.plus) - im(src.minus) - src.emf.im);
    }
    for (const b of circuit.branches) {
      if (abs(b.sNominal) === 0 || !isLive(b.from) || !isLive(b.to)) continue;
      branchStamp(b, re(b.from) - re(b.to), im(b.from) - im(b.to), threshold, load);
      stamp(b.from, b.to, load[0]!, load[1]!, load[2]!, load[3]!, load[4]!, load[5]!);
    }
    for (let k = 0; k < size; k++) residual[k] = -residual[k]!;
    const step = solveReal(jac, residual, size);
    if (!step) return { converged: false, iterations: iteration };
    let largest = 0;
    for (let k = 0; k < n; k++) largest = Math.max(largest, Math.hypot(step[2 * k]!, step[2 * k + 1]!) / vBase);
    const shorten = largest > maxUpdate ? maxUpdate / largest : 1;
    for (let node = 0; node < nodes; node++) {
      const k = index[node]!;
      if (k < 0) continue;
      // add(v, scale(step, shorten))
      vr[node] = vr[node]! + step[2 * k]! * shorten;
      vi[node] = vi[node]! + step[2 * k + 1]! * shorten;
    }
    if (largest <= tolerance) {
      const voltages = Array.from({ length: nodes }, (_, node): ComplexValue | null => (live[node] ? { re: vr[node]!, im: vi[node]! } : null));
      return { converged: true, voltages, iterations: iteration, lastChange: largest };
    }
  }
  return { converged: false, iterations: maxIterations };
}

/** Entries `branchStamp` writes: current (re, im), ∂I/∂x (re, im), ∂I/∂y (re, im), admittance (re, im). */
const BRANCH_STAMP = 8;

/**
 * A load branch's current, its derivatives with respect to the real and imaginary parts of the branch
 * voltage (vre, vim), and the admittance it has there, into `out`: Y = Y0·f(|V|) with Y0 = conj(S)/V0²,
 * ∂I/∂x = Y0·(f + f'·(x/m)·V), ∂I/∂y = Y0·(j·f + f'·(y/m)·V), each product in complex.ts's order.
 */
function branchStamp(branch: Pick<LoadBranch, 'sNominal' | 'vNominal' | 'zip'>, vre: number, vim: number, threshold: number, out: Float64Array): void {
  const v0 = branch.vNominal;
  const m = Math.hypot(vre, vim);
  const held = m <= threshold * v0;
  const mc = held ? threshold * v0 : m;
  const { z, i, p } = branch.zip;
  const f = z + (i * v0) / mc + (p * v0 * v0) / (mc * mc);
  const df = held || m === 0 ? 0 : (-i * v0) / (m * m) - (2 * p * v0 * v0) / (m * m * m);
  const k0 = 1 / (v0 * v0);
  const y0r = branch.sNominal.re * k0;
  const y0i = -branch.sNominal.im * k0;
  const ar = y0r * f;
  const ai = y0i * f;
  out[6] = ar;
  out[7] = ai;
  out[0] = ar * vre - ai * vim;
  out[1] = ar * vim + ai * vre;
  const sx = m === 0 ? 0 : (df * vre) / m;
  const wxr = f + vre * sx;
  const wxi = 0 + vim * sx;
  out[2] = y0r * wxr - y0i * wxi;
  out[3] = y0r * wxi + y0i * wxr;
  const sy = m === 0 ? 0 : (df * vim) / m;
  const wyr = 0 + vre * sy;
  const wyi = f + vim * sy;
  out[4] = y0r * wyr - y0i * wyi;
  out[5] = y0r * wyi + y0i * wyr;
}

/** The board's solution at node voltages Newton settled on: branch admittances and source currents at those voltages, read as `solveNetwork` reads its own. */
export function newtonSolution(
  board: Board,
  settled: { readonly voltages: readonly (ComplexValue | null)[]; readonly iterations: number; readonly lastChange: number },
  threshold: number,
  built?: InstallationCircuit,
): NetworkSolution {
  const { installation, boardIndex } = installationOf(board);
  const layout = built ?? buildInstallationCircuit(installation);
  const circuit = layout.circuit;
  const voltages = settled.voltages;
  const at = (node: number) => (node === REFERENCE ? ZERO : (voltages[node] ?? ZERO));
  const live = (node: number) => node === REFERENCE || voltages[node] !== null;
  const load = new Float64Array(BRANCH_STAMP);
  const admittances = circuit.branches.map((b): ComplexValue => {
    if (abs(b.sNominal) === 0 || !live(b.from) || !live(b.to)) return ZERO;
    const v = sub(at(b.from), at(b.to));
    branchStamp(b, v.re, v.im, threshold, load);
    return { re: load[6]!, im: load[7]! };
  });
  const state = { nodeVoltages: voltages, admittances, sourceCurrents: sourceCurrentsAt(circuit, voltages, admittances), iterations: settled.iterations, lastChange: settled.lastChange, lowVoltageThreshold: threshold };
  return { ...readInstallationSolution(installation, layout, state).boards[boardIndex]!, board };
}

/**
 * Solves `board` by Newton's method from `start` (node voltages in the node
 * order of the board's circuit, null for a dead node — e.g. a
 * `NetworkSolution.nodeVoltages` of a board with the same nodes).
 * Returns `converged: false` rather than throwing: a search that finds no state
 * near its start is an answer for the callers (a fold, where a state ceases to exist).
 */
export function solveNetworkByNewton(board: Board, start: readonly (ComplexValue | null)[], options: NewtonOptions = {}): NewtonOutcome {
  assertBoardModel(board);
  const settings = newtonSettings(options);
  const layout = buildInstallationCircuit(installationOf(board).installation);
  const out = newtonVoltages(layout.circuit, board.nominalLineToNeutralV, start, settings);
  return out.converged ? { converged: true, solution: newtonSolution(board, out, settings.threshold, layout) } : { converged: false, iterations: out.iterations };
}
