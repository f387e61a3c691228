/**
 * What the harmonic study returns: plain JSON-serialisable data, the same for
 * the library and `trivar harmonics --json`.
 */
import type { PhaseId } from '../board/boardModel.js';
import type { PowerFactorSense } from '../analysis/boardResult.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import type { VoltageDistortionBasis } from './voltageDistortionLimits.js';

/** One harmonic order of a quantity. */
export interface OrderReading {
  readonly order: number;
  /** rms magnitude, A or V. */
  readonly magnitude: number;
  /** % of the fundamental of the same quantity. */
  /** Null where the fundamental is round-off (a neutral whose fundamentals cancel): no share of it means anything. */
  readonly percentOfFundamental: number | null;
  readonly angleDeg: number;
}

/** A waveform by its orders: rms, fundamental, THD and each order ≥ 2. */
export interface DistortionReading {
  readonly rms: number;
  readonly fundamental: number;
  /** √Σ_{h≥2} X_h² / X_1, %; null when the fundamental is zero. */
  readonly thdPercent: number | null;
  readonly orders: readonly OrderReading[];
}

export interface HarmonicLineReading {
  readonly phase: PhaseId;
  readonly current: DistortionReading;
  /** Voltage to the neutral bar (4-wire, split- and single-phase) or to the centroid of the line voltages (3-wire). */
  readonly voltage: DistortionReading;
  /** Active power through all orders, kW. */
  readonly kW: number;
  /** P / (V_rms · I_rms). */
  readonly truePf: number | null;
  /** cos(angle V1 − angle I1): negative where the line carries power back; its sense in `displacementSense`. */
  readonly displacementPf: number | null;
  /** Lagging (Q1 > 0, absorbed), leading (Q1 < 0, capacitive: a bank larger than the line's load), unity, or none without current. */
  readonly displacementSense: PowerFactorSense;
  /** Active power at the fundamental, kW (load convention). */
  readonly fundamentalKW: number;
  /** Reactive power at the fundamental, kvar (+ absorbed, as by a lagging load; − capacitive). */
  readonly fundamentalKvar: number;
}

/**
 * The board's power factors: true (every order) and displacement (the fundamental), both arithmetic over the
 * lines; the displacement PF's sense, and the fundamental's P and Q it is read from, summed over the lines.
 */
export interface HarmonicsPowerFactor {
  readonly true: number | null;
  readonly displacement: number | null;
  /**
   * Of ΣQ1 over the lines: leading where the board as a whole sends capacitive kvar back up its supply; 'none'
   * where some lines lag and others lead, as the arithmetic figure's shortfall from 1 is then theirs, not the board's.
   */
  readonly displacementSense: PowerFactorSense;
  readonly fundamentalKW: number;
  readonly fundamentalKvar: number;
}

export interface NeutralCheck {
  readonly current: DistortionReading;
  /** Zero-sequence orders (3, 9, 15…) as a share of the neutral's rms², %. */
  readonly triplenSharePercent: number | null;
  /** Neutral rms / largest line rms. */
  readonly ratioToPhase: number | null;
  /**
   * What makes the neutral carry as much as the largest line, where it does: the phase loading (its
   * fundamental alone reaches the largest line's, the loads sitting on one line), triplen orders adding
   * from several lines (they are at least 10 % of its rms² and more than any one line carries), both, or
   * neither alone (other harmonic orders). With the figures the words quote, A. Null where the neutral is
   * below the largest line.
   */
  readonly aboveLine: {
    readonly cause: 'phase-loading' | 'triplen' | 'both' | 'harmonics';
    readonly neutralFundamentalA: number;
    readonly lineFundamentalA: number;
    readonly neutralTriplenA: number;
    readonly lineTriplenA: number;
  } | null;
  readonly ratingA: number | null;
  readonly loadingPercent: number | null;
  readonly overloaded: boolean;
  /** The usual sizing practice for this neutral; null on a three-phase board whose neutral carries little triplen current. */
  readonly practice: string | null;
}

