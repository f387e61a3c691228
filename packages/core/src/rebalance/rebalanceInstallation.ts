/**
 * The rebalancing study: which circuits to move to which connection, on any
 * board of an installation (a single board is the installation with one board).
 *
 *   study ─resolve─▶ problem (fast complex-power model) ─local search─▶ answer
 *     ─branch-and-bound (small boards)─▶ proven answer, or polygon lower bound ─▶ gap
 *     ─move table / fewest moves─▶ chosen answer ─network solver─▶ before/after figures
 */
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import type { Installation } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { NAME_CONTROLS_MESSAGE, NAME_WITHOUT_CONTROLS } from '../board/boardRanges.js';
import { InputError, inputIssue, quoteText } from '../errors.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { assertFiniteResult } from '../analysis/assertFiniteResult.js';
import { analyseSolution } from '../analysis/analyseSolution.js';
import { solveInstallationNetwork } from '../network/solveNetwork.js';
import { collapseError } from '../analysis/viableOperatingPoint.js';
import type { BoardResult } from '../analysis/boardResult.js';
import type { VoltageCheck } from '../analysis/voltageCheck.js';
import * as z from 'zod';
import {
  homeChoice,
  isBetter,
  largestOverload,
  magnitudesOf,
  OVERLOAD_TIE,
  scoreChoice,
  sumQuantities,
  tieTolerance,
  withinLimits,
  type AssignmentProblem,
  type ScoredChoice,
} from './assignmentProblem.js';
import { magnitudeBoundsWithMoveLimit } from './assignmentBounds.js';
import { buildAssignmentProblem, type BuiltProblem } from './buildAssignmentProblem.js';
import { conditionFigures, builtInObjective, guardedObjective, type ConditionFigures, type ConditionLayout, type RebalanceObjective } from './rebalanceObjective.js';
import { resolveRebalanceSpec, type RebalanceContext, type ResolvedRebalance } from './rebalanceRules.js';
import { rebalanceTree, type RebalanceTree } from './rebalanceTree.js';
import { searchExact } from './searchExact.js';
import { greedyChoice, searchLocal, trimMoves } from './searchLocal.js';
import { searchMeetInMiddle } from './searchMeetInMiddle.js';
import { termBoundFor } from './termBounds.js';
import { leastLoadingBound, LOADING_BOUND_STEPS, loadingBoundOf, UNREACHABLE_MARGIN } from './loadingBound.js';
import { ratedReadings, type RatedReading } from './ratedCurrentLimits.js';
import { installationInCondition, moveInstallationCircuits } from './applyMoves.js';
import type { BoardVoltageComparison, CapacityExcess, CircuitMove, ConditionComparison, LoadingBound, MoveTableRow, Overload, RebalanceReport } from './rebalanceResult.js';
import { REBALANCE_NOTES, rebalanceCautions } from './rebalanceWording.js';
import { movedCircuitNumber } from './movedCircuitNumber.js';
import { bankInServiceWords, listedBanksInService } from '../analysis/banksInServiceWords.js';
import { assertInstallationModel } from '../board/modelGuards.js';

const optionsSchema = z.strictObject({
  method: z.enum(['auto', 'exact', 'local-search']).optional(),
  exactUpTo: z.int().min(0).optional(),
  nodeBudget: z.int().positive().optional(),
  kicks: z.int().min(0).optional(),
  seed: z.int().optional(),
  moveTable: z.boolean().optional(),
  objective: z.function().optional(),
  profile: z.looseObject({}).optional(),
  loadConditions: z
    // Names made from interval times and what peaks there, any length; still no control characters.
    .array(z.strictObject({ name: z.string().min(1).regex(NAME_WITHOUT_CONTROLS, { message: NAME_CONTROLS_MESSAGE }), weight: z.number().nonnegative(), factors: z.array(z.strictObject({ re: z.number(), im: z.number() })) }))
    .optional(),
});

export interface RebalanceOptions {
  /**
   * `exact` always runs branch-and-bound (to the node budget), `local-search` never,
   * `auto` runs it on boards with at most `exactUpTo` movable circuits.
   * @defaultValue 'auto'
   */
  readonly method?: 'auto' | 'exact' | 'local-search';
  /** @defaultValue 18 (movable circuits: proven within half a second of CPU on random boards, see README) */
  readonly exactUpTo?: number;
  /** Most branch-and-bound nodes before it stops and reports the best found. @defaultValue 2 000 000 (a few seconds) */
  readonly nodeBudget?: number;
  /** Random kicks of the local search after its first local optimum. @defaultValue 100 */
  readonly kicks?: number;
  /** Seed of the local search's generator (answers are repeatable). @defaultValue 1 */
  readonly seed?: number;
  /** Also tabulate the best score with 0, 1, 2… moves. @defaultValue true (always on in fewest-moves mode) */
  readonly moveTable?: boolean;
  /**
   * Your own score of the condition figures (lower is better) instead of the
   * aim weights. It must never fall when a figure grows (see `RebalanceObjective`). It sees frozen
   * copies of the figures; a score that is not a finite number is refused (InputError at `objective`).
   * The search gives it the fast model's figures, whose `lineVoltageRatePercent` is null; `solvedScore`
   * is the same score of the network re-solve's, where that figure is filled in.
   */
  readonly objective?: RebalanceObjective;
  /** The file's `profile:` section, read when the study's conditions are `"scenarios"`. */
  readonly profile?: RebalanceContext['profile'];
  /**
   * Load conditions that replace the study's, each a complex multiplier of every
   * circuit's rating (board by board, in file order); `conditionsFromIntervals` builds them from interval data.
   */
  readonly loadConditions?: RebalanceContext['loadConditions'];
}

interface ResolvedOptions {
  readonly method: 'auto' | 'exact' | 'local-search';
  readonly exactUpTo: number;
  readonly nodeBudget: number;
  readonly kicks: number;
  readonly seed: number;
  readonly moveTable: boolean;
  readonly objective: RebalanceObjective | undefined;
}

function resolveOptions(options: RebalanceOptions): ResolvedOptions {
  parseOptions(optionsSchema, options, 'rebalanceBoard options');
  return {
    method: options.method ?? 'auto',
    exactUpTo: options.exactUpTo ?? 18,
    nodeBudget: options.nodeBudget ?? 2_000_000,
    kicks: options.kicks ?? 100,
    seed: options.seed ?? 1,
    moveTable: options.moveTable ?? true,
    objective: options.objective && guardedObjective(options.objective),
  };
}

