/**
 * Rules a correction spec must meet on a particular board, beyond its shape.
 * Each rule is a small named function returning the problems it finds, so the
 * user sees them all at once.
 */
import type { Board } from '../board/boardModel.js';
import { inputIssue, type InputIssue, quoteText } from '../errors.js';
import type { CorrectionSpec } from './correctionSpec.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { meteringPointIssues } from './meteringPoint.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import { starWordOf } from '../board/conventions/regionWords.js';

type Rule = (spec: CorrectionSpec, board: Board) => InputIssue[];

const threePhase = (board: Board) => board.phases.length === 3;
const definitionOf = (spec: CorrectionSpec) =>
  spec.target?.definition ?? (spec.arrangement === 'balancing-compensator' ? CORRECTION_DEFAULTS.compensatorDefinition : CORRECTION_DEFAULTS.definition);

/** Arrangements that fit a board: a split-phase board takes a line-to-line capacitor as its "delta" bank. */
export function arrangementsFor(board: Board): readonly NonNullable<CorrectionSpec['arrangement']>[] {
  if (threePhase(board)) return ['star-bank', 'delta-bank', 'balancing-compensator'];
  if (board.system === 'split-phase') return ['star-bank', 'delta-bank'];
  return ['star-bank'];
}

/** Why an arrangement does not fit: a delta bank needs two lines, which only a single-phase board lacks. */
const needs = (arrangement: string, board: Board): string =>
  arrangement === 'delta-bank' && board.system === 'single-phase' ? 'needs two lines; a single-phase board has one line and the neutral' : 'needs three phases';

function ruleArrangementFitsBoard(spec: CorrectionSpec, board: Board): InputIssue[] {
  const fits = arrangementsFor(board);
  if (spec.arrangement !== undefined && !fits.includes(spec.arrangement))
    return [inputIssue('not_applicable', 'arrangement', `${fits.join(' or ')} on a ${board.system} board (${spec.arrangement} ${needs(spec.arrangement, board)})`, spec.arrangement)];
  return [];
}

function ruleDefinitionFitsBoard(spec: CorrectionSpec, board: Board): InputIssue[] {
  const definition = definitionOf(spec);
  if ((definition === 'effective' || definition === 'positive-sequence') && !threePhase(board))
    return [inputIssue('not_applicable', 'target.definition', `per-line, vector or arithmetic on a ${board.system} board (${definition} is defined for three-phase boards)`, definition)];
  return [];
}

function rulePerPhaseTargets(spec: CorrectionSpec, board: Board): InputIssue[] {
  const perPhase = spec.target?.perPhase;
  if (!perPhase) return [];
  if (spec.arrangement === 'balancing-compensator')
    return [inputIssue('not_applicable', 'target.perPhase', 'pf alone: a balancing compensator makes every line alike', 'per-phase targets')];
  if (definitionOf(spec) !== 'per-line')
    return [inputIssue('not_applicable', 'target.perPhase', 'per-phase targets only with definition per-line', definitionOf(spec))];
  const label = labellerOf(conventionsOf(board).phaseNames);
  return (['A', 'B', 'C'] as const)
    .filter((p) => perPhase[p] !== undefined && !board.phases.includes(p))
    .map((p) => inputIssue('unknown_phase', `target.perPhase.${p}`, `only phases ${board.phases.map(label).join(', ')} of this board`, label(p)));
}

function ruleTargetBounds(spec: CorrectionSpec): InputIssue[] {
  const t = spec.target;
  if (!t) return [];
  const issues: InputIssue[] = [];
  const leading = t.leading ?? CORRECTION_DEFAULTS.leading;
  if (t.minLeadingPf !== undefined && leading !== 'allowed')
    issues.push(inputIssue('not_applicable', 'target.minLeadingPf', 'minLeadingPf only with leading: allowed', t.minLeadingPf));
  if (t.maxLaggingPf !== undefined) {
    if (leading === 'allowed')
      issues.push(inputIssue('conflict', 'target.maxLaggingPf', 'either leading: allowed or an upper lagging bound, not both (the bound keeps every line lagging)', t.maxLaggingPf));
    const minimums = [t.pf ?? CORRECTION_DEFAULTS.pf, ...Object.values(t.perPhase ?? {}).filter((v): v is number => v !== undefined)];
    const strictest = Math.max(...minimums);
    if (t.maxLaggingPf < strictest)
      issues.push(inputIssue('conflict', 'target.maxLaggingPf', `an upper bound at least the target (${strictest})`, t.maxLaggingPf));
  }
  return issues;
}