export interface TddLine {
  readonly phase: PhaseId;
  readonly tddPercent: number;
  readonly orders: readonly { readonly order: number; readonly percentOfDemand: number; readonly limitPercent: number; readonly ok: boolean }[];
  readonly ok: boolean;
}

export interface TddCheck {
  readonly shortCircuitRatio: number;
  readonly shortCircuitRatioFrom: 'board file' | 'source impedance';
  readonly demandCurrentA: number;
  readonly demandCurrentFrom: 'board file' | 'solved fundamental line current';
  /** The row of the IEEE 519 table used, e.g. `20 < 50`. */
  readonly tableRow: string;
  readonly tddLimitPercent: number;
  readonly lines: readonly TddLine[];
  readonly ok: boolean;
  readonly source: string;
}

/** One bus voltage of the board against the levels of its basis (IEC 61000-2-2, EN 50160 or IEEE 519). */
export interface BusVoltageDistortion {
  /** `A-N` (to the neutral bar; to the centroid of the line voltages on a 3-wire board) or `A-B`. */
  readonly bus: string;
  readonly thdPercent: number | null;
  /** The largest order's voltage, % of the fundamental; null when there is none. */
  readonly largest: { readonly order: number; readonly percent: number } | null;
  /** Orders above their level, ascending, % of the fundamental, each with the level it exceeds. */
  readonly ordersAbove: readonly { readonly order: number; readonly percent: number; readonly limitPercent: number }[];
  readonly ok: boolean;
}

export interface VoltageDistortionCheck {
  /** The document the voltages are judged against (`harmonics.voltageDistortionLimits`). */
  readonly basis: VoltageDistortionBasis;
  /** Named in the board file, or the default of the board's region (IEC 61000-2-2 for IEC, IEEE 519 for North America). */
  readonly basisFrom: 'board file' | 'region';
  /** How reports name it: `IEC 61000-2-2 compatibility levels`. */
  readonly basisName: string;
  /** The one level every order is judged against (IEEE 519: 5 %); null where each order has its own (`orderLimits`). */
  readonly individualLimitPercent: number | null;
  /** The level of each order solved, % of the fundamental; null where the document gives none (judged through THD only). */
  readonly orderLimits: readonly { readonly order: number; readonly limitPercent: number | null }[];
  readonly thdLimitPercent: number;
  /** Every bus voltage of the board: each phase, then each line-to-line pair. */
  readonly buses: readonly BusVoltageDistortion[];
  readonly ok: boolean;
  readonly source: string;
}

export interface ScanPeak {
  /** Terminal pair the impedance is seen between: `A-N`, `A-B`... */
  readonly pair: string;
  /** Peak order, refined between grid points. */
  readonly order: number;
  readonly impedanceOhm: number;
}

export interface ScanCombination {
  /** Which steps are on, in step order. */
  readonly steps: readonly boolean[];
  /** In words: `no bank`, `fixed part`, `steps 1+3`… */
  readonly label: string;
  /** Effective fundamental output of what is on, at nominal voltage, three-phase kvar. */
  readonly capacitorKvar: number;
  /**
   * The lowest resonance order of the supply path's reactances (per line and the neutral's) with the capacitors
   * of the parts on, the estimate beside the scan: √(X_C/X_path) for a single loop or a balanced delta bank, the
   * lowest eigen-order of that small LC network otherwise (capacitorPathReactance.ts; the classic √(S_sc/Q_c)
   * with S_sc from |Z| assumes X ≫ R); null without a source reactance, without capacitors, or for a detuned
   * bank (the estimate does not apply).
   */
  readonly formulaOrder: number | null;
  /** |Z| per pair, per scanned order, ohm, rounded to 1e-6 of the curve's largest value (plotting data). */
  readonly impedanceOhm: readonly (readonly number[])[];
  readonly peaks: readonly ScanPeak[];
  /** Injected (or watched) orders within ±10 % of a peak. */
  readonly nearOrders: readonly number[];
}

