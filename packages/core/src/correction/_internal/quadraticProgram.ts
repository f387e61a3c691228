/**
 * Exact solution of a tiny strictly convex quadratic programme,
 *   minimise ½·xᵀHx + cᵀx  subject to  A·x ≥ b,
 * as the enumeration of active sets defines it: for each candidate set the equality-constrained KKT
 * system is solved; a set whose point is primal feasible with non-negative multipliers (within
 * TOLERANCE) qualifies, and the qualifying set of least value wins — the first in enumeration order
 * (by size, then lexicographically) where values are equal to the last bit.
 *
 * The sets judged are few: a dual active-set method (dualActiveSet.ts) finds the optimum's
 * multipliers, and they bound how far any qualifying set of no greater value can lie from the
 * optimum — only the constraints within that reach are formed into sets (`judgeSetsNearOptimum`).
 * The very same judgement of those sets gives the enumeration's answer to the last bit. Where the
 * method gives up or the bound does not close, every set is enumerated (`enumerateActiveSets`).
 */
import { nextSubset, solveLinearInPlace } from './realMatrix.js';
import { solveByDualActiveSet } from './dualActiveSet.js';

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
/**
 * Below this many active sets in all the programme is simply enumerated: the bookkeeping costs
 * more than it saves (the compensator's own sizing, 6 unknowns and 9 constraints: 466 sets).
 */
const SKIPPING_FROM = 1000;
/** Add/drop steps of the search for an early qualifying set (only an upper bound for skipping). */
const PROBE_STEPS = 24;

/** The programme on typed arrays, read in the loops below: the same values, one element kind. */
interface TypedProgramme {
  readonly n: number;
  readonly m: number;
  readonly h: Float64Array;
  readonly c: Float64Array;
  readonly rows: Float64Array;
  readonly bounds: Float64Array;
  readonly norms: readonly number[];
  /** Size of the objective's data: the multipliers' tolerance is relative to it. */
  readonly scale: number;
}

function typedProgramme(qp: QuadraticProgram): TypedProgramme {
  return {
    n: qp.c.length,
    m: qp.rows.length,
    h: Float64Array.from(qp.h.flat()),
    c: Float64Array.from(qp.c),
    rows: Float64Array.from(qp.rows.flat()),
    bounds: Float64Array.from(qp.bounds),
    norms: qp.rows.map((r) => Math.hypot(...r) || 1),
    scale: Math.max(1, ...qp.c.map(Math.abs), ...qp.h.flat().map(Math.abs)),
  };
}

/**
 * The judgement of one active set, the same arithmetic wherever a set is judged (so every path
 * gives the same bits): `judge` solves its KKT system and leaves the point and multipliers in
 * `sol`, its objective value in `value` and the size of the value's terms in `size`.
 */
class ActiveSetJudge {
  value = NaN;
  size = NaN;
  readonly sol: Float64Array;
  private readonly kkt: Float64Array;
  private readonly rowOf: Int32Array;
  private readonly hx: Float64Array;
  constructor(private readonly p: TypedProgramme) {
    // Thousands of KKT systems per call: one typed work area for all (see solveLinearInPlace).
    const largest = p.n + Math.min(p.n, p.m);
    this.kkt = new Float64Array(largest * (largest + 1));
    this.rowOf = new Int32Array(largest);
    this.sol = new Float64Array(largest);
    this.hx = new Float64Array(p.n);
  }

  /** Judges the k sets in `set`: 0 singular, 1 a multiplier negative, 2 infeasible, 3 qualifies. Sets `value` unless 0. */
  judge(set: Int32Array, k: number): number {
    const { n, m, h, c, rows, bounds, norms, scale } = this.p;
    const { kkt, sol, hx } = this;
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
    if (!solveLinearInPlace(kkt, dim, this.rowOf, sol)) return 0;
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
    this.value = 0.5 * xhx + cx;
    this.size = Math.abs(0.5 * xhx) + Math.abs(cx);
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
  }
}

