/**
 * What each column of an interval-data file means, read from its header.
 *
 * The first column is the time. Every other header is `<target> [<quantity>]`:
 * the target is `phase A`/`phase B`/`phase C` (a metered phase total), a group
 * from the board file's `profile.groups`, or a load name; the quantity is one
 * of kW, kvar, pf, A, x (x = fraction of the rating). A target takes one of the
 * combinations in ACCEPTED_SETS. Loads that no column drives are off unless the
 * caller keeps them at their rating.
 */
import { labellerOf, readPhaseTerm } from '../board/conventions/phaseNames.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import type { Board, BoardLoad, PhaseId } from '../board/boardModel.js';
import { balancedAnglesDeg } from '../board/normaliseBoard.js';
import { abs, degToRad, div, mul, neg, polar, sub, ZERO, type ComplexValue } from '../complex.js';
import { InputError, inputIssue, type InputIssue, quoteText } from '../errors.js';
import type { DriverColumns, DriverSpec } from './batchNetwork.js';
import { ownEntry } from '../_internal/ownEntry.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { checkListArgument, checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

export const QUANTITIES = ['kW', 'kvar', 'pf', 'A', 'x'] as const;
export type Quantity = (typeof QUANTITIES)[number];

/** Accepted quantity sets for one target, in the words an error shows. */
export const ACCEPTED_SETS: readonly (readonly Quantity[])[] = [['x'], ['kW'], ['kW', 'kvar'], ['kW', 'pf'], ['A', 'pf']];

export interface ColumnTarget {
  /** As written in the header. */
  readonly name: string;
  readonly kind: 'phase' | 'group' | 'load';
  /** Board load indices the target drives (for a phase: the added metered load). */
  readonly loads: readonly number[];
  /** Data-column index (0 = first column after the time) of each quantity given. */
  readonly columns: Partial<Record<Quantity, number>>;
  /**
   * A metered phase only: the rated power factor of the board file's loads on that phase, which a kW column
   * alone is taken at (null: the file has no load drawing power there, so PF 1), and those loads' names.
   */
  readonly phaseRating?: { readonly pf: number | null; readonly tanPhi: number; readonly loads: readonly string[] };
}

export interface ColumnPlan {
  /** The board with one metered phase-to-neutral load added per phase target. */
  readonly board: Board;
  readonly timeHeader: string;
  readonly dataHeaders: readonly string[];
  readonly targets: readonly ColumnTarget[];
  /** Loads of the board file that no column drives. */
  readonly undriven: readonly string[];
  readonly undrivenAtRating: boolean;
  /** Loads at their rating in every interval whatever the options (capacitor banks the file lists in service). @defaultValue none */
  readonly inService?: readonly number[];
  /** How columns that leave something to the model were read (a phase in kW alone, a group's shares), a sentence each. @defaultValue none */
  readonly notes?: readonly string[];
}

const HEADER = /^(.+?)\s*\[\s*([A-Za-z]+)\s*\]$/;
/** "phase A [kW]" or, in IEC naming, "phase L1 [kW]" (either naming, whatever the board file uses). */
const PHASE = /^phase\s+([ABC]|L[123])$/i;

const where = (column: number, header: string) => `header, column ${column + 1} (${quoteText(header)})`;

export interface ColumnPlanOptions {
  /** Named load sets (the board file's `profile.groups`). */
  readonly groups?: Readonly<Record<string, readonly string[]>>;
  /** Keep loads that no column drives at their rating (default: off). */
  readonly undrivenAtRating?: boolean;
  /**
   * Loads (indices) at their rating in every interval: the parts of capacitor banks the file lists in
   * service (harmonics.banks), which the installation's resolver lets no column name. @defaultValue none
   */
  readonly inService?: readonly number[];
}

