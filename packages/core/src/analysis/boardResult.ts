/**
 * The result of solving a board: plain JSON-serialisable data, the same for
 * the library and `trivar solve --json`.
 *
 * Sign conventions: load convention (P > 0 consumed, Q > 0 lagging/inductive);
 * line currents flow from the source into the board; the neutral current flows
 * from the board back to the source, so ΣI_line = I_N. Angles in degrees,
 * referred to the phase-A source EMF.
 */
import type { Phasor } from '../complex.js';
import type { PhaseId } from '../board/boardModel.js';
import type { SequenceSet } from './symmetricalComponents.js';
import type { BoardPowerDefinitions } from './powerDefinitions.js';
import type { BoardConventions } from '../board/conventions/boardConventions.js';
import type { VoltageCheck } from './voltageCheck.js';

/** `none` when no power flows (no PF). */
export type PowerFactorSense = 'lagging' | 'leading' | 'unity' | 'none';

export interface PowerReading {
  readonly kW: number;
  readonly kvar: number;
  readonly kVA: number;
  /** Displacement power factor |P|/S; null when no power flows (S = 0 after the noise floor): a PF is not defined then. */
  readonly pf: number | null;
  readonly sense: PowerFactorSense;
}

export interface PhaseReading extends PowerReading {
  readonly phase: PhaseId;
  /** Line-to-neutral voltage at the board: to the neutral bar (4-wire), or to the centroid of the line voltages (3-wire virtual neutral), V. */
  readonly voltage: Phasor;
  readonly voltagePercent: number;
  /** Line current, source → board, A. */
  readonly current: Phasor;
  /** Line current as % of the line conductor rating; null without a rating. */
  readonly loadingPercent: number | null;
  /**
   * Voltage drop, % of nominal: |open-circuit EMF| − |`voltage`|, the voltage line-to-neutral
   * loads see (to the neutral bar on a 4-wire board, so the neutral conductor's drop is
   * included; to the virtual neutral on a 3-wire board). The one drop figure trivar reports.
   */
  readonly voltageDropPercent: number;
}

export interface LineToLineReading {
  readonly pair: `${PhaseId}-${PhaseId}`;
  readonly voltage: Phasor;
  readonly voltagePercent: number;
}

export interface NeutralReading {
  /** Board → source, A. Zero when the neutral is open. */
  readonly current: Phasor;
  /** Voltage of the board neutral bar to the source star point (neutral-point displacement), V. */
  readonly barVoltage: Phasor | null;
  readonly ratingA: number | null;
  readonly loadingPercent: number | null;
  /** Neutral current as % of the largest line current. */
  readonly percentOfLargestLine: number;
}

export interface BranchReading {
  readonly from: string;
  readonly to: string;
  readonly voltage: Phasor;
  readonly voltagePercent: number;
  readonly current: Phasor;
  readonly kW: number;
  readonly kvar: number;
}

export interface LoadReading extends PowerReading {
  readonly name: string;
  readonly connection: string;
  readonly model: string;
  readonly origin: 'board' | 'added';
  readonly branches: readonly BranchReading[];
  /** Largest current the load draws from any one line, A (the line current of a three-phase load). */
  readonly currentA: number;
  /** Floating star point: its voltage to the centroid of the line voltages, V. */
  readonly starPointShift: Phasor | null;
  /** Circuit number or way from the file (`circuit`); null when not given. */
  readonly circuit: string | null;
  /** Breaker or fuse rating from the file, A; null when not given. */
  readonly breakerA: number | null;
  /** Breaker poles from the file (checked against the connection); null when not given. */
  readonly poles: 1 | 2 | 3 | null;
  /** Whether the load is taken to run for 3 h or more (the file's `continuous`, default true): on a North-American board its breaker is judged at 80 %. */
  readonly continuous: boolean;
  readonly energised: boolean;
  /** Present when the board file gave kW without pf: pf 1 (resistive) was taken. */
  readonly pfAssumed?: true;
}

export interface UnbalanceReading {
  /** IEC voltage unbalance factor |V2|/|V1|, %. */
  readonly voltageFactorPercent: number;
  /** |V0|/|V1|, %. */
  readonly zeroSequenceVoltagePercent: number;
  /** NEMA MG 1 line-voltage unbalance rate, %. */
  readonly lineVoltageRatePercent: number;
  /** IEEE phase-voltage unbalance rate (line-to-neutral magnitudes), %. */
  readonly phaseVoltageRatePercent: number;
  /** |I2|/|I1|, %. */
  readonly currentNegativePercent: number;
  /** |I0|/|I1|, %. */
  readonly currentZeroPercent: number;
  /** Largest deviation of a line-current magnitude from their average, %. */
  readonly currentDeviationPercent: number;
  /**
   * Derating factor for three-phase induction motors at this line-voltage
   * unbalance (NEMA MG 1 Figure 14-1); null above 5 %, where operation is not recommended.
   */
  readonly motorDeratingFactor: number | null;
}

