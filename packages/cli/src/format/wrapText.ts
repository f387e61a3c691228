/** Word-wrapping for report prose, so text reports fit a 100-column terminal. */

export const REPORT_WIDTH = 100;

/**
 * Wraps `text` at spaces to `width` columns; the first line starts with
 * `first`, the rest with `rest` (a hanging indent). Words longer than a line stay whole.
 */
export function wrapText(text: string, first = '', rest = ' '.repeat(first.length), width = REPORT_WIDTH): string {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  let line = first;
  let empty = true;
  for (const word of words) {
    if (!empty && line.length + 1 + word.length > width) {
      lines.push(line);
      line = rest + word;
    } else line = empty ? line + word : `${line} ${word}`;
    empty = false;
  }
  lines.push(line);
  return lines.join('\n');
}
