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