/** Losses in what feeds the board: source and feeder on a main or single board; on a sub-board, its own feeder only (sourceKW 0). */
export interface LossReading {
  readonly sourceKW: number;
  readonly lineFeederKW: number;
  readonly neutralKW: number;
  readonly totalKW: number;
  /** Reactive power absorbed by source and feeder reactances, kvar. */
  readonly totalKvar: number;
}

export interface BoardWarning {
  readonly code: string;
  readonly message: string;
  readonly value: number;
  readonly threshold: number;
}

export interface OpenNeutralLoadReading {
  /** The circuit's name; for a circuit of a board fed from this one, followed by that board's name in brackets. */
  readonly name: string;
  /** For a circuit of a board fed (directly or further) from this one, which shares the broken neutral: that board. */
  readonly board?: string;
  readonly phase: PhaseId;
  readonly voltage: number;
  readonly voltagePercent: number;
  readonly flag: 'over' | 'under' | 'ok';
  /** True when this load's constant-current/constant-power part is below the low-voltage threshold, so it is taken as an impedance. */
  readonly belowLowVoltageRule: boolean;
}

/** One solution of the board with its neutral open: what each line-to-neutral load sees. */
export interface OpenNeutralState {
  /** Voltage of the floating neutral bar to the source star point, V. */
  readonly barVoltage: Phasor | null;
  readonly loads: readonly OpenNeutralLoadReading[];
  readonly highestPercent: number;
  readonly lowestPercent: number;
}

/** Following the board from intact to open neutral with the low-voltage rule switched off (constant power all the way down). */
export interface OpenNeutralWithoutRule {
  /** True when the state followed from the intact board exists with the neutral open. */
  readonly reachedOpen: boolean;
  /** Neutral fault resistance at which the followed state ceased to exist (voltage collapse), ohm. */
  readonly collapseAtOhms: number | null;
  /** The open-neutral state when reached, else the last state followed. */
  readonly state: OpenNeutralState;
}

export interface OpenNeutralStudy {
  readonly applicable: boolean;
  /** Why not, when not applicable. */
  readonly note: string | null;
  /** Voltage of the floating neutral bar to the source star point, V (the state the board reaches). */
  readonly barVoltage: Phasor | null;
  /** What each line-to-neutral load sees in the state the board reaches. */
  readonly loads: readonly OpenNeutralLoadReading[];
  readonly highestPercent: number | null;
  readonly lowestPercent: number | null;
  readonly cautions: readonly string[];
  /**
   * True when the state above was followed continuously from the intact board
   * as a resistance in the neutral rose to open; false when that state ceased
   * to exist on the way, and the state above is the worst one found instead.
   */
  readonly reachedFromIntact: boolean;
  /** Neutral fault resistance at which the state followed from the intact board ceased to exist, ohm; null when it did not. */
  readonly collapseAtOhms: number | null;
  /** The same board with every load taken as a constant impedance (its impedance at nominal voltage). */
  readonly impedanceModel: OpenNeutralState | null;
  /** Other solutions of the same open-neutral equations, not reached from the intact board. */
  readonly otherStates: readonly OpenNeutralState[];
  /** The follow repeated with constant power held all the way down (no low-voltage rule); null when no load has a constant-current/power part. */
  readonly withoutLowVoltageRule: OpenNeutralWithoutRule | null;
  /** A load's voltage differs by more than `OPEN_NEUTRAL_LIMITS.modelDependencePercent` of nominal between the state reached and the impedance model. */
  readonly dependsOnLoadModel: boolean;
  /** The open-neutral equations have more than one solution. */
  readonly multipleStates: boolean;
  /** The state reached rests on the low-voltage rule: loads sit below it, and without it the result differs. */
  readonly lowVoltageRuleDecides: boolean;
  /** The flags above in words, most important first. */
  readonly findings: readonly string[];
}

/** The supply transformer's loading (board files with `supply.transformer`). */
export interface TransformerReading {
  readonly ratedKVA: number;
  /** Apparent power at its terminals, Σ|V||I| over the lines, kVA. */
  readonly kVA: number;
  /** Rated line current from kVA and nominal voltage, A. */
  readonly ratedCurrentA: number;
  readonly largestLineCurrentA: number;
  /** Most loaded line against the rated current, %: above 100 the transformer is overloaded. */
  readonly loadingPercent: number;
}

/** A rated single-phase unit of a bank or an open delta, loaded by the line current through it. */
export interface SourceUnitReading {
  /** Where it is connected, data keys: `A` (to the star point, in a bank) or `A-B` (an open delta's winding). */
  readonly winding: string;
  readonly ratedKVA: number;
  /** The line current through it, A. */
  readonly currentA: number;
  /** Rated current: kVA over its rated voltage (line-to-neutral in a bank, line-to-line in an open delta), A. */
  readonly ratedCurrentA: number;
  /** Its current against the rated current, %: above 100 the unit is overloaded. */
  readonly loadingPercent: number;
}