/**
 * Meet-in-the-middle rounds for one-quantity scores, each freeing 16 circuits (2 × 6561 placings):
 * on random boards of 24–36 circuits six rounds took the neutral current from about 0.3 A after the
 * local search to a few mA, in a few milliseconds each.
 */
const MEET_ROUNDS = 6;
const MEET_SIZE = 16;

/** Kicks for the incumbent handed to branch-and-bound (which then proves or improves it). */
const EXACT_INCUMBENT_KICKS = 30;

interface Answer {
  readonly best: ScoredChoice;
  readonly lowerBound: number | null;
  readonly proven: boolean;
  readonly exactRan: boolean;
  /** Branch-and-bound stopped at the node budget before it could prove this answer. */
  readonly budgetReached: boolean;
  readonly nodes: number;
  /** Each quantity's polygon bound over the answers within this move limit, where the search computed them. */
  readonly magnitudeBounds: Float64Array | null;
}

/** Best answer with at most `limit` moves: local search, then branch-and-bound where it pays. */
/** What every answer of one study shares: the problem, its one-quantity index, the decomposed bound. */
interface Search {
  readonly p: AssignmentProblem;
  readonly single: number | null;
  readonly termBound: ((bounds: Float64Array) => number) | null;
}

/** Move counts the table answers one by one before it steps. */
const TABLE_EVERY_MOVE_UP_TO = 20;
/** Ratio between the counts the table lists past that. */
const TABLE_STEP = 1.25;

/**
 * The move limits the table answers: every one from the forced moves up to 20 more, then each about
 * a quarter more than the last, and the whole limit. Every row is a full search: one per move up to
 * a limit of 277 moves (an installation of 500 circuits) took 85 s and gave a table no one reads.
 */
export function tableMoveCounts(forced: number, limit: number): number[] {
  const counts: number[] = [];
  for (let m = forced; m <= limit; ) {
    counts.push(m);
    m = m < forced + TABLE_EVERY_MOVE_UP_TO ? m + 1 : Math.max(m + 1, Math.ceil(m * TABLE_STEP));
  }
  if (counts.at(-1) !== limit) counts.push(limit);
  return counts;
}

function answerWithin({ p, single, termBound }: Search, limit: number, o: ResolvedOptions, tie: number, hints: readonly ScoredChoice[]): Answer {
  const n = p.circuitCount;
  const starts = [homeChoice(p)];
  if (limit >= n) starts.push(greedyChoice(p));
  for (const hint of hints) starts.push(hint.moves <= limit ? hint.choice : trimMoves(p, hint.choice, limit, tie));
  const exactRan = o.method === 'exact' || (o.method === 'auto' && n <= o.exactUpTo);
  // With branch-and-bound to follow, the local search only needs a fair incumbent.
  const kicks = exactRan ? Math.min(o.kicks, EXACT_INCUMBENT_KICKS) : o.kicks;
  let best = searchLocal(p, starts, { moveLimit: limit, kicks, seed: o.seed, tie });
  if (single !== null && !exactRan)
    best = searchMeetInMiddle(p, best, { quantity: single, moveLimit: limit, rounds: MEET_ROUNDS, size: MEET_SIZE, seed: o.seed, tie });
  let proven = false;
  let budgetReached = false;
  let nodes = 0;
  if (exactRan) {
    const exact = searchExact(p, { moveLimit: limit, nodeBudget: o.nodeBudget, incumbent: best, tie });
    best = exact.best;
    proven = exact.complete;
    budgetReached = !exact.complete;
    nodes = exact.nodes;
  }
  let lowerBound: number | null = null;
  let bounds: Float64Array | null = null;
  if (proven) lowerBound = best.score;
  else {
    bounds = magnitudeBoundsWithMoveLimit(p, limit);
    lowerBound = termBound ? Math.max(p.score(bounds), termBound(bounds)) : p.score(bounds);
  }
  if (!proven && lowerBound !== null && withinLimits(best) && lowerBound <= best.score + tie) proven = lowerBound >= best.score - tie;
  // A score that falls as a figure grows (only possible for a custom one) voids the bound.
  if (lowerBound !== null && lowerBound > best.score + tie) lowerBound = null;
  // Over a limit, the score's bound is over answers the overload ranks differently: no bound on this answer's score.
  if (!withinLimits(best)) lowerBound = null;
  return { best, lowerBound: lowerBound === null ? null : Math.min(lowerBound, best.score), proven, exactRan, budgetReached, nodes, magnitudeBounds: bounds };
}

/**
 * The fewest moves above `limit` with which an answer keeps every limit, `within` being one that does: by
 * bisection on the move limit (an answer allowed m moves is allowed more), each probe a search of its own.
 */
function fewestMovesWithin(search: Search, limit: number, within: ScoredChoice, o: ResolvedOptions, tie: number): number {
  let over = limit;
  let enough = within.moves;
  while (enough - over > 1) {
    const m = Math.floor((over + enough) / 2);
    const probe = answerWithin(search, m, o, tie, [within]).best;
    if (withinLimits(probe)) enough = Math.min(m, probe.moves);
    else over = m;
  }
  return enough;
}

/** |I2|/|I1| of a board that draws no current has no value (0/0): null, as on a board without the figure. */
const idleRatioVoid = (f: ConditionFigures): ConditionFigures => (f.lineA.every((a) => a === 0) ? { ...f, currentUnbalancePercent: null } : f);

/** The fast model's figures for the report (the search reads conditionFigures itself). */
function figuresOf(layouts: readonly ConditionLayout[], p: AssignmentProblem, choice: Int32Array): ConditionFigures[] {
  const mags = magnitudesOf(sumQuantities(p, choice), new Float64Array(p.quantityCount));
  return layouts.map((l) => idleRatioVoid(conditionFigures(l, mags)));
}

function solvedFigures(name: string, board: string, result: BoardResult): ConditionFigures {
  const lineA = result.phases.map((ph) => ph.current.magnitude);
  return idleRatioVoid({
    name,
    board,
    lineA,
    largestLineA: Math.max(...lineA),
    neutralA: result.neutral ? result.neutral.current.magnitude : null,
    currentUnbalancePercent: result.unbalance ? result.unbalance.currentNegativePercent : null,
    voltageUnbalancePercent: result.unbalance ? result.unbalance.voltageFactorPercent : null,
    lineVoltageRatePercent: result.unbalance ? result.unbalance.lineVoltageRatePercent : null,
  });
}

/**
 * Where the study lets only some boards' circuits move: the fewest moves with which an arrangement of every board's
 * circuits (same move limit, pins and limits, file's ratings untightened) keeps every limit in the fast model, by
 * local search; null where none found does.
 */
