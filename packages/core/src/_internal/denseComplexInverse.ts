/**
 * Inverse of a small dense complex matrix held split in two real typed arrays
 * (n × n, row-major), in place, by Gauss–Jordan elimination with partial pivoting;
 * no allocation. For the few load ports of a network (loadPortReduction.ts),
 * inverted several times per network solve, where the inverse itself is wanted
 * (it is the loaded ports' transfer impedance the Newton step needs): complexLu.ts
 * works on objects and allocates per call.
 */

/**
 * Replaces (`re`, `im`) by its inverse; `pivots` (length n) is scratch. Returns
 * false, with the matrix spoiled, when a pivot is at most `relativePivot` × the
 * largest entry (no well-determined inverse) or is not finite.
 */
export function invertComplexInPlace(re: Float64Array, im: Float64Array, n: number, pivots: Int32Array, relativePivot = 1e-13): boolean {
  let largest = 0;
  for (let k = 0; k < n * n; k++) {
    const size = Math.abs(re[k]!) + Math.abs(im[k]!);
    if (size > largest) largest = size;
  }
  const floor = relativePivot * largest;
  for (let c = 0; c < n; c++) {
    let pivot = c;
    let best = Math.abs(re[c * n + c]!) + Math.abs(im[c * n + c]!);
    for (let r = c + 1; r < n; r++) {
      const size = Math.abs(re[r * n + c]!) + Math.abs(im[r * n + c]!);
      if (size > best) {
        best = size;
        pivot = r;
      }
    }
    if (!(best > floor) || !(best < Infinity)) return false;
    pivots[c] = pivot;
    if (pivot !== c) swapRows(re, im, n, c, pivot);
    // Row c ← row c / pivot, with the pivot's own slot becoming 1/pivot.
    const dr = re[c * n + c]!;
    const di = im[c * n + c]!;
    const dd = dr * dr + di * di;
    const pr = dr / dd;
    const pi = -di / dd;
    re[c * n + c] = 1;
    im[c * n + c] = 0;
    for (let j = 0; j < n; j++) {
      const ar = re[c * n + j]!;
      const ai = im[c * n + j]!;
      re[c * n + j] = ar * pr - ai * pi;
      im[c * n + j] = ar * pi + ai * pr;
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const fr = re[r * n + c]!;
      const fi = im[r * n + c]!;
      if (fr === 0 && fi === 0) continue;
      re[r * n + c] = 0;
      im[r * n + c] = 0;
      for (let j = 0; j < n; j++) {
        const ur = re[c * n + j]!;
        const ui = im[c * n + j]!;
        re[r * n + j] = re[r * n + j]! - (fr * ur - fi * ui);
        im[r * n + j] = im[r * n + j]! - (fr * ui + fi * ur);
      }
    }
  }
  // Row swaps during elimination are column swaps of the inverse, undone last to first.
  for (let c = n - 1; c >= 0; c--) {
    const pivot = pivots[c]!;
    if (pivot === c) continue;
    for (let r = 0; r < n; r++) {
      const a = r * n + c;
      const b = r * n + pivot;
      const tr = re[a]!;
      const ti = im[a]!;
      re[a] = re[b]!;
      im[a] = im[b]!;
      re[b] = tr;
      im[b] = ti;
    }
  }
  return true;
}

function swapRows(re: Float64Array, im: Float64Array, n: number, a: number, b: number): void {
  for (let j = 0; j < n; j++) {
    const x = a * n + j;
    const y = b * n + j;
    const tr = re[x]!;
    const ti = im[x]!;
    re[x] = re[y]!;
    im[x] = im[y]!;
    re[y] = tr;
    im[y] = ti;
  }
}
