/**
 * Exact solution of a tiny strictly convex quadratic programme,
 *   minimise ½·xᵀHx + cᵀx  subject to  A·x ≥ b,
 * by enumerating active sets. For each candidate set the equality-constrained
 * KKT system is solved; the set whose point is primal feasible with
 * non-negative multipliers is the optimum (unique, H being positive definite).
 * The capacitor-only compensator has ≤ 6 unknowns and ≤ 9 constraints, i.e. at
 * most a few hundred 12×12 solves — simpler and more predictable than an
 * iterative active-set or projected-gradient code at this size.
 */
import { nextSubset, solveLinearInPlace } from './realMatrix.js';

export interface QuadraticProgram {
  readonly h: readonly (readonly number[])[];
  readonly c: readonly number[];
  /** Constraint rows: `rows[i]·x ≥ bounds[i]`. */
  readonly rows: readonly (readonly number[])[];
  readonly bounds: readonly number[];
}

/**
 * Relative tolerance for primal and dual feasibility of a candidate, kept far
 * below the sizing loops' convergence step as in the LP: a looser one lets a
 * candidate a hair outside a constraint win on objective.
 */
const TOLERANCE = 1e-12;

/** The optimum, or null when the constraints cannot all be met. */
export function solveQuadraticProgram(qp: QuadraticProgram): number[] | null {
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
