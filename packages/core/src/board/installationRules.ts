/**
 * Cross-field rules of an installation file: the boards form one radial tree
 * under one main board, and each board passes the board rules (its feeder and
 * loads checked at their own paths).
 */
import { caseFoldedName } from './nameFolding.js';
import { inputIssue, type InputIssue, quoteText } from '../errors.js';
import type { BoardBaseSpec } from './boardSchema.js';
import { missingNeutralWords, ruleFeederNeutral, usesNeutral, type BoardRule } from './boardRules.js';
import type { PhaseNaming } from './conventions/phaseNames.js';
import type { InstallationBaseSpec } from './installationSchema.js';
import { systemHasNeutral } from './systemTopology.js';

/** One board of an installation on its own, its loads as the installation file types them (with any study fields). */
export type BoardOfInstallation<I extends InstallationBaseSpec> = Omit<BoardBaseSpec, 'loads'> & { loads: I['boards'][number]['loads'] };

/** The board spec a board of the installation would be on its own (supply, its feeder, its loads). */
export function boardSpecOf<I extends InstallationBaseSpec>(spec: I, index: number): BoardOfInstallation<I> {
  const b = spec.boards[index]!;
  // A board's own voltage limits stand in for the installation's.
  const conventions = b.voltageLimits === undefined ? spec.conventions : { ...spec.conventions, voltageLimits: b.voltageLimits };
  return {
    name: b.name,
    supply: spec.supply,
    ...(conventions ? { conventions } : {}),
    ...(b.feeder ? { feeder: b.feeder } : {}),
    loads: b.loads,
    ...(spec.studies ? { studies: spec.studies } : {}),
  };
}

/** The same issue at a path under `prefix` (e.g. `loads[2].pf` → `boards[1].loads[2].pf`). */
function moved(issue: InputIssue, prefix: string): InputIssue {
  const path = `${prefix}.${issue.path}`;
  return { ...issue, path, message: issue.message.startsWith(issue.path) ? `${path}${issue.message.slice(issue.path.length)}` : issue.message };
}

/** A board name as a reader sees it: spaces collapsed and trimmed, letter case ignored. */
const foldName = caseFoldedName;
/** What the reports call the main board's source, folded: no board may take it. */
const RESERVED_BOARD_NAMES: readonly string[] = ['supply'];

function ruleTree(spec: InstallationBaseSpec): InputIssue[] {
  const issues: InputIssue[] = [];
  const index = new Map<string, number>();
  // Names that differ only in spaces or letter case read alike in every table and drawing, and to --board.
  const folded = new Map<string, number>();
  let duplicated = false;
  spec.boards.forEach((b, i) => {
    const first = index.get(b.name);
    const alike = folded.get(foldName(b.name));
    if (first !== undefined) {
      duplicated = true;
      issues.push(inputIssue('duplicate', `boards[${i}].name`, `a name not already used (boards[${first}] has it)`, b.name));
    } else if (alike !== undefined) {
      duplicated = true;
      issues.push(
        inputIssue(
          'duplicate',
          `boards[${i}].name`,
          `a name that differs from the other boards' in more than spaces or letter case (boards[${alike}] is ${JSON.stringify(spec.boards[alike]!.name)}): the reports and --board could not tell the two apart`,
          b.name,
        ),
      );
    } else {
      index.set(b.name, i);
      folded.set(foldName(b.name), i);
    }
    if (RESERVED_BOARD_NAMES.includes(foldName(b.name)))
      issues.push(inputIssue('reserved_name', `boards[${i}].name`, `a name other than ${JSON.stringify(b.name)}: the reports name the main board's source "supply" (its feeder runs "from supply"), and a board of that name would read as the source`, b.name));
  });
  const mains = spec.boards.flatMap((b, i) => (b.fedFrom === undefined ? [i] : []));
  if (mains.length === 0) issues.push(inputIssue('missing', 'boards', 'one main board with no fedFrom: the board the supply feeds'));
  for (const i of mains.slice(1))
    issues.push(
      inputIssue('two_supplies', `boards[${i}].fedFrom`, `the board that feeds ${quoteText(spec.boards[i]!.name)}: only one board takes the supply (boards[${mains[0]}] ${quoteText(spec.boards[mains[0]!]!.name)} already does)`),
    );
  const names = [...index.keys()];
  spec.boards.forEach((b, i) => {
    if (b.fedFrom === undefined) return;
    if (!index.has(b.fedFrom)) {
      const near = names.find((n) => foldName(n) === foldName(b.fedFrom!));
      const hint = near === undefined ? '' : ` (${JSON.stringify(near)} differs only in spaces or letter case)`;
      issues.push(inputIssue('unknown_board', `boards[${i}].fedFrom`, `the name of a board in this installation, exactly as written: ${names.map((n) => JSON.stringify(n)).join(', ')}${hint}`, b.fedFrom));
      return;
    }
    // Walk towards the supply; coming back to this board means a loop. Not while two boards share a
    // name: which one a fedFrom means is unknown, and the "loop" found would only echo the duplicate.
    if (duplicated) return;
    const seen = [b.name];
    let at = b.fedFrom;
    for (let steps = 0; steps <= spec.boards.length; steps++) {
      if (at === b.name) {
        issues.push(inputIssue('loop', `boards[${i}].fedFrom`, `a board nearer the supply (the boards feed each other in a loop: ${[...seen, at].join(' → ')})`, b.fedFrom));
        return;
      }
      seen.push(at);
      const next = spec.boards[index.get(at)!]?.fedFrom;
      if (next === undefined || !index.has(next)) return;
      at = next;
    }
  });
  return issues;
}

