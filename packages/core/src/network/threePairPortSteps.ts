/**
 * The Newton steps of compiledNetwork.ts's `solveByMagnitudes` for the commonest
 * board, written out in one pass: three node pairs carry the voltage-dependent loads and
 * they are the network's only load ports (a load from each phase to neutral). Each step
 * takes the ports' admittances and their slopes at the assumed magnitudes, solves the
 * ports (L·D·Lᵀ, loadPortReduction.ts), forms the residuals, the loaded ports' transfer
 * impedance, φ' and (I − φ')⁻¹, and moves the magnitudes, all in locals. The arithmetic
 * is that of `admittancesAtMagnitudes`, `LoadPortReduction.solvePorts` and
 * `loadedTransfer`, `prepareJacobian` and `invertReal3InPlace`, operation for operation
 * and in the same order, so the state is the same to the bit. What it saves is the trips
 * through typed arrays between those steps (V8 checks an array again at every access)
 * and the calls: about half the time of a step.
 *
 * Not re-entrant: the tables it reads and writes (magnitudes, unknowns' voltages) belong
 * to one compiled network, which solves one call at a time.
 */
import type { LoadPortReduction } from './loadPortReduction.js';
import { PIVOT_FLOOR } from '../_internal/symmetricComplexLdl.js';
import { REAL3_RELATIVE_PIVOT } from '../_internal/denseRealLu.js';

/** What `run` left for the caller (see there). */
export const STEPS_DECLINED = -1;
export const STEPS_NEED_GENERAL = -2;
export const STEPS_CONTINUE = 0;
export const STEPS_SETTLED = 1;

/** Per-branch tables of the compiled network (its own arrays, read in place). */
export interface BranchTables {
  readonly count: number;
  /** Pair of each branch (-1: constant impedance, or inactive). */
  readonly pairOf: Int32Array;
  /** Port of each branch (-1: inactive, or no end is an unknown); ports 0, 1, 2 are the pairs. */
  readonly portOf: readonly number[];
  readonly active: Uint8Array;
  readonly vNominal: Float64Array;
  readonly zipZ: Float64Array;
  readonly zipI: Float64Array;
  readonly zipP: Float64Array;
  readonly powerRe: Float64Array;
  readonly powerIm: Float64Array;
}

export class ThreePairPortSteps {
  /** Voltage change (fraction of base) of the last step `run` took, as `solveByMagnitudes` keeps it. */
  lastChange = 0;
  /** Port solves `run` took. */
  solves = 0;
  // W's lower triangle (fixed at compile time), S.
  private readonly w00r: number;
  private readonly w00i: number;
  private readonly w10r: number;
  private readonly w10i: number;
  private readonly w11r: number;
  private readonly w11i: number;
  private readonly w20r: number;
  private readonly w20i: number;
  private readonly w21r: number;
  private readonly w21i: number;
  private readonly w22r: number;
  private readonly w22i: number;

  constructor(
    private readonly branches: BranchTables,
    private readonly reduction: LoadPortReduction,
  ) {
    const wRe = reduction.wRe;
    const wIm = reduction.wIm;
    this.w00r = wRe[0]!;
    this.w00i = wIm[0]!;
    this.w10r = wRe[3]!;
    this.w10i = wIm[3]!;
    this.w11r = wRe[4]!;
    this.w11i = wIm[4]!;
    this.w20r = wRe[6]!;
    this.w20i = wIm[6]!;
    this.w21r = wRe[7]!;
    this.w21i = wIm[7]!;
    this.w22r = wRe[8]!;
    this.w22i = wIm[8]!;
  }

