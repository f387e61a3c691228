/**
 * The normalised board: SI units, complex impedances, every load broken into
 * two-terminal branches. The solver works on this; equipment sized later
 * (capacitor banks, reactors) is added as further loads of the same shape.
 */
import type { ComplexValue } from '../complex.js';
import type { ConnectionSpec, LoadModelName, SystemKind } from './boardSchema.js';
import type { PhaseId } from './systemTopology.js';
import type { BoardConventions } from './conventions/boardConventions.js';
import type { VoltageLimits } from './conventions/voltageLimits.js';
import type { FeederRouteLengths } from './feederModel.js';

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
  /** True when the file gave kW without pf, so pf 1 was taken (a resistive load, or an exporter at unity PF). */
  readonly pfAssumed?: boolean;
  /** Panel-schedule fields from the file (circuit number, breaker rating, poles), when given. */
  readonly schedule?: CircuitSchedule;
}

export interface CircuitSchedule {
  readonly circuit?: string;
  readonly breakerA?: number;
  readonly poles?: 1 | 2 | 3;
  /** The file's `continuous` (absent: continuous, the cautious reading for a breaker check). */
  readonly continuous?: boolean;
}

export interface Board {
  readonly name: string;
  readonly system: SystemKind;
  readonly phases: readonly PhaseId[];
  /** True when a neutral conductor runs from the source star point to the board. */
  readonly hasNeutral: boolean;
  readonly frequencyHz: number;
  readonly sequence: 'ABC' | 'ACB';
  /** The model's nominal voltages: the source EMF and the loads' ratings are taken at these. */
  readonly nominalLineToNeutralV: number;
  /** Null on a single-phase 2-wire board. */
  readonly nominalLineToLineV: number | null;
  /**
   * The system's nominal voltages as the standards name them (230/400 V where the model's are
   * 230.9/400 V), which limits and "% of nominal" are taken against; absent where they are the
   * model's (nominalVoltages.ts, judgedNominalOf).
   */
  readonly systemNominal?: { readonly lineToNeutralV: number; readonly lineToLineV: number | null };
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
  /** A sub-board no neutral reaches, on a system that has one (SubBoardFeeder.withoutNeutral): `hasNeutral` is then false. */
  readonly withoutNeutral?: true;
  /** The smallest rating given for a line conductor (the weakest line), A. */
  readonly lineRatingA: number | null;
  /** Each line conductor's own rating, A, in the order of `phases` (null where none is given); absent on boards built in code, which read `lineRatingA` for every line (see `lineRatingOf`). */
  readonly lineRatingsA?: readonly (number | null)[];
  readonly neutralRatingA: number | null;
  /** The route lengths of the feeder's conductors, where the file gives them unalike (see feederModel.ts). */
  readonly feederUnequalLengths?: FeederRouteLengths;
  /** Rated kVA of the supply transformer; null when the source is given another way. */
  readonly transformerKVA: number | null;
  readonly loads: readonly BoardLoad[];
  readonly studies: { readonly openNeutral: boolean };
  /** Region, phase labels, voltage limits; absent on boards built in code, which take `conventionsOf(board)`'s defaults. */
  readonly conventions?: BoardConventions;
  /**
   * Unequal source impedances, ohm, one per phase in the order of `phases` (a bank of
   * unequal single-phase units, or the two windings of an open delta); when set, the
   * solve uses these and `sourceImpedance` is their mean, for summaries.
   */
  readonly sourceImpedances?: readonly ComplexValue[];
  /**
   * Impedance between the source star point and its earthed neutral terminal, ohm:
   * (Z0 − Z1)/3, which with Z1 in each phase gives the source the zero-sequence
   * impedance Z0 (a symmetric source's phase matrix, written as a common return).
   */
  readonly sourceStarImpedance?: ComplexValue;
  /**
   * Open-delta supply: the phase at the corner the two windings share (3-wire only).
   * Each other phase has one winding to this corner; `emf` are still the open-circuit
   * phase voltages (only their differences drive the windings).
   */
  readonly openDeltaCorner?: PhaseId;
  /**
   * The single-phase units of a bank or an open delta that give a kVA rating: each carries one line's
   * current (a bank's unit on A-N carries line A; an open delta's unit on A-B, corner B, carries line A).
   */
  readonly sourceUnits?: readonly SourceUnit[];
  /** Unequal feeder impedances per line conductor, ohm, in the order of `phases`; `lineImpedance` is then their mean. */
  readonly lineImpedances?: readonly ComplexValue[];
  /** Set when the board is one board of an installation: a solve covers the whole installation. */
  readonly installation?: InstallationPlace;
}

