/**
 * A small network's loads seen through its fixed part. The fixed admittances (source
 * windings, feeders, neutrals: everything but the load branches) do not change
 * between solves, so they are factorised once, at compile time, and reduced to the
 * node pairs that carry load branches (ports): W, the ports' admittance matrix with
 * every load open (Kron reduction: the inverse of the ports' transfer impedances
 * Z), and T, each unknown's voltage per unit current through each port. A solve with
 * load admittances Y (per port, the sum of its branches) is then a dense solve on
 * the ports:
 *
 *   (W + diag(Y))·v = W·v_open,   V = V_open − T·(Y∘v),
 *
 * with V_open the node voltages with every load open (sources and injections only).
 * This is the state assembling and factorising the nodal matrix with those
 * admittances gives, for a few dense operations on three to a dozen ports, and the
 * inverse (W + diag(Y))⁻¹ it forms is the loaded ports' transfer impedance the
 * Newton path of compiledNetwork.ts needs for its step, with no further work.
 *
 * Only where the fixed part alone is well determined and the ports are independent:
 * a node held only by loads (a floating star point, a broken neutral) has no
 * open-circuit voltage; a node held by a tiny admittance would make V_open − T·i
 * cancel large terms; ports that form a loop (loads A–B, B–C and C–A, or A–N, B–N
 * and A–B) have no W. Those networks take the sparse solve.
 */
import { factorInPlace, substituteInOrder, type SparsePattern } from '../_internal/sparseComplexLu.js';
import { invertComplexInPlace } from '../_internal/denseComplexInverse.js';

/**
 * Every pivot of the fixed part, and of Z when it is inverted, at least this fraction
 * of the largest: the reduction then costs at most about four digits of the sixteen,
 * far inside the solve tolerance (1e-10 of nominal by default).
 */
const WELL_DETERMINED = 1e-4;

export class LoadPortReduction {
  readonly portCount: number;
  private readonly pattern: SparsePattern;
  /** Factors of the fixed part, by slot of `pattern`. */
  private readonly fixedRe: Float64Array;
  private readonly fixedIm: Float64Array;
  private readonly portPositionFrom: Int32Array;
  private readonly portPositionTo: Int32Array;
  /** Voltage (from − to) of the port's ends that are fixed nodes (ideal EMFs), V. */
  private readonly portFixedRe: Float64Array;
  private readonly portFixedIm: Float64Array;
  /** T: column p (at p·size, elimination order) = the unknowns' voltages per unit current through port p. */
  private readonly towardRe: Float64Array;
  private readonly towardIm: Float64Array;
  /** W (ports × ports, row-major), S. */
  private readonly wRe: Float64Array;
  private readonly wIm: Float64Array;
  /** V_open (elimination order) and W·v_open with no injection: fixed at compile time. */
  private readonly sourceOpenRe: Float64Array;
  private readonly sourceOpenIm: Float64Array;
  private readonly sourceDriveRe: Float64Array;
  private readonly sourceDriveIm: Float64Array;
  /** The same with injections, when a caller sets them. */
  private readonly injectedOpenRe: Float64Array;
  private readonly injectedOpenIm: Float64Array;
  private readonly injectedDriveRe: Float64Array;
  private readonly injectedDriveIm: Float64Array;
  private injected = false;
  /** (W + diag(Y))⁻¹ of the last `solvePorts`: the loaded ports' transfer impedance, Ω (ports × ports). */
  readonly inverseRe: Float64Array;
  readonly inverseIm: Float64Array;
  private readonly pivots: Int32Array;
  /** The ports' voltages (from − to) in the last `solvePorts`, V, and their currents, A. */
  readonly voltageRe: Float64Array;
  readonly voltageIm: Float64Array;
  private readonly currentRe: Float64Array;
  private readonly currentIm: Float64Array;
  /** Admittance of each port (sum of its branches), S: set by the caller before `solvePorts`. */
  readonly admittanceRe: Float64Array;
  readonly admittanceIm: Float64Array;

