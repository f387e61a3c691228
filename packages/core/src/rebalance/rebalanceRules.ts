/**
 * A rebalancing study checked against its board and resolved to what the
 * search needs: defaults filled in one place, pins and conditions turned into
 * load indices. Every problem is collected in one pass, each at its path
 * inside the board file's `rebalance:` section.
 */
import type { Board } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { rebalanceSpecSchema, type RebalanceSpec } from './rebalanceSpec.js';
import type { AimWeights } from './rebalanceObjective.js';

export const LINE_TO_NEUTRAL: readonly ConnectionSpec[] = ['A-N', 'B-N', 'C-N'];
export const LINE_TO_LINE: readonly ConnectionSpec[] = ['A-B', 'B-C', 'C-A'];

/** The connections a circuit wired on `connection` could be moved to on this board (itself included). */
export function connectionChoices(board: Board, connection: ConnectionSpec): readonly ConnectionSpec[] {
  const threePhase = board.phases.length === 3;
  if (LINE_TO_NEUTRAL.includes(connection)) {
    if (!board.hasNeutral || board.phases.length < 2) return [connection];
    return LINE_TO_NEUTRAL.filter((c) => board.phases.includes(c[0] as 'A'));
  }
  if (LINE_TO_LINE.includes(connection) && threePhase) return LINE_TO_LINE;
  return [connection];
}

export interface ResolvedCondition {
  readonly name: string;
  readonly weight: number;
  /** Fraction of each board load (by load index) running in this condition. */
  readonly factors: readonly number[];
}

export interface ResolvedRebalance {
  readonly aim: AimWeights;
  readonly combine: 'worst' | 'weighted';
  /** Most moves; `Infinity` for no limit. */
  readonly moveLimit: number;
  readonly nearBestPercent: number | null;
  /** Load index → the connection it must end on (its present one for a plain pin). */
  readonly pinned: ReadonlyMap<number, ConnectionSpec>;
  /** Capacity of each line in `board.phases` order, A (Infinity where none). */
  readonly lineCapacityA: readonly number[];
  /** Where the capacity was given, for messages: `lineCapacityA` or `lineCapacityA.B`. */
  readonly capacityPaths: readonly string[];
  readonly conditions: readonly ResolvedCondition[];
}

/** Default aim: the largest line current, plus the neutral current where the board has a neutral. */
function defaultAim(board: Board): AimWeights {
  return { largestLine: 1, neutral: board.hasNeutral ? 1 : 0, currentUnbalance: 0, voltageUnbalance: 0 };
}

function pinIssues(spec: RebalanceSpec, board: Board, pinned: Map<number, ConnectionSpec>): InputIssue[] {
  const issues: InputIssue[] = [];
  const byName = new Map(board.loads.map((l, i) => [l.name, i] as const));
  (spec.pinned ?? []).forEach((entry, n) => {
    const name = typeof entry === 'string' ? entry : entry.circuit;
    const path = typeof entry === 'string' ? `pinned[${n}]` : `pinned[${n}].circuit`;
    const index = byName.get(name);
    if (index === undefined || board.loads[index]!.origin !== 'board') {
      issues.push(inputIssue('unknown_circuit', path, 'the name of a circuit on the board', name));
      return;
    }
    if (pinned.has(index)) {
      issues.push(inputIssue('duplicate', path, 'each circuit pinned once', name));
      return;
    }
    const present = board.loads[index]!.connection;
    if (typeof entry === 'string') {
      pinned.set(index, present);
      return;
    }
    const onPath = `pinned[${n}].on`;
    const used = entry.on.split('-').filter((t) => t !== 'N');
    const missing = used.filter((p) => !board.phases.includes(p as 'A'));
    if (missing.length || (entry.on.endsWith('-N') && !board.hasNeutral)) {
      const accepted = [...LINE_TO_NEUTRAL, ...LINE_TO_LINE].filter((c) => {
        const lines = c.split('-').filter((t) => t !== 'N');
        return lines.every((p) => board.phases.includes(p as 'A')) && (!c.endsWith('-N') || board.hasNeutral);
      });
      issues.push(inputIssue('unknown_phase', onPath, `one of ${accepted.join(', ')} on a ${board.system} supply`, entry.on));
      return;
    }
    const choices = connectionChoices(board, present);
    if (!choices.includes(entry.on)) {
      const kind = LINE_TO_NEUTRAL.includes(present) ? 'line-to-neutral' : LINE_TO_LINE.includes(present) ? 'line-to-line' : 'three-phase';
      issues.push(
        inputIssue('wrong_kind', onPath, `one of ${choices.join(', ')} (the circuit is ${kind}, wired ${present} now)`, entry.on),
      );
      return;
    }
    pinned.set(index, entry.on);
  });
  return issues;
}

