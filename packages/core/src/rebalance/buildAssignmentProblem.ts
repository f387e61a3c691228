/**
 * Installation (a single board is one with one board) + resolved study → the
 * numeric assignment problem (assignmentProblem.ts).
 *
 * The scoring model is the fast one: a stiff, balanced supply at nominal
 * voltage, each circuit drawing I = conj(S / V) for its complex rating S (its
 * power factor and sign kept: lagging, leading and exporting circuits partly
 * cancel). Quantities per condition: each line current, the neutral current
 * (4-wire and split-phase), the negative-sequence current (three-phase) and,
 * when the aim asks for it, the negative-sequence board voltage
 * V2 = E2 − Z·I2 with Z the source and feeder impedance per line (the neutral
 * path carries only zero sequence, so it does not enter V2). The final
 * answer is always re-solved by the network solver.
 *
 * On an installation the quantities are read at each measured board's incomer:
 * the sum of the currents drawn on that board and every board it feeds (the
 * feeders change with every move below them). V2 at a board subtracts the drop
 * of each feeder on its path, each carrying the I2 of what it feeds.
 */
import type { Board, BoardLoad } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { A_OPERATOR, A_SQUARED, abs, add, complex, conj, div, mul, polar, scale, sub, ZERO, type ComplexValue } from '../complex.js';
import { fortescueComponents } from '../analysis/symmetricalComponents.js';
import { MAX_OPTIONS, type AssignmentProblem } from './assignmentProblem.js';
import { ratedCurrentLimits } from './ratedCurrentLimits.js';
import { builtInMagnitudeScore, magnitudeScore, type ConditionLayout, type RebalanceObjective } from './rebalanceObjective.js';
import { connectionChoices, type ResolvedRebalance } from './rebalanceRules.js';
import { isUnder, loadOf, pathTo, type RebalanceTree } from './rebalanceTree.js';

/** A circuit the search may place, with the connections it may take. */
export interface CircuitSlot {
  /** Flat circuit index in the installation (rebalanceTree.ts). */
  readonly flat: number;
  /** Board number and name. */
  readonly board: number;
  readonly boardName: string;
  /** Index of the load in its board (and in that board's `loads` in the file). */
  readonly loadIndex: number;
  readonly name: string;
  readonly present: ConnectionSpec;
  readonly options: readonly ConnectionSpec[];
}

export interface BuiltProblem {
  readonly problem: AssignmentProblem;
  readonly slots: readonly CircuitSlot[];
  readonly layouts: readonly ConditionLayout[];
  /** Line currents (phase order) of the loads that cannot move, per layout (condition × measured board), A — for messages. */
  readonly fixedLineA: readonly (readonly number[])[];
  /**
   * The one quantity the score reads, when it reads only one (a built-in aim of just the neutral,
   * just the current unbalance or just the voltage unbalance, in one condition); else null.
   */
  readonly singleQuantity: number | null;
  /**
   * The file's ratings as limits of the search (ratedCurrentLimits.ts): per quantity, the rated current in
   * the fast model's terms (scaled by solvedNowA), the quantity's limit (or the study's capacity where that
   * is lower). Where the present wiring is over one, the search minimises the overload first
   * (assignmentProblem.ts isBetter). Line and neutral currents at every rated board's incomer.
   */
  readonly rated: readonly {
    readonly quantity: number;
    readonly ratingA: number;
    /** Condition and board number it is read in and at; the line (index into phases), or null for the neutral. */
    readonly condition: number;
    readonly board: number;
    readonly line: number | null;
  }[];
}

/** Balanced nominal phase voltages of the scoring model, in `board.phases` order. */
export function nominalPhaseVoltages(board: Board): ComplexValue[] {
  const ln = board.nominalLineToNeutralV;
  if (board.phases.length === 1) return [polar(ln, 0)];
  if (board.phases.length === 2) return [polar(ln, 0), polar(ln, Math.PI)];
  const turn = (2 * Math.PI) / 3;
  return board.sequence === 'ABC' ? [polar(ln, 0), polar(ln, -turn), polar(ln, turn)] : [polar(ln, 0), polar(ln, turn), polar(ln, -turn)];
}

