/**
 * Entry checks of the public functions that take a normalised `Board` or `Installation`, or text.
 * A shape check only: a handful of property reads, so the studies' inner solves (which call each
 * other with models they built themselves) pay nothing worth measuring. What they catch is the
 * wrong kind of argument — a raw spec, `null`, a file name — which would otherwise surface as a
 * TypeError deep inside a solve, or worse, as a silent wrong answer.
 */
import { describeValue, InputError } from '../errors.js';
import type { Board, Installation } from './boardModel.js';

const BOARD_EXPECTED = 'a board from normaliseBoard(parseBoard(...)), not the spec itself';
const INSTALLATION_EXPECTED = 'an installation from normaliseInstallation(parseInstallation(...)).installation, not the spec itself';

export const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The fields every study reads first: enough to tell a normalised board from a spec or anything else. */
export function isBoardModel(value: unknown): value is Board {
  return (
    isObject(value) &&
    Array.isArray(value.phases) &&
    Array.isArray(value.loads) &&
    Array.isArray(value.emf) &&
    typeof value.nominalLineToNeutralV === 'number' &&
    typeof value.frequencyHz === 'number' &&
    isObject(value.sourceImpedance) &&
    isObject(value.lineImpedance)
  );
}

export function isInstallationModel(value: unknown): value is Installation {
  return isObject(value) && isBoardModel(value.main) && Array.isArray(value.subBoards);
}

/** The argument's problem as one issue: "board: expected a board from … (received an object)". */
export function argumentError(argument: string, expected: string, value: unknown, heading: string, wanted: 'normalised' | 'solved' = 'normalised'): InputError {
  // A spec (what parseBoard returns, or a file's data) is the likeliest mistake: say so.
  const received =
    isObject(value) && 'supply' in value
      ? `a spec with supply: ..., not ${wanted}`
      : wanted === 'solved' && isBoardModel(value)
        ? 'a normalised board, not solved'
        : describeValue(value);
  return new InputError([{ code: 'invalid_type', path: argument, expected, received, message: `${argument}: expected ${expected} (received ${received})` }], heading);
}

/** @throws {InputError} naming `argument` when `value` is not a normalised board */
export function assertBoardModel(value: unknown, argument = 'board'): asserts value is Board {
  if (!isBoardModel(value)) throw argumentError(argument, BOARD_EXPECTED, value, `the ${argument} argument is not a normalised board`);
}

/** @throws {InputError} naming `argument` when `value` is not a normalised installation */
export function assertInstallationModel(value: unknown, argument = 'installation'): asserts value is Installation {
  if (!isInstallationModel(value)) throw argumentError(argument, INSTALLATION_EXPECTED, value, `the ${argument} argument is not a normalised installation`);
}

/** @throws {InputError} naming `argument` when `value` is not a string (a file's text, not its name's object or a Buffer) */
export function assertText(value: unknown, argument = 'text'): asserts value is string {
  if (typeof value !== 'string') throw argumentError(argument, 'the text of a file, as a string (read it first, e.g. fs.readFileSync(path, "utf8"))', value, `the ${argument} argument is not text`);
}

/**
 * A profile study's input: the board and the columns planned for it (planColumns/driverColumns),
 * the interval times. @throws {InputError} naming the first part that is not what it should be
 */
export function assertProfileInput(input: unknown): void {
  if (!isObject(input) || !('board' in input)) throw argumentError('input', '{ board, drivers, columns, utcMs, intervalMs } (see planColumns and driverColumns)', input, 'the input argument is not a profile study input');
  assertBoardModel(input.board, 'input.board');
  if (!isObject(input.columns) || typeof input.columns.count !== 'number')
    throw argumentError('input.columns', 'the columns from driverColumns(...)', input.columns, 'the input argument is not a profile study input');
  if (!(input.utcMs instanceof Float64Array)) throw argumentError('input.utcMs', 'a Float64Array of interval start times, ms since 1970 UTC', input.utcMs, 'the input argument is not a profile study input');
}
