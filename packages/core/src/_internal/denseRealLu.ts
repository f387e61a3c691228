/**
 * LU with partial pivoting of a small dense real matrix, in place (`a` n × n,
 * row-major; `pivots` receives the row swapped in at each step), and the solve
 * with those factors, neither allocating. For the few unknowns of a Newton step:
 * the project's other LUs are complex, and such Jacobians are real.
 */

/**
 * Factorises `a` in place. Returns false when a pivot is at most `relativePivot` ×
 * the largest entry of `a` (no well-determined solution).
 */
export function factorRealInPlace(a: Float64Array, n: number, pivots: Int32Array, relativePivot = 1e-13): boolean {
  let largest = 0;
  for (let k = 0; k < n * n; k++) largest = Math.max(largest, Math.abs(a[k]!));
  for (let c = 0; c < n; c++) {
    let pivot = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r * n + c]!) > Math.abs(a[pivot * n + c]!)) pivot = r;
    if (!(Math.abs(a[pivot * n + c]!) > relativePivot * largest)) return false;
    pivots[c] = pivot;
    if (pivot !== c) {
      for (let j = 0; j < n; j++) {
        const t = a[c * n + j]!;
        a[c * n + j] = a[pivot * n + j]!;
        a[pivot * n + j] = t;
      }
    }
    const d = a[c * n + c]!;
    for (let r = c + 1; r < n; r++) {
      const k = a[r * n + c]! / d;
      a[r * n + c] = k;
      if (k === 0) continue;
      for (let j = c + 1; j < n; j++) a[r * n + j] = a[r * n + j]! - k * a[c * n + j]!;
    }
  }
  return true;
}

/** Solves with the factors of `factorRealInPlace`: `b` receives the solution. */
export function solveRealFactored(a: Float64Array, n: number, pivots: Int32Array, b: Float64Array): void {
  for (let c = 0; c < n; c++) {
    const pivot = pivots[c]!;
    if (pivot !== c) {
      const t = b[c]!;
      b[c] = b[pivot]!;
      b[pivot] = t;
    }
    const bc = b[c]!;
    for (let r = c + 1; r < n; r++) b[r] = b[r]! - a[r * n + c]! * bc;
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r]!;
    for (let j = r + 1; j < n; j++) s -= a[r * n + j]! * b[j]!;
    b[r] = s / a[r * n + r]!;
  }
}

/** The determinant floor of `invertReal3InPlace`, relative to the largest entry cubed. */
export const REAL3_RELATIVE_PIVOT = 1e-13;

/**
 * Inverse of a 3 × 3 real matrix in place, by cofactors (the commonest Newton step:
 * three loaded node pairs; no pivoting to do, and a third of the work of the LU and
 * its solve). Returns false, with `a` untouched, when the determinant is at most
 * `relativePivot` × the largest entry cubed, or not finite.
 */
export function invertReal3InPlace(a: Float64Array, relativePivot = REAL3_RELATIVE_PIVOT): boolean {
  const a00 = a[0]!;
  const a01 = a[1]!;
  const a02 = a[2]!;
  const a10 = a[3]!;
  const a11 = a[4]!;
  const a12 = a[5]!;
  const a20 = a[6]!;
  const a21 = a[7]!;
  const a22 = a[8]!;
  const c00 = a11 * a22 - a12 * a21;
  const c01 = a12 * a20 - a10 * a22;
  const c02 = a10 * a21 - a11 * a20;
  const det = a00 * c00 + a01 * c01 + a02 * c02;
  let largest = 0;
  for (let k = 0; k < 9; k++) largest = Math.max(largest, Math.abs(a[k]!));
  if (!(Math.abs(det) > relativePivot * largest * largest * largest) || !Number.isFinite(det)) return false;
  const r = 1 / det;
  a[0] = c00 * r;
  a[1] = (a02 * a21 - a01 * a22) * r;
  a[2] = (a01 * a12 - a02 * a11) * r;
  a[3] = c01 * r;
  a[4] = (a00 * a22 - a02 * a20) * r;
  a[5] = (a02 * a10 - a00 * a12) * r;
  a[6] = c02 * r;
  a[7] = (a01 * a20 - a00 * a21) * r;
  a[8] = (a00 * a11 - a01 * a10) * r;
  return true;
}

/** b ← a·b for a 3 × 3 real matrix (row-major) and a 3-vector. */
export function multiplyReal3(a: Float64Array, b: Float64Array): void {
  const b0 = b[0]!;
  const b1 = b[1]!;
  const b2 = b[2]!;
  b[0] = a[0]! * b0 + a[1]! * b1 + a[2]! * b2;
  b[1] = a[3]! * b0 + a[4]! * b1 + a[5]! * b2;
  b[2] = a[6]! * b0 + a[7]! * b1 + a[8]! * b2;
}
