/**
 * Dense real linear algebra for the small problems of correction sizing (at
 * most a dozen unknowns): Gaussian elimination with partial pivoting, and the
 * few matrix products the optimisers need.
 */

export type Matrix = readonly (readonly number[])[];

/**
 * Solves A·x = b. Returns null when a pivot falls below `relativePivot` × the
 * largest entry of A (singular or nearly so), so callers can skip that case.
 */
export function solveLinear(a: Matrix, b: readonly number[], relativePivot = 1e-13): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]!]);
  let largest = 0;
  for (const row of a) for (const v of row) largest = Math.max(largest, Math.abs(v));
  if (largest === 0) return n === 0 ? [] : null;
  for (let col = 0; col < n; col++) {
    let pivotRow = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r]![col]!) > Math.abs(m[pivotRow]![col]!)) pivotRow = r;
    if (Math.abs(m[pivotRow]![col]!) <= relativePivot * largest) return null;
    [m[col], m[pivotRow]] = [m[pivotRow]!, m[col]!];
    const pivot = m[col]!;
    for (let r = col + 1; r < n; r++) {
      const row = m[r]!;
      const f = row[col]! / pivot[col]!;
      if (f !== 0) for (let c = col; c <= n; c++) row[c] = row[c]! - f * pivot[c]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    const row = m[r]!;
    let s = row[n]!;
    for (let c = r + 1; c < n; c++) s -= row[c]! * x[c]!;
    x[r] = s / row[r]!;
  }
  return x;
}

/**
 * `solveLinear` on an augmented system held in a typed array (row r at `r * (n + 1)`, the
 * right-hand side last), for callers that solve thousands of small systems (the quadratic
 * programme's active sets): no allocation, and the very same operations in the same order,
 * so the answers are bit for bit those of `solveLinear`. Overwrites `m`; rows are swapped
 * through `rowOf` (length ≥ n). Returns false where `solveLinear` returns null.
 */
export function solveLinearInPlace(m: Float64Array, n: number, rowOf: Int32Array, x: Float64Array, relativePivot = 1e-13): boolean {
  const w = n + 1;
  let largest = 0;
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) largest = Math.max(largest, Math.abs(m[r * w + c]!));
  if (largest === 0) return n === 0;
  for (let r = 0; r < n; r++) rowOf[r] = r * w;
  for (let col = 0; col < n; col++) {
    let pivotRow = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[rowOf[r]! + col]!) > Math.abs(m[rowOf[pivotRow]! + col]!)) pivotRow = r;
    if (Math.abs(m[rowOf[pivotRow]! + col]!) <= relativePivot * largest) return false;
    const swap = rowOf[col]!;
    rowOf[col] = rowOf[pivotRow]!;
    rowOf[pivotRow] = swap;
    const pivot = rowOf[col]!;
    for (let r = col + 1; r < n; r++) {
      const row = rowOf[r]!;
      const f = m[row + col]! / m[pivot + col]!;
      if (f !== 0) for (let c = col; c <= n; c++) m[row + c] = m[row + c]! - f * m[pivot + c]!;
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    const row = rowOf[r]!;
    let s = m[row + n]!;
    for (let c = r + 1; c < n; c++) s -= m[row + c]! * x[c]!;
    x[r] = s / m[row + r]!;
  }
  return true;
}

export const transpose = (a: Matrix): number[][] => (a.length === 0 ? [] : a[0]!.map((_, j) => a.map((row) => row[j]!)));

export const multiply = (a: Matrix, b: Matrix): number[][] =>
  a.map((row) => (b[0] ?? []).map((_, j) => row.reduce((s, v, k) => s + v * b[k]![j]!, 0)));

export const multiplyVector = (a: Matrix, x: readonly number[]): number[] => a.map((row) => row.reduce((s, v, k) => s + v * x[k]!, 0));

export const dot = (u: readonly number[], v: readonly number[]): number => u.reduce((s, x, i) => s + x * v[i]!, 0);

export const maxAbs = (v: readonly number[]): number => v.reduce((m, x) => Math.max(m, Math.abs(x)), 0);

/**
 * Moves `pick` (k increasing indices below n) to the next k-element subset in lexicographic order, in
 * place; false after the last. Start from 0 … k−1.
 */
export function nextSubset(pick: Int32Array, k: number, n: number): boolean {
  let i = k - 1;
  while (i >= 0 && pick[i] === n - k + i) i--;
  if (i < 0) return false;
  pick[i]!++;
  for (let j = i + 1; j < k; j++) pick[j] = pick[j - 1]! + 1;
  return true;
}