export interface ResonanceScan {
  readonly orders: readonly number[];
  readonly pairs: readonly string[];
  /** Short-circuit power at the board from the source and feeder impedance (line and neutral on a single-phase board), kVA; null on an ideal source. */
  readonly shortCircuitKVA: number | null;
  /** Orders a resonance is checked against: those injected or on the supply, else the odd orders 3 … 19 (HARMONICS_DEFAULTS.watchedOrders). */
  readonly checkedOrders: readonly number[];
  readonly checkedOrdersFrom: 'spectra and background' | 'characteristic orders (no spectrum given)';
  readonly combinations: readonly ScanCombination[];
  /** How loads enter the scan, in words. */
  readonly basis: string;
}

/** A level another bank is scanned at. */
export interface OtherBankLevel {
  /** In words: `off`, `out of service` (its fixed part off too), `fixed part only`, `steps 1+2`… */
  readonly label: string;
  readonly steps: readonly boolean[];
  /** Whether its fixed part is on (false only out of service). */
  readonly fixedOn: boolean;
  /** Effective fundamental output on, at nominal voltage, three-phase kvar. */
  readonly capacitorKvar: number;
}

/** A scan peak and the other banks' state it is found in. */
export interface JointPeak extends ScanPeak {
  /** The other banks' state, in words: `Studios bank off; Plant bank steps 1+2`. */
  readonly otherBanks: string;
}

/** One combination of a bank's steps over every scanned state of the other banks. */
export interface JointScanCombination {
  readonly steps: readonly boolean[];
  readonly label: string;
  readonly capacitorKvar: number;
  /** States of the other banks scanned with this combination. */
  readonly networkStates: number;
  /** Per state of the other banks, the orders of its peaks (every pair's, rounded to 0.01, each once, ascending). */
  readonly states: readonly { readonly otherBanks: string; readonly peakOrders: readonly number[] }[];
  /** The lowest and highest peak found over those states; null when none has a peak. */
  readonly lowestPeak: JointPeak | null;
  readonly highestPeak: JointPeak | null;
  /** The peak nearest a checked order (relative to the order) over those states, and that order. */
  readonly nearest: (JointPeak & { readonly checkedOrder: number }) | null;
  /** Checked orders within ±10 % of a peak in some state, each with the state whose peak is nearest it. */
  readonly nearOrders: readonly { readonly order: number; readonly peak: JointPeak }[];
}

/** The resonance seen from a bank's board with the installation's other banks switched too. */
export interface JointScan {
  /** Each other bank's board and the levels it was scanned at (lowest first). */
  readonly otherBanks: readonly { readonly board: string; readonly levels: readonly OtherBankLevel[] }[];
  /**
   * How the other banks' states were chosen: every state of each one's steps (any switching order),
   * combined; above `stateLimit` networks every level a controller reaches stepping in the written
   * order; above it again each at its extremes (off or fully on); above that all together.
   */
  readonly coverage: 'every step combination' | 'controller levels' | 'each off or fully on' | 'all off or all on together';
  /** Distinct networks scanned (this bank's distinct states × the other banks' states). */
  readonly networkStates: number;
  readonly stateLimit: number;
  /** Per combination of this bank's steps, in the scan's order. */
  readonly combinations: readonly JointScanCombination[];
}

export interface DutyFigures {
  /** Per unit of the capacitor rating. */
  readonly voltageRms: number;
  readonly voltagePeak: number;
  readonly currentRms: number;
  readonly kvar: number;
}

export interface DutyLimits {
  readonly voltageRms: number;
  readonly voltagePeak: number | null;
  readonly currentRms: number;
  readonly kvar: number | null;
}

export interface CapacitanceTolerance {
  readonly minusPercent: number;
  readonly plusPercent: number;
}

/** Where a duty case was found: the units' capacitance and the board's loads. */
export interface DutyCondition {
  /** Capacitance of the units, % of nominal: 100, or an end of their tolerance (95, 110…). */
  readonly capacitancePercent: number;
  /** `as given`: the board's loads as in the file; `off`: every load off, the highest voltage a bank on a lagging board sees. */
  readonly loads: 'as given' | 'off';
  /**
   * On an installation with other banks: all fully on, all out of service, or `switched` to the
   * state (`otherBanksState`, in words) at which the joint scan found a peak nearest a checked order.
   */
  readonly otherBanks?: 'on' | 'off' | 'switched';
  readonly otherBanksState?: string;
}

