/** Plain-text tables: columns padded to width, numbers right-aligned. */
import { REPORT_WIDTH } from './wrapText.js';

export interface Column {
  readonly header: string;
  readonly align?: 'left' | 'right';
}

export function renderTable(columns: readonly Column[], rows: readonly (readonly string[])[], indent = '  '): string {
  const widths = columns.map((c, k) => Math.max(c.header.length, ...rows.map((r) => (r[k] ?? '').length)));
  const line = (cells: readonly string[]) =>
    indent +
    cells
      .map((cell, k) => (columns[k]?.align === 'left' ? cell.padEnd(widths[k]!) : cell.padStart(widths[k]!)))
      .join('  ')
      .trimEnd();
  const rule = indent + widths.map((w) => '-'.repeat(w)).join('  ');
  return [line(columns.map((c) => c.header)), rule, ...rows.map(line)].join('\n');
}

/** Characters as a reader counts them (code points, so ∠ and · count once). */
export const textWidth = (text: string): number => [...text].length;

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

/** A heading line for a report section. */
export const section = (title: string): string => `\n${title}\n`;

