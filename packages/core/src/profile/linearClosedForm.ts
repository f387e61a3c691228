/**
 * The closed-form path as one fused loop over intervals, for intervals whose
 * loads are all constant impedance (then no load iteration is needed): each
 * phase's admittance Y_k = conj(S_z,k)/V0² comes straight from the driver
 * columns, Millman gives the neutral-bar voltage, and every figure the
 * summaries read is written in the same pass. No calls, no allocation per
 * interval — this is the batch kernel the benchmark times against NumPy.
 */
import type { BatchNetwork, DriverColumns } from './batchNetwork.js';
import { closedFormBlocker } from './closedFormKernel.js';
import { modulus } from './batchKernel.js';
import type { IntervalFigures } from './solveBatch.js';
import { lineDeviationPercentOf } from '../analysis/unbalanceIndices.js';

const H = Math.sqrt(3) / 2;

/** True when the closed-form board has only constant-impedance parts in every driver. */
export function isLinearClosedForm(net: BatchNetwork): boolean {
  if (closedFormBlocker(net) || net.board.phases.length !== 3) return false;
  const k = net.coefficients;
  for (let j = 0; j < k.length; j += 6) if (k[j + 2] !== 0 || k[j + 3] !== 0 || k[j + 4] !== 0 || k[j + 5] !== 0) return false;
  return true;
}

/**
 * Solves intervals [from, to) of a linear closed-form board into `out`.
 * @throws {RangeError} when the board does not qualify (see isLinearClosedForm).
 */
