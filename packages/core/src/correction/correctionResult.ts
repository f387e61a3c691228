/**
 * What the correction study returns: plain JSON-serialisable data, the same
 * for the library and a CLI's `--json`. Reactive values follow the compensator
 * convention of the methods notes: kvar > 0 is capacitive, < 0 inductive;
 * susceptance B > 0 is a capacitor. Line powers keep the load convention
 * (Q > 0 lagging).
 */
import type { Phasor } from '../complex.js';
import type { Board, PhaseId } from '../board/boardModel.js';
import type { BoardResult, PowerFactorSense } from '../analysis/boardResult.js';
import type { Arrangement, Practice } from './correctionSpec.js';
import type { EquipmentGroup } from './equipment.js';
import type { ResolvedTarget, TargetCheck } from './correctionTarget.js';
import type { BalanceCheck, BalanceTarget } from './balanceTarget.js';

export interface CorrectionWarning {
  readonly code: string;
  readonly message: string;
  /** Input field the warning is about (`catalogue[2].ratedV`), or null. */
  readonly path: string | null;
  readonly value: number | null;
  readonly threshold: number | null;
}

/** One element of a bank or compensator, as sized or as built. */
export interface BranchSizing {
  /** `A-N`, `A-B`, `A-star`... */
  readonly branch: string;
  readonly element: 'capacitor' | 'reactor' | 'none';
  readonly susceptanceS: number;
  /** Output at the nominal element voltage, kvar (+ capacitive, − inductive). */
  readonly kvarAtNominalV: number;
  /** Solved voltage across the element with the equipment in place, V. */
  readonly appliedV: number;
  /** Output at the solved voltage, kvar (+ capacitive, − inductive). */
  readonly kvarAtAppliedV: number;
  readonly currentA: number;
  readonly capacitanceUF: number | null;
  readonly inductanceMH: number | null;
  /**
   * The most this branch can take before a line passes its upper bound
   * (leads, or goes past the upper lagging PF), S — the top of the window units
   * are chosen in. Null where it is not computed.
   */
  readonly limitSusceptanceS: number | null;
}

/** A line's current split into the part in phase with its voltage and the part in quadrature. */
export interface LineComparison {
  readonly phase: PhaseId;
  readonly currentA: BeforeAfter;
  /** P/|V|: a delta branch moves active current between its two lines. */
  readonly activeCurrentA: BeforeAfter;
  /** Q/|V| (+ lagging). */
  readonly reactiveCurrentA: BeforeAfter;
  /** null on a side where the line carries no current: a PF is not defined there. */
  readonly pf: PfBeforeAfter;
  readonly sense: { readonly before: PowerFactorSense; readonly after: PowerFactorSense };
  readonly voltageDropPercent: BeforeAfter;
}

/** A power factor before and after; null where no current flows. */
export interface PfBeforeAfter {
  readonly before: number | null;
  readonly after: number | null;
  readonly change: number | null;
}

export interface BeforeAfter {
  readonly before: number;
  readonly after: number;
  /** after − before */
  readonly change: number;
}

export interface SizedEquipment {
  readonly frequencyHz: number;
  /** In the order of the equipment's branches. */
  readonly branches: readonly BranchSizing[];
  readonly equipment: readonly EquipmentGroup[];
}

export type SizingStatus = 'meets-target' | 'already-meets-target' | 'infeasible';

export interface BankSizing extends SizedEquipment {
  readonly arrangement: 'star-bank' | 'delta-bank';
  /** How the bank was sized, in words. */
  readonly method: string;
  readonly target: ResolvedTarget;
  readonly status: SizingStatus;
  /** Why it is infeasible (empty otherwise). */
  readonly reasons: readonly string[];
  readonly totalKvarAtNominalV: number;
  /** The corrected board judged against the target. */
  readonly check: TargetCheck;
  readonly lines: readonly LineComparison[];
  /** Floating star point of the bank to the centroid of the line voltages, V; null when tied to the neutral. */
  readonly starPointShift: Phasor | null;
  /**
   * Per-line targets on a three-phase bank: the kvar per branch (at nominal voltage) an equal bank needs
   * to meet every line (null: no equal bank does before a line passes its bound), and the most it may have.
   */
  readonly equalShare: { readonly minKvar: number | null; readonly limitKvar: number } | null;
  /**
   * Per-line targets, where some branch's own window is empty (its limit, the least-kvar bank that puts
   * every line at its bound, below its requirement across the capacitance tolerance: a delta branch
   * serves two lines): per branch a window of design-state output at nominal voltage, kvar, such that
   * any state with every branch inside its window meets every target at −tol and passes no bound at
   * +tol (to first order about the sizing; see roundingWindows.ts), in sets of several widths. Units
   * are rounded in these instead. Null where every branch's own window holds, or none was found.
   */
  readonly roundingWindows: {
    /** Narrowest first (least kvar at the low ends); the unit choice tries each and keeps the best build. */
    readonly sets: readonly { readonly lowKvar: readonly number[]; readonly highKvar: readonly number[] }[];
    readonly tolerance: { readonly minus: number; readonly plus: number };
  } | null;
  /** Board solves the sizing used. */
  readonly solves: number;
}

export interface CompensatorResidual {
  /** |I2|/|I1| after, %. */
  readonly negativeSequenceCurrentPercent: number;
  /** |I0|/|I1| after, %. */
  readonly zeroSequenceCurrentPercent: number;
  readonly neutralCurrentA: number | null;
  readonly positiveSequencePf: number | null;
  readonly positiveSequenceKvar: number | null;
  readonly effectivePf: number | null;
  readonly leadingLines: readonly PhaseId[];
}

