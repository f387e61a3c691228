/**
 * A rebalancing study checked against its board and resolved to what the
 * search needs: defaults filled in one place, pins and conditions turned into
 * load indices. Every problem is collected in one pass, each at its path
 * inside the board file's `rebalance:` section.
 */
import type { Board } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { InputError, inputIssue, namingArgument, type InputIssue, quoteText } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { complex, type ComplexValue } from '../complex.js';
import type { ProfileSpec } from '../profile/profileSpec.js';
import { rebalanceSpecSchema, type LoadConditionSpec, type RebalanceSpec } from './rebalanceSpec.js';
import { loadOf, type RebalanceTree } from './rebalanceTree.js';
import type { AimWeights } from './rebalanceObjective.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import { inFileNaming } from '../board/conventions/issueNaming.js';
import { ownEntry } from '../_internal/ownEntry.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

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
  /** Complex multiplier of each circuit's rating (by flat circuit index) in this condition. */
  readonly factors: readonly ComplexValue[];
}

export interface ResolvedRebalance {
  readonly aim: AimWeights;
  readonly combine: 'worst' | 'weighted';
  /** Most moves; `Infinity` for no limit. */
  readonly moveLimit: number;
  readonly nearBestPercent: number | null;
  /** Flat circuit index → the connection it must end on (its present one for a plain pin). */
  readonly pinned: ReadonlyMap<number, ConnectionSpec>;
  /** Capacity of each line in `phases` order, A (Infinity where none). */
  readonly lineCapacityA: readonly number[];
  /** Where the capacity was given, for messages: `lineCapacityA` or `lineCapacityA.B`. */
  readonly capacityPaths: readonly string[];
  readonly conditions: readonly ResolvedCondition[];
  /** Per board number: may its circuits move. */
  readonly movableBoards: readonly boolean[];
  /** Board numbers whose incomer the score reads (a single board: [0]). */
  readonly measuredBoards: readonly number[];
}

/** What the study may need from outside its own section: the file's profile scenarios, or conditions built by the caller. */
export interface RebalanceContext {
  readonly profile?: ProfileSpec | undefined;
  /** Conditions that replace the study's (e.g. from interval data, intervalConditions.ts); factors by flat circuit index. */
  readonly loadConditions?: readonly { readonly name: string; readonly weight: number; readonly factors: readonly ComplexValue[] }[] | undefined;
}

/** Default aim: the largest line current, plus the neutral current where the board has a neutral. */
function defaultAim(board: Board): AimWeights {
  return { largestLine: 1, neutral: board.hasNeutral ? 1 : 0, currentUnbalance: 0, voltageUnbalance: 0 };
}

/** Circuit names → flat indices; a name on several boards is also reachable as "board/circuit". */
function circuitFinder(tree: RebalanceTree) {
  const byName = new Map<string, number[]>();
  const qualified = new Map<string, number>();
  tree.circuits.forEach((ref, flat) => {
    const load = tree.boards[ref.board]!.loads[ref.load]!;
    if (load.origin !== 'board') return;
    byName.set(load.name, [...(byName.get(load.name) ?? []), flat]);
    qualified.set(`${tree.names[ref.board]}/${load.name}`, flat);
  });
  const several = tree.boards.length > 1;
  const accepted = several ? 'the name of a circuit in the installation, or "board/circuit"' : 'the name of a circuit on the board';
  /** A flat index, or an issue at `path`. */
  return (name: string, path: string, board?: string): number | InputIssue => {
    if (board !== undefined) {
      const flat = qualified.get(`${board}/${name}`);
      if (flat !== undefined) return flat;
      if (!tree.names.includes(board)) return inputIssue('unknown_board', path.replace(/circuit$/, 'board'), `one of ${tree.names.join(', ')}`, board);
      return inputIssue('unknown_circuit', path, `the name of a circuit on board ${quoteText(board)}`, name);
    }
    const found = byName.get(name);
    if (found?.length === 1) return found[0]!;
    if (found && found.length > 1)
      return inputIssue('ambiguous_circuit', path, `one circuit: ${quoteText(name)} is on boards ${found.map((f) => tree.names[tree.circuits[f]!.board]).join(', ')}; name the board too`, name);
    const flat = qualified.get(name);
    return flat ?? inputIssue('unknown_circuit', path, accepted, name);
  };
}