/** Line currents (phase order) drawn by power S on a connection, in the scoring model. */
function connectionLineCurrents(board: Board, v: readonly ComplexValue[], connection: ConnectionSpec, s: ComplexValue): ComplexValue[] {
  const out = board.phases.map(() => complex(0, 0));
  const [from, to] = connection.split('-') as [string, string];
  const at = (t: string) => board.phases.indexOf(t as 'A');
  const vFrom = v[at(from)]!;
  const vTo = to === 'N' ? complex(0, 0) : v[at(to)]!;
  const current = conj(div(s, sub(vFrom, vTo)));
  out[at(from)] = current;
  if (to !== 'N') out[at(to)] = scale(current, -1);
  return out;
}

/** Line currents of a fixed load (any shape) in the scoring model: its branches at nominal voltage. */
export function fixedLoadLineCurrents(board: Board, v: readonly ComplexValue[], load: BoardLoad, factor: ComplexValue): ComplexValue[] {
  const out = board.phases.map(() => complex(0, 0));
  const voltage = (t: string) => {
    const k = board.phases.indexOf(t as 'A');
    return k >= 0 ? v[k]! : complex(0, 0); // N and a balanced star point sit at 0
  };
  for (const b of load.branches) {
    const current = conj(div(mul(b.sNominal, factor), sub(voltage(b.from), voltage(b.to))));
    const f = board.phases.indexOf(b.from as 'A');
    const t = board.phases.indexOf(b.to as 'A');
    if (f >= 0) out[f] = add(out[f]!, current);
    if (t >= 0) out[t] = sub(out[t]!, current);
  }
  return out;
}

/**
 * Fast-model current over network-solved current into board `p` at the present wiring (sums over its
 * lines), to scale its ratings by; 1 without solved figures or current. Kept within 0.5–2: beyond, the
 * fast model is no guide and the re-solve's check of the answer speaks (rebalanceInstallation.ts).
 */
function modelOverSolved(drawn: readonly (readonly ComplexValue[])[], p: number, solved: readonly number[] | undefined): number {
  if (!solved) return 1;
  const model = drawn[p]!.reduce((t, x) => t + abs(x), 0);
  const actual = solved.reduce((t, a) => t + a, 0);
  if (!(model > 0 && actual > 0)) return 1;
  return Math.min(2, Math.max(0.5, model / actual));
}

interface QuantityRow {
  /** Coefficients on a board's line currents (phase order). */
  readonly weights: readonly ComplexValue[];
  /** Multiplier of the currents drawn on each board (0 for boards outside the measured incomer). */
  readonly perBoard: readonly ComplexValue[];
  readonly condition: number;
  readonly constant: ComplexValue;
}

/**
 * @param objective a caller's score; the built-in weighted score when absent.
 * @param solvedNowA the network-solved line currents of the present wiring, A, [condition][board][line]: the
 *   file's ratings are scaled by how far the fast model reads each board's incomer below (or above) them, so
 *   a limit kept in the fast model is one the re-solve keeps (a board whose voltage sags draws more current
 *   than the fast model's nominal voltage gives). Without it, the ratings are taken as they are.
 */
