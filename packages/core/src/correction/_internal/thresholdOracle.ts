/**
 * Answers a bisection's questions "is t below the threshold?" for a predicate that holds on one
 * side of a threshold t* only (every bisection assumes this), solving the board only where the
 * answer is in doubt. A few Illinois (regula falsi) steps on a continuous margin first bracket t*
 * closely; a question further than the doubt width below a solved point on the low side, or above
 * one on the high side, is then answered without a solve. Every other question is solved, so a
 * bisection asking them ends where it ends when it solves every midpoint — the same figures to the
 * last bit — in a fraction of the solves.
 */

/** One solved trial: which side of the threshold it is on, and a margin (> 0 on the low side, < 0 on the high side) to interpolate on. */
export interface SideReading {
  readonly low: boolean;
  readonly margin: number;
}

/** The doubt width is at least this fraction of t. */
const RELATIVE_DOUBT = 1e-11;
/** Illinois steps at most; where they do not bracket t* tightly the questions are simply solved. */
const MAX_NARROWING_STEPS = 40;

export interface ThresholdOracle {
  /** True when t is on the low side (solved, or answered from a solved point well beyond it). */
  isLow(t: number): boolean;
  /** A reading already known (e.g. from another sizing step) at t. */
  record(t: number, reading: SideReading): void;
  /** Illinois steps between the closest solved points on either side, until they are within the doubt width. */
  narrow(): void;
}

/**
 * @param doubt how far (in units of t) either side of t* round-off in `solve` may flip its answer;
 *   answers are inferred only from solved points further away than this
 */
export function createThresholdOracle(solve: (t: number) => SideReading, doubt: number): ThresholdOracle {
  const gapAt = (t: number) => Math.max(doubt, RELATIVE_DOUBT * Math.abs(t));
  const known = new Map<number, SideReading>();
  // The highest solved point on the low side and the lowest on the high side, with their margins.
  let lo = -Infinity;
  let loMargin = NaN;
  let hi = Infinity;
  let hiMargin = NaN;
  const record = (t: number, reading: SideReading) => {
    known.set(t, reading);
    if (reading.low && t > lo) [lo, loMargin] = [t, reading.margin];
    if (!reading.low && t < hi) [hi, hiMargin] = [t, reading.margin];
  };
  const solved = (t: number): SideReading => {
    const seen = known.get(t);
    if (seen) return seen;
    const reading = solve(t);
    record(t, reading);
    return reading;
  };
  return {
    record,
    isLow(t) {
      const gap = gapAt(t);
      if (t <= lo - gap && t < lo) return true;
      if (t >= hi + gap && t > hi) return false;
      return solved(t).low;
    },
    narrow() {
      let fLo = loMargin;
      let fHi = hiMargin;
      let kept = 0;
      for (let step = 0; step < MAX_NARROWING_STEPS && Number.isFinite(lo) && Number.isFinite(hi) && hi - lo > gapAt(hi); step++) {
        let t = lo - (fLo * (hi - lo)) / (fHi - fLo);
        if (!Number.isFinite(t)) t = lo + (hi - lo) / 2;
        // Kept a quarter of the goal width inside the ends: once one end is that close to t*, the step crosses it.
        const edge = gapAt(hi) / 4;
        t = Math.min(Math.max(t, lo + edge), hi - edge);
        const reading = solved(t);
        // Illinois: an end kept twice in a row has its margin halved, so both ends close in.
        if (reading.low) {
          fLo = reading.margin;
          if (kept === 1) fHi /= 2;
          kept = 1;
        } else {
          fHi = reading.margin;
          if (kept === -1) fLo /= 2;
          kept = -1;
        }
      }
    },
  };
}
