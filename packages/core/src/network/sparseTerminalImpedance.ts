/**
 * Impedances between terminal pairs of a large network (an installation "looking in" from one
 * board, every EMF shorted) from a sparse factorisation instead of a dense inverse.
 *
 * Why: a resonance scan evaluates the network at hundreds of orders and every bank state, and
 * the dense Gauss–Jordan inverse of terminalImpedance.ts costs n³: an installation of 50 boards
 * (about 200 unknowns) took 8 s to scan with no bank at all, 100 boards a minute, 300 boards
 * half an hour. The nodal matrix of a radial installation is sparse and its pattern is fixed for
 * the whole scan, so the fixed-pattern complex LU (`_internal/sparseComplexLu.ts`, the one the
 * fundamental solve uses) factorises it in time linear in the boards, and a substitution of a
 * unit source at every terminal gives every pair's impedance: one pass over the factors for all
 * the terminals at once (written out for a board's four, fourColumnSparse.ts), each terminal's
 * numbers those of its own substitution.
 *
 * The LU does not pivot. A nodal matrix at a harmonic order mixes inductive and capacitive parts,
 * so a pivot can come out small near a series resonance; `evaluate` then, or when the solution's
 * residual is not at round-off level, returns false and the caller inverts the dense matrix
 * with partial pivoting as before.
 */
