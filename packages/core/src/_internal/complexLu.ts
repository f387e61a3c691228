/**
 * Dense complex LU solve with partial pivoting, on split real/imaginary typed arrays.
 *
 * Why by hand, when mathjs has `lup`/`lusolve`: both give the same answers
 * (test/reference/mathjsLinearSolve.test.ts checks this solver against mathjs on
 * random systems; test/reference/ngspice.test.ts checks whole board solves), but mathjs builds its typed
 * functions lazily on first use and dispatches every scalar operation through
 * them. Measured on the bakery example, `trivar solve` took 0.39 s with mathjs
 * and 0.20 s with this routine (bare `node -e ""`: 0.085 s); the start-up budget
 * is 3× bare node. Board networks are small (≤ a few dozen unknowns), so a
 * dense O(n³) elimination is the right tool.
 */
import type { ComplexValue } from '../complex.js';

export type LinearSolveResult =
  | { readonly ok: true; readonly x: ComplexValue[] }
  /** `column` is the unknown whose pivot vanished: the node (or source) that is not tied down. */
  | { readonly ok: false; readonly column: number };

/**
 * Solves A·x = b. A pivot no larger than `relativePivotTolerance` × the largest
 * |entry| of A counts as singular and is reported by column instead of dividing
 * by (almost) zero.
 */
export function solveComplexSystem(
  a: readonly (readonly ComplexValue[])[],
  b: readonly ComplexValue[],
  relativePivotTolerance = 1e-13,
): LinearSolveResult {
  const n = b.length;
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  const rhsRe = new Float64Array(n);
  const rhsIm = new Float64Array(n);
  let largest = 0;
  for (let i = 0; i < n; i++) {
    rhsRe[i] = b[i]!.re;
    rhsIm[i] = b[i]!.im;
    const row = a[i]!;
    for (let j = 0; j < n; j++) {
      const v = row[j]!;
      re[i * n + j] = v.re;
      im[i * n + j] = v.im;
      largest = Math.max(largest, Math.hypot(v.re, v.im));
    }
  }
  const swapRows = (p: number, q: number) => {
    for (let j = 0; j < n; j++) {
      const r = re[p * n + j]!;
      re[p * n + j] = re[q * n + j]!;
      re[q * n + j] = r;
      const m = im[p * n + j]!;
      im[p * n + j] = im[q * n + j]!;
      im[q * n + j] = m;
    }
    const r = rhsRe[p]!;
    rhsRe[p] = rhsRe[q]!;
    rhsRe[q] = r;
    const m = rhsIm[p]!;
    rhsIm[p] = rhsIm[q]!;
    rhsIm[q] = m;
  };
  for (let k = 0; k < n; k++) {
    let pivotRow = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const size = Math.hypot(re[i * n + k]!, im[i * n + k]!);
      if (size > best) {
        best = size;
        pivotRow = i;
      }
    }
    if (best <= relativePivotTolerance * largest) return { ok: false, column: k };
    if (pivotRow !== k) swapRows(pivotRow, k);
    const pr = re[k * n + k]!;
    const pi = im[k * n + k]!;
    const pd = pr * pr + pi * pi;
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k]!;
      const ai = im[i * n + k]!;
      if (ar === 0 && ai === 0) continue;
      // factor = a[i][k] / a[k][k]
      const fr = (ar * pr + ai * pi) / pd;
      const fi = (ai * pr - ar * pi) / pd;
      for (let j = k; j < n; j++) {
        const ur = re[k * n + j]!;
        const ui = im[k * n + j]!;
        re[i * n + j] = re[i * n + j]! - (fr * ur - fi * ui);
        im[i * n + j] = im[i * n + j]! - (fr * ui + fi * ur);
      }
      const br = rhsRe[k]!;
      const bi = rhsIm[k]!;
      rhsRe[i] = rhsRe[i]! - (fr * br - fi * bi);
      rhsIm[i] = rhsIm[i]! - (fr * bi + fi * br);
    }
  }
  const x = new Array<ComplexValue>(n);
  for (let i = n - 1; i >= 0; i--) {
    let sr = rhsRe[i]!;
    let si = rhsIm[i]!;
    for (let j = i + 1; j < n; j++) {
      const ur = re[i * n + j]!;
      const ui = im[i * n + j]!;
      const xj = x[j]!;
      sr -= ur * xj.re - ui * xj.im;
      si -= ur * xj.im + ui * xj.re;
    }
    const pr = re[i * n + i]!;
    const pi = im[i * n + i]!;
    const pd = pr * pr + pi * pi;
    x[i] = { re: (sr * pr + si * pi) / pd, im: (si * pr - sr * pi) / pd };
  }
  return { ok: true, x };
}

/**
 * For a singular A, the unknown that is least determined: the largest entry of
 * A's (near) null vector, found by one step of inverse iteration on A + εI.
 * Used only to name the culprit in an error message.
 */
export function leastDeterminedUnknown(a: readonly (readonly ComplexValue[])[]): number {
  const n = a.length;
  let largest = 0;
  for (const row of a) for (const v of row) largest = Math.max(largest, Math.hypot(v.re, v.im));
  const shift = 1e-9 * (largest || 1);
  const shifted = a.map((row, i) => row.map((v, j) => (i === j ? { re: v.re + shift, im: v.im } : v)));
  // A rhs with no special structure, so it has a component along the null vector.
  const rhs = Array.from({ length: n }, (_, i) => ({ re: 1 + i / n, im: 0.5 - i / (2 * n) }));
  const solved = solveComplexSystem(shifted, rhs, 0);
  if (!solved.ok) return solved.column;
  let best = 0;
  solved.x.forEach((v, i) => {
    if (Math.hypot(v.re, v.im) > Math.hypot(solved.x[best]!.re, solved.x[best]!.im)) best = i;
  });
  return best;
}