function fewestMovesOnEveryBoard(
  tree: RebalanceTree,
  study: unknown,
  resolved: ResolvedRebalance,
  options: RebalanceOptions,
  o: ResolvedOptions,
  solvedNow: readonly { readonly results: readonly BoardResult[] }[],
  tie: number,
): number | null {
  const every = resolveRebalanceSpec({ ...(study as object), boards: undefined }, tree, { profile: options.profile, loadConditions: options.loadConditions });
  const built = buildAssignmentProblem(tree, { ...every, conditions: resolved.conditions }, o.objective, solvedNow.map((x) => x.results.map((r) => r.phases.map((ph) => ph.current.magnitude))));
  const p = built.problem;
  const search: Search = { p, single: null, termBound: null };
  const quick = { ...o, method: 'local-search' as const };
  const limit = Math.min(every.moveLimit, p.circuitCount);
  const wider = answerWithin(search, limit, quick, tie, []).best;
  if (!withinLimits(wider)) return null;
  // Below the forced moves no answer exists; the present wiring (no forced move) is over, or the restricted search would not be.
  const forced = built.slots.filter((s) => !s.options.includes(s.present)).length;
  const moves = fewestMovesWithin(search, Math.max(forced - 1, 0), wider, quick, tie);
  // None: the present wiring is within before any tightening of the ratings, nothing the other boards add.
  return moves > 0 ? moves : null;
}

/** Capacity below what no spread of the movable circuits can avoid is a bad study, whatever the move limit. */
function checkCapacity(built: BuiltProblem, study: ResolvedRebalance, tie: number): void {
  if (study.lineCapacityA.every((c) => c === Infinity)) return;
  const bounds = magnitudeBoundsWithMoveLimit(built.problem, built.problem.circuitCount);
  const several = built.layouts.length > new Set(built.layouts.map((l) => l.condition)).size;
  // Parseval: the largest line current is at least the part no assignment changes (|I1|, or the split-phase share).
  const balanced = built.layouts.flatMap((layout) => {
    const best = Math.max(...layout.lines.map((_, k) => study.lineCapacityA[k]!));
    if (!(layout.balancedA > best + tie)) return [];
    const path = study.capacityPaths.every((x) => x === 'lineCapacityA') ? 'lineCapacityA' : study.capacityPaths[0]!.replace(/\.[ABC]$/, '');
    return [
      inputIssue(
        'capacity_unreachable',
        path,
        `a capacity of at least ${layout.balancedA.toFixed(1)} A on some line${several ? ` at ${quoteText(layout.board)}` : ''} in ${quoteText(layout.name)}: spread perfectly, the load still draws ${layout.balancedA.toFixed(1)} A per line`,
        best,
      ),
    ];
  });
  if (balanced.length) throw new InputError(balanced, 'the rebalancing study is not valid');
  const issues = built.layouts.flatMap((layout, c) =>
    layout.lines.flatMap((j, k) => {
      const cap = study.lineCapacityA[k]!;
      if (!(bounds[j]! > cap + tie)) return [];
      const line = ['A', 'B', 'C'][k];
      const fixed = built.fixedLineA[c]![k]!;
      const at = several ? ` at ${quoteText(layout.board)}` : '';
      return [
        inputIssue(
          'capacity_unreachable',
          study.capacityPaths[k]!,
          `a capacity of at least ${bounds[j]!.toFixed(1)} A for line ${line}${at} in ${quoteText(layout.name)}: the circuits that cannot move draw ${fixed.toFixed(1)} A on it and no spread of the others brings it lower`,
          cap,
        ),
      ];
    }),
  );
  if (issues.length) throw new InputError(issues, 'the rebalancing study is not valid');
}

/** Every line of the answer above its capacity in the fast model, worst first. */
function capacityExcesses(built: BuiltProblem, study: ResolvedRebalance, choice: Int32Array, tie: number): CapacityExcess[] {
  const p = built.problem;
  const mags = magnitudesOf(sumQuantities(p, choice), new Float64Array(p.quantityCount));
  const now = magnitudesOf(sumQuantities(p, homeChoice(p)), new Float64Array(p.quantityCount));
  const out: CapacityExcess[] = [];
  built.layouts.forEach((layout) =>
    layout.lines.forEach((j, k) => {
      const cap = study.lineCapacityA[k]!;
      if (mags[j]! > cap + tie)
        out.push({
          board: layout.board,
          condition: layout.name,
          conductor: 'line',
          line: ['A', 'B', 'C'][k] as 'A',
          winding: null,
          currentA: mags[j]!,
          capacityA: cap,
          overA: mags[j]! - cap,
          limit: 'study',
          nowA: now[j]!,
          change: changeOf(now[j]!, mags[j]!, cap, tie),
        });
    }),
  );
  return out.sort((a, b) => b.overA - a.overA);
}

/** Searches after the first that a rating the re-solve puts over may ask for (each tightens the limits it broke). */
const RATING_PASSES = 3;

/** The rated rows (buildAssignmentProblem.ts `rated`) of one rated item: a supply unit's or the transformer's rating limits the lines it carries. */
function ratedRowsOf(built: BuiltProblem, tree: RebalanceTree, e: Pick<CapacityExcess, 'board' | 'condition' | 'conductor' | 'line' | 'winding'>): BuiltProblem['rated'] {
  const b = tree.names.indexOf(e.board);
  const board = tree.boards[b]!;
  // Every condition is read at each measured board, so a layout names its index.
  const condition = built.layouts.find((l) => l.name === e.condition)!.condition;
  const lines: (number | null)[] =
    e.conductor === 'neutral'
      ? [null]
      : e.conductor === 'line'
        ? [board.phases.indexOf(e.line!)]
        : e.conductor === 'source-unit'
          ? [board.phases.indexOf(board.sourceUnits!.find((u) => u.winding === e.winding)!.line)]
          : board.phases.map((_, k) => k);
  return built.rated.filter((r) => r.board === b && r.condition === condition && lines.includes(r.line));
}

/** True when the fast model's answer too has a rated item over its limit: the search chose it as the least overload. */
function overInModel(built: BuiltProblem, tree: RebalanceTree, afterMagnitudes: Float64Array, e: Parameters<typeof ratedRowsOf>[2]): boolean {
  return ratedRowsOf(built, tree, e).some((r) => afterMagnitudes[r.quantity]! > built.problem.limits[r.quantity]! * (1 + OVERLOAD_TIE));
}

