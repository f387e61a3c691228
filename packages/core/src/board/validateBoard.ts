/**
 * Validation of board files: schema first (zod), then the cross-field rules.
 * `validateBoard` returns a result; `parseBoard` throws an `InputError`.
 */
import { parseDocument } from 'yaml';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { boardSchema, type BoardSpec } from './boardSchema.js';
import { BOARD_RULES } from './boardRules.js';

export type BoardValidation = { ok: true; board: BoardSpec } | { ok: false; issues: InputIssue[] };

/**
 * Checks an already-parsed board object (from JSON, YAML or code).
 * @returns `{ ok: true, board }` or `{ ok: false, issues }` with every problem found.
 */
export function validateBoard(input: unknown): BoardValidation {
  const parsed = boardSchema.safeParse(input);
  if (!parsed.success) return { ok: false, issues: inputIssuesFromZod(parsed.error.issues, input) };
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
