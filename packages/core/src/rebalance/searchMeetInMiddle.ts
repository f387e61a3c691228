/**
 * Fine placing for scores that read a single complex quantity (the neutral
 * current alone, or the current unbalance alone, in one load condition): free
 * up to 16 circuits, list every placing of each half (3^8 = 6561 sums), and
 * pair each sum of one half with the sum of the other that brings the quantity
 * nearest to zero — the exact best of 3^16 placings from two sorted lists
 * (meet in the middle). A well-spread board can cancel its neutral current to
 * milliamps this way, where one- and two-circuit moves stall near a tenth of
 * an amp.
 */
import { contributionOffset, isBetter, largestOverload, magnitudesOf, overloadSum, type AssignmentProblem, type ScoredChoice } from './assignmentProblem.js';
import { seededRandom } from './seededRandom.js';

export interface MeetInMiddleOptions {
  /** The one quantity the score reads. */
  readonly quantity: number;
  readonly moveLimit: number;
  readonly rounds: number;
  /** Circuits freed per round (split into two halves). */
  readonly size: number;
  readonly seed: number;
  readonly tie: number;
}

interface HalfList {
  readonly re: Float64Array;
  readonly im: Float64Array;
  readonly moves: Int32Array;
  /** Placing of the half's circuits, `count` entries per row. */
  readonly options: Int32Array;
}

/** Every placing of `circuits`: the quantity's sum and the moves it costs. */
function enumerateHalf(p: AssignmentProblem, circuits: readonly number[], quantity: number): HalfList {
  let total = 1;
  for (const i of circuits) total *= p.optionCounts[i]!;
  const re = new Float64Array(total);
  const im = new Float64Array(total);
  const moves = new Int32Array(total);
  const options = new Int32Array(total * circuits.length);
  const digits = new Int32Array(circuits.length);
  for (let row = 0; row < total; row++) {
    let r = 0;
    let m = 0;
    let x = 0;
    circuits.forEach((i, t) => {
      const k = digits[t]!;
      const at = contributionOffset(p, i, k) + 2 * quantity;
      r += p.contributions[at]!;
      x += p.contributions[at + 1]!;
      if (k !== p.home[i]) m++;
      options[row * circuits.length + t] = k;
    });
    re[row] = r;
    im[row] = x;
    moves[row] = m;
    // Next placing (mixed-radix counter).
    for (let t = 0; t < circuits.length; t++) {
      if (++digits[t]! < p.optionCounts[circuits[t]!]!) break;
      digits[t] = 0;
    }
  }
  return { re, im, moves, options };
}

export function searchMeetInMiddle(p: AssignmentProblem, start: ScoredChoice, o: MeetInMiddleOptions): ScoredChoice {
  const random = seededRandom(o.seed);
  const movable = [...Array(p.circuitCount).keys()].filter((i) => p.optionCounts[i]! > 1);
  const size = Math.min(o.size, movable.length);
  if (size < 2) return start;
  const q2 = 2 * p.quantityCount;
  const mags = new Float64Array(p.quantityCount);
  const sums = new Float64Array(q2);
  let best = start;
  for (let round = 0; round < o.rounds; round++) {
    const pool = movable.slice();
    for (let t = 0; t < size; t++) {
      const r = t + Math.floor(random() * (pool.length - t));
      [pool[t], pool[r]] = [pool[r]!, pool[t]!];
    }
    const free = pool.slice(0, size);
    const left = free.slice(0, size >> 1);
    const right = free.slice(size >> 1);
    // The quantity with the free circuits taken out, and the moves of the others.
    let fixedRe = p.base[2 * o.quantity]!;
    let fixedIm = p.base[2 * o.quantity + 1]!;
    let fixedMoves = 0;
    const isFree = new Set(free);
    for (let i = 0; i < p.circuitCount; i++) {
      if (isFree.has(i)) continue;
      const at = contributionOffset(p, i, best.choice[i]!) + 2 * o.quantity;
      fixedRe += p.contributions[at]!;
      fixedIm += p.contributions[at + 1]!;
      if (best.choice[i] !== p.home[i]) fixedMoves++;
    }
    const budget = o.moveLimit - fixedMoves;
    if (budget < 0) continue;
    const a = enumerateHalf(p, left, o.quantity);
    const b = enumerateHalf(p, right, o.quantity);
    // The right half sorted by its real part, for a nearest-point scan.
    const order = Int32Array.from(b.re.keys()).sort((x, y) => b.re[x]! - b.re[y]!);
    const sortedRe = Float64Array.from(order, (k) => b.re[k]!);
    let bestDistance = Infinity;
    let bestA = -1;
    let bestB = -1;
    for (let s = 0; s < a.re.length; s++) {
      if (a.moves[s]! > budget) continue;
      const tRe = -(fixedRe + a.re[s]!);
      const tIm = -(fixedIm + a.im[s]!);
      // Binary search for the target's real part, then scan outwards while the real gap can still win.
      let lo = 0;
      let hi = sortedRe.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (sortedRe[mid]! < tRe) lo = mid + 1;
        else hi = mid;
      }
      for (let dir = -1; dir <= 1; dir += 2) {
        for (let k = dir < 0 ? lo - 1 : lo; k >= 0 && k < sortedRe.length; k += dir) {
          const dRe = sortedRe[k]! - tRe;
          if (dRe * dRe >= bestDistance) break;
          const t = order[k]!;
          if (a.moves[s]! + b.moves[t]! > budget) continue;
          const dIm = b.im[t]! - tIm;
          const d = dRe * dRe + dIm * dIm;
          if (d < bestDistance) {
            bestDistance = d;
            bestA = s;
            bestB = t;
          }
        }
      }
    }
    if (bestA < 0) continue;
    const choice = Int32Array.from(best.choice);
    left.forEach((i, t) => (choice[i] = a.options[bestA * left.length + t]!));
    right.forEach((i, t) => (choice[i] = b.options[bestB * right.length + t]!));
    sums.set(p.base);
    let moves = 0;
    for (let i = 0; i < p.circuitCount; i++) {
      const at = contributionOffset(p, i, choice[i]!);
      for (let j = 0; j < q2; j++) sums[j]! += p.contributions[at + j]!;
      if (choice[i] !== p.home[i]) moves++;
    }
    magnitudesOf(sums, mags);
    const candidate = { choice, score: p.score(mags), excess: largestOverload(p, mags), excessSum: overloadSum(p, mags), moves };
    if (isBetter(candidate, best, o.tie)) best = candidate;
  }
  return best;
}