export interface CompensatorSolution extends SizedEquipment {
  readonly kind: 'ideal' | 'capacitor-only';
  /** Branches that need a reactor (always empty for capacitor-only). */
  readonly reactorBranches: readonly string[];
  /** True when the solution balances exactly and meets Q1 (objective ≈ 0). */
  readonly exact: boolean;
  /** Value of the weighted objective, per unit (0 for an exact solution). */
  readonly objective: number;
  readonly residual: CompensatorResidual;
  readonly check: TargetCheck;
  readonly lines: readonly LineComparison[];
}

/** A target a compensator is judged on. */
export type TargetName = 'power-factor' | 'balance';

/** What a compensator state reads as on the board. */
export interface CompensatorReading {
  readonly positiveSequencePf: number | null;
  /** |I2|/|I1|, %. */
  readonly negativeSequenceCurrentPercent: number;
  /** |I_N|/|I1|, %; null on a board without a neutral. */
  readonly neutralPercent: number | null;
}

/**
 * A branch of the exact ideal compensator below CORRECTION_DEFAULTS.negligibleBranchFraction of its
 * total kvar: left out when the board re-solved without it, the other branches sized again around it,
 * still meets every target it met with it; otherwise kept because a target needs it.
 */
export interface SmallBranch {
  readonly branch: string;
  /** Its output in the exact solution at nominal voltage, kvar (+ capacitor, − reactor); after others were left out, as sized again around them. */
  readonly kvarAtNominalV: number;
  /** True when it fell below the floor only as the other branches were sized again around ones left out before it. */
  readonly afterOthersLeftOut: boolean;
  readonly leftOut: boolean;
  /** Leaving it out, as re-solved: the board with it and without it, how far the other branches moved, the targets then missed. */
  readonly effect: {
    readonly with: CompensatorReading;
    readonly without: CompensatorReading;
    /** The largest change of another branch's output, kvar at nominal voltage. */
    readonly largestResizeKvar: number;
    /** Targets met with it and missed without it (empty when it is left out). */
    readonly missedWithout: readonly TargetName[];
  };
}

/** A branch the capacitor-only programme gave a capacitor that the compensator does without (`fewerCapacitorBranches`). */
export interface SparedBranch {
  readonly branch: string;
  /** Its output before it was left out, kvar at nominal voltage. */
  readonly kvarAtNominalV: number;
  /** The board with it and, the other branches solved again, without it. */
  readonly effect: { readonly with: CompensatorReading; readonly without: CompensatorReading };
}

export interface CompensatorSizing {
  readonly arrangement: 'balancing-compensator';
  readonly branchesUsed: 'delta' | 'delta-and-star';
  readonly target: ResolvedTarget;
  /** Positive-sequence reactive power aimed at, kvar (load convention, + lagging). */
  readonly q1TargetKvar: number;
  /** What the capacitor-only solution minimises, in words. */
  readonly objectiveStatement: string;
  readonly weights: { readonly negativeSequence: number; readonly zeroSequence: number; readonly reactive: number };
  /** The unbalance the compensator must bring down to, and where the board is before and with the capacitor-only solution. */
  readonly balance: BalanceTarget;
  readonly balanceBefore: BalanceCheck;
  readonly balanceAfter: BalanceCheck;
  /** Which solution is built: the capacitor-only one, or (reactors allowed, capacitors not enough) the ideal one. */
  readonly recommended: 'capacitor-only' | 'ideal';
  /** The ideal solution as built: its negligible branches left out where no target needs them (see `smallBranches`). */
  readonly ideal: CompensatorSolution;
  /** Branches of the exact ideal solution too small to build, and whether they were left out. */
  readonly smallBranches: readonly SmallBranch[];
  readonly capacitorOnly: CompensatorSolution;
  /**
   * The capacitor-only compensator on fewer branches: the programme spreads output over every branch that
   * helps, and these branches can go with every target still met and the balance no more than
   * CORRECTION_DEFAULTS.fewerBranchesAllowancePercent of |I1| worse (in the order they were left out).
   * A correction study builds both from units and keeps the cheaper. Null when every branch is needed.
   */
  readonly fewerBranches: { readonly solution: CompensatorSolution; readonly spared: readonly SparedBranch[] } | null;
  readonly status: SizingStatus;
  readonly reasons: readonly string[];
  readonly warnings: readonly CorrectionWarning[];
  readonly solves: number;
}

export interface SelectedUnit {
  readonly name: string;
  readonly kind: 'three-phase' | 'single-phase';
  /** Nameplate of the whole unit, kvar. */
  readonly ratedKvar: number;
  /** Rated voltage, V (line-to-line for a three-phase unit). */
  readonly ratedV: number;
  readonly ratedHz: number;
  /** `typical`: from a built-in typical catalogue, not a vendor's. */
  readonly source: 'catalogue' | 'typical';
  /** Index in the user catalogue, or null for a typical unit. */
  readonly catalogueIndex: number | null;
  /** Capacitance of one element (a three-phase unit has three), µF. */
  readonly elementCapacitanceUF: number;
  /** Share of the nameplate the unit delivers at the lowest applied voltage it sees and the board frequency. */
  readonly deliveredFraction: number;
}

/**
 * One step of a bank as built: a group of units switched together by one
 * controller output (or the fixed part, always connected). Plain data that a
 * time-series study can switch step by step.
 */
