import { studyBoardHarmonics, type HarmonicsOptions } from '../harmonics/studyHarmonics.js';
import type { HarmonicsReport } from '../harmonics/harmonicsResult.js';
import { parseBoard } from './validateBoard.js';

/**
 * Validates a board file and runs its harmonic study (`harmonics:` section,
 * load `spectrum` fields).
 * @throws {InputError} listing every problem, each with its field path
 * @throws {NumericalError} when a solve fails
 * @example
 * const report = studyHarmonics(boardObject);
 * report.neutral?.ratioToPhase //=> 1.7 for balanced switch-mode loads (typical spectrum)
 */
export function studyHarmonics(input: unknown, options: HarmonicsOptions = {}): HarmonicsReport {
  return studyBoardHarmonics(parseBoard(input), options);
}
