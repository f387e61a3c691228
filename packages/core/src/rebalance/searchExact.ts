/**
 * Branch-and-bound over the circuits' options: proves the best assignment (or
 * stops at a node budget and says so). Depth-first, largest circuits first,
 * children visited in order of their bound with the present option first, so
 * ties go to the answer with fewer moves; a node is cut when its polygon bound
 * (assignmentBounds.ts) cannot beat the best answer found. Answers are compared
 * as isBetter compares them (the least overload of the limits first, then the
 * score, then fewer moves), and a node's bound is that key of its magnitude
 * bounds, so a complete search proves the answer over that same order: where no
 * answer keeps every limit, the least overload is proven, not only that none does.
 */
import {
  cannotBeat,
  contributionOffset,
  countMoves,
  isBetter,
  largestOverload,
  magnitudesOf,
  MAX_OPTIONS,
  overloadSum,
  type AssignmentProblem,
  type ScoredChoice,
} from './assignmentProblem.js';
import { NodeBounder } from './assignmentBounds.js';

export interface ExactSearchOptions {
  readonly moveLimit: number;
  /** Stop after this many nodes; the answer is then the best found, not proven. */
  readonly nodeBudget: number;
  /** A known answer to start from (its score prunes from the first node). */
  readonly incumbent: ScoredChoice;
  readonly tie: number;
}

export interface ExactSearchResult {
  readonly best: ScoredChoice;
  /** True when every node was either visited or cut by its bound: `best` is proven. */
  readonly complete: boolean;
  readonly nodes: number;
}

/** Circuits with one option first (no branching), then by the largest contribution. */
function searchOrder(p: AssignmentProblem): Int32Array {
  const size = (i: number): number => {
    let biggest = 0;
    for (let k = 0; k < p.optionCounts[i]!; k++) {
      const at = contributionOffset(p, i, k);
      let s = 0;
      for (let j = 0; j < 2 * p.quantityCount; j++) s += p.contributions[at + j]! ** 2;
      biggest = Math.max(biggest, s);
    }
    return biggest;
  };
  const ids = Array.from({ length: p.circuitCount }, (_, i) => i);
  const sizes = ids.map(size);
  ids.sort((a, b) => {
    const fa = p.optionCounts[a] === 1 ? 0 : 1;
    const fb = p.optionCounts[b] === 1 ? 0 : 1;
    return fa - fb || sizes[b]! - sizes[a]! || a - b;
  });
  return Int32Array.from(ids);
}