/** What a header's target name stands for: how a plan finds loads, groups and metered phases. */
export interface TargetResolver {
  /** The loads targets index (metered phases are appended as they are met). */
  readonly loads: BoardLoad[];
  /** The target a name stands for, or null after pushing an issue at `at`. */
  resolve(name: string, at: string, issues: InputIssue[]): { kind: ColumnTarget['kind']; loads: number[] } | null;
  /** The board a load (index into `loads`) is on, where there are several. @defaultValue one board */
  boardOf?(load: number): number;
  /** Each phase's balanced nominal angle, degrees (an installation's boards share the main board's phases). */
  readonly phaseAnglesDeg: Readonly<Partial<Record<PhaseId, number>>>;
}

/** The balanced nominal angle of each phase of a board, degrees: what a metered phase's share of a line-to-line load turns on. */
export function phaseAnglesOf(board: Pick<Board, 'system' | 'sequence' | 'phases'>): Partial<Record<PhaseId, number>> {
  const angles = balancedAnglesDeg(board.system, board.sequence);
  return Object.fromEntries(board.phases.map((p, k) => [p, angles[k]!]));
}

/** A constant-power phase-to-neutral load standing for a metered phase total. */
export function meteredPhaseLoad(name: string, p: PhaseId, vNominal: number): BoardLoad {
  return {
    name,
    connection: `${p}-N`,
    model: 'constant-power',
    origin: 'added',
    branches: [{ from: p, to: 'N', sNominal: { re: 0, im: 0 }, vNominal, zip: { z: 0, i: 0, p: 1 } }],
  };
}

/** The phase a `phase A` / `phase L1` target names, or null when the name is not one. */
export function phaseTargetOf(name: string): PhaseId | null {
  const phase = PHASE.exec(name);
  return phase ? ((readPhaseTerm(phase[1]!.toUpperCase())?.canonical ?? phase[1]!.toUpperCase()) as PhaseId) : null;
}

/** A single board's targets: its loads by name, `profile.groups`, and its metered phases. */
function boardResolver(board: Board, groups: Readonly<Record<string, readonly string[]>>): TargetResolver {
  const loads: BoardLoad[] = [...board.loads];
  const loadIndex = new Map(board.loads.map((l, i) => [l.name, i]));
  // Phases in messages and in the metered loads' names as the board file names them (L1 or A).
  const label = labellerOf(conventionsOf(board).phaseNames);
  return {
    loads,
    phaseAnglesDeg: phaseAnglesOf(board),
    resolve(name, at, issues) {
      const p = phaseTargetOf(name);
      if (p) {
        if (!board.phases.includes(p) || !board.hasNeutral) {
          issues.push(inputIssue('unknown_target', at, `a phase of this board with a neutral (${board.hasNeutral ? board.phases.map(label).join(', ') : 'this board has none'})`, name));
          return null;
        }
        return { kind: 'phase', loads: [loads.push(meteredPhaseLoad(`metered phase ${label(p)}`, p, board.nominalLineToNeutralV)) - 1] };
      }
      const group = ownEntry(groups, name);
      if (group) {
        const members = group.map((n) => loadIndex.get(n));
        if (members.some((x) => x === undefined)) {
          issues.push(inputIssue('unknown_load', `profile.groups.${name}`, 'names of loads on the board', group.find((n) => !loadIndex.has(n))));
          return null;
        }
        return { kind: 'group', loads: members as number[] };
      }
      if (loadIndex.has(name)) return { kind: 'load', loads: [loadIndex.get(name)!] };
      issues.push(inputIssue('unknown_target', at, 'a load name on the board, a group from profile.groups, or "phase A/B/C" ("phase L1/L2/L3")', name));
      return null;
    },
  };
}

/**
 * Reads the header row against the board.
 * @throws {InputError} naming each header cell that is wrong, with its column.
 */
export function planColumns(board: Board, header: readonly string[], options: ColumnPlanOptions = {}): ColumnPlan {
  assertBoardModel(board);
  const resolver = boardResolver(board, options.groups ?? {});
  return { board: { ...board, loads: resolver.loads }, ...planTargets(header, board.loads.length, resolver, options) };
}

