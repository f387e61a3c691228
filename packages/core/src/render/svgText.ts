/**
 * Small helpers for writing SVG and HTML as text: escaping and number
 * formatting that gives the same characters on every run and platform.
 */
import { argumentIssueError } from '../_internal/argumentChecks.js';

/**
 * Control characters XML 1.0 forbids (and that a terminal would act on) are shown as escapes (\u{1B});
 * tab and newline become spaces, so a name never breaks a label or a table cell.
 */
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/** Control characters shown as visible escapes; tab and line breaks as spaces. */
export const visibleControls = (text: string): string =>
  text.replace(CONTROL, (c) => (c === '\t' || c === '\n' || c === '\r' ? ' ' : `\\u{${c.codePointAt(0)!.toString(16).toUpperCase()}}`));

/** Escapes text for an XML/HTML text node or a double-quoted attribute. */
export function escapeXml(text: string): string {
  return visibleControls(text).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A coordinate with two decimals, no trailing zeros, never "-0". */
export function coord(x: number): string {
  const s = (Math.round(x * 100) / 100).toFixed(2).replace(/\.?0+$/, '');
  return s === '-0' ? '0' : s;
}

/** Fixed decimals, with "-0.0" shown as "0.0". */
export function fixed(x: number, digits: number): string {
  const s = x.toFixed(digits);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/** A magnitude with three significant figures at most (228, 90.4, 7.34, 0.312). */
export function sig3(x: number): string {
  const a = Math.abs(x);
  if (a >= 100) return fixed(x, 0);
  if (a >= 10) return fixed(x, 1);
  if (a >= 1) return fixed(x, 2);
  return fixed(x, 3);
}

/** A drawing's heading (null: none drawn) and the text of its <title> element. */
export interface DrawingTitle {
  readonly heading: string | null;
  readonly title: string;
}

/**
 * The heading a caller gives a drawing, the default where it gives none, and the <title> it makes with the
 * thing drawn: "heading: subject". An empty or blank heading means none: no heading line, and the <title> is
 * the subject alone (or the default words, for a drawing with no subject), never ": subject".
 * @throws {InputError} naming `argument` for a heading that is not text
 */
export function drawingTitle(given: unknown, fallback: string, subject: string | null, argument = 'options.title'): DrawingTitle {
  if (given === undefined) return { heading: fallback, title: subject === null ? fallback : `${fallback}: ${subject}` };
  if (typeof given !== 'string') throw argumentIssueError(argument, "the drawing's heading as text ('' for no heading), or nothing for the default", given);
  if (given.trim() === '') return { heading: null, title: subject ?? fallback };
  return { heading: given, title: subject === null ? given : `${given}: ${subject}` };
}

/** Attribute list from an object, keys in the given order, values escaped. */
export function attrs(values: Readonly<Record<string, string | number>>): string {
  return Object.entries(values)
    .map(([k, v]) => ` ${k}="${escapeXml(typeof v === 'number' ? coord(v) : v)}"`)
    .join('');
}
