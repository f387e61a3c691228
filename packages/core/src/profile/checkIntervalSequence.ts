/**
 * Time order, interval length, duplicates and gaps of interval data. Gaps are
 * reported and left as gaps unless the caller asks for a fill, and the report
 * says which fill was used and how many intervals it made.
 */
import { InputError, inputIssue } from '../errors.js';
import type { RawIntervals } from './readIntervalRows.js';
import { argumentIssueError, checkListArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

export const GAP_FILLS = ['none', 'hold', 'linear'] as const;
/** none: leave gaps out of every figure; hold: repeat the last reading; linear: interpolate between the readings either side. */
export type GapFill = (typeof GAP_FILLS)[number];

export interface GapReading {
  /** UTC ms of the last reading before the gap and the first after it. */
  readonly afterUtcMs: number;
  readonly beforeUtcMs: number;
  readonly missingIntervals: number;
}

export interface SequenceReport {
  readonly rowsRead: number;
  readonly intervalSeconds: number;
  readonly duplicates: { readonly count: number; /** file rows of the first few dropped duplicates */ readonly rows: readonly number[] };
  readonly gaps: { readonly count: number; readonly missingIntervals: number; readonly missingHours: number; /** the longest few */ readonly longest: readonly GapReading[] };
  /** Steps that are not a whole number of intervals (irregular logging). */
  readonly irregularSteps: number;
  readonly ambiguousTimes: number;
  readonly fill: GapFill;
  readonly filledIntervals: number;
}

export interface IntervalTable {
  readonly count: number;
  readonly utcMs: Float64Array;
  readonly values: readonly Float64Array[];
  readonly intervalMs: number;
  /** 1 where the interval was made by the gap fill. */
  readonly filled: Uint8Array;
  /**
   * Where some rows are not a whole number of intervals apart: the hours each row stands for, the time up
   * to the next row less any whole intervals counted missing there (at most about 1.5 intervals; the last
   * row one interval). Energy, hours and demand weigh each row by it. Null where every step is a whole
   * number of intervals: every row one interval.
   */
  readonly rowHours: Float64Array | null;
  readonly report: SequenceReport;
}

/** Joins row chunks read in parallel, in order. */
export function concatRawIntervals(parts: readonly RawIntervals[]): RawIntervals {
  checkListArgument(parts, 'parts', 'a non-empty list of raw intervals as a row reader gives them', (x) => typeof x === 'object' && x !== null);
  if (parts.length === 0) throw argumentIssueError('parts', 'a non-empty list of raw intervals as a row reader gives them', parts);
  if (parts.length === 1) return parts[0]!;
  const count = parts.reduce((s, p) => s + p.count, 0);
  const join = <T extends Float64Array | Int32Array>(pick: (p: RawIntervals) => T, make: (n: number) => T): T => {
    const out = make(count);
    let at = 0;
    for (const p of parts) {
      out.set(pick(p), at);
      at += p.count;
    }
    return out;
  };
  return {
    count,
    utcMs: join((p) => p.utcMs, (n) => new Float64Array(n)),
    rows: join((p) => p.rows, (n) => new Int32Array(n)),
    values: parts[0]!.values.map((_, c) => join((p) => p.values[c]!, (n) => new Float64Array(n))),
    ambiguousTimes: parts.reduce((s, p) => s + p.ambiguousTimes, 0),
  };
}

/** The most common positive step between rows, ms. */
function typicalStep(utc: Float64Array): number {
  const counts = new Map<number, number>();
  for (let i = 1; i < utc.length; i++) {
    const d = utc[i]! - utc[i - 1]!;
    if (d > 0) counts.set(d, (counts.get(d) ?? 0) + 1);
  }
  let best = 0;
  let bestCount = 0;
  for (const [d, n] of counts) if (n > bestCount || (n === bestCount && d < best)) [best, bestCount] = [d, n];
  return best;
}

/**
 * The hours each row stands for (IntervalTable.rowHours): a meter or logger writes the reading for the time
 * from its stamp to the next, so a row 7 min before the next stands for 7 min, not a whole interval; a step
 * long enough to hold missing intervals (the same rounding as the gap count) stands for what is left after
 * them, so rows and gaps together cover the record's span once.
 */
function rowHoursOf(utc: Float64Array, step: number): Float64Array {
  const hours = new Float64Array(utc.length);
  for (let i = 0; i < utc.length; i++) {
    const d = i + 1 < utc.length ? utc[i + 1]! - utc[i]! : step;
    const missing = Math.max(0, Math.round(d / step) - 1);
    hours[i] = (d - missing * step) / 3_600_000;
  }
  return hours;
}

/**
 * @throws {InputError} for rows out of time order or an interval outside 1 s – 1 h.
 */
export function checkIntervalSequence(raw: RawIntervals, fill: GapFill = 'none'): IntervalTable {
  checkObjectArgument(raw, 'raw', 'raw intervals as a row reader gives them (createRowReader(...))', ['count', 'utcMs', 'rows', 'values']);
  const { utcMs: utc, rows } = raw;
  const backwards: number[] = [];
  for (let i = 1; i < raw.count && backwards.length < 10; i++) if (utc[i]! < utc[i - 1]!) backwards.push(i);
  if (backwards.length)
    throw new InputError(
      backwards.map((i) =>
        inputIssue('out_of_order', `row ${rows[i]}, column 1`, `a time after the row before (row ${rows[i - 1]}); sort the file by time (local times that repeat when clocks go back need their time zone)`, new Date(utc[i]!).toISOString()),
      ),
      'the interval data is not in time order',
    );
  const step = raw.count > 1 ? typicalStep(utc) : 3_600_000;
  if (!(step >= 1000 && step <= 3_600_000))
    throw new InputError([inputIssue('bad_interval', 'column 1', 'intervals from 1 s to 1 h', `${step / 1000} s between most rows`)], 'the interval data cannot be used');

  // Keep the first of equal times; find gaps.
  const keep = new Uint8Array(raw.count);
  const duplicateRows: number[] = [];
  let duplicates = 0;
  let irregularSteps = 0;
  const gaps: GapReading[] = [];
  let missing = 0;
  keep[0] = 1;
  let last = 0;
  for (let i = 1; i < raw.count; i++) {
    const d = utc[i]! - utc[last]!;
    if (d === 0) {
      duplicates++;
      if (duplicateRows.length < 10) duplicateRows.push(rows[i]!);
      continue;
    }
    keep[i] = 1;
    const steps = d / step;
    if (Math.abs(steps - Math.round(steps)) > 1e-6) irregularSteps++;
    const lost = Math.round(steps) - 1;
    if (lost >= 1) {
      gaps.push({ afterUtcMs: utc[last]!, beforeUtcMs: utc[i]!, missingIntervals: lost });
      missing += lost;
    }
    last = i;
  }
  const kept = raw.count - duplicates;
  const made = fill === 'none' ? 0 : missing;
  const total = kept + made;
  const outUtc = new Float64Array(total);
  const outValues = raw.values.map(() => new Float64Array(total));
  const filled = new Uint8Array(total);
  let o = 0;
  let prev = -1;
  for (let i = 0; i < raw.count; i++) {
    if (!keep[i]) continue;
    if (prev >= 0 && made > 0) {
      const lost = Math.round((utc[i]! - utc[prev]!) / step) - 1;
      for (let k = 1; k <= lost; k++) {
        outUtc[o] = utc[prev]! + k * step;
        const f = k / (lost + 1);
        raw.values.forEach((v, c) => {
          outValues[c]![o] = fill === 'hold' ? v[prev]! : v[prev]! + (v[i]! - v[prev]!) * f;
        });
        filled[o] = 1;
        o++;
      }
    }
    outUtc[o] = utc[i]!;
    raw.values.forEach((v, c) => {
      outValues[c]![o] = v[i]!;
    });
    o++;
    prev = i;
  }
  return {
    count: total,
    utcMs: outUtc,
    values: outValues,
    intervalMs: step,
    filled,
    rowHours: irregularSteps ? rowHoursOf(outUtc, step) : null,
    report: {
      rowsRead: raw.count,
      intervalSeconds: step / 1000,
      duplicates: { count: duplicates, rows: duplicateRows },
      gaps: {
        count: gaps.length,
        missingIntervals: missing,
        missingHours: (missing * step) / 3_600_000,
        longest: [...gaps].sort((a, b) => b.missingIntervals - a.missingIntervals).slice(0, 5),
      },
      irregularSteps,
      ambiguousTimes: raw.ambiguousTimes,
      fill,
      filledIntervals: made,
    },
  };
}
