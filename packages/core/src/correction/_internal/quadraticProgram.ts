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

/**
 * Margin (relative to the size of the objective's terms, in the two values compared and in the
 * unconstrained minimum) by which a lower bound must pass the upper bound before an active set is
 * skipped: far above the round-off of a value, so a set that could win is never skipped.
 */
const PRUNING_MARGIN = 1e-7;
/** And at least this: values near the subnormal range (from 2.2e-308) carry no relative precision. */
const PRUNING_FLOOR = 1e-300;
/** Most sets of one size whose bounds are kept for the next size (two doubles each). */
const MAX_LEVEL_SETS = 1 << 18;
/** Add/drop steps of the search for an early qualifying set (only an upper bound for skipping). */
const PROBE_STEPS = 24;

/**
 * The optimum, or null when the constraints cannot all be met.
 *
 * Every candidate active set is judged as in a plain enumeration (in the same order, by the same
 * arithmetic: the answer is the same to the last bit), but a set is skipped when it cannot win: its
 * equality-constrained minimum is at least that of each of its subsets (a minimum over a larger
 * affine set), so a set holding a subset of one member fewer whose minimum already lies above a
 * qualifying set's value can only lose. The qualifying set that gives the first such upper bound
 * is found by a few add-the-most-violated / drop-the-most-negative steps from the empty set.
 */
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
  const most = Math.min(n, m);
  const active = new Int32Array(most);
  // Set by `judge`: the candidate's objective value and the size of its terms (for the margin).
  let value = NaN;
  let size = NaN;
  /** Solves the KKT system of the k sets in `set`; 0 singular, 1 a multiplier negative, 2 infeasible, 3 qualifies. Sets `value`. */
  const judge = (set: Int32Array, k: number): number => {
    const dim = n + k;
    const w = dim + 1;
    // [H  −Aᵀ] [x]   [−c]
    // [A   0 ] [λ] = [ b]
    kkt.fill(0, 0, dim * w);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) kkt[i * w + j] = h[i * n + j]!;
      kkt[i * w + dim] = -c[i]!;
    }
    for (let a = 0; a < k; a++) {
      const row = set[a]! * n;
      for (let j = 0; j < n; j++) {
        kkt[(n + a) * w + j] = rows[row + j]!;
        kkt[j * w + n + a] = -rows[row + j]!;
      }
      kkt[(n + a) * w + dim] = bounds[set[a]!]!;
    }
    if (!solveLinearInPlace(kkt, dim, rowOf, sol)) return 0;
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
    value = 0.5 * xhx + cx;
    size = Math.abs(0.5 * xhx) + Math.abs(cx);
    let negative = false;
    for (let a = 0; a < k; a++) if (sol[n + a]! < -TOLERANCE * scale) negative = true;
    if (negative) return 1;
    let xScale = 1;
    for (let j = 0; j < n; j++) xScale = Math.max(xScale, Math.abs(sol[j]!));
    // Every row·x ≥ bound (within tolerance), each dot product summed left to right from 0 as `dot` sums it.
    for (let i = 0; i < m; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s = s + rows[i * n + j]! * sol[j]!;
      if (!(s >= bounds[i]! - TOLERANCE * norms[i]! * xScale)) return 2;
    }
    return 3;
  };
  // An upper bound on the winner's value: the value of a set known to qualify.
  let upper = Infinity;
  let upperSize = 0;
  let unconstrainedSize = 0;
  const cannotWin = (bound: number, boundSize: number) => bound - upper > PRUNING_MARGIN * (boundSize + upperSize + unconstrainedSize) + PRUNING_FLOOR;
  // Lower bounds of the previous level's sets, each at its colex rank Σ C(cᵢ, i + 1): the
  // equality-constrained minimum where the set was solved, the bound it was skipped on where it was
  // skipped, NaN where its system is singular. A level of more than `MAX_LEVEL_SETS` sets keeps the
  // one-constraint minima only.
  const binomial = (x: number, y: number): number => {
    let r = 1;
    for (let i = 0; i < y; i++) r = (r * (x - i)) / (i + 1);
    return y < 0 || x < y ? 0 : Math.round(r);
  };
  const choose: Float64Array[] = Array.from({ length: m + 1 }, (_, x) => Float64Array.from({ length: most + 2 }, (__, y) => binomial(x, y)));
  let previous = new Float64Array(0);
  let previousSize = new Float64Array(0);
  let previousKept = false;
  const alone = new Float64Array(m).fill(NaN);
  const aloneSize = new Float64Array(m);
  for (let k = 0; k <= most; k++) {
    if (k === 2 && upper === Infinity) [upper, upperSize] = probeUpperBound();
    const count = choose[m]![k]!;
    const kept = count <= MAX_LEVEL_SETS;
    const current = new Float64Array(kept ? count : 0).fill(NaN);
    const currentSize = new Float64Array(kept ? count : 0);
    const byRank = kept && previousKept;
    // Every k-element subset of the constraints in lexicographic order, held in `active`.
    for (let i = 0; i < k; i++) active[i] = i;
    for (let more = true; more; more = nextSubset(active, k, m)) {
      let rank = 0;
      if (kept) for (let a = 0; a < k; a++) rank += choose[active[a]!]![a + 1]!;
      if (k >= 2) {
        // Skipped when a set of one member fewer already has its minimum above the upper bound.
        let bound = NaN;
        let boundSize = 0;
        for (let a = 0; a < k && Number.isNaN(bound); a++) {
          let v = alone[active[a]!]!;
          let vSize = aloneSize[active[a]!]!;
          if (byRank) {
            let without = 0;
            for (let b = 0; b < k; b++) if (b !== a) without += choose[active[b]!]![b < a ? b + 1 : b]!;
            v = previous[without]!;
            vSize = previousSize[without]!;
          }
          if (cannotWin(v, vSize)) [bound, boundSize] = [v, vSize];
        }
        if (!Number.isNaN(bound)) {
          if (kept) [current[rank], currentSize[rank]] = [bound, boundSize];
          continue;
        }
      }
      const verdict = judge(active, k);
      if (verdict > 0) {
        if (kept) [current[rank], currentSize[rank]] = [value, size];
        if (k === 0) unconstrainedSize = size;
        if (k === 1) [alone[active[0]!], aloneSize[active[0]!]] = [value, size];
      }
      if (verdict < 3) continue;
      if (value < upper) [upper, upperSize] = [value, size];
      if (value < bestValue) {
        best = Array.from(sol.subarray(0, n));
        bestValue = value;
      }
    }
    previous = current;
    previousSize = currentSize;
    previousKept = kept;
  }
  return best;

  /** [value, size] of a qualifying set reached by a few add/drop steps from the empty set, or [Infinity, 0]. */
  function probeUpperBound(): [number, number] {
    const set = new Int32Array(most);
    let k = 0;
    for (let step = 0; step < PROBE_STEPS; step++) {
      const verdict = judge(set, k);
      if (verdict === 0) break;
      if (verdict === 3) return [value, size];
      if (verdict === 1) {
        // Drop the most negative multiplier.
        let worst = 0;
        for (let a = 1; a < k; a++) if (sol[n + a]! < sol[n + worst]!) worst = a;
        for (let a = worst; a < k - 1; a++) set[a] = set[a + 1]!;
        k--;
        continue;
      }
      if (k === most) break;
      // Add the most violated constraint, kept in ascending order (the order the enumeration assembles it in).
      let pick = -1;
      let worstGap = 0;
      for (let i = 0; i < m; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s = s + rows[i * n + j]! * sol[j]!;
        const gap = (bounds[i]! - s) / norms[i]!;
        if (gap > worstGap) [pick, worstGap] = [i, gap];
      }
      if (pick < 0) break;
      let at = k;
      while (at > 0 && set[at - 1]! > pick) {
        set[at] = set[at - 1]!;
        at--;
      }
      set[at] = pick;
      k++;
    }
    return [Infinity, 0];
  }
}