  /**
   * Up to `most` Newton steps through the ports from the magnitudes in `magnitude`, after
   * the reduction's `openCircuit`, stopping as `solveByMagnitudes` does. Leaves the unknowns'
   * voltages of the last port solve in `xRe/xIm` (elimination order) and returns: STEPS_SETTLED
   * (the magnitudes in `magnitude` are the state, after `solves` solves, and `xRe/xIm` its
   * voltages); STEPS_CONTINUE (`most` steps taken without settling: the caller declines too);
   * STEPS_DECLINED (hand the solve to the
   * fixed-point iteration); STEPS_NEED_GENERAL (a port pivot too small for L·D·Lᵀ: the
   * caller starts again on the general path, which takes the pivoted inverse).
   * @param contractionLimit the row-sum bound on |φ'| (compiledNetwork.ts).
   * @param roundOff a voltage change (fraction of base) that is round-off.
   */
  run(
    magnitude: Float64Array,
    most: number,
    threshold: number,
    tolerance: number,
    vBase: number,
    contractionLimit: number,
    roundOff: number,
    xRe: Float64Array,
    xIm: Float64Array,
  ): number {
    this.solves = 0;
    this.lastChange = 0;
    for (let solves = 1; solves <= most; solves++) {
      this.solves = solves;
      const outcome = this.step(solves, magnitude, threshold, tolerance, vBase, contractionLimit, roundOff, xRe, xIm);
      if (outcome !== STEPS_CONTINUE) return outcome;
    }
    return STEPS_CONTINUE;
  }

