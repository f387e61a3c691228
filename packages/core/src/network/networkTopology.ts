/**
 * A board's terminals in the circuit it is solved in (built by installationCircuit.ts).
 *
 * The reference node is the source's earthed neutral terminal (the star point,
 * unless a zero-sequence impedance puts one between them). Each source is folded
 * into its line, so the phase bus is the node its EMF drives (`sourceNode` equals
 * `busNode`). A zero-impedance neutral makes the main board's bar the reference
 * itself, an open one leaves it to float.
 */
import type { ComplexValue } from '../complex.js';
import type { Terminal } from '../board/boardModel.js';

export { REFERENCE } from './circuit.js';

export interface NetworkTopology {
  /** Human names of the unknown nodes, index = node number. */
  readonly nodeNames: readonly string[];
  /** Node of each terminal; `REFERENCE` for the star point. */
  readonly terminalNode: ReadonlyMap<Terminal, number>;
  /** Per phase: the node the EMF drives and the bus node (the same node: sources are folded into their lines). */
  readonly sourceNode: readonly number[];
  readonly busNode: readonly number[];
  /** Admittance of each line (source + feeder) when all are equal and non-zero; else null. */
  readonly lineAdmittance: ComplexValue | null;
  /** Admittance of the neutral conductor; null when it is absent, open, or of zero impedance. */
  readonly neutralAdmittance: ComplexValue | null;
  /** Node of the board neutral bar; `REFERENCE` if tied solidly to the star point, undefined if the board has none. */
  readonly neutralNode: number | undefined;
}

