/**
 * What a rebalancing study returns: plain JSON data, the same for the library
 * and `trivar rebalance --json`. Currents in A, unbalance in %.
 */
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import type { Region } from '../board/conventions/region.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import type { AimWeights, ConditionFigures } from './rebalanceObjective.js';
import type { VoltageLimits } from '../board/conventions/voltageLimits.js';
import type { VoltageCheck } from '../analysis/voltageCheck.js';
import type { MovedCircuitNumber } from './movedCircuitNumber.js';

/** One line of the work order. */
export interface CircuitMove {
  /** The board the circuit is on. */
  readonly board: string;
  /** The file's circuit number (`circuit:`) as written; null where the file gives none. */
  readonly circuit: string | null;
  /** Position of the circuit in its board's `loads` list in the file, counted from 1. */
  readonly listPosition: number;
  readonly name: string;
  readonly from: ConnectionSpec;
  readonly to: ConnectionSpec;
  /** What the move does to the circuit number (its breaker takes another position); null where the file gives no number. */
  readonly circuitNumber: MovedCircuitNumber | null;
}

/** One condition read at one measured board's incomer (a single board: its incomer). */
export interface ConditionComparison {
  /** The condition's name. */
  readonly name: string;
  /** The board whose incomer the figures are read at. */
  readonly board: string;
  readonly weight: number;
  /** The fast scoring model (stiff balanced supply, currents at nominal voltage). */
  readonly model: { readonly before: ConditionFigures; readonly after: ConditionFigures };
  /** The network solver on the whole board (impedances, load models): the figures to trust. */
  readonly solved: { readonly before: ConditionFigures; readonly after: ConditionFigures };
}

/** Best score reachable with at most `moves` moves. */
export interface MoveTableRow {
  readonly moves: number;
  readonly score: number;
  readonly lowerBound: number | null;
  readonly proven: boolean;
  /** Moves the best answer of this row actually uses (≤ `moves`). */
  readonly movesUsed: number;
  /**
   * False when no answer found with this many moves keeps every current within its limit (the study's
   * capacity, the file's ratings): then `score` is that of the answer with the least overload (`Overload`),
   * and `proven` means no answer with this many moves has less.
   */
  readonly withinCapacity: boolean;
  /**
   * The largest loading of a current the study or the file limits, % of its limit; null where nothing is limited.
   * The network re-solve's where `loadingSolved` (the present wiring and the answer given, the figures the notes
   * quote), else the fast model's against the limits as the search holds them (`search.limitsTightened`).
   */
  readonly largestLoadingPercent: number | null;
  /** True where `largestLoadingPercent` is the network re-solve's figure of this row's wiring. */
  readonly loadingSolved: boolean;
}

/** A board the score does not read, solved before and after all the same (installations only). */
export interface UnmeasuredBoardComparison {
  readonly name: string;
  readonly board: string;
  readonly weight: number;
  readonly before: ConditionFigures;
  readonly after: ConditionFigures;
}

/**
 * One board's voltages (its own and every load's) in one condition, network-solved now and after the
 * moves, each judged against that board's own limits: an installation board's `voltageLimits` where it
 * has them, else the installation's `conventions.voltageLimits` (the verdict `trivar solve` gives).
 */
export interface BoardVoltageComparison {
  /** The condition's name. */
  readonly name: string;
  readonly board: string;
  readonly limits: VoltageLimits;
  readonly before: VoltageCheck;
  readonly after: VoltageCheck;
}

/**
 * Something above its capacity after the moves. Two sources: the study's own `lineCapacityA` (`limit: 'study'`,
 * fast model: when no answer within the move limit keeps every line within it), and the ratings the file gives
 * (`limit: 'rating'`, network re-solve of the moved installation, the figures `trivar solve` warns of: a line or
 * neutral conductor's `ratingA`, the supply transformer, a rated unit of a bank or open delta).
 */
export interface CapacityExcess {
  readonly board: string;
  readonly condition: string;
  /** What is over: a line (or the line a unit or the transformer carries), the neutral, the supply transformer, a rated supply unit. */
  readonly conductor: 'line' | 'neutral' | 'transformer' | 'source-unit';
  /** The line of a line conductor; null for the others (see `winding`). */
  readonly line: 'A' | 'B' | 'C' | null;
  /** A supply unit's winding (`C`, or `A-B` in an open delta); null otherwise. */
  readonly winding: string | null;
  readonly currentA: number;
  readonly capacityA: number;
  readonly overA: number;
  readonly limit: 'study' | 'rating';
  /** The same figure as things stand, A (same model). */
  readonly nowA: number;
  /**
   * `new`: within its capacity now, over it after the moves; `worse`: over now and more so after;
   * `unchanged`: over now and no worse after (the moves do not cause it).
   */
  readonly change: 'new' | 'worse' | 'unchanged';
}

