/**
 * Impedances between terminal pairs of a large network (an installation "looking in" from one
 * board, every EMF shorted) from a sparse factorisation instead of a dense inverse.
 *
 * Why: a resonance scan evaluates the network at hundreds of orders and every bank state, and
 * the dense Gauss–Jordan inverse of terminalImpedance.ts costs n³: an installation of 50 boards
 * (about 200 unknowns) took 8 s to scan with no bank at all, 100 boards a minute, 300 boards
 * half an hour. The nodal matrix of a radial installation is sparse and its pattern is fixed for
 * the whole scan, so the fixed-pattern complex LU (`_internal/sparseComplexLu.ts`, the one the
 * fundamental solve uses) factorises it in time linear in the boards, and a few substitutions
 * (one per terminal) give every pair's impedance.
 *
 * The LU does not pivot. A nodal matrix at a harmonic order mixes inductive and capacitive parts,
 * so a pivot can come out small near a series resonance; `evaluate` then, or when the solution's
 * residual is not at round-off level, returns false and the caller inverts the dense matrix
 * with partial pivoting as before.
 */
import { analysePattern, factorInPlace, substituteInOrder, type SparsePattern } from '../_internal/sparseComplexLu.js';

/** A pivot at or below this share of the largest diagonal entry hands the evaluation to the dense pivoted inverse. */
const RELATIVE_PIVOT = 1e-8;
/** Largest residual |Y·x − e| accepted, relative to |Y|·|x| (round-off is about 1e-15 of it). */
const RESIDUAL_LIMIT = 1e-9;

export class SparseTerminalImpedance {
  private readonly pattern: SparsePattern;
  /** Values by slot: the part every state shares (set per order), the state's matrix, and a copy of it before factorising. */
  private readonly baseRe: Float64Array;
  private readonly baseIm: Float64Array;
  private readonly re: Float64Array;
  private readonly im: Float64Array;
  private readonly originalRe: Float64Array;
  private readonly originalIm: Float64Array;
  /** Per terminal node: its column of the impedance matrix, read at every terminal node (by position). */
  private readonly terminals: Int32Array;
  private readonly columnRe: Float64Array;
  private readonly columnIm: Float64Array;
  private readonly xRe: Float64Array;
  private readonly xIm: Float64Array;
  /** Residual check scratch, by position. */
  private readonly rRe: Float64Array;
  private readonly rIm: Float64Array;
  private readonly rScale: Float64Array;
  /** |x| by position, and |Y| of every unfactorised slot: each taken once where the residual check reads it several times. */
  private readonly xAbs: Float64Array;
  private readonly slotAbs: Float64Array;

  /**
   * @param size unknowns
   * @param pairs every (p, q) a stamp will touch (-1: the reference, i.e. a diagonal entry only)
   * @param terminalNodes the unknowns whose pair impedances are read (-1 entries are ignored)
   */
  constructor(size: number, pairs: Iterable<readonly [number, number]>, terminalNodes: readonly number[]) {
    const offDiagonal: [number, number][] = [];
    for (const [p, q] of pairs) if (p >= 0 && q >= 0 && p !== q) offDiagonal.push([p, q]);
    this.pattern = analysePattern(size, offDiagonal);
    const slots = this.pattern.slotCount;
    this.baseRe = new Float64Array(slots);
    this.baseIm = new Float64Array(slots);
    this.re = new Float64Array(slots);
    this.im = new Float64Array(slots);
    this.originalRe = new Float64Array(slots);
    this.originalIm = new Float64Array(slots);
    this.terminals = Int32Array.from(new Set(terminalNodes.filter((n) => n >= 0)));
    const t = this.terminals.length;
    this.columnRe = new Float64Array(t * t);
    this.columnIm = new Float64Array(t * t);
    this.xRe = new Float64Array(size);
    this.xIm = new Float64Array(size);
    this.rRe = new Float64Array(size);
    this.rIm = new Float64Array(size);
    this.rScale = new Float64Array(size);
    this.xAbs = new Float64Array(size);
    this.slotAbs = new Float64Array(slots);
  }

  /** The four slots a stamp between p and q adds to: pp, qq, pq, qp (-1 where an end is the reference). */
  slotsOf(p: number, q: number): [number, number, number, number] {
    const s = this.pattern.slotOf;
    return [p >= 0 ? s(p, p) : -1, q >= 0 ? s(q, q) : -1, p >= 0 && q >= 0 ? s(p, q) : -1, p >= 0 && q >= 0 ? s(q, p) : -1];
  }

  clearBase(): void {
    this.baseRe.fill(0);
    this.baseIm.fill(0);
  }

  /** Adds g + jb between the ends whose slots `slots` holds at `at` (as `slotsOf` gives them) to the shared part. */
  stampBase(slots: Int32Array, at: number, g: number, b: number): void {
    stampSlots(this.baseRe, this.baseIm, slots, at, g, b);
  }

  /** Starts a state: the shared part alone. */
  beginState(): void {
    this.re.set(this.baseRe);
    this.im.set(this.baseIm);
  }

  /** Adds g + jb to the state's matrix. */
  stamp(slots: Int32Array, at: number, g: number, b: number): void {
    stampSlots(this.re, this.im, slots, at, g, b);
  }

