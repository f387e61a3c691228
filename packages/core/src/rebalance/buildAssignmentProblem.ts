/**
 * Board + resolved study → the numeric assignment problem (assignmentProblem.ts).
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
 */
import type { Board } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { A_OPERATOR, A_SQUARED, abs, add, complex, conj, div, mul, polar, scale, sub, type ComplexValue } from '../complex.js';
import { sequenceComponents } from '../analysis/symmetricalComponents.js';
import { MAX_OPTIONS, type AssignmentProblem } from './assignmentProblem.js';
import { builtInMagnitudeScore, magnitudeScore, type ConditionLayout, type RebalanceObjective } from './rebalanceObjective.js';
import { connectionChoices, type ResolvedRebalance } from './rebalanceRules.js';

/** A circuit the search may place, with the connections it may take. */
export interface CircuitSlot {
  /** Index of the load in the board (and the board file's `loads`). */
  readonly loadIndex: number;
  readonly name: string;
  readonly present: ConnectionSpec;
  readonly options: readonly ConnectionSpec[];
}

export interface BuiltProblem {
  readonly problem: AssignmentProblem;
  readonly slots: readonly CircuitSlot[];
  readonly layouts: readonly ConditionLayout[];
  /** Line currents (phase order) of the loads that cannot move, per condition, A — for messages. */
  readonly fixedLineA: readonly (readonly number[])[];
  /**
   * The one quantity the score reads, when it reads only one (a built-in aim of just the neutral,
   * just the current unbalance or just the voltage unbalance, in one condition); else null.
   */
  readonly singleQuantity: number | null;
}

