/**
 * Impedance seen between terminals of a board with every EMF shorted (the
 * network "looking in" from the board, as a frequency scan needs it).
 *
 * The node numbering comes from `compileBoard`, the same as every solve (each
 * source folded into its line); with the EMFs shorted a bus an ideal EMF holds
 * is the star point, so the unknowns are the board's own nodes (phase buses, neutral bar, floating star points).
 * That leaves a handful of unknowns, so the matrix lives in two flat typed
 * arrays and is inverted in place: a scan evaluates it hundreds of thousands
 * of times, and the general solve's object arithmetic would dominate (see
 * bench/harmonic-scan.mjs). `solveFixedNetwork` with a 1 A source between the
 * two terminals gives the same numbers (test/harmonics checks it).
 */
import type { ComplexValue } from '../complex.js';
import { NumericalError } from '../errors.js';
import type { Board, Terminal } from '../board/boardModel.js';
import { REFERENCE } from './networkTopology.js';
import { compileBoard } from './solveNetwork.js';

/** The board's nodes with the EMFs shorted: which unknown each terminal and branch end is. */
export interface PassiveNetworkPlan {
  /** Number of unknown node voltages. */
  readonly size: number;
  /** Unknown of each terminal; -1 for the star point (and for a bus fed by an ideal source). */
  readonly terminalIndex: ReadonlyMap<Terminal, number>;
  /** Per phase, the unknown of its bus (-1 when an ideal source holds it). */
  readonly busIndex: readonly number[];
  /** Unknown of the neutral bar; -1 when solidly tied to the star point; null without a neutral. */
  readonly neutralIndex: number | null;
  /** Per load, per branch: the two unknowns it joins (-1 = star point); null for a dead branch. */
  readonly branchEnds: readonly (readonly ([number, number] | null)[])[];
}

/**
 * Numbers the unknowns of the passive network. Nodes that nothing live reaches
 * (a dead branch's private star point) are left out.
 */
export function planPassiveNetwork(board: Board): PassiveNetworkPlan {
  // Same numbering and the same idea of which nodes conduct as every solve.
  const { topology: topo, network } = compileBoard(board);
  const live = Array.from(network.live, (x) => x === 1);
  // Buses an ideal EMF holds (no line impedance) sit on the star point once the EMFs are shorted.
  const sources = new Set(network.circuit.sources.filter((s) => !s.admittance).map((s) => s.plus));
  const index = new Array<number>(topo.nodeNames.length).fill(-1);
  let size = 0;
  live.forEach((ok, node) => {
    // Shorted EMFs put the source terminals on the star point.
    if (ok && !sources.has(node)) index[node] = size++;
  });
  const unknownOf = (node: number) => (node === REFERENCE ? -1 : index[node]!);
  const terminalIndex = new Map<Terminal, number>();
  for (const [t, node] of topo.terminalNode) terminalIndex.set(t, unknownOf(node));
  const branchEnds = board.loads.map((load) =>
    load.branches.map((b): [number, number] | null => {
      const p = topo.terminalNode.get(b.from)!;
      const q = topo.terminalNode.get(b.to)!;
      const alive = (n: number) => n === REFERENCE || live[n] === true;
      return alive(p) && alive(q) ? [unknownOf(p), unknownOf(q)] : null;
    }),
  );
  return {
    size,
    terminalIndex,
    busIndex: topo.busNode.map(unknownOf),
    neutralIndex: board.hasNeutral && topo.neutralNode !== undefined ? unknownOf(topo.neutralNode) : null,
    branchEnds,
  };
}

/** A nodal admittance matrix, row-major, real and imaginary parts apart. */
export interface NodalMatrix {
  readonly size: number;
  readonly re: Float64Array;
  readonly im: Float64Array;
}

export const createNodalMatrix = (size: number): NodalMatrix => ({ size, re: new Float64Array(size * size), im: new Float64Array(size * size) });

export function copyNodalMatrix(from: NodalMatrix, to: NodalMatrix): void {
  to.re.set(from.re);
  to.im.set(from.im);
}

/** Adds admittance g + jb between unknowns p and q (-1 = star point). */
export function stampAdmittance(m: NodalMatrix, p: number, q: number, g: number, b: number): void {
  const n = m.size;
  if (p >= 0) {
    m.re[p * n + p] = m.re[p * n + p]! + g;
    m.im[p * n + p] = m.im[p * n + p]! + b;
  }
  if (q >= 0) {
    m.re[q * n + q] = m.re[q * n + q]! + g;
    m.im[q * n + q] = m.im[q * n + q]! + b;
  }
  if (p >= 0 && q >= 0) {
    m.re[p * n + q] = m.re[p * n + q]! - g;
    m.im[p * n + q] = m.im[p * n + q]! - b;
    m.re[q * n + p] = m.re[q * n + p]! - g;
    m.im[q * n + p] = m.im[q * n + p]! - b;
  }
}