function pinIssues(spec: RebalanceSpec, tree: RebalanceTree, pinned: Map<number, ConnectionSpec>): InputIssue[] {
  const issues: InputIssue[] = [];
  const board = tree.boards[0]!;
  const find = circuitFinder(tree);
  (spec.pinned ?? []).forEach((entry, n) => {
    const name = typeof entry === 'string' ? entry : entry.circuit;
    const path = typeof entry === 'string' ? `pinned[${n}]` : `pinned[${n}].circuit`;
    const index = find(name, path, typeof entry === 'string' ? undefined : entry.board);
    if (typeof index !== 'number') {
      issues.push(index);
      return;
    }
    if (pinned.has(index)) {
      issues.push(inputIssue('duplicate', path, 'each circuit pinned once', name));
      return;
    }
    const present = loadOf(tree, index).connection;
    if (typeof entry === 'string' || entry.on === undefined) {
      pinned.set(index, present);
      return;
    }
    const onPath = `pinned[${n}].on`;
    const label = labellerOf(conventionsOf(board).phaseNames);
    const used = entry.on.split('-').filter((t) => t !== 'N');
    const missing = used.filter((p) => !board.phases.includes(p as 'A'));
    if (missing.length || (entry.on.endsWith('-N') && !board.hasNeutral)) {
      const accepted = [...LINE_TO_NEUTRAL, ...LINE_TO_LINE].filter((c) => {
        const lines = c.split('-').filter((t) => t !== 'N');
        return lines.every((p) => board.phases.includes(p as 'A')) && (!c.endsWith('-N') || board.hasNeutral);
      });
      issues.push(inputIssue('unknown_phase', onPath, `one of ${accepted.map(label).join(', ')} on a ${board.system} supply`, label(entry.on)));
      return;
    }
    const choices = connectionChoices(board, present);
    if (!choices.includes(entry.on)) {
      const kind = LINE_TO_NEUTRAL.includes(present) ? 'line-to-neutral' : LINE_TO_LINE.includes(present) ? 'line-to-line' : 'three-phase';
      issues.push(
        inputIssue('wrong_kind', onPath, `one of ${choices.map(label).join(', ')} (the circuit is ${kind}, wired ${label(present)} now)`, label(entry.on)),
      );
      return;
    }
    pinned.set(index, entry.on);
  });
  return issues;
}

/** The profile section's scenarios as load conditions: each weighted by its hours (or weight), groups expanded. */
export function conditionsFromScenarios(profile: ProfileSpec): LoadConditionSpec[] {
  checkObjectArgument(profile, 'profile', "a board file's profile section as parseBoard gives it (spec.profile)");
  const groups = profile.groups ?? {};
  return (profile.scenarios ?? []).map((s) => {
    // No prototype: a circuit called `constructor` or `toString` is an entry like any other.
    const circuits: Record<string, number> = Object.create(null);
    for (const [name, f] of Object.entries(s.loads)) for (const member of ownEntry(groups, name) ?? [name]) circuits[member] = f;
    return { name: s.name, weight: s.hours ?? s.weight ?? 1, factor: s.others ?? 0, circuits };
  });
}

