/**
 * A lower bound on the least largest loading any assignment can reach: the first thing the overload-first
 * ranking (assignmentProblem.ts isBetter) minimises, max_j |q_j| / L_j over the limited quantities.
 *
 * Why it is a lower bound. For weights z_j (complex) with Σ_j |z_j| ≤ 1, and for every assignment x:
 *
 *   max_j |q_j(x)| / L_j  ≥  Σ_j |z_j| · |q_j(x)| / L_j        (a weighted mean, weights ≤ 1 in all, of non-negative terms)
 *                         ≥  Σ_j Re(z̄_j · q_j(x)) / L_j        (|z|·|q| ≥ Re(z̄·q), Cauchy–Schwarz in the plane)
 *                         =  Σ_j Re(z̄_j · base_j) / L_j + Σ_i g_i(k_i),   g_i(k) = Σ_j Re(z̄_j · c_ikj) / L_j
 *
 * (the first line needs a non-negative left side, which a maximum of magnitudes is). The last line is affine in the
 * choices, so its least value over the assignments with at most r moves is found exactly, circuit by circuit: a
 * circuit that must move takes its least g_i, the others stay unless among the r largest savings
 * g_i(home) − min_k g_i(k) (as assignmentBounds.ts counts moves). That least value is at most the right-hand side at
 * the best assignment, hence at most its largest loading: a lower bound, for every z. Any z will do; a better z gives
 * a higher bound, so z climbs by projected subgradient steps (the subgradient at z is the loading phasors q_j(x*)/L_j
 * of the minimising assignment x*) and the highest value met is kept. With one z_j = 1 this is the polygon bound on one
 * quantity; spread over a board's three lines it recovers the Parseval bound (a spread load still draws |I1| per line).
 * The bound relaxes whole circuits to shares, so on boards of few large circuits it stays below the least whole
 * arrangement: there the exact search proves the answer instead.
 */
import { contributionOffset, largestOverload, magnitudesOf, sumQuantities, type AssignmentProblem } from './assignmentProblem.js';
import { keepLargest, magnitudeBoundsWithMoveLimit } from './assignmentBounds.js';
import type { LoadingBound } from './rebalanceResult.js';

export interface LoadingBoundOptions {
  /** Most subgradient steps. */
  readonly steps: number;
  /**
   * A largest loading some assignment reaches (per unit): an upper end for the step length, and the climb stops
   * once the bound reaches it (nothing higher can be proven).
   */
  readonly reached: number;
  /** The assignment that reaches it: one of the climb's starting points. */
  readonly choice: ArrayLike<number>;
}

/** Steps where the climb is not told otherwise: ~1 ms on 84 circuits with a rated line set and neutral. */
export const LOADING_BOUND_STEPS = 120;

/** A bound within this share of `reached` stops the climb: the rest would not change a figure anyone reads. */
const CLOSE_ENOUGH = 1e-7;

/**
 * @returns a lower bound on min over assignments with at most `moveLimit` moves of max_j |q_j| / limit_j (per unit,
 *   1 = at the limit); 0 where nothing is limited.
 */
