/**
 * Delta bank: one capacitor per line pair. A branch across x–y lowers the
 * reactive current of both its lines and moves active current from one to the
 * other (P_x falls by Q/(2√3), P_y rises by as much, for ABC), so the three
 * branch ratings are coupled: they are sized together on the solved board.
 */
import * as z from 'zod';
import type { Board } from '../board/boardModel.js';
import type { SolveOptions } from '../network/solveNetwork.js';
import { targetSchema, type TargetSpec } from './correctionSpec.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { resolveTarget } from './correctionTarget.js';
import { deltaSlots } from './equipment.js';
import type { BankSizing } from './correctionResult.js';
import { checkRules, definedOnly, maxIterationsSchema, solveOptionsSchema } from './_internal/optionSchemas.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { sizeBank, type ResolvedBankOptions } from './_internal/sizeBank.js';
import { assertBoardModel } from '../board/modelGuards.js';

export interface DeltaBankOptions {
  /**
   * The power-factor target.
   * @defaultValue `{ pf: 0.95, definition: 'per-line', leading: 'never' }`
   */
  readonly target?: TargetSpec;
  /**
   * With a board-wide target only: equal kvar per branch (one three-phase
   * bank), or in proportion to what each branch needs for the upper bound.
   * @defaultValue 'equal'
   */
  readonly share?: 'equal' | 'proportional';
  /** Passed to the board solver at every re-solve. @defaultValue solver defaults */
  readonly solve?: SolveOptions;
  /** Outer sizing iterations. @defaultValue 30 */
  readonly maxIterations?: number;
}

const deltaBankOptionsSchema = z.strictObject({
  target: targetSchema.optional(),
  share: z.enum(['equal', 'proportional']).optional(),
  solve: solveOptionsSchema.optional(),
  maxIterations: maxIterationsSchema.optional(),
});

function resolveDeltaBankOptions(board: Board, input: DeltaBankOptions | undefined): ResolvedBankOptions {
  const options = parseOptions(deltaBankOptionsSchema, input, 'sizeDeltaBank options');
  checkRules(definedOnly({ arrangement: 'delta-bank' as const, target: options.target, share: options.share }), board, 'sizeDeltaBank options');
  return {
    target: resolveTarget(options.target, board),
    share: options.share ?? CORRECTION_DEFAULTS.share,
    solve: definedOnly(options.solve ?? {}),
    loop: { maxIterations: options.maxIterations ?? CORRECTION_DEFAULTS.maxIterations, convergence: CORRECTION_DEFAULTS.convergence },
  };
}

/**
 * Sizes a delta bank (continuous ratings, capacitors only) on a three-phase
 * board by re-solving the board with the bank in place.
 * @param board a normalised three-phase board
 * @returns ratings per line pair, the corrected board's check against the
 *   target, and per line the change in active current the branches cause
 * @param use `limitsOnly`: a light-load sizing, read only for its limits (an equal bank's window is then
 *   found up to its limit only, `equalShare.minKvar` null)
 * @throws {InputError} on a board without three phases, or options that do not fit it
 * @throws {NumericalError} if a re-solve fails
 * @example
 * // balanced 400 V board, 30 kW at 0.8 lagging per phase, target 0.95:
 * sizeDeltaBank(board, { target: { pf: 0.95 } }).branches.map((b) => b.kvarAtNominalV)
 * //=> [12.64…, 12.64…, 12.64…]
 */
export function sizeDeltaBank(board: Board, options?: DeltaBankOptions, use: Pick<ResolvedBankOptions, 'limitsOnly' | 'capacitanceTolerance'> = {}): BankSizing {
  assertBoardModel(board);
  const resolved = resolveDeltaBankOptions(board, options);
  return sizeBank(board, 'delta-bank', deltaSlots(board), { ...resolved, ...use });
}