/**
 * The header's targets through a resolver; the first `ownLoads` of its loads are the file's (the rest metered).
 * @throws {InputError} naming each header cell that is wrong, with its column.
 */
export function planTargets(header: readonly string[], ownLoads: number, resolver: TargetResolver, options: ColumnPlanOptions = {}): Omit<ColumnPlan, 'board'> {
  const issues: InputIssue[] = [];
  const inService = new Set(options.inService ?? []);
  if (header.length < 2) throw new InputError([headerSeparatorIssue(header)], 'the interval data cannot be read');
  const byName = new Map<string, { kind: ColumnTarget['kind']; loads: number[]; columns: Partial<Record<Quantity, number>> }>();
  const { loads } = resolver;
  header.slice(1).forEach((raw, c) => {
    const cell = raw.trim();
    const at = where(c + 1, cell);
    const m = HEADER.exec(cell);
    if (!m || !(QUANTITIES as readonly string[]).includes(m[2]!)) {
      issues.push(inputIssue('bad_header', at, `"<load, group or phase A/B/C or L1/L2/L3> [<${QUANTITIES.join('|')}>]", e.g. "oven [kW]"`, cell));
      return;
    }
    const name = m[1]!;
    const quantity = m[2] as Quantity;
    let target = byName.get(name);
    if (!target) {
      const found = resolver.resolve(name, at, issues);
      if (!found) return;
      target = { ...found, columns: {} };
      byName.set(name, target);
    }
    if (target.columns[quantity] !== undefined) {
      issues.push(inputIssue('duplicate_column', at, `one ${quoteText(`${name} [${quantity}]`)} column`, cell));
      return;
    }
    target.columns[quantity] = c;
  });
  const drivenBy = new Map<number, string>();
  const targets: ColumnTarget[] = [];
  for (const [name, t] of byName) {
    const given = QUANTITIES.filter((q) => t.columns[q] !== undefined);
    const accepted = ACCEPTED_SETS.some((set) => set.length === given.length && set.every((q) => given.includes(q)));
    if (!accepted)
      issues.push(
        inputIssue('bad_quantities', `header (${quoteText(name)})`, `one of these column sets per target: ${ACCEPTED_SETS.map((s) => s.map((q) => `[${q}]`).join('+')).join(', ')}`, given.map((q) => `[${q}]`).join('+')),
      );
    if (t.columns.A !== undefined && !(t.kind === 'phase' || t.loads.every((l) => isPhaseToNeutral(loads[l]!)))) {
      issues.push(inputIssue('bad_quantities', `header (${quoteText(`${name} [A]`)})`, 'current columns only for phases and phase-to-neutral loads (give kW or x for others)', name));
    }
    for (const l of t.loads) {
      const other = drivenBy.get(l);
      if (other) issues.push(inputIssue('driven_twice', `header (${quoteText(name)})`, `each load driven by one column target; ${quoteText(loads[l]!.name)} is also in ${quoteText(other)}`, name));
      drivenBy.set(l, name);
    }
    targets.push({ name, kind: t.kind, loads: t.loads, columns: t.columns, ...(t.kind === 'phase' ? { phaseRating: phaseRatingOf(t.loads[0]!, ownLoads, loads, resolver, inService) } : {}) });
  }
  const undriven = loads
    .slice(0, ownLoads)
    .flatMap((_, i) => (!drivenBy.has(i) && !inService.has(i) ? [i] : []));
  issues.push(...countedTwiceIssues(targets, loads, resolver, options.undrivenAtRating ? undriven : []));
  if (issues.length) throw new InputError(issues, 'the interval data header is not valid');
  return {
    timeHeader: header[0]!.trim(),
    dataHeaders: header.slice(1).map((h) => h.trim()),
    targets,
    // A load wholly on metered phases is in their totals, not off: it is left out of the loads with no column.
    undriven: undriven.filter((i) => !inMeteredTotals(i, targets, loads, resolver)).map((i) => loads[i]!.name),
    undrivenAtRating: options.undrivenAtRating ?? false,
    notes: columnNotes(targets, loads),
    ...(inService.size ? { inService: [...inService] } : {}),
  };
}

