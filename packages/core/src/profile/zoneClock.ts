/**
 * Wall-clock times in an IANA time zone ⇄ UTC, for interval data.
 *
 * Offsets come from the platform's time-zone database (Intl). Asking Intl for
 * every row of a year of 1-minute data would dominate the read, so each UTC
 * day is looked up once: its offsets at start and end, and where they differ
 * the minute of the change (binary search). Zones change offset at most once
 * a day in practice.
 */

import { InputError, inputIssue } from '../errors.js';

const DAY_MS = 86_400_000;
const MINUTE_MS = 60_000;

interface DayOffsets {
  readonly start: number;
  readonly end: number;
  /** UTC ms from which `end` applies; Infinity when the day has one offset. */
  readonly change: number;
}

export interface ZoneClock {
  readonly zone: string;
  /** Offset of local time from UTC at a UTC instant, ms (local = utc + offset). */
  offsetAt(utcMs: number): number;
  /**
   * UTC instants at which the wall-clock time `localMs` (written as if it were UTC)
   * occurs: none in a spring-forward gap, two in an autumn repeat, else one.
   */
  instantsOf(localMs: number): readonly number[];
  /**
   * True when `utcMs` has offset `offset` and no offset change lies within a day either
   * side, so the wall-clock time utcMs + offset occurs once, at utcMs (the fast path for
   * rows that follow one another).
   */
  isUnambiguous(utcMs: number, offset: number): boolean;
}

/** True when the platform knows the zone name. */
export function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/**
 * @throws {InputError} at `timeZone` when the zone is not a name this platform's time-zone database
 *   knows (Intl would throw a bare RangeError from deep inside the read)
 */
export function createZoneClock(zone: string): ZoneClock {
  if (typeof zone !== 'string' || !isKnownTimeZone(zone))
    throw new InputError([inputIssue('unknown_time_zone', 'timeZone', 'an IANA time zone this system knows, such as Europe/Lisbon or America/Chicago (default UTC)', zone)], 'the options are not valid');
  if (zone === 'UTC') return { zone, offsetAt: () => 0, instantsOf: (l) => [l], isUnambiguous: (_u, o) => o === 0 };
  const format = new Intl.DateTimeFormat('en-US', {
    timeZone: zone,
    hourCycle: 'h23',
    year: 'numeric',
    month: 'numeric',
    day: 'numeric',
    hour: 'numeric',
    minute: 'numeric',
    second: 'numeric',
  });
  const exactOffset = (utcMs: number): number => {
    const parts: Record<string, number> = {};
    for (const p of format.formatToParts(utcMs)) if (p.type !== 'literal') parts[p.type] = Number(p.value);
    const local = Date.UTC(parts.year!, parts.month! - 1, parts.day!, parts.hour!, parts.minute!, parts.second!);
    return local - Math.floor(utcMs / 1000) * 1000;
  };
  const days = new Map<number, DayOffsets>();
  const dayOffsets = (day: number): DayOffsets => {
    let d = days.get(day);
    if (d) return d;
    const t0 = day * DAY_MS;
    const start = exactOffset(t0);
    const end = exactOffset(t0 + DAY_MS - MINUTE_MS);
    let change = Number.POSITIVE_INFINITY;
    if (start !== end) {
      let lo = 0; // minutes into the day with the start offset
      let hi = 1439; // minutes with the end offset
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if (exactOffset(t0 + mid * MINUTE_MS) === start) lo = mid;
        else hi = mid;
      }
      change = t0 + hi * MINUTE_MS;
    }
    d = { start, end, change };
    days.set(day, d);
    return d;
  };
  // Rows come in time order: remember the last day looked up.
  let lastDay = Number.NaN;
  let last: DayOffsets = { start: 0, end: 0, change: 0 };
  const offsetAt = (utcMs: number): number => {
    const day = Math.floor(utcMs / DAY_MS);
    if (day !== lastDay) {
      last = dayOffsets(day);
      lastDay = day;
    }
    return utcMs < last.change ? last.start : last.end;
  };
  let steadyDay = Number.NaN;
  let steadyOffset = 0;
  const steady = (day: number, offset: number) => {
    const d = dayOffsets(day);
    return d.start === offset && d.end === offset;
  };
  return {
    zone,
    offsetAt,
    isUnambiguous(utcMs, offset) {
      const day = Math.floor(utcMs / DAY_MS);
      if (day === steadyDay && offset === steadyOffset) return true;
      const ok = steady(day, offset) && steady(day - 1, offset) && steady(day + 1, offset);
      if (ok) [steadyDay, steadyOffset] = [day, offset];
      return ok;
    },
    instantsOf(localMs) {
      // Offsets well before and after bracket any change near this wall-clock time.
      const before = offsetAt(localMs - DAY_MS);
      const after = offsetAt(localMs + DAY_MS);
      const out: number[] = [];
      if (offsetAt(localMs - before) === before) out.push(localMs - before);
      if (after !== before && offsetAt(localMs - after) === after) out.push(localMs - after);
      return out.sort((a, b) => a - b);
    },
  };
}

/** Calendar date of a day count since 1970-01-01 (proleptic Gregorian; H. Hinnant's civil_from_days). */
export function civilFromDays(days: number): { year: number; month: number; day: number } {
  const z = days + 719468;
  const era = Math.floor(z / 146097);
  const doe = z - era * 146097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const month = mp < 10 ? mp + 3 : mp - 9;
  return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

/** Month key year·12 + (month − 1) of a local time written as ms. */
export function monthKeyOf(localMs: number): number {
  const { year, month } = civilFromDays(Math.floor(localMs / DAY_MS));
  return year * 12 + month - 1;
}

/** "2025-03" for a month key. */
export function monthLabel(key: number): string {
  return `${Math.floor(key / 12)}-${String((key % 12) + 1).padStart(2, '0')}`;
}
