/**
 * `--board <name>` on an installation file: the board it names, with a clear error listing the boards there are.
 * A name on the command line that no board has is a command-line problem (exit 2, as `rebalance --boards`
 * gives); a name in the file (`correction.board`) stays the file's (exit 3).
 */
import { InputError } from '@trivar/core';
import { UsageError } from '../exitCodes.js';

export function unknownBoardError(unknown: readonly string[], names: readonly string[], option = '--board'): UsageError {
  const listed = names.map((x) => JSON.stringify(x)).join(', ');
  return new UsageError(`the options do not fit the file: ${unknown.map((n) => `${option}: expected a board of this installation: ${listed} (received ${JSON.stringify(n)})`).join('; ')}`);
}

/** The named board, or the main board (the first of `names`) when none is named. */
export function chooseBoard(names: readonly string[], wanted: string | undefined): string {
  if (wanted === undefined) return names[0]!;
  if (!names.includes(wanted)) throw unknownBoardError([wanted], names);
  return wanted;
}

/** The error for `--board` on a file with one board. */
export function boardOptionOnBoardFile(options: string): InputError {
  return new InputError(
    [{ code: 'not_applicable', path: '', expected: `an installation file (with boards:) for ${options}`, message: `${options} ${options.includes(' and ') ? 'apply' : 'applies'} to installation files (with boards:), and this is a single board` }],
    'the options do not fit the file',
  );
}
