/**
 * The power-factor target, resolved against a board, and the one check of a
 * solved board against it (used by sizing, verification and the tests alike).
 *
 * Per line the target is a band on τ = Q/|P| (the signed tan φ of the line's
 * displacement angle, Q > 0 lagging): τ ≤ tan(acos pf) meets the minimum (a
 * lower bound on the PF: a line already better than it needs nothing);
 * τ ≥ τ_low keeps the line from leading (τ_low = 0), from leading beyond the
 * allowed leading PF (τ_low < 0), or from passing the upper lagging bound (τ_low > 0).
 *
 * "Never leading" is judged on what the equipment changes: given the board
 * before correction, a line that already led there (a line-to-line load makes
 * one of its two lines lead against the neutral, whatever is installed) passes
 * as long as it does not lead more; a line that did not lead may not start to.
 */
import type { Board, PhaseId } from '../board/boardModel.js';
import type { BoardResult, PowerFactorSense } from '../analysis/boardResult.js';
import type { TargetReadings } from '../analysis/analyseSolution.js';
import type { Arrangement, TargetDefinition, TargetSpec } from './correctionSpec.js';
import { TARGET_DEFINITIONS } from './correctionSpec.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { InputError, inputIssue } from '../errors.js';
import { meteredStatement, PER_LINE_STATEMENTS, SINGLE_LINE_STATEMENT, TARGET_STATEMENTS, targetShortfall } from './correctionWording.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import { argumentError, assertBoardModel, isObject } from '../board/modelGuards.js';
import { assertBeforeReadings, assertResolvedTarget, assertTargetReadings } from './targetArguments.js';

export type BoardTargetDefinition = Exclude<TargetDefinition, 'per-line'>;

export interface ResolvedTarget {
  readonly definition: TargetDefinition;
  /** The definition in words, for reports. */
  readonly statement: string;
  /** Board-wide minimum PF (for the per-line definition: the default for every line). */
  readonly pf: number;
  /** Minimum PF of each line; only with the per-line definition, otherwise empty. */
  readonly lines: readonly { readonly phase: PhaseId; readonly minPf: number }[];
  readonly leading: 'never' | 'allowed';
  readonly minLeadingPf: number | null;
  readonly maxLaggingPf: number | null;
  /** Where the target is measured when that is not the equipment's board: `origin` or a board's name (see meteringPoint.ts). */
  readonly measuredAt?: string;
}

/**
 * A line that already led may lead more by this much of its active power
 * (Δτ = 0.01): a bank on the other lines raises the voltage, so a line-to-line
 * load leading on this line draws a hair more; that is not the bank making it
 * lead (common practice, no source; a PF change well below 0.001 at 0.95).
 */
export const LEAD_MORE_TOLERANCE = 0.01;

/**
 * Relative slack when judging a computed figure against a bound. The sizing drives figures onto their
 * bounds, and the re-solve lands them there to about 1e-9 of the line's kVA (a line held at unity was
 * seen at −1.3e-9·S): 1e-8 keeps round-off from reading as a line that leads (PF 1 − 5e-17) or misses.
 */
export const TARGET_SLACK = 1e-8;

const tanOfPf = (pf: number): number => Math.sqrt(Math.max(0, 1 - pf * pf)) / pf;

/**
 * Fills the defaults of a target for a board and an arrangement (a balancing
 * compensator defaults to the positive-sequence PF, the banks to per-line).
 * @example resolveTarget({ pf: 0.9 }, board).definition //=> 'per-line'
 */