/**
 * How far over its limits an answer is. Each limited current is loaded |I| / limit: every rating the file gives
 * (a line or neutral conductor, the supply transformer, a rated unit of a bank or open delta, as trivar solve
 * judges them) and each measured board's lines against the study's capacity. The search ranks answers by the
 * fast model's loadings: the largest over 100 % first, then the loadings over 100 % added, then the score, then
 * the moves. The figures here are the network re-solve's.
 */
/**
 * The least largest loading any arrangement can reach, beside the answer's (fast model, each limit as the file and
 * study give it, before any tightening after a re-solve; % of each limit): loadingBound.ts says why it is a bound.
 */
export interface LoadingBound {
  /** No arrangement within the move limit (of the circuits `boards.movable` holds) has its largest loading below this, %. */
  readonly leastPercent: number;
  /** The answer's largest loading in the same model and against the same limits, %. */
  readonly answerPercent: number;
  /** The bound is above 100 % (by more than 0.01 %): no arrangement keeps every limit, proven. */
  readonly limitsUnreachable: boolean;
  /** The bound meets the answer's loading: no arrangement has a lower largest loading, proven. */
  readonly answerLeast: boolean;
  /** Decimals that state the two figures as they compare (the bound rounded down, the answer to the nearest). */
  readonly decimals: number;
}

export interface Overload {
  /** The largest loading of a limited current, %, now and after the moves. */
  readonly largestLoadingPercent: { readonly before: number; readonly after: number };
  /** Every loading over 100 % added, percentage points, now and after. */
  readonly overSumPercent: { readonly before: number; readonly after: number };
  /** True when the answer keeps every limit in the fast model (the present wiring does not). */
  readonly within: boolean;
  /**
   * True when no arrangement within the move limit has a smaller overload in the fast model (branch-and-bound
   * completed): among the circuits of `boards.movable` only, where the study restricts the boards (`search.onlyBoards`).
   */
  readonly proven: boolean;
  /** What the answer leaves most over, in words (the file's phase names), with its loading, %; null where nothing is. */
  readonly worst: { readonly what: string; readonly loadingPercent: number; readonly limit: 'rating' | 'capacity' } | null;
  /** Where the move limit keeps an overload that more moves remove: the moves an arrangement within every limit takes; else null. */
  readonly movesForWithin: number | null;
  /**
   * Where the study lets only some boards' circuits move and the answer stays over: the moves with which an
   * arrangement of every board's circuits (same move limit) keeps every limit, found by local search; else null.
   */
  readonly movesForWithinAllBoards: number | null;
  /** Where the answer stays over a limit in the fast model: the least largest loading any arrangement can reach beside its own; else null. */
  readonly bound: LoadingBound | null;
}

/** One board's neutral with harmonics (the harmonic study at the file's loads), now and after the moves. */
export interface HarmonicNeutralComparison {
  readonly board: string;
  readonly ratingA: number | null;
  readonly before: HarmonicNeutralFigures;
  readonly after: HarmonicNeutralFigures;
}

export interface HarmonicNeutralFigures {
  /** rms of every order, A: what heats the conductor. */
  readonly rmsA: number;
  /** rms of the triplen orders (3, 9, 15…), A: rebalancing does not move them. */
  readonly triplenA: number;
  /** rms against the neutral's rating, %; null without a rating. */
  readonly loadingPercent: number | null;
}