function conditionIssues(spec: RebalanceSpec, tree: RebalanceTree, context: RebalanceContext, out: ResolvedCondition[]): InputIssue[] {
  const issues: InputIssue[] = [];
  if (context.loadConditions) {
    if (context.loadConditions.length === 0) return [inputIssue('missing', 'conditions', 'at least one load condition', 'none')];
    context.loadConditions.forEach((c, n) => {
      if (c.factors.length !== tree.circuits.length)
        issues.push(inputIssue('out_of_range', `loadConditions[${n}].factors`, `one factor per circuit (${tree.circuits.length})`, c.factors.length));
      out.push({ name: c.name, weight: c.weight, factors: c.factors });
    });
    return issues;
  }
  const find = circuitFinder(tree);
  let given: readonly LoadConditionSpec[] = [{ name: 'as rated' }];
  let where = 'conditions';
  if (spec.conditions === 'scenarios') {
    if (!context.profile?.scenarios?.length)
      return [inputIssue('missing', 'conditions', 'scenarios under profile.scenarios in the board file when conditions is "scenarios"', 'scenarios')];
    given = conditionsFromScenarios(context.profile);
    where = 'profile.scenarios';
  } else if (spec.conditions) given = spec.conditions;
  const names = new Set<string>();
  given.forEach((c, n) => {
    if (names.has(c.name)) issues.push(inputIssue('duplicate', `${where}[${n}].name`, 'a name not already used by another condition', c.name));
    names.add(c.name);
    const factors = tree.circuits.map((_, flat) => complex(loadOf(tree, flat).origin === 'board' ? (c.factor ?? 1) : 1));
    for (const [name, f] of Object.entries(c.circuits ?? {})) {
      const index = find(name, where === 'conditions' ? `conditions[${n}].circuits.${name}` : `profile.scenarios[${n}].loads.${name}`);
      if (typeof index !== 'number') issues.push(index);
      else factors[index] = complex(f);
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
  const label = labellerOf(conventionsOf(board).phaseNames);
  return (['A', 'B', 'C'] as const)
    .filter((p) => given[p] !== undefined && !board.phases.includes(p))
    .map((p) => inputIssue('not_applicable', `lineCapacityA.${p}`, `only lines ${board.phases.map(label).join(', ')} on a ${board.system} supply`, given[p]));
}

/** A board name as a reader sees it: spaces collapsed and trimmed, letter case ignored (as installationRules.ts compares them). */
const foldName = (name: string) => name.trim().replace(/\s+/g, ' ').toLowerCase();

/**
 * The board whose name reads as the word `at` ("main" or "each"), where that makes the word mean two
 * things; −1 where it does not. The main board itself called "main" is no clash: both readings are its incomer.
 */
function measureWordClash(tree: RebalanceTree, at: string): number {
  if (at !== 'main' && at !== 'each') return -1;
  const b = tree.names.findIndex((name) => foldName(name) === at);
  if (b < 0 || (at === 'main' && b === 0) || (at === 'each' && tree.boards.length === 1)) return -1;
  return b;
}

function boardIssues(spec: RebalanceSpec, tree: RebalanceTree, movable: boolean[], measured: number[]): InputIssue[] {
  const issues: InputIssue[] = [];
  const count = tree.boards.length;
  const accepted = `one of ${tree.names.map((n) => `${quoteText(n)}`).join(', ')}`;
  movable.push(...tree.boards.map(() => spec.boards === undefined));
  (spec.boards ?? []).forEach((name, n) => {
    const b = tree.names.indexOf(name);
    if (b < 0) issues.push(inputIssue('unknown_board', `boards[${n}]`, accepted, name));
    else movable[b] = true;
  });
  const at = spec.measureAt ?? 'each';
  const clash = spec.measureAt === undefined ? -1 : measureWordClash(tree, at);
  if (clash >= 0) {
    const board = quoteText(tree.names[clash]!);
    const instead = at === 'main' ? `the main board's own name, ${quoteText(tree.names[0]!)}, for the main incomer` : 'to leave it out for every incomer (the default)';
    issues.push(inputIssue('ambiguous_board', 'measureAt', `${instead}: "${at}" is also the name of board ${board}, and could mean either; to score at that board, rename it`, at));
  } else if (at === 'each') measured.push(...tree.boards.map((_, b) => b));
  else if (at === 'main') measured.push(0);
  else {
    const b = tree.names.indexOf(at);
    if (b < 0) issues.push(inputIssue('unknown_board', 'measureAt', `"each", "main" or a board name: ${accepted}`, at));
    else measured.push(b);
  }
  if (count === 1 && spec.measureAt === undefined) measured.splice(0, measured.length, 0);
  return issues;
}

/**
 * Checks a rebalancing study against its installation (a single board is the
 * installation with one board) and fills in the defaults. Paths in the issues
 * are relative to the study (`pinned[1].on`); the CLI restates them under `rebalance.`.
 * @throws {InputError}
 */
export function resolveRebalanceSpec(input: unknown, tree: RebalanceTree, context: RebalanceContext = {}): ResolvedRebalance {
  const parsed = rebalanceSpecSchema.safeParse(input ?? {}, ONE_SHOT_PARSE);
  const board = tree.boards[0]!;
  if (!parsed.success) throw new InputError(inFileNaming(namingArgument(inputIssuesFromZod(parsed.error.issues, input ?? {}, [], { schema: rebalanceSpecSchema, input: input ?? {} }), 'study'), conventionsOf(board).phaseNames), 'the rebalancing study is not valid');
  const spec = parsed.data;
  const pinned = new Map<number, ConnectionSpec>();
  const conditions: ResolvedCondition[] = [];
  const capacity: number[] = [];
  const capacityPaths: string[] = [];
  const movableBoards: boolean[] = [];
  const measuredBoards: number[] = [];
  const issues = [
    ...pinIssues(spec, tree, pinned),
    ...conditionIssues(spec, tree, context, conditions),
    ...capacityIssues(spec, board, capacity, capacityPaths),
    ...boardIssues(spec, tree, movableBoards, measuredBoards),
  ];
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
  if (issues.length) throw new InputError(inFileNaming(issues, conventionsOf(board).phaseNames), 'the rebalancing study is not valid');
  return {
    aim,
    combine: spec.combine ?? 'worst',
    moveLimit: spec.moveLimit ?? Infinity,
    nearBestPercent: spec.nearBestPercent ?? null,
    pinned,
    lineCapacityA: capacity,
    capacityPaths,
    conditions,
    movableBoards,
    measuredBoards,
  };
}