export function solveLinearClosedForm(net: BatchNetwork, columns: DriverColumns, out: IntervalFigures, from = 0, to = columns.count): void {
  if (!isLinearClosedForm(net)) throw new RangeError('solveLinearClosedForm: the board needs phase-to-neutral constant-impedance loads on three phases and a neutral');
  const { board } = net;
  const E = net.edges.length;
  const v0 = board.nominalLineToNeutralV;
  const inv = 1 / (v0 * v0);
  // Per phase and driver: the constant-impedance coefficient (complex), zero where the phase has no edge.
  const D = columns.re.length;
  const kr = new Float64Array(3 * D);
  const ki = new Float64Array(3 * D);
  board.phases.forEach((p, ph) => {
    const e = net.edges.findIndex((x) => x.from === p);
    if (e < 0) return;
    for (let d = 0; d < D; d++) {
      kr[ph * D + d] = net.coefficients[(d * E + e) * 6]!;
      ki[ph * D + d] = net.coefficients[(d * E + e) * 6 + 1]!;
    }
  });
  const zr = board.sourceImpedance.re + board.lineImpedance.re;
  const zi = board.sourceImpedance.im + board.lineImpedance.im;
  const zn = board.neutralImpedance;
  const solid = zn.re === 0 && zn.im === 0;
  const znm = zn.re * zn.re + zn.im * zn.im;
  const ynr = solid ? 0 : zn.re / znm;
  const yni = solid ? 0 : -zn.im / znm;
  const [e0, e1, e2] = board.emf as [typeof board.emf[0], typeof board.emf[0], typeof board.emf[0]];
  const s = board.sequence === 'ABC' ? H : -H;
  const [a0, a1, a2] = out.lineA as [Float64Array, Float64Array, Float64Array];
  const [u0, u1, u2] = out.phaseV as [Float64Array, Float64Array, Float64Array];
  const [l01, l12, l20] = out.lineToLineV as [Float64Array, Float64Array, Float64Array];
  const [w0, w1, w2] = out.phaseW as [Float64Array, Float64Array, Float64Array];
  const [q0, q1, q2] = out.phaseVar as [Float64Array, Float64Array, Float64Array];
  const neutral = out.neutralA;
  const vuf = out.unbalancePercent;
  const deviation = out.lineDeviationPercent;
  const ar = columns.re;
  const ai = columns.im;
  for (let d = 0; d < 3 * D; d++) {
    // Fold conj(·)/V0² into the coefficients: Y = Σ_d conj(a_d·K_d)/V0².
    kr[d] = kr[d]! * inv;
    ki[d] = ki[d]! * inv;
  }
  for (let i = from; i < to; i++) {
    let y0r = 0;
    let y0i = 0;
    let y1r = 0;
    let y1i = 0;
    let y2r = 0;
    let y2i = 0;
    for (let d = 0; d < D; d++) {
      const xr = ar[d]![i]!;
      const xi = ai[d]![i]!;
      y0r += xr * kr[d]! - xi * ki[d]!;
      y0i -= xr * ki[d]! + xi * kr[d]!;
      y1r += xr * kr[D + d]! - xi * ki[D + d]!;
      y1i -= xr * ki[D + d]! + xi * kr[D + d]!;
      y2r += xr * kr[2 * D + d]! - xi * ki[2 * D + d]!;
      y2i -= xr * ki[2 * D + d]! + xi * kr[2 * D + d]!;
    }
    // Y' = Y / (1 + Z·Y) per phase.
    let gr = y0r;
    let gi = y0i;
    let dr = 1 + zr * gr - zi * gi;
    let di = zr * gi + zi * gr;
    let dm = 1 / (dr * dr + di * di);
    const p0r = (gr * dr + gi * di) * dm;
    const p0i = (gi * dr - gr * di) * dm;
    gr = y1r;
    gi = y1i;
    dr = 1 + zr * gr - zi * gi;
    di = zr * gi + zi * gr;
    dm = 1 / (dr * dr + di * di);
    const p1r = (gr * dr + gi * di) * dm;
    const p1i = (gi * dr - gr * di) * dm;
    gr = y2r;
    gi = y2i;
    dr = 1 + zr * gr - zi * gi;
    di = zr * gi + zi * gr;
    dm = 1 / (dr * dr + di * di);
    const p2r = (gr * dr + gi * di) * dm;
    const p2i = (gi * dr - gr * di) * dm;
    // Millman: V_N = Σ Y'_k E_k / (Σ Y'_k + Y_n); a solid neutral holds it at 0.
    let vnr = 0;
    let vni = 0;
    if (!solid) {
      const sr = ynr + p0r + p1r + p2r;
      const si = yni + p0i + p1i + p2i;
      const nr = p0r * e0.re - p0i * e0.im + p1r * e1.re - p1i * e1.im + p2r * e2.re - p2i * e2.im;
      const ni = p0r * e0.im + p0i * e0.re + p1r * e1.im + p1i * e1.re + p2r * e2.im + p2i * e2.re;
      const sm = 1 / (sr * sr + si * si);
      vnr = (nr * sr + ni * si) * sm;
      vni = (ni * sr - nr * si) * sm;
    }
    // Line currents, bus voltages, phase voltages (to the bar) and powers.
    let xr = e0.re - vnr;
    let xi = e0.im - vni;
    const i0r = p0r * xr - p0i * xi;
    const i0i = p0r * xi + p0i * xr;
    const b0r = e0.re - (zr * i0r - zi * i0i);
    const b0i = e0.im - (zr * i0i + zi * i0r);
    xr = e1.re - vnr;
    xi = e1.im - vni;
    const i1r = p1r * xr - p1i * xi;
    const i1i = p1r * xi + p1i * xr;
    const b1r = e1.re - (zr * i1r - zi * i1i);
    const b1i = e1.im - (zr * i1i + zi * i1r);
    xr = e2.re - vnr;
    xi = e2.im - vni;
    const i2r = p2r * xr - p2i * xi;
    const i2i = p2r * xi + p2i * xr;
    const b2r = e2.re - (zr * i2r - zi * i2i);
    const b2i = e2.im - (zr * i2i + zi * i2r);
    a0[i] = Math.sqrt(i0r * i0r + i0i * i0i);
    a1[i] = Math.sqrt(i1r * i1r + i1i * i1i);
    a2[i] = Math.sqrt(i2r * i2r + i2i * i2i);
    const inr = i0r + i1r + i2r;
    const ini = i0i + i1i + i2i;
    neutral[i] = Math.sqrt(inr * inr + ini * ini);
    let vr = b0r - vnr;
    let vi = b0i - vni;
    u0[i] = Math.sqrt(vr * vr + vi * vi);
    w0[i] = vr * i0r + vi * i0i;
    q0[i] = vi * i0r - vr * i0i;
    vr = b1r - vnr;
    vi = b1i - vni;
    u1[i] = Math.sqrt(vr * vr + vi * vi);
    w1[i] = vr * i1r + vi * i1i;
    q1[i] = vi * i1r - vr * i1i;
    vr = b2r - vnr;
    vi = b2i - vni;
    u2[i] = Math.sqrt(vr * vr + vi * vi);
    w2[i] = vr * i2r + vi * i2i;
    q2[i] = vi * i2r - vr * i2i;
    l01[i] = modulus(b0r - b1r, b0i - b1i);
    l12[i] = modulus(b1r - b2r, b1i - b2i);
    l20[i] = modulus(b2r - b0r, b2i - b0i);
    // |V2|/|V1| of the bus voltages (see recordInterval).
    const sumR = b0r - 0.5 * (b1r + b2r);
    const sumI = b0i - 0.5 * (b1i + b2i);
    const tr = -s * (b1i - b2i);
    const ti = s * (b1r - b2r);
    const pr = sumR + tr;
    const pi = sumI + ti;
    const nr2 = sumR - tr;
    const ni2 = sumI - ti;
    const m1 = pr * pr + pi * pi;
    vuf[i] = m1 === 0 ? 0 : 100 * Math.sqrt((nr2 * nr2 + ni2 * ni2) / m1);
    deviation[i] = lineDeviationPercentOf(l01[i]!, l12[i]!, l20[i]!);
  }
}
