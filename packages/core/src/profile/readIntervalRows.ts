/**
 * Interval-data rows → typed columns, one record at a time (the CLI streams
 * records from its CSV parser into `push`). Every bad cell is reported with its
 * row and column; reading stops after MAX_ISSUES of them.
 */
import { InputError, inputIssue, type InputIssue, quoteText } from '../errors.js';
import type { ColumnPlan } from './columnPlan.js';
import { EARLY_YEAR_EXPECTED, parseTimestamp, TIMESTAMP_EXPECTED } from './intervalTimestamp.js';
import { createZoneClock, type ZoneClock } from './zoneClock.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

const MAX_ISSUES = 20;

/** Rows as read, in file order, before order, gaps and duplicates are checked. */
export interface RawIntervals {
  readonly count: number;
  /** UTC instant of each row, ms. */
  readonly utcMs: Float64Array;
  /** File row of each record (the header is row 1). */
  readonly rows: Int32Array;
  /** One column per data header. */
  readonly values: readonly Float64Array[];
  /** Wall-clock times that occur twice (clocks going back) and were placed by row order. */
  readonly ambiguousTimes: number;
}

export interface RowReader {
  /** Reads one record; `row` is its row in the file (header = 1). */
  push(record: readonly string[], row: number): void;
  /** @throws {InputError} with every bad cell found (row and column). */
  finish(): RawIntervals;
}

export interface RowReaderOptions {
  /** IANA zone for times written without an offset. @defaultValue 'UTC' */
  readonly timeZone?: string;
  /** Expected row count, to size the columns once. */
  readonly expectedRows?: number;
}

const cellPath = (plan: ColumnPlan, row: number, column: number) =>
  `row ${row}, column ${column + 1} (${quoteText(column === 0 ? plan.timeHeader : (plan.dataHeaders[column - 1] ?? ''))})`;

function fail(issues: InputIssue[]): never {
  throw new InputError(issues, 'the interval data cannot be read');
}

/** The quantity of a data header ("oven [kW]" → "kW"). */
const quantityOf = (header: string) => /\[\s*([A-Za-z]+)\s*\]$/.exec(header)?.[1] ?? '';

/**
 * Largest magnitude a cell of each quantity may hold: ten times a board file's largest load (a column
 * may drive a group or a whole phase), a multiplier of the loads' ratings up to 1,000. They only keep
 * out figures (1e308 kW) that would end in overflow far from the cell that caused it.
 */
const LARGEST: Readonly<Record<string, number>> = { kW: 1e6, kvar: 1e6, kVA: 1e6, A: 1e6, x: 1000 };

/**
 * A cell's number as people and meters write it: decimal, optional sign, fraction and exponent, spaces
 * about it. Number() alone would also read 0x10, 0b11 and 0o7 (as 16, 3 and 7), "Infinity", and an
 * empty cell as 0.
 */
const DECIMAL = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;

/** Range a quantity's value must fall in, and how to say it. */
function checkValue(q: string, x: number): string | null {
  if (q === 'pf' && !(x !== 0 && Math.abs(x) <= 1)) return 'a power factor with 0 < |pf| <= 1 (negative = leading)';
  if ((q === 'A' || q === 'x') && x < 0) return `a number >= 0 for [${q}]`;
  const largest = LARGEST[q];
  if (largest !== undefined && Math.abs(x) > largest) return `a number of at most ${largest.toLocaleString('en-US')} in size for [${q}]`;
  return null;
}

export function createRowReader(plan: ColumnPlan, options: RowReaderOptions = {}): RowReader {
  checkObjectArgument(plan, 'plan', 'a column plan from planColumns(...)', ['board', 'dataHeaders', 'targets']);
  const width = plan.dataHeaders.length + 1;
  const quantities = plan.dataHeaders.map(quantityOf);
  const clock: ZoneClock = createZoneClock(options.timeZone ?? 'UTC');
  let capacity = Math.max(1024, options.expectedRows ?? 0);
  let utcMs = new Float64Array(capacity);
  let rows = new Int32Array(capacity);
  let values = plan.dataHeaders.map(() => new Float64Array(capacity));
  let count = 0;
  let ambiguousTimes = 0;
  /** Offset of the last offset-less time read: the next one almost always has it too. */
  let lastOffset = 0;
  const issues: InputIssue[] = [];
  const report = (issue: InputIssue) => {
    issues.push(issue);
    if (issues.length >= MAX_ISSUES) fail([...issues, inputIssue('too_many', 'file', 'fewer problems', `more than ${MAX_ISSUES}; reading stopped`)]);
  };
  const grow = () => {
    capacity *= 2;
    const u = new Float64Array(capacity);
    u.set(utcMs);
    utcMs = u;
    const r = new Int32Array(capacity);
    r.set(rows);
    rows = r;
    values = values.map((v) => {
      const w = new Float64Array(capacity);
      w.set(v);
      return w;
    });
  };
  return {
    push(record, row) {
      if (record.length !== width) {
        report(inputIssue('bad_row', `row ${row}`, `${width} fields like the header`, `${record.length} fields`));
        return;
      }
      const t = parseTimestamp(record[0]!);
      if (!t.ok) {
        report(inputIssue('bad_time', cellPath(plan, row, 0), t.tooEarly ? EARLY_YEAR_EXPECTED : TIMESTAMP_EXPECTED, record[0]));
        return;
      }
      let instant: number;
      if (t.offsetMs !== null) instant = t.wallMs - t.offsetMs;
      else if (clock.isUnambiguous(t.wallMs - lastOffset, lastOffset)) instant = t.wallMs - lastOffset;
      else {
        const candidates = clock.instantsOf(t.wallMs);
        if (candidates.length === 0) {
          report(
            inputIssue('nonexistent_time', cellPath(plan, row, 0), `a time that exists in ${clock.zone} (clocks go forward over this one; write the offset, or check the logger's clock)`, record[0]),
          );
          return;
        }
        instant = candidates[0]!;
        if (candidates.length > 1) {
          ambiguousTimes++;
          // The hour that repeats when clocks go back: the first pass is the earlier instant.
          const previous = count > 0 ? utcMs[count - 1]! : Number.NEGATIVE_INFINITY;
          instant = candidates.find((c) => c > previous) ?? candidates[0]!;
        }
      }
      lastOffset = t.offsetMs === null ? t.wallMs - instant : lastOffset;
      if (count === capacity) grow();
      let ok = true;
      for (let c = 1; c < width; c++) {
        const text = record[c]!;
        const x = DECIMAL.test(text) ? Number(text) : Number.NaN;
        const bad = Number.isFinite(x) ? checkValue(quantities[c - 1]!, x) : 'a number written in decimal, such as 1.25, -0.4 or 2e3 (an empty cell is not read as zero: leave the row out to make a gap)';
        if (bad) {
          report(inputIssue('bad_value', cellPath(plan, row, c), bad, text));
          ok = false;
          continue;
        }
        values[c - 1]![count] = x;
      }
      if (!ok) return;
      utcMs[count] = instant;
      rows[count] = row;
      count++;
    },
    finish() {
      if (issues.length) fail(issues);
      if (count === 0) fail([inputIssue('missing', 'file', 'at least one data row after the header')]);
      return { count, utcMs: utcMs.subarray(0, count), rows: rows.subarray(0, count), values: values.map((v) => v.subarray(0, count)), ambiguousTimes };
    },
  };
}
