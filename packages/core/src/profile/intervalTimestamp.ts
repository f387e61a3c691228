/**
 * Reads interval timestamps: ISO 8601 date and time, `T` or a space between,
 * seconds optional, then `Z`, a `±HH:MM` offset, or nothing (wall-clock time
 * in the chosen zone). Hand-written rather than Date.parse: Date.parse reads an
 * offset-less date-time as local time of the machine running it, and accepts
 * forms (month names, two-digit years) that would hide a wrong column.
 */

export type ParsedTimestamp =
  | { readonly ok: true; /** ms as if the wall-clock time were UTC */ readonly wallMs: number; /** offset written in the text, ms, or null */ readonly offsetMs: number | null }
  | { readonly ok: false; /** a well-formed time in a year before EARLIEST_YEAR */ readonly tooEarly?: true };

/**
 * The first year interval data may be in. Metered interval data is much younger; a year like 0050 is a
 * typing slip or a wrong column, and would be misread besides (Date.UTC takes years 0–99 as 1900–1999),
 * while before about 1900 the zone database has only local mean times. Common practice, no source.
 */
export const EARLIEST_YEAR = 1900;

const digits = (s: string, from: number, count: number): number => {
  let v = 0;
  for (let i = from; i < from + count; i++) {
    const c = s.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return -1;
    v = v * 10 + c;
  }
  return v;
};

const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

export const TIMESTAMP_EXPECTED = 'a date and time like 2025-03-30 02:15, 2025-03-30T02:15:00Z or 2025-03-30T02:15:00+02:00';
export const EARLY_YEAR_EXPECTED = `a date and time in ${EARLIEST_YEAR} or later (an earlier year is a slip or the wrong column)`;

export function parseTimestamp(text: string): ParsedTimestamp {
  const s = text.trim();
  if (s.length < 16 || s[4] !== '-' || s[7] !== '-' || (s[10] !== 'T' && s[10] !== ' ') || s[13] !== ':') return { ok: false };
  const year = digits(s, 0, 4);
  const month = digits(s, 5, 2);
  const day = digits(s, 8, 2);
  const hour = digits(s, 11, 2);
  const minute = digits(s, 14, 2);
  if (year < 0 || month < 1 || month > 12 || day < 1 || hour < 0 || hour > 23 || minute < 0 || minute > 59) return { ok: false };
  if (year < EARLIEST_YEAR) return { ok: false, tooEarly: true };
  if (day > DAYS_IN_MONTH[month - 1]! || (month === 2 && day === 29 && !(year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0)))) return { ok: false };
  let i = 16;
  let ms = 0;
  if (s[i] === ':') {
    const sec = digits(s, i + 1, 2);
    if (sec < 0 || sec > 59) return { ok: false };
    ms = sec * 1000;
    i += 3;
    if (s[i] === '.') {
      let j = i + 1;
      let frac = 0;
      let scale = 100;
      while (j < s.length && s.charCodeAt(j) >= 48 && s.charCodeAt(j) <= 57) {
        frac += (s.charCodeAt(j) - 48) * scale;
        scale /= 10;
        j++;
      }
      if (j === i + 1) return { ok: false };
      ms += Math.round(frac);
      i = j;
    }
  }
  let offsetMs: number | null = null;
  if (i < s.length) {
    if (s[i] === 'Z' && i + 1 === s.length) offsetMs = 0;
    else if ((s[i] === '+' || s[i] === '-') && s.length === i + 6 && s[i + 3] === ':') {
      const oh = digits(s, i + 1, 2);
      const om = digits(s, i + 4, 2);
      if (oh < 0 || oh > 14 || om < 0 || om > 59) return { ok: false };
      offsetMs = (s[i] === '-' ? -1 : 1) * (oh * 60 + om) * 60_000;
    } else return { ok: false };
  }
  return { ok: true, wallMs: Date.UTC(year, month - 1, day, hour, minute) + ms, offsetMs };
}