/**
 * The optimum, or null when the constraints cannot all be met: the enumeration's answer (see the
 * top of this file) from the few active sets near the optimum the dual active-set method finds, or
 * from every set where that does not settle it.
 *
 * One departure from a plain enumeration: a programme the method proves infeasible, so far that a
 * point meeting every row within the judge's tolerance (which grows with the point's size) would
 * lie beyond INFEASIBLE_REACH times the programme's own scale, is infeasible here without judging
 * a set. A plain enumeration could still accept such a point from a nearly singular active set —
 * a point 10⁶ times larger than the problem, of no use to any caller.
 */
export function solveQuadraticProgram(qp: QuadraticProgram): number[] | null {
  return solveQuadraticProgramBy(qp).x;
}

/** How the answer was reached: sets near the optimum judged, infeasibility proven, or every set enumerated. */
export type QuadraticRoute = 'near-optimum' | 'proven-infeasible' | 'enumerated';

/** `solveQuadraticProgram` with the route it took (for tests and profiling). */
export function solveQuadraticProgramBy(qp: QuadraticProgram): { x: number[] | null; route: QuadraticRoute } {
  const p = typedProgramme(qp);
  const judge = new ActiveSetJudge(p);
  if (p.m > 0 && p.n > 0) {
    const dual = solveByDualActiveSet(p.h, p.c, p.rows, p.bounds, p.norms, p.n, p.m);
    if (dual?.kind === 'infeasible' && isFarFromFeasible(p, judge, dual.certificate)) return { x: null, route: 'proven-infeasible' };
    if (dual?.kind === 'optimal') {
      const found = judgeSetsNearOptimum(p, judge, dual.x, dual.multipliers);
      if (found !== undefined) return { x: found, route: 'near-optimum' };
    }
  }
  return { x: enumerateSets(p, judge, SKIPPING_FROM), route: 'enumerated' };
}

/**
 * Relative padding of the bounds below, far above the round-off of the values bounded (≈ 1e-15
 * relative): it only widens the reach, so a set that could win is never left out.
 */
const BOUND_PADDING = 1e-10;
/** See solveQuadraticProgram: how far beyond the programme's scale a point proven infeasible may not be sought. */
const INFEASIBLE_REACH = 1e6;

/**
 * The winner among the active sets of constraints near the optimum, or undefined when that is not
 * proven to be the enumeration's winner.
 *
 * For any multipliers μ ≥ 0, with x̂ = H⁻¹(Aᵀμ − c) the minimum of the Lagrangian and q its value,
 *   f(x) = q + ½‖x − x̂‖²_H + Σ μᵢ·(rowᵢ·x − bᵢ)   for every x.
 * The winner's point x qualifies, so every rowᵢ·x ≥ bᵢ − TOLERANCE·‖rowᵢ‖·max(1, |x|∞), and its value
 * is at most U (that of a qualifying set, checked at the end): ‖x − x̂‖²_H ≤ 2·B. Each constraint of
 * the winner's set holds with equality at x, so |rowᵢ·x̂ − bᵢ| ≤ √(2·B·rowᵢH⁻¹rowᵢᵀ): constraints
 * further from x̂ cannot be in it. The winner is the enumeration's first qualifying set of least
 * value; the sets of the near constraints are judged in the enumeration's order, so the first of
 * least value among them is that set.
 */
