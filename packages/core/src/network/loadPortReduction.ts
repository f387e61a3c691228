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
import { factorSymmetricInPlace, invertSymmetricFactored, PIVOT_FLOOR, solveSymmetricFactored } from '../_internal/symmetricComplexLdl.js';

/**
 * Every pivot of the fixed part, and of Z when it is inverted, at least this fraction
 * of the largest: the reduction then costs at most about four digits of the sixteen,
 * far inside the solve tolerance (1e-10 of nominal by default).
 */
const WELL_DETERMINED = 1e-4;

/**
 * Typed arrays carved out of one allocation: on Node 20 a fresh typed array costs
 * about as much as a whole small solve, and a reduction holds some thirty of them.
 */
class Slab<T extends Float64Array | Int32Array> {
  private offset = 0;
  constructor(private readonly buffer: T) {}
  take(length: number): T {
    const view = this.buffer.subarray(this.offset, this.offset + length) as T;
    this.offset += length;
    return view;
  }
}

const EMPTY = new Float64Array(0);

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
  readonly towardRe: Float64Array;
  readonly towardIm: Float64Array;
  /** W (ports × ports, row-major), S. */
  readonly wRe: Float64Array;
  readonly wIm: Float64Array;
  /** V_open (elimination order) and W·v_open with no injection: fixed at compile time. */
  private readonly sourceOpenRe: Float64Array;
  private readonly sourceOpenIm: Float64Array;
  private readonly sourceDriveRe: Float64Array;
  private readonly sourceDriveIm: Float64Array;
  /** The same with injections, when a caller sets them (made at the first such solve). */
  private injectedOpenRe = EMPTY;
  private injectedOpenIm = EMPTY;
  private injectedDriveRe = EMPTY;
  private injectedDriveIm = EMPTY;
  private injected = false;
  /** W + diag(Y) of the last `solvePorts`, as L·D·Lᵀ factors (or spoiled, when `inverted` holds the inverse instead). */
  private readonly factorRe: Float64Array;
  private readonly factorIm: Float64Array;
  /**
   * (W + diag(Y))⁻¹ of the last `solvePorts`, the loaded ports' transfer impedance, Ω
   * (ports × ports): filled by `loadedTransfer`, or by `solvePorts` itself when it
   * had to invert with pivoting.
   */
  readonly inverseRe: Float64Array;
  readonly inverseIm: Float64Array;
  private inverted = false;
  private readonly pivots: Int32Array;
  private readonly columnRe: Float64Array;
  private readonly columnIm: Float64Array;
  /** The ports' voltages (from − to) in the last `solvePorts`, V, and their currents, A. */
  readonly voltageRe: Float64Array;
  readonly voltageIm: Float64Array;
  private readonly currentRe: Float64Array;
  private readonly currentIm: Float64Array;
  /** Admittance of each port (sum of its branches), S: set by the caller before `solvePorts`. */
  readonly admittanceRe: Float64Array;
  readonly admittanceIm: Float64Array;

  private constructor(pattern: SparsePattern, ports: number, floats: Slab<Float64Array>, ints: Slab<Int32Array>) {
    const n = pattern.size;
    this.portCount = ports;
    this.pattern = pattern;
    this.fixedRe = floats.take(pattern.slotCount);
    this.fixedIm = floats.take(pattern.slotCount);
    this.portPositionFrom = ints.take(ports);
    this.portPositionTo = ints.take(ports);
    this.pivots = ints.take(ports);
    this.portFixedRe = floats.take(ports);
    this.portFixedIm = floats.take(ports);
    this.towardRe = floats.take(ports * n);
    this.towardIm = floats.take(ports * n);
    this.wRe = floats.take(ports * ports);
    this.wIm = floats.take(ports * ports);
    this.sourceOpenRe = floats.take(n);
    this.sourceOpenIm = floats.take(n);
    this.sourceDriveRe = floats.take(ports);
    this.sourceDriveIm = floats.take(ports);
    this.factorRe = floats.take(ports * ports);
    this.factorIm = floats.take(ports * ports);
    this.inverseRe = floats.take(ports * ports);
    this.inverseIm = floats.take(ports * ports);
    this.columnRe = floats.take(ports);
    this.columnIm = floats.take(ports);
    this.voltageRe = floats.take(ports);
    this.voltageIm = floats.take(ports);
    this.currentRe = floats.take(ports);
    this.currentIm = floats.take(ports);
    this.admittanceRe = floats.take(ports);
    this.admittanceIm = floats.take(ports);
  }

  /** Floats the constructor carves, for `ports` ports on `pattern`. */
  private static floatsFor(pattern: SparsePattern, ports: number): number {
    return 2 * pattern.slotCount + 2 * ports * pattern.size + 6 * ports * ports + 2 * pattern.size + 12 * ports;
  }

  /**
   * Reduces the network with fixed-part values `baseRe/baseIm` (by slot of `pattern`)
   * and right-hand side `rhsRe/rhsIm` (by unknown: its sources) to the ports between
   * elimination positions `from[p]` and `to[p]` (-1: the reference or a fixed node,
   * whose voltages from − to are `fixedVoltageRe/Im[p]`). Null where the fixed part is
   * not well determined or the ports are not independent (see WELL_DETERMINED). One or
   * two ports are made three with ports that carry nothing (W's identity, no transfer,
   * open at both ends), so that they take the three-port solve.
   */
  static build(
    pattern: SparsePattern,
    baseRe: Float64Array,
    baseIm: Float64Array,
    rhsRe: Float64Array,
    rhsIm: Float64Array,
    from: readonly number[],
    to: readonly number[],
    fixedVoltageRe: readonly number[],
    fixedVoltageIm: readonly number[],
  ): LoadPortReduction | null {
    const n = pattern.size;
    const q = from.length;
    const ports = Math.max(q, 3);
    const floats = new Slab(new Float64Array(LoadPortReduction.floatsFor(pattern, ports) + 2 * q * q));
    const ints = new Slab(new Int32Array(3 * ports + q));
    const r = new LoadPortReduction(pattern, ports, floats, ints);
    const { fixedRe, fixedIm, towardRe, towardIm } = r;
    let scale = 0;
    for (let s = 0; s < pattern.slotCount; s++) {
      fixedRe[s] = baseRe[s]!;
      fixedIm[s] = baseIm[s]!;
    }
    for (let k = 0; k < n; k++) {
      const d = pattern.diagonal[k]!;
      scale = Math.max(scale, Math.sqrt(fixedRe[d]! * fixedRe[d]! + fixedIm[d]! * fixedIm[d]!));
    }
    if (!(scale > 0 && scale < Infinity) || factorInPlace(pattern, fixedRe, fixedIm, WELL_DETERMINED, scale) >= 0) return null;
    for (let p = 0; p < ports; p++) {
      r.portPositionFrom[p] = p < q ? from[p]! : -1;
      r.portPositionTo[p] = p < q ? to[p]! : -1;
      r.portFixedRe[p] = p < q ? fixedVoltageRe[p]! : 0;
      r.portFixedIm[p] = p < q ? fixedVoltageIm[p]! : 0;
    }
    for (let p = 0; p < q; p++) {
      if (from[p]! >= 0) towardRe[p * n + from[p]!] = 1;
      if (to[p]! >= 0) towardRe[p * n + to[p]!] = -1;
      substituteInOrder(pattern, fixedRe, fixedIm, towardRe, towardIm, p * n);
    }
    // Z (q × q), inverted in place to W, then set into the ports' table (identity for padding).
    const zRe = floats.take(q * q);
    const zIm = floats.take(q * q);
    for (let a = 0; a < q; a++)
      for (let p = 0; p < q; p++) {
        zRe[a * q + p] = r.across(towardRe, p * n, a);
        zIm[a * q + p] = r.across(towardIm, p * n, a);
      }
    if (!invertComplexInPlace(zRe, zIm, q, ints.take(q), WELL_DETERMINED)) return null;
    for (let a = 0; a < ports; a++)
      for (let p = 0; p < ports; p++) {
        r.wRe[a * ports + p] = a < q && p < q ? zRe[a * q + p]! : a === p ? 1 : 0;
        r.wIm[a * ports + p] = a < q && p < q ? zIm[a * q + p]! : 0;
      }
    r.openCircuitInto(rhsRe, rhsIm, r.sourceOpenRe, r.sourceOpenIm, r.sourceDriveRe, r.sourceDriveIm);
    for (const table of [r.wRe, r.wIm, towardRe, towardIm, r.sourceOpenRe, r.sourceOpenIm, r.sourceDriveRe, r.sourceDriveIm])
      for (let k = 0; k < table.length; k++) if (!Number.isFinite(table[k]!)) return null;
    return r;
  }

  /** V_open of the last `openCircuit` (elimination order), V, and W·v_open, A. */
  get openRe(): Float64Array {
    return this.injected ? this.injectedOpenRe : this.sourceOpenRe;
  }
  get openIm(): Float64Array {
    return this.injected ? this.injectedOpenIm : this.sourceOpenIm;
  }
  get driveRe(): Float64Array {
    return this.injected ? this.injectedDriveRe : this.sourceDriveRe;
  }
  get driveIm(): Float64Array {
    return this.injected ? this.injectedDriveIm : this.sourceDriveIm;
  }

  /** Voltage across port a (from − to) of the vector at `offset` in `x` (elimination order), its fixed ends left out. */
  private across(x: Float64Array, offset: number, a: number): number {
    const f = this.portPositionFrom[a]!;
    const t = this.portPositionTo[a]!;
    return (f >= 0 ? x[offset + f]! : 0) - (t >= 0 ? x[offset + t]! : 0);
  }

  /**
   * Sets the right-hand side for the next solves: `null` for the sources alone (fixed
   * at compile time), or the full one by unknown number (sources and injections).
   */
  openCircuit(rhsRe: Float64Array | null, rhsIm: Float64Array | null): void {
    this.injected = rhsRe !== null && rhsIm !== null;
    if (rhsRe !== null && rhsIm !== null && this.injectedOpenRe.length === 0) {
      this.injectedOpenRe = new Float64Array(this.pattern.size);
      this.injectedOpenIm = new Float64Array(this.pattern.size);
      this.injectedDriveRe = new Float64Array(this.portCount);
      this.injectedDriveIm = new Float64Array(this.portCount);
    }
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
    if (this.portCount === 3) return this.solveThreePorts(xRe, xIm);
    const q = this.portCount;
    const n = this.pattern.size;
    const fRe = this.factorRe;
    const fIm = this.factorIm;
    const yRe = this.admittanceRe;
    const yIm = this.admittanceIm;
    const wRe = this.wRe;
    const wIm = this.wIm;
    // The lower triangle and diagonal are all the L·D·Lᵀ factorisation reads.
    for (let a = 0; a < q; a++) {
      for (let b = 0; b < a; b++) {
        fRe[a * q + b] = wRe[a * q + b]!;
        fIm[a * q + b] = wIm[a * q + b]!;
      }
      fRe[a * q + a] = wRe[a * q + a]! + yRe[a]!;
      fIm[a * q + a] = wIm[a * q + a]! + yIm[a]!;
    }
    const injected = this.injected;
    const dRe = injected ? this.injectedDriveRe : this.sourceDriveRe;
    const dIm = injected ? this.injectedDriveIm : this.sourceDriveIm;
    const vRe = this.voltageRe;
    const vIm = this.voltageIm;
    for (let a = 0; a < q; a++) {
      vRe[a] = dRe[a]!;
      vIm[a] = dIm[a]!;
    }
    this.inverted = !factorSymmetricInPlace(fRe, fIm, q);
    if (!this.inverted) solveSymmetricFactored(fRe, fIm, q, vRe, vIm);
    else if (!this.solveByInverse()) return -1;
    // Port currents (from → to): each leaves the network at `from` and returns at `to`.
    const iRe = this.currentRe;
    const iIm = this.currentIm;
    for (let a = 0; a < q; a++) {
      iRe[a] = yRe[a]! * vRe[a]! - yIm[a]! * vIm[a]!;
      iIm[a] = yRe[a]! * vIm[a]! + yIm[a]! * vRe[a]!;
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

  /**
   * Where L·D·Lᵀ refused a pivot: v = (W + diag(Y))⁻¹·(W·v_open) by the pivoted
   * inverse, which then also serves `loadedTransfer`. False when it is singular.
   */
  private solveByInverse(): boolean {
    const q = this.portCount;
    const aRe = this.inverseRe;
    const aIm = this.inverseIm;
    for (let k = 0; k < q * q; k++) {
      aRe[k] = this.wRe[k]!;
      aIm[k] = this.wIm[k]!;
    }
    for (let a = 0; a < q; a++) {
      aRe[a * q + a] = aRe[a * q + a]! + this.admittanceRe[a]!;
      aIm[a * q + a] = aIm[a * q + a]! + this.admittanceIm[a]!;
    }
    if (!invertComplexInPlace(aRe, aIm, q, this.pivots)) return false;
    const vRe = this.voltageRe;
    const vIm = this.voltageIm;
    const dRe = this.columnRe;
    const dIm = this.columnIm;
    for (let a = 0; a < q; a++) {
      dRe[a] = vRe[a]!;
      dIm[a] = vIm[a]!;
    }
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
    }
    return true;
  }

  /**
   * `solvePorts` for three ports (most boards: loads from each phase to neutral, or
   * padded up from one or two), written out: the L·D·Lᵀ factors, the substitutions
   * and the port currents in locals. Loops over three-element arrays cost more than
   * the arithmetic here, and this runs several times per network solve. Same factors,
   * same layout, same pivot rule as the general path.
   */
  private solveThreePorts(xRe: Float64Array, xIm: Float64Array): number {
    const wRe = this.wRe;
    const wIm = this.wIm;
    const yRe = this.admittanceRe;
    const yIm = this.admittanceIm;
    const y0r = yRe[0]!;
    const y0i = yIm[0]!;
    const y1r = yRe[1]!;
    const y1i = yIm[1]!;
    const y2r = yRe[2]!;
    const y2i = yIm[2]!;
    // A = W + diag(Y), lower triangle.
    const a00r = wRe[0]! + y0r;
    const a00i = wIm[0]! + y0i;
    const a10r = wRe[3]!;
    const a10i = wIm[3]!;
    const a11r = wRe[4]! + y1r;
    const a11i = wIm[4]! + y1i;
    const a20r = wRe[6]!;
    const a20i = wIm[6]!;
    const a21r = wRe[7]!;
    const a21i = wIm[7]!;
    const a22r = wRe[8]! + y2r;
    const a22i = wIm[8]! + y2i;
    // Pivot 0 and the first column of L.
    let dd = a00r * a00r + a00i * a00i;
    const e0r = a00r / dd;
    const e0i = -a00i / dd;
    const l10r = a10r * e0r - a10i * e0i;
    const l10i = a10r * e0i + a10i * e0r;
    const l20r = a20r * e0r - a20i * e0i;
    const l20i = a20r * e0i + a20i * e0r;
    // Pivot 1 = a11 − l10·a10; then l21 = (a21 − l20·a10) / pivot 1.
    const d1r = a11r - (l10r * a10r - l10i * a10i);
    const d1i = a11i - (l10r * a10i + l10i * a10r);
    dd = d1r * d1r + d1i * d1i;
    const e1r = d1r / dd;
    const e1i = -d1i / dd;
    const p21r = a21r - (l20r * a10r - l20i * a10i);
    const p21i = a21i - (l20r * a10i + l20i * a10r);
    const l21r = p21r * e1r - p21i * e1i;
    const l21i = p21r * e1i + p21i * e1r;
    // Pivot 2 = a22 − l20·a20 − l21·(a21 − l20·a10).
    const d2r = a22r - (l20r * a20r - l20i * a20i) - (l21r * p21r - l21i * p21i);
    const d2i = a22i - (l20r * a20i + l20i * a20r) - (l21r * p21i + l21i * p21r);
    dd = d2r * d2r + d2i * d2i;
    const e2r = d2r / dd;
    const e2i = -d2i / dd;
    // The pivot rule of factorSymmetricInPlace: each pivot at least PIVOT_FLOOR of the largest entry.
    const largest = Math.max(
      Math.abs(a00r) + Math.abs(a00i),
      Math.abs(a10r) + Math.abs(a10i),
      Math.abs(a11r) + Math.abs(a11i),
      Math.abs(a20r) + Math.abs(a20i),
      Math.abs(a21r) + Math.abs(a21i),
      Math.abs(a22r) + Math.abs(a22i),
    );
    const small = (dr: number, di: number) => {
      const pivot = Math.abs(dr) + Math.abs(di);
      return !(pivot >= PIVOT_FLOOR * largest) || !(pivot > 0) || !(pivot < Infinity);
    };
    const vRe = this.voltageRe;
    const vIm = this.voltageIm;
    const injected = this.injected;
    const dRe = injected ? this.injectedDriveRe : this.sourceDriveRe;
    const dIm = injected ? this.injectedDriveIm : this.sourceDriveIm;
    if (small(a00r, a00i) || small(d1r, d1i) || small(d2r, d2i)) {
      for (let a = 0; a < 3; a++) {
        vRe[a] = dRe[a]!;
        vIm[a] = dIm[a]!;
      }
      this.inverted = true;
      if (!this.solveByInverse()) return -1;
    } else {
      const fRe = this.factorRe;
      const fIm = this.factorIm;
      fRe[0] = e0r;
      fIm[0] = e0i;
      fRe[4] = e1r;
      fIm[4] = e1i;
      fRe[8] = e2r;
      fIm[8] = e2i;
      fRe[3] = l10r;
      fIm[3] = l10i;
      fRe[6] = l20r;
      fIm[6] = l20i;
      fRe[7] = l21r;
      fIm[7] = l21i;
      this.inverted = false;
      // Forward (unit L), D⁻¹, backward (Lᵀ).
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
      vRe[0] = c0r - (l10r * v1r - l10i * v1i) - (l20r * v2r - l20i * v2i);
      vIm[0] = c0i - (l10r * v1i + l10i * v1r) - (l20r * v2i + l20i * v2r);
      vRe[1] = v1r;
      vIm[1] = v1i;
      vRe[2] = v2r;
      vIm[2] = v2i;
    }
    // Port currents, then V = V_open − T·i with the change from what `x` held.
    const v0r = vRe[0]!;
    const v0i = vIm[0]!;
    const v1r = vRe[1]!;
    const v1i = vIm[1]!;
    const v2r = vRe[2]!;
    const v2i = vIm[2]!;
    const i0r = y0r * v0r - y0i * v0i;
    const i0i = y0r * v0i + y0i * v0r;
    const i1r = y1r * v1r - y1i * v1i;
    const i1i = y1r * v1i + y1i * v1r;
    const i2r = y2r * v2r - y2i * v2i;
    const i2i = y2r * v2i + y2i * v2r;
    const n = this.pattern.size;
    const oRe = injected ? this.injectedOpenRe : this.sourceOpenRe;
    const oIm = injected ? this.injectedOpenIm : this.sourceOpenIm;
    const tRe = this.towardRe;
    const tIm = this.towardIm;
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
    return Math.sqrt(change2);
  }

  /** Fills `inverseRe/Im` for the last `solvePorts` (see there). */
  loadedTransfer(): void {
    if (!this.inverted && this.portCount === 3) this.invertThreePorts();
    else if (!this.inverted) invertSymmetricFactored(this.factorRe, this.factorIm, this.portCount, this.inverseRe, this.inverseIm);
    this.inverted = true;
  }

  /** `invertSymmetricFactored` for three ports, written out: A⁻¹ = Mᵀ·D⁻¹·M with M = L⁻¹. */
  private invertThreePorts(): void {
    const fRe = this.factorRe;
    const fIm = this.factorIm;
    const e0r = fRe[0]!;
    const e0i = fIm[0]!;
    const e1r = fRe[4]!;
    const e1i = fIm[4]!;
    const e2r = fRe[8]!;
    const e2i = fIm[8]!;
    const l10r = fRe[3]!;
    const l10i = fIm[3]!;
    const l20r = fRe[6]!;
    const l20i = fIm[6]!;
    const l21r = fRe[7]!;
    const l21i = fIm[7]!;
    // M = L⁻¹: m10 = −l10, m21 = −l21, m20 = l21·l10 − l20.
    const m10r = -l10r;
    const m10i = -l10i;
    const m21r = -l21r;
    const m21i = -l21i;
    const m20r = l21r * l10r - l21i * l10i - l20r;
    const m20i = l21r * l10i + l21i * l10r - l20i;
    // Products with D⁻¹ used more than once.
    const g1r = m10r * e1r - m10i * e1i; // m10·e1
    const g1i = m10r * e1i + m10i * e1r;
    const g2r = m20r * e2r - m20i * e2i; // m20·e2
    const g2i = m20r * e2i + m20i * e2r;
    const h2r = m21r * e2r - m21i * e2i; // m21·e2
    const h2i = m21r * e2i + m21i * e2r;
    const out = (k: number, re: number, im: number) => {
      this.inverseRe[k] = re;
      this.inverseIm[k] = im;
    };
    out(8, e2r, e2i);
    out(5, h2r, h2i);
    out(7, h2r, h2i);
    out(2, g2r, g2i);
    out(6, g2r, g2i);
    // (1,1) = e1 + m21·(m21·e2)
    out(4, e1r + (m21r * h2r - m21i * h2i), e1i + (m21r * h2i + m21i * h2r));
    // (0,1) = m10·e1 + m21·(m20·e2)
    const r01 = g1r + (m21r * g2r - m21i * g2i);
    const i01 = g1i + (m21r * g2i + m21i * g2r);
    out(1, r01, i01);
    out(3, r01, i01);
    // (0,0) = e0 + m10·(m10·e1) + m20·(m20·e2)
    out(0, e0r + (m10r * g1r - m10i * g1i) + (m20r * g2r - m20i * g2i), e0i + (m10r * g1i + m10i * g1r) + (m20r * g2i + m20i * g2r));
  }
}
