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

/** Sides of the polygon used at search nodes: 64 sides lose at most 0.12 % of a magnitude bound. */
export const NODE_DIRECTIONS = 64;
/** Sides tried either side of the centre direction at a node. */
export const NODE_WINDOW = 2;
/** Moves left at or below which node bounds count the move limit (tables grow with it). */
export const LIMITED_MOVES = 6;
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

/**
 * atan2 within 0.0003 rad (a polynomial on the octant): only picks the middle of the
 * window of polygon sides, so its error only has to stay well inside one side
 * (2π/64 = 0.098 rad); several times cheaper than Math.atan2 at every node.
 */
function roughAngle(y: number, x: number): number {
  const ax = Math.abs(x);
  const ay = Math.abs(y);
  if (ax === 0 && ay === 0) return 0;
  const t = ax > ay ? ay / ax : ax / ay;
  // atan(t) on [0, 1]: the usual odd polynomial fit.
  const t2 = t * t;
  let a = ((-0.0464964749 * t2 + 0.15931422) * t2 - 0.327622764) * t2 * t + t;
  if (ay > ax) a = Math.PI / 2 - a;
  if (x < 0) a = Math.PI - a;
  return y < 0 ? -a : a;
}

/**
 * Magnitude bounds at search nodes. The best direction for |q| lies close to the
 * direction of the centre of the reachable set (fixed part + the free circuits'
 * mean options), so only the `window` polygon sides either side of that
 * direction are tried: any direction gives a valid bound, and on random boards
 * a fine polygon with a narrow window cut more nodes per microsecond than a
 * coarse polygon tried all round.
 */
export class NodeBounder {
  private readonly table: Float64Array;
  private readonly centres: Float64Array;
  private readonly dirs: DirectionSet;
  private readonly firstFree: number;
  private readonly homeCentres: Float64Array;
  private readonly homeTable: Float64Array;
  private readonly topSavings: Float64Array;

  constructor(
    private readonly p: AssignmentProblem,
    order: Int32Array,
    sides = NODE_DIRECTIONS,
    private readonly window = NODE_WINDOW,
  ) {
    this.dirs = directionSet(sides);
    this.table = suffixDirectionTable(p, order, this.dirs);
    const n = p.circuitCount;
    const q2 = 2 * p.quantityCount;
    this.centres = new Float64Array((n + 1) * q2);
    for (let depth = n - 1; depth >= 0; depth--) {
      const i = order[depth]!;
      const k = p.optionCounts[i]!;
      for (let j = 0; j < q2; j++) {
        let mean = 0;
        for (let o = 0; o < k; o++) mean += p.contributions[contributionOffset(p, i, o) + j]!;
        this.centres[depth * q2 + j] = this.centres[(depth + 1) * q2 + j]! + mean / k;
      }
    }
    // With few moves left the free circuits mostly stay: per direction, the present options'
    // sum less the r largest savings from moving (exact for the linear function, as in
    // magnitudeBoundsWithMoveLimit), for r up to LIMITED_MOVES. Circuits that must move
    // come first in the order, so the tables start where they end.
    this.firstFree = 0;
    while (this.firstFree < n && p.home[order[this.firstFree]!]! < 0) this.firstFree++;
    const q = p.quantityCount;
    const D = this.dirs.count;
    const R = LIMITED_MOVES;
    this.homeCentres = new Float64Array((n + 1) * q2);
    this.homeTable = new Float64Array((n + 1) * q * D);
    this.topSavings = new Float64Array((n + 1) * q * D * (R + 1));
    const top = new Float64Array(q * D * R); // per (j, d): the R largest savings so far, descending
    for (let depth = n - 1; depth >= this.firstFree; depth--) {
      const i = order[depth]!;
      const h = p.home[i]!;
      const home = contributionOffset(p, i, h);
      for (let j = 0; j < q2; j++) this.homeCentres[depth * q2 + j] = this.homeCentres[(depth + 1) * q2 + j]! + p.contributions[home + j]!;
      for (let j = 0; j < q; j++)
        for (let d = 0; d < D; d++) {
          const c = this.dirs.cos[d]!;
          const sn = this.dirs.sin[d]!;
          const stay = c * p.contributions[home + 2 * j]! + sn * p.contributions[home + 2 * j + 1]!;
          let least = stay;
          for (let o = 0; o < p.optionCounts[i]!; o++) {
            const at = contributionOffset(p, i, o) + 2 * j;
            least = Math.min(least, c * p.contributions[at]! + sn * p.contributions[at + 1]!);
          }
          const cell = (depth * q + j) * D + d;
          this.homeTable[cell] = this.homeTable[((depth + 1) * q + j) * D + d]! + stay;
          // Insert this circuit's saving into the running top-R list.
          let saving = stay - least;
          const list = (j * D + d) * R;
          for (let r = 0; r < R; r++) {
            if (saving > top[list + r]!) {
              const held = top[list + r]!;
              top[list + r] = saving;
              saving = held;
            }
          }
          let running = 0;
          this.topSavings[cell * (R + 1)] = 0;
          for (let r = 0; r < R; r++) {
            running += top[list + r]!;
            this.topSavings[cell * (R + 1) + r + 1] = running;
          }
        }
    }
  }

