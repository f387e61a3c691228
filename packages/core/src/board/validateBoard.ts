/**
 * Validation of board files: schema first (zod), then the cross-field rules.
 * `validateBoard` returns a result; `parseBoard` throws an `InputError`.
 */
import { parseDocument } from 'yaml';
import type { core } from 'zod';
import { formatPath, InputError, inputIssue, type InputIssue } from '../errors.js';
import { boardSchema, type BoardSpec } from './boardSchema.js';
import { BOARD_RULES } from './boardRules.js';

export type BoardValidation = { ok: true; board: BoardSpec } | { ok: false; issues: InputIssue[] };

/** What a schema field accepts, for messages: taken from the schema's own descriptions. */
function expectedFor(issue: core.$ZodIssue): string {
  switch (issue.code) {
    case 'invalid_type':
      return issue.expected === 'object' ? 'an object' : issue.expected === 'array' ? 'a list' : `a ${issue.expected}`;
    case 'invalid_value':
      return `one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`;
    case 'too_small':
      if (issue.origin === 'array') return `at least ${String(issue.minimum)} item(s)`;
      if (issue.origin === 'string') return 'a non-empty text';
      return `a number ${issue.inclusive ? '>=' : '>'} ${String(issue.minimum)}`;
    case 'too_big':
      return `a number ${issue.inclusive ? '<=' : '<'} ${String(issue.maximum)}`;
    case 'unrecognized_keys':
      return 'only the documented keys (see the board JSON Schema)';
    default:
      return issue.message;
  }
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let node: unknown = root;
  for (const key of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<PropertyKey, unknown>)[key];
  }
  return node;
}

function toInputIssues(issue: core.$ZodIssue, root: unknown): InputIssue[] {
  if (issue.code === 'unrecognized_keys') {
    return issue.keys.map((key) =>
      inputIssue('unknown_key', formatPath([...issue.path, key]), 'only the documented keys (see the board JSON Schema)', key),
    );
  }
  const received = valueAt(root, issue.path);
  const code = issue.code === 'invalid_type' && received === undefined ? 'missing' : issue.code === 'too_small' || issue.code === 'too_big' ? 'out_of_range' : issue.code;
  return [inputIssue(code, formatPath(issue.path), expectedFor(issue), received)];
}

/**
 * Checks an already-parsed board object (from JSON, YAML or code).
 * @returns `{ ok: true, board }` or `{ ok: false, issues }` with every problem found.
 */
export function validateBoard(input: unknown): BoardValidation {
  const parsed = boardSchema.safeParse(input);
  if (!parsed.success) return { ok: false, issues: parsed.error.issues.flatMap((i) => toInputIssues(i, input)) };
  const issues = BOARD_RULES.flatMap((rule) => rule(parsed.data));
  return issues.length ? { ok: false, issues } : { ok: true, board: parsed.data };
}

/**
 * Validates a board object and returns it typed.
 * @throws {InputError} listing every problem, each with its field path.
 */
export function parseBoard(input: unknown): BoardSpec {
  const result = validateBoard(input);
  if (!result.ok) throw new InputError(result.issues);
  return result.board;
}

/**
 * Reads board text (YAML, of which JSON is a subset) into a plain object. YAML
 * syntax errors become an `InputError` naming the line and column.
 * @throws {InputError}
 */
export function readBoardText(text: string): unknown {
  const doc = parseDocument(text, { prettyErrors: true, uniqueKeys: true });
  if (doc.errors.length) {
    throw new InputError(
      doc.errors.map((e) => {
        const at = e.linePos?.[0];
        const where = at ? `line ${at.line}, column ${at.col}` : 'the file';
        return { code: 'syntax', path: '', expected: 'valid YAML or JSON', message: `${where}: ${e.message.split('\n')[0]!.replace(/ at line \d+, column \d+:?$/, '')}` };
      }),
      'the board file could not be read',
    );
  }
  const value: unknown = doc.toJS();
  if (value === null || value === undefined)
    throw new InputError([inputIssue('missing', '', 'a board object with supply and loads')], 'the board file is empty');
  return value;
}

/** `readBoardText` then `parseBoard`. @throws {InputError} */
export function parseBoardText(text: string): BoardSpec {
  return parseBoard(readBoardText(text));
}