export function resolveTarget(spec: TargetSpec | undefined, board: Board, arrangement: Arrangement = 'star-bank'): ResolvedTarget {
  assertBoardModel(board);
  const compensator = arrangement === 'balancing-compensator';
  const definition: TargetDefinition = spec?.definition ?? (compensator ? CORRECTION_DEFAULTS.compensatorDefinition : CORRECTION_DEFAULTS.definition);
  const pf = spec?.pf ?? CORRECTION_DEFAULTS.pf;
  const leading = spec?.leading ?? CORRECTION_DEFAULTS.leading;
  const lines = definition === 'per-line' ? board.phases.map((phase) => ({ phase, minPf: spec?.perPhase?.[phase] ?? pf })) : [];
  // "Every line" and a 3-wire board's virtual neutral say nothing on a board with one line and the neutral.
  const stated =
    definition !== 'per-line'
      ? TARGET_STATEMENTS[definition]
      : board.system === 'single-phase'
        ? SINGLE_LINE_STATEMENT
        : board.hasNeutral
          ? PER_LINE_STATEMENTS.neutral
          : PER_LINE_STATEMENTS.threeWire;
  return {
    definition,
    statement: spec?.measuredAt === undefined ? stated : meteredStatement(stated),
    pf,
    lines,
    leading,
    minLeadingPf: leading === 'allowed' ? (spec?.minLeadingPf ?? pf) : null,
    maxLaggingPf: spec?.maxLaggingPf ?? null,
    ...(spec?.measuredAt === undefined ? {} : { measuredAt: spec.measuredAt }),
  };
}

/**
 * The PF a target pins where its band has no width — the strictest minimum PF already at the upper
 * bound (`maxLaggingPf`, or unity when no line may lead) — or null where the band has room. Units come
 * in fixed sizes, so a build lands in such a band only by chance; the verdict says so.
 */
export function widthlessTargetPf(target: ResolvedTarget): number | null {
  const strictest = Math.max(target.pf, ...target.lines.map((l) => l.minPf));
  const upper = target.leading === 'allowed' ? ((target.minLeadingPf ?? target.pf) >= 1 ? 1 : null) : (target.maxLaggingPf ?? 1);
  return upper !== null && strictest >= upper - TARGET_SLACK ? upper : null;
}

/** Bounds on τ = Q/|P| for one line (index into `board.phases`). `high` is +∞ when the target is board-wide. */
export function lineTanBounds(target: ResolvedTarget, lineIndex: number): { high: number; low: number } {
  const line = target.lines[lineIndex];
  const high = line ? tanOfPf(line.minPf) : Infinity;
  let low = 0;
  if (target.leading === 'allowed') low = -tanOfPf(target.minLeadingPf ?? target.pf);
  if (target.maxLaggingPf !== null && target.definition === 'per-line') low = tanOfPf(target.maxLaggingPf);
  return { high, low };
}

/** The board-wide PF by a named definition (signed like P), or null where that definition does not exist. */
export function boardPowerFactor(result: Pick<BoardResult, 'powerFactor'>, definition: BoardTargetDefinition): number | null {
  if (!isObject(result) || !isObject(result.powerFactor) || !isObject(result.powerFactor.vector))
    throw argumentError('result', 'a solved board from solveBoard(...) or solveBoardModel(...), or its powerFactor', result, 'the result argument is not a solved board', 'solved');
  const pf = result.powerFactor;
  switch (definition) {
    case 'effective':
      return pf.effective?.pf ?? null;
    case 'vector':
      return pf.vector.pf;
    case 'arithmetic':
      return pf.arithmetic.pf;
    case 'positive-sequence':
      return pf.positiveSequence?.pf ?? null;
  }
  throw new InputError(
    [inputIssue('invalid_value', 'definition', `one of ${TARGET_DEFINITIONS.filter((d) => d !== 'per-line').map((d) => `"${d}"`).join(', ')}`, definition)],
    'the definition argument is not a power-factor definition',
  );
}

export interface LineTargetCheck {
  readonly phase: PhaseId;
  /** null for a line with no current (no PF). */
  readonly pf: number | null;
  readonly sense: PowerFactorSense;
  /** False for a line carrying (almost) no current, which is not judged. */
  readonly loaded: boolean;
  /** Minimum PF this line must reach; null with a board-wide target. */
  readonly minPf: number | null;
  readonly meetsMinimum: boolean;
  /** Not leading (beyond what is allowed) and not past the upper lagging bound. */
  readonly withinUpperBound: boolean;
}

export interface TargetCheck {
  readonly met: boolean;
  readonly lines: readonly LineTargetCheck[];
  /** The board-wide figure; null with the per-line definition. */
  readonly board: {
    readonly definition: BoardTargetDefinition;
    readonly pf: number | null;
    readonly minPf: number;
    readonly maxPf: number | null;
    readonly met: boolean;
  } | null;
  /** Lines leading more than the target allows (more than before, where the board before is known). */
  readonly leadingLines: readonly PhaseId[];
  /** Lines that already led before correction and are judged against how much they led then. */
  readonly leadingBefore: readonly PhaseId[];
  /** One sentence per unmet condition. */
  readonly shortfalls: readonly string[];
}