export interface BankStep {
  /** Controller output (1-based); null for the fixed part. */
  readonly output: number | null;
  /** fixed: always on; balanced: equal on every branch of a three-phase set; trim: one branch; single: a lone branch of a split- or single-phase board. */
  readonly part: 'fixed' | 'balanced' | 'trim' | 'single';
  /** three-phase: balanced over three branches; single-phase: one branch. */
  readonly kind: 'three-phase' | 'single-phase';
  /** Branches the step adds capacitance to (`A-B`, `A-N`, `A-star`…). */
  readonly branches: readonly string[];
  readonly unit: SelectedUnit;
  /** Units in the step. */
  readonly units: number;
  readonly nameplateKvar: number;
  /** Output at the nominal voltage across its branches, kvar (the C/k basis). */
  readonly kvarAtNominalV: number;
  /** Output at the solved design-load voltage, kvar. */
  readonly deliveredKvar: number;
  /** Capacitance the step adds to each of its branches, µF. */
  readonly capacitancePerBranchUF: number;
  /**
   * Detuning factor p of a series reactor, 0 for a plain step. A detuned step
   * gives Q_r·(U/U_r)²/(1 − p); every output figure here already includes it.
   */
  readonly detuningFactor: number;
  /** C/k of this step for the controller's CT, A on the secondary. */
  readonly responseThresholdA: number;
  /**
   * How that C/k is read: three-phase (a balanced step), single-phase (a step to the neutral, or across a
   * split-phase board's two lines: its whole current is reactive in its line), line-pair (a step across two
   * lines of a three-phase board: √3/2 of its branch current is reactive in each of the two lines, read
   * against the line's voltage to the neutral).
   */
  readonly thresholdBasis: 'three-phase' | 'single-phase' | 'line-pair';
  readonly onAtDesign: boolean;
}

/**
 * Where the controller's CT goes and the current it must carry there: the largest line current at that
 * point before the equipment, with every step in, or in the worst state the switched steps can sit in,
 * whichever is largest (adding capacitors can raise a line's current: a line taken past unity, or a delta
 * branch moving current between its lines; a fixed reactor with the capacitor steps out, or trim steps on
 * different branches, can raise it past both ends: switchedStepStates.ts).
 */
export interface CtBasis {
  /** `board`: the incomer of the board the equipment is on; `metering-point`: where `target.measuredAt` puts the target. */
  readonly place: 'board' | 'metering-point';
  /** That board's name, or `origin`; null for a selection made on its own (selectBankUnits without a board). */
  readonly point: string | null;
  /** Largest line current there without and with the equipment, A; null where the caller gave the figure (`lineCurrentA`). */
  readonly largestLineCurrentA: { readonly before: number; readonly after: number } | null;
  /** What the `after` figure is of: the board re-solved with the units as built, or the continuous sizing. */
  readonly afterFrom: 'as-built' | 'as-sized' | null;
  /**
   * The worst state of the switched steps there other than every step in, re-solved; null where there is
   * none to add (no switched step, or a single one and no fixed part), or the caller gave the figure.
   */
  readonly stepState: StepStateCurrent | null;
  /**
   * The capacitance tolerance end the CT's after and step-state figures are read at: the one that gives the larger
   * current there. |I| of a line is convex in the capacitance, so an end bounds every capacitance between; with load
   * current at the CT the high end is not always the worse (capacitors taking a lagging line past unity draw more
   * the more they are). Null where the caller gave the figure or the reading was at nominal capacitance only
   * (a selection without a board). `stepState` is the worst state at that end.
   */
  readonly capacitance: CtCapacitanceEnd | null;
  /** Which figure the CT is chosen on and checked against: the largest of them, or the one given. */
  readonly sizedOn: 'before' | 'after' | 'step-state' | 'given';
  /** That figure, A. */
  readonly currentA: number;
  /** Where the CT goes, in words ("the origin of the installation (…), where the target is measured"). */
  readonly placeWords: string;
  /** The figure in words ("112.7 A, the largest line current there before correction (95.3 A after)"). */
  readonly currentWords: string;
}

/** One state the controller can put the bank in, and its supply resonance (stepStateResonance.ts). */
export interface StepStateOrders {
  /** Controller outputs switched in and out (the fixed part, if any, is always in). */
  readonly outputsIn: readonly number[];
  readonly outputsOut: readonly number[];
  /** Other combinations of outputs in with the same capacitance on every branch (equal steps): the same network, the same orders. */
  readonly alike: readonly (readonly number[])[];
  /** The equipment's capacitors in this state, kvar at nominal voltage. */
  readonly capacitorKvarAtNominalV: number;
  /** Its resonance orders with the supply path, lowest first (those within 0.5 % of the one before left out). */
  readonly orders: readonly number[];
  readonly lowestOrder: number | null;
  /** The watched orders within the resonance band of any of `orders`; empty when none. */
  readonly nearOrders: readonly number[];
  /** Those of `orders` that lie within the band of a watched order. */
  readonly resonancesNear: readonly number[];
}

/** The supply resonance in every state of the switched steps (stepStateResonance.ts). */
export interface StepStateResonance {
  /** Distinct states: every step in first, then by capacitance, most first. */
  readonly states: readonly StepStateOrders[];
  /** How many combinations of the switched outputs the controller can reach (without a fixed part, every step out is the board as it was and not counted). */
  readonly combinations: number;
  /** What stays in whatever the controller does. */
  readonly fixedPart: { readonly reactors: boolean; readonly capacitors: boolean };
  /** How many of `states` have an order near a watched one. */
  readonly nearStates: number;
}

/** The tolerance end a CT is sized at, with the figures at both ends (see CtBasis.capacitance). */
export interface CtCapacitanceEnd {
  /** The end used: the one with the larger current where the CT reads. */
  readonly end: 'low' | 'high';
  /** Its capacitance as a share of nominal (0.95, 1.10). */
  readonly capacitanceFactor: number;
  /** The largest line current there with every step in, at each end, A. */
  readonly afterA: { readonly low: number; readonly high: number };
  /** The worst step state's largest line current at each end, A; null where there is no state to add. */
  readonly stepStateA: { readonly low: number; readonly high: number } | null;
}

/** The largest line current where the CT reads in the worst state of the switched steps (see CtBasis). */
export interface StepStateCurrent {
  /** The line it flows in, and that line as the file names it. */
  readonly phase: PhaseId;
  readonly lineLabel: string;
  /** Re-solved, A. */
  readonly currentA: number;
  /** By superposition of the steps' design-state currents (what chose the state), A. */
  readonly estimateA: number;
  /** False where that state did not solve: `currentA` is then the superposition's figure. */
  readonly solved: boolean;
  /** Controller outputs switched in and out in that state. */
  readonly outputsIn: readonly number[];
  readonly outputsOut: readonly number[];
  /** What stays in whatever the controller does: reactors, fixed capacitors. */
  readonly fixedPart: { readonly reactors: boolean; readonly capacitors: boolean };
}