export function leastLoadingBound(p: AssignmentProblem, moveLimit: number, options: LoadingBoundOptions): number {
  const limited: number[] = [];
  for (let j = 0; j < p.quantityCount; j++) if (Number.isFinite(p.limits[j]!) && p.limits[j]! > 0) limited.push(j);
  const m = limited.length;
  if (m === 0) return 0;
  const n = p.circuitCount;
  // Each limited quantity per unit of its limit: base and contributions, compact (re, im) rows.
  const base = new Float64Array(2 * m);
  const rows = new Float64Array(n * 3 * 2 * m);
  limited.forEach((j, r) => {
    const scale = 1 / p.limits[j]!;
    base[2 * r] = p.base[2 * j]! * scale;
    base[2 * r + 1] = p.base[2 * j + 1]! * scale;
    for (let i = 0; i < n; i++)
      for (let k = 0; k < p.optionCounts[i]!; k++) {
        const from = contributionOffset(p, i, k) + 2 * j;
        const to = ((i * 3 + k) * m + r) * 2;
        rows[to] = p.contributions[from]! * scale;
        rows[to + 1] = p.contributions[from + 1]! * scale;
      }
  });
  let forced = 0;
  for (let i = 0; i < n; i++) if (p.home[i]! < 0) forced++;
  const free = Math.max(0, Math.min(n, moveLimit) - forced);

  const z = new Float64Array(2 * m);
  const g = new Float64Array(3);
  const least = new Int32Array(n);
  const savings = new Float64Array(n);
  const byRank = new Int32Array(n);
  const chosen = new Int32Array(n);
  const loading = new Float64Array(2 * m);

  const ranked = new Float64Array(n);
  const top = new Float64Array(16);
  let strictlyAbove = 0;
  /** The r-th largest saving of the movable circuits (sets strictlyAbove: how many lie above it). */
  const kthLargest = (movable: number, r: number): number => {
    for (let t = 0; t < movable; t++) ranked[t] = savings[byRank[t]!]!;
    let threshold: number;
    if (r <= top.length) {
      keepLargest(ranked, movable, r, top);
      threshold = top[r - 1]!;
    } else threshold = ranked.subarray(0, movable).sort()[movable - r]!;
    strictlyAbove = 0;
    for (let t = 0; t < movable; t++) if (ranked[t]! > threshold) strictlyAbove++;
    return threshold;
  };

  /** The least value of the affine minorant at z over the assignments, and its minimiser into `chosen`. */
  const minorant = (): number => {
    let value = 0;
    for (let r = 0; r < m; r++) value += z[2 * r]! * base[2 * r]! + z[2 * r + 1]! * base[2 * r + 1]!;
    let movable = 0;
    for (let i = 0; i < n; i++) {
      let best = 0;
      for (let k = 0; k < p.optionCounts[i]!; k++) {
        let s = 0;
        const at = (i * 3 + k) * m * 2;
        for (let t = 0; t < 2 * m; t++) s += z[t]! * rows[at + t]!;
        g[k] = s;
        if (s < g[best]!) best = k;
      }
      least[i] = best;
      const h = p.home[i]!;
      if (h < 0) {
        value += g[best]!;
        chosen[i] = best;
      } else {
        value += g[h]!;
        chosen[i] = h;
        savings[i] = g[h]! - g[best]!;
        if (savings[i]! > 0) byRank[movable++] = i;
      }
    }
    if (free > 0 && movable > 0) {
      // The circuits of the `free` largest savings move: all of them, or those whose saving reaches the
      // free-th largest (ties broken by order: any of them gives the same least value).
      const threshold = free >= movable ? -Infinity : kthLargest(movable, free);
      let atThreshold = free - strictlyAbove;
      for (let t = 0; t < movable; t++) {
        const i = byRank[t]!;
        const saving = savings[i]!;
        if (saving > threshold || (saving === threshold && atThreshold-- > 0)) {
          value -= saving;
          chosen[i] = least[i]!;
        }
      }
    }
    return value;
  };

  /** The loading phasors q_j(chosen) / L_j: the subgradient of the minorant's least value at z. */
  const loadingsOfChosen = () => {
    loading.set(base);
    for (let i = 0; i < n; i++) {
      const at = (i * 3 + chosen[i]!) * m * 2;
      for (let t = 0; t < 2 * m; t++) loading[t]! += rows[at + t]!;
    }
  };

  /** z onto Σ|z_j| ≤ 1: each modulus lowered by one threshold (the ℓ1 ball's projection), directions kept. */
  const project = () => {
    const moduli = Array.from({ length: m }, (_, r) => Math.sqrt(z[2 * r]! ** 2 + z[2 * r + 1]! ** 2));
    const total = moduli.reduce((s, x) => s + x, 0);
    if (total <= 1) return;
    const sorted = [...moduli].sort((a, b) => b - a);
    let running = 0;
    let threshold = 0;
    for (let t = 0; t < m; t++) {
      running += sorted[t]!;
      const candidate = (running - 1) / (t + 1);
      if (t === m - 1 || sorted[t + 1]! <= candidate) {
        threshold = candidate;
        break;
      }
    }
    for (let r = 0; r < m; r++) {
      const kept = moduli[r]! > threshold ? (moduli[r]! - threshold) / moduli[r]! : 0;
      z[2 * r]! *= kept;
      z[2 * r + 1]! *= kept;
    }
  };

  // Starts: z along the loading phasors of an assignment, weighted by their size (the quantities that assignment
  // loads most weigh most), or all on its most loaded quantity (the polygon bound's direction). Assignments: the
  // present wiring, one reached (the search's answer), and the centre of the relaxed set (each circuit shared evenly
  // between its options: a spread board's lines there point along the positive sequence, the Parseval bound's z).
  let bestValue = -Infinity;
  let bestZ = new Float64Array(2 * m);
  const tryStart = (top: boolean) => {
    z.fill(0);
    let total = 0;
    let at = 0;
    let largest = -1;
    for (let r = 0; r < m; r++) {
      const size = Math.sqrt(loading[2 * r]! ** 2 + loading[2 * r + 1]! ** 2);
      total += size;
      if (size > largest) {
        largest = size;
        at = r;
      }
    }
    if (!(total > 0)) return;
    if (top) {
      z[2 * at] = loading[2 * at]! / largest;
      z[2 * at + 1] = loading[2 * at + 1]! / largest;
    } else for (let t = 0; t < 2 * m; t++) z[t] = loading[t]! / total;
    const value = minorant();
    if (value > bestValue) {
      bestValue = value;
      bestZ = Float64Array.from(z);
    }
  };
  const startsFrom = (choice: ArrayLike<number> | null) => {
    if (choice) {
      for (let i = 0; i < n; i++) chosen[i] = choice[i]!;
      loadingsOfChosen();
    } else {
      loading.set(base);
      for (let i = 0; i < n; i++)
        for (let k = 0; k < p.optionCounts[i]!; k++) {
          const at = (i * 3 + k) * m * 2;
          for (let t = 0; t < 2 * m; t++) loading[t]! += rows[at + t]! / p.optionCounts[i]!;
        }
    }
    tryStart(true);
    tryStart(false);
  };
  startsFrom(Int32Array.from(p.home, (h) => (h < 0 ? 0 : h)));
  startsFrom(options.choice);
  startsFrom(null);
  const target = options.reached;
  if (!(target > bestValue)) return Math.max(0, bestValue);

  // Polyak steps towards the reached loading (an over-estimate of the dual optimum), the step share halved after
  // a run of steps without progress, restarting from the best z: the usual subgradient schedule.
  z.set(bestZ);
  let share = 1;
  let idle = 0;
  for (let step = 0; step < options.steps; step++) {
    const value = minorant();
    if (value > bestValue) {
      bestValue = value;
      bestZ = Float64Array.from(z);
      idle = 0;
      if (bestValue >= target * (1 - CLOSE_ENOUGH)) break;
    } else if (++idle >= 8) {
      share /= 2;
      idle = 0;
      z.set(bestZ);
      if (share < 1e-4) break;
      continue;
    }
    loadingsOfChosen();
    let norm = 0;
    for (let t = 0; t < 2 * m; t++) norm += loading[t]! ** 2;
    if (!(norm > 0)) break;
    const length = (share * (target - value)) / norm;
    for (let t = 0; t < 2 * m; t++) z[t]! += length * loading[t]!;
    project();
  }
  return Math.max(0, bestValue);
}

