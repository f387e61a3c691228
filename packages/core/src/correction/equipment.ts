/**
 * Correction equipment as plain data, and how it joins a board: each group
 * (a star bank, a delta bank, the two halves of a compensator) becomes one
 * added `BoardLoad` of constant-impedance branches, so the ordinary solver
 * re-solves the corrected board.
 */
import type { Board, BoardLoad, PhaseId, Terminal } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { labelIn, type PhaseNaming } from '../board/conventions/phaseNames.js';
import type { StarWord } from '../board/conventions/regionWords.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';

/** Where a branch ends: a phase, the neutral bar, or the bank's own floating star point. */
export type EquipmentTerminal = PhaseId | 'N' | 'star';

/** Where one reactive element sits, before it has a value. */
export interface BranchSlot {
  /** `A-N`, `A-B`, `A-star`... */
  readonly branch: string;
  readonly from: PhaseId;
  readonly to: EquipmentTerminal;
  /** Nominal voltage across the element, V (line-to-neutral for star, line-to-line for delta). */
  readonly vNominal: number;
  /**
   * The system's nominal voltage across the element where it is not `vNominal` (277 V on a 480Y/277 board
   * whose model holds 480/√3 = 277.1 V): a unit's rating margin and delivery floor are judged against it,
   * as units are sold for the system's voltage (nominalVoltages.ts).
   */
  readonly ratedV?: number;
}

export interface EquipmentBranch extends BranchSlot {
  /** Susceptance with the bank in its design state, S: > 0 capacitor, < 0 reactor. */
  readonly susceptanceS: number;
  /** The part left connected at light load (the fixed part of a switched bank), S. */
  readonly fixedSusceptanceS: number;
}

export interface EquipmentGroup {
  readonly name: string;
  readonly connection: ConnectionSpec;
  readonly branches: readonly EquipmentBranch[];
}

/** One element per phase, to the neutral bar or to a floating star point. */
export function starSlots(board: Board, starPoint: 'neutral' | 'floating'): BranchSlot[] {
  const to: EquipmentTerminal = starPoint === 'neutral' ? 'N' : 'star';
  const rated = judgedNominalOf(board).ln;
  return board.phases.map((p) => ({
    branch: `${p}-${to === 'N' ? 'N' : 'star'}`,
    from: p,
    to,
    vNominal: board.nominalLineToNeutralV,
    ...(rated !== board.nominalLineToNeutralV ? { ratedV: rated } : {}),
  }));
}

/** One element per line pair: A-B, B-C, C-A on a three-phase board; the one line-to-line capacitor A-B on a split-phase board. */
export function deltaSlots(board: Board): BranchSlot[] {
  const ll = board.nominalLineToLineV ?? board.nominalLineToNeutralV;
  const judged = judgedNominalOf(board);
  const rated = judged.ll ?? judged.ln;
  const pairs: [PhaseId, PhaseId][] =
    board.phases.length === 2
      ? [['A', 'B']]
      : [
          ['A', 'B'],
          ['B', 'C'],
          ['C', 'A'],
        ];
  return pairs.map(([from, to]) => ({ branch: `${from}-${to}`, from, to, vNominal: ll, ...(rated !== ll ? { ratedV: rated } : {}) }));
}

/** Susceptance of an element that gives `kvar` at voltage `v` (+ capacitive). */
export const susceptanceFromKvar = (kvar: number, v: number): number => (kvar * 1000) / (v * v);
export const kvarFromSusceptance = (susceptanceS: number, v: number): number => (susceptanceS * v * v) / 1000;

/**
 * Below a microvar an element is rounding left by the iterations, not equipment: it is
 * dropped (0), so an all-but-empty floating star does not leave a node hanging on nothing.
 */
export const cleanSusceptance = (susceptanceS: number, v: number): number => (Math.abs(susceptanceS) * v * v < 1e-6 ? 0 : susceptanceS);

/** The power a branch of susceptance `susceptanceS` at nominal voltage `v` is given as a load, VA (load convention: S = V²·conj(jB) = −jB·V²). */
export const equipmentPower = (susceptanceS: number, v: number): { re: number; im: number } => ({ re: 0, im: -susceptanceS * v * v });

export interface EquipmentGroupOptions {
  /** The part left connected at light load, S, per slot. @defaultValue the susceptances */
  readonly fixedSusceptances?: readonly number[];
  /** How the board's file names its phases: a group of one branch is named with it (`star bank L1-N`). @defaultValue 'A/B/C' */
  readonly naming?: PhaseNaming;
  /** The board's word for star, in a compensator's part name (`compensator wye part` in North America). @defaultValue 'star' */
  readonly star?: StarWord;
}

