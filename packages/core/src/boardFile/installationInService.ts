import type { Installation } from '../board/boardModel.js';
import { normaliseInstallation } from '../board/normaliseInstallation.js';
import { withBanksInService } from '../harmonics/banksInService.js';
import type { InstallationSpec } from './boardFileSchema.js';

/**
 * A validated installation file as solved: normalised, with the capacitor banks its `harmonics.banks`
 * lists in service at the fundamental (every step unless an entry's `stepsInService` says otherwise).
 * What `trivar solve`, `report` and `diagram` solve and `trivar correct` starts from on an installation.
 * @throws {InputError} for a bank on an unknown board, two on one board, or steps in service a bank does not have
 */
export function installationInService(spec: InstallationSpec): Installation {
  return withBanksInService(normaliseInstallation(spec).installation, spec.harmonics?.banks);
}
