import type { Installation } from '../board/boardModel.js';
import { solveInstallationNetwork } from '../network/solveNetwork.js';
import { analyseInstallation, type AnalyseInstallationOptions } from './analyseInstallation.js';
import type { InstallationResult } from './installationResult.js';
import { assertFiniteResult } from './assertFiniteResult.js';
import { assertInstallationModel } from '../board/modelGuards.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';
import { SOLVE_OPTION_KEYS, solveOptionsOf } from '../network/solveOptions.js';

export type SolveInstallationOptions = AnalyseInstallationOptions;

/**
 * Solves a normalised installation (see `normaliseInstallation`) and analyses every board and feeder.
 * @throws {NumericalError} for a singular network or a load iteration that does not settle.
 */
export function solveInstallationModel(installation: Installation, options: SolveInstallationOptions = {}): InstallationResult {
  assertInstallationModel(installation);
  checkOptionKeys(options, 'options', [...SOLVE_OPTION_KEYS, 'openNeutral']);
  return assertFiniteResult(analyseInstallation(solveInstallationNetwork(installation, solveOptionsOf(options)), options));
}
