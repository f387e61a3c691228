/**
 * A board named on the command line of a study on an installation (correct, profile): its number, or a
 * usage error naming the option (exit 2) — its own module, as installationBoardIndex brings the correction
 * modules, which `trivar solve` (through chooseBoard.ts) must not load.
 */
import { InputError, installationBoardIndex, type Installation } from '@trivar/core';
import { UsageError } from '../exitCodes.js';

/** installationBoardIndex for a name given on the command line: an unknown one is a usage error naming the option. */
export function boardIndexOption(installation: Installation, name: string | undefined, option = '--board'): number {
  try {
    return installationBoardIndex(installation, name, option);
  } catch (error) {
    if (error instanceof InputError && error.issues.every((i) => i.code === 'unknown_board')) throw new UsageError(`the options do not fit the installation: ${error.issues.map((i) => i.message).join('; ')}`);
    throw error;
  }
}
