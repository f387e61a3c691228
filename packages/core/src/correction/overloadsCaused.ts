/**
 * Overloads equipment causes: the overload warnings a board has with the equipment in that it did not
 * have without it. Used for the equipment's own board (verifyCorrection.ts) and, on an installation,
 * for every board it feeds through (installationEffect.ts).
 */
import type { BoardResult, BoardWarning } from '../analysis/boardResult.js';

/** The board's own overload warnings: a conductor, the supply transformer or one of its units above its rating. */
const OVERLOAD_CODES: ReadonlySet<string> = new Set(['line-over-rating', 'neutral-over-rating', 'transformer-overload', 'source-unit-overload']);

/**
 * Overload warnings the equipped board has that the board without the equipment did not: matched by
 * code and subject (the words with their figures taken out, so "line B carries 87 A" before and
 * "line B carries 93 A" after is the same overload, not a new one).
 */
export function overloadsCaused(before: BoardResult, after: BoardResult): BoardWarning[] {
  const subject = (w: BoardWarning) => `${w.code}:${w.message.replace(/[\d.,]+/g, '#')}`;
  const had = new Set(before.warnings.filter((w) => OVERLOAD_CODES.has(w.code)).map(subject));
  return after.warnings.filter((w) => OVERLOAD_CODES.has(w.code) && !had.has(subject(w)));
}