/** Where a board sits in an installation (see installationModel.ts). */
export interface InstallationPlace {
  readonly installation: Installation;
  /** 0 for the main board, i + 1 for `subBoards[i]`. */
  readonly boardIndex: number;
}

/** A single-phase supply unit with a rating (see `Board.sourceUnits`). */
export interface SourceUnit {
  /** Where it is connected, data keys: `A` (A to the star point, in a bank) or `A-B` (an open delta's winding). */
  readonly winding: string;
  readonly kVA: number;
  /** Its rated voltage: line-to-neutral in a bank, line-to-line in an open delta, V. */
  readonly ratedV: number;
  /** The line whose current flows through it. */
  readonly line: PhaseId;
}

/** A feeder from a parent board to a sub-board: impedance per conductor. */
export interface SubBoardFeeder {
  /** Per line conductor, ohm, in the order of the installation's phases. */
  readonly lineImpedances: readonly ComplexValue[];
  readonly neutralImpedance: ComplexValue;
  /** True when this feeder's neutral conductor is broken (what-if). */
  readonly neutralOpen: boolean;
  /**
   * True where no neutral reaches the board: its feeder, or one upstream, has line conductors only (the
   * rules then allow no load there or beyond that uses a neutral). The board is read as a 3-wire one.
   */
  readonly withoutNeutral?: true;
  /** The smallest rating given for a line conductor, A. */
  readonly lineRatingA: number | null;
  /** Each line conductor's own rating, A, in the order of the installation's phases (null where none is given). */
  readonly lineRatingsA?: readonly (number | null)[];
  readonly neutralRatingA: number | null;
  /** The route lengths of its conductors, where the file gives them unalike. */
  readonly unequalLengths?: FeederRouteLengths;
  /** The cable in words when it came from the cable library (e.g. `4×95 mm² Cu, 40 m`). */
  readonly description: string | null;
}

export interface SubBoard {
  readonly name: string;
  /** Board number of the board feeding it: 0 = main board, i + 1 = `subBoards[i]`. */
  readonly fedFrom: number;
  readonly feeder: SubBoardFeeder;
  readonly loads: readonly BoardLoad[];
  /** The board's own voltage limits (the file's `voltageLimits` on this board); absent where it shares the main board's. */
  readonly voltageLimits?: VoltageLimits;
}

/**
 * A radial installation: the main board (which carries the supply and the service
 * feeder, exactly as a single board does) and the sub-boards fed from it or from
 * each other. A single board is the installation with no sub-boards.
 */
export interface Installation {
  readonly name: string;
  readonly main: Board;
  readonly subBoards: readonly SubBoard[];
  /** The service cable in words when sized from the cable library. */
  readonly serviceFeederDescription?: string | null;
  /** Capacitor banks of the file in service at the fundamental, their parts among their boards' loads; absent: none. */
  readonly banksInService?: readonly BankInService[];
}

/**
 * A capacitor bank listed in the file (an installation's `harmonics.banks`) taken in service at the
 * fundamental: its parts are constant-impedance loads of its board (`origin: 'added'`).
 */
export interface BankInService {
  /** 0 for the main board, i + 1 for `subBoards[i]`. */
  readonly boardIndex: number;
  readonly connection: 'delta' | 'star';
  /** Rated voltage of the capacitor elements, V. */
  readonly ratedV: number;
  /** Three-phase output of each step at rated voltage, kvar (every step, in service or not). */
  readonly stepsKvar: readonly number[];
  /** Step numbers in service, from 1. */
  readonly stepsInService: readonly number[];
  readonly fixedKvar: number;
  /** Detuning reactor p = X_L/X_C, %; 0 for a plain bank. */
  readonly detuningPercent: number;
  /** Index in the board's loads of each part in service (the fixed part first, then the steps in service). */
  readonly loads: readonly number[];
}

/**
 * The rating of line `k` (index into `phases`): its own conductor's where the feeder gives one per line,
 * else the board's line rating. A 16 mm² phase beside two 95 mm² ones is judged against its own 40 A,
 * and the 95 mm² ones against theirs, not against the weakest.
 */
export function lineRatingOf(board: Pick<Board, 'lineRatingA' | 'lineRatingsA'>, k: number): number | null {
  return board.lineRatingsA ? (board.lineRatingsA[k] ?? null) : board.lineRatingA;
}