function ruleStarPoint(spec: CorrectionSpec, board: Board): InputIssue[] {
  if (spec.starPoint === undefined) return [];
  if (spec.arrangement !== undefined && spec.arrangement !== 'star-bank')
    return [inputIssue('not_applicable', 'starPoint', 'starPoint only with arrangement star-bank', spec.starPoint)];
  const star = starWordOf(conventionsOf(board).region);
  if (spec.starPoint === 'neutral' && (!board.hasNeutral || board.neutralOpen))
    return [inputIssue('no_neutral', 'starPoint', `floating: this board has no neutral to tie the ${star} point to`, spec.starPoint)];
  if (spec.starPoint === 'floating' && !threePhase(board))
    return [inputIssue('not_applicable', 'starPoint', `neutral on a ${board.system} board (a floating ${star} needs three phases)`, spec.starPoint)];
  return [];
}

function ruleShare(spec: CorrectionSpec): InputIssue[] {
  if (spec.share === undefined) return [];
  if (spec.arrangement === 'balancing-compensator')
    return [inputIssue('not_applicable', 'share', 'share only with a star or delta bank', spec.share)];
  if (definitionOf(spec) === 'per-line')
    return [inputIssue('not_applicable', 'share', 'share only with a board-wide target (per-line targets fix each branch)', spec.share)];
  return [];
}

function ruleCompensator(spec: CorrectionSpec, board: Board): InputIssue[] {
  const c = spec.compensator;
  if (!c) return [];
  if (spec.arrangement !== undefined && spec.arrangement !== 'balancing-compensator')
    return [inputIssue('not_applicable', 'compensator', 'compensator settings only with arrangement balancing-compensator', 'compensator')];
  if (c.branches === 'delta-and-star' && (!board.hasNeutral || board.neutralOpen))
    return [inputIssue('no_neutral', 'compensator.branches', 'delta: this board has no neutral for line-to-neutral branches', c.branches)];
  return [];
}

function ruleBalance(spec: CorrectionSpec): InputIssue[] {
  if (spec.balance === undefined || spec.arrangement === undefined || spec.arrangement === 'balancing-compensator') return [];
  return [inputIssue('not_applicable', 'balance', 'balance targets only with arrangement balancing-compensator', 'balance')];
}

function ruleLightLoadNames(spec: CorrectionSpec, board: Board): InputIssue[] {
  const perLoad = spec.lightLoad?.perLoad;
  if (!perLoad) return [];
  const names = new Set(board.loads.filter((l) => l.origin === 'board').map((l) => l.name));
  return Object.keys(perLoad)
    .filter((name) => !names.has(name))
    .map((name) => inputIssue('unknown_load', `lightLoad.perLoad.${name}`, 'the name of a load on the board', name));
}

function ruleMeasuredAt(spec: CorrectionSpec, board: Board): InputIssue[] {
  const point = spec.target?.measuredAt;
  const issues = meteringPointIssues(board, point);
  if (issues.length || point === undefined || point === board.name || spec.arrangement !== 'balancing-compensator') return issues;
  return [inputIssue('not_applicable', 'target.measuredAt', `the compensator's own board ${quoteText(board.name)}: a balancing compensator balances and corrects where it is installed`, point)];
}

export const CORRECTION_RULES: readonly Rule[] = [
  ruleArrangementFitsBoard,
  ruleDefinitionFitsBoard,
  rulePerPhaseTargets,
  ruleTargetBounds,
  ruleStarPoint,
  ruleShare,
  ruleCompensator,
  ruleBalance,
  ruleLightLoadNames,
  ruleMeasuredAt,
];