function conditionIssues(spec: RebalanceSpec, board: Board, out: ResolvedCondition[]): InputIssue[] {
  const issues: InputIssue[] = [];
  const byName = new Map(board.loads.map((l, i) => [l.name, i] as const));
  const given = spec.conditions ?? [{ name: 'as rated' }];
  const names = new Set<string>();
  given.forEach((c, n) => {
    if (names.has(c.name)) issues.push(inputIssue('duplicate', `conditions[${n}].name`, 'a name not already used by another condition', c.name));
    names.add(c.name);
    const factors = board.loads.map((l) => (l.origin === 'board' ? (c.factor ?? 1) : 1));
    for (const [name, f] of Object.entries(c.circuits ?? {})) {
      const index = byName.get(name);
      if (index === undefined) issues.push(inputIssue('unknown_circuit', `conditions[${n}].circuits.${name}`, 'the name of a circuit on the board', name));
      else factors[index] = f;
    }
    out.push({ name: c.name, weight: c.weight ?? 1, factors });
  });
  return issues;
}

function capacityIssues(spec: RebalanceSpec, board: Board, capacity: number[], paths: string[]): InputIssue[] {
  const given = spec.lineCapacityA;
  for (const p of board.phases) {
    capacity.push(typeof given === 'number' ? given : (given?.[p] ?? Infinity));
    paths.push(typeof given === 'number' ? 'lineCapacityA' : `lineCapacityA.${p}`);
  }
  if (given === undefined || typeof given === 'number') return [];
  return (['A', 'B', 'C'] as const)
    .filter((p) => given[p] !== undefined && !board.phases.includes(p))
    .map((p) => inputIssue('not_applicable', `lineCapacityA.${p}`, `only lines ${board.phases.join(', ')} on a ${board.system} supply`, given[p]));
}

/**
 * Checks a rebalancing study against its board and fills in the defaults.
 * Paths in the issues are relative to the study (`pinned[1].on`); the CLI
 * restates them under `rebalance.`.
 * @throws {InputError}
 */
export function resolveRebalanceSpec(input: unknown, board: Board): ResolvedRebalance {
  const parsed = rebalanceSpecSchema.safeParse(input ?? {});
  if (!parsed.success) throw new InputError(inputIssuesFromZod(parsed.error.issues, input ?? {}), 'the rebalancing study is not valid');
  const spec = parsed.data;
  const pinned = new Map<number, ConnectionSpec>();
  const conditions: ResolvedCondition[] = [];
  const capacity: number[] = [];
  const capacityPaths: string[] = [];
  const issues = [...pinIssues(spec, board, pinned), ...conditionIssues(spec, board, conditions), ...capacityIssues(spec, board, capacity, capacityPaths)];
  const given = spec.aim ?? {};
  const fallback = defaultAim(board);
  // An aim given in the file replaces the default weights: figures it leaves out weigh 0.
  const aim: AimWeights = spec.aim
    ? { largestLine: given.largestLine ?? 0, neutral: given.neutral ?? 0, currentUnbalance: given.currentUnbalance ?? 0, voltageUnbalance: given.voltageUnbalance ?? 0 }
    : fallback;
  if (aim.neutral > 0 && !board.hasNeutral)
    issues.push(inputIssue('not_applicable', 'aim.neutral', 'no neutral weight on a board without a neutral', aim.neutral));
  if (board.phases.length !== 3)
    for (const figure of ['currentUnbalance', 'voltageUnbalance'] as const)
      if ((spec.aim?.[figure] ?? 0) > 0)
        issues.push(inputIssue('not_applicable', `aim.${figure}`, 'unbalance figures only on a three-phase board', spec.aim?.[figure]));
  if (Object.values(aim).every((w) => w === 0)) issues.push(inputIssue('out_of_range', 'aim', 'at least one figure with a weight above 0', 'all 0'));
  if (issues.length) throw new InputError(issues, 'the rebalancing study is not valid');
  return {
    aim,
    combine: spec.combine ?? 'worst',
    moveLimit: spec.moveLimit ?? Infinity,
    nearBestPercent: spec.nearBestPercent ?? null,
    pinned,
    lineCapacityA: capacity,
    capacityPaths,
    conditions,
  };
}
