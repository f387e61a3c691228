/** Plain-text tables: columns padded to width, numbers right-aligned. */

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

/** Fixed decimals, with "-0.0" shown as "0.0". */
export function fixed(x: number, digits: number): string {
  const s = x.toFixed(digits);
  return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
}

/** A heading line for a report section. */
export const section = (title: string): string => `\n${title}\n`;

/** Widest line a text report may have, in characters. */
export const REPORT_WIDTH = 100;

/**
 * Word-wraps one paragraph to `width`, starting with `first` and continuing
 * under it with `rest` (hanging indent). A word longer than the line stays whole.
 */
export function wrapParagraph(text: string, first: string, rest = ' '.repeat(first.length), width = REPORT_WIDTH): string {
  const lines: string[] = [];
  let line = first;
  let empty = true;
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (!empty && line.length + 1 + word.length > width) {
      lines.push(line);
      line = rest + word;
    } else line += (empty ? '' : ' ') + word;
    empty = false;
  }
  lines.push(line);
  return lines.join('\n');
}