/**
 * A header of one cell: where that cell holds a semicolon or a tab (a spreadsheet's export in a locale that writes
 * the decimal comma), the separator is the fault, and the issue says so; otherwise the columns are missing.
 */
function headerSeparatorIssue(header: readonly string[]): InputIssue {
  const cell = header[0] ?? '';
  const found = cell.includes(';') ? 'semicolons' : cell.includes('\t') ? 'tabs' : null;
  if (!found) return inputIssue('missing', 'header', 'a time column and at least one data column');
  return inputIssue(
    'bad_separator',
    'header',
    `columns separated by commas, with a point for decimals (1.25): the header's columns are separated by ${found}; export the file as comma-separated values`,
    cell,
  );
}

/**
 * A metered phase total is everything that phase draws on its board: a column for a load on that phase (or a
 * load kept at its rating, `atRating`) would count that load twice, once inside the total and once on its own.
 * The issues naming both, or none.
 */
function countedTwiceIssues(targets: readonly ColumnTarget[], loads: readonly BoardLoad[], resolver: TargetResolver, atRating: readonly number[]): InputIssue[] {
  const boardOf = (l: number) => resolver.boardOf?.(l) ?? 0;
  const issues: InputIssue[] = [];
  for (const metered of targets.filter((t) => t.kind === 'phase')) {
    const m = metered.loads[0]!;
    const phase = loads[m]!.branches[0]!.from;
    const onPhase = (l: number) => boardOf(l) === boardOf(m) && loads[l]!.branches.some((b) => b.from === phase || b.to === phase);
    for (const other of targets) {
      if (other.kind === 'phase') continue;
      const shared = other.loads.filter(onPhase).map((l) => `"${loads[l]!.name}" (${loads[l]!.connection})`);
      if (shared.length)
        issues.push(
          inputIssue(
            'counted_twice',
            `header ("${metered.name}" and "${other.name}")`,
            `a metered phase total or columns for the loads on that phase, not both: "${metered.name}" is everything the phase draws on its board, and "${other.name}" drives ${shared.join(', ')} on it too, so it would be counted twice; leave out one of the two columns`,
            `${metered.name}, ${other.name}`,
          ),
        );
    }
    const kept = atRating.filter(onPhase).map((l) => `"${loads[l]!.name}" (${loads[l]!.connection})`);
    if (kept.length)
      issues.push(
        inputIssue(
          'counted_twice',
          `header ("${metered.name}")`,
          `a metered phase total without loads on that phase kept at rating: --unlisted-at-rating holds ${kept.join(', ')} on at its rating, and "${metered.name}" already counts everything the phase draws on its board; leave out --unlisted-at-rating (loads without a column then count as off), or give those loads columns and leave out the phase total`,
          metered.name,
        ),
      );
  }
  return issues;
}

/**
 * The rated power of the file's own loads on a metered load's phase (same board, banks in service aside), as
 * that line carries it at balanced nominal voltages, S_x = V_x·I*: a branch from the phase to the neutral
 * whole, a line-to-line branch x–y its share S·V_x/(V_x − V_y) (on a three-phase board S/√3 turned by ∓30°,
 * so a 20 kW oven at PF 1 on A-B is 10 − j5.77 kVA on line A and 10 + j5.77 on B; on a split-phase board
 * exactly half). A metered phase given in kW alone is taken at this power factor: the loads there are what
 * the meter sees, and PF 1 — or a line-to-line load's own PF on each line — would misplace their reactive
 * power in the currents, the neutral, the power factor and the bank.
 */