function judgeSetsNearOptimum(p: TypedProgramme, judge: ActiveSetJudge, xDual: Float64Array, mu: Float64Array): number[] | null | undefined {
  const { n, m, h, c, rows, bounds, norms } = p;
  const inverse = invertPositiveDefinite(h, n);
  if (!inverse) return undefined;
  const quadratic = (x: Float64Array) => {
    let xhx = 0;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) xhx += x[i]! * h[i * n + j]! * x[j]!;
    return 0.5 * xhx;
  };
  const linear = (x: Float64Array) => {
    let s = 0;
    for (let j = 0; j < n; j++) s += c[j]! * x[j]!;
    return s;
  };
  const rowAt = (i: number, x: Float64Array) => {
    let s = 0;
    for (let j = 0; j < n; j++) s += rows[i * n + j]! * x[j]!;
    return s;
  };
  // x̂ = H⁻¹(Aᵀμ − c) and q = L(x̂, μ).
  const v = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = -c[j]!;
    for (let i = 0; i < m; i++) s += mu[i]! * rows[i * n + j]!;
    v[j] = s;
  }
  const xHat = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += inverse[i * n + j]! * v[j]!;
    xHat[i] = s;
  }
  let q = quadratic(xHat) + linear(xHat);
  let size = Math.abs(quadratic(xHat)) + Math.abs(linear(xHat));
  let muNorms = 0;
  for (let i = 0; i < m; i++) {
    if (mu[i]! === 0) continue;
    const r = rowAt(i, xHat);
    q -= mu[i]! * (r - bounds[i]!);
    size += mu[i]! * (Math.abs(r) + Math.abs(bounds[i]!));
    muNorms += mu[i]! * norms[i]!;
  }
  const fDual = quadratic(xDual) + linear(xDual);
  size += Math.abs(fDual) + Math.abs(quadratic(xDual)) + Math.abs(linear(xDual));
  const upper = Math.max(fDual, q) + BOUND_PADDING * size;
  const budget = upper - q + BOUND_PADDING * size;
  // The winner's xScale X: |xⱼ| ≤ |x̂ⱼ| + √(2·(budget + t·X)·H⁻¹ⱼⱼ), t·X the tolerance term; X at most the larger root.
  const t = 2 * TOLERANCE * muNorms;
  let reach = 1;
  for (let j = 0; j < n; j++) {
    const a = Math.abs(xHat[j]!);
    const hj = inverse[j * n + j]!;
    reach = Math.max(reach, a + hj * t + Math.sqrt(2 * a * hj * t + hj * hj * t * t + 2 * hj * budget));
  }
  const radius2 = 2 * (budget + t * reach * (1 + BOUND_PADDING));
  const near: number[] = [];
  for (let i = 0; i < m; i++) {
    let g = 0;
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += inverse[j * n + k]! * rows[i * n + k]!;
      g += rows[i * n + j]! * s;
    }
    const distance = Math.abs(rowAt(i, xHat) - bounds[i]!);
    if (distance <= Math.sqrt(radius2 * Math.max(0, g)) * (1 + BOUND_PADDING) + BOUND_PADDING * (norms[i]! * reach + Math.abs(bounds[i]!))) near.push(i);
  }
  // Every set of near constraints, by size, then lexicographically (the enumeration's order).
  let best: number[] | null = null;
  let bestValue = Infinity;
  const most = Math.min(n, near.length);
  const pick = new Int32Array(most);
  const set = new Int32Array(most);
  for (let k = 0; k <= most; k++) {
    for (let i = 0; i < k; i++) pick[i] = i;
    for (let more = true; more; more = nextSubset(pick, k, near.length)) {
      for (let a = 0; a < k; a++) set[a] = near[pick[a]!]!;
      if (judge.judge(set, k) === 3 && judge.value < bestValue) {
        best = Array.from(judge.sol.subarray(0, n));
        bestValue = judge.value;
      }
    }
  }
  return best !== null && bestValue <= upper ? best : undefined;
}

/**
 * True when the certificate u (u ≥ 0, Σ uᵢ·rowᵢ ≈ 0, Σ uᵢ·bᵢ > 0) shows that a point meeting every
 * row within the judge's tolerance would need max(1, |x|∞) ≥ Σuᵢbᵢ / (‖Σuᵢrowᵢ‖₁ + TOLERANCE·Σuᵢ‖rowᵢ‖),
 * and that is beyond INFEASIBLE_REACH times the programme's scale (its unconstrained minimum, and
 * each bound's distance from the origin).
 */