  private constructor(
    pattern: SparsePattern,
    fixedRe: Float64Array,
    fixedIm: Float64Array,
    from: Int32Array,
    to: Int32Array,
    fixedVoltageRe: Float64Array,
    fixedVoltageIm: Float64Array,
    wRe: Float64Array,
    wIm: Float64Array,
    towardRe: Float64Array,
    towardIm: Float64Array,
  ) {
    const n = pattern.size;
    const q = from.length;
    this.portCount = q;
    this.pattern = pattern;
    this.fixedRe = fixedRe;
    this.fixedIm = fixedIm;
    this.portPositionFrom = from;
    this.portPositionTo = to;
    this.portFixedRe = fixedVoltageRe;
    this.portFixedIm = fixedVoltageIm;
    this.wRe = wRe;
    this.wIm = wIm;
    this.towardRe = towardRe;
    this.towardIm = towardIm;
    this.sourceOpenRe = new Float64Array(n);
    this.sourceOpenIm = new Float64Array(n);
    this.sourceDriveRe = new Float64Array(q);
    this.sourceDriveIm = new Float64Array(q);
    this.injectedOpenRe = new Float64Array(n);
    this.injectedOpenIm = new Float64Array(n);
    this.injectedDriveRe = new Float64Array(q);
    this.injectedDriveIm = new Float64Array(q);
    this.inverseRe = new Float64Array(q * q);
    this.inverseIm = new Float64Array(q * q);
    this.pivots = new Int32Array(q);
    this.voltageRe = new Float64Array(q);
    this.voltageIm = new Float64Array(q);
    this.currentRe = new Float64Array(q);
    this.currentIm = new Float64Array(q);
    this.admittanceRe = new Float64Array(q);
    this.admittanceIm = new Float64Array(q);
  }

  /**
   * Reduces the network with fixed-part values `baseRe/baseIm` (by slot of `pattern`)
   * and right-hand side `rhsRe/rhsIm` (by unknown: its sources) to the ports between
   * elimination positions `from[p]` and `to[p]` (-1: the reference or a fixed node,
   * whose voltages from − to are `fixedVoltageRe/Im[p]`). Null where the fixed part is
   * not well determined or the ports are not independent (see WELL_DETERMINED).
   */
  static build(
    pattern: SparsePattern,
    baseRe: Float64Array,
    baseIm: Float64Array,
    rhsRe: Float64Array,
    rhsIm: Float64Array,
    from: Int32Array,
    to: Int32Array,
    fixedVoltageRe: Float64Array,
    fixedVoltageIm: Float64Array,
  ): LoadPortReduction | null {
    const n = pattern.size;
    const q = from.length;
    const fixedRe = Float64Array.from(baseRe);
    const fixedIm = Float64Array.from(baseIm);
    let scale = 0;
    for (let k = 0; k < n; k++) {
      const d = pattern.diagonal[k]!;
      scale = Math.max(scale, Math.hypot(fixedRe[d]!, fixedIm[d]!));
    }
    if (!(scale > 0 && scale < Infinity) || factorInPlace(pattern, fixedRe, fixedIm, WELL_DETERMINED, scale) >= 0) return null;
    const towardRe = new Float64Array(q * n);
    const towardIm = new Float64Array(q * n);
    for (let p = 0; p < q; p++) {
      if (from[p]! >= 0) towardRe[p * n + from[p]!] = 1;
      if (to[p]! >= 0) towardRe[p * n + to[p]!] = -1;
      substituteInOrder(pattern, fixedRe, fixedIm, towardRe, towardIm, p * n);
    }
    const across = (x: Float64Array, offset: number, a: number) =>
      (from[a]! >= 0 ? x[offset + from[a]!]! : 0) - (to[a]! >= 0 ? x[offset + to[a]!]! : 0);
    const wRe = new Float64Array(q * q);
    const wIm = new Float64Array(q * q);
    for (let a = 0; a < q; a++)
      for (let p = 0; p < q; p++) {
        wRe[a * q + p] = across(towardRe, p * n, a);
        wIm[a * q + p] = across(towardIm, p * n, a);
      }
    if (!invertComplexInPlace(wRe, wIm, q, new Int32Array(q), WELL_DETERMINED)) return null;
    const reduction = new LoadPortReduction(pattern, fixedRe, fixedIm, from, to, fixedVoltageRe, fixedVoltageIm, wRe, wIm, towardRe, towardIm);
    reduction.openCircuitInto(rhsRe, rhsIm, reduction.sourceOpenRe, reduction.sourceOpenIm, reduction.sourceDriveRe, reduction.sourceDriveIm);
    for (const table of [wRe, wIm, towardRe, towardIm, reduction.sourceOpenRe, reduction.sourceOpenIm, reduction.sourceDriveRe, reduction.sourceDriveIm])
      for (const x of table) if (!Number.isFinite(x)) return null;
    return reduction;
  }

  /**
   * Sets the right-hand side for the next solves: `null` for the sources alone (fixed
   * at compile time), or the full one by unknown number (sources and injections).
   */
  openCircuit(rhsRe: Float64Array | null, rhsIm: Float64Array | null): void {
    this.injected = rhsRe !== null && rhsIm !== null;
    if (rhsRe !== null && rhsIm !== null)
      this.openCircuitInto(rhsRe, rhsIm, this.injectedOpenRe, this.injectedOpenIm, this.injectedDriveRe, this.injectedDriveIm);
  }

