/**
 * The line currents where a controller's CT reads in the states the bank's switched steps can sit in.
 *
 * The design state (every step in) and the board without equipment do not bound the others. Part of
 * the equipment may stay in whatever the controller does (a compensator's reactors, a bank's fixed
 * part): with the switched capacitors out, a reactor's current adds to its lines unopposed. Steps on
 * different branches (trim steps) switch apart, so their states form a box, not a segment, and a
 * corner of it can load a line more than either end (a step on A-B out, one on B-C in).
 *
 * Each step's current is taken as it flows in the design state, jωC·V across its branch at the solved
 * voltages there, and added to the line currents read at the CT: the feeders between the equipment's
 * board and a metering point carry it unchanged. Per line, |c + Σ t_s·d_s| over t ∈ {0, 1}ⁿ is a convex
 * function on the vertices of a zonotope in the plane; its largest value sits at a vertex, and every
 * vertex is the set of steps whose current points along some direction u (u·d_s > 0). Those sets change
 * only where u crosses a right angle to a step's current, so one direction in each of the ≤ 2n sectors
 * between those angles finds the largest exactly, for any number of steps (all 2ⁿ states checked one by
 * one would agree; the tests do that). The worst state is then solved once, so the figure given is the
 * network's, not the superposition's.
 */
import type { PhaseId } from '../board/boardModel.js';
import type { BoardResult } from '../analysis/boardResult.js';
import { add, sub, type ComplexValue } from '../complex.js';
import type { BankStep, StepStateCurrent } from './correctionResult.js';
import { cleanSusceptance, type EquipmentGroup } from './equipment.js';
import { NumericalError } from '../errors.js';

/** The state of the switched steps that draws the most current on one line, by superposition. */
export interface LargestSwitching {
  /** The line (index into the currents given). */
  readonly line: number;
  /** Per step: true when it is switched in. */
  readonly stepsIn: readonly boolean[];
  /** |current| on that line in that state, A. */
  readonly currentA: number;
}

const dot = (a: ComplexValue, b: ComplexValue) => a.re * b.re + a.im * b.im;

/**
 * The largest |base[k] + Σ_{s in} steps[s][k]| over every line k and every subset of steps (see the
 * top of this file for why the sector scan is exact).
 * @param base each line's current with every switched step out, A (phasor)
 * @param steps per step, the current it adds to each line when switched in, A (phasor)
 */