/**
 * A bound above 100 % by less than this (per unit) proves nothing anyone could act on: a limit missed by a hundredth
 * of a per cent in a model is not shown as "cannot be met".
 */
export const UNREACHABLE_MARGIN = 1e-4;

/**
 * Decimals for the answer's loading and the bound, %: enough to show a gap under a point (up to 2), and more where
 * fewer would show the bound, rounded down, equal to the answer or, proving a limit out of reach, not above 100 %.
 */
function boundDecimals(answer: number, bound: number, unreachable: boolean): number {
  const down = (x: number, d: number) => Math.floor(x * 10 ** d + 1e-9) / 10 ** d;
  const near = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;
  const gap = answer - bound;
  let d = gap >= 1 || gap <= 0 ? 0 : gap >= 0.1 ? 1 : 2;
  while (d < 2 && ((unreachable && down(bound, d) <= 100) || (gap > 0 && down(bound, d) >= near(answer, d)))) d++;
  return d;
}

/**
 * The answer's largest loading beside the least any arrangement can reach (fast model, % of each limit): proven
 * equal where the exact search completed, else the bound of leastLoadingBound.
 * @param p the problem with the limits the figures are stated against
 * @param proven the exact search completed over these same limits: the answer is the least overload
 * @param magnitudeBounds magnitudeBoundsWithMoveLimit(p, moveLimit) where the search has them (they do not depend on the limits)
 */
export function loadingBoundOf(p: AssignmentProblem, moveLimit: number, choice: Int32Array, proven: boolean, magnitudeBounds?: Float64Array | null): LoadingBound {
  const answer = 1 + largestOverload(p, magnitudesOf(sumQuantities(p, choice), new Float64Array(p.quantityCount)));
  // largestOverload counts only loadings over 1; the answer is over a limit here, so this is its largest loading.
  // Each limited quantity alone (its 256-sided polygon bound, the best direction for it) may beat the climb's start.
  const alone = magnitudeBounds ?? magnitudeBoundsWithMoveLimit(p, moveLimit);
  let single = 0;
  for (let j = 0; j < p.quantityCount; j++) if (Number.isFinite(p.limits[j]!) && p.limits[j]! > 0) single = Math.max(single, alone[j]! / p.limits[j]!);
  const raw = proven ? answer : Math.max(single, leastLoadingBound(p, moveLimit, { steps: LOADING_BOUND_STEPS, reached: answer, choice }));
  // Round-off can put a bound a hair above the answer that meets it: never state a bound above an answer found.
  const bound = Math.min(raw, answer);
  const unreachable = bound > 1 + UNREACHABLE_MARGIN;
  return {
    leastPercent: 100 * bound,
    answerPercent: 100 * answer,
    limitsUnreachable: unreachable,
    answerLeast: bound >= answer - 1e-9,
    decimals: boundDecimals(100 * answer, 100 * bound, unreachable),
  };
}
