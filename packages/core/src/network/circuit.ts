/**
 * A circuit as the compiled solver sees it: numbered nodes (reference = the
 * earthed source star point), fixed two-terminal admittances (source windings,
 * feeders, neutrals), EMFs behind admittances, and load branches whose
 * admittance follows their voltage. Boards and installations are both written
 * in this form (see boardCircuit.ts, installationCircuit.ts); nothing else
 * reaches the solver.
 */
import type { ComplexValue } from '../complex.js';
import type { ZipFractions } from '../board/boardModel.js';

/** The reference node (earthed source star point). */
export const REFERENCE = -1;

/** A fixed admittance between two nodes. */
export interface CircuitElement {
  readonly from: number;
  readonly to: number;
  readonly admittance: ComplexValue;
}

/**
 * An EMF in series with an admittance: V(plus) − V(minus) = emf − I/admittance,
 * where I is the current leaving `plus` into the circuit. A null admittance is
 * an ideal source; its `minus` must be the reference or the `plus` of an ideal
 * source listed earlier, so that its node voltage is known outright.
 */
export interface CircuitSource {
  readonly plus: number;
  readonly minus: number;
  readonly emf: ComplexValue;
  readonly admittance: ComplexValue | null;
}

/** A load branch: draws `sNominal` at `vNominal` across from → to, scaled by its ZIP fractions. */
export interface CircuitBranch {
  readonly from: number;
  readonly to: number;
  readonly sNominal: ComplexValue;
  readonly vNominal: number;
  readonly zip: ZipFractions;
}

export interface Circuit {
  /** Human names of the nodes, index = node number (trade words, for error messages). */
  readonly nodeNames: readonly string[];
  readonly elements: readonly CircuitElement[];
  readonly sources: readonly CircuitSource[];
  readonly branches: readonly CircuitBranch[];
  /** Voltage base for convergence checks, V. */
  readonly voltageBase: number;
}
