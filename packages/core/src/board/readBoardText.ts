/**
 * Board text (YAML 1.2, of which JSON is a subset) → a plain object, read one
 * way whatever the file says about itself, with limits a hostile file cannot
 * get past: nesting depth, alias expansion, one document only.
 */
import { isAlias, isCollection, isMap, isPair, isScalar, parseDocument, type Document, type Node } from 'yaml';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { readJsonText } from './readJsonText.js';

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

const READ_HEADING = 'the board file could not be read';

function refuse(code: string, expected: string, message: string): never {
  throw new InputError([{ code, path: '', expected, message }], READ_HEADING);
}

/**
 * Nesting depth and number of entries of YAML text, counted before yaml parses it
 * (its parser and composer recurse and hold about 1 kB per value, so a deep or
 * huge file must never reach them). Depth counts flow brackets
 * outside quotes and comments, block indentation levels and `- - -` runs; it may
 * overcount (a `[` inside a plain scalar) but never undercounts.
 */
export function scanYamlShape(text: string): { depth: number; entries: number } {
  let deepest = 0;
  let entries = 0;
  let flow = 0;
  const indents: number[] = [];
  let quote: '"' | "'" | null = null;
  let lineStart = true;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quote) {
      if (c === '\\' && quote === '"') i++;
      else if (c === quote) quote = null;
      continue;
    }
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

const NOT_TEXT_KEY = 'keys that are plain text or numbers';

/**
 * The document as plain data, aliases expanded, without yaml's `toJS`: that resolves each alias by
 * scanning the whole document (80,000 aliases took two minutes). Here anchors are tracked in document
 * order (an alias names the latest anchor before it) and each anchored value is converted once and
 * shared. The expanded size is counted before anything is expanded, so a "billion laughs" file is
 * refused at no cost. Keys become own properties even when named `__proto__`, so they reach
 * validation as the unknown keys they are instead of replacing an object's prototype.
 */
function toPlainData(doc: Document): unknown {
  const anchors = new Map<string, Node>();
  const sizes = new Map<Node, number>();
  const values = new Map<Node, unknown>();
  const inProgress = new Set<Node>();
  let literal = 0;
  let added = 0;
  const limit = BOARD_TEXT_LIMITS.maxAliasExpansion;
  const convert = (node: unknown): { value: unknown; size: number } => {
    if (isAlias(node)) {
      const target = anchors.get(node.source);
      if (target === undefined) refuse('alias_unknown', 'an alias (*name) after its anchor (&name)', `alias *${node.source} has no anchor &${node.source} before it`);
      if (inProgress.has(target)) refuse('alias_loop', 'aliases that refer to earlier, complete values', `alias *${node.source} refers to a value that contains it (a loop)`);
      const size = sizes.get(target)!;
      added += size;
      if (added > limit)
        refuse(
          'alias_expansion',
          `aliases adding at most ${limit.toLocaleString('en')} values when expanded`,
          `the aliases (*name) in the file would expand its ${literal.toLocaleString('en')} written values by more than ${limit.toLocaleString('en')}; ordinary reuse of anchors stays far below that (a file built to exhaust memory looks like this)`,
        );
      return { value: values.get(target), size };
    }
    if (!isScalar(node) && !isCollection(node)) return { value: null, size: 1 };
    if (node.anchor) anchors.set(node.anchor, node);
    literal++;
    let size = 1;
    let value: unknown;
    if (isScalar(node)) value = node.value;
    else if (isMap(node)) {
      inProgress.add(node);
      const object: Record<string, unknown> = {};
      for (const pair of node.items) {
        const key = convert(pair.key);
        const item = convert(pair.value);
        size += key.size + item.size;
        if (key.value !== null && typeof key.value === 'object') refuse('invalid_key', NOT_TEXT_KEY, 'a key is a list or a mapping; board keys are plain text');
        Object.defineProperty(object, String(key.value), { value: item.value, enumerable: true, writable: true, configurable: true });
      }
      inProgress.delete(node);
      value = object;
    } else {
      inProgress.add(node);
      const list: unknown[] = [];
      for (const entry of node.items) {
        const item = convert(isPair(entry) ? entry.value : entry);
        size += item.size;
        list.push(item.value);
      }
      inProgress.delete(node);
      value = list;
    }
    sizes.set(node, size);
    values.set(node, value);
    return { value, size };
  };
  return convert(doc.contents).value;
}

function syntaxIssues(doc: Document): InputIssue[] {
  return doc.errors.map((e) => {
    if (e.code === 'MULTIPLE_DOCS')
      return {
        code: 'multiple_documents',
        path: '',
        expected: 'one YAML document per board file',
        message: `line ${e.linePos?.[0].line ?? '?'}: a second YAML document starts here ("---" after the board); a board file holds one board: split the file, or remove the "---" line`,
      };
    const at = e.linePos?.[0];
    const where = at ? `line ${at.line}, column ${at.col}` : 'the file';
    return { code: 'syntax', path: '', expected: 'valid YAML or JSON', message: `${where}: ${e.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '')}` };
  });
}

/**
 * Reads board text (YAML 1.2 core schema; JSON is a subset) into a plain object.
 * The same text always reads the same way: a `%YAML` header other than 1.2 is
 * refused (YAML 1.1 would turn `012` into 10 and `1:30` into 90), `<<` merge keys
 * stay ordinary keys, and only one document is accepted.
 * @throws {InputError} for syntax errors (naming line and column), too deep nesting,
 * aliases that would expand too far, a second document or a foreign `%YAML` version.
 */
export function readBoardText(text: string): unknown {
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
  // JSON boards skip yaml's parser when the engine's JSON.parse gives the same data (readJsonText.ts).
  const value = readJsonText(body) ?? readYamlText(body);
  if (value === null || value === undefined)
    throw new InputError([inputIssue('missing', '', 'a board object with supply and loads')], 'the board file is empty');
  return value;
}

/** YAML 1.2 text (limits already checked) → plain data: the general reader behind readBoardText. */
export function readYamlText(body: string): unknown {
  const doc = parseDocument(body, { prettyErrors: true, uniqueKeys: true, version: '1.2', merge: false });
  if (doc.errors.length) throw new InputError(syntaxIssues(doc), READ_HEADING);
  const declared = doc.directives?.yaml;
  if (declared?.explicit && declared.version !== '1.2')
    refuse(
      'yaml_version',
      'no %YAML line, or %YAML 1.2',
      `the file starts with "%YAML ${declared.version}": board files are always read as YAML 1.2 (under 1.1, 012 would mean 10 and 1:30 would mean 90); remove the %YAML line and check numbers written that way`,
    );
  return toPlainData(doc);
}