export interface ControllerSettings {
  /** Outputs of the controller, and how many the bank uses. */
  readonly outputs: number;
  readonly outputsUsed: number;
  /** one-line: an ordinary controller reading one CT; every-line: steps serve single lines, so the controller must measure each line. */
  readonly measurement: 'one-line' | 'every-line';
  readonly ctPrimaryA: number;
  readonly ctSecondaryA: number;
  readonly ctRatio: number;
  /** True when trivar chose the CT primary (none given). */
  readonly ctChosen: boolean;
  /**
   * Where a CT given is below the current it must carry (`ctBasis.currentA`): the primary trivar would choose there
   * (the next standard rating at or above 1.25 × that current) and C/k and its setting on it (C/k ∝ 1/k_CT, the
   * same secondary). The settings above are for the CT given, which saturates; null where the CT is large enough
   * or was chosen.
   */
  readonly ctNeeded: { readonly primaryA: number; readonly responseThresholdA: number; readonly responseSettingA: number } | null;
  /** Where the CT goes and the line current it is chosen on (or, given, checked against). */
  readonly ctBasis: CtBasis;
  readonly smallestStepKvar: number;
  /** How the smallest step's C/k is read (BankStep.thresholdBasis). */
  readonly thresholdBasis: 'three-phase' | 'single-phase' | 'line-pair';
  /** C/k of the smallest step, A on the CT secondary. */
  readonly responseThresholdA: number;
  /** Suggested setting: `settingFraction` × C/k. */
  readonly responseSettingA: number;
  readonly settingFraction: number;
  /** PF band the controller holds: at least minPf lagging, at most maxPf lagging (null: up to unity). */
  readonly targetBand: { readonly minPf: number; readonly maxPf: number | null; readonly leadingAllowed: boolean };
  readonly switchingDelayS: number;
  /** Discharge time of the practice, s. */
  readonly dischargeTimeS: number;
  /** The rule that time follows ("IEC 60831-1: 75 V or less within 3 min"). */
  readonly dischargeRule: string;
  /** A step is not switched on again before this, s (at least the discharge time). */
  readonly reconnectionDelayS: number;
}

/** The least output of a switched step of one kind, at nominal voltage. */
export interface StepFloor {
  /** How the step's C/k is read (BankStep.thresholdBasis). */
  readonly kind: 'three-phase' | 'single-phase' | 'line-pair';
  /** The voltage its C/k is read at: U_LL for three-phase and line-pair steps, the voltage across a single-phase one. */
  readonly voltageV: number;
  /** kvar at nominal voltage that gives the least C/k (and, detuned, at least the detuned floor). */
  readonly kvarAtNominalV: number;
}

/**
 * The least switched step (leastSwitchedStep.ts): no switched step is built below it. Common practice, no
 * source: a step whose C/k is below a share of the CT's rated secondary is lost in the CT's error.
 */
export interface LeastSwitchedStep {
  /** True when the steps sit behind detuning reactors (the stricter share and a least kvar). */
  readonly detuned: boolean;
  /** Least C/k of a switched step, A on the CT secondary. */
  readonly responseThresholdA: number;
  /** That C/k as a share of the CT's rated secondary current (0.01 = 1 %). */
  readonly shareOfSecondary: number;
  /** The CT it is judged on (the controller's). */
  readonly ctPrimaryA: number;
  readonly ctSecondaryA: number;
  /** The same floor in kvar at nominal voltage, for each kind of step the bank may have. */
  readonly floors: readonly StepFloor[];
  /** Least nameplate of a switched step, kvar (bank.minStepKvar). */
  readonly nameplateKvar: number;
  /** A detuned step's least output at nominal voltage, kvar; null for a plain bank. */
  readonly detunedKvar: number | null;
  /** Widest largest/smallest C/k of the switched steps a build is kept within where one fits as well; wider is warned. */
  readonly widestRatio: number;
  /** Largest over smallest C/k of the switched steps as built; null with fewer than two. */
  readonly ratio: number | null;
  /**
   * Where no build kept to the least step fits a branch's capacitance range and one with a smaller
   * step would: that step (not built), its branches as data keys (A-B). Null otherwise.
   */
  readonly heldBack: { readonly branches: readonly string[]; readonly kvarAtNominalV: number; readonly responseThresholdA: number } | null;
  /** The least step in words, for the report. */
  readonly words: string;
}

export interface BranchSelection {
  readonly branch: string;
  /** Units serving this branch (a three-phase unit counts once per branch). */
  readonly units: number;
  /** This branch's share of the nameplate, kvar. */
  readonly nameplateKvar: number;
  /** The sizing's requirement, µF (nominal capacitance). */
  readonly requiredCapacitanceUF: number;
  /** What the design state must reach so the target holds at the low tolerance, µF. */
  readonly minimumCapacitanceUF: number;
  /** Most the design state may have so no line passes its bound at the high tolerance, µF; null if not known. */
  readonly maximumCapacitanceUF: number | null;
  readonly fixedCapacitanceUF: number;
  readonly designCapacitanceUF: number;
  /** Nominal voltage the rating is based on, the highest solved voltage, and the rating a unit needs, V. */
  readonly nominalV: number;
  readonly highestVoltageV: number;
  readonly requiredRatedV: number;
  /** Delivered at the solved design-load voltage, kvar. */
  readonly designKvarAtAppliedV: number;
  readonly designCurrentA: number;
  /** False when no build met both window ends (see warnings). */
  readonly withinWindow: boolean;
}