  private step(
    solves: number,
    magnitude: Float64Array,
    threshold: number,
    tolerance: number,
    vBase: number,
    contractionLimit: number,
    roundOff: number,
    xRe: Float64Array,
    xIm: Float64Array,
  ): number {
    const b = this.branches;
    const pairOf = b.pairOf;
    const portOf = b.portOf;
    const active = b.active;
    const vNominal = b.vNominal;
    const zipZ = b.zipZ;
    const zipI = b.zipI;
    const zipP = b.zipP;
    const powerRe = b.powerRe;
    const powerIm = b.powerIm;
    const r = this.reduction;
    const dRe = r.driveRe;
    const dIm = r.driveIm;
    const oRe = r.openRe;
    const oIm = r.openIm;
    const tRe = r.towardRe;
    const tIm = r.towardIm;
    const n = xRe.length;
    const m0 = magnitude[0]!;
    const m1 = magnitude[1]!;
    const m2 = magnitude[2]!;
    // Port admittances and pair slopes at m (admittancesAtMagnitudes).
    let y0r = 0;
    let y0i = 0;
    let y1r = 0;
    let y1i = 0;
    let y2r = 0;
    let y2i = 0;
    let s0r = 0;
    let s0i = 0;
    let s1r = 0;
    let s1i = 0;
    let s2r = 0;
    let s2i = 0;
    for (let k = 0; k < b.count; k++) {
      const v0 = vNominal[k]!;
      const g = pairOf[k]!;
      const v = g === 0 ? m0 : g === 1 ? m1 : g === 2 ? m2 : active[k] ? v0 : 0;
      const floor = threshold * v0;
      if (g >= 0 && v <= floor) return STEPS_DECLINED;
      const ratio = v0 / Math.max(v, floor);
      const zi = zipI[k]!;
      const zp = zipP[k]!;
      const factor = (zipZ[k]! + zi * ratio + zp * ratio * ratio) / (v0 * v0);
      const pr = powerRe[k]!;
      const pi = powerIm[k]!;
      const yr = pr * factor;
      const yi = -pi * factor;
      const port = portOf[k]!;
      if (port === 0) {
        y0r += yr;
        y0i += yi;
      } else if (port === 1) {
        y1r += yr;
        y1i += yi;
      } else if (port === 2) {
        y2r += yr;
        y2i += yi;
      }
      if (g >= 0) {
        const slope = -(zi * ratio + 2 * zp * ratio * ratio) / (v * v0 * v0);
        if (g === 0) {
          s0r += pr * slope;
          s0i -= pi * slope;
        } else if (g === 1) {
          s1r += pr * slope;
          s1i -= pi * slope;
        } else {
          s2r += pr * slope;
          s2i -= pi * slope;
        }
      }
    }
    // A = W + diag(Y), its L·D·Lᵀ factors (solveThreePorts).
    const a00r = this.w00r + y0r;
    const a00i = this.w00i + y0i;
    const a10r = this.w10r;
    const a10i = this.w10i;
    const a11r = this.w11r + y1r;
    const a11i = this.w11i + y1i;
    const a20r = this.w20r;
    const a20i = this.w20i;
    const a21r = this.w21r;
    const a21i = this.w21i;
    const a22r = this.w22r + y2r;
    const a22i = this.w22i + y2i;
    let dd = a00r * a00r + a00i * a00i;
    const e0r = a00r / dd;
    const e0i = -a00i / dd;
    const l10r = a10r * e0r - a10i * e0i;
    const l10i = a10r * e0i + a10i * e0r;
    const l20r = a20r * e0r - a20i * e0i;
    const l20i = a20r * e0i + a20i * e0r;
    const d1r = a11r - (l10r * a10r - l10i * a10i);
    const d1i = a11i - (l10r * a10i + l10i * a10r);
    dd = d1r * d1r + d1i * d1i;
    const e1r = d1r / dd;
    const e1i = -d1i / dd;
    const p21r = a21r - (l20r * a10r - l20i * a10i);
    const p21i = a21i - (l20r * a10i + l20i * a10r);
    const l21r = p21r * e1r - p21i * e1i;
    const l21i = p21r * e1i + p21i * e1r;
    const d2r = a22r - (l20r * a20r - l20i * a20i) - (l21r * p21r - l21i * p21i);
    const d2i = a22i - (l20r * a20i + l20i * a20r) - (l21r * p21i + l21i * p21r);
    dd = d2r * d2r + d2i * d2i;
    const e2r = d2r / dd;
    const e2i = -d2i / dd;
    const largest = Math.max(
      Math.abs(a00r) + Math.abs(a00i),
      Math.abs(a10r) + Math.abs(a10i),
      Math.abs(a11r) + Math.abs(a11i),
      Math.abs(a20r) + Math.abs(a20i),
      Math.abs(a21r) + Math.abs(a21i),
      Math.abs(a22r) + Math.abs(a22i),
    );
    if (smallPivot(a00r, a00i, largest) || smallPivot(d1r, d1i, largest) || smallPivot(d2r, d2i, largest)) return STEPS_NEED_GENERAL;
    // v = A⁻¹·(W·v_open): forward (unit L), D⁻¹, backward (Lᵀ).
    const b0r = dRe[0]!;
    const b0i = dIm[0]!;
    const b1r = dRe[1]! - (l10r * b0r - l10i * b0i);
    const b1i = dIm[1]! - (l10r * b0i + l10i * b0r);
    const b2r = dRe[2]! - (l20r * b0r - l20i * b0i) - (l21r * b1r - l21i * b1i);
    const b2i = dIm[2]! - (l20r * b0i + l20i * b0r) - (l21r * b1i + l21i * b1r);
    const v2r = b2r * e2r - b2i * e2i;
    const v2i = b2r * e2i + b2i * e2r;
    const c1r = b1r * e1r - b1i * e1i;
    const c1i = b1r * e1i + b1i * e1r;
    const v1r = c1r - (l21r * v2r - l21i * v2i);
    const v1i = c1i - (l21r * v2i + l21i * v2r);
    const c0r = b0r * e0r - b0i * e0i;
    const c0i = b0r * e0i + b0i * e0r;
    const v0r = c0r - (l10r * v1r - l10i * v1i) - (l20r * v2r - l20i * v2i);
    const v0i = c0i - (l10r * v1i + l10i * v1r) - (l20r * v2i + l20i * v2r);
    // Port currents, then V = V_open − T·i, with the largest change from what `x` held.
    const i0r = y0r * v0r - y0i * v0i;
    const i0i = y0r * v0i + y0i * v0r;
    const i1r = y1r * v1r - y1i * v1i;
    const i1i = y1r * v1i + y1i * v1r;
    const i2r = y2r * v2r - y2i * v2i;
    const i2i = y2r * v2i + y2i * v2r;
    let change2 = 0;
    for (let k = 0; k < n; k++) {
      const t0r = tRe[k]!;
      const t0i = tIm[k]!;
      const t1r = tRe[n + k]!;
      const t1i = tIm[n + k]!;
      const t2r = tRe[2 * n + k]!;
      const t2i = tIm[2 * n + k]!;
      const sr = oRe[k]! - (t0r * i0r - t0i * i0i) - (t1r * i1r - t1i * i1i) - (t2r * i2r - t2i * i2i);
      const si = oIm[k]! - (t0r * i0i + t0i * i0r) - (t1r * i1i + t1i * i1r) - (t2r * i2i + t2i * i2r);
      const dr = sr - xRe[k]!;
      const di = si - xIm[k]!;
      const d2 = dr * dr + di * di;
      if (d2 > change2 || Number.isNaN(d2)) change2 = d2;
      xRe[k] = sr;
      xIm[k] = si;
    }
    // Residuals φ(m) − m: the pairs are the ports.
    const u0 = Math.sqrt(v0r * v0r + v0i * v0i);
    const u1 = Math.sqrt(v1r * v1r + v1i * v1i);
    const u2 = Math.sqrt(v2r * v2r + v2i * v2i);
    let q0 = u0 - m0;
    let q1 = u1 - m1;
    let q2 = u2 - m2;
    if (solves > 1) {
      const change = Math.sqrt(change2) / vBase;
      if (!Number.isFinite(change)) return STEPS_DECLINED;
      // The general loop's stop: the error left estimated from the rate changes shrink.
      const rate = solves > 2 ? Math.min(1, change / this.lastChange) : 1;
      this.lastChange = change;
      const mismatch = Math.max(0, Math.abs(q0), Math.abs(q1), Math.abs(q2));
      if ((change * rate <= tolerance || change <= roundOff) && mismatch <= tolerance * vBase) return STEPS_SETTLED;
      if (solves > 2 && !(rate < 1)) return STEPS_DECLINED;
    }
    // Z = A⁻¹ = Mᵀ·D⁻¹·M with M = L⁻¹ (invertThreePorts).
    const m10r = -l10r;
    const m10i = -l10i;
    const m21r = -l21r;
    const m21i = -l21i;
    const m20r = l21r * l10r - l21i * l10i - l20r;
    const m20i = l21r * l10i + l21i * l10r - l20i;
    const g1r = m10r * e1r - m10i * e1i;
    const g1i = m10r * e1i + m10i * e1r;
    const g2r = m20r * e2r - m20i * e2i;
    const g2i = m20r * e2i + m20i * e2r;
    const h2r = m21r * e2r - m21i * e2i;
    const h2i = m21r * e2i + m21i * e2r;
    const z22r = e2r;
    const z22i = e2i;
    const z12r = h2r;
    const z12i = h2i;
    const z02r = g2r;
    const z02i = g2i;
    const z11r = e1r + (m21r * h2r - m21i * h2i);
    const z11i = e1i + (m21r * h2i + m21i * h2r);
    const z01r = g1r + (m21r * g2r - m21i * g2i);
    const z01i = g1i + (m21r * g2i + m21i * g2r);
    const z00r = e0r + (m10r * g1r - m10i * g1i) + (m20r * g2r - m20i * g2i);
    const z00i = e0i + (m10r * g1i + m10i * g1r) + (m20r * g2i + m20i * g2r);
    // φ'(g, j) = −Re(conj(v_g)·Z(g, j)·c_j)/|v_g|, c_j = (dY_j/dm)·v_j (prepareThreePairJacobian).
    const n0 = -1 / u0;
    const n1 = -1 / u1;
    const n2 = -1 / u2;
    const c0jr = s0r * v0r - s0i * v0i;
    const c0ji = s0r * v0i + s0i * v0r;
    const c1jr = s1r * v1r - s1i * v1i;
    const c1ji = s1r * v1i + s1i * v1r;
    const c2jr = s2r * v2r - s2i * v2i;
    const c2ji = s2r * v2i + s2i * v2r;
    const f00 = (v0r * (z00r * c0jr - z00i * c0ji) + v0i * (z00r * c0ji + z00i * c0jr)) * n0;
    const f01 = (v0r * (z01r * c1jr - z01i * c1ji) + v0i * (z01r * c1ji + z01i * c1jr)) * n0;
    const f02 = (v0r * (z02r * c2jr - z02i * c2ji) + v0i * (z02r * c2ji + z02i * c2jr)) * n0;
    const f10 = (v1r * (z01r * c0jr - z01i * c0ji) + v1i * (z01r * c0ji + z01i * c0jr)) * n1;
    const f11 = (v1r * (z11r * c1jr - z11i * c1ji) + v1i * (z11r * c1ji + z11i * c1jr)) * n1;
    const f12 = (v1r * (z12r * c2jr - z12i * c2ji) + v1i * (z12r * c2ji + z12i * c2jr)) * n1;
    const f20 = (v2r * (z02r * c0jr - z02i * c0ji) + v2i * (z02r * c0ji + z02i * c0jr)) * n2;
    const f21 = (v2r * (z12r * c1jr - z12i * c1ji) + v2i * (z12r * c1ji + z12i * c1jr)) * n2;
    const f22 = (v2r * (z22r * c2jr - z22i * c2ji) + v2i * (z22r * c2ji + z22i * c2jr)) * n2;
    if (
      !(Math.abs(f00) + Math.abs(f01) + Math.abs(f02) < contractionLimit) ||
      !(Math.abs(f10) + Math.abs(f11) + Math.abs(f12) < contractionLimit) ||
      !(Math.abs(f20) + Math.abs(f21) + Math.abs(f22) < contractionLimit)
    )
      return STEPS_DECLINED;
    // (I − φ')⁻¹ by cofactors (invertReal3InPlace), applied to the residuals.
    const j00 = 1 - f00;
    const j01 = -f01;
    const j02 = -f02;
    const j10 = -f10;
    const j11 = 1 - f11;
    const j12 = -f12;
    const j20 = -f20;
    const j21 = -f21;
    const j22 = 1 - f22;
    const k00 = j11 * j22 - j12 * j21;
    const k01 = j12 * j20 - j10 * j22;
    const k02 = j10 * j21 - j11 * j20;
    const det = j00 * k00 + j01 * k01 + j02 * k02;
    const big = Math.max(0, Math.abs(j00), Math.abs(j01), Math.abs(j02), Math.abs(j10), Math.abs(j11), Math.abs(j12), Math.abs(j20), Math.abs(j21), Math.abs(j22));
    if (!(Math.abs(det) > REAL3_RELATIVE_PIVOT * big * big * big) || !Number.isFinite(det)) return STEPS_DECLINED;
    const rd = 1 / det;
    const i00 = k00 * rd;
    const i01 = (j02 * j21 - j01 * j22) * rd;
    const i02 = (j01 * j12 - j02 * j11) * rd;
    const i10 = k01 * rd;
    const i11 = (j00 * j22 - j02 * j20) * rd;
    const i12 = (j02 * j10 - j00 * j12) * rd;
    const i20 = k02 * rd;
    const i21 = (j01 * j20 - j00 * j21) * rd;
    const i22 = (j00 * j11 - j01 * j10) * rd;
    const step0 = i00 * q0 + i01 * q1 + i02 * q2;
    const step1 = i10 * q0 + i11 * q1 + i12 * q2;
    const step2 = i20 * q0 + i21 * q1 + i22 * q2;
    q0 = m0 + step0;
    q1 = m1 + step1;
    q2 = m2 + step2;
    if (!(q0 > 0) || !(q1 > 0) || !(q2 > 0)) return STEPS_DECLINED;
    magnitude[0] = q0;
    magnitude[1] = q1;
    magnitude[2] = q2;
    return STEPS_CONTINUE;
  }
}

/** The pivot rule of factorSymmetricInPlace: a pivot at least PIVOT_FLOOR of the largest entry, finite. */
function smallPivot(dr: number, di: number, largest: number): boolean {
  const pivot = Math.abs(dr) + Math.abs(di);
  return !(pivot >= PIVOT_FLOOR * largest) || !(pivot > 0) || !(pivot < Infinity);
}
