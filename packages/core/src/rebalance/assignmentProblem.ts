/**
 * The numeric form of a phase-assignment problem, shared by the exact search,
 * the local search and the bounds. Everything the searches score is a set of
 * complex "quantities" (line currents, neutral current, negative-sequence
 * current… in each load condition), each an affine function of the choices:
 *
 *   q_j = base_j + Σ_i contribution(i, chosen option of i)_j
 *
 * and the score is a function of their magnitudes that never decreases when a
 * magnitude grows. That monotonicity is what makes lower bounds on the
 * magnitudes (bounds.ts) lower bounds on the score.
 *
 * Typed arrays, interleaved (re, im): the searches visit millions of nodes.
 */

/** Most options a circuit can have: three phases, or three line pairs. */
export const MAX_OPTIONS = 3;

export interface AssignmentProblem {
  readonly circuitCount: number;
  /** Number of complex quantities Q. */
  readonly quantityCount: number;
  /** Options of each circuit (1 for a circuit pinned to one connection). */
  readonly optionCounts: Int32Array;
  /** Option each circuit sits on now; −1 when it must leave (pinned elsewhere). */
  readonly home: Int32Array;
  /** Constant part of each quantity (circuits that cannot move, supply terms), 2Q. */
  readonly base: Float64Array;
  /** Contribution of circuit i on option k at offset (i·MAX_OPTIONS + k)·2Q. */
  readonly contributions: Float64Array;
  /** Upper limit on each quantity's magnitude (Infinity where none): line capacities. */
  readonly limits: Float64Array;
  /** The score from the magnitudes; non-decreasing in each of them. Lower is better. */
  readonly score: (magnitudes: Float64Array) => number;
}

export const contributionOffset = (p: AssignmentProblem, circuit: number, option: number): number =>
  (circuit * MAX_OPTIONS + option) * 2 * p.quantityCount;

/** Quantities of an assignment: base + chosen contributions (into `out`, 2Q). */
export function sumQuantities(p: AssignmentProblem, choice: ArrayLike<number>, out = new Float64Array(2 * p.quantityCount)): Float64Array {
  out.set(p.base);
  for (let i = 0; i < p.circuitCount; i++) {
    const at = contributionOffset(p, i, choice[i]!);
    for (let j = 0; j < out.length; j++) out[j]! += p.contributions[at + j]!;
  }
  return out;
}

/** |q_j| for each quantity (Math.hypot is several times slower and currents cannot overflow here). */
export function magnitudesOf(sums: Float64Array, out: Float64Array, at = 0): Float64Array {
  for (let j = 0; j < out.length; j++) {
    const re = sums[at + 2 * j]!;
    const im = sums[at + 2 * j + 1]!;
    out[j] = Math.sqrt(re * re + im * im);
  }
  return out;
}

/** How far the magnitudes exceed their limits, summed (0 when every limit holds). */
export function limitExcess(p: AssignmentProblem, magnitudes: Float64Array): number {
  let excess = 0;
  for (let j = 0; j < magnitudes.length; j++) {
    const over = magnitudes[j]! - p.limits[j]!;
    if (over > 0) excess += over;
  }
  return excess;
}

export function countMoves(p: AssignmentProblem, choice: ArrayLike<number>): number {
  let moves = 0;
  for (let i = 0; i < p.circuitCount; i++) if (choice[i] !== p.home[i]) moves++;
  return moves;
}

/** The starting assignment: every circuit where it is (a forced circuit on its only option). */
export function homeChoice(p: AssignmentProblem): Int32Array {
  return Int32Array.from(p.home, (k) => (k < 0 ? 0 : k));
}

/** An assignment with its score; `excess` > 0 means a line limit is broken. */
export interface ScoredChoice {
  readonly choice: Int32Array;
  readonly score: number;
  readonly excess: number;
  readonly moves: number;
}

export function scoreChoice(p: AssignmentProblem, choice: Int32Array): ScoredChoice {
  const mags = magnitudesOf(sumQuantities(p, choice), new Float64Array(p.quantityCount));
  return { choice: Int32Array.from(choice), score: p.score(mags), excess: limitExcess(p, mags), moves: countMoves(p, choice) };
}

/**
 * Scores within this of each other count as equal; then fewer moves wins.
 * Far above float noise on the sums (~1e-13 of the currents), far below anything a meter shows.
 */
export function tieTolerance(reference: number): number {
  return 1e-9 * Math.max(Math.abs(reference), 1e-6);
}

/** True when a is a better answer than b: feasible first, then score (with ties), then fewer moves. */
export function isBetter(a: ScoredChoice, b: ScoredChoice, tie: number): boolean {
  const aOk = a.excess <= tie;
  const bOk = b.excess <= tie;
  if (aOk !== bOk) return aOk;
  if (!aOk) return a.excess < b.excess - tie;
  if (a.score < b.score - tie) return true;
  if (a.score > b.score + tie) return false;
  return a.moves < b.moves;
}
