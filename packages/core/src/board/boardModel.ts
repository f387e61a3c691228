/**
 * The normalised board: SI units, complex impedances, every load broken into
 * two-terminal branches. The solver works on this; equipment sized later
 * (capacitor banks, reactors) is added as further loads of the same shape.
 */
import type { ComplexValue } from '../complex.js';
import type { ConnectionSpec, LoadModelName, SystemKind } from './boardSchema.js';
import type { PhaseId } from './systemTopology.js';

export type { PhaseId } from './systemTopology.js';

/**
 * A point a branch connects to: a phase bus, the board neutral bar, or the
 * private star point of a load (`star:<load index>`).
 */
export type Terminal = PhaseId | 'N' | `star:${number}`;

/** Fractions of constant impedance (z), current (i) and power (p); they sum to 1. */
export interface ZipFractions {
  readonly z: number;
  readonly i: number;
  readonly p: number;
}

/** One two-terminal part of a load. Voltage across it is V(from) − V(to); current flows from → to. */
export interface LoadBranch {
  readonly from: Terminal;
  readonly to: Terminal;
  /** Complex power drawn at the branch's nominal voltage, VA (load convention: P > 0 consumed, Q > 0 lagging). */
  readonly sNominal: ComplexValue;
  /** Nominal voltage across the branch, V. */
  readonly vNominal: number;
  readonly zip: ZipFractions;
}

export interface BoardLoad {
  readonly name: string;
  readonly connection: ConnectionSpec;
  /** How the load depends on voltage, in words (`constant-power`, `zip`...). */
  readonly model: LoadModelName | 'zip';
  readonly branches: readonly LoadBranch[];
  /** Where the load came from: the board file, or equipment a study added. */
  readonly origin: 'board' | 'added';
}

export interface Board {
  readonly name: string;
  readonly system: SystemKind;
  readonly phases: readonly PhaseId[];
  /** True when a neutral conductor runs from the source star point to the board. */
  readonly hasNeutral: boolean;
  readonly frequencyHz: number;
  readonly sequence: 'ABC' | 'ACB';
  readonly nominalLineToNeutralV: number;
  /** Null on a single-phase 2-wire board. */
  readonly nominalLineToLineV: number | null;
  /** Source EMF of each phase to the source star point, V, in the order of `phases`. */
  readonly emf: readonly ComplexValue[];
  /** Source impedance per line, ohm. */
  readonly sourceImpedance: ComplexValue;
  /** Feeder impedance of each line conductor, ohm. */
  readonly lineImpedance: ComplexValue;
  /** Feeder impedance of the neutral conductor, ohm. */
  readonly neutralImpedance: ComplexValue;
  /** True when the neutral conductor is broken (what-if). */
  readonly neutralOpen: boolean;
  readonly lineRatingA: number | null;
  readonly neutralRatingA: number | null;
  /** Rated kVA of the supply transformer; null when the source is given another way. */
  readonly transformerKVA: number | null;
  readonly loads: readonly BoardLoad[];
  readonly studies: { readonly openNeutral: boolean };
}
