/** Schema pieces shared by the options of the public correction functions. */
import * as z from 'zod';
import type { Board } from '../../board/boardModel.js';
import { InputError } from '../../errors.js';
import type { CorrectionSpec } from '../correctionSpec.js';
import { CORRECTION_RULES } from '../correctionRules.js';
import { conventionsOf } from '../../board/conventions/boardConventions.js';
import { inFileNaming } from '../../board/conventions/issueNaming.js';

export const solveOptionsSchema = z
  .strictObject({
    tolerance: z.number().positive().lt(0.1).optional(),
    maxIterations: z.int().min(1).optional(),
    lowVoltageThreshold: z.number().positive().max(1).optional(),
  })
  .describe('options passed to the board solver');

export const maxIterationsSchema = z.int().min(1).max(1000).describe('outer sizing iterations (each re-solves the board)');

/**
 * Runs the board-dependent spec rules on a public function's options, as if
 * they were a spec for `arrangement`.
 * @throws {InputError}
 */
export function checkRules(spec: CorrectionSpec, board: Board, what: string): void {
  const issues = inFileNaming(CORRECTION_RULES.flatMap((rule) => rule(spec, board)), conventionsOf(board).phaseNames);
  if (issues.length) throw new InputError(issues, `${what} are not valid`);
}

/** Drops keys whose value is undefined, so optional fields stay absent (exactOptionalPropertyTypes). */
export function definedOnly<T extends object>(value: T): { [K in keyof T]: Exclude<T[K], undefined> } {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as { [K in keyof T]: Exclude<T[K], undefined> };
}
