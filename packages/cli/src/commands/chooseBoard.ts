/** `--board <name>` on an installation file: the board it names, with a clear error listing the boards there are. */
import { InputError } from '@trivar/core';

export function unknownBoardError(unknown: readonly string[], names: readonly string[]): InputError {
  const listed = names.map((x) => JSON.stringify(x)).join(', ');
  return new InputError(
    unknown.map((n) => ({ code: 'unknown_board', path: '', expected: `a board of this installation: ${listed}`, received: JSON.stringify(n), message: `--board: expected a board of this installation: ${listed} (received ${JSON.stringify(n)})` })),
    'the options do not fit the file',
  );
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
    [{ code: 'not_applicable', path: '', expected: `an installation file (with boards:) for ${options}`, message: `${options} apply to installation files (with boards:), and this is a single board` }],
    'the options do not fit the file',
  );
}