/** Balanced nominal phase voltages of the scoring model, in `board.phases` order. */
function nominalPhaseVoltages(board: Board): ComplexValue[] {
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
function fixedLoadLineCurrents(board: Board, v: readonly ComplexValue[], loadIndex: number, factor: number): ComplexValue[] {
  const out = board.phases.map(() => complex(0, 0));
  const voltage = (t: string) => {
    const k = board.phases.indexOf(t as 'A');
    return k >= 0 ? v[k]! : complex(0, 0); // N and a balanced star point sit at 0
  };
  for (const b of board.loads[loadIndex]!.branches) {
    const current = conj(div(scale(b.sNominal, factor), sub(voltage(b.from), voltage(b.to))));
    const f = board.phases.indexOf(b.from as 'A');
    const t = board.phases.indexOf(b.to as 'A');
    if (f >= 0) out[f] = add(out[f]!, current);
    if (t >= 0) out[t] = sub(out[t]!, current);
  }
  return out;
}

/**
 * @param objective a caller's score; the built-in weighted score when absent.
 */
export function buildAssignmentProblem(board: Board, study: ResolvedRebalance, objective?: RebalanceObjective): BuiltProblem {
  const v = nominalPhaseVoltages(board);
  const lines = board.phases.length;
  const threePhase = lines === 3;
  const wantVoltage = threePhase && study.aim.voltageUnbalance > 0;

  // Quantity rows: coefficients on the line currents, per condition.
  const rows: ComplexValue[][] = [];
  const layouts: ConditionLayout[] = [];
  const [ab, ac] = board.sequence === 'ABC' ? [A_OPERATOR, A_SQUARED] : [A_SQUARED, A_OPERATOR];
  const negativeRow = threePhase ? [complex(1 / 3), scale(ac, 1 / 3), scale(ab, 1 / 3)] : [];
  const seriesZ = add(board.sourceImpedance, board.lineImpedance);
  const emfSeq = threePhase ? sequenceComponents(board.emf as [ComplexValue, ComplexValue, ComplexValue], board.sequence) : null;
  const voltageConstants: { index: number; value: ComplexValue }[] = [];

  const slots: CircuitSlot[] = [];
  board.loads.forEach((load, i) => {
    if (load.origin !== 'board' || load.branches.length !== 1) return;
    const pin = study.pinned.get(i);
    const choices = connectionChoices(board, load.connection);
    if (choices.length < 2 && pin === undefined) return;
    if (pin !== undefined && pin === load.connection) return; // stays: part of the fixed load
    slots.push({ loadIndex: i, name: load.name, present: load.connection, options: pin !== undefined ? [pin] : choices });
  });
  const movable = new Set(slots.map((s) => s.loadIndex));

  // Per condition: line currents of the fixed loads, and of each slot option.
  const fixedLineA: number[][] = [];
  const fixedByCondition: ComplexValue[][] = [];
  const slotCurrents: ComplexValue[][][][] = slots.map(() => []); // [slot][option][condition][line]
  study.conditions.forEach((condition) => {
    let fixed = board.phases.map(() => complex(0, 0));
    board.loads.forEach((_, i) => {
      if (movable.has(i)) return;
      const currents = fixedLoadLineCurrents(board, v, i, condition.factors[i]!);
      fixed = fixed.map((x, k) => add(x, currents[k]!));
    });
    fixedByCondition.push(fixed);
    fixedLineA.push(fixed.map(abs));
    slots.forEach((slot, s) => {
      const rating = scale(board.loads[slot.loadIndex]!.branches[0]!.sNominal, condition.factors[slot.loadIndex]!);
      slot.options.forEach((option, k) => {
        (slotCurrents[s]![k] ??= []).push(connectionLineCurrents(board, v, option, rating));
      });
    });
  });

  study.conditions.forEach((condition, c) => {
    const first = rows.length;
    const lineIdx = board.phases.map((_, k) => {
      rows.push(board.phases.map((__, x) => complex(x === k ? 1 : 0)));
      return first + k;
    });
    let neutral = -1;
    if (board.hasNeutral && lines > 1) {
      neutral = rows.length;
      rows.push(board.phases.map(() => complex(1)));
    }
    let negative = -1;
    if (threePhase) {
      negative = rows.length;
      rows.push(negativeRow);
    }
    // Every assignment draws the same total; take the present one to read the fixed parts.
    const total = board.phases.map((_, k) => {
      let x = fixedByCondition[c]![k]!;
      slots.forEach((slot, s) => {
        const present = slot.options.indexOf(slot.present);
        x = add(x, slotCurrents[s]![Math.max(present, 0)]![c]![k]!);
      });
      return x;
    });
    let positiveA = 0;
    let balancedA = 0;
    let positiveV = board.nominalLineToNeutralV;
    let voltageNegative = -1;
    if (threePhase) {
      const seq = sequenceComponents(total as [ComplexValue, ComplexValue, ComplexValue], board.sequence);
      positiveA = abs(seq.positive);
      balancedA = positiveA;
      positiveV = abs(sub(emfSeq!.positive, mul(seriesZ, seq.positive)));
      if (wantVoltage) {
        voltageNegative = rows.length;
        rows.push(negativeRow.map((x) => scale(mul(seriesZ, x), -1)));
        voltageConstants.push({ index: voltageNegative, value: emfSeq!.negative });
      }
    } else if (lines === 2) {
      balancedA = abs(scale(sub(total[0]!, total[1]!), 0.5));
    } else {
      balancedA = abs(total[0]!);
    }
    layouts.push({
      name: condition.name,
      weight: condition.weight,
      lines: lineIdx,
      neutral,
      negative,
      voltageNegative,
      balancedA,
      neutralShare: threePhase ? 1 / 3 : 0.5,
      positiveA,
      positiveV,
    });
  });

  // Rows of each condition act on that condition's line currents only.
  const conditionOfRow: number[] = [];
  layouts.forEach((l, c) => {
    const end = c + 1 < layouts.length ? layouts[c + 1]!.lines[0]! : rows.length;
    for (let j = l.lines[0]!; j < end; j++) conditionOfRow[j] = c;
  });
  const project = (row: readonly ComplexValue[], currents: readonly ComplexValue[]) => row.reduce((acc, w, k) => add(acc, mul(w, currents[k]!)), complex(0, 0));

  const q = rows.length;
  const base = new Float64Array(2 * q);
  const contributions = new Float64Array(slots.length * MAX_OPTIONS * 2 * q);
  const limits = new Float64Array(q).fill(Infinity);
  rows.forEach((row, j) => {
    const c = conditionOfRow[j]!;
    const value = project(row, fixedByCondition[c]!);
    base[2 * j] = value.re;
    base[2 * j + 1] = value.im;
    slots.forEach((slot, s) =>
      slot.options.forEach((_, k) => {
        const x = project(row, slotCurrents[s]![k]![c]!);
        const at = (s * MAX_OPTIONS + k) * 2 * q + 2 * j;
        contributions[at] = x.re;
        contributions[at + 1] = x.im;
      }),
    );
  });
  for (const { index, value } of voltageConstants) {
    base[2 * index]! += value.re;
    base[2 * index + 1]! += value.im;
  }
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
  let singleQuantity: number | null = null;
  const aimed = (Object.keys(study.aim) as (keyof typeof study.aim)[]).filter((k) => study.aim[k] > 0);
  if (!objective && layouts.length === 1 && aimed.length === 1) {
    const l = layouts[0]!;
    const index = { largestLine: -1, neutral: l.neutral, currentUnbalance: l.negative, voltageUnbalance: l.voltageNegative }[aimed[0]!];
    if (index >= 0) singleQuantity = index;
  }
  return { problem, slots, layouts, fixedLineA, singleQuantity };
}

