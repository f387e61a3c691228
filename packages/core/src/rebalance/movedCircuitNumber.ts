/**
 * What moving a circuit to another line does to its circuit number. A breaker on another line sits
 * in another position; on a North-American panel the usual numbering (analysis/panelNumbering.ts)
 * ties each number to a line, so the number has to change with the position, and a file rewritten
 * with the move keeps the old one.
 */
import type { Board } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { circuitNumberOf, panelPhasesOf, writtenPhases } from '../analysis/panelNumbering.js';

/**
 * `renumber`: the usual numbering puts this number on `implied`, not on the line moved to: the breaker
 * takes a position on the new line and the circuit that position's number.
 * `matches-new-line`: the usual numbering already puts this number on the line moved to (the file had
 * number and line disagreeing): check where the breaker is before moving it.
 * `position-changes`: the numbering is not judged (not a North-American panel, or not a plain number):
 * the breaker still takes another position, whose number or way the chart must show.
 */
export interface MovedCircuitNumber {
  readonly verdict: 'renumber' | 'matches-new-line' | 'position-changes';
  /** The lines the usual numbering gives the number (North-American panels); null where not judged. */
  readonly implied: readonly string[] | null;
}

/** Null where the file gives the circuit no number. */
export function movedCircuitNumber(board: Board, circuit: string | null, to: ConnectionSpec): MovedCircuitNumber | null {
  if (circuit === null) return null;
  const number = circuitNumberOf(circuit);
  const lines = writtenPhases(to);
  const phaseCount = board.phases.length;
  if (conventionsOf(board).region !== 'north-america' || number === null || lines === null || (phaseCount !== 2 && phaseCount !== 3))
    return { verdict: 'position-changes', implied: null };
  const implied = panelPhasesOf(number, lines.length, phaseCount);
  const matches = implied.length === lines.length && implied.every((p) => lines.includes(p));
  return { verdict: matches ? 'matches-new-line' : 'renumber', implied };
}
