/**
 * Validation of installation files (and of board files, which are one-board
 * installations): the whole file's schema, then the tree, board and study rules.
 */
import { InputError } from '../errors.js';
import { oneBoardInstallation, validateInstallationWith, type InstallationFileChecks, type InstallationValidationOf } from '../board/validateInstallationWith.js';
import { isInstallationInput } from '../board/installationInput.js';
import { installationSchema, type BoardSpec, type InstallationSpec } from './boardFileSchema.js';
import { BOARD_FILE_CHECKS } from './validateBoard.js';
import { INSTALLATION_FILE_RULES, readWellFormedInstallation } from './boardFileRules.js';
import type { HarmonicsSectionSpec, InstallationHarmonicsSectionSpec } from '../harmonics/harmonicsSpec.js';

/** A board file's `harmonics:` section as the installation's: its bank on the one board. */
function harmonicsOfBoard(name: string, section: HarmonicsSectionSpec): InstallationHarmonicsSectionSpec {
  const { bank, ...rest } = section;
  return bank ? { ...rest, banks: [{ ...bank, board: name }] } : rest;
}

const INSTALLATION_FILE_CHECKS: InstallationFileChecks<InstallationSpec, BoardSpec> = {
  schema: installationSchema,
  rules: INSTALLATION_FILE_RULES,
  board: BOARD_FILE_CHECKS,
  // The board's correction and harmonic studies carry over (its bank on its one board); the other sections are one-board studies.
  boardAsInstallation: (board) => ({
    ...oneBoardInstallation(board),
    ...(board.correction ? { correction: board.correction } : {}),
    ...(board.harmonics ? { harmonics: harmonicsOfBoard(board.name ?? 'board', board.harmonics) } : {}),
  }),
};

export type InstallationValidation = InstallationValidationOf<InstallationSpec>;

/**
 * Checks an installation object; a board object (supply, feeder, loads) is
 * accepted too and becomes the installation with that one board.
 */
export function validateInstallation(input: unknown): InstallationValidation {
  // Most installation files are well formed: the shortcut answers those without the schemas.
  const installation = isInstallationInput(input) ? readWellFormedInstallation(input) : undefined;
  return installation ? { ok: true, installation } : validateInstallationWith(INSTALLATION_FILE_CHECKS, input);
}

/** @throws {InputError} listing every problem, each with its field path. */
export function parseInstallation(input: unknown): InstallationSpec {
  const result = validateInstallation(input);
  if (!result.ok) throw new InputError(result.issues, isInstallationInput(input) ? 'the installation is not valid' : 'the board is not valid');
  return result.installation;
}