/** Branches no unit of the catalogue fits. */
export interface UnbuildableBranches {
  readonly branches: readonly string[];
  readonly requiredRatedV: number;
  /** Lowest solved voltage across those branches, V. */
  readonly appliedV: number;
  /** Where the delivery floor is judged, V: the nominal voltage across them (on a floating star, the solved one). */
  readonly floorV: number;
  readonly message: string;
}

export interface BankSelection {
  readonly frequencyHz: number;
  /** The bank as chosen: design-state and fixed-part susceptance per branch. */
  readonly equipment: readonly EquipmentGroup[];
  readonly catalogue: 'user' | 'typical';
  readonly practice: Practice;
  /** The catalogue in words (`built-in typical IEC catalogue (50 Hz)`). */
  readonly catalogueTitle: string;
  readonly catalogueNote: string;
  readonly capacitanceTolerance: { readonly minusPercent: number; readonly plusPercent: number };
  /**
   * True when the capacitance windows (`selections`' minimum and maximum) are the sizing's rounding windows,
   * which hold together (`BankSizing.roundingWindows`), not each branch's own.
   */
  readonly windowsHeldTogether: boolean;
  /**
   * True when a three-branch set was built as an equal bank (balanced steps only) against the equal bank's
   * window (`BankSizing.equalShare`): the same range on every branch, which puts capacitance on a branch the
   * continuous sizing left at 0 kvar (the least-kvar bank is unequal).
   */
  readonly equalBankWindows: boolean;
  /** Rating rule: at least (1 + margin) × nominal voltage across the unit, and the highest solved voltage within 110 % of rating. */
  readonly voltageMarginPercent: number;
  readonly continuousLimitPercent: number;
  readonly deliveryFloorPercent: number;
  /** What the unit choice minimised, in words and as a figure (kvar-equivalents). */
  readonly cost: { readonly statement: string; readonly unitCostKvar: number; readonly value: number };
  readonly steps: readonly BankStep[];
  readonly controller: ControllerSettings | null;
  /** The least switched step the build kept to (kvar and C/k), and the step series as built. */
  readonly leastStep: LeastSwitchedStep;
  readonly selections: readonly BranchSelection[];
  readonly nameplateKvar: number;
  /** Delivered at the solved design-load voltage with every step on, kvar. */
  readonly deliveredKvar: number;
  readonly units: number;
  /** Null when every branch could be built. */
  readonly unbuildable: UnbuildableBranches | null;
  readonly warnings: readonly CorrectionWarning[];
}

export interface ToleranceCase {
  readonly capacitanceFactor: number;
  readonly check: TargetCheck;
}

/** The capacitance (and added reactors) a supply resonance estimate is worked from, kvar at the solved voltages. */
export interface ResonanceCapacitance {
  /** Capacitors of the equipment added. */
  readonly addedKvar: number;
  /** Leading vars of the board's own loads (a fixed bank written as a load), taken as capacitance. */
  readonly onBoardKvar: number;
  /** The board's loads counted in `onBoardKvar`, by name. */
  readonly loadsOnBoard: readonly string[];
  /** Reactors of the equipment added (positive). */
  readonly reactorKvar: number;
  /** addedKvar + onBoardKvar. */
  readonly totalKvar: number;
  /**
   * Reactance of the supply path to the board (source and every feeder on the way), ohm: on a single-phase
   * board the loop, line and neutral; otherwise per line. Null where it has none.
   */
  readonly supplyReactanceOhm: number | null;
  /**
   * Reactance of the neutral back to the source, ohm, where part of the capacitors' current returns on it
   * (always on a single-phase board, where `supplyReactanceOhm` includes it; on split-phase and 4-wire boards
   * the share of line-to-neutral capacitors that does not cancel there); null where none does.
   */
  readonly neutralReactanceOhm: number | null;
  /** S_sc,X = Q_C²/Q_L of that path as the capacitors' current meets it, kVA (n·V²/X_path for a single loop or a balanced bank): what the order is worked from. */
  readonly reactanceShortCircuitKVA: number | null;
  /**
   * True where the capacitors' currents are unequal, so S_sc,X is not n·V²/X_path but Q_C²/Σ X·|I|² with the
   * current each conductor carries (a lone line-to-line capacitor on a three-phase board loads two lines).
   */
  readonly unequalCurrents: boolean;
  /**
   * The parallel resonance orders of the supply path's reactances (per line, and the neutral's) with these
   * capacitances and reactors, lowest first: the eigen-orders of the small LC network at the board's terminals
   * (capacitorPathReactance.ts). One for a single loop or a balanced delta bank, up to one per terminal otherwise.
   */
  readonly orders: readonly number[];
  /**
   * True where the lowest order lies below the single-node figure √((S_sc,X + Q_L)/Q_C): the capacitors' own
   * current pattern is not one of the network's modes (unequal line-to-neutral capacitors, or a star bank whose
   * lines can swing together against the neutral), so √(X_C/X_path) does not name it.
   */
  readonly lowestBelowSingleNode: boolean;
  /** The single-node figure √((S_sc,X + Q_L)/Q_C) at nominal voltage (capacitorPathReactance.ts); null without capacitors. */
  readonly singleNodeOrder: number | null;
  /**
   * Q_C of the capacitance (added and on the board) at nominal voltage, kvar: what every order is worked from (the
   * capacitance, not the kvar it delivers at the solved voltage, `totalKvar`); 0 where the path has no estimate.
   */
  readonly capacitorKvarAtNominalV: number;
  /** Q_L of the reactors added at nominal voltage, kvar, as `singleNodeOrder` takes it; 0 without reactors or estimate. */
  readonly reactorKvarAtNominalV: number;
  /** The neutral path's reactance, ohm, where a capacitor is tied to the neutral (its common mode swings against it); else null. */
  readonly neutralTieReactanceOhm: number | null;
}