export function searchExact(p: AssignmentProblem, options: ExactSearchOptions): ExactSearchResult {
  const n = p.circuitCount;
  const q2 = 2 * p.quantityCount;
  const order = searchOrder(p);
  const bounder = new NodeBounder(p, order);
  const { moveLimit, nodeBudget, tie } = options;

  // Sum of the present options from each depth on, for the "no moves left" shortcut.
  let firstFree = 0;
  while (firstFree < n && p.home[order[firstFree]!]! < 0) firstFree++;
  const homeSuffix = new Float64Array((n + 1) * q2);
  for (let depth = n - 1; depth >= firstFree; depth--) {
    const i = order[depth]!;
    const at = contributionOffset(p, i, p.home[i]!);
    for (let j = 0; j < q2; j++) homeSuffix[depth * q2 + j] = homeSuffix[(depth + 1) * q2 + j]! + p.contributions[at + j]!;
  }

  const sums = new Float64Array((n + 1) * q2);
  sums.set(p.base);
  const choice = new Int32Array(n);
  const mags = new Float64Array(p.quantityCount);
  const leafSums = new Float64Array(q2);
  const childBound = new Float64Array((n + 1) * MAX_OPTIONS);
  const childExcess = new Float64Array((n + 1) * MAX_OPTIONS);
  const childExcessSum = new Float64Array((n + 1) * MAX_OPTIONS);
  const childOrder = new Int32Array((n + 1) * MAX_OPTIONS);

  let best = options.incumbent;
  let nodes = 0;
  let aborted = false;

  const consider = (leaf: Float64Array, leafAt: number, moves: number): void => {
    const m = magnitudesOf(leaf, mags, leafAt);
    const found = { excess: largestOverload(p, m), excessSum: overloadSum(p, m), score: p.score(m), moves };
    if (isBetter(found, best, tie)) best = { choice: Int32Array.from(choice), ...found };
  };

  /** Child a sorts before child b (slots in one node's list): the smaller key, the present option on equal keys. */
  const before = (a: number, b: number, aHome: boolean): boolean =>
    childExcess[a]! < childExcess[b]! ||
    (childExcess[a] === childExcess[b] && (childExcessSum[a]! < childExcessSum[b]! || (childExcessSum[a] === childExcessSum[b] && (childBound[a]! < childBound[b]! || (childBound[a] === childBound[b] && aHome)))));

  const visit = (depth: number, moves: number): void => {
    if (aborted) return;
    if (++nodes > nodeBudget) {
      aborted = true;
      return;
    }
    const at = depth * q2;
    if (depth === n) {
      consider(sums, at, moves);
      return;
    }
    if (moves === moveLimit && depth >= firstFree) {
      for (let t = depth; t < n; t++) choice[order[t]!] = p.home[order[t]!]!;
      for (let j = 0; j < q2; j++) leafSums[j] = sums[at + j]! + homeSuffix[at + j]!;
      consider(leafSums, 0, moves);
      return;
    }
    const i = order[depth]!;
    const home = p.home[i]!;
    const next = at + q2;
    const slot = depth * MAX_OPTIONS;
    let count = 0;
    for (let k = 0; k < p.optionCounts[i]!; k++) {
      const childMoves = moves + (k === home ? 0 : 1);
      if (childMoves > moveLimit) continue;
      const c = contributionOffset(p, i, k);
      for (let j = 0; j < q2; j++) sums[next + j] = sums[at + j]! + p.contributions[c + j]!;
      const lb = bounder.bounds(sums, next, depth + 1, mags, moveLimit - childMoves);
      // Insertion by the bound's key; on equal keys the present option goes first, so it wins ties.
      let pos = count++;
      const at2 = slot + pos;
      childExcess[at2] = largestOverload(p, lb);
      childExcessSum[at2] = overloadSum(p, lb);
      childBound[at2] = p.score(lb);
      childOrder[at2] = k;
      while (pos > 0 && before(slot + pos, slot + pos - 1, k === home)) {
        swap(slot + pos, slot + pos - 1);
        pos--;
      }
    }
    for (let t = 0; t < count; t++) {
      const k = childOrder[slot + t]!;
      const childMoves = moves + (k === home ? 0 : 1);
      const key = { excess: childExcess[slot + t]!, excessSum: childExcessSum[slot + t]!, score: childBound[slot + t]!, moves: childMoves };
      if (cannotBeat(key, best, tie)) continue;
      const c = contributionOffset(p, i, k);
      for (let j = 0; j < q2; j++) sums[next + j] = sums[at + j]! + p.contributions[c + j]!;
      choice[i] = k;
      visit(depth + 1, childMoves);
      if (aborted) return;
    }
  };

  const swap = (a: number, b: number): void => {
    [childExcess[a], childExcess[b]] = [childExcess[b]!, childExcess[a]!];
    [childExcessSum[a], childExcessSum[b]] = [childExcessSum[b]!, childExcessSum[a]!];
    [childBound[a], childBound[b]] = [childBound[b]!, childBound[a]!];
    [childOrder[a], childOrder[b]] = [childOrder[b]!, childOrder[a]!];
  };

  visit(0, 0);
  const result = { ...best, moves: countMoves(p, best.choice) };
  return { best: result, complete: !aborted, nodes };
}