  /**
   * Factorises the state's matrix and writes Z = V/I of a 1 A source between each pair's ends into
   * `outRe/outIm` (pair k at k). Returns false, with nothing trusted written, when a pivot is small
   * or a solution's residual is above round-off: the caller then uses the dense pivoted inverse.
   */
  evaluate(ends: readonly (readonly [number, number])[], outRe: Float64Array, outIm: Float64Array): boolean {
    const p = this.pattern;
    const n = p.size;
    this.originalRe.set(this.re);
    this.originalIm.set(this.im);
    for (let s = 0; s < p.slotCount; s++) this.slotAbs[s] = Math.sqrt(this.re[s]! * this.re[s]! + this.im[s]! * this.im[s]!);
    let scale = 0;
    for (let k = 0; k < n; k++) {
      const d = p.diagonal[k]!;
      scale = Math.max(scale, Math.abs(this.re[d]!) + Math.abs(this.im[d]!));
    }
    if (!(scale > 0) || factorInPlace(p, this.re, this.im, RELATIVE_PIVOT, scale) >= 0) return false;
    const t = this.terminals.length;
    for (let c = 0; c < t; c++) {
      const xRe = this.xRe;
      const xIm = this.xIm;
      xRe.fill(0);
      xIm.fill(0);
      const source = p.position[this.terminals[c]!]!;
      xRe[source] = 1;
      substituteInOrder(p, this.re, this.im, xRe, xIm, 0);
      if (!this.residualSmall(source)) return false;
      for (let r = 0; r < t; r++) {
        const at = p.position[this.terminals[r]!]!;
        this.columnRe[r * t + c] = xRe[at]!;
        this.columnIm[r * t + c] = xIm[at]!;
      }
    }
    for (let k = 0; k < ends.length; k++) {
      const [a, b] = ends[k]!;
      const i = a >= 0 ? this.terminals.indexOf(a) : -1;
      const j = b >= 0 ? this.terminals.indexOf(b) : -1;
      let zr = 0;
      let zi = 0;
      if (i >= 0) {
        zr += this.columnRe[i * t + i]!;
        zi += this.columnIm[i * t + i]!;
      }
      if (j >= 0) {
        zr += this.columnRe[j * t + j]!;
        zi += this.columnIm[j * t + j]!;
      }
      if (i >= 0 && j >= 0) {
        zr -= this.columnRe[i * t + j]! + this.columnRe[j * t + i]!;
        zi -= this.columnIm[i * t + j]! + this.columnIm[j * t + i]!;
      }
      outRe[k] = zr;
      outIm[k] = zi;
    }
    return true;
  }

  /** Whether Y·x (the unfactorised values, x by position) is the unit vector at `source` to round-off. */
  private residualSmall(source: number): boolean {
    const p = this.pattern;
    const { diagonal, neighbourStart, neighbourPosition, lowerSlot, upperSlot } = p;
    const re = this.originalRe;
    const im = this.originalIm;
    const slotAbs = this.slotAbs;
    const xRe = this.xRe;
    const xIm = this.xIm;
    const xAbs = this.xAbs;
    // r = Y·x − e accumulated per position, and Σ|Y_kj|·|x_j| per row for its scale.
    const n = p.size;
    const rRe = this.rRe;
    const rIm = this.rIm;
    const mag = this.rScale;
    rRe.fill(0);
    rIm.fill(0);
    mag.fill(0);
    for (let k = 0; k < n; k++) xAbs[k] = Math.sqrt(xRe[k]! * xRe[k]! + xIm[k]! * xIm[k]!);
    for (let k = 0; k < n; k++) {
      const d = diagonal[k]!;
      const xr = xRe[k]!;
      const xi = xIm[k]!;
      const xm = xAbs[k]!;
      // Row k's sums in locals: the rows below add only into later rows.
      let rr = rRe[k]! + re[d]! * xr - im[d]! * xi;
      let ri = rIm[k]! + re[d]! * xi + im[d]! * xr;
      let mk = mag[k]! + slotAbs[d]! * xm;
      for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
        const i = neighbourPosition[a]!;
        const u = upperSlot[a]!; // Y(k, i)
        const l = lowerSlot[a]!; // Y(i, k)
        rr = rr + re[u]! * xRe[i]! - im[u]! * xIm[i]!;
        ri = ri + re[u]! * xIm[i]! + im[u]! * xRe[i]!;
        mk = mk + slotAbs[u]! * xAbs[i]!;
        rRe[i] = rRe[i]! + re[l]! * xr - im[l]! * xi;
        rIm[i] = rIm[i]! + re[l]! * xi + im[l]! * xr;
        mag[i] = mag[i]! + slotAbs[l]! * xm;
      }
      rRe[k] = rr;
      rIm[k] = ri;
      mag[k] = mk;
    }
    rRe[source] = rRe[source]! - 1;
    let worst = 0;
    let size = 1;
    for (let k = 0; k < n; k++) {
      worst = Math.max(worst, Math.sqrt(rRe[k]! * rRe[k]! + rIm[k]! * rIm[k]!));
      size = Math.max(size, mag[k]!);
    }
    return Number.isFinite(worst) && worst <= RESIDUAL_LIMIT * size;
  }
}

function stampSlots(re: Float64Array, im: Float64Array, slots: Int32Array, at: number, g: number, b: number): void {
  const pp = slots[at]!;
  const qq = slots[at + 1]!;
  const pq = slots[at + 2]!;
  const qp = slots[at + 3]!;
  if (pp >= 0) {
    re[pp] = re[pp]! + g;
    im[pp] = im[pp]! + b;
  }
  if (qq >= 0) {
    re[qq] = re[qq]! + g;
    im[qq] = im[qq]! + b;
  }
  if (pq >= 0) {
    re[pq] = re[pq]! - g;
    im[pq] = im[pq]! - b;
    re[qp] = re[qp]! - g;
    im[qp] = im[qp]! - b;
  }
}
