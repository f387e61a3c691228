/**
 * What `checkHandFigures` returns: plain JSON data. Reactive power of
 * capacitors is given as a positive kvar (capacitive); line powers keep the
 * load convention (Q > 0 lagging).
 */
import type { PhaseId } from '../board/boardModel.js';
import type { BoardWarning, OperatingPoint, PowerFactorSense, PowerReading } from '../analysis/boardResult.js';
import type { HandBranch } from './handFiguresSpec.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';

/** One capacitor as the user gave it and as the board really runs it. */
export interface HandCapacitor {
  readonly branch: HandBranch;
  /** What the hand method counts on: the nameplate kvar, or ωCV² at nominal voltage for a µF figure. */
  readonly handKvar: number;
  readonly capacitanceUF: number;
  /** Nominal voltage across the branch, V. */
  readonly nominalV: number;
  /** Solved voltage across it on the real board, V. */
  readonly appliedV: number;
  /** Output at that voltage, kvar. */
  readonly kvarAtAppliedV: number;
}

/** The per-phase working of the textbook method (nominal balanced voltages, line-to-line branches split half to each line). */
export interface TextbookPhase {
  readonly phase: PhaseId;
  readonly voltageV: number;
  readonly kW: number;
  /** Before the capacitors, + lagging. */
  readonly kvarBefore: number;
  /** tan φ1 = Q/P; null when P is zero. */
  readonly tanBefore: number | null;
  readonly pfBefore: number;
  /** Capacitor kvar this phase is credited with (a line-pair capacitor: half to each line). */
  readonly capacitorKvar: number;
  /** Qc = P(tan φ1 − tan φ2) for the target, kvar; null without a target or with P ≤ 0. */
  readonly requiredKvar: number | null;
  readonly kvarAfter: number;
  readonly tanAfter: number | null;
  readonly pfAfter: number;
  readonly senseAfter: PowerFactorSense;
  /** Current triangle: P/V, Q/V before and after, and the hypotenuse, A. */
  readonly activeCurrentA: number;
  readonly reactiveCurrentBeforeA: number;
  readonly reactiveCurrentAfterA: number;
  readonly currentBeforeA: number;
  readonly currentAfterA: number;
}

export interface Compared {
  /** The user's own figure, when given. */
  readonly yours: number | null;
  /** What the textbook method gives. */
  readonly textbook: number;
  /** What the board really does (solved). */
  readonly solved: number;
  /** solved − textbook */
  readonly difference: number;
}

export interface LineCheck {
  readonly phase: PhaseId;
  readonly currentA: Compared;
  readonly pf: Compared;
  /** 'none' on a line with no current: it has no PF, as the board table prints it (—). */
  readonly senseTextbook: PowerFactorSense;
  readonly senseSolved: PowerFactorSense;
  /** The angle φ = atan(Q/|P|) of the line's power, degrees, lagging positive (yours: null). */
  readonly angleDeg: Compared;
  /** Lagging by one method, leading by the other: the PF difference alone would hide the turn, so φ's is told. */
  readonly crossesUnity: boolean;
}

export type HandEffectId = 'line-pair-split' | 'board-voltage' | 'neutral-return' | 'capacitor-voltage' | 'voltage-dependent-loads';

/** How much one effect moves each figure (solved with the effect − solved without it). */
export interface EffectContribution {
  readonly effect: HandEffectId;
  readonly title: string;
  /** What the effect is, with this board's numbers. */
  readonly explanation: string;
  /** angleDeg: the change of φ = atan(Q/|P|), degrees, lagging positive; the PF change where it does not cross unity. */
  readonly lines: readonly { readonly phase: PhaseId; readonly currentA: number; readonly pf: number; readonly angleDeg: number }[];
  readonly neutralA: number | null;
  readonly boardPf: number;
}

export interface HandCheckResult {
  readonly board: { readonly name: string; readonly system: string; readonly nominalLineToNeutralV: number; readonly frequencyHz: number };
  /** How the board names its phases ("A/B/C" or "L1/L2/L3"): reports label with it; data keys stay A/B/C. */
  readonly phaseNames: PhaseNaming;
  readonly targetPf: number | null;
  readonly capacitors: readonly HandCapacitor[];
  readonly textbook: readonly TextbookPhase[];
  readonly lines: readonly LineCheck[];
  readonly neutralA: Compared | null;
  /** Vector power factor of the board, ΣP/|ΣS| (negative when the board exports). */
  readonly boardPf: Compared;
  /** The board's total power with the capacitors, textbook and solved: the sense beside the board PF. */
  readonly boardPower: { readonly textbook: PowerReading; readonly solved: PowerReading };
  /** In the order they are switched on; their sum is solved − textbook for every figure. */
  readonly effects: readonly EffectContribution[];
  /**
   * The board as it runs with your capacitors: lines and board led by them, then the solved board's own
   * warnings (ratings, voltage limits, neutral), as `trivar solve` gives them.
   */
  readonly warnings: readonly BoardWarning[];
  /** The solved board's operating point with the capacitors: `collapsed` is the state `trivar solve` refuses. */
  readonly operatingPoint: Pick<OperatingPoint, 'collapsed' | 'findings'>;
  readonly cautions: readonly string[];
}