  /** V_open (elimination order) and W·v_open from a right-hand side by unknown number. */
  private openCircuitInto(rhsRe: Float64Array, rhsIm: Float64Array, oRe: Float64Array, oIm: Float64Array, dRe: Float64Array, dIm: Float64Array): void {
    const order = this.pattern.order;
    const n = this.pattern.size;
    const q = this.portCount;
    for (let k = 0; k < n; k++) {
      oRe[k] = rhsRe[order[k]!]!;
      oIm[k] = rhsIm[order[k]!]!;
    }
    substituteInOrder(this.pattern, this.fixedRe, this.fixedIm, oRe, oIm, 0);
    const vRe = this.voltageRe;
    const vIm = this.voltageIm;
    for (let a = 0; a < q; a++) {
      const f = this.portPositionFrom[a]!;
      const t = this.portPositionTo[a]!;
      vRe[a] = (f >= 0 ? oRe[f]! : 0) - (t >= 0 ? oRe[t]! : 0) + this.portFixedRe[a]!;
      vIm[a] = (f >= 0 ? oIm[f]! : 0) - (t >= 0 ? oIm[t]! : 0) + this.portFixedIm[a]!;
    }
    for (let a = 0; a < q; a++) {
      let sr = 0;
      let si = 0;
      for (let p = 0; p < q; p++) {
        const wr = this.wRe[a * q + p]!;
        const wi = this.wIm[a * q + p]!;
        sr += wr * vRe[p]! - wi * vIm[p]!;
        si += wr * vIm[p]! + wi * vRe[p]!;
      }
      dRe[a] = sr;
      dIm[a] = si;
    }
  }

  /**
   * The unknowns' voltages (elimination order, into `xRe/xIm`) with the port
   * admittances `admittanceRe/Im` and the last `openCircuit`; the ports' voltages in
   * `voltageRe/Im`. Returns the largest change of an unknown's voltage from what `x`
   * held, V (NaN when one is not finite), or -1, with `x` untouched, when
   * W + diag(Y) is singular.
   */
  solvePorts(xRe: Float64Array, xIm: Float64Array): number {
    const q = this.portCount;
    const n = this.pattern.size;
    const aRe = this.inverseRe;
    const aIm = this.inverseIm;
    const yRe = this.admittanceRe;
    const yIm = this.admittanceIm;
    const wRe = this.wRe;
    const wIm = this.wIm;
    for (let k = 0; k < q * q; k++) {
      aRe[k] = wRe[k]!;
      aIm[k] = wIm[k]!;
    }
    for (let a = 0; a < q; a++) {
      aRe[a * q + a] = aRe[a * q + a]! + yRe[a]!;
      aIm[a * q + a] = aIm[a * q + a]! + yIm[a]!;
    }
    if (!invertComplexInPlace(aRe, aIm, q, this.pivots)) return -1;
    const injected = this.injected;
    const dRe = injected ? this.injectedDriveRe : this.sourceDriveRe;
    const dIm = injected ? this.injectedDriveIm : this.sourceDriveIm;
    const vRe = this.voltageRe;
    const vIm = this.voltageIm;
    // Port currents (from → to): each leaves the network at `from` and returns at `to`.
    const iRe = this.currentRe;
    const iIm = this.currentIm;
    for (let a = 0; a < q; a++) {
      let sr = 0;
      let si = 0;
      for (let p = 0; p < q; p++) {
        const mr = aRe[a * q + p]!;
        const mi = aIm[a * q + p]!;
        sr += mr * dRe[p]! - mi * dIm[p]!;
        si += mr * dIm[p]! + mi * dRe[p]!;
      }
      vRe[a] = sr;
      vIm[a] = si;
      iRe[a] = yRe[a]! * sr - yIm[a]! * si;
      iIm[a] = yRe[a]! * si + yIm[a]! * sr;
    }
    const oRe = injected ? this.injectedOpenRe : this.sourceOpenRe;
    const oIm = injected ? this.injectedOpenIm : this.sourceOpenIm;
    const tRe = this.towardRe;
    const tIm = this.towardIm;
    let change2 = 0;
    for (let k = 0; k < n; k++) {
      let sr = oRe[k]!;
      let si = oIm[k]!;
      for (let p = 0; p < q; p++) {
        const tr = tRe[p * n + k]!;
        const ti = tIm[p * n + k]!;
        sr -= tr * iRe[p]! - ti * iIm[p]!;
        si -= tr * iIm[p]! + ti * iRe[p]!;
      }
      const dr = sr - xRe[k]!;
      const di = si - xIm[k]!;
      const d2 = dr * dr + di * di;
      if (d2 > change2 || Number.isNaN(d2)) change2 = d2;
      xRe[k] = sr;
      xIm[k] = si;
    }
    return Math.sqrt(change2);
  }
}