export function buildAssignmentProblem(
  tree: RebalanceTree,
  study: ResolvedRebalance,
  objective?: RebalanceObjective,
  solvedNowA?: readonly (readonly (readonly number[])[])[],
): BuiltProblem {
  const board = tree.boards[0]!;
  const v = nominalPhaseVoltages(board);
  const lines = board.phases.length;
  const threePhase = lines === 3;
  const wantVoltage = threePhase && study.aim.voltageUnbalance > 0;
  const [ab, ac] = board.sequence === 'ABC' ? [A_OPERATOR, A_SQUARED] : [A_SQUARED, A_OPERATOR];
  const negativeRow = threePhase ? [complex(1 / 3), scale(ac, 1 / 3), scale(ab, 1 / 3)] : [];
  const emfSeq = threePhase ? fortescueComponents(board.emf as [ComplexValue, ComplexValue, ComplexValue], board.sequence) : null;
  const unit = board.phases.map((_, k) => board.phases.map((__, x) => complex(x === k ? 1 : 0)));
  const ones = board.phases.map(() => complex(1));
  const under = (p: number) => tree.boards.map((_, x) => complex(isUnder(tree, x, p) ? 1 : 0));
  /** −(series impedance of the path into `p` that carries a current drawn on each board). */
  const dropInto = (p: number) =>
    tree.boards.map((_, x) => scale(pathTo(tree, p).reduce((z, k) => (isUnder(tree, x, k) ? add(z, tree.seriesZ[k]!) : z), ZERO), -1));

  const slots: CircuitSlot[] = [];
  tree.circuits.forEach((ref, flat) => {
    const load = loadOf(tree, flat);
    if (load.origin !== 'board' || load.branches.length !== 1) return;
    const pin = study.pinned.get(flat);
    if (pin === undefined && !study.movableBoards[ref.board]) return;
    const choices = connectionChoices(board, load.connection);
    if (choices.length < 2 && pin === undefined) return;
    if (pin !== undefined && pin === load.connection) return; // stays: part of the fixed load
    slots.push({
      flat,
      board: ref.board,
      boardName: tree.names[ref.board]!,
      loadIndex: ref.load,
      name: load.name,
      present: load.connection,
      options: pin !== undefined ? [pin] : choices,
    });
  });
  const movable = new Set(slots.map((s) => s.flat));

  // Per condition: each board's line currents of the loads that cannot move, and of each slot option.
  const fixedByCondition: ComplexValue[][][] = []; // [condition][board][line]
  const slotCurrents: ComplexValue[][][][] = slots.map(() => []); // [slot][option][condition][line]
  study.conditions.forEach((condition) => {
    const fixed = tree.boards.map(() => board.phases.map(() => ZERO));
    tree.circuits.forEach((ref, flat) => {
      if (movable.has(flat)) return;
      const currents = fixedLoadLineCurrents(board, v, loadOf(tree, flat), condition.factors[flat]!);
      fixed[ref.board] = fixed[ref.board]!.map((x, k) => add(x, currents[k]!));
    });
    fixedByCondition.push(fixed);
    slots.forEach((slot, s) => {
      const rating = mul(loadOf(tree, slot.flat).branches[0]!.sNominal, condition.factors[slot.flat]!);
      slot.options.forEach((option, k) => {
        (slotCurrents[s]![k] ??= []).push(connectionLineCurrents(board, v, option, rating));
      });
    });
  });

  const rows: QuantityRow[] = [];
  const layouts: ConditionLayout[] = [];
  /** The fast model's currents into each board at the present wiring, [condition][board][line]. */
  const drawnByCondition: ComplexValue[][][] = [];
  const fixedLineA: number[][] = [];
  study.conditions.forEach((condition, c) => {
    // Every assignment draws the same positive-sequence current on each board; read it at the present wiring.
    const drawn = tree.boards.map((_, b) => {
      let x = fixedByCondition[c]![b]!;
      slots.forEach((slot, s) => {
        if (slot.board !== b) return;
        const present = Math.max(slot.options.indexOf(slot.present), 0);
        x = x.map((y, k) => add(y, slotCurrents[s]![present]![c]![k]!));
      });
      return x;
    });
    drawnByCondition.push(tree.boards.map((_, p) => board.phases.map((__, k) => drawn.reduce((t, x, b) => (isUnder(tree, b, p) ? add(t, x[k]!) : t), ZERO))));
    const sumUnder = (p: number, per: readonly ComplexValue[][]) =>
      board.phases.map((_, k) => per.reduce((t, x, b) => (isUnder(tree, b, p) ? add(t, x[k]!) : t), ZERO));
    const positiveInto = (p: number) =>
      threePhase ? fortescueComponents(sumUnder(p, drawn) as [ComplexValue, ComplexValue, ComplexValue], board.sequence).positive : ZERO;
    for (const p of study.measuredBoards) {
      const perBoard = under(p);
      const lineIdx = board.phases.map((_, k) => rows.push({ weights: unit[k]!, perBoard, condition: c, constant: ZERO }) - 1);
      // On a single-phase board the neutral carries the line current back: counted as the network re-solve counts it.
      const neutral = board.hasNeutral ? rows.push({ weights: ones, perBoard, condition: c, constant: ZERO }) - 1 : -1;
      const negative = threePhase ? rows.push({ weights: negativeRow, perBoard, condition: c, constant: ZERO }) - 1 : -1;
      const total = sumUnder(p, drawn);
      let positiveA = 0;
      let balancedA: number;
      let positiveV = board.nominalLineToNeutralV;
      let voltageNegative = -1;
      if (threePhase) {
        positiveA = abs(positiveInto(p));
        balancedA = positiveA;
        positiveV = abs(pathTo(tree, p).reduce((e, k) => sub(e, mul(tree.seriesZ[k]!, positiveInto(k))), emfSeq!.positive));
        if (wantVoltage) voltageNegative = rows.push({ weights: negativeRow, perBoard: dropInto(p), condition: c, constant: emfSeq!.negative }) - 1;
      } else if (lines === 2) {
        balancedA = abs(scale(sub(total[0]!, total[1]!), 0.5));
      } else {
        balancedA = abs(total[0]!);
      }
      fixedLineA.push(sumUnder(p, fixedByCondition[c]!).map(abs));
      layouts.push({
        name: condition.name,
        board: tree.names[p]!,
        condition: c,
        weight: condition.weight,
        lines: lineIdx,
        neutral,
        negative,
        voltageNegative,
        balancedA,
        // The neutral current is the sum of the lines: the mean-square bound takes 1/3 (1/2) of it on three (two) lines; one line is its own neutral.
        neutralShare: threePhase ? 1 / 3 : lines === 2 ? 0.5 : 0,
        positiveA,
        positiveV,
      });
    }
  });

  // The file's ratings at every board's incomer, measured or not: rows of their own where the score reads none.
  const ratedRows: { quantity: number; ratingA: number; condition: number; board: number; line: number | null }[] = [];
  study.conditions.forEach((_, c) =>
    tree.boards.forEach((b, p) => {
      const rated = ratedCurrentLimits(b, p === 0);
      if (rated.lineA.every((a) => a === Infinity) && rated.neutralA === Infinity) return;
      const scale = modelOverSolved(drawnByCondition[c]!, p, solvedNowA?.[c]?.[p]);
      const layout = layouts.find((l) => l.condition === c && l.board === tree.names[p]);
      const perBoard = under(p);
      rated.lineA.forEach((ratingA, k) => {
        if (ratingA === Infinity) return;
        const quantity = layout ? layout.lines[k]! : rows.push({ weights: unit[k]!, perBoard, condition: c, constant: ZERO }) - 1;
        ratedRows.push({ quantity, ratingA: ratingA * scale, condition: c, board: p, line: k });
      });
      if (rated.neutralA !== Infinity) {
        const quantity = layout && layout.neutral >= 0 ? layout.neutral : rows.push({ weights: ones, perBoard, condition: c, constant: ZERO }) - 1;
        ratedRows.push({ quantity, ratingA: rated.neutralA * scale, condition: c, board: p, line: null });
      }
    }),
  );

  const project = (row: QuantityRow, b: number, currents: readonly ComplexValue[]) =>
    mul(row.perBoard[b]!, row.weights.reduce((acc, w, k) => add(acc, mul(w, currents[k]!)), ZERO));

  const q = rows.length;
  const base = new Float64Array(2 * q);
  const contributions = new Float64Array(slots.length * MAX_OPTIONS * 2 * q);
  const limits = new Float64Array(q).fill(Infinity);
  rows.forEach((row, j) => {
    const value = tree.boards.reduce((t, _, b) => add(t, project(row, b, fixedByCondition[row.condition]![b]!)), row.constant);
    base[2 * j] = value.re;
    base[2 * j + 1] = value.im;
    slots.forEach((slot, s) =>
      slot.options.forEach((_, k) => {
        const x = project(row, slot.board, slotCurrents[s]![k]![row.condition]!);
        const at = (s * MAX_OPTIONS + k) * 2 * q + 2 * j;
        contributions[at] = x.re;
        contributions[at + 1] = x.im;
      }),
    );
  });
  layouts.forEach((l) => l.lines.forEach((j, k) => (limits[j] = study.lineCapacityA[k]!)));

  const score = objective
    ? magnitudeScore(objective, layouts)
    : builtInMagnitudeScore(study.aim, study.combine, layouts);
  const problem: AssignmentProblem = {
    circuitCount: slots.length,
    quantityCount: q,
    optionCounts: Int32Array.from(slots, (s) => s.options.length),
    home: Int32Array.from(slots, (s) => s.options.indexOf(s.present)),
    base,
    contributions,
    limits,
    score,
  };
  // A rating the present wiring is already over stays the limit: the overload is what the search lowers first.
  for (const row of ratedRows) limits[row.quantity] = Math.min(limits[row.quantity]!, row.ratingA);
  const rated = ratedRows;
  let singleQuantity: number | null = null;
  const aimed = (Object.keys(study.aim) as (keyof typeof study.aim)[]).filter((k) => study.aim[k] > 0);
  if (!objective && layouts.length === 1 && aimed.length === 1) {
    const l = layouts[0]!;
    const index = { largestLine: -1, neutral: l.neutral, currentUnbalance: l.negative, voltageUnbalance: l.voltageNegative }[aimed[0]!];
    if (index >= 0) singleQuantity = index;
  }
  return { problem, slots, layouts, fixedLineA, singleQuantity, rated };
}
