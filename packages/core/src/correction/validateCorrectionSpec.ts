/**
 * Validation of a correction spec against a board: shape first (zod), then the
 * board-dependent rules. `validateCorrectionSpec` returns a result;
 * `parseCorrectionSpec` throws an `InputError`.
 */
import type { Board } from '../board/boardModel.js';
import { InputError, namingArgument, type InputIssue } from '../errors.js';
import { correctionSpecSchema, type CorrectionSpec } from './correctionSpec.js';
import { CORRECTION_RULES } from './correctionRules.js';
import { allInputIssues } from '../_internal/zodIssues.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { inFileNaming } from '../board/conventions/issueNaming.js';
import { assertBoardModel } from '../board/modelGuards.js';

export type CorrectionSpecValidation = { ok: true; spec: CorrectionSpec } | { ok: false; issues: InputIssue[] };

/**
 * Checks a correction spec (a plain object, e.g. from a file or CLI flags) for a board.
 * @returns `{ ok: true, spec }` or `{ ok: false, issues }` with every problem and its field path.
 */
export function validateCorrectionSpec(input: unknown, board: Board): CorrectionSpecValidation {
  assertBoardModel(board);
  const parsed = correctionSpecSchema.safeParse(input, ONE_SHOT_PARSE);
  // A non-object is the `spec` argument's problem, not the board's.
  const shapeIssues = namingArgument(allInputIssues(parsed.success ? [] : parsed.error.issues, input, correctionSpecSchema), 'spec');
  // Paths and lists in the board's naming: a file in L1/L2/L3 reads `target.perPhase.L3`.
  const naming = conventionsOf(board).phaseNames;
  if (!parsed.success || shapeIssues.length) return { ok: false, issues: inFileNaming(shapeIssues, naming) };
  const issues = inFileNaming(CORRECTION_RULES.flatMap((rule) => rule(parsed.data, board)), naming);
  return issues.length ? { ok: false, issues } : { ok: true, spec: parsed.data };
}

/**
 * Validates a correction spec for a board and returns it typed.
 * @throws {InputError} listing every problem, each with its field path (`target.pf`).
 * @example
 * parseCorrectionSpec({ arrangement: 'star-bank', target: { pf: 1.2 } }, board)
 * //=> throws InputError: "target.pf: expected a number <= 1 (received 1.2)"
 */
export function parseCorrectionSpec(input: unknown, board: Board): CorrectionSpec {
  assertBoardModel(board);
  const result = validateCorrectionSpec(input, board);
  if (!result.ok) throw new InputError(result.issues, 'the correction settings are not valid');
  return result.spec;
}
