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

export const transpose = (a: Matrix): number[][] => (a.length === 0 ? [] : a[0]!.map((_, j) => a.map((row) => row[j]!)));

export const multiply = (a: Matrix, b: Matrix): number[][] =>
  a.map((row) => (b[0] ?? []).map((_, j) => row.reduce((s, v, k) => s + v * b[k]![j]!, 0)));

export const multiplyVector = (a: Matrix, x: readonly number[]): number[] => a.map((row) => row.reduce((s, v, k) => s + v * x[k]!, 0));

export const dot = (u: readonly number[], v: readonly number[]): number => u.reduce((s, x, i) => s + x * v[i]!, 0);

export const maxAbs = (v: readonly number[]): number => v.reduce((m, x) => Math.max(m, Math.abs(x)), 0);

/** Every k-element subset of {0 … n−1}, in lexicographic order. */
export function* subsets(n: number, k: number): Generator<number[]> {
  if (k > n || k < 0) return;
  const pick = Array.from({ length: k }, (_, i) => i);
  for (;;) {
    yield [...pick];
    let i = k - 1;
    while (i >= 0 && pick[i] === n - k + i) i--;
    if (i < 0) return;
    pick[i]!++;
    for (let j = i + 1; j < k; j++) pick[j] = pick[j - 1]! + 1;
  }
}