import { analysePattern, factorInPlace, multiplyAddColumnsInOrder, substituteColumnsInOrder, type SparsePattern } from '../_internal/sparseComplexLu.js';
import { multiplyAddFourColumnsInOrder, substituteFourColumnsInOrder } from '../_internal/fourColumnSparse.js';

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
  /** Every terminal's solution, interleaved: position k of terminal c's at k·t + c (substituteColumnsInOrder). */
  private readonly xRe: Float64Array;
  private readonly xIm: Float64Array;
  private readonly sumRe: Float64Array;
  private readonly sumIm: Float64Array;
  /** Residual check scratch, interleaved like x. */
  private readonly rRe: Float64Array;
  private readonly rIm: Float64Array;
  private readonly rScale: Float64Array;
  /** |x| interleaved like x, and |Y| of every unfactorised slot, for the residual's scale: each taken once where it is read several times. */
  private readonly xAbs: Float64Array;
  private readonly slotAbs: Float64Array;
  /** The pairs last read (a scan reads the same ones every time) and their ends' terminal numbers, two per pair (-1: the reference). */
  private endsRead: readonly (readonly [number, number])[] | null = null;
  private endTerminal = new Int32Array(0);

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
    this.xRe = new Float64Array(size * t);
    this.xIm = new Float64Array(size * t);
    this.sumRe = new Float64Array(t);
    this.sumIm = new Float64Array(t);
    this.rRe = new Float64Array(size * t);
    this.rIm = new Float64Array(size * t);
    this.rScale = new Float64Array(size * t);
    this.xAbs = new Float64Array(size * t);
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
    let scale = 0;
    for (let k = 0; k < n; k++) {
      const d = p.diagonal[k]!;
      scale = Math.max(scale, Math.abs(this.re[d]!) + Math.abs(this.im[d]!));
    }
    if (!(scale > 0) || factorInPlace(p, this.re, this.im, RELATIVE_PIVOT, scale) >= 0) return false;
    const t = this.terminals.length;
    const xRe = this.xRe;
    const xIm = this.xIm;
    xRe.fill(0);
    xIm.fill(0);
    for (let c = 0; c < t; c++) xRe[p.position[this.terminals[c]!]! * t + c] = 1;
    if (t === 4) substituteFourColumnsInOrder(p, this.re, this.im, xRe, xIm);
    else substituteColumnsInOrder(p, this.re, this.im, xRe, xIm, t, this.sumRe, this.sumIm);
    if (!this.residualsSmall()) return false;
    for (let c = 0; c < t; c++)
      for (let r = 0; r < t; r++) {
        const at = p.position[this.terminals[r]!]! * t + c;
        this.columnRe[r * t + c] = xRe[at]!;
        this.columnIm[r * t + c] = xIm[at]!;
      }
    if (this.endsRead !== ends) {
      this.endsRead = ends;
      this.endTerminal = Int32Array.from(ends.flatMap(([a, b]) => [a >= 0 ? this.terminals.indexOf(a) : -1, b >= 0 ? this.terminals.indexOf(b) : -1]));
    }
    const endTerminal = this.endTerminal;
    for (let k = 0; k < ends.length; k++) {
      const i = endTerminal[2 * k]!;
      const j = endTerminal[2 * k + 1]!;
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

  /**
   * Whether Y·x (the unfactorised values) is, for every terminal c, the unit vector at its position to
   * round-off: the largest |r| of r = Y·x − e within RESIDUAL_LIMIT × max(1, largest row of |Y|·|x|).
   * That scale is never below 1, so a residual within RESIDUAL_LIMIT passes whatever the scale, which
   * is summed only when one is above (as good as never: round-off is some 1e-15 of it) or when a
   * value is so large that |Y|·|x| could overflow, where the check runs in full as written.
   */
  private residualsSmall(): boolean {
    const p = this.pattern;
    const t = this.terminals.length;
    const re = this.originalRe;
    const im = this.originalIm;
    const xRe = this.xRe;
    const xIm = this.xIm;
    // r = Y·x − e, each terminal's sums in the order of a check of its vector alone.
    const n = p.size;
    const rRe = this.rRe;
    const rIm = this.rIm;
    rRe.fill(0);
    rIm.fill(0);
    if (t === 4) multiplyAddFourColumnsInOrder(p, re, im, xRe, xIm, rRe, rIm);
    else multiplyAddColumnsInOrder(p, re, im, xRe, xIm, t, rRe, rIm);
    // Below this no |Y|, |x| or product of the two overflows, so the scale is finite and at least 1
    // (a NaN anywhere makes r NaN, which no check passes).
    const modest = largestPart(re, im) < 1e150 && largestPart(xRe, xIm) < 1e150;
    let scaled = false;
    for (let c = 0; c < t; c++) {
      const source = p.position[this.terminals[c]!]! * t + c;
      rRe[source] = rRe[source]! - 1;
      // The largest |r|: the root of the largest |r|², as √ is monotonic (and NaN stays NaN).
      let worst2 = 0;
      for (let k = 0; k < n; k++) {
        const e = k * t + c;
        worst2 = Math.max(worst2, rRe[e]! * rRe[e]! + rIm[e]! * rIm[e]!);
      }
      const worst = Math.sqrt(worst2);
      if (modest && worst <= RESIDUAL_LIMIT) continue;
      if (!scaled) this.sumScales();
      scaled = true;
      let size = 1;
      for (let k = 0; k < n; k++) size = Math.max(size, this.rScale[k * t + c]!);
      if (!(Number.isFinite(worst) && worst <= RESIDUAL_LIMIT * size)) return false;
    }
    return true;
  }

  /** Σ|Y_kj|·|x_j| per row and terminal into rScale, for the residual check's scale. */
  private sumScales(): void {
    const p = this.pattern;
    const { diagonal, neighbourStart, neighbourPosition, lowerSlot, upperSlot } = p;
    const t = this.terminals.length;
    const n = p.size;
    const re = this.originalRe;
    const im = this.originalIm;
    const xRe = this.xRe;
    const xIm = this.xIm;
    const slotAbs = this.slotAbs;
    const xAbs = this.xAbs;
    const mag = this.rScale;
    for (let s = 0; s < p.slotCount; s++) slotAbs[s] = Math.sqrt(re[s]! * re[s]! + im[s]! * im[s]!);
    for (let e = 0; e < n * t; e++) xAbs[e] = Math.sqrt(xRe[e]! * xRe[e]! + xIm[e]! * xIm[e]!);
    mag.fill(0);
    for (let k = 0; k < n; k++) {
      const row = k * t;
      const dm = slotAbs[diagonal[k]!]!;
      for (let c = 0; c < t; c++) mag[row + c] = mag[row + c]! + dm * xAbs[row + c]!;
      for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
        const i = neighbourPosition[a]! * t;
        const um = slotAbs[upperSlot[a]!]!;
        const lm = slotAbs[lowerSlot[a]!]!;
        for (let c = 0; c < t; c++) {
          mag[row + c] = mag[row + c]! + um * xAbs[i + c]!;
          mag[i + c] = mag[i + c]! + lm * xAbs[row + c]!;
        }
      }
    }
  }
}

/** The largest |re| or |im| of a vector (NaNs passed over). */
function largestPart(re: Float64Array, im: Float64Array): number {
  let largest = 0;
  for (let k = 0; k < re.length; k++) {
    const a = Math.abs(re[k]!);
    const b = Math.abs(im[k]!);
    if (a > largest) largest = a;
    if (b > largest) largest = b;
  }
  return largest;
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
