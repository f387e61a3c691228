/**
 * What moving a circuit to another line does to its circuit number. A breaker on another line sits
 * in another position; on a North-American panel the usual numbering (analysis/panelNumbering.ts)
 * ties each number to a line, so the number has to change with the position, and a file rewritten
 * with the move keeps the old one. A multi-pole breaker is read as panelNumbering.ts reads it: one
 * number (its first position, the others below it: n + 2, …) or every position listed ("1,3").
 */
import type { Board } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { circuitPositionsOf, panelPhasesOf, writtenPhases } from '../analysis/panelNumbering.js';

/**
 * `renumber`: the usual numbering puts this number on `implied`, not on the line(s) moved to: the breaker
 * takes a position on the new line and the circuit that position's number.
 * `matches-new-line`: the usual numbering already puts this number on the line(s) moved to (the file had
 * number and line disagreeing): check where the breaker is before moving it.
 * `position-changes`: the numbering is not judged (not a North-American panel, not a circuit number, or
 * positions listed that are not one per pole, stacked — solve warns of those): the breaker still takes
 * another position, whose number or way the chart must show.
 */
export interface MovedCircuitNumber {
  readonly verdict: 'renumber' | 'matches-new-line' | 'position-changes';
  /** The lines the usual numbering gives the breaker's positions, in row order (North-American panels); null where not judged. */
  readonly implied: readonly string[] | null;
  /** Every position the breaker takes: those listed, or the number written and, for a multi-pole breaker, n + 2, …; null where not judged. */
  readonly positions: readonly number[] | null;
}

const NOT_JUDGED: MovedCircuitNumber = { verdict: 'position-changes', implied: null, positions: null };

/**
 * Null where the file gives the circuit no number.
 * @param poles the breaker's poles as the file gives them; default one per line conductor of `to`
 */
export function movedCircuitNumber(board: Board, circuit: string | null, to: ConnectionSpec, poles?: number): MovedCircuitNumber | null {
  if (circuit === null) return null;
  const written = circuitPositionsOf(circuit);
  const lines = writtenPhases(to);
  const phaseCount = board.phases.length;
  if (conventionsOf(board).region !== 'north-america' || written === null || lines === null || (phaseCount !== 2 && phaseCount !== 3)) return NOT_JUDGED;
  const breakerPoles = poles ?? lines.length;
  const first = written[0]!;
  // Listed positions that are not one per pole, stacked in a column, describe no breaker the numbering places.
  if (written.length > 1 && (written.length !== breakerPoles || written.some((n, k) => n !== first + 2 * k))) return NOT_JUDGED;
  const positions = Array.from({ length: breakerPoles }, (_, k) => first + 2 * k);
  const implied = panelPhasesOf(first, breakerPoles, phaseCount);
  const matches = implied.length === lines.length && implied.every((p) => lines.includes(p));
  return { verdict: matches ? 'matches-new-line' : 'renumber', implied, positions };
}