/** A sub-board's incomer: the feeder from the board that feeds it, loaded by this board and every board beyond it. */
export interface IncomerReading {
  /** The feeding board's name. */
  readonly fedFrom: string;
  /** Apparent power through the incomer at this board, Σ|V||I| over the lines, kVA. */
  readonly kVA: number;
  readonly largestLineCurrentA: number;
  /** The feeder's line rating, A (with a rating per line, the rating of the line most loaded against its own); null where the file gives none. */
  readonly ratingA: number | null;
  /** Most loaded line against its rating, %; null without a rating. */
  readonly loadingPercent: number | null;
}

/** Whether the solved point is one the supply can hold (see `SUPPLY_LIMITS`). */
export interface OperatingPoint {
  /** True when the supply cannot carry the loads: the figures describe a collapse, not a working board. */
  readonly collapsed: boolean;
  /** Why, in words; empty when not collapsed. */
  readonly findings: readonly string[];
}

export interface BoardResult {
  readonly board: {
    readonly name: string;
    readonly system: string;
    readonly sequence: 'ABC' | 'ACB';
    readonly frequencyHz: number;
    /** The system's nominal voltages as the standards name them (230/400 V): every voltage percentage and limit is taken against these. */
    readonly nominalLineToNeutralV: number;
    readonly nominalLineToLineV: number | null;
    /** Present where the balanced source is not exactly the system nominal: a 400 V source is 230.9 V to neutral, judged at 230 V. */
    readonly sourceNominal?: { readonly lineToNeutralV: number; readonly lineToLineV: number | null };
    /**
     * Present where the source EMFs are not the balanced set at the model's nominal voltage (the file's
     * `supply.emf` per phase): each phase's open-circuit EMF to the source star point, as entered.
     */
    readonly sourceEmf?: readonly { readonly phase: PhaseId; readonly magnitude: number; readonly angleDeg: number }[];
    readonly neutralOpen: boolean;
    /** Present where no neutral reaches this board of a system that has one: its feeder, or one upstream, has line conductors only. */
    readonly withoutNeutral?: true;
    /** Present on the main board when the supply is ideal (no transformer, impedance, bank or open delta: zero source impedance): its terminals hold the EMF whatever the load, and it has no windings to lose power in. */
    readonly idealSource?: true;
    /**
     * Present on every board the file's supply transformer feeds (supply.transformer, or single-phase units rated
     * in kVA): the words naming the source's neutral point name the transformer's (its center tap on split-phase).
     */
    readonly suppliedByTransformer?: true;
  };
  /**
   * Region, phase labels and voltage limits the report follows. Keys in this result stay
   * A/B/C whatever the naming; `conventions.phaseLabels` gives each phase's label.
   */
  readonly conventions: BoardConventions;
  /**
   * How the voltage-dependent load iteration settled: `iterations`, the solves it took, and `lastChangePercent`,
   * the largest move of a node voltage in its last solve, % of nominal voltage. The iteration stops on the error
   * that move leaves, not on the move: the move times the rate moves shrink (on the Newton path about
   * move² / previous move), within the tolerance (1e-10 of nominal by default, SolveOptions.tolerance). So a
   * settled solve may read a last move far above 1e-8 %: 4.5e-7 % on a 3 kW shed heater, whose state after that
   * move is within the tolerance.
   */
  readonly solve: { readonly iterations: number; readonly lastChangePercent: number };
  readonly phases: readonly PhaseReading[];
  readonly lineToLine: readonly LineToLineReading[];
  readonly neutral: NeutralReading | null;
  readonly loads: readonly LoadReading[];
  /** Sum of the loads. */
  readonly totals: PowerReading;
  /**
   * Delivered by the source EMFs (= totals + losses). On a sub-board of an installation:
   * what its feeder takes from the board feeding it (= totals + its feeder's losses +
   * what it passes on to the boards it feeds).
   */
  readonly source: { readonly kW: number; readonly kvar: number };
  readonly losses: LossReading;
  readonly sequences: { readonly voltage: SequenceSet<Phasor>; readonly current: SequenceSet<Phasor> } | null;
  readonly unbalance: UnbalanceReading | null;
  readonly powerFactor: BoardPowerDefinitions;
  /** Board and load voltages against `conventions.voltageLimits`; agrees with the voltage warnings. */
  readonly voltageCheck: VoltageCheck;
  readonly warnings: readonly BoardWarning[];
  readonly cautions: readonly string[];
  readonly openNeutral: OpenNeutralStudy | null;
  /** Supply transformer loading; null without a transformer, and on a sub-board (see `incomer`). */
  readonly transformer: TransformerReading | null;
  /** Loading of the supply's rated single-phase units (a bank or an open delta given in kVA); null otherwise, and on a sub-board. */
  readonly sourceUnits: readonly SourceUnitReading[] | null;
  /** A sub-board of an installation: its incomer's loading; null on a main (or single) board. */
  readonly incomer: IncomerReading | null;
  readonly operatingPoint: OperatingPoint;
}