export interface RebalanceReport {
  /** The board, or the installation (its name) when it has several boards. */
  /**
   * `phaseNames`: how the file names phases; moves stay in A/B/C here, reports relabel them. `region`: the
   * trade practice the file follows (its conventions); on a North-American board reports show the NEMA MG 1
   * line-voltage unbalance rate beside |V2|/|V1|.
   */
  readonly board: { readonly name: string; readonly system: string; readonly phaseNames?: PhaseNaming; readonly region: Region };
  /** Every board (main board first, then the file's order), those whose circuits could move, and those whose incomers the score reads. */
  readonly boards: { readonly all: readonly string[]; readonly movable: readonly string[]; readonly measured: readonly string[] };
  /**
   * True on a single-phase supply: one line carries every circuit, so there is nothing to rebalance
   * (the text report says so and shows no scores; the figures here are the board as it stands).
   */
  readonly oneLine: boolean;
  /** The weights of the built-in score, or `custom` for a caller's objective. */
  readonly aim: AimWeights | 'custom';
  readonly combine: 'worst' | 'weighted';
  readonly moveLimit: number | null;
  /**
   * The search that gave the answer: `exact` when branch-and-bound ran (`proven`, or stopped at its node
   * budget: `search.budgetReached`), `local-search` when only the local search ran (the best found, with its bound).
   */
  readonly method: 'exact' | 'local-search';
  /** The method the caller asked for (`auto` chooses by the number of movable circuits). */
  readonly methodAsked: 'auto' | 'exact' | 'local-search';
  /**
   * True when no assignment within the move limit ranks better: a lower score, or where the answer is over a
   * limit (`overload`), a smaller overload (then score, then moves).
   */
  readonly proven: boolean;
  /** Scores in the fast model (lower is better; A for current figures, % for unbalance figures). */
  readonly score: {
    readonly before: number;
    readonly after: number;
    /** No assignment within the move limit scores below this; null where the answer is over a limit (it is ranked by overload first). */
    readonly lowerBound: number | null;
    readonly gap: number | null;
    readonly gapPercent: number | null;
  };
  /** The same score computed from the network-solved figures. */
  readonly solvedScore: { readonly before: number; readonly after: number };
  readonly moves: readonly CircuitMove[];
  /** One per load condition and measured board, conditions in order. */
  readonly conditions: readonly ConditionComparison[];
  /** Installations: the boards the score does not read, network-solved before and after. */
  readonly otherBoards: readonly UnmeasuredBoardComparison[];
  /** Every board's voltages against its own limits, now and after, per condition (conditions in order, boards main first). */
  readonly voltages: readonly BoardVoltageComparison[];
  /**
   * Everything over its capacity after the moves, worst first: lines over the study's `lineCapacityA`
   * (fast model), and every conductor or supply unit over the file's rating in the re-solve (what
   * `trivar solve` of the rewritten file warns of). Empty when everything is within.
   */
  readonly capacityExceeded: readonly CapacityExcess[];
  /**
   * True when the file rates something (a conductor's `ratingA`, the transformer, a bank's units): the search
   * then keeps each rated current within its rating (fast model) where some arrangement can; where none can
   * (the board is over a rating as things stand), it lowers the overload first (`overload`).
   */
  readonly ratingsKept: boolean;
  /**
   * Where the present wiring or the answer is over a limit (a study capacity or the file's rating, fast model):
   * the overload measure the search lowers before the score. Null where both keep every limit.
   */
  readonly overload: Overload | null;
  readonly moveTable: readonly MoveTableRow[] | null;
  /**
   * Fewest-moves mode: the % asked for and the best score it was measured from, the best of the answers that keep
   * every limit (an answer over one ranks by its overload first). Where none does, `bestScore` is null and
   * `applied` false: the answer is the least overload, whatever its moves.
   */
  readonly nearBest: { readonly percent: number; readonly bestScore: number | null; readonly applied: boolean } | null;
  readonly search: {
    /** Circuits on the boards whose circuits may move (`boards.movable`). */
    readonly circuits: number;
    /** Circuits in the whole installation (the board's, on a single board). */
    readonly circuitsInInstallation: number;
    /** The boards the study lets circuits move on, where it names fewer than every board; null where every board's may move. */
    readonly onlyBoards: readonly string[] | null;
    /** True when a rated limit was tightened after the network re-solve put an answer the fast model kept within over it (then searched again). */
    readonly limitsTightened: boolean;
    readonly movable: number;
    readonly pinned: number;
    /** Branch-and-bound nodes visited, over every search the answer and its table needed. */
    readonly nodes: number;
    /** The node budget of each branch-and-bound search; null when none ran. */
    readonly nodeBudget: number | null;
    /** True when the branch-and-bound search for the answer stopped at its budget (the answer is then the best found). */
    readonly budgetReached: boolean;
  };
  /**
   * Files with harmonic data (`withHarmonicNeutral`): each board's neutral rms now and after the moves.
   * The condition figures above are the fundamental only. Absent otherwise.
   */
  readonly harmonicNeutral?: readonly HarmonicNeutralComparison[];
  /** Facts about this answer worth reading (nothing to move, re-solve disagreement...). */
  readonly notes: readonly string[];
  readonly cautions: readonly string[];
}