function isFarFromFeasible(p: TypedProgramme, judge: ActiveSetJudge, u: Float64Array): boolean {
  const { n, m, rows, bounds, norms } = p;
  let beta = 0;
  let betaSize = 0;
  let normSum = 0;
  for (let i = 0; i < m; i++) {
    beta += u[i]! * bounds[i]!;
    betaSize += u[i]! * Math.abs(bounds[i]!);
    normSum += u[i]! * norms[i]!;
  }
  let residual = 0;
  for (let j = 0; j < n; j++) {
    let s = 0;
    let sSize = 0;
    for (let i = 0; i < m; i++) {
      s += u[i]! * rows[i * n + j]!;
      sSize += u[i]! * Math.abs(rows[i * n + j]!);
    }
    residual += Math.abs(s) + BOUND_PADDING * sSize;
  }
  const provenGap = beta - BOUND_PADDING * betaSize;
  if (!(provenGap > 0)) return false;
  const leastScale = provenGap / (residual + 2 * TOLERANCE * normSum);
  if (judge.judge(new Int32Array(0), 0) === 0) return false;
  let programmeScale = 1;
  for (let j = 0; j < n; j++) programmeScale = Math.max(programmeScale, Math.abs(judge.sol[j]!));
  for (let i = 0; i < m; i++) programmeScale = Math.max(programmeScale, Math.abs(bounds[i]!) / norms[i]!);
  return leastScale > INFEASIBLE_REACH * programmeScale;
}

/** H⁻¹ (row-major) of a symmetric positive definite H by Cholesky, or null when a pivot is not clearly positive. */
function invertPositiveDefinite(h: Float64Array, n: number): Float64Array | null {
  const l = new Float64Array(n * n);
  let largest = 0;
  for (let i = 0; i < n; i++) largest = Math.max(largest, h[i * n + i]!);
  for (let j = 0; j < n; j++) {
    let d = h[j * n + j]!;
    for (let k = 0; k < j; k++) d -= l[j * n + k]! ** 2;
    if (!(d > 1e-12 * largest)) return null;
    const root = Math.sqrt(d);
    l[j * n + j] = root;
    for (let i = j + 1; i < n; i++) {
      let s = h[i * n + j]!;
      for (let k = 0; k < j; k++) s -= l[i * n + k]! * l[j * n + k]!;
      l[i * n + j] = s / root;
    }
  }
  // Columns of H⁻¹: L·y = eₖ, then Lᵀ·x = y.
  const inverse = new Float64Array(n * n);
  const y = new Float64Array(n);
  for (let col = 0; col < n; col++) {
    for (let i = 0; i < n; i++) {
      let s = i === col ? 1 : 0;
      for (let k = 0; k < i; k++) s -= l[i * n + k]! * y[k]!;
      y[i] = s / l[i * n + i]!;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i]!;
      for (let k = i + 1; k < n; k++) s -= l[k * n + i]! * inverse[k * n + col]!;
      inverse[i * n + col] = s / l[i * n + i]!;
    }
  }
  return inverse;
}

/**
 * The optimum by enumerating active sets, or null when the constraints cannot all be met.
 *
 * Every candidate active set is judged as in a plain enumeration (in the same order, by the same
 * arithmetic: the answer is the same to the last bit), but a set is skipped when it cannot win: its
 * equality-constrained minimum is at least that of each of its subsets (a minimum over a larger
 * affine set), so a set holding a subset of one member fewer whose minimum already lies above a
 * qualifying set's value can only lose. The qualifying set that gives the first such upper bound
 * is found by a few add-the-most-violated / drop-the-most-negative steps from the empty set.
 * @param skippingFrom fewest active sets in all for which sets are skipped (tests pass 0 to skip on any programme)
 */
export function enumerateActiveSets(qp: QuadraticProgram, skippingFrom = SKIPPING_FROM): number[] | null {
  const p = typedProgramme(qp);
  return enumerateSets(p, new ActiveSetJudge(p), skippingFrom);
}

