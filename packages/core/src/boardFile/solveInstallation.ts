import { normaliseInstallation } from '../board/normaliseInstallation.js';
import { solveInstallationModel, type SolveInstallationOptions } from '../analysis/solveInstallationModel.js';
import type { InstallationResult } from '../analysis/installationResult.js';
import { parseInstallation } from './validateInstallation.js';
import { isInstallationInput } from '../board/installationInput.js';
import { installationInService } from './installationInService.js';

/**
 * Validates, normalises and solves an installation file given as a plain object
 * (a board file is accepted too: the installation with one board). An installation's
 * `harmonics.banks` are in service (`installationInService`); a board file's `harmonics.bank` is the
 * bank `trivar correct` designs for its one board, and is left out as `solveBoard` leaves it out.
 * @throws {InputError} listing every problem, each with its path.
 * @throws {NumericalError} for a singular network or a load iteration that does not settle.
 * @example
 * const result = solveInstallation({
 *   supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
 *   boards: [
 *     { name: 'Main', loads: [] },
 *     { name: 'Shed', fedFrom: 'Main', feeder: { lengthM: 40, line: { mm2: 16 }, neutral: { mm2: 16 } },
 *       loads: [{ name: 'heater', connection: 'A-N', kW: 3 }] },
 *   ],
 * });
 * // 3000 W / 229.5 V: 230.9 V less 13.07 A × 0.110 ohm, 80 m of 16 mm² copper out and back at 70 °C (1.38 ohm/km)
 * result.feeders[1].lines[0].current.magnitude //=> 13.07 (A)
 */
export function solveInstallation(input: unknown, options: SolveInstallationOptions = {}): InstallationResult {
  const spec = parseInstallation(input);
  return solveInstallationModel(isInstallationInput(input) ? installationInService(spec) : normaliseInstallation(spec).installation, options);
}
