/**
 * An interval-data header read against an installation. Loads are named per
 * board, so a column names a load by its name where only one board has a load
 * of that name, else as `<board>/<load>`; a metered phase total is `phase A`
 * at the main board or `<board>/phase A` at a sub-board. `profile.groups`
 * members are named the same way. Those forms can meet (a load "Sub A/b" on one
 * board, a load "b" on board "Sub A"), so `<board>//<load>` is kept for the
 * board and load alone: a name holding "//" that is some board's load so written
 * is read only that way, never as a load's own name.
 *
 * The plan is an ordinary ColumnPlan whose `board` lists every board's loads
 * in one row (named `<board>/<load>`), with the board each load sits on beside
 * it; only its loads and nominal voltage are read (drivers, columns), never solved.
 */
import type { BoardLoad, Installation, PhaseId } from '../board/boardModel.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { inputIssue, type InputIssue, quoteText } from '../errors.js';
import { bankPartIndices } from '../analysis/banksInServiceWords.js';
import { meteredPhaseLoad, phaseAnglesOf, phaseTargetOf, planTargets, type ColumnPlan, type ColumnPlanOptions, type TargetResolver } from './columnPlan.js';
import { ownEntry } from '../_internal/ownEntry.js';
import { assertInstallationModel } from '../board/modelGuards.js';

export interface InstallationColumnPlan extends ColumnPlan {
  /** Board number (0 = main, i + 1 = subBoards[i]) of each load in `board.loads`. */
  readonly loadBoards: readonly number[];
}

/** Every board's name, main first (board number = index). */
export const boardNamesOf = (installation: Installation): string[] => [installation.main.name, ...installation.subBoards.map((sb) => sb.name)];

/** Every board's loads in one list, in board order, with the board number of each. */
export function flattenLoads(installation: Installation): { loads: BoardLoad[]; boards: number[] } {
  const names = boardNamesOf(installation);
  const loads: BoardLoad[] = [];
  const boards: number[] = [];
  [installation.main.loads, ...installation.subBoards.map((sb) => sb.loads)].forEach((own, b) =>
    own.forEach((l) => {
      loads.push({ ...l, name: `${names[b]}/${l.name}` });
      boards.push(b);
    }),
  );
  return { loads, boards };
}

/** Each flattened load's board and own name (the order of flattenLoads). */
function placesOf(installation: Installation): { board: string; load: string }[] {
  const names = boardNamesOf(installation);
  return [installation.main.loads, ...installation.subBoards.map((sb) => sb.loads)].flatMap((own, b) => own.map((l) => ({ board: names[b]!, load: l.name })));
}

/** What a load name (bare, `<board>/<load>` or `<board>//<load>`) stands for among the flattened loads. */
export function loadLookup(installation: Installation): (name: string) => number[] {
  const byName = new Map<string, number[]>();
  const byBoard = new Map<string, number[]>();
  const add = (map: Map<string, number[]>, key: string, index: number) => {
    const list = map.get(key) ?? [];
    if (!list.includes(index)) list.push(index);
    map.set(key, list);
  };
  placesOf(installation).forEach(({ board, load }, index) => {
    add(byName, load, index);
    add(byName, `${board}/${load}`, index);
    add(byBoard, `${board}//${load}`, index);
  });
  // The `//` form first: it names a board and its load, whatever other loads are called.
  return (name) => byBoard.get(name) ?? byName.get(name) ?? [];
}

/**
 * The issue for a name that stands for several loads: each load it names, on its board, with the names
 * that reach that load alone (its own name, `<board>/<load>`, and `<board>//<load>` where neither does).
 */
export function ambiguousLoadIssue(installation: Installation, lookup: (name: string) => number[], code: string, path: string, name: string, found: readonly number[]): InputIssue {
  const places = placesOf(installation);
  const each = found.map((l) => {
    const { board, load } = places[l]!;
    const alone = (candidate: string) => candidate !== name && lookup(candidate).length === 1 && lookup(candidate)[0] === l;
    const simple = [load, `${board}/${load}`].filter(alone);
    const ways = simple.length ? simple : [`${board}//${load}`].filter(alone);
    const write = ways.length ? `write ${ways.map((w) => `${quoteText(w)}`).join(' or ')}` : 'no name reaches it alone';
    return `load ${quoteText(load)} on board ${quoteText(board)} (${write})`;
  });
  return inputIssue(code, path, `one load; ${quoteText(name)} names ${found.length}: ${each.slice(0, -1).join(', ')} and ${each[each.length - 1]}`, name);
}

