/**
 * The quadratic programme's plain enumeration as it stood before any skipping: every active set
 * judged, in order of size and then lexicographically, the first qualifying set of least value
 * winning — the reference `solveQuadraticProgram` must match bit for bit.
 */
import type { QuadraticProgram } from '../../../packages/core/src/correction/_internal/quadraticProgram.js';
import { nextSubset, solveLinearInPlace } from '../../../packages/core/src/correction/_internal/realMatrix.js';

const TOLERANCE = 1e-12;

export function enumerateEveryActiveSet(qp: QuadraticProgram): number[] | null {
  const n = qp.c.length;
  const m = qp.rows.length;
  const norms = qp.rows.map((r) => Math.hypot(...r) || 1);
  const scale = Math.max(1, ...qp.c.map(Math.abs), ...qp.h.flat().map(Math.abs));
  // The programme on typed arrays, read in the loops below: the same values (rows of small integers
  // and of fractions alike), one element kind, so the loops over thousands of active sets stay fast.
  const h = Float64Array.from(qp.h.flat());
  const c = Float64Array.from(qp.c);
  const rows = Float64Array.from(qp.rows.flat());
  const bounds = Float64Array.from(qp.bounds);
  let best: number[] | null = null;
  let bestValue = Infinity;
  // Thousands of KKT systems per call: one typed work area for all (see solveLinearInPlace).
  const largest = n + Math.min(n, m);
  const kkt = new Float64Array(largest * (largest + 1));
  const rowOf = new Int32Array(largest);
  const sol = new Float64Array(largest);
  const hx = new Float64Array(n);
  const active = new Int32Array(Math.min(n, m));
  for (let k = 0; k <= Math.min(n, m); k++) {
    const size = n + k;
    const w = size + 1;
    // Every k-element subset of the constraints in lexicographic order, held in `active`.
    for (let i = 0; i < k; i++) active[i] = i;
    for (let more = true; more; more = nextSubset(active, k, m)) {
      // [H  −Aᵀ] [x]   [−c]
      // [A   0 ] [λ] = [ b]
      kkt.fill(0, 0, size * w);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) kkt[i * w + j] = h[i * n + j]!;
        kkt[i * w + size] = -c[i]!;
      }
      for (let a = 0; a < k; a++) {
        const row = active[a]! * n;
        for (let j = 0; j < n; j++) {
          kkt[(n + a) * w + j] = rows[row + j]!;
          kkt[j * w + n + a] = -rows[row + j]!;
        }
        kkt[(n + a) * w + size] = bounds[active[a]!]!;
      }
      if (!solveLinearInPlace(kkt, size, rowOf, sol)) continue;
      let negative = false;
      for (let a = 0; a < k; a++) if (sol[n + a]! < -TOLERANCE * scale) negative = true;
      if (negative) continue;
      let xScale = 1;
      for (let j = 0; j < n; j++) xScale = Math.max(xScale, Math.abs(sol[j]!));
      // Every row·x ≥ bound (within tolerance), each dot product summed left to right from 0 as `dot` sums it.
      let feasible = true;
      for (let i = 0; i < m && feasible; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s = s + rows[i * n + j]! * sol[j]!;
        feasible = s >= bounds[i]! - TOLERANCE * norms[i]! * xScale;
      }
      if (!feasible) continue;
      // ½·xᵀHx + cᵀx, summed in the order `0.5 * dot(x, multiplyVector(h, x)) + dot(c, x)` sums it.
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s = s + h[i * n + j]! * sol[j]!;
        hx[i] = s;
      }
      let xhx = 0;
      let cx = 0;
      for (let j = 0; j < n; j++) xhx = xhx + sol[j]! * hx[j]!;
      for (let j = 0; j < n; j++) cx = cx + c[j]! * sol[j]!;
      const value = 0.5 * xhx + cx;
      if (value < bestValue) {
        best = Array.from(sol.subarray(0, n));
        bestValue = value;
      }
    }
  }
  return best;
}

/** Same answer to the last bit (null for null). */
export const sameBits = (a: readonly number[] | null, b: readonly number[] | null) => (a === null || b === null ? a === b : a.length === b.length && a.every((v, i) => Object.is(v, b[i])));

/** H = MᵀM + ridge·I: symmetric positive definite for ridge > 0. */
export const positiveDefinite = (m: readonly (readonly number[])[], n: number, ridge: number) =>
  Array.from({ length: n }, (_, i) => Array.from({ length: n }, (__, j) => m.reduce((s, row) => s + row[i]! * row[j]!, 0) + (i === j ? ridge : 0)));
