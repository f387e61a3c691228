/**
 * The dual active-set method of Goldfarb and Idnani (Math. Programming 27, 1983) for a small
 * strictly convex QP, minimise ½·xᵀHx + cᵀx subject to rows·x ≥ bounds: from the unconstrained
 * minimum, the most violated constraint is added, constraints whose multiplier would turn negative
 * on the way are dropped, until no constraint is violated — or a violated constraint is a
 * non-negative combination of the active ones pointing the other way, which proves that no point
 * meets them all (a Farkas certificate).
 *
 * Each step solves the KKT system of the active set afresh (≤ 12 unknowns here), which is simpler
 * than updating factors. The answer is a guide, not the final word: `solveQuadraticProgram` uses
 * its multipliers to bound which active sets could win and judges those exactly.
 */
import { solveLinearInPlace } from './realMatrix.js';

export type DualOutcome =
  /** x the minimum found; multipliers per constraint, ≥ 0, zero for the constraints left out. */
  | { readonly kind: 'optimal'; readonly x: Float64Array; readonly multipliers: Float64Array }
  /** certificate per constraint, ≥ 0: Σ uᵢ·rowᵢ = 0 and Σ uᵢ·boundᵢ > 0 (up to round-off). */
  | { readonly kind: 'infeasible'; readonly certificate: Float64Array };

/** A constraint counts as violated below this (relative to its row norm and the point's size). */
const VIOLATION = 1e-11;
/** A new row is taken as a combination of the active ones when its step n·z falls below this fraction of n·H⁻¹·n. */
const DEPENDENT = 1e-10;

/**
 * The optimum and its multipliers, a proof of infeasibility, or null when the method gives up (a
 * singular KKT system, or more steps than a tiny programme should need: round-off cycling).
 * @param h row-major n×n, symmetric positive definite
 * @param rows row-major m×n
 * @param norms each row's Euclidean norm (1 for a row without coefficients)
 */
export function solveByDualActiveSet(h: Float64Array, c: Float64Array, rows: Float64Array, bounds: Float64Array, norms: readonly number[], n: number, m: number): DualOutcome | null {
  const most = Math.min(n, m);
  const largest = n + most;
  const kkt = new Float64Array(largest * (largest + 1));
  const rowOf = new Int32Array(largest);
  const sol = new Float64Array(largest);
  const active: number[] = [];
  const lambda: number[] = [];
  const isActive = new Uint8Array(m);
  const x = new Float64Array(n);
  const z = new Float64Array(n);

  /** Solves [H −Aᵀ; A 0]·[u; v] = [rhs; tail] for the active rows; false when singular. Result in `sol`. */
  const solveKkt = (rhs: (i: number) => number, tail: (a: number) => number): boolean => {
    const k = active.length;
    const dim = n + k;
    const w = dim + 1;
    kkt.fill(0, 0, dim * w);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) kkt[i * w + j] = h[i * n + j]!;
      kkt[i * w + dim] = rhs(i);
    }
    for (let a = 0; a < k; a++) {
      const row = active[a]! * n;
      for (let j = 0; j < n; j++) {
        kkt[(n + a) * w + j] = rows[row + j]!;
        kkt[j * w + n + a] = -rows[row + j]!;
      }
      kkt[(n + a) * w + dim] = tail(a);
    }
    return solveLinearInPlace(kkt, dim, rowOf, sol);
  };
  const zero = () => 0;

  // n·H⁻¹·n for every row: the largest its step n·z can be (with no row active).
  const reach = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    if (!solveKkt((j) => rows[i * n + j]!, zero)) return null;
    let s = 0;
    for (let j = 0; j < n; j++) s += rows[i * n + j]! * sol[j]!;
    reach[i] = s;
  }
  if (!solveKkt((j) => -c[j]!, zero)) return null;
  for (let j = 0; j < n; j++) x[j] = sol[j]!;

  const stepLimit = 8 * (m + n) + 20;
  for (let steps = 0; ; ) {
    let xScale = 1;
    for (let j = 0; j < n; j++) xScale = Math.max(xScale, Math.abs(x[j]!));
    let p = -1;
    let worst = -VIOLATION * xScale;
    for (let i = 0; i < m; i++) {
      if (isActive[i]) continue;
      let s = 0;
      for (let j = 0; j < n; j++) s += rows[i * n + j]! * x[j]!;
      const gap = (s - bounds[i]!) / norms[i]!;
      if (gap < worst) {
        worst = gap;
        p = i;
      }
    }
    if (p < 0) {
      const multipliers = new Float64Array(m);
      active.forEach((i, a) => (multipliers[i] = Math.max(0, lambda[a]!)));
      return { kind: 'optimal', x, multipliers };
    }
    let lambdaP = 0;
    for (;;) {
      if (++steps > stepLimit) return null;
      // Direction of x and of the active multipliers per unit of p's multiplier: H·z − Aᵀ·ρ = n_p, A·z = 0.
      if (!solveKkt((j) => rows[p * n + j]!, zero)) return null;
      const k = active.length;
      let npz = 0;
      for (let j = 0; j < n; j++) {
        z[j] = sol[j]!;
        npz += rows[p * n + j]! * z[j]!;
      }
      // The partial step: the first active multiplier to reach zero.
      let block = -1;
      let partial = Infinity;
      for (let a = 0; a < k; a++) {
        const rho = sol[n + a]!;
        if (rho < 0) {
          const t = Math.max(0, lambda[a]!) / -rho;
          if (t < partial) {
            partial = t;
            block = a;
          }
        }
      }
      const dependent = !(npz > DEPENDENT * reach[p]!);
      if (dependent && block < 0) {
        // n_p + Σ ρₐ·nₐ = 0 with every ρₐ ≥ 0, while p is violated where the active rows hold.
        const certificate = new Float64Array(m);
        certificate[p] = 1;
        for (let a = 0; a < k; a++) certificate[active[a]!] = Math.max(0, sol[n + a]!);
        return { kind: 'infeasible', certificate };
      }
      let gapP = -bounds[p]!;
      for (let j = 0; j < n; j++) gapP += rows[p * n + j]! * x[j]!;
      const full = dependent ? Infinity : Math.max(0, -gapP) / npz;
      const t = Math.min(partial, full);
      if (!dependent) for (let j = 0; j < n; j++) x[j] = x[j]! + t * z[j]!;
      for (let a = 0; a < k; a++) lambda[a] = lambda[a]! + t * sol[n + a]!;
      lambdaP += t;
      if (full <= partial) {
        active.push(p);
        lambda.push(lambdaP);
        isActive[p] = 1;
        break;
      }
      isActive[active[block]!] = 0;
      active.splice(block, 1);
      lambda.splice(block, 1);
    }
  }
}