export interface DutyCase {
  readonly label: string;
  readonly steps: readonly boolean[];
  /** The worst branch of the bank in this state. */
  readonly branch: string;
  readonly figures: DutyFigures;
  readonly ok: boolean;
  /** The condition of this state with the largest duty (figure / limit). */
  readonly condition: DutyCondition;
  /** Fundamental rms voltage across one capacitor element of that branch, V. */
  readonly capacitorVoltageV: number;
}

export interface CapacitorDuty {
  readonly standard: 'ieee-18' | 'iec-60831-1';
  readonly limits: DutyLimits;
  readonly limitsSource: string;
  readonly ratedV: number;
  readonly detuningPercent: number;
  /** Fundamental voltage across the capacitors at nominal network voltage, V (U/(1 − p) when detuned). */
  readonly capacitorVoltageV: number;
  /** Capacitance tolerance of the units, % (each end is checked). */
  readonly capacitanceTolerance: CapacitanceTolerance;
  /** The conditions every state is checked in. */
  readonly conditions: readonly DutyCondition[];
  /** Per state, its worst condition. */
  readonly cases: readonly DutyCase[];
  readonly worst: DutyCase;
  /** The worst state at nominal capacitance with the loads as given (the design point alone). */
  readonly worstNominal: DutyCase;
  /** Highest fundamental rms voltage across a capacitor element in any state and condition, V. */
  readonly highestCapacitorVoltageV: number;
  /**
   * Where the standard's continuous voltage is below its duty limit (IEC 60831-1: 1.00 U_N against 1.10 for
   * 8 h in every 24 h): the highest rms voltage (with harmonics, per unit of rating) at nominal capacitance
   * with the loads as given, the running state, and the state it is in. Null otherwise.
   */
  readonly continuousVoltage: ContinuousVoltage | null;
  readonly ok: boolean;
}

/**
 * The capacitors' voltage against what they stand continuously (IEC 60831-1: 1.00 U_N; the 1.10 U_N the
 * duty limit allows is for 8 h in every 24 h): the running state, every state checked, and the
 * fundamental alone.
 */
export interface ContinuousVoltage {
  readonly limitPu: number;
  /** The highest rms voltage (with harmonics, per unit of rating) at nominal capacitance with the loads as given: the running state. */
  readonly highestPu: number;
  readonly label: string;
  readonly branch: string;
  /**
   * The highest rms voltage (with harmonics, per unit) in any state the bank can stay in — the loads as
   * given, at every capacitance checked, other banks as they run — and where. (With every load off a
   * controller switches steps out: that condition is left to the 8-hour duty limit.)
   */
  readonly anyStatePu: number;
  readonly anyState: { readonly label: string; readonly branch: string; readonly condition: DutyCondition };
  /** The highest fundamental voltage across a capacitor in those states, per unit of rating. */
  readonly fundamentalPu: number;
  /** The fundamental across the capacitors at the network's nominal voltage, per unit: U/(1 − p) over U_r. */
  readonly nominalPu: number;
  /** True where any of these reaches the continuous limit: the units run at or above their rated voltage. */
  readonly reached: boolean;
}

export interface HarmonicsWarning {
  readonly code: string;
  readonly message: string;
  readonly value: number | null;
  readonly threshold: number | null;
}

export interface LoadSpectrumNote {
  readonly load: string;
  readonly spectrum: string;
  readonly source: string;
  /** Current THD of the load's own spectrum, %. */
  readonly thdPercent: number;
}

