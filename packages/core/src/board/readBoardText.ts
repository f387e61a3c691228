/**
 * Board text (YAML 1.2, of which JSON is a subset) → a plain object, read one
 * way whatever the file says about itself, with limits a hostile file cannot
 * get past: nesting depth, alias expansion, one document only.
 */
import { isAlias, isCollection, isMap, isPair, isScalar, parseDocument, type Document, type Node } from 'yaml';
import { formatPath, InputError, inputIssue, type InputIssue } from '../errors.js';
import { BOARD_TEXT_LIMITS, checkedBoardText, READ_HEADING, refuse } from './boardText.js';
import { readJsonText } from './readJsonText.js';
import { readPlainYamlText } from './plainYamlText.js';

export { BOARD_TEXT_LIMITS, scanYamlShape } from './boardText.js';

const NOT_TEXT_KEY = 'keys that are plain text or numbers';

/**
 * The document as plain data, aliases expanded, without yaml's `toJS`: that resolves each alias by
 * scanning the whole document (80,000 aliases took two minutes). Here anchors are tracked in document
 * order (an alias names the latest anchor before it) and each anchored value is converted once and
 * shared. The expanded size is counted before anything is expanded, so a "billion laughs" file is
 * refused at no cost. Keys become own properties even when named `__proto__`, so they reach
 * validation as the unknown keys they are instead of replacing an object's prototype.
 */
function toPlainData(doc: Document, body: string): unknown {
  // Where the conversion is, for the one error that needs a field path (a key given twice).
  const trail: (string | number)[] = [];
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
        if (key.value !== null && typeof key.value === 'object') refuse('invalid_key', NOT_TEXT_KEY, 'a key is a list or a mapping; board keys are plain text');
        const name = String(key.value);
        if (Object.prototype.hasOwnProperty.call(object, name)) duplicateKey(trail, name, body, isScalar(pair.key) ? pair.key.range?.[0] : undefined);
        trail.push(name);
        const item = convert(pair.value);
        trail.pop();
        size += key.size + item.size;
        Object.defineProperty(object, name, { value: item.value, enumerable: true, writable: true, configurable: true });
      }
      inProgress.delete(node);
      value = object;
    } else {
      inProgress.add(node);
      const list: unknown[] = [];
      for (const entry of node.items) {
        trail.push(list.length);
        const item = convert(isPair(entry) ? entry.value : entry);
        trail.pop();
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

/** A key given twice in one mapping: refused with the mapping's field path and the second key's line (JSON.parse and YAML readers disagree on which value wins). */
function duplicateKey(trail: readonly (string | number)[], name: string, body: string, offset: number | undefined): never {
  const where = formatPath(trail);
  const line = offset === undefined ? null : body.slice(0, offset).split('\n').length;
  const key = JSON.stringify(name.length > 40 ? `${name.slice(0, 37)}...` : name);
  throw new InputError(
    [
      {
        code: 'duplicate_key',
        path: where,
        expected: 'each key once in a mapping',
        message: `${where === '' ? 'the top level' : where}: the key ${key} is given twice${line === null ? '' : ` (the second time on line ${line})`}; keep one of the values`,
      },
    ],
    READ_HEADING,
  );
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
  const body = checkedBoardText(text);
  // Most files never reach yaml's parser: a JSON object, or YAML in the plain subset (boardText.ts).
  const value = readJsonText(body) ?? readPlainYamlText(body) ?? readYamlText(body);
  if (value === null || value === undefined)
    throw new InputError([inputIssue('missing', '', 'a board object with supply and loads')], 'the board file is empty');
  return value;
}

/** YAML 1.2 text (limits already checked) → plain data: the general reader behind readBoardText. */
export function readYamlText(body: string): unknown {
  // Keys given twice are found while converting, where the field path is known (duplicateKey).
  const doc = parseDocument(body, { prettyErrors: true, uniqueKeys: false, version: '1.2', merge: false });
  if (doc.errors.length) throw new InputError(syntaxIssues(doc), READ_HEADING);
  const declared = doc.directives?.yaml;
  if (declared?.explicit && declared.version !== '1.2')
    refuse(
      'yaml_version',
      'no %YAML line, or %YAML 1.2',
      `the file starts with "%YAML ${declared.version}": board files are always read as YAML 1.2 (under 1.1, 012 would mean 10 and 1:30 would mean 90); remove the %YAML line and check numbers written that way`,
    );
  return toPlainData(doc, body);
}