function phaseRatingOf(metered: number, ownLoads: number, loads: readonly BoardLoad[], resolver: TargetResolver, inService: ReadonlySet<number>): NonNullable<ColumnTarget['phaseRating']> {
  const phase = loads[metered]!.branches[0]!.from;
  const boardOf = (l: number) => resolver.boardOf?.(l) ?? 0;
  // A terminal's balanced nominal voltage, per unit: the neutral (and a floating star point, balanced) at 0.
  const unitVoltage = (t: string): ComplexValue => {
    const deg = resolver.phaseAnglesDeg[t as PhaseId];
    return deg === undefined ? ZERO : polar(1, degToRad(deg));
  };
  let p = 0;
  let q = 0;
  const names: string[] = [];
  for (let l = 0; l < ownLoads; l++) {
    // A bank the file lists in service is solved at its rating beside the total, so its kvar is not the meter's share.
    if (boardOf(l) !== boardOf(metered) || inService.has(l)) continue;
    let on = false;
    let whole = true;
    for (const b of loads[l]!.branches) {
      if (b.from !== phase && b.to !== phase) {
        whole = false;
        continue;
      }
      const toNeutral = b.to === 'N' || b.from === 'N';
      whole &&= toNeutral;
      // S_x = S·V_x/(V_from − V_to), with V_x = V_from for the from end and −V_to for the to end (its current is −I).
      const vf = unitVoltage(b.from);
      const vt = unitVoltage(b.to);
      const across = sub(vf, vt);
      if (!(abs(across) > 0)) continue;
      const share = mul(b.sNominal, div(b.from === phase ? vf : neg(vt), across));
      p += share.re;
      q += share.im;
      on = true;
    }
    // A load across phases is in the total only for its part on this one (the rest of it is off or driven elsewhere).
    if (on) names.push(whole ? loads[l]!.name : `part of ${loads[l]!.name}`);
  }
  if (!(p > 0)) return { pf: null, tanPhi: 0, loads: names };
  return { pf: p / Math.hypot(p, q), tanPhi: q / p, loads: names };
}

/** Whether every phase a load draws from is a metered phase total on its board. */
function inMeteredTotals(load: number, targets: readonly ColumnTarget[], loads: readonly BoardLoad[], resolver: TargetResolver): boolean {
  const boardOf = (l: number) => resolver.boardOf?.(l) ?? 0;
  const metered = new Set(targets.filter((t) => t.kind === 'phase' && boardOf(t.loads[0]!) === boardOf(load)).map((t) => loads[t.loads[0]!]!.branches[0]!.from));
  if (!metered.size) return false;
  const phases = loads[load]!.branches.flatMap((b) => [b.from, b.to]).filter((x) => x !== 'N');
  return phases.length > 0 && phases.every((x) => metered.has(x));
}

/**
 * The sentences that say how a column was read where the file leaves it to the model: a metered phase in
 * kW alone (at which power factor, and why), and how a group's kW, kvar or current is shared among loads of
 * unlike power factors.
 */
