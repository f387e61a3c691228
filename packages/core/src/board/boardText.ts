/**
 * Board text before any parser: the limits a hostile file cannot get past (nesting depth,
 * entries), checked on the text itself, and the readers that need no YAML library (a JSON
 * object, YAML in the plain subset). No yaml here: `trivar solve` reads most files without
 * loading it; readBoardText.ts adds yaml's reader for the rest.
 */
import { InputError } from '../errors.js';
import { readJsonText } from './readJsonText.js';
import { readPlainYamlText } from './plainYamlText.js';
import { assertText } from './modelGuards.js';

export const BOARD_TEXT_LIMITS = {
  /** Deepest nesting accepted. A board file nests about 5 levels; yaml's own composer overflows the stack near 1000. */
  maxDepth: 64,
  /**
   * Values that aliases (`*name`) may add when expanded. The limit is on the expanded size, not on the number
   * of aliases, so reusing an anchor on every load is fine while a "billion laughs" file is refused long
   * before it costs memory. A template anchored once and reused on 1,000 circuits adds about 10,000.
   */
  maxAliasExpansion: 100_000,
  /**
   * Entries (content lines, list items, flow items) read. yaml's parser holds about 1 kB per value,
   * so this, not the byte size, bounds its memory: 50,000 entries cost at most about 130 MB (flow style,
   * `[1, 2, ...]`, is the costly one). A board of 1,000 circuits written one per line has about 1,000;
   * in block style, about 8,000.
   */
  maxEntries: 50_000,
} as const;

/**
 * Nesting depth and number of entries of YAML text, counted before yaml parses it
 * (its parser and composer recurse and hold about 1 kB per value, so a deep or
 * huge file must never reach them). Depth counts flow brackets
 * outside quotes and comments, block indentation levels and `- - -` runs; it may
 * overcount (a `[` inside a plain scalar) but never undercounts.
 */
const IN_DOUBLE_QUOTES = /[^"\\]*/y;
const IN_SINGLE_QUOTES = /[^']*/y;
const UNCOUNTED = /[^\n#"'[\]{},]*/y;

export function scanYamlShape(text: string): { depth: number; entries: number } {
  let deepest = 0;
  let entries = 0;
  let flow = 0;
  const indents: number[] = [];
  let quote: '"' | "'" | null = null;
  let lineStart = true;
  for (let i = 0; i < text.length; i++) {
    if (quote) {
      // Jump to the closing quote (a backslash escapes the next character in double quotes).
      const run = quote === '"' ? IN_DOUBLE_QUOTES : IN_SINGLE_QUOTES;
      run.lastIndex = i;
      run.test(text);
      i = run.lastIndex;
      if (text[i] === '\\') i++;
      else if (i < text.length) quote = null;
      continue;
    }
    if (!lineStart) {
      // Jump over characters that change nothing counted here.
      UNCOUNTED.lastIndex = i;
      UNCOUNTED.test(text);
      i = UNCOUNTED.lastIndex;
      if (i >= text.length) break;
    }
    const c = text[i]!;
    if (lineStart) {
      lineStart = false;
      let j = i;
      while (text[j] === ' ') j++;
      const first = text[j];
      if (first !== undefined && first !== '\n' && first !== '\r' && first !== '#' && flow === 0) {
        const indent = j - i;
        while (indents.length && indents[indents.length - 1]! >= indent) indents.pop();
        indents.push(indent);
        let dashes = 0;
        // "- - - x" and "? ? ? x" nest on one line.
        while ((text[j] === '-' || text[j] === '?') && (text[j + 1] === ' ' || text[j + 1] === '\t')) {
          dashes++;
          j += 2;
          while (text[j] === ' ') j++;
        }
        deepest = Math.max(deepest, indents.length + dashes);
        entries += 1 + dashes;
      }
      i = j - 1;
      continue;
    }
    if (c === '\n') lineStart = true;
    else if (c === '#' && (i === 0 || /\s/.test(text[i - 1]!))) {
      while (i + 1 < text.length && text[i + 1] !== '\n') i++;
    } else if (c === '"' || c === "'") {
      // A quote opens a string only where a scalar can start (not inside a plain word like O'Brien).
      const before = text[i - 1];
      if (before === undefined || /[\s[{,:-]/.test(before)) quote = c;
    } else if (c === '[' || c === '{') {
      flow++;
      entries++;
      deepest = Math.max(deepest, indents.length + flow);
    } else if ((c === ']' || c === '}') && flow > 0) flow--;
    else if (c === ',' && flow > 0) entries++;
  }
  return { depth: deepest, entries };
}

export const READ_HEADING = 'the board file could not be read';

export function refuse(code: string, expected: string, message: string): never {
  throw new InputError([{ code, path: '', expected, message }], READ_HEADING);
}

/** The text without a byte-order mark, once its depth and entries are within the limits. @throws {InputError} */
export function checkedBoardText(text: string): string {
  assertText(text);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const { depth, entries } = scanYamlShape(body);
  if (depth > BOARD_TEXT_LIMITS.maxDepth)
    refuse('too_deep', `at most ${BOARD_TEXT_LIMITS.maxDepth} levels of nesting (a board needs about 5)`, `the file nests more than ${BOARD_TEXT_LIMITS.maxDepth} levels deep (a board file needs about 5); nesting that deep is refused before it is parsed`);
  if (entries > BOARD_TEXT_LIMITS.maxEntries)
    refuse(
      'too_many_entries',
      `at most ${BOARD_TEXT_LIMITS.maxEntries.toLocaleString('en')} entries (lines and list items)`,
      `the file holds more than ${BOARD_TEXT_LIMITS.maxEntries.toLocaleString('en')} entries (lines and list items); a board of 1,000 circuits has under 10,000`,
    );
  return body;
}

/**
 * Board text as plain data when it needs no YAML library: a JSON object (readJsonText.ts) or
 * YAML in the plain subset (plainYamlText.ts), read exactly as readBoardText reads them;
 * otherwise undefined (then readBoardText, with yaml, reads it or words the problem).
 * @throws {InputError} for text past the depth or entry limits.
 */
export function readPlainBoardText(text: string): unknown {
  const body = checkedBoardText(text);
  return readJsonText(body) ?? readPlainYamlText(body);
}
