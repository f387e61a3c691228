/**
 * Large-neighbourhood improvement: free a random handful of circuits, hold the
 * rest where they are, and let branch-and-bound find the best placing of the
 * handful exactly. Moving several circuits at once in a coordinated way is what
 * one- and two-circuit local search cannot do, and near the balanced optimum
 * the last fractions of a per cent need exactly that.
 */
import { contributionOffset, MAX_OPTIONS, type AssignmentProblem, type ScoredChoice } from './assignmentProblem.js';
import { searchExact } from './searchExact.js';
import { seededRandom } from './seededRandom.js';

export interface SubsetSearchOptions {
  readonly moveLimit: number;
  readonly rounds: number;
  /** Circuits freed in each round. */
  readonly size: number;
  /** Node budget of each round's branch-and-bound. */
  readonly nodeBudget: number;
  readonly seed: number;
  readonly tie: number;
}

/** The problem restricted to `free` circuits, the others fixed on their options in `choice`. */
function restrict(p: AssignmentProblem, choice: Int32Array, free: readonly number[]): { sub: AssignmentProblem; fixedMoves: number } {
  const q2 = 2 * p.quantityCount;
  const isFree = new Uint8Array(p.circuitCount);
  for (const i of free) isFree[i] = 1;
  const base = Float64Array.from(p.base);
  let fixedMoves = 0;
  for (let i = 0; i < p.circuitCount; i++) {
    if (isFree[i]) continue;
    if (choice[i] !== p.home[i]) fixedMoves++;
    const at = contributionOffset(p, i, choice[i]!);
    for (let j = 0; j < q2; j++) base[j]! += p.contributions[at + j]!;
  }
  const contributions = new Float64Array(free.length * MAX_OPTIONS * q2);
  free.forEach((i, s) => contributions.set(p.contributions.subarray(contributionOffset(p, i, 0), contributionOffset(p, i, 0) + MAX_OPTIONS * q2), s * MAX_OPTIONS * q2));
  const sub: AssignmentProblem = {
    circuitCount: free.length,
    quantityCount: p.quantityCount,
    optionCounts: Int32Array.from(free, (i) => p.optionCounts[i]!),
    home: Int32Array.from(free, (i) => p.home[i]!),
    base,
    contributions,
    limits: p.limits,
    score: p.score,
  };
  return { sub, fixedMoves };
}

export function searchSubsets(p: AssignmentProblem, start: ScoredChoice, o: SubsetSearchOptions): ScoredChoice {
  const random = seededRandom(o.seed);
  const movable = [...Array(p.circuitCount).keys()].filter((i) => p.optionCounts[i]! > 1);
  if (movable.length <= o.size) return start;
  let best = start;
  for (let round = 0; round < o.rounds; round++) {
    // A random handful (partial Fisher–Yates).
    const pool = movable.slice();
    for (let t = 0; t < o.size; t++) {
      const r = t + Math.floor(random() * (pool.length - t));
      [pool[t], pool[r]] = [pool[r]!, pool[t]!];
    }
    const free = pool.slice(0, o.size);
    const { sub, fixedMoves } = restrict(p, best.choice, free);
    const limit = o.moveLimit - fixedMoves;
    if (limit < 0) continue;
    const incumbent: ScoredChoice = {
      choice: Int32Array.from(free, (i) => best.choice[i]!),
      score: best.score,
      excess: best.excess,
      moves: best.moves - fixedMoves,
    };
    const found = searchExact(sub, { moveLimit: limit, nodeBudget: o.nodeBudget, incumbent, tie: o.tie }).best;
    if (found.choice.every((k, s) => k === incumbent.choice[s])) continue;
    const choice = Int32Array.from(best.choice);
    free.forEach((i, s) => (choice[i] = found.choice[s]!));
    best = { choice, score: found.score, excess: found.excess, moves: found.moves + fixedMoves };
  }
  return best;
}
