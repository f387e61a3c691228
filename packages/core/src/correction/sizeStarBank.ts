/**
 * Star bank: one capacitor per phase, to the neutral bar on a 4-wire board or
 * to its own floating star point (a 3-wire board, or by choice).
 */
import * as z from 'zod';
import type { Board } from '../board/boardModel.js';
import type { SolveOptions } from '../network/solveNetwork.js';
import { targetSchema, type TargetSpec } from './correctionSpec.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { resolveTarget } from './correctionTarget.js';
import { starSlots } from './equipment.js';
import type { BankSizing } from './correctionResult.js';
import { checkRules, definedOnly, maxIterationsSchema, solveOptionsSchema } from './_internal/optionSchemas.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { sizeBank, type ResolvedBankOptions } from './_internal/sizeBank.js';
import { assertBoardModel } from '../board/modelGuards.js';

export interface StarBankOptions {
  /**
   * The power-factor target.
   * @defaultValue `{ pf: 0.95, definition: 'per-line', leading: 'never' }`
   */
  readonly target?: TargetSpec;
  /**
   * Where the star point goes. A floating star point settles where the three
   * capacitor currents sum to zero; its shift from the centroid of the line
   * voltages is reported.
   * @defaultValue 'neutral' on a board with a (closed) neutral, otherwise 'floating'
   */
  readonly starPoint?: 'neutral' | 'floating';
  /**
   * With a board-wide target only: equal kvar per phase (one three-phase bank),
   * or in proportion to what each phase needs for its upper bound.
   * @defaultValue 'equal'
   */
  readonly share?: 'equal' | 'proportional';
  /** Passed to the board solver at every re-solve. @defaultValue solver defaults */
  readonly solve?: SolveOptions;
  /** Outer sizing iterations. @defaultValue 30 */
  readonly maxIterations?: number;
}

const starBankOptionsSchema = z.strictObject({
  target: targetSchema.optional(),
  starPoint: z.enum(['neutral', 'floating']).optional(),
  share: z.enum(['equal', 'proportional']).optional(),
  solve: solveOptionsSchema.optional(),
  maxIterations: maxIterationsSchema.optional(),
});

function resolveStarBankOptions(board: Board, input: StarBankOptions | undefined): ResolvedBankOptions & { starPoint: 'neutral' | 'floating' } {
  const options = parseOptions(starBankOptionsSchema, input, 'sizeStarBank options');
  checkRules(definedOnly({ arrangement: 'star-bank' as const, target: options.target, starPoint: options.starPoint, share: options.share }), board, 'sizeStarBank options');
  return {
    target: resolveTarget(options.target, board),
    starPoint: options.starPoint ?? (board.hasNeutral && !board.neutralOpen ? 'neutral' : 'floating'),
    share: options.share ?? CORRECTION_DEFAULTS.share,
    solve: definedOnly(options.solve ?? {}),
    loop: { maxIterations: options.maxIterations ?? CORRECTION_DEFAULTS.maxIterations, convergence: CORRECTION_DEFAULTS.convergence },
  };
}

/**
 * Sizes a star bank (continuous ratings) by re-solving the board with the bank
 * in place until every constrained power factor sits on its target.
 * @param board a normalised board (`normaliseBoard`)
 * @returns ratings per phase (kvar at nominal and at the solved voltage, µF,
 *   current), the corrected board's check against the target, and the change
 *   in each line's active and reactive current
 * @param use `limitsOnly`: a light-load sizing, read only for its limits (an equal bank's window is then
 *   found up to its limit only, `equalShare.minKvar` null)
 * @throws {InputError} for options that do not fit the board (field path in each issue)
 * @throws {NumericalError} if a re-solve fails
 * @example
 * // 400 V 4-wire board, 30 kW at 0.8 lagging per phase, target 0.95:
 * sizeStarBank(board, { target: { pf: 0.95 } }).branches[0].kvarAtNominalV
 * //=> 12.64… (= 30 × (tan acos 0.8 − tan acos 0.95))
 */
export function sizeStarBank(board: Board, options?: StarBankOptions, use: Pick<ResolvedBankOptions, 'limitsOnly' | 'capacitanceTolerance'> = {}): BankSizing {
  assertBoardModel(board);
  const resolved = resolveStarBankOptions(board, options);
  return sizeBank(board, 'star-bank', starSlots(board, resolved.starPoint), { ...resolved, ...use });
}