export interface VoltageRise {
  /** Net capacitive output considered, kvar. */
  readonly capacitorKvar: number;
  /** Short-circuit power at the board from the source and feeder impedance (line and neutral on a single-phase board), kVA; null on an ideal source. */
  readonly shortCircuitKVA: number | null;
  /** S_sc,X from the supply path's reactance as the capacitors' current meets it, kVA; null where the path has no reactance. */
  readonly reactanceShortCircuitKVA: number | null;
  /**
   * The worst line's first-order rise, %: X_line·I_line plus the neutral's X·I_N along that line's voltage (a
   * capacitor's current is reactive, so the path's reactance raises the voltage, not |Z|); Q_C/S_sc,X = Q_C·X/V²
   * for a single loop or a balanced bank. Null where the path has no reactance or nothing is added.
   */
  readonly estimatePercent: number | null;
  /**
   * Why there is no estimate although the path has reactance: 'reactors' where the equipment holds reactors as
   * well as capacitors (a balancing compensator), which lower some lines while the capacitors raise others;
   * 'nothing-added' where no capacitor is built (nothing carries a capacitor current); 'unequal-path' where the
   * lines' paths to the source differ (`unequalPath`: an open delta, unequal source units or feeder conductors),
   * so no one X per line gives each line's rise; else null.
   */
  readonly estimateWithheld: 'reactors' | 'nothing-added' | 'unequal-path' | null;
  /** The line `estimatePercent` is worked for: the one whose voltage the capacitor currents raise most; null without an estimate. */
  readonly estimateLine: PhaseId | null;
  /** Largest rise of a line-to-neutral voltage magnitude in the solved board, % of nominal. */
  readonly solvedPercent: number;
  /** Each line's solved rise, % of nominal (line-to-neutral; to the centroid of the line voltages on a 3-wire board). */
  readonly solvedPerLine: readonly { readonly phase: PhaseId; readonly percent: number }[];
  /**
   * Where the supply path's reactance differs between the lines by more than UNEQUAL_PATH_SPREAD of its mean:
   * each line's own (supplyPathImpedancesPerLine), and the open delta's corner line where that is why; else null.
   */
  readonly unequalPath: { readonly lines: readonly { readonly phase: PhaseId; readonly reactanceOhm: number }[]; readonly openDeltaCorner: PhaseId | null } | null;
  /**
   * The flag level, % (CorrectionSpec.voltageRiseLimitPercent): a steady rise above it is flagged for a second
   * look at what it does on this board (`flagReading`); it is not a limit the verdict is judged on.
   */
  readonly flagLevelPercent: number;
  /** The figure judged against the flag level, %: the larger of the estimate and the solved rise (the solved rise alone without an estimate). */
  readonly judgedPercent: number;
  /** True where `judgedPercent` is above `flagLevelPercent`. */
  readonly flagged: boolean;
  /** What the flagged rise means on this board, in figures and words; null where the rise is not flagged. */
  readonly flagReading: VoltageRiseFlagReading | null;
}

/** A range of the board's own voltages, % of nominal. */
export interface BoardVoltageRange {
  readonly lowestPercent: number;
  readonly highestPercent: number;
}

/**
 * What a rise above the flag level does on the board it is flagged on (voltageRiseFlag.ts): the board's own
 * voltages (those its voltage check judges, loads left out) at design load without and with the equipment,
 * and with the board's loads off and every step still in, against the board's band.
 */
export interface VoltageRiseFlagReading {
  readonly designLoad: { readonly before: BoardVoltageRange; readonly after: BoardVoltageRange };
  /** The board's loads (and those of the boards it feeds) off: its highest voltage without the equipment and with every step in, % of nominal. */
  readonly noLoad: { readonly withoutPercent: number; readonly everyStepInPercent: number };
  /** The band the board's voltages are judged in, % of nominal. */
  readonly band: { readonly lowPercent: number; readonly highPercent: number };
  /**
   * At design load: 'towards-nominal' where the equipment leaves the board nearer nominal than it was (its
   * farthest voltage from nominal comes closer) and inside its band; 'above-band' where it puts a voltage above
   * the band; else 'within-band'.
   */
  readonly atDesignLoad: 'towards-nominal' | 'within-band' | 'above-band';
  /** With the loads off and every step in: above the band or within it. */
  readonly atNoLoad: 'within-band' | 'above-band';
  /** The reading in words, for the warning and the comparison. */
  readonly words: string;
}

export interface LightLoadCheck {
  readonly fraction: number;
  readonly perLoad: Readonly<Record<string, number>>;
  /** Output of the fixed part at its applied voltage, kvar. */
  readonly fixedKvar: number;
  /** Lines at light load with only the fixed part connected, at the high capacitance tolerance. */
  readonly lines: readonly { readonly phase: PhaseId; readonly pf: number | null; readonly sense: PowerFactorSense }[];
  readonly leadingLines: readonly PhaseId[];
  readonly ok: boolean;
  readonly voltageRise: VoltageRise;
  readonly after: BoardResult;
}

/** The board-wide power factors before and after (null where a definition does not exist: fewer than three phases). */
export interface PowerFactorsBeforeAfter {
  readonly effective: BeforeAfter | null;
  /** Null where no power flows before or after (a board carrying nothing has no PF). */
  readonly vector: BeforeAfter | null;
  readonly arithmetic: BeforeAfter | null;
  readonly positiveSequence: BeforeAfter | null;
}

