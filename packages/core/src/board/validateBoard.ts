/**
 * Validation of board files: schema first (zod), then the cross-field rules.
 * `validateBoard` returns a result; `parseBoard` throws an `InputError`.
 */
import { InputError, type InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { boardSchema, type BoardSpec } from './boardSchema.js';
import { BOARD_RULES } from './boardRules.js';
import { readBoardText } from './readBoardText.js';

export { readBoardText };

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

/** `readBoardText` then `parseBoard`. @throws {InputError} */
export function parseBoardText(text: string): BoardSpec {
  return parseBoard(readBoardText(text));
}
