/** Plain-text tables: columns padded to width, numbers right-aligned. */
import { REPORT_WIDTH } from './wrapText.js';

export interface Column {
  readonly header: string;
  readonly align?: 'left' | 'right';
}

export function renderTable(columns: readonly Column[], rows: readonly (readonly string[])[], indent = '  '): string {
  // One native test over the whole table: Latin text pads by its length (the usual case, and the
  // cheap one for a 1,000-circuit report); anything wider or narrower is measured cell by cell.
  const narrow = NARROW_ONLY.test(columns.map((c) => c.header).join('') + rows.map((r) => r.join('')).join(''));
  const width = narrow ? (cell: string) => cell.length : textWidth;
  const widths = columns.map((c, k) => Math.max(width(c.header), ...rows.map((r) => width(r[k] ?? ''))));
  const pad = (cell: string, k: number) => ' '.repeat(Math.max(0, widths[k]! - width(cell)));
  const line = (cells: readonly string[]) =>
    indent +
    cells
      .map((cell, k) => (columns[k]?.align === 'left' ? cell + pad(cell, k) : pad(cell, k) + cell))
      .join('  ')
      .trimEnd();
  const rule = indent + widths.map((w) => '-'.repeat(w)).join('  ');
  return [line(columns.map((c) => c.header)), rule, ...rows.map(line)].join('\n');
}

/**
 * Terminal columns one character takes: none for a combining mark or a zero-width joiner/selector, two
 * for East Asian wide and fullwidth forms and the common emoji blocks (Unicode UAX #11's W and F
 * ranges, in the blocks that matter for names), one otherwise. Written here rather than taken from a
 * package (string-width): a few ranges, and no module to load before every command's first line.
 */
function charWidth(cp: number): number {
  if ((cp >= 0x300 && cp <= 0x36f) || (cp >= 0x200b && cp <= 0x200f) || (cp >= 0xfe00 && cp <= 0xfe0f)) return 0;
  if (
    (cp >= 0x1100 && cp <= 0x115f) ||
    (cp >= 0x2e80 && cp <= 0x303e) ||
    (cp >= 0x3041 && cp <= 0xa4cf) ||
    (cp >= 0xac00 && cp <= 0xd7a3) ||
    (cp >= 0xf900 && cp <= 0xfaff) ||
    (cp >= 0xfe30 && cp <= 0xfe4f) ||
    (cp >= 0xff00 && cp <= 0xff60) ||
    (cp >= 0xffe0 && cp <= 0xffe6) ||
    (cp >= 0x1f300 && cp <= 0x1f64f) ||
    (cp >= 0x1f900 && cp <= 0x1f9ff) ||
    (cp >= 0x20000 && cp <= 0x3fffd)
  )
    return 2;
  return 1;
}

/** Text of characters below the combining marks, one column each (every ASCII and Latin-1 figure and name). */
const NARROW_ONLY = /^[\u0000-\u02ff]*$/;

/** Columns a text takes on a terminal (∠ and · count once, 電 twice, a combining accent not at all). */
export function textWidth(text: string): number {
  // Nearly every cell is Latin text and figures: one native test instead of a loop per character (a
  // 1,000-circuit report measures some 20,000 cells, in code that runs once).
  if (NARROW_ONLY.test(text)) return text.length;
  let width = 0;
  for (const ch of text) width += charWidth(ch.codePointAt(0)!);
  return width;
}

/**
 * `renderTable`, fitted to `width`: when it is wider, a cell of the text column
 * `shrink` longer than the room left (never less than `MIN_ROOM`) moves to a line
 * of its own above its row, whole — names are the user's own and stay exact.
 */
export function renderTableWithin(columns: readonly Column[], rows: readonly (readonly string[])[], shrink = 0, width = REPORT_WIDTH): string {
  const table = renderTable(columns, rows);
  const widest = Math.max(...table.split('\n').map(textWidth));
  if (widest <= width) return table;
  const longest = Math.max(...rows.map((r) => textWidth(r[shrink] ?? '')));
  const room = Math.max(MIN_ROOM, longest - (widest - width));
  const tooLong = (r: readonly string[]) => textWidth(r[shrink] ?? '') > room;
  const [head, rule, ...body] = renderTable(columns, rows.map((r) => (tooLong(r) ? r.map((cell, k) => (k === shrink ? '' : cell)) : r))).split('\n');
  const out = [head!, rule!];
  body.forEach((line, k) => {
    if (tooLong(rows[k]!)) out.push(...ownLines(rows[k]![shrink]!, width));
    out.push(line);
  });
  return out.join('\n');
}

/** A long cell on lines of its own, indented like the table, cut only where it is wider than a line. */
function ownLines(text: string, width: number): string[] {
  const chars = [...text];
  const lines: string[] = [];
  for (let k = 0; k < chars.length; k += width - 2) lines.push(`  ${chars.slice(k, k + width - 2).join('')}`);
  return lines;
}

/** Narrowest the text column is squeezed to before long cells move to their own lines. */
const MIN_ROOM = 12;

/** Fixed decimals, with "-0.0" shown as "0.0". */
export function fixed(x: number, digits: number): string {
  const s = x.toFixed(digits);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/**
 * A whole number grouped in thousands ("145,800"), with a rounded "-0" shown as "0". Round-off is cleared
 * first (12 significant digits), so a sum that came to 7.499999999999998 for 7.5 rounds as 7.5 does.
 */
export function thousands(x: number): string {
  const cleared = Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(12)) : x;
  return (Math.round(cleared) || 0).toLocaleString('en-US');
}

/** A heading line for a report section. */
export const section = (title: string): string => `\n${title}\n`;