export interface CorrectionVerification {
  readonly equipment: readonly EquipmentGroup[];
  /** The corrected board (design state, nominal capacitance), ready to solve again or to simulate elsewhere. */
  readonly board: Board;
  readonly target: ResolvedTarget;
  readonly before: BoardResult;
  readonly after: BoardResult;
  readonly check: TargetCheck;
  readonly checkBefore: TargetCheck;
  readonly branches: readonly BranchSizing[];
  readonly lines: readonly LineComparison[];
  readonly powerFactor: PowerFactorsBeforeAfter;
  readonly neutralCurrentA: BeforeAfter | null;
  readonly unbalance: {
    readonly negativeSequenceCurrentPercent: BeforeAfter;
    readonly zeroSequenceCurrentPercent: BeforeAfter;
    readonly voltageFactorPercent: BeforeAfter;
  } | null;
  /** Apparent power no longer drawn (before − after), kVA. */
  readonly releasedKVA: { readonly effective: number | null; readonly vector: number; readonly arithmetic: number; readonly source: number };
  /**
   * Loss reduction (before − after), kW, in the losses `before.losses`/`after.losses` hold: source and
   * feeder on a main or single board; on a sub-board of an installation only its own feeder (the
   * installation's total is `InstallationEffect`'s).
   */
  readonly lossReductionKW: number;
  readonly tolerance: { readonly low: ToleranceCase; readonly high: ToleranceCase };
  readonly voltageRise: VoltageRise;
  /**
   * The lowest parallel resonance with the supply: the lowest eigen-order of the LC network of the supply
   * path's reactances (not |Z|: the classic √(S_sc/Q_C) assumes X ≫ R, and behind a cable feeder names too
   * low an order) with the capacitors added, the leading loads already on the board and the reactors added;
   * √(X_C/X_path) = √((S_sc,X + Q_L)/Q_C) for a single loop or a balanced delta bank. Null on an ideal source
   * or with no capacitance at all.
   */
  readonly resonanceOrder: number | null;
  /** Every resonance order of the supply path with the capacitance, lowest first (`resonanceCapacitance.orders`, those within 0.5 % of the one before left out); empty where `resonanceOrder` is null. */
  readonly resonanceOrders: readonly number[];
  /** The watched harmonic orders (CORRECTION_DEFAULTS.resonanceWatchedOrders) within ±10 % of any of `resonanceOrders`; empty when none. */
  readonly resonanceNearOrders: readonly number[];
  /** What `resonanceOrder` is worked from, kvar at the solved voltages with the equipment in. */
  readonly resonanceCapacitance: ResonanceCapacitance;
  /**
   * The resonance orders in every state the controller can put the bank in (the fixed part with each combination
   * of switched steps, stepStateResonance.ts); null where the build has no switched step or no estimate (an ideal
   * source, a detuned bank whose harmonic check decides).
   */
  readonly resonanceStepStates: StepStateResonance | null;
  /**
   * The watched orders that headline the verdict: within the band of a resonance with every step in or in a
   * state the controller can reach, with significant typical content (CORRECTION_DEFAULTS.resonanceHeadlineOrders),
   * and able to reach the capacitance (the triplens only through a neutral branch, a split-phase or single-phase
   * board, or loads across two lines: resonanceExcitation.ts). Orders near only in the warnings are not here.
   */
  readonly resonanceHeadlineOrders: readonly number[];
  /**
   * True where `resonanceHeadlineOrders` is not empty: what the verdict's headline and the comparison's ranking
   * weigh (the warnings name every watched order near). False where the harmonic check's scan of every step
   * combination decides.
   */
  readonly resonanceNearHarmonic: boolean;
  readonly lightLoad: LightLoadCheck | null;
  /**
   * What the equipment overloads that was not overloaded without it (a line, the neutral, the supply
   * transformer or one of its units), each in words as the board's own warning says it; empty when nothing.
   */
  readonly overloadsCaused: readonly { readonly code: string; readonly message: string }[];
  readonly warnings: readonly CorrectionWarning[];
  /**
   * Present when the target is measured away from the equipment's board (`target.measuredAt`): the
   * readings there, from solves of the whole installation. `check`, `checkBefore`, the tolerance ends
   * and the light-load leading check are judged there; everything else stays the equipment's board's.
   */
  readonly metering?: MeteringReadings;
}

/** The point a target is measured at, before and after the equipment. */
export interface MeteringReadings {
  /** `origin` (the supply's terminals, where the service cable starts) or the name of the board at whose incomer it is measured. */
  readonly point: string;
  readonly lines: readonly LineComparison[];
  readonly powerFactor: PowerFactorsBeforeAfter;
  /** Active and reactive power through the point (load convention, + lagging), kW / kvar. */
  readonly kW: BeforeAfter;
  readonly kvar: BeforeAfter;
  readonly before: BoardResult;
  readonly after: BoardResult;
}

/**
 * A balancing compensator built from units: its reactors sized again beside the capacitors as built
 * (the capacitor-only objective with the reactors as unknowns), and whether the build uses them.
 */
export interface ReactorResizing {
  /** Per reactor branch: output at nominal voltage beside the exact capacitors and beside the built ones, kvar (inductive, ≥ 0); where the build meets both targets as sized nothing is re-sized, and the two are equal. */
  readonly reactors: readonly { readonly branch: string; readonly sizedKvar: number; readonly resizedKvar: number }[];
  /** Weighted residual Σ wₖ·rₖ² (I2, I0, Q1 − target, per unit) with the reactors as sized and as re-sized. */
  readonly objectiveSized: number;
  readonly objectiveResized: number;
  readonly converged: boolean;
  /**
   * True when the re-sized reactors are what is built and verified: the build as sized misses a target
   * (PF or balance) and the re-sized one meets more of them, or as many with a lower residual.
   */
  readonly used: boolean;
  readonly solves: number;
}

export type CorrectionStatus =
  | 'meets-target'
  | 'meets-target-at-nominal-capacitance'
  | 'already-meets-target'
  | 'misses-target-with-available-units'
  | 'no-suitable-units'
  | 'infeasible'
  | 'nothing-to-build';

