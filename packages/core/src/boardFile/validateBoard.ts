/**
 * Validation of board files: the whole file's schema, then the board's rules
 * and the studies' rules. `validateBoard` returns a result; `parseBoard` throws
 * an `InputError`.
 */
import { InputError } from '../errors.js';
import { validateBoardWith, type BoardFileChecks, type BoardValidationOf } from '../board/validateBoardWith.js';
import { boardSchema, type BoardSpec } from './boardFileSchema.js';
import { BOARD_FILE_RULES, readWellFormedBoard } from './boardFileRules.js';

export const BOARD_FILE_CHECKS: BoardFileChecks<BoardSpec> = {
  schema: boardSchema,
  load: boardSchema.shape.loads.element,
  rules: BOARD_FILE_RULES,
};

export type BoardValidation = BoardValidationOf<BoardSpec>;

/**
 * Checks an already-parsed board object (from JSON, YAML or code).
 * @returns `{ ok: true, board }` or `{ ok: false, issues }` with every problem found.
 */
export function validateBoard(input: unknown): BoardValidation {
  // Most files are well formed: the shortcut answers those without the schema's per-load work.
  const board = readWellFormedBoard(input);
  return board ? { ok: true, board } : validateBoardWith(BOARD_FILE_CHECKS, input);
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
