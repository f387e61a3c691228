/**
 * Nodal matrices for the impedance seen between terminals with every EMF
 * shorted (the network "looking in" from a board, as a frequency scan needs
 * it; harmonics/scanEvaluator.ts numbers the unknowns from the compiled
 * circuit). A scan evaluates hundreds of thousands of them, so a matrix lives
 * in two flat typed arrays and is inverted in place: the general solve's
 * object arithmetic would dominate (see bench/harmonic-scan.bench.ts).
 * `solveFixedNetwork` with a 1 A source between the two terminals gives the
 * same numbers (test/harmonics checks it).
 */
import { NumericalError } from '../errors.js';

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
