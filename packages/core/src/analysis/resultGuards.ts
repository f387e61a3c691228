/**
 * Entry checks of the public functions that take a solved result (diagrams, the board-wide PF by a
 * definition): as modelGuards.ts does for models, a few property reads telling a result from a spec,
 * a model or nothing, so the wrong argument is an InputError naming it, not a TypeError in a drawing.
 */
import { argumentError, isObject } from '../board/modelGuards.js';
import type { BoardResult } from './boardResult.js';
import type { InstallationResult } from './installationResult.js';

const BOARD_RESULT_EXPECTED = 'a solved board from solveBoard(...) or solveBoardModel(...)';
const INSTALLATION_RESULT_EXPECTED = 'a solved installation from solveInstallation(...) or solveInstallationModel(...)';

export function isBoardResult(value: unknown): value is BoardResult {
  return isObject(value) && isObject(value.board) && Array.isArray(value.phases) && Array.isArray(value.lineToLine) && isObject(value.powerFactor) && isObject(value.conventions);
}

/** @throws {InputError} naming `argument` when `value` is not a solved board */
export function assertBoardResult(value: unknown, argument = 'result'): asserts value is BoardResult {
  if (!isBoardResult(value)) throw argumentError(argument, BOARD_RESULT_EXPECTED, value, `the ${argument} argument is not a solved board`, 'solved');
}

/** @throws {InputError} naming `argument` when `value` is not a solved installation */
export function assertInstallationResult(value: unknown, argument = 'result'): asserts value is InstallationResult {
  if (!(isObject(value) && Array.isArray(value.boards) && value.boards.length > 0 && Array.isArray(value.feeders) && value.boards.every((b) => isObject(b) && isBoardResult(b.result))))
    throw argumentError(argument, INSTALLATION_RESULT_EXPECTED, value, `the ${argument} argument is not a solved installation`, 'solved');
}
