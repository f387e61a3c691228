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

/**
 * How far the magnitudes exceed their limits, summed in A (0 when every limit holds): a penalty the
 * greedy start and the trimming of moves add to the score. The searches compare answers by the
 * overload measure below instead.
 */
export function limitExcess(p: AssignmentProblem, magnitudes: Float64Array): number {
  let excess = 0;
  for (let j = 0; j < magnitudes.length; j++) {
    const over = magnitudes[j]! - p.limits[j]!;
    if (over > 0) excess += over;
  }
  return excess;
}

/**
 * The overload measure, per unit of each quantity's limit (a study capacity or the file's rating):
 * the largest loading over 1, |q|/limit − 1 (0 when every limit holds). A board already over a
 * rating is scored by how far over it stays, so a move set that lowers the worst overload always
 * beats one that keeps it, whatever the aim's score.
 */
export function largestOverload(p: AssignmentProblem, magnitudes: Float64Array): number {
  let largest = 0;
  for (let j = 0; j < magnitudes.length; j++) {
    const over = magnitudes[j]! / p.limits[j]! - 1;
    if (over > largest) largest = over;
  }
  return largest;
}

/** The overload measure's second part: every loading over 1 added, per unit (between answers of equal largest overload). */
export function overloadSum(p: AssignmentProblem, magnitudes: Float64Array): number {
  let sum = 0;
  for (let j = 0; j < magnitudes.length; j++) {
    const over = magnitudes[j]! / p.limits[j]! - 1;
    if (over > 0) sum += over;
  }
  return sum;
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

/**
 * An assignment with its score and overload: `excess` the largest loading over a limit, `excessSum`
 * every loading over a limit added (both per unit; 0 when every limit holds).
 */
export interface ScoredChoice {
  readonly choice: Int32Array;
  readonly score: number;
  readonly excess: number;
  readonly excessSum: number;
  readonly moves: number;
}

export function scoreChoice(p: AssignmentProblem, choice: Int32Array): ScoredChoice {
  const mags = magnitudesOf(sumQuantities(p, choice), new Float64Array(p.quantityCount));
  return { choice: Int32Array.from(choice), score: p.score(mags), excess: largestOverload(p, mags), excessSum: overloadSum(p, mags), moves: countMoves(p, choice) };
}

/**
 * Scores within this of each other count as equal; then fewer moves wins.
 * Far above float noise on the sums (~1e-13 of the currents), far below anything a meter shows.
 */
export function tieTolerance(reference: number): number {
  return 1e-9 * Math.max(Math.abs(reference), 1e-6);
}

/**
 * Overloads (per unit) within this of each other count as equal: mirror-image answers over the same
 * limits by the same amounts differ by float noise only, which must not buy a move.
 */
export const OVERLOAD_TIE = 1e-9;

/** True when every limited quantity is within its limit (up to OVERLOAD_TIE). */
export const withinLimits = (a: { readonly excess: number }): boolean => a.excess <= OVERLOAD_TIE;

/** The parts answers are compared by. */
export interface AnswerKey {
  readonly excess: number;
  readonly excessSum: number;
  readonly score: number;
  readonly moves: number;
}

/**
 * True when a is a better answer than b: the least largest overload first, then the least sum of
 * overloads, then the score (ties within `tie`), then fewer moves. Where every limit holds (both
 * overloads 0) that is the score, then fewer moves.
 */
export function isBetter(a: AnswerKey, b: AnswerKey, tie: number): boolean {
  if (a.excess < b.excess - OVERLOAD_TIE) return true;
  if (a.excess > b.excess + OVERLOAD_TIE) return false;
  if (a.excessSum < b.excessSum - OVERLOAD_TIE) return true;
  if (a.excessSum > b.excessSum + OVERLOAD_TIE) return false;
  if (a.score < b.score - tie) return true;
  if (a.score > b.score + tie) return false;
  return a.moves < b.moves;
}

/**
 * True when no completion below a search node can beat `best`: every part of the node's key is a
 * lower bound on that part of any completion's (overloads and score from magnitude bounds, moves
 * only grow), compared part by part as isBetter compares them.
 */
export function cannotBeat(node: AnswerKey, best: AnswerKey, tie: number): boolean {
  if (node.excess > best.excess + OVERLOAD_TIE) return true;
  if (node.excess < best.excess - OVERLOAD_TIE) return false;
  if (node.excessSum > best.excessSum + OVERLOAD_TIE) return true;
  if (node.excessSum < best.excessSum - OVERLOAD_TIE) return false;
  if (node.score > best.score + tie) return true;
  if (node.score < best.score - tie) return false;
  return node.moves >= best.moves;
}