function columnNotes(targets: readonly ColumnTarget[], loads: readonly BoardLoad[]): string[] {
  const notes: string[] = [];
  const pfWords = (pf: number, tanPhi: number) => `PF ${pf.toFixed(3)} ${tanPhi < 0 ? 'leading' : 'lagging'}`;
  for (const t of targets) {
    if (t.kind === 'phase' && kwAlone(t) && t.phaseRating) {
      const r = t.phaseRating;
      const give = `give ${quoteText(`${t.name} [kvar]`)} or ${quoteText(`${t.name} [pf]`)} where the meter records it`;
      notes.push(
        r.pf === null
          ? `${quoteText(`${t.name} [kW]`)} has no kvar or pf column and the board file has no load drawing power on that phase: taken at PF 1; ${give}`
          : `${quoteText(`${t.name} [kW]`)} has no kvar or pf column: taken at ${r.pf > 0.99995 ? 'PF 1' : pfWords(r.pf, r.tanPhi)}, the rated power factor of the board file's loads on that phase (${r.loads.join(', ')}); ${give}`,
      );
    }
    if (t.kind !== 'group' || t.loads.length < 2 || t.columns.x !== undefined) continue;
    const rated = t.loads.map((l) => ratedPower(loads[l]!));
    // Loads alike in power factor share alike whichever way: only a mix is worth a sentence.
    const tan = rated.map((r) => (r.re !== 0 ? r.im / r.re : Number.NaN));
    if (tan.every((x) => Math.abs(x - tan[0]!) <= 1e-9)) continue;
    const given = QUANTITIES.filter((q) => t.columns[q] !== undefined).map((q) => `[${q}]`).join(' and ');
    const byKw = kwShares(rated) !== null;
    notes.push(
      byKw
        ? `${quoteText(t.name)} ${given} is shared among its ${t.loads.length} loads in proportion to their rated kW${kwAlone(t) ? ', each at its own rated power factor' : ', all at the power factor the columns give'}`
        : `${quoteText(t.name)} ${given} is shared among its ${t.loads.length} loads in proportion to their rated kVA, all at the power factor ${kwAlone(t) ? "of the group's rating" : 'the columns give'} (their rated kW, of both signs or none, give no share)`,
    );
  }
  return notes;
}

const isPhaseToNeutral = (load: BoardLoad) => load.branches.length === 1 && load.branches[0]!.to === 'N';

export const ratedPower = (load: BoardLoad): ComplexValue =>
  load.branches.reduce((s, b) => ({ re: s.re + b.sNominal.re, im: s.im + b.sNominal.im }), { re: 0, im: 0 });

/**
 * The batch drivers of a plan: per target, either a scale factor on each load's rating (x) or a complex
 * total P + jQ (every other column set; see driverColumns) shared by the loads in proportion to their
 * rated kW. With kW alone the driver is P and each load's coefficient is its own rating ÷ the target's
 * rated kW, so every load keeps its own rated tan φ (a heater at PF 1 in a group with a motor draws no
 * kvar, and a group at its rated kW is the board at rating). Where the loads' rated kW do not give a
 * share (none, or of both signs) they share by rated kVA, the old way, at the target's mean tan φ.
 * Loads kept at rating get one constant driver at the end.
 */
export function planDrivers(plan: ColumnPlan): DriverSpec[] {
  checkObjectArgument(plan, 'plan', 'a column plan from planColumns(...)', ['board', 'targets']);
  const { board } = plan;
  const drivers: DriverSpec[] = plan.targets.map((t) => {
    const rated = t.loads.map((l) => ratedPower(board.loads[l]!));
    if (t.columns.x !== undefined) return { name: t.name, loads: t.loads.map((l, k) => ({ load: l, coefficient: rated[k]! })) };
    const byKw = kwShares(rated);
    if (byKw && t.kind !== 'phase' && kwAlone(t)) return { name: t.name, loads: t.loads.map((l, k) => ({ load: l, coefficient: { re: byKw[k]!, im: (byKw[k]! * rated[k]!.im) / rated[k]!.re || 0 } })) };
    const shares = byKw ?? kvaShares(rated);
    return { name: t.name, loads: t.loads.map((l, k) => ({ load: l, coefficient: { re: shares[k]!, im: 0 } })) };
  });
  if (plan.undrivenAtRating) {
    const rest = plan.undriven.map((name) => board.loads.findIndex((l) => l.name === name));
    if (rest.length) drivers.push({ name: 'loads at rating', loads: rest.map((l) => ({ load: l, coefficient: ratedPower(board.loads[l]!) })) });
  }
  if (plan.inService?.length) drivers.push({ name: 'banks in service', loads: plan.inService.map((l) => ({ load: l, coefficient: ratedPower(board.loads[l]!) })) });
  return drivers;
}

/** A target given in kW alone (no kvar, pf or A beside it). */
const kwAlone = (t: ColumnTarget) => t.columns.kW !== undefined && t.columns.kvar === undefined && t.columns.pf === undefined;