/**
 * The issue for a name that stands only for parts of capacitor banks the file lists in service (they are
 * in service as listed, so no column or scenario drives them); null for any other name.
 */
export function bankPartIssue(found: readonly number[], bankParts: ReadonlySet<number>, name: string, path: string, each: 'interval' | 'scenario'): InputIssue | null {
  if (!found.length || !found.every((l) => bankParts.has(l))) return null;
  return inputIssue('bank_in_service', path, `a load that is not part of a capacitor bank the file lists in service (harmonics.banks): ${quoteText(name)} is, and stays in service in every ${each} as listed`, name);
}

function installationResolver(installation: Installation, groups: Readonly<Record<string, readonly string[]>>, boards: number[]): TargetResolver {
  const { loads } = flattenLoads(installation);
  const names = boardNamesOf(installation);
  const main = installation.main;
  const label = labellerOf(conventionsOf(main).phaseNames);
  const lookup = loadLookup(installation);
  const loadsExpected = 'a load name on one board, "<board>/<load>" (or "<board>//<load>"), a group from profile.groups, or "phase A/B/C" at the main board ("<board>/phase A" at a sub-board; L1/L2/L3 also)';
  const bankParts = new Set(bankPartIndices(installation));
  /** One load for a name, or null after an issue: none, several boards have it, or it is part of a bank in service. */
  const oneLoad = (name: string, path: string, expected: string, issues: InputIssue[]): number | null => {
    const found = lookup(name);
    const bank = bankPartIssue(found, bankParts, name, path, 'interval');
    if (bank) {
      issues.push(bank);
      return null;
    }
    if (found.length === 1) return found[0]!;
    if (found.length === 0) issues.push(inputIssue('unknown_target', path, expected, name));
    else issues.push(ambiguousLoadIssue(installation, lookup, 'ambiguous_target', path, name, found));
    return null;
  };
  /** `phase A` (main board) or `<board>/phase A`: the board number and phase, or null when the name is no phase. */
  const meteredAt = (name: string): { board: number; phase: PhaseId } | null => {
    const bare = phaseTargetOf(name);
    if (bare) return { board: 0, phase: bare };
    const cut = name.lastIndexOf('/');
    if (cut < 0) return null;
    const phase = phaseTargetOf(name.slice(cut + 1).trim());
    const board = names.indexOf(name.slice(0, cut).trim());
    return phase && board >= 0 ? { board, phase } : null;
  };
  return {
    loads,
    boardOf: (load) => boards[load]!,
    phaseAnglesDeg: phaseAnglesOf(main),
    resolve(name, at, issues) {
      const metered = meteredAt(name);
      if (metered) {
        if (!main.phases.includes(metered.phase) || !main.hasNeutral) {
          issues.push(inputIssue('unknown_target', at, `a phase of the installation with a neutral (${main.hasNeutral ? main.phases.map(label).join(', ') : 'this installation has none'})`, name));
          return null;
        }
        boards.push(metered.board);
        return { kind: 'phase', loads: [loads.push(meteredPhaseLoad(`${names[metered.board]}/metered phase ${label(metered.phase)}`, metered.phase, main.nominalLineToNeutralV)) - 1] };
      }
      const group = ownEntry(groups, name);
      if (group) {
        const members: number[] = [];
        for (const [k, member] of group.entries()) {
          const l = oneLoad(member, `profile.groups.${name}[${k}]`, 'a load name on one board, or "<board>/<load>" (or "<board>//<load>")', issues);
          if (l === null) return null;
          members.push(l);
        }
        return { kind: 'group', loads: members };
      }
      const l = oneLoad(name, at, loadsExpected, issues);
      return l === null ? null : { kind: 'load', loads: [l] };
    },
  };
}

/**
 * Reads the header row against an installation.
 * @throws {InputError} naming each header cell that is wrong (unknown or ambiguous load, bad quantity), with its column.
 */
export function planInstallationColumns(installation: Installation, header: readonly string[], options: ColumnPlanOptions = {}): InstallationColumnPlan {
  assertInstallationModel(installation);
  const flat = flattenLoads(installation);
  const boards = [...flat.boards];
  const resolver = installationResolver(installation, options.groups ?? {}, boards);
  // The parts of the banks the file lists in service: at their rating in every interval.
  const inService = bankPartIndices(installation);
  const planned = planTargets(header, flat.loads.length, resolver, { ...options, ...(inService.length ? { inService } : {}) });
  return { board: { ...installation.main, name: installation.name, loads: resolver.loads }, loadBoards: boards, ...planned };
}