/**
 * Stamps the fixed elements: each line (source + feeder) from its bus to the
 * star point, and the neutral conductor from the bar to the star point.
 * Admittances as complex values, one for every line or one per line in phase
 * order; null for none.
 */
export function stampConductors(
  plan: PassiveNetworkPlan,
  m: NodalMatrix,
  lineAdmittance: ComplexValue | readonly (ComplexValue | null)[] | null,
  neutralAdmittance: ComplexValue | null,
): void {
  plan.busIndex.forEach((bus, k) => {
    const y = Array.isArray(lineAdmittance) ? lineAdmittance[k] : (lineAdmittance as ComplexValue | null);
    if (y) stampAdmittance(m, bus, -1, y.re, y.im);
  });
  if (neutralAdmittance && plan.neutralIndex !== null && plan.neutralIndex >= 0) stampAdmittance(m, plan.neutralIndex, -1, neutralAdmittance.re, neutralAdmittance.im);
}

/**
 * Inverts `m` in place (Gauss–Jordan with partial pivoting) into the nodal
 * impedance matrix. `work` must be another matrix of the same size.
 * @throws {NumericalError} when the matrix is singular (a node tied to nothing
 *   at this frequency, or an exact series resonance).
 */
export function invertNodalMatrix(m: NodalMatrix, work: NodalMatrix): void {
  const n = m.size;
  const { re, im } = m;
  const ire = work.re;
  const iim = work.im;
  ire.fill(0);
  iim.fill(0);
  for (let i = 0; i < n; i++) ire[i * n + i] = 1;
  let largest = 0;
  for (let k = 0; k < n * n; k++) largest = Math.max(largest, Math.abs(re[k]!) + Math.abs(im[k]!));
  for (let k = 0; k < n; k++) {
    let pivot = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const size = Math.abs(re[i * n + k]!) + Math.abs(im[i * n + k]!);
      if (size > best) {
        best = size;
        pivot = i;
      }
    }
    if (!(best > 1e-13 * largest)) throw new NumericalError('singular', 'the impedance seen from the board is undefined at this frequency: a node is tied to nothing or a series L–C resonance shorts it exactly');
    if (pivot !== k) {
      for (let j = 0; j < n; j++) {
        swap(re, pivot * n + j, k * n + j);
        swap(im, pivot * n + j, k * n + j);
        swap(ire, pivot * n + j, k * n + j);
        swap(iim, pivot * n + j, k * n + j);
      }
    }
    const pr = re[k * n + k]!;
    const pi = im[k * n + k]!;
    const pd = pr * pr + pi * pi;
    const qr = pr / pd;
    const qi = -pi / pd;
    for (let j = 0; j < n; j++) {
      const a = re[k * n + j]!;
      const b = im[k * n + j]!;
      re[k * n + j] = a * qr - b * qi;
      im[k * n + j] = a * qi + b * qr;
      const c = ire[k * n + j]!;
      const d = iim[k * n + j]!;
      ire[k * n + j] = c * qr - d * qi;
      iim[k * n + j] = c * qi + d * qr;
    }
    for (let i = 0; i < n; i++) {
      if (i === k) continue;
      const fr = re[i * n + k]!;
      const fi = im[i * n + k]!;
      if (fr === 0 && fi === 0) continue;
      for (let j = 0; j < n; j++) {
        const a = re[k * n + j]!;
        const b = im[k * n + j]!;
        re[i * n + j] = re[i * n + j]! - (fr * a - fi * b);
        im[i * n + j] = im[i * n + j]! - (fr * b + fi * a);
        const c = ire[k * n + j]!;
        const d = iim[k * n + j]!;
        ire[i * n + j] = ire[i * n + j]! - (fr * c - fi * d);
        iim[i * n + j] = iim[i * n + j]! - (fr * d + fi * c);
      }
    }
  }
  re.set(ire);
  im.set(iim);
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i]!;
  a[i] = a[j]!;
  a[j] = t;
}

/**
 * Impedance between unknowns p and q read from an inverted (impedance) matrix:
 * Z = Z_pp + Z_qq − Z_pq − Z_qp (the voltage a 1 A source from q to p makes).
 * Writes re, im into `out` at `at`.
 */
export function impedanceBetween(z: NodalMatrix, p: number, q: number, out: Float64Array, at: number): void {
  const n = z.size;
  let r = 0;
  let x = 0;
  if (p >= 0) {
    r += z.re[p * n + p]!;
    x += z.im[p * n + p]!;
  }
  if (q >= 0) {
    r += z.re[q * n + q]!;
    x += z.im[q * n + q]!;
  }
  if (p >= 0 && q >= 0) {
    r -= z.re[p * n + q]! + z.re[q * n + p]!;
    x -= z.im[p * n + q]! + z.im[q * n + p]!;
  }
  out[at] = r;
  out[at + 1] = x;
}