/**
 * Tightens the fast model's limit on each quantity whose rating the re-solve of an answer put over where the fast
 * model kept it within: by the ratio of the rating to the re-solved figure, a little more. An item the fast model
 * has over too is the least overload the search found, not the model's error: left as it is. False when there was
 * nothing to tighten.
 */
function tightenRatedLimits(built: BuiltProblem, tree: RebalanceTree, over: readonly CapacityExcess[], afterMagnitudes: Float64Array): boolean {
  let tightened = false;
  for (const e of over) {
    if (!(e.currentA > 0) || overInModel(built, tree, afterMagnitudes, e)) continue;
    const ratio = (e.capacityA / e.currentA) * (1 - TIGHTEN_MARGIN);
    for (const r of ratedRowsOf(built, tree, e)) {
      built.problem.limits[r.quantity] = Math.min(built.problem.limits[r.quantity]!, built.problem.limits[r.quantity]! * ratio);
      tightened = true;
    }
  }
  return tightened;
}

/**
 * The largest |q| / limit over the limited quantities, % (fast model, each limit as the search holds it: a rating
 * scaled by the fast model's reading of the present wiring, above or below the re-solve, and tightened where a
 * re-solve put an answer over it; so over 100 % exactly where the search counts it over); null where nothing is limited.
 */
function largestLoadingPercent(p: AssignmentProblem, choice: Int32Array): number | null {
  const mags = magnitudesOf(sumQuantities(p, choice), new Float64Array(p.quantityCount));
  let largest: number | null = null;
  for (let j = 0; j < mags.length; j++) if (Number.isFinite(p.limits[j]!)) largest = Math.max(largest ?? 0, (100 * mags[j]!) / p.limits[j]!);
  return largest;
}

/** One limited current's loading (current / limit) now and after the moves, network re-solve. */
interface Loading {
  readonly what: string;
  readonly before: number;
  readonly after: number;
  readonly limit: 'rating' | 'capacity';
}

/**
 * Every limited current's loading in the network re-solve, now and after: each rating the file gives, as trivar
 * solve judges it, and each measured board's lines against the study's capacity.
 */
function loadingsOf(
  conditions: readonly { readonly name: string }[],
  solved: readonly { readonly before: { readonly results: readonly BoardResult[] }; readonly after: { readonly results: readonly BoardResult[] } }[],
  tree: RebalanceTree,
  study: ResolvedRebalance,
  label: (term: string) => string,
): Loading[] {
  const key = (r: RatedReading) => `${r.conductor}:${r.at}`;
  const where = (board: string, condition: string) =>
    `${tree.boards.length > 1 ? ` at ${quoteText(board)}` : ''}${conditions.length > 1 ? ` in ${quoteText(condition)}` : ''}`;
  return conditions.flatMap((c, ci) =>
    tree.boards.flatMap((board, b): Loading[] => {
      const now = solved[ci]!.before.results[b]!;
      const then = solved[ci]!.after.results[b]!;
      const after = new Map(ratedReadings(then, board).map((r) => [key(r), r]));
      const rated = ratedReadings(now, board).map((r): Loading => ({
        what: `${REBALANCE_NOTES.ratedItem(r, label)}${where(tree.names[b]!, c.name)}`,
        before: r.currentA / r.ratingA,
        after: after.get(key(r))!.currentA / r.ratingA,
        limit: 'rating',
      }));
      const capacity = !study.measuredBoards.includes(b)
        ? []
        : board.phases.flatMap((phase, k): Loading[] => {
            const cap = study.lineCapacityA[k]!;
            if (!Number.isFinite(cap)) return [];
            const what = `line ${label(phase)}${where(tree.names[b]!, c.name)}`;
            return [{ what, before: now.phases[k]!.current.magnitude / cap, after: then.phases[k]!.current.magnitude / cap, limit: 'capacity' }];
          });
      return [...rated, ...capacity];
    }),
  );
}

/**
 * The overload of the present wiring and the answer, with what stays over most (network re-solve); null where both
 * keep every limit in the fast model the search ranks answers by (assignmentProblem.ts isBetter).
 */
function overloadSummary(
  home: ScoredChoice,
  chosen: Answer,
  loadings: readonly Loading[],
  movesForWithin: number | null,
  movesForWithinAllBoards: number | null,
  bound: LoadingBound | null,
): Overload | null {
  if (withinLimits(home) && withinLimits(chosen.best)) return null;
  const largest = (side: 'before' | 'after') => 100 * Math.max(0, ...loadings.map((x) => x[side]));
  const overSum = (side: 'before' | 'after') => 100 * loadings.reduce((t, x) => t + Math.max(0, x[side] - 1), 0);
  const worst = [...loadings].sort((a, b) => b.after - a.after)[0];
  return {
    largestLoadingPercent: { before: largest('before'), after: largest('after') },
    overSumPercent: { before: overSum('before'), after: overSum('after') },
    within: withinLimits(chosen.best),
    proven: chosen.proven,
    worst: worst && worst.after > 1 ? { what: worst.what, loadingPercent: 100 * worst.after, limit: worst.limit } : null,
    movesForWithin,
    movesForWithinAllBoards,
    bound,
  };
}

/** Beyond the ratio, so the next answer is not one on the edge the re-solve tips over again. */
const TIGHTEN_MARGIN = 0.002;

/** The problem with the study's line capacities only: what the file's ratings cost, for a note. */
function withoutRatings(built: BuiltProblem, study: ResolvedRebalance): AssignmentProblem {
  const limits = new Float64Array(built.problem.quantityCount).fill(Infinity);
  built.layouts.forEach((l) => l.lines.forEach((j, k) => (limits[j] = study.lineCapacityA[k]!)));
  return { ...built.problem, limits };
}

/** Whether a figure over its capacity after the moves is the moves' doing. */
function changeOf(nowA: number, afterA: number, capacityA: number, tie: number): CapacityExcess['change'] {
  if (nowA <= capacityA + tie) return 'new';
  return afterA > nowA + tie ? 'worse' : 'unchanged';
}

/** A rated item over its rating now or after the moves (network re-solve), as trivar solve judges it. */
interface RatingChange {
  readonly board: string;
  readonly condition: string;
  readonly reading: RatedReading;
  readonly nowA: number;
  readonly afterA: number;
}