/** Lines whose apparent power is below this fraction of the largest are not judged. */
const UNLOADED_FRACTION = 1e-6;

/**
 * Judges a solved board against a target.
 * @param before the board before correction: lines that already passed their
 *   lower τ bound there are held to that (not to lead more); omit to judge the
 *   bound as written.
 * @throws {InputError} naming the argument, or its field, that is not a solved board's readings or a resolved target
 */
export function checkTarget(result: TargetReadings, target: ResolvedTarget, before?: Pick<BoardResult, 'phases'>): TargetCheck {
  assertTargetReadings(result);
  assertResolvedTarget(target, result);
  assertBeforeReadings(before, result.phases.length);
  return judgeTarget(result, target, before);
}

/** checkTarget without the argument checks: the sizing loops judge every trial state they built. */
export function judgeTarget(result: TargetReadings, target: ResolvedTarget, before?: Pick<BoardResult, 'phases'>): TargetCheck {
  const largest = Math.max(...result.phases.map((p) => p.kVA), 0);
  // Shortfalls name lines the way the board file does (L1 or A).
  const label = labellerOf(result.conventions.phaseNames);
  const shortfalls: string[] = [];
  const leadingLines: PhaseId[] = [];
  const leadingBefore: PhaseId[] = [];
  const lines = result.phases.map((p, k): LineTargetCheck => {
    const loaded = p.kVA > UNLOADED_FRACTION * largest && p.kVA > 1e-9;
    const bounds = lineTanBounds(target, k);
    const high = bounds.high;
    let low = bounds.low;
    const b = before?.phases[k];
    if (b && b.kVA > UNLOADED_FRACTION * largest && b.kW !== 0 && b.kvar / Math.abs(b.kW) < low) {
      low = b.kvar / Math.abs(b.kW) - LEAD_MORE_TOLERANCE;
      leadingBefore.push(p.phase);
    }
    const slack = TARGET_SLACK * p.kVA;
    const meetsMinimum = !loaded || high === Infinity || p.kvar <= high * Math.abs(p.kW) + slack;
    const withinUpperBound = !loaded || p.kvar >= low * Math.abs(p.kW) - slack;
    const minPf = target.lines[k]?.minPf ?? null;
    if (!meetsMinimum) shortfalls.push(targetShortfall.lineBelow(label(p.phase), p.pf, p.sense, minPf ?? target.pf));
    if (!withinUpperBound) {
      if (p.kvar < 0) leadingLines.push(p.phase);
      shortfalls.push(leadingBefore.includes(p.phase) ? targetShortfall.lineLeadsMore(label(p.phase), p.pf, b!.pf) : targetShortfall.lineBeyond(label(p.phase), p.pf, p.sense, target));
    }
    return { phase: p.phase, pf: p.pf, sense: p.sense, loaded, minPf, meetsMinimum, withinUpperBound };
  });
  let board: TargetCheck['board'] = null;
  if (target.definition !== 'per-line') {
    const pf = boardPowerFactor(result, target.definition);
    // Signed like P: an exporting board's PF is negative, and its size is what a target speaks of (as |P| per line).
    // A board that carries no power has no PF (null) and nothing to correct: the target holds, as on its idle lines.
    const idle = result.powerFactor.vector.kVA === 0;
    const size = pf === null ? null : Math.abs(pf);
    const reached = idle || (size !== null && size >= target.pf - TARGET_SLACK);
    const notPast = size === null || target.maxLaggingPf === null || size <= target.maxLaggingPf + TARGET_SLACK;
    if (!reached) shortfalls.push(targetShortfall.boardBelow(target, pf));
    if (!notPast) shortfalls.push(targetShortfall.boardBeyond(target, pf));
    board = { definition: target.definition, pf, minPf: target.pf, maxPf: target.maxLaggingPf, met: reached && notPast };
  }
  const met = lines.every((l) => l.meetsMinimum && l.withinUpperBound) && (board?.met ?? true);
  return { met, lines, board, leadingLines, leadingBefore, shortfalls };
}