export interface CorrectionReport {
  readonly arrangement: Arrangement;
  readonly status: CorrectionStatus;
  /** One line for people. */
  readonly summary: string;
  readonly reasons: readonly string[];
  readonly target: ResolvedTarget;
  readonly sizing: BankSizing | CompensatorSizing;
  /** Null when nothing needs to be built. */
  readonly selection: BankSelection | null;
  /** The recommended design (chosen units, or the continuous sizing when none were chosen), re-solved. */
  readonly verification: CorrectionVerification;
  /** Balancing compensator only: the ideal solution (with reactors), re-solved. */
  readonly idealVerification: CorrectionVerification | null;
  /** Balancing compensator only: the unbalance of the board as built against the balance target. */
  readonly balance: BalanceCheck | null;
  /** Balancing compensator with reactors, built from units: the reactors re-sized to the capacitors as built; null otherwise. */
  readonly reactorResizing: ReactorResizing | null;
  /**
   * Balancing compensator whose capacitor-only solution also works on fewer branches (`sizing.fewerBranches`):
   * both built from units, the better verdict kept, then the lower cost (fewer branches at equal cost).
   * Null otherwise.
   */
  readonly fewerBranchesBuild: FewerBranchesBuild | null;
  /**
   * Balancing compensator built with reactors whose capacitors, rounded down to their requirement (the
   * reactors as sized), do not meet the target across the tolerance: the same rounded up (the reactors
   * sized again around them) weighed against it, the better verdict kept, then the lower cost. Null
   * otherwise (rounded down meets it: up is not tried).
   */
  readonly roundingBesideReactors: RoundingBesideReactors | null;
  /**
   * Status `nothing-to-build`: why no build is offered (the need per line, what stood in the way, a build
   * withheld because it made things worse) and what to do instead. Null otherwise.
   */
  readonly nothingToBuild: NothingToBuild | null;
  readonly warnings: readonly CorrectionWarning[];
  readonly cautions: readonly string[];
}

/** What one line needs to reach the target PF on its own: Q = P·(tan φ1 − tan φ2). */
export interface LineNeed {
  readonly phase: PhaseId;
  /** The line's active and reactive power before correction (load convention, + lagging), kW / kvar. */
  readonly kW: number;
  readonly kvar: number;
  /** The line's PF before (null where it carries nothing) and the target's lower bound. */
  readonly pfBefore: number | null;
  readonly pfTarget: number;
  /** Capacitive kvar that brings the line to the target, at the solved voltage; 0 where it already meets it. */
  readonly neededKvar: number;
}

/**
 * Why a build from units was not offered: `reactors-alone` (a compensator's capacitors could not be built,
 * and its reactors are there to balance what they correct), `lowers-target-pf` (re-solved, the PF the target
 * is defined on falls), `loads-idle-line` (a line that carried nothing carries current with it, and the
 * target is still missed).
 */
export type WithheldBuildReason = 'reactors-alone' | 'lowers-target-pf' | 'loads-idle-line';

/** A build from units verified and then withheld: what it would have done. */
export interface WithheldBuild {
  readonly reasons: readonly WithheldBuildReason[];
  /** Capacitor and reactor kvar of the withheld build at nominal voltage (reactor kvar ≥ 0). */
  readonly capacitorKvar: number;
  readonly reactorKvar: number;
  /** The PF the target is defined on, before and with the withheld build in (null where no line carries current). */
  readonly targetPfBefore: number | null;
  readonly targetPfWithBuild: number | null;
  /** Lines that carried nothing before and carry current with the build in, with that current, A. */
  readonly idleLinesLoaded: readonly { readonly phase: PhaseId; readonly currentA: number }[];
}

/** The smallest catalogue unit that suits one line-to-neutral branch, against that branch's capacitance window. */
export interface SmallestUnitOnBranch {
  readonly branch: string;
  readonly phase: PhaseId;
  readonly unitName: string;
  readonly ratedKvar: number;
  readonly ratedV: number;
  readonly capacitanceUF: number;
  /** Its output at the solved voltage across the branch, kvar. */
  readonly kvarAtAppliedV: number;
  /** The branch's window: the least capacitance holding the target at the low tolerance end, the most keeping every line within its bound at the high end, µF. */
  readonly minimumUF: number;
  readonly maximumUF: number | null;
}

/** Status `nothing-to-build`: the figures behind it and the words. */
export interface NothingToBuild {
  readonly needs: readonly LineNeed[];
  /** The least kvar a switched step may have (`bank.minStepKvar`). */
  readonly minStepKvar: number;
  readonly smallestUnits: readonly SmallestUnitOnBranch[];
  /** The build verified and withheld, null where none was made (no unit fitted). */
  readonly withheld: WithheldBuild | null;
  /** That build and what it would have done, in words; null with it. */
  readonly withheldWords: string | null;
  /** Why nothing is built, in words. */
  readonly why: string;
  /** What to do instead, in words. */
  readonly advice: string;
}

export interface FewerBranchesBuild {
  /** True when the build on fewer branches is the one chosen. */
  readonly used: boolean;
  /** Cost of the build on fewer branches (`selection.cost`; a capacitor-only build has no reactors); null when no units fit. */
  readonly cost: number | null;
  /** Cost of the build on every branch the programme used; null when no units fit. */
  readonly costOnEveryBranch: number | null;
  /** How each build fares when re-solved: meets across the tolerance, at nominal capacitance, misses, or no units fit. */
  readonly verdict: BuildVerdict;
  readonly verdictOnEveryBranch: BuildVerdict;
}

export interface RoundingBesideReactors {
  readonly used: 'down' | 'up';
  readonly verdictDown: BuildVerdict;
  readonly verdictUp: BuildVerdict;
  /** Unit cost plus the reactors at twice their kvar; null when no units fit. */
  readonly costDown: number | null;
  readonly costUp: number | null;
}

/** `withheld`: built and re-solved, but it made things worse (WithheldBuildReason), so it is not offered. */
export type BuildVerdict = 'meets' | 'meets-at-nominal' | 'misses' | 'withheld' | 'no-units';