/** Every rating the file gives, judged on the re-solved installation now and after the moves: those over on either side. */
function ratingChanges(
  conditions: readonly { readonly name: string }[],
  solved: readonly { readonly before: { readonly results: readonly BoardResult[] }; readonly after: { readonly results: readonly BoardResult[] } }[],
  tree: RebalanceTree,
): RatingChange[] {
  const key = (r: RatedReading) => `${r.conductor}:${r.at}`;
  return conditions.flatMap((c, ci) =>
    tree.boards.flatMap((board, b) => {
      const after = new Map(ratedReadings(solved[ci]!.after.results[b]!, board).map((r) => [key(r), r]));
      return ratedReadings(solved[ci]!.before.results[b]!, board).flatMap((now) => {
        const then = after.get(key(now));
        if (!then || (now.currentA <= now.ratingA && then.currentA <= then.ratingA)) return [];
        return [{ board: tree.names[b]!, condition: c.name, reading: then, nowA: now.currentA, afterA: then.currentA }];
      });
    }),
  );
}

/** The changes over their rating after the moves, as capacity excesses. */
function ratingExcesses(changes: readonly RatingChange[]): CapacityExcess[] {
  return changes
    .filter((x) => x.afterA > x.reading.ratingA)
    .map(({ board, condition, reading: r, nowA, afterA }) => ({
      board,
      condition,
      conductor: r.conductor,
      line: r.conductor === 'line' ? (r.at as 'A') : null,
      winding: r.conductor === 'source-unit' ? r.at : null,
      currentA: afterA,
      capacityA: r.ratingA,
      overA: afterA - r.ratingA,
      limit: 'rating',
      nowA,
      // Compared as solve prints them (0.1 A): a hair's difference in the re-solve is not "worse".
      change: changeOf(nowA, afterA, r.ratingA, PRINTED_AMPS / 2),
    }));
}

/** The precision solve prints currents to, A. */
const PRINTED_AMPS = 0.1;

/** Solved figures at each board of the installation, in one condition, and each board's voltages against its own limits. */
function solveAtBoards(installation: Installation, condition: string, tree: RebalanceTree, when: string): { figures: ConditionFigures[]; voltages: VoltageCheck[]; results: BoardResult[] } {
  const solution = solveInstallationNetwork(installation);
  const results = solution.boards.map((b) => assertFiniteResult(analyseSolution(b)));
  // A work order for a supply that cannot carry its loads would rest on figures of a state that cannot exist.
  const collapsed = results.flatMap((r, k) => (r.operatingPoint.collapsed ? r.operatingPoint.findings.map((f) => `${tree.names.length > 1 ? `${tree.names[k]}, ` : ''}${when}: ${f}`) : []));
  if (collapsed.length) throw collapseError({ operatingPoint: { findings: collapsed } });
  return { figures: results.map((r, k) => solvedFigures(condition, tree.names[k]!, r)), voltages: results.map((r) => r.voltageCheck), results };
}

/** Every board in every condition, judged against the board's own voltage limits now and after the moves. */
function voltageComparisons(
  conditions: readonly { readonly name: string }[],
  solved: readonly { readonly before: { readonly voltages: readonly VoltageCheck[] }; readonly after: { readonly voltages: readonly VoltageCheck[] } }[],
  tree: RebalanceTree,
): BoardVoltageComparison[] {
  return conditions.flatMap((c, ci) =>
    tree.names.map((board, b) => {
      const before = solved[ci]!.before.voltages[b]!;
      return { name: c.name, board, limits: before.limits, before, after: solved[ci]!.after.voltages[b]! };
    }),
  );
}

/**
 * Finds which circuits to move to which connection so the score (by default the
 * largest line current plus the neutral current at each board's incomer, added
 * over the boards, in the worst load condition) is as small as possible, within
 * the move limit and line capacities, and re-solves the installation before and
 * after with the network solver.
 *
 * @param installation a normalised installation (`normaliseInstallation`); a single board is one with no sub-boards.
 * @param study the study, shaped like the file's `rebalance:` section.
 * @throws {InputError} for a bad study (paths relative to the study: `pinned[1].on`).
 * @throws {NumericalError} when the network solver cannot solve a condition.
 * @example
 * const { installation } = normaliseInstallation(parseInstallation(riser));
 * const report = rebalanceInstallation(installation, { boards: ['Floor 3'], measureAt: 'main' });
 * report.moves //=> [{ board: 'Floor 3', circuit: null, listPosition: 1, name: 'Flat 3A', from: 'A-N', to: 'B-N', circuitNumber: null }]
 */
