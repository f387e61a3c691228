/**
 * A·x = b and A⁻¹ for a small dense complex symmetric matrix (A = Aᵀ, not Hermitian)
 * held split in two real typed arrays (n × n, row-major), by A = L·D·Lᵀ without
 * pivoting; no allocation. Half the work of a general LU, and the inverse, when it
 * is wanted, comes from the same factors. For the load ports of a network
 * (loadPortReduction.ts), whose matrix, the ports' admittances, is complex symmetric
 * and in practice strongly diagonal. Without pivoting a small pivot would cost
 * accuracy unseen, so the factorisation refuses one below `PIVOT_FLOOR` of the
 * largest entry, and the caller takes a pivoted solve instead.
 */

/**
 * Each pivot at least this fraction of the matrix's largest entry (sizes as |re| + |im|):
 * each elimination step then grows the entries by at most about 1/PIVOT_FLOOR, a few
 * digits of the sixteen for the three to a dozen ports this serves.
 */
export const PIVOT_FLOOR = 1e-2;

/**
 * Factorises in place: the strict lower triangle receives L (unit diagonal), the
 * diagonal D⁻¹ (the reciprocals of the pivots: every later use multiplies), the
 * strict upper triangle L·D transposed (scratch for the factorisation). Returns
 * false, with the matrix spoiled, when a pivot is below PIVOT_FLOOR of the largest
 * entry or not finite.
 */
export function factorSymmetricInPlace(re: Float64Array, im: Float64Array, n: number): boolean {
  let largest = 0;
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const size = Math.abs(re[i * n + j]!) + Math.abs(im[i * n + j]!);
      if (size > largest) largest = size;
    }
  const floor = PIVOT_FLOOR * largest;
  for (let k = 0; k < n; k++) {
    const kk = k * n + k;
    let dr = re[kk]!;
    let di = im[kk]!;
    // d_k = a_kk − Σ_j l_kj·(l_kj·d_j), with each l_kj·d_j kept at (j, k) when column j was done.
    for (let j = 0; j < k; j++) {
      const lr = re[k * n + j]!;
      const li = im[k * n + j]!;
      const pr = re[j * n + k]!;
      const pi = im[j * n + k]!;
      dr -= lr * pr - li * pi;
      di -= lr * pi + li * pr;
    }
    const pivot = Math.abs(dr) + Math.abs(di);
    if (!(pivot >= floor) || !(pivot > 0) || !(pivot < Infinity)) return false;
    const dd = dr * dr + di * di;
    const invR = dr / dd;
    const invI = -di / dd;
    re[kk] = invR;
    im[kk] = invI;
    // l_ik·d_k = a_ik − Σ_j l_ij·(l_kj·d_j) for the rows below; l_ik from it.
    for (let i = k + 1; i < n; i++) {
      let sr = re[i * n + k]!;
      let si = im[i * n + k]!;
      for (let j = 0; j < k; j++) {
        const lr = re[i * n + j]!;
        const li = im[i * n + j]!;
        const pr = re[j * n + k]!;
        const pi = im[j * n + k]!;
        sr -= lr * pr - li * pi;
        si -= lr * pi + li * pr;
      }
      re[k * n + i] = sr;
      im[k * n + i] = si;
      re[i * n + k] = sr * invR - si * invI;
      im[i * n + k] = sr * invI + si * invR;
    }
  }
  return true;
}

/** Solves with the factors of `factorSymmetricInPlace`, in place on (`bRe`, `bIm`). */
export function solveSymmetricFactored(re: Float64Array, im: Float64Array, n: number, bRe: Float64Array, bIm: Float64Array): void {
  for (let i = 1; i < n; i++) {
    let sr = bRe[i]!;
    let si = bIm[i]!;
    for (let j = 0; j < i; j++) {
      const lr = re[i * n + j]!;
      const li = im[i * n + j]!;
      sr -= lr * bRe[j]! - li * bIm[j]!;
      si -= lr * bIm[j]! + li * bRe[j]!;
    }
    bRe[i] = sr;
    bIm[i] = si;
  }
  for (let i = 0; i < n; i++) {
    const dr = re[i * n + i]!;
    const di = im[i * n + i]!;
    const sr = bRe[i]!;
    const si = bIm[i]!;
    bRe[i] = sr * dr - si * di;
    bIm[i] = sr * di + si * dr;
  }
  for (let i = n - 2; i >= 0; i--) {
    let sr = bRe[i]!;
    let si = bIm[i]!;
    for (let j = i + 1; j < n; j++) {
      const lr = re[j * n + i]!;
      const li = im[j * n + i]!;
      sr -= lr * bRe[j]! - li * bIm[j]!;
      si -= lr * bIm[j]! + li * bRe[j]!;
    }
    bRe[i] = sr;
    bIm[i] = si;
  }
}

/**
 * A⁻¹ = L⁻ᵀ·D⁻¹·L⁻¹ from the factors of `factorSymmetricInPlace`, into (`outRe`,
 * `outIm`) (n × n, full): M = L⁻¹ first (in the strict lower triangle of `out`), then
 * each A⁻¹(c, i) = Σ_{k ≥ i} M(k, c)·D⁻¹(k)·M(k, i) for c ≤ i (upper triangle), then
 * mirrored.
 */
export function invertSymmetricFactored(re: Float64Array, im: Float64Array, n: number, outRe: Float64Array, outIm: Float64Array): void {
  for (let i = 1; i < n; i++)
    for (let c = 0; c < i; c++) {
      // M(i, c) = −L(i, c) − Σ_{c<j<i} L(i, j)·M(j, c)
      let sr = -re[i * n + c]!;
      let si = -im[i * n + c]!;
      for (let j = c + 1; j < i; j++) {
        const lr = re[i * n + j]!;
        const li = im[i * n + j]!;
        const mr = outRe[j * n + c]!;
        const mi = outIm[j * n + c]!;
        sr -= lr * mr - li * mi;
        si -= lr * mi + li * mr;
      }
      outRe[i * n + c] = sr;
      outIm[i * n + c] = si;
    }
  for (let c = 0; c < n; c++)
    for (let i = c; i < n; i++) {
      let sr = 0;
      let si = 0;
      for (let k = i; k < n; k++) {
        // M(k, c)·D⁻¹(k)·M(k, i), M's diagonal being 1.
        const ar = k === c ? 1 : outRe[k * n + c]!;
        const ai = k === c ? 0 : outIm[k * n + c]!;
        const br = k === i ? 1 : outRe[k * n + i]!;
        const bi = k === i ? 0 : outIm[k * n + i]!;
        const dr = re[k * n + k]!;
        const di = im[k * n + k]!;
        const pr = ar * br - ai * bi;
        const pi = ar * bi + ai * br;
        sr += pr * dr - pi * di;
        si += pr * di + pi * dr;
      }
      outRe[c * n + i] = sr;
      outIm[c * n + i] = si;
    }
  for (let i = 1; i < n; i++)
    for (let c = 0; c < i; c++) {
      outRe[i * n + c] = outRe[c * n + i]!;
      outIm[i * n + c] = outIm[c * n + i]!;
    }
}