/**
 * Groups slots and their susceptances the way they would be built: three
 * star slots → one `ABC-star` group, three delta slots → one `ABC-delta` group
 * (a compensator has both), anything else (split-phase, single-phase) → one
 * group per branch, named with its branch as the file names it. Branch order is kept.
 */
export function equipmentGroups(name: string, slots: readonly BranchSlot[], susceptances: readonly number[], options: EquipmentGroupOptions = {}): EquipmentGroup[] {
  const fixedSusceptances = options.fixedSusceptances ?? susceptances;
  const naming = options.naming ?? 'A/B/C';
  const clean = cleanSusceptance;
  const branches = slots.map(
    (s, i): EquipmentBranch => ({ ...s, susceptanceS: clean(susceptances[i]!, s.vNominal), fixedSusceptanceS: clean(fixedSusceptances[i]!, s.vNominal) }),
  );
  const isStar = (b: EquipmentBranch) => b.to === 'N' || b.to === 'star';
  const star = branches.filter(isStar);
  const delta = branches.filter((b) => !isStar(b));
  const both = star.length > 0 && delta.length > 0;
  const groupOf = (part: EquipmentBranch[], connection: ConnectionSpec, suffix: string): EquipmentGroup[] => {
    if (part.length === 0) return [];
    if (part.length === 3) return [{ name: both ? `${name} ${suffix}` : name, connection, branches: part }];
    // The name is text for people (JSON and reports alike); `branch` and `connection` stay A/B/C data.
    return part.map((b) => ({ name: `${name} ${labelIn(naming, b.branch)}`, connection: `${b.from}-${b.to}` as ConnectionSpec, branches: [b] }));
  };
  const groups = [...groupOf(delta, 'ABC-delta', 'delta part'), ...groupOf(star, 'ABC-star', `${options.star ?? 'star'} part`)];
  const firstIndex = (g: EquipmentGroup) => branches.indexOf(g.branches[0]!);
  return groups.sort((a, b) => firstIndex(a) - firstIndex(b));
}

export interface AddEquipmentOptions {
  /**
   * `design`: every branch at its design-state susceptance; `fixed`: only the
   * fixed part (what stays on at light load).
   * @defaultValue 'design'
   */
  readonly state?: 'design' | 'fixed';
  /**
   * Multiplies every capacitor's susceptance (reactors are left alone): 0.95
   * and 1.10 model the capacitance tolerance.
   * @defaultValue 1
   */
  readonly capacitanceFactor?: number;
}

/**
 * The board with correction equipment added as loads of origin `added`; solve
 * it with `solveBoardModel`, or hand it to an outside circuit simulator.
 * @example
 * const corrected = addCorrectionEquipment(board, report.verification.equipment);
 * corrected.loads.at(-1)?.origin //=> 'added'
 */
export function addCorrectionEquipment(board: Board, groups: readonly EquipmentGroup[], options: AddEquipmentOptions = {}): Board {
  assertBoardModel(board);
  const state = options.state ?? 'design';
  const factor = options.capacitanceFactor ?? 1;
  const added = groups.map((group, g): BoardLoad => {
    const star: Terminal = `star:${board.loads.length + g}`;
    return {
      name: group.name,
      connection: group.connection,
      model: 'constant-impedance',
      origin: 'added',
      branches: group.branches.map((b) => {
        const raw = state === 'design' ? b.susceptanceS : b.fixedSusceptanceS;
        const susceptance = raw > 0 ? raw * factor : raw;
        return {
          from: b.from,
          to: b.to === 'star' ? star : b.to,
          sNominal: equipmentPower(susceptance, b.vNominal),
          vNominal: b.vNominal,
          zip: { z: 1, i: 0, p: 0 },
        };
      }),
    };
  });
  return { ...board, loads: [...board.loads, ...added] };
}

/** The reactors' output of a set of groups, kvar at nominal voltage (inductive counted positive). */
export const reactorKvarOf = (groups: readonly EquipmentGroup[]): number =>
  groups.flatMap((g) => g.branches).reduce((sum, b) => sum + (b.susceptanceS < 0 ? Math.abs(kvarFromSusceptance(b.susceptanceS, b.vNominal)) : 0), 0);