type BoardSpec = InstallationBaseSpec['boards'][number];

/**
 * A feeder written with some conductors but not others would leave the missing ones with no
 * impedance: a silently low drop. On every feeder, the service feeder too, a line conductor without
 * a neutral is refused where loads on the board or beyond it return through it (a three-core feeder
 * to a board of three-phase loads stays valid), as a board file's ruleFeederNeutral refuses it. On a
 * sub-board a length or neutral without a line conductor is refused as well; the service feeder keeps
 * a board file's rule there (a neutral alone models that conductor's impedance).
 */
function ruleFeederConductors(spec: InstallationBaseSpec): InputIssue[] {
  const issues: InputIssue[] = [];
  const byName = new Map(spec.boards.map((b) => [b.name, b]));
  const children = new Map<string, BoardSpec[]>();
  for (const b of spec.boards) if (b.fedFrom !== undefined) children.set(b.fedFrom, [...(children.get(b.fedFrom) ?? []), b]);
  /** Loads on this board and every board it feeds that use the neutral (a loop is left to ruleTree), star-connected ones apart. */
  const neutralLoads = (board: BoardSpec): { lineToNeutral: string[]; star: string[] } => {
    const found = { lineToNeutral: [] as string[], star: [] as string[] };
    const seen = new Set<BoardSpec>();
    const stack = [board];
    while (stack.length) {
      const b = stack.pop()!;
      if (seen.has(b)) continue;
      seen.add(b);
      for (const l of b.loads.filter(usesNeutral)) (l.connection === 'ABC-star' ? found.star : found.lineToNeutral).push(`${quoteText(l.name)} on ${b.name}`);
      stack.push(...(children.get(b.name) ?? []));
    }
    return found;
  };
  spec.boards.forEach((b, i) => {
    const f = b.feeder;
    if (!f) return;
    const path = `boards[${i}].feeder`;
    if (b.fedFrom !== undefined && !f.line && (f.neutral || f.lengthM !== undefined || f.lengthFt !== undefined)) {
      issues.push(inputIssue('missing', `${path}.line`, 'the line conductors: a size (mm2, awg or kcmil) or rOhmPerKm with the length, or r and x; write r: 0, x: 0 for lines of no impedance'));
      return;
    }
    if (f.line && !f.neutral && systemHasNeutral(spec.supply.system) && byName.get(b.name) === b) {
      const users = neutralLoads(b);
      if (users.lineToNeutral.length || users.star.length) issues.push(inputIssue('missing', `${path}.neutral`, missingNeutralWords(users)));
    }
  });
  return issues;
}

/** Each board passes the board rules given (the board's own and the studies'), at its own paths. */
const ruleBoards =
  <I extends InstallationBaseSpec>(boardRules: readonly BoardRule<BoardOfInstallation<I>>[]) =>
  (spec: I, naming: PhaseNaming): InputIssue[] =>
    spec.boards.flatMap((_, i) => {
      const own = boardSpecOf(spec, i);
      // Supply rules are reported once, from the first board; the rest are the board's own.
      return boardRules.flatMap((rule) => rule(own, naming)).flatMap((issue) => {
        if (issue.path.startsWith('supply')) return i === 0 ? [issue] : [];
        return [moved(issue, `boards[${i}]`)];
      });
    });

/** The installation's rules: one radial tree, then every board against `boardRules`. */
export function installationRulesWith<I extends InstallationBaseSpec>(boardRules: readonly BoardRule<BoardOfInstallation<I>>[]): readonly ((spec: I, naming: PhaseNaming) => InputIssue[])[] {
  // The feeder's neutral is judged over the boards beyond it (ruleFeederConductors), not board by board.
  return [ruleTree, ruleFeederConductors, ruleBoards<I>(boardRules.filter((rule) => rule !== ruleFeederNeutral))];
}
