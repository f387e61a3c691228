/**
 * Validation of board files: the whole file's schema, then the board's rules
 * and the studies' rules. `validateBoard` returns a result; `parseBoard` throws
 * an `InputError`.
 */
import { InputError } from '../errors.js';
import { BOARD_RULES } from '../board/boardRules.js';
import { readBoardText } from '../board/readBoardText.js';
import { validateBoardWith, type BoardFileChecks, type BoardValidationOf } from '../board/validateBoardWith.js';
import { ruleHarmonicFields } from '../harmonics/harmonicsRules.js';
import { boardSchema, type BoardSpec } from './boardFileSchema.js';

/** The rules the studies add to the board's own, run after them. */
export const STUDY_BOARD_RULES = [ruleHarmonicFields] as const;

export const BOARD_FILE_CHECKS: BoardFileChecks<BoardSpec> = {
  schema: boardSchema,
  load: boardSchema.shape.loads.element,
  rules: [...BOARD_RULES, ...STUDY_BOARD_RULES],
};

export type BoardValidation = BoardValidationOf<BoardSpec>;

/**
 * Checks an already-parsed board object (from JSON, YAML or code).
 * @returns `{ ok: true, board }` or `{ ok: false, issues }` with every problem found.
 */
export function validateBoard(input: unknown): BoardValidation {
  return validateBoardWith(BOARD_FILE_CHECKS, input);
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
