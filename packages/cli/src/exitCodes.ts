/** Exit codes of the trivar CLI, decided in one place. */
import { collapseError, InputError, NumericalError, type BoardResult, type InstallationResult } from '@trivar/core';
import { escapeControlCharacters } from './format/terminalText.js';

export const EXIT = {
  ok: 0,
  /** A bug in trivar: the message says so. */
  internal: 1,
  /** The command line itself is wrong (unknown option, missing argument, a --board name the installation does not have). */
  usage: 2,
  /** The board file cannot be read, is not a valid board, or is the wrong kind for the study (an installation to a hand check). */
  input: 3,
  /** The board is valid but has no solution (singular network, loads beyond what the supply can deliver). */
  numerical: 4,
  /** `trivar correct` ran, but the target cannot be met with the allowed equipment, or what meets it fails the harmonic check (the report says why). */
  targetNotMet: 5,
  /** The output could not be written (a full disk, a closed file); a reader closing a pipe early is not an error (exit 0). */
  output: 6,
} as const;

/** A problem with the command line or the files it names. */
export class UsageError extends Error {
  override readonly name = 'UsageError';
  readonly exitCode: number;
  constructor(message: string, exitCode: number = EXIT.usage) {
    super(message);
    this.exitCode = exitCode;
  }
}

/** A solved board whose operating point is a collapse: the core's NumericalError (exit 4, as for a board with no solution). */
export { collapseError } from '@trivar/core';

/**
 * The collapse of a solved board, or of any board of a solved installation (each finding named with its
 * board): the error a command raises after writing its output, as `trivar solve` does; null when none collapsed.
 */
export function collapseOf(result: BoardResult | InstallationResult): NumericalError | null {
  const findings =
    'boards' in result
      ? result.boards.flatMap((b) => (b.result.operatingPoint.collapsed ? b.result.operatingPoint.findings.map((f) => `${b.name}: ${f}`) : []))
      : result.operatingPoint.collapsed
        ? result.operatingPoint.findings
        : [];
  return findings.length ? collapseError({ operatingPoint: { findings } }) : null;
}

export function exitCodeFor(error: unknown): number {
  if (error instanceof InputError) return EXIT.input;
  if (error instanceof NumericalError) return EXIT.numerical;
  if (error instanceof UsageError) return error.exitCode;
  return EXIT.internal;
}

/** A file with more problems than this is most likely not a board at all. */
const MAX_ISSUES_SHOWN = 50;

/** The message for stderr; user text inside it (names, keys, paths) has its control characters escaped. */
export function messageFor(error: unknown): string {
  if (error instanceof InputError) {
    const shown = error.issues.slice(0, MAX_ISSUES_SHOWN).map((i) => `  - ${escapeControlCharacters(i.message)}`);
    const more = error.issues.length - shown.length;
    if (more > 0) shown.push(`  (${more} more problem${more === 1 ? '' : 's'} not shown: is this a board file?)`);
    return `error: ${error.heading}:\n${shown.join('\n')}`;
  }
  // A collapse has a solution, just not a viable one: its message says so itself.
  if (error instanceof NumericalError && error.reason === 'collapsed') return `error: ${escapeControlCharacters(error.message)}`;
  if (error instanceof NumericalError) return `error: no solution: ${escapeControlCharacters(error.message)}`;
  if (error instanceof UsageError) return `error: ${escapeControlCharacters(error.message)}`;
  const detail = error instanceof Error ? (error.stack ?? error.message) : String(error);
  return `internal error (a bug in trivar, please report it with the board file):\n${detail}`;
}

/**
 * A profile some of whose intervals collapsed (a phase below 50 % of nominal: the state `trivar solve`
 * refuses with exit 4), before or with the bank, on any board: raised after the report is written, as
 * `trivar solve` does, so a script does not take the year's figures as sound. Null when none did.
 */
export function profileCollapseOf(summaries: readonly ({ readonly hoursCollapsed: number } | null | undefined)[], where: string): NumericalError | null {
  const hours = Math.max(0, ...summaries.map((s) => s?.hoursCollapsed ?? 0));
  if (!(hours > 0)) return null;
  return new NumericalError(
    'collapsed',
    `the supply cannot carry the load in some intervals${where}: a phase below 50 % of nominal for ${+hours.toPrecision(4)} h (the report above says which figures that affects); trivar solve refuses the same state`,
  );
}