export interface HarmonicsReport {
  readonly board: string;
  /** How the board names its phases ("A/B/C" or "L1/L2/L3"): labels in warnings follow it; data keys stay A/B/C. */
  readonly phaseNames: PhaseNaming;
  readonly frequencyHz: number;
  /** Orders solved (≥ 2). */
  readonly orders: readonly number[];
  /** The state the line, neutral and voltage figures are for. */
  readonly state: string;
  readonly lines: readonly HarmonicLineReading[];
  readonly lineToLine: readonly { readonly pair: string; readonly voltage: DistortionReading }[];
  /**
   * False on a board without a neutral (3-wire): its line voltages (`lines[].voltage`) are to the mean of
   * the three, a point no conductor reaches; reports and the voltage-level check read the line-to-line voltages.
   */
  readonly hasNeutral: boolean;
  readonly neutral: NeutralCheck | null;
  /** Board figures, arithmetic over the lines: ΣP / Σ(V·I). */
  readonly powerFactor: HarmonicsPowerFactor;
  readonly tdd: TddCheck | null;
  /** The board's bus voltages against the levels of its basis (IEC 61000-2-2, EN 50160 or IEEE 519): each order and THD. */
  readonly voltageDistortion: VoltageDistortionCheck;
  readonly scan: ResonanceScan;
  readonly capacitorDuty: CapacitorDuty | null;
  readonly spectra: readonly LoadSpectrumNote[];
  /** Defaults and modelling choices used, in words. */
  readonly assumptions: readonly string[];
  readonly warnings: readonly HarmonicsWarning[];
  readonly cautions: readonly string[];
}

/** One board of an installation at harmonic orders: its busbar and the feeder that supplies it. */
export interface BoardHarmonics {
  readonly board: string;
  /** The board feeding this one; null for the main board (fed by the supply). */
  readonly fedFrom: string | null;
  /** 1 for the main board, 2 for the boards it feeds, … */
  readonly depth: number;
  /** Per phase: the current in the board's incoming feeder (the service feeder at the main board) and the voltage at its busbar. */
  readonly lines: readonly HarmonicLineReading[];
  readonly lineToLine: readonly { readonly pair: string; readonly voltage: DistortionReading }[];
  /** False on a board without a neutral (3-wire): as HarmonicsReport.hasNeutral. */
  readonly hasNeutral: boolean;
  /** The incoming feeder's neutral; its rating is the feeder's neutral rating. */
  readonly neutral: NeutralCheck | null;
  /** rms of the zero-sequence orders (3, 9, 15…) in the feeder neutral, A; null without a neutral. */
  readonly triplenNeutralA: number | null;
  readonly powerFactor: HarmonicsPowerFactor;
  readonly voltageDistortion: VoltageDistortionCheck;
  /** Non-linear loads on this board and their spectra. */
  readonly spectra: readonly LoadSpectrumNote[];
}

/** The scan seen from one board of an installation (a bank's board), and that bank's duty. */
export interface BoardScan {
  readonly board: string;
  /** Every combination of this bank's steps with every other bank fully on. */
  readonly scan: ResonanceScan;
  /** The same with the other banks switched; null without another bank. */
  readonly jointScan: JointScan | null;
  /** Null where the board has no bank. */
  readonly capacitorDuty: CapacitorDuty | null;
}

/** A warning of the installation study, with the board it is about (null for the whole installation). */
export interface InstallationHarmonicsWarning extends HarmonicsWarning {
  readonly board: string | null;
}

export interface InstallationHarmonicsReport {
  readonly installation: string;
  readonly phaseNames: PhaseNaming;
  readonly frequencyHz: number;
  /** Orders solved (≥ 2), over every board. */
  readonly orders: readonly number[];
  /** The state the board figures are for. */
  readonly state: string;
  /** Every board, main board first, each after the board feeding it. */
  readonly boards: readonly BoardHarmonics[];
  /** IEEE 519 at the supply intake (`harmonics.pcc`); null when not asked. */
  readonly tdd: TddCheck | null;
  /** One per bank, seen from its board; with no bank, one seen from the main board as it is. */
  readonly scans: readonly BoardScan[];
  readonly assumptions: readonly string[];
  readonly warnings: readonly InstallationHarmonicsWarning[];
  readonly cautions: readonly string[];
}