/** Each load's share of the rated kW, or null where the rated kW give none (all 0, or of both signs). */
function kwShares(rated: readonly ComplexValue[]): number[] | null {
  const total = rated.reduce((s, r) => s + r.re, 0);
  if (rated.some((r) => r.re < 0) && rated.some((r) => r.re > 0)) return null;
  return total !== 0 ? rated.map((r) => r.re / total) : null;
}

/** Each load's share of the rated kVA, or equal shares where every rating is 0. */
function kvaShares(rated: readonly ComplexValue[]): number[] {
  const kva = rated.map((r) => Math.hypot(r.re, r.im));
  const total = kva.reduce((a, b) => a + b, 0);
  return kva.map((x) => (total > 0 ? x / total : 1 / rated.length));
}

/**
 * Per-interval driver values from the table's columns, in planDrivers' order:
 * x as it is; kW alone as P, each load
 * then at its own rated tan φ through planDrivers' coefficients (a metered phase at the rated tan φ of
 * the file's loads on that phase, ColumnTarget.phaseRating; where the loads' kW give no share, the
 * target's mean rated tan φ); kW + kvar; kW + pf (negative pf = leading); A + pf with apparent
 * power = A × nominal line-to-neutral voltage.
 */
export function driverColumns(plan: ColumnPlan, values: readonly Float64Array[], count: number): DriverColumns {
  checkObjectArgument(plan, 'plan', 'a column plan from planColumns(...)', ['board', 'targets']);
  checkListArgument(values, 'values', 'one Float64Array of interval values per data column', (x) => x instanceof Float64Array);
  checkNumberArgument(count, 'count', 'a number of intervals: a whole number at least 0', (x) => Number.isInteger(x) && x >= 0);
  const re: Float64Array[] = [];
  const im: Float64Array[] = [];
  const vLN = plan.board.nominalLineToNeutralV;
  for (const t of plan.targets) {
    const r = new Float64Array(count);
    const m = new Float64Array(count);
    const col = (q: Quantity) => (t.columns[q] === undefined ? null : values[t.columns[q]]!);
    const x = col('x');
    const kW = col('kW');
    const kvar = col('kvar');
    const pf = col('pf');
    const amps = col('A');
    const ratings = t.loads.map((l) => ratedPower(plan.board.loads[l]!));
    const rated = ratings.reduce((s, r) => ({ re: s.re + r.re, im: s.im + r.im }), { re: 0, im: 0 });
    // kW alone: the Q a driver must carry itself (the loads' coefficients carry it where their kW share it out).
    const tanRated = t.kind === 'phase' ? (t.phaseRating?.tanPhi ?? 0) : kwShares(ratings) ? 0 : rated.re !== 0 ? rated.im / rated.re : 0;
    for (let i = 0; i < count; i++) {
      if (x) r[i] = x[i]!;
      else if (kW && kvar) {
        r[i] = kW[i]! * 1000;
        m[i] = kvar[i]! * 1000;
      } else if (kW && pf) {
        const p = kW[i]! * 1000;
        const f = pf[i]!;
        r[i] = p;
        m[i] = Math.sign(f) * ((Math.abs(p) * Math.sqrt(1 - f * f)) / Math.abs(f));
      } else if (kW) {
        r[i] = kW[i]! * 1000;
        m[i] = r[i]! * tanRated;
      } else if (amps && pf) {
        const s = amps[i]! * vLN;
        const f = pf[i]!;
        r[i] = s * Math.abs(f);
        m[i] = Math.sign(f) * s * Math.sqrt(1 - f * f);
      }
    }
    re.push(r);
    im.push(m);
  }
  // The constant drivers, in planDrivers' order: loads kept at rating, then banks in service.
  for (const constant of [plan.undrivenAtRating && plan.undriven.length > 0, (plan.inService?.length ?? 0) > 0])
    if (constant) {
      re.push(new Float64Array(count).fill(1));
      im.push(new Float64Array(count));
    }
  return { count, re, im };
}