export function largestSwitching(base: readonly ComplexValue[], steps: readonly (readonly ComplexValue[])[]): LargestSwitching {
  let best: LargestSwitching = { line: 0, stepsIn: steps.map(() => false), currentA: -1 };
  base.forEach((c, k) => {
    const ds = steps.map((s) => s[k]!);
    const scale = Math.max(Math.hypot(c.re, c.im), ...ds.map((d) => Math.hypot(d.re, d.im)));
    // The right angles to each step's current, where the set a direction picks can change.
    const edges = ds.filter((d) => Math.hypot(d.re, d.im) > 1e-12 * scale).flatMap((d) => [Math.atan2(d.im, d.re) + Math.PI / 2, Math.atan2(d.im, d.re) - Math.PI / 2]);
    const angles = edges.map((a) => ((a % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI)).sort((a, b) => a - b);
    // One direction inside each sector (the wrap-around one too); none when no step moves this line.
    const directions = angles.length ? angles.map((a, i) => (a + (i + 1 < angles.length ? angles[i + 1]! : angles[0]! + 2 * Math.PI)) / 2) : [0];
    for (const phi of directions) {
      const u = { re: Math.cos(phi), im: Math.sin(phi) };
      const stepsIn = ds.map((d) => angles.length > 0 && dot(u, d) > 0);
      const z = ds.reduce((sum, d, s) => (stepsIn[s] ? add(sum, d) : sum), c);
      const currentA = Math.hypot(z.re, z.im);
      if (currentA > best.currentA) best = { line: k, stepsIn, currentA };
    }
  });
  return best;
}

/** The current one switched step adds to each of `phases` in the design state, A: jωC·V across each of its branches. */
export function stepLineCurrents(step: BankStep, phases: readonly PhaseId[], voltages: ReadonlyMap<PhaseId, ComplexValue>, omega: number): ComplexValue[] {
  const b = (omega * step.capacitancePerBranchUF * 1e-6) / (1 - step.detuningFactor);
  const ends = step.branches.map((name) => name.split('-') as [PhaseId, string]);
  // A floating star of equal branches sits at the centroid of its lines' voltages.
  const starLines = ends.filter(([, to]) => to === 'star').map(([from]) => voltages.get(from)!);
  const star = starLines.reduce((s, v) => ({ re: s.re + v.re / starLines.length, im: s.im + v.im / starLines.length }), { re: 0, im: 0 });
  const into = new Map<string, ComplexValue>(phases.map((p) => [p, { re: 0, im: 0 }]));
  for (const [from, to] of ends) {
    const across = sub(voltages.get(from)!, to === 'N' ? { re: 0, im: 0 } : to === 'star' ? star : voltages.get(to as PhaseId)!);
    const i = { re: -b * across.im, im: b * across.re };
    into.set(from, add(into.get(from)!, i));
    if (into.has(to)) into.set(to, sub(into.get(to)!, i));
  }
  return phases.map((p) => into.get(p)!);
}

/** What switching a step out reads of it: its output (null: the fixed part), branches, capacitance per branch and detuning. */
export type SwitchableStep = Pick<BankStep, 'output' | 'branches' | 'capacitancePerBranchUF' | 'detuningFactor'>;

/** The equipment with the steps not in `stepsIn` switched out (their capacitance taken off their capacitor branches). */
export function equipmentWithStepsOut(equipment: readonly EquipmentGroup[], steps: readonly SwitchableStep[], stepsIn: readonly boolean[], omega: number): EquipmentGroup[] {
  return equipment.map((g) => ({
    ...g,
    branches: g.branches.map((br) => {
      // Steps are capacitors: a reactor's branch keeps its value.
      if (!(br.susceptanceS > 0)) return br;
      const out = steps.reduce((sum, s, k) => (!stepsIn[k] && s.branches.includes(br.branch) ? sum + (omega * s.capacitancePerBranchUF * 1e-6) / (1 - s.detuningFactor) : sum), 0);
      return out === 0 ? br : { ...br, susceptanceS: cleanSusceptance(br.susceptanceS - out, br.vNominal) };
    }),
  }));
}

/** The worst state of the switched steps where the CT reads, re-solved: StepStateCurrent without the line's label (the caller names it). */
export type WorstStepState = Omit<StepStateCurrent, 'lineLabel'>;

export interface StepStateInputs {
  /** Every step of the bank as built (the fixed part has output null). */
  readonly steps: readonly BankStep[];
  readonly equipment: readonly EquipmentGroup[];
  /** The equipment's board with everything in (design state): its voltages. */
  readonly equipped: Pick<BoardResult, 'phases'>;
  /** Where the CT reads, with everything in: its line currents. */
  readonly atCt: Pick<BoardResult, 'phases'>;
  readonly frequencyHz: number;
  /**
   * The capacitors' capacitance as a share of nominal (a tolerance end): `equipped` and `atCt` are solved with
   * it, each step's current is scaled by it, and `solveAtCt` must apply it to the equipment it is given. @defaultValue 1
   */
  readonly capacitanceFactor?: number;
  /** Solves the board with the equipment given and reads the CT's point. */
  readonly solveAtCt: (equipment: readonly EquipmentGroup[]) => Pick<BoardResult, 'phases'>;
}

/**
 * The state of the switched steps with the largest line current where the CT reads, other than every
 * step in (the design state, known) and, without a fixed part, every step out (the board as it was):
 * null where there is no such state (no switched step, or one step and no fixed part).
 */
export function worstStepState(input: StepStateInputs): WorstStepState | null {
  const switched = input.steps.filter((s) => s.output !== null);
  const fixedPart = {
    reactors: input.equipment.some((g) => g.branches.some((b) => b.susceptanceS < 0)),
    capacitors: input.steps.some((s) => s.output === null),
  };
  const hasFixed = fixedPart.reactors || fixedPart.capacitors;
  if (!switched.length || (switched.length === 1 && !hasFixed)) return null;
  const omega = 2 * Math.PI * input.frequencyHz;
  const phases = input.atCt.phases.map((p) => p.phase);
  const voltages = new Map<PhaseId, ComplexValue>(input.equipped.phases.map((p) => [p.phase, p.voltage]));
  const factor = input.capacitanceFactor ?? 1;
  const stepCurrents = switched.map((s) => stepLineCurrents(s, phases, voltages, omega).map((i) => ({ re: i.re * factor, im: i.im * factor })));
  const base = input.atCt.phases.map((p, k) => stepCurrents.reduce((c, d) => sub(c, d[k]!), p.current as ComplexValue));
  const worst = largestSwitching(base, stepCurrents);
  // Every step in is the design state; every step out without a fixed part is the board as it was.
  if (worst.stepsIn.every(Boolean) || (!hasFixed && !worst.stepsIn.some(Boolean))) return null;
  const largest = solvedLargest(() => input.solveAtCt(equipmentWithStepsOut(input.equipment, switched, worst.stepsIn, omega)));
  return {
    phase: largest?.phase ?? phases[worst.line]!,
    currentA: largest?.currentA ?? worst.currentA,
    estimateA: worst.currentA,
    solved: largest !== null,
    outputsIn: switched.filter((_, k) => worst.stepsIn[k]).map((s) => s.output!),
    outputsOut: switched.filter((_, k) => !worst.stepsIn[k]).map((s) => s.output!),
    fixedPart,
  };
}

/**
 * The largest line current of a state solved, or null where it has no solution: the CT's check then
 * takes the superposition's figure rather than end a study whose design state solved.
 */
function solvedLargest(solve: () => Pick<BoardResult, 'phases'>): { phase: PhaseId; currentA: number } | null {
  try {
    const largest = solve().phases.reduce((a, b) => (b.current.magnitude > a.current.magnitude ? b : a));
    return { phase: largest.phase, currentA: largest.current.magnitude };
  } catch (error) {
    if (error instanceof NumericalError) return null;
    throw error;
  }
}