function enumerateSets(p: TypedProgramme, judgement: ActiveSetJudge, skippingFrom: number): number[] | null {
  const { n, m, rows, bounds, norms } = p;
  let best: number[] | null = null;
  let bestValue = Infinity;
  const sol = judgement.sol;
  const most = Math.min(n, m);
  const active = new Int32Array(most);
  // Set by `judge`: the candidate's objective value and the size of its terms (for the margin).
  let value = NaN;
  let size = NaN;
  const judge = (set: Int32Array, k: number): number => {
    const verdict = judgement.judge(set, k);
    value = judgement.value;
    size = judgement.size;
    return verdict;
  };
  // An upper bound on the winner's value: the value of a set known to qualify.
  let upper = Infinity;
  let upperSize = 0;
  let unconstrainedSize = 0;
  const cannotWin = (bound: number, boundSize: number) => bound - upper > PRUNING_MARGIN * (boundSize + upperSize + unconstrainedSize) + PRUNING_FLOOR;
  // (Plain assignments below, not destructuring: unoptimised code builds an iterator for each.)
  // Lower bounds of the previous level's sets, each at its colex rank Σ C(cᵢ, i + 1): the
  // equality-constrained minimum where the set was solved, the bound it was skipped on where it was
  // skipped, NaN where its system is singular. A level of more than `MAX_LEVEL_SETS` sets keeps the
  // one-constraint minima only.
  const binomial = (x: number, y: number): number => {
    let r = 1;
    for (let i = 0; i < y; i++) r = (r * (x - i)) / (i + 1);
    return y < 0 || x < y ? 0 : Math.round(r);
  };
  // Whole numbers, so ranks add up without boxing doubles (capped: a larger entry is only read on a level not kept).
  const choose: Int32Array[] = Array.from({ length: m + 1 }, (_, x) => Int32Array.from({ length: most + 2 }, (__, y) => Math.min(binomial(x, y), 2 ** 30)));
  let previous = new Float64Array(0);
  let previousSize = new Float64Array(0);
  let previousKept = false;
  const alone = new Float64Array(m).fill(NaN);
  const aloneSize = new Float64Array(m);
  let sets = 0;
  for (let k = 0; k <= most; k++) sets += choose[m]![k]!;
  const skipping = sets >= skippingFrom;
  for (let k = 0; k <= most; k++) {
    if (skipping && k === 2 && upper === Infinity) [upper, upperSize] = probeUpperBound();
    const count = choose[m]![k]!;
    const kept = skipping && count <= MAX_LEVEL_SETS;
    const current = new Float64Array(kept ? count : 0).fill(NaN);
    const currentSize = new Float64Array(kept ? count : 0);
    const byRank = kept && previousKept;
    // Every k-element subset of the constraints in lexicographic order, held in `active`.
    for (let i = 0; i < k; i++) active[i] = i;
    for (let more = true; more; more = nextSubset(active, k, m)) {
      let rank = 0;
      if (kept) for (let a = 0; a < k; a++) rank += choose[active[a]!]![a + 1]!;
      if (skipping && k >= 2) {
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
          if (cannotWin(v, vSize)) {
            bound = v;
            boundSize = vSize;
          }
        }
        if (!Number.isNaN(bound)) {
          if (kept) {
            current[rank] = bound;
            currentSize[rank] = boundSize;
          }
          continue;
        }
      }
      const verdict = judge(active, k);
      if (verdict > 0) {
        if (kept) {
          current[rank] = value;
          currentSize[rank] = size;
        }
        if (k === 0) unconstrainedSize = size;
        if (k === 1) {
          alone[active[0]!] = value;
          aloneSize[active[0]!] = size;
        }
      }
      if (verdict < 3) continue;
      if (value < upper) {
        upper = value;
        upperSize = size;
      }
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
        if (gap > worstGap) {
          pick = i;
          worstGap = gap;
        }
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
