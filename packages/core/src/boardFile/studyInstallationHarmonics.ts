import { studyInstallationHarmonicsSpec } from '../harmonics/studyInstallationHarmonics.js';
import type { HarmonicsOptions } from '../harmonics/studyHarmonics.js';
import type { InstallationHarmonicsReport } from '../harmonics/harmonicsResult.js';
import { parseInstallation } from './validateInstallation.js';

/**
 * Validates an installation file (a board file is accepted too: the installation
 * with one board) and runs its harmonic study through the installation's network:
 * every board's busbar and incoming feeder, the scan and duty of every bank.
 * @throws {InputError} listing every problem, each with its field path
 * @throws {NumericalError} when a solve fails
 * @example
 * const report = studyInstallationHarmonics(installationObject);
 * report.boards[1].triplenNeutralA //=> the triplen current in that board's feeder neutral, A
 */
export function studyInstallationHarmonics(input: unknown, options: HarmonicsOptions = {}): InstallationHarmonicsReport {
  return studyInstallationHarmonicsSpec(parseInstallation(input), options);
}
