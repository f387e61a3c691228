/**
 * Lower bounds on the score of any completion of a partial assignment.
 *
 * For a unit direction u, |q| ≥ Re(ū·q), and Re(ū·q) is linear in the choices,
 * so its minimum over the free circuits splits circuit by circuit:
 *   |q| ≥ Re(ū·S) + Σ_free min_k Re(ū·c_ik).
 * Taking the best of D directions bounds |q| by the distance from the origin to
 * a D-sided polygon around the set of reachable sums (the convex hull of the
 * free circuits' options, Minkowski-added) — within cos(π/D) of the exact hull
 * distance. The score never decreases with a magnitude, so the score of the
 * magnitude bounds bounds the score. With a move limit r the free part becomes
 * "the r largest savings from moving", still exact for the linear function.
 */
import { contributionOffset, type AssignmentProblem } from './assignmentProblem.js';

export interface DirectionSet {
  readonly count: number;
  readonly cos: Float64Array;
  readonly sin: Float64Array;
}

export function directionSet(count: number): DirectionSet {
  const cos = new Float64Array(count);
  const sin = new Float64Array(count);
  for (let d = 0; d < count; d++) {
    cos[d] = Math.cos((2 * Math.PI * d) / count);
    sin[d] = Math.sin((2 * Math.PI * d) / count);
  }
  return { count, cos, sin };
}

/** Sides of the polygon used at every search node: 16 sides lose at most 1.9 % of a magnitude bound. */
export const NODE_DIRECTIONS = 16;
/** Sides used for the one-off bound reported with an answer: 256 sides lose at most 0.008 %. */
export const REPORT_DIRECTIONS = 256;

/**
 * Suffix table for circuits taken in `order`: entry ((depth·Q + j)·D + d) is
 * Σ_{t ≥ depth} min_k Re(ū_d · contribution(order[t], k)_j).
 */
export function suffixDirectionTable(p: AssignmentProblem, order: Int32Array, dirs: DirectionSet): Float64Array {
  const n = p.circuitCount;
  const q = p.quantityCount;
  const D = dirs.count;
  const table = new Float64Array((n + 1) * q * D);
  for (let depth = n - 1; depth >= 0; depth--) {
    const i = order[depth]!;
    for (let j = 0; j < q; j++) {
      for (let d = 0; d < D; d++) {
        let least = Infinity;
        for (let k = 0; k < p.optionCounts[i]!; k++) {
          const at = contributionOffset(p, i, k) + 2 * j;
          const v = dirs.cos[d]! * p.contributions[at]! + dirs.sin[d]! * p.contributions[at + 1]!;
          if (v < least) least = v;
        }
        table[(depth * q + j) * D + d] = table[((depth + 1) * q + j) * D + d]! + least;
      }
    }
  }
  return table;
}

/** Magnitude bounds at a node: `sums` holds the fixed part (base + circuits before `depth`). */
export function nodeMagnitudeBounds(
  p: AssignmentProblem,
  sums: Float64Array,
  sumsAt: number,
  depth: number,
  table: Float64Array,
  dirs: DirectionSet,
  out: Float64Array,
): Float64Array {
  const q = p.quantityCount;
  const D = dirs.count;
  for (let j = 0; j < q; j++) {
    const re = sums[sumsAt + 2 * j]!;
    const im = sums[sumsAt + 2 * j + 1]!;
    const row = (depth * q + j) * D;
    let best = 0;
    for (let d = 0; d < D; d++) {
      const v = dirs.cos[d]! * re + dirs.sin[d]! * im + table[row + d]!;
      if (v > best) best = v;
    }
    out[j] = best;
  }
  return out;
}

/**
 * Bounds on every magnitude over all assignments with at most `moveLimit` moves
 * (circuits that must move are counted in). Returns magnitude bounds; the
 * score bound is `p.score(bounds)`.
 */
export function magnitudeBoundsWithMoveLimit(p: AssignmentProblem, moveLimit: number, dirs = directionSet(REPORT_DIRECTIONS)): Float64Array {
  const n = p.circuitCount;
  const q = p.quantityCount;
  const out = new Float64Array(q);
  let forced = 0;
  for (let i = 0; i < n; i++) if (p.home[i]! < 0) forced++;
  const free = Math.max(0, Math.min(n, moveLimit) - forced);
  const savings = new Float64Array(n);
  for (let j = 0; j < q; j++) {
    let best = 0;
    for (let d = 0; d < dirs.count; d++) {
      const c = dirs.cos[d]!;
      const s = dirs.sin[d]!;
      let value = c * p.base[2 * j]! + s * p.base[2 * j + 1]!;
      let m = 0;
      for (let i = 0; i < n; i++) {
        let least = Infinity;
        for (let k = 0; k < p.optionCounts[i]!; k++) {
          const at = contributionOffset(p, i, k) + 2 * j;
          const v = c * p.contributions[at]! + s * p.contributions[at + 1]!;
          if (v < least) least = v;
        }
        const h = p.home[i]!;
        if (h < 0) {
          value += least;
          continue;
        }
        const at = contributionOffset(p, i, h) + 2 * j;
        const stay = c * p.contributions[at]! + s * p.contributions[at + 1]!;
        value += stay;
        savings[m++] = stay - least;
      }
      if (free >= m) for (let t = 0; t < m; t++) value -= savings[t]!;
      else if (free > 0) {
        const sorted = savings.subarray(0, m).sort();
        for (let t = m - free; t < m; t++) value -= sorted[t]!;
      }
      if (value > best) best = value;
    }
    out[j] = best;
  }
  return out;
}
