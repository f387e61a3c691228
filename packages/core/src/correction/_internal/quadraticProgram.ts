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
import { dot, multiplyVector, solveLinearInPlace, subsets } from './realMatrix.js';

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

const objective = (qp: QuadraticProgram, x: readonly number[]) => 0.5 * dot(x, multiplyVector(qp.h, x)) + dot(qp.c, x);

/** The optimum, or null when the constraints cannot all be met. */
export function solveQuadraticProgram(qp: QuadraticProgram): number[] | null {
  const n = qp.c.length;
  const m = qp.rows.length;
  const norms = qp.rows.map((r) => Math.hypot(...r) || 1);
  const scale = Math.max(1, ...qp.c.map(Math.abs), ...qp.h.flat().map(Math.abs));
  let best: number[] | null = null;
  let bestValue = Infinity;
  // Thousands of KKT systems per call: one typed work area for all (see solveLinearInPlace).
  const largest = n + Math.min(n, m);
  const kkt = new Float64Array(largest * (largest + 1));
  const rowOf = new Int32Array(largest);
  const sol = new Float64Array(largest);
  for (let k = 0; k <= Math.min(n, m); k++) {
    const size = n + k;
    const w = size + 1;
    for (const active of subsets(m, k)) {
      // [H  −Aᵀ] [x]   [−c]
      // [A   0 ] [λ] = [ b]
      kkt.fill(0, 0, size * w);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) kkt[i * w + j] = qp.h[i]![j]!;
        kkt[i * w + size] = -qp.c[i]!;
      }
      for (let a = 0; a < k; a++) {
        const row = qp.rows[active[a]!]!;
        for (let j = 0; j < n; j++) {
          kkt[(n + a) * w + j] = row[j]!;
          kkt[j * w + n + a] = -row[j]!;
        }
        kkt[(n + a) * w + size] = qp.bounds[active[a]!]!;
      }
      if (!solveLinearInPlace(kkt, size, rowOf, sol)) continue;
      let negative = false;
      for (let a = 0; a < k; a++) if (sol[n + a]! < -TOLERANCE * scale) negative = true;
      if (negative) continue;
      const x = Array.from(sol.subarray(0, n));
      const xScale = Math.max(1, ...x.map(Math.abs));
      if (!qp.rows.every((row, i) => dot(row, x) >= qp.bounds[i]! - TOLERANCE * norms[i]! * xScale)) continue;
      const value = objective(qp, x);
      if (value < bestValue) {
        best = x;
        bestValue = value;
      }
    }
  }
  return best;
}