export function rebalanceInstallation(installation: Installation, study: unknown, options: RebalanceOptions = {}): RebalanceReport {
  assertInstallationModel(installation);
  const o = resolveOptions(options);
  const tree = rebalanceTree(installation);
  const resolved = resolveRebalanceSpec(study, tree, { profile: options.profile, loadConditions: options.loadConditions });
  // The present wiring, network-solved first: the file's ratings are scaled by how far the fast model reads above or below it.
  const conditionWords = (c: { name: string }, when: string) => (resolved.conditions.length > 1 ? `${c.name}, ${when}` : when);
  const solvedNow = resolved.conditions.map((c) => solveAtBoards(installationInCondition(tree, installation, c.factors), c.name, tree, conditionWords(c, 'as it stands')));
  const built = buildAssignmentProblem(tree, resolved, o.objective, solvedNow.map((x) => x.results.map((r) => r.phases.map((ph) => ph.current.magnitude))));
  const p = built.problem;
  const n = p.circuitCount;
  const forced = built.slots.filter((s) => !s.options.includes(s.present)).length;
  if (resolved.moveLimit < forced)
    throw new InputError(
      [inputIssue('out_of_range', 'moveLimit', `at least ${forced}: that many circuits are pinned to a connection they are not on`, resolved.moveLimit)],
      'the rebalancing study is not valid',
    );
  const limit = Math.min(resolved.moveLimit, n);
  const home = scoreChoice(p, homeChoice(p));
  const tie = tieTolerance(home.score);
  checkCapacity(built, resolved, tie);

  const search: Search = { p, single: built.singleQuantity, termBound: o.objective ? null : termBoundFor(p, built.layouts, resolved.aim, resolved.combine) };
  /** The answer, its move table and the chosen row, searched over the problem's present limits. */
  const searchAnswers = () => {
    const main = answerWithin(search, limit, o, tie, []);
    let chosen = main;
    let table: MoveTableRow[] | null = null;
    let tableChoices: Int32Array[] = [];
    let nearBestScore: number | null = null;
    const wantTable = o.moveTable || resolved.nearBestPercent !== null;
    if (wantTable) {
      const rows: { moves: number; answer: Answer }[] = [];
      const rowOf = (m: number, previous: Answer | null): Answer => {
        const row: Answer = m === limit ? main : answerWithin(search, m, o, tie, previous ? [main.best, previous.best] : [main.best]);
        // An answer with fewer moves is allowed with more: rows never get worse.
        return previous && isBetter(previous.best, row.best, tie) ? { ...row, best: previous.best } : row;
      };
      let previous: Answer | null = null;
      for (const m of tableMoveCounts(forced, limit)) {
        const row = rowOf(m, previous);
        rows.push({ moves: m, answer: row });
        previous = row;
        if (!isBetter(main.best, row.best, tie)) break;
      }
      // A row's search can end better than the unlimited one (both are local searches): the answer given
      // is then that row's, so the work order never scores worse than a line of the table beside it.
      for (const { answer } of rows) {
        const a = answer.best;
        const c = chosen.best;
        // Its bound is for its own (smaller) move limit: the answer keeps the whole limit's.
        if (isBetter(a, c, tie)) {
          // Likewise whether branch-and-bound over the whole limit stopped at its budget; an answer as good as a proven one is proven.
          const proven = main.proven || (withinLimits(a) && main.lowerBound !== null && main.lowerBound >= a.score - tie);
          chosen = { ...answer, lowerBound: withinLimits(a) ? main.lowerBound : null, proven, budgetReached: main.budgetReached };
        }
      }
      // Near-best ranks the answers that keep every limit: one over a limit ranks by its overload first, and a
      // low score bought with an overload is no best to come near (the present wiring over a rating may score least).
      const withinScores = [main, ...rows.map((r) => r.answer)].filter((a) => withinLimits(a.best)).map((a) => a.best.score);
      if (resolved.nearBestPercent !== null && withinScores.length) {
        const best = Math.min(...withinScores);
        nearBestScore = best;
        const target = best * (1 + resolved.nearBestPercent / 100) + tie;
        const near = (a: Answer) => a.best.score <= target && withinLimits(a.best);
        let at = rows.findIndex((r) => near(r.answer));
        // Between two counts the table steps over, the fewest moves that come within the target, by bisection.
        // Each probe goes into the table; `at` stays on the first row within the target.
        while (at > 0 && rows[at]!.moves - rows[at - 1]!.moves > 1) {
          const m = Math.floor((rows[at - 1]!.moves + rows[at]!.moves) / 2);
          const row = rowOf(m, rows[at - 1]!.answer);
          rows.splice(at, 0, { moves: m, answer: row });
          if (!near(row)) at++;
        }
        const row = at >= 0 ? rows[at]! : null;
        if (row && row.moves < limit) chosen = answerWithin(search, row.moves, o, tie, [main.best]);
      }
      table = rows.map(({ moves, answer: a }) => ({
        moves,
        score: a.best.score,
        lowerBound: a.lowerBound,
        proven: a.proven,
        movesUsed: a.best.moves,
        withinCapacity: withinLimits(a.best),
        largestLoadingPercent: largestLoadingPercent(p, a.best.choice),
        loadingSolved: false,
      }));
      tableChoices = rows.map((r) => r.answer.best.choice);
    }
    return { main, chosen, table, tableChoices, nearBestScore };
  };
  /** The work order of an answer and the installation re-solved with it. */
  const outcomeOf = (choice: Int32Array) => {
    const moves: CircuitMove[] = [];
    const moveMap = new Map<number, ConnectionSpec>();
    built.slots.forEach((slot, i) => {
      const to = slot.options[choice[i]!]!;
      if (to !== slot.present) {
        const board = tree.boards[tree.circuits[slot.flat]!.board]!;
        const schedule = board.loads[slot.loadIndex]!.schedule;
        const circuit = schedule?.circuit ?? null;
        moves.push({ board: slot.boardName, circuit, listPosition: slot.loadIndex + 1, name: slot.name, from: slot.present, to, circuitNumber: movedCircuitNumber(board, circuit, to, schedule?.poles) });
        moveMap.set(slot.flat, to);
      }
    });
    const moved = moveInstallationCircuits(tree, moveMap);
    const solved = resolved.conditions.map((c, ci) => ({
      before: solvedNow[ci]!,
      after: solveAtBoards(installationInCondition(tree, moved, c.factors), c.name, tree, conditionWords(c, 'after the moves')),
    }));
    return { moves, moved, solved };
  };
  let { main, chosen, table, tableChoices, nearBestScore } = searchAnswers();
  let { moves, solved } = outcomeOf(chosen.best.choice);
  let limitsTightened = false;
  // The limits as the file and study give them, before a re-solve tightens any: what the stated bound is against.
  const givenLimits = Float64Array.from(p.limits);
  // Where the re-solve puts a rating over that the fast model kept, that limit is tightened by as much and the search runs again.
  const magnitudesAfter = (c: Int32Array) => magnitudesOf(sumQuantities(p, c), new Float64Array(p.quantityCount));
  for (let pass = 0; pass < RATING_PASSES && tightenRatedLimits(built, tree, ratingExcesses(ratingChanges(resolved.conditions, solved, tree)), magnitudesAfter(chosen.best.choice)); pass++) {
    limitsTightened = true;
    ({ main, chosen, table, tableChoices, nearBestScore } = searchAnswers());
    ({ moves, solved } = outcomeOf(chosen.best.choice));
  }
  const choice = chosen.best.choice;
  const beforeModel = figuresOf(built.layouts, p, homeChoice(p));
  const afterModel = figuresOf(built.layouts, p, choice);
  const conditions: ConditionComparison[] = built.layouts.map((l, k) => {
    const b = tree.names.indexOf(l.board);
    return {
      name: l.name,
      board: l.board,
      weight: l.weight,
      model: { before: beforeModel[k]!, after: afterModel[k]! },
      solved: { before: solved[l.condition]!.before.figures[b]!, after: solved[l.condition]!.after.figures[b]! },
    };
  });
  const unmeasured = tree.boards.length > 1 ? resolved.conditions.flatMap((c, ci) =>
    tree.names
      .map((name, b) => ({ name, b }))
      .filter(({ b }) => !resolved.measuredBoards.includes(b))
      .map(({ name, b }) => ({ name: c.name, board: name, weight: c.weight, before: solved[ci]!.before.figures[b]!, after: solved[ci]!.after.figures[b]! })),
  ) : [];
  const objective = o.objective ?? builtInObjective(resolved.aim, resolved.combine, built.layouts);
  const solvedScore = {
    before: objective(conditions.map((c) => c.solved.before)),
    after: objective(conditions.map((c) => c.solved.after)),
  };

  const notes: string[] = [];
  // Notes name lines the way the file does (L1 or A).
  const label = labellerOf(conventionsOf(tree.boards[0]!).phaseNames);
  // Banks the file lists in service (harmonics.banks) are loads of their boards, as trivar solve has them.
  if (installation.banksInService?.length)
    notes.push(REBALANCE_NOTES.banksInService(listedBanksInService(installation).map((b) => bankInServiceWords(b))));
  const renumbered = moves.filter((m) => m.circuitNumber?.verdict === 'renumber');
  if (renumbered.length) notes.push(REBALANCE_NOTES.renumber(renumbered.map((m) => ({ board: tree.boards.length > 1 ? m.board : null, circuit: m.circuit!, name: m.name, positions: m.circuitNumber!.positions!.length }))));
  const oneLine = tree.boards[0]!.phases.length === 1;
  if (oneLine) notes.push(REBALANCE_NOTES.oneLine);
  else if (n === 0) notes.push(REBALANCE_NOTES.nothingToMove);
  else if (moves.length === 0) {
    // No move within a limit below the circuit count may be the limit's doing: a search without it says.
    const free = limit < n ? answerWithin(search, n, { ...o, method: 'local-search' }, tie, [main.best]).best : null;
    const unrated = built.rated.length ? answerWithin({ ...search, p: withoutRatings(built, resolved) }, limit, { ...o, method: 'local-search' }, tie, [main.best]).best : null;
    if (free && withinLimits(free) && free.score < home.score - tie) notes.push(REBALANCE_NOTES.limitKeepsWiring(limit, free.moves, home.score, free.score));
    else if (unrated && withinLimits(unrated) && unrated.score < home.score - tie) notes.push(REBALANCE_NOTES.ratingsKeepWiring(unrated.moves, home.score, unrated.score));
    else notes.push(REBALANCE_NOTES.alreadyBest);
  }
  if (chosen.exactRan && !chosen.proven && chosen.budgetReached) notes.push(REBALANCE_NOTES.budgetReached(o.nodeBudget));
  if (chosen.lowerBound === null && withinLimits(chosen.best) && n > 0) notes.push(REBALANCE_NOTES.noBound);
  const excesses = withinLimits(chosen.best) ? [] : capacityExcesses(built, resolved, choice, tie);
  // Where the study names the boards whose circuits may move, every proof is over those circuits only.
  const onlyBoards = tree.boards.length > 1 && resolved.movableBoards.some((m) => !m) ? tree.names.filter((_, b) => resolved.movableBoards[b]) : null;
  const limitWords = Number.isFinite(resolved.moveLimit) ? limit : null;
  const ratings = ratingChanges(resolved.conditions, solved, tree);
  const ratingOver = ratingExcesses(ratings);
  if (excesses.length) {
    const bounds = magnitudeBoundsWithMoveLimit(p, limit);
    // The study's capacities alone: the per-line polygon bound, or the least largest loading over them all.
    const capacities = withoutRatings(built, resolved);
    const impossible =
      built.layouts.some((l) => l.lines.some((j, k) => bounds[j]! > resolved.lineCapacityA[k]! + tie)) ||
      leastLoadingBound(capacities, limit, { steps: LOADING_BOUND_STEPS, reached: 1 + largestOverload(capacities, magnitudesOf(sumQuantities(capacities, choice), new Float64Array(p.quantityCount))), choice }) >
        1 + UNREACHABLE_MARGIN;
    const several = tree.boards.length > 1;
    // The note quotes the re-solve's current, as the tables beside it do; the fast model's where only it has the line over.
    const solvedA = (e: CapacityExcess) => {
      const c = conditions.find((x) => x.name === e.condition && x.board === e.board)!;
      return c.solved.after.lineA[tree.boards[0]!.phases.indexOf(e.line!)]!;
    };
    const words = excesses.map((e) => {
      const currentA = solvedA(e);
      return REBALANCE_NOTES.excess({ ...e, line: label(e.line!), currentA, fastA: currentA > e.capacityA ? null : e.currentA }, several);
    });
    notes.push(REBALANCE_NOTES.capacityNotMet(limitWords, onlyBoards, impossible || (chosen.exactRan && chosen.proven), words));
  }
  conditions.forEach(({ board, solved: { before: f } }) =>
    f.lineA.forEach((amps, k) => {
      const cap = resolved.lineCapacityA[k]!;
      if (amps > cap + tie) notes.push(REBALANCE_NOTES.overCapacityNow(tree.boards.length > 1 ? board : null, label(tree.boards[0]!.phases[k]!), amps, cap, f.name));
    }),
  );
  // The file's ratings, as trivar solve judges them on the re-solve: what the moves would overload first.
  const severalBoards = tree.boards.length > 1;
  const ratingWords = (x: RatingChange) => ({
    what: REBALANCE_NOTES.ratedItem(x.reading, label),
    board: severalBoards ? x.board : null,
    condition: resolved.conditions.length > 1 ? x.condition : null,
    nowA: x.nowA,
    afterA: x.afterA,
    ratingA: x.reading.ratingA,
  });
  const caused = ratingOver.filter((e) => e.change !== 'unchanged');
  const keyOfExcess = (e: CapacityExcess) => `${e.board}|${e.condition}|${e.conductor}|${e.line ?? e.winding}`;
  const causedKeys = new Set(caused.map(keyOfExcess));
  const keyOf = (x: RatingChange) => `${x.board}|${x.condition}|${x.reading.conductor}|${x.reading.at}`;
  // What the fast model has over too is the least overload the search found (a trade it chose); the rest is the re-solve's alone.
  const afterMagnitudes = magnitudesAfter(choice);
  const tradedKeys = new Set(caused.filter((e) => overInModel(built, tree, afterMagnitudes, e)).map(keyOfExcess));
  const slipped = ratings.filter((x) => causedKeys.has(keyOf(x)) && !tradedKeys.has(keyOf(x)));
  const traded = ratings.filter((x) => tradedKeys.has(keyOf(x)));
  const homeNow = scoreChoice(p, homeChoice(p));
  // Whether the move limit is what keeps an overload: the same search without it.
  const wider = !withinLimits(chosen.best) && limit < n ? answerWithin(search, n, o, tie, [chosen.best]).best : null;
  const movesForWithin = wider && withinLimits(wider) ? fewestMovesWithin(search, limit, wider, o, tie) : null;
  if (movesForWithin !== null) notes.push(REBALANCE_NOTES.limitKeepsOverload(limit, movesForWithin));
  else if (wider && wider.excess < chosen.best.excess - OVERLOAD_TIE)
    notes.push(REBALANCE_NOTES.limitKeepsLargerOverload(limit, wider.moves, largestLoadingPercent(p, wider.choice)!));
  const movesForWithinAllBoards = onlyBoards && !withinLimits(chosen.best) ? fewestMovesOnEveryBoard(tree, study, resolved, options, o, solvedNow, tie) : null;
  if (onlyBoards && movesForWithinAllBoards !== null) notes.push(REBALANCE_NOTES.otherBoardsWithin(onlyBoards, movesForWithinAllBoards));
  // Over a limit: the least largest loading any arrangement can reach, against the limits as given (a proof of the
  // exact search over tightened limits is not one over these).
  const given = { ...p, limits: givenLimits };
  const overGiven = !withinLimits(chosen.best) && !withinLimits(scoreChoice(given, choice));
  const loadingBound = overGiven ? loadingBoundOf(given, limit, choice, chosen.proven && !limitsTightened, main.magnitudeBounds) : null;
  const overload = overloadSummary(homeNow, chosen, loadingsOf(resolved.conditions, solved, tree, resolved, label), movesForWithin, movesForWithinAllBoards, loadingBound);
  const least = overload && {
    beforePercent: overload.largestLoadingPercent.before,
    afterPercent: overload.largestLoadingPercent.after,
    proven: overload.proven,
    unreachable: loadingBound?.limitsUnreachable ?? false,
    ratingsOnly: resolved.lineCapacityA.every((c) => c === Infinity),
    moveLimit: limitWords,
    onlyBoards,
  };
  if (resolved.nearBestPercent !== null && nearBestScore === null) notes.push(REBALANCE_NOTES.nearBestUnused(resolved.nearBestPercent));
  // The present wiring's and the answer's rows give the re-solve's loading, the one the notes and verdict quote.
  const moveTable = table?.map((row, k): MoveTableRow => {
    if (overload === null || row.largestLoadingPercent === null) return row;
    const c = tableChoices[k]!;
    const solvedLoading = row.movesUsed === 0 ? overload.largestLoadingPercent.before : c.every((x, i) => x === choice[i]) ? overload.largestLoadingPercent.after : null;
    return solvedLoading === null ? row : { ...row, largestLoadingPercent: solvedLoading, loadingSolved: true };
  }) ?? null;
  if (slipped.length) notes.unshift(REBALANCE_NOTES.overRatingAfterMoves(slipped.map(ratingWords)));
  if (traded.length && least) notes.unshift(REBALANCE_NOTES.overRatingTraded(traded.map(ratingWords), least));
  // A line the study's own capacity (no higher than its rating) already notes as over now is not noted twice.
  const notedNow = (x: RatingChange) => {
    if (x.reading.conductor !== 'line' || !resolved.measuredBoards.includes(tree.names.indexOf(x.board))) return false;
    const cap = resolved.lineCapacityA[tree.boards[0]!.phases.indexOf(x.reading.at as 'A')]!;
    return cap <= x.reading.ratingA && x.nowA > cap;
  };
  const stays = ratings.filter((x) => x.nowA > x.reading.ratingA && !causedKeys.has(keyOf(x)) && !notedNow(x));
  if (stays.length) notes.push(REBALANCE_NOTES.overRatingNow(stays.map(ratingWords), moves.length > 0, least));
  const voltages = voltageComparisons(resolved.conditions, solved, tree);
  const severalConditions = resolved.conditions.length > 1;
  for (const v of voltages)
    if (v.before.verdict !== 'within' || v.after.verdict !== 'within')
      notes.push(REBALANCE_NOTES.voltagesOutside(v, tree.boards.length > 1 ? v.board : null, severalConditions ? v.name : null, moves.length > 0));
  if (moves.length > 0 && solvedScore.after > solvedScore.before + tieTolerance(solvedScore.before))
    notes.push(REBALANCE_NOTES.solvedNotBetter(solvedScore.before, solvedScore.after));
  const differs = Math.max(
    ...conditions.flatMap((c) =>
      c.solved.after.lineA.map((a, k) => (100 * Math.abs(a - c.model.after.lineA[k]!)) / Math.max(c.solved.after.largestLineA, 1e-9)),
    ),
  );
  if (differs > 5) notes.push(REBALANCE_NOTES.modelDiffers(differs));

  const after = chosen.best.score;
  const lb = chosen.lowerBound;
  const main0 = tree.boards[0]!;
  return {
    board: { name: tree.boards.length > 1 ? installation.name : main0.name, system: main0.system, phaseNames: conventionsOf(main0).phaseNames, region: conventionsOf(main0).region },
    boards: {
      all: tree.names,
      movable: tree.names.filter((_, b) => resolved.movableBoards[b]),
      measured: resolved.measuredBoards.map((b) => tree.names[b]!),
    },
    oneLine,
    aim: o.objective ? 'custom' : resolved.aim,
    combine: resolved.combine,
    moveLimit: Number.isFinite(resolved.moveLimit) ? resolved.moveLimit : null,
    method: chosen.exactRan ? 'exact' : 'local-search',
    methodAsked: o.method,
    proven: chosen.proven,
    score: {
      before: home.score,
      after,
      lowerBound: lb,
      gap: lb === null ? null : after - lb,
      gapPercent: lb === null ? null : after > 0 ? (100 * (after - lb)) / after : 0,
    },
    solvedScore,
    moves,
    conditions,
    otherBoards: unmeasured,
    voltages,
    capacityExceeded: [...excesses, ...ratingOver].sort((a, b) => b.overA - a.overA),
    ratingsKept: built.rated.length > 0,
    overload,
    moveTable: o.moveTable || resolved.nearBestPercent !== null ? moveTable : null,
    nearBest: resolved.nearBestPercent !== null ? { percent: resolved.nearBestPercent, bestScore: nearBestScore, applied: nearBestScore !== null } : null,
    search: {
      circuitsInInstallation: tree.circuits.filter((ref) => tree.boards[ref.board]!.loads[ref.load]!.origin === 'board').length,
      onlyBoards,
      limitsTightened,
      circuits: tree.circuits.filter((_, flat) => {
        const ref = tree.circuits[flat]!;
        return resolved.movableBoards[ref.board] && tree.boards[ref.board]!.loads[ref.load]!.origin === 'board';
      }).length,
      movable: built.slots.filter((s) => s.options.length > 1).length,
      pinned: resolved.pinned.size,
      nodes: main.nodes + (chosen === main ? 0 : chosen.nodes),
      nodeBudget: chosen.exactRan ? o.nodeBudget : null,
      budgetReached: chosen.exactRan && chosen.budgetReached,
    },
    notes,
    cautions: rebalanceCautions(tree.boards.some((b, k) => resolved.movableBoards[k] && b.hasNeutral)),
  };
}