  /**
   * Bounds on every magnitude below a node: `sums` at `at` holds base + the circuits before
   * `depth`; `movesLeft` is how many of the rest may still move.
   */
  bounds(sums: Float64Array, at: number, depth: number, out: Float64Array, movesLeft = Infinity): Float64Array {
    const q = this.p.quantityCount;
    const D = this.dirs.count;
    const { cos, sin } = this.dirs;
    const perTurn = D / (2 * Math.PI);
    const w = this.window;
    const R = LIMITED_MOVES;
    const limited = movesLeft <= R && depth >= this.firstFree;
    const centres = limited ? this.homeCentres : this.centres;
    for (let j = 0; j < q; j++) {
      const re = sums[at + 2 * j]!;
      const im = sums[at + 2 * j + 1]!;
      const cRe = re + centres[depth * 2 * q + 2 * j]!;
      const cIm = im + centres[depth * 2 * q + 2 * j + 1]!;
      const row = (depth * q + j) * D;
      const middle = Math.round(roughAngle(cIm, cRe) * perTurn);
      let best = 0;
      for (let t = middle - w; t <= middle + w; t++) {
        const d = ((t % D) + D) % D;
        const v = limited
          ? cos[d]! * re + sin[d]! * im + this.homeTable[row + d]! - this.topSavings[(row + d) * (R + 1) + movesLeft]!
          : cos[d]! * re + sin[d]! * im + this.table[row + d]!;
        if (v > best) best = v;
      }
      out[j] = best;
    }
    return out;
  }
}

/** Up to this many largest values are picked by insertion into a short list; more, by sorting. */
const FEW_LARGEST = 16;

/**
 * The r largest of values[0..count) into top[0..r), largest first (top[r − 1] is the r-th largest):
 * insertion into a short list, no sort, for the small r the bounds ask for. top starts full of −Infinity
 * so the first r values always enter.
 */
export function keepLargest(values: ArrayLike<number>, count: number, r: number, top: Float64Array): void {
  top.fill(-Infinity, 0, r);
  for (let t = 0; t < count; t++) {
    let v = values[t]!;
    if (v <= top[r - 1]!) continue;
    for (let u = 0; u < r; u++)
      if (v > top[u]!) {
        const held = top[u]!;
        top[u] = v;
        v = held;
      }
  }
}

/**
 * The sum of the `r` largest of `values[0..count)` (all of them where r ≥ count; none where r ≤ 0). A few are
 * picked by insertion into `scratch` (at least FEW_LARGEST long), O(count·r): a move limit of a few moves on a
 * large board sorted every direction's savings (256 sorts per quantity) for the 4 it kept. May reorder `values`.
 */
export function sumOfLargest(values: Float64Array, count: number, r: number, scratch: Float64Array): number {
  let sum = 0;
  if (r <= 0) return 0;
  if (r >= count) {
    for (let t = 0; t < count; t++) sum += values[t]!;
    return sum;
  }
  if (r > FEW_LARGEST) {
    const sorted = values.subarray(0, count).sort();
    for (let t = count - r; t < count; t++) sum += sorted[t]!;
    return sum;
  }
  keepLargest(values, count, r, scratch);
  for (let u = 0; u < r; u++) sum += scratch[u]!;
  return sum;
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
  const contributions = p.contributions;
  let forced = 0;
  for (let i = 0; i < n; i++) if (p.home[i]! < 0) forced++;
  const free = Math.max(0, Math.min(n, moveLimit) - forced);
  const savings = new Float64Array(n);
  const top = new Float64Array(FEW_LARGEST);
  // Per quantity, the circuits that change it: on an installation a circuit reaches only the incomers
  // on its path to the supply. One that adds nothing to quantity j in any option adds nothing to its
  // bound either (a saving of 0, and savings are never negative), so leaving it out changes no figure.
  const reaching: Int32Array[] = [];
  for (let j = 0; j < q; j++) {
    const list: number[] = [];
    for (let i = 0; i < n; i++)
      for (let k = 0; k < p.optionCounts[i]!; k++) {
        const at = contributionOffset(p, i, k) + 2 * j;
        if (contributions[at] !== 0 || contributions[at + 1] !== 0) {
          list.push(i);
          break;
        }
      }
    reaching.push(Int32Array.from(list));
  }
  for (let j = 0; j < q; j++) {
    let best = 0;
    const circuits = reaching[j]!;
    for (let d = 0; d < dirs.count; d++) {
      const c = dirs.cos[d]!;
      const s = dirs.sin[d]!;
      let value = c * p.base[2 * j]! + s * p.base[2 * j + 1]!;
      let m = 0;
      for (let r = 0; r < circuits.length; r++) {
        const i = circuits[r]!;
        let least = Infinity;
        let stay = 0;
        const h = p.home[i]!;
        const options = p.optionCounts[i]!;
        for (let k = 0; k < options; k++) {
          const at = contributionOffset(p, i, k) + 2 * j;
          const v = c * contributions[at]! + s * contributions[at + 1]!;
          if (v < least) least = v;
          if (k === h) stay = v;
        }
        if (h < 0) value += least;
        else {
          value += stay;
          savings[m++] = stay - least;
        }
      }
      value -= sumOfLargest(savings, m, free, top);
      if (value > best) best = value;
    }
    out[j] = best;
  }
  return out;
}
