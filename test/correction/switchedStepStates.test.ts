/**
 * The controller's CT must carry the largest line current in any state the switched steps can sit in,
 * not only before the equipment and with every step in: a fixed reactor with the capacitor steps out,
 * or trim steps on different line pairs switched apart, load a line past both ends. Every board here is
 * invented, on an ideal 400 V source with constant-impedance loads, so the currents are worked by hand
 * from the loads at nominal voltage (V_AN = 230.94 V ∠0°, V_AB = 400 V ∠30°, V_BC = 400 V ∠−90°).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyseSolution, correctBoard, NumericalError, normaliseBoard, parseBoard, readBoardText, solveNetwork, type EquipmentGroup } from '@trivar/core';
import type { BankStep, ControllerSettings } from '../../packages/core/src/correction/correctionResult.js';
import { controllerWarnings, ctBasisOf, standardCtPrimaryA } from '../../packages/core/src/correction/controllerSettings.js';
import { addCorrectionEquipment } from '../../packages/core/src/correction/equipment.js';
import { largestSwitching, worstStepState } from '../../packages/core/src/correction/switchedStepStates.js';
import { expectClose } from '../support/tolerance.js';

/** Within `abs` of the figure: 1e-4 A against an exact hand figure, half the last printed digit against a printed one. */
const near = (actual: number, expected: number, abs: number) => expectClose(actual, expected, { rel: 0, abs });
const boardOf = (lines: readonly string[]) => normaliseBoard(parseBoard(readBoardText(lines.join('\n'))));
const OMEGA = 2 * Math.PI * 50;
const VLN = 400 / Math.sqrt(3);

/** A switched (or, output null, fixed) capacitor step of `kvar` at nominal voltage on one branch. */
function step(output: number | null, branch: string, kvar: number, v: number): BankStep {
  const uF = ((kvar * 1000) / (OMEGA * v * v)) * 1e6;
  return { output, part: output === null ? 'fixed' : 'trim', kind: 'single-phase', branches: [branch], units: 1, nameplateKvar: kvar, kvarAtNominalV: kvar, deliveredKvar: kvar, capacitancePerBranchUF: uF, detuningFactor: 0, responseThresholdA: 1, thresholdBasis: 'single-phase', onAtDesign: true } as unknown as BankStep;
}

/** One group per branch, at `kvar` (+ capacitive, − inductive), fixed part `fixedKvar`. */
function branchGroup(branch: string, kvar: number, fixedKvar: number, v: number): EquipmentGroup {
  const [from, to] = branch.split('-') as ['A' | 'B' | 'C', 'A' | 'B' | 'C' | 'N'];
  return { name: `bank ${branch}`, connection: `${from}-${to}`, branches: [{ branch, from, to, vNominal: v, susceptanceS: (kvar * 1000) / (v * v), fixedSusceptanceS: (fixedKvar * 1000) / (v * v) }] } as EquipmentGroup;
}

function worstOn(board: ReturnType<typeof boardOf>, steps: BankStep[], equipment: EquipmentGroup[]) {
  const solveWith = (eq: readonly EquipmentGroup[]) => analyseSolution(solveNetwork(addCorrectionEquipment(board, eq)));
  const after = solveWith(equipment);
  const before = analyseSolution(solveNetwork(board));
  const worst = worstStepState({ steps, equipment, equipped: after, atCt: after, frequencyHz: 50, solveAtCt: solveWith });
  const largest = (r: typeof after) => Math.max(...r.phases.map((p) => p.current.magnitude));
  return { worst, before: largest(before), after: largest(after) };
}

describe('the worst state of the switched steps where the CT reads', () => {
  it('a fixed reactor with its capacitor step out: 54.49 A on B, above 50.0 A both before and with the step in', () => {
    // Kiln shed: an 11.547 kW heater (50 A × 230.94 V) B-N (50.0 A ∠−120°); a 5 kvar reactor B-N stays in, a 5 kvar capacitor
    // step B-N switches. Step in: they cancel, 50.0 A. Step out: the reactor's 5000/230.94 = 21.65 A lags
    // V_BN by 90°, so |I_B| = √(50² + 21.65²) = √2968.75 = 54.49 A.
    const board = boardOf([
      'name: Kiln shed',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'loads: [ { name: Kiln heater, connection: B-N, kW: 11.5470054, pf: 1, model: constant-impedance } ]',
    ]);
    // The reactor and the capacitor as two groups on B-N: a net zero in one branch would say nothing.
    const split = [branchGroup('B-N', -5, -5, VLN), branchGroup('B-N', 5, 0, VLN)];
    const { worst, before, after } = worstOn(board, [step(1, 'B-N', 5, VLN)], split);
    near(before, 50.0, 0.005);
    near(after, 50.0, 0.005);
    expect(worst).not.toBeNull();
    expect(worst!.phase).toBe('B');
    near(worst!.currentA, Math.sqrt(50 ** 2 + (5000 / VLN) ** 2), 1e-4);
    near(worst!.currentA, 54.49, 0.005);
    expect(worst!.solved).toBe(true);
    expect(worst!.outputsIn).toEqual([]);
    expect(worst!.outputsOut).toEqual([1]);
    expect(worst!.fixedPart).toEqual({ reactors: true, capacitors: false });
  });

  it('trim steps on two line pairs: output 1 in and output 2 out gives 66.14 A on B, above 64.95 A with both in and 50.0 A before', () => {
    // Plating line: an 11.547 kW heater (50 A × 230.94 V) B-N (50.0 A ∠−120° = −25 − j43.30). Step 1: 10 kvar A-B, 25 A ∠120°,
    // takes −25 ∠120° = 12.5 − j21.65 from B. Step 2: 5 kvar B-C, 12.5 A ∠0°, adds 12.5 to B.
    // Both in: B = 0 − j64.95, 64.95 A. Step 1 alone: −12.5 − j64.95, √4375 = 66.14 A. Step 2 alone: 42.7 A.
    const board = boardOf([
      'name: Plating line',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'loads: [ { name: Rinse tank heater, connection: B-N, kW: 11.5470054, pf: 1, model: constant-impedance } ]',
    ]);
    const equipment = [branchGroup('A-B', 10, 0, 400), branchGroup('B-C', 5, 0, 400)];
    const { worst, before, after } = worstOn(board, [step(1, 'A-B', 10, 400), step(2, 'B-C', 5, 400)], equipment);
    near(before, 50.0, 0.005);
    near(after, 37.5 * Math.sqrt(3), 1e-4);
    expect(worst!.phase).toBe('B');
    near(worst!.currentA, Math.sqrt(4375), 1e-4);
    near(worst!.currentA, 66.14, 0.005);
    expect(worst!.outputsIn).toEqual([1]);
    expect(worst!.outputsOut).toEqual([2]);
    expect(worst!.fixedPart).toEqual({ reactors: false, capacitors: false });
  });

  it('a state that does not solve: the superposition gives the figure (exact here), said as not solved', () => {
    const board = boardOf([
      'name: Kiln shed',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'loads: [ { name: Kiln heater, connection: B-N, kW: 11.5470054, pf: 1, model: constant-impedance } ]',
    ]);
    const equipment = [branchGroup('B-N', -5, -5, VLN), branchGroup('B-N', 5, 0, VLN)];
    const after = analyseSolution(solveNetwork(addCorrectionEquipment(board, equipment)));
    const refuse = (): never => {
      throw new NumericalError('singular', 'no solution in this state');
    };
    const worst = worstStepState({ steps: [step(1, 'B-N', 5, VLN)], equipment, equipped: after, atCt: after, frequencyHz: 50, solveAtCt: refuse });
    expect(worst!.solved).toBe(false);
    expect(worst!.phase).toBe('B');
    near(worst!.currentA, Math.sqrt(50 ** 2 + (5000 / VLN) ** 2), 1e-4);
  });

  it('one step and no fixed part: its two states are the ends, nothing to add', () => {
    const board = boardOf([
      'name: Pump house',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'loads: [ { name: Borehole pump, connection: A-B, kW: 8, pf: 0.8, model: constant-impedance } ]',
    ]);
    const { worst } = worstOn(board, [step(1, 'A-B', 4, 400)], [branchGroup('A-B', 4, 0, 400)]);
    expect(worst).toBeNull();
  });
});

describe('the largest line current over every state of the steps: the sector scan against all 2ⁿ states', () => {
  // A small deterministic generator: the same cases every run.
  let seed = 12345;
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * 2 - 1;
  const c = () => ({ re: 100 * rand(), im: 100 * rand() });
  it('agrees on 300 random boards of 1 to 8 steps and 1 to 3 lines', () => {
    for (let trial = 0; trial < 300; trial++) {
      const lines = 1 + (trial % 3);
      const n = 1 + (trial % 8);
      const base = Array.from({ length: lines }, c);
      const steps = Array.from({ length: n }, () => Array.from({ length: lines }, () => (rand() > 0.7 ? { re: 0, im: 0 } : c())));
      let brute = 0;
      for (let mask = 0; mask < 1 << n; mask++)
        for (let k = 0; k < lines; k++) {
          let re = base[k]!.re;
          let im = base[k]!.im;
          for (let s = 0; s < n; s++) if (mask & (1 << s)) (re += steps[s]![k]!.re), (im += steps[s]![k]!.im);
          brute = Math.max(brute, Math.hypot(re, im));
        }
      const found = largestSwitching(base, steps);
      near(found.currentA, brute, 1e-9);
      // The state it names gives that figure.
      const z = steps.reduce((sum, d, s) => (found.stepsIn[s] ? { re: sum.re + d[found.line]!.re, im: sum.im + d[found.line]!.im } : sum), base[found.line]!);
      near(Math.hypot(z.re, z.im), found.currentA, 1e-9);
    }
  });
});

describe('corner bakery: the compensator keeps its reactors in while its capacitor trim steps switch', () => {
  const bakery = () =>
    correctBoard(normaliseBoard(parseBoard(readBoardText(readFileSync('examples/corner-bakery.yaml', 'utf8')))), { arrangement: 'balancing-compensator', controller: { ctPrimaryA: 95 } });
  it('the CT is checked against 95.1 A on B with the reactors in and every step out, not 90.4 A before', () => {
    const r = bakery();
    const basis = r.selection!.controller!.ctBasis;
    near(basis.largestLineCurrentA!.before, 90.41, 0.005);
    near(basis.largestLineCurrentA!.after, 65.31, 0.005);
    expect(basis.sizedOn).toBe('step-state');
    // The board re-solved with the two reactors alone (C-A 17.73 kvar, B-N 4.53 kvar) carries 95.14 A on B.
    near(basis.currentA, 95.14, 0.005);
    expect(basis.stepState!.phase).toBe('B');
    // Reactors alone draw the same at either tolerance end (no capacitor in): the end is named only for the every-step-in figure.
    expect(basis.capacitance!.stepStateA!.low).toBe(basis.capacitance!.stepStateA!.high);
    expect(basis.currentWords).toBe(
      `95.1 A on line B with the reactors in and every switched step out, the largest line current there in any state of the steps (90.4 A before correction, ${basis.capacitance!.afterA.high.toFixed(1)} A with every step in at +10 % capacitance)`,
    );
    const w = r.warnings.find((x) => x.code === 'ct-below-line-current')!;
    expect(w.threshold).toBe(basis.currentA);
    expect(w.message).toContain('the CT primary (95 A) is below the largest line current (95.1 A) on line B with the reactors in and every switched step out');
  });
});

describe('the CT at the capacitance tolerance end that draws more where it reads', () => {
  // Glaze kiln: an 11.547 kW heater B-N (50.0 A ∠−120°); a 10 kvar reactor B-N and a 6 kvar capacitor B-N stay in,
  // a 4 kvar capacitor step B-N switches. By hand (ideal source, V_BN = 230.94 V), with the capacitance at k × nominal:
  // step in, the net is 10 − 10k kvar; step out, 10 − 6k kvar, |I_B| = √(50² + (net/230.94 V)²).
  // Step out: k = 0.95 → 4.3 kvar, 18.62 A, 53.35 A; k = 1 → 52.92 A; k = 1.10 → 3.4 kvar, 14.72 A, 52.12 A.
  // Step in: k = 0.95 → 50.05 A; k = 1.10 → 50.19 A. So the −5 % end, with the step out, is the CT's figure.
  const board = boardOf([
    'name: Glaze kiln room',
    'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
    'loads: [ { name: Glaze kiln, connection: B-N, kW: 11.5470054, pf: 1, model: constant-impedance } ]',
  ]);
  const equipment = [branchGroup('B-N', -10, -10, VLN), branchGroup('B-N', 10, 6, VLN)];
  const steps = [step(null, 'B-N', 6, VLN), step(1, 'B-N', 4, VLN)];
  const hand = (netKvar: number) => Math.hypot(50, (netKvar * 1000) / VLN);
  const endReading = (k: number) => {
    const solveWith = (eq: readonly EquipmentGroup[]) => analyseSolution(solveNetwork(addCorrectionEquipment(board, eq, { capacitanceFactor: k })));
    const all = solveWith(equipment);
    const worst = worstStepState({ steps, equipment, equipped: all, atCt: all, frequencyHz: 50, capacitanceFactor: k, solveAtCt: solveWith });
    return { capacitanceFactor: k, afterA: Math.max(...all.phases.map((p) => p.current.magnitude)), stepState: worst && { ...worst, lineLabel: worst.phase } };
  };

  it('each end re-solved: the step out draws 53.35 A at −5 % and 52.12 A at +10 %; every step in 50.05 A and 50.19 A', () => {
    const low = endReading(0.95);
    const high = endReading(1.1);
    near(low.afterA, hand(10 - 9.5), 1e-4);
    near(high.afterA, hand(10 - 11), 1e-4);
    near(low.stepState!.currentA, hand(10 - 5.7), 1e-4);
    near(low.stepState!.currentA, 53.35, 0.005);
    near(high.stepState!.currentA, hand(10 - 6.6), 1e-4);
    near(high.stepState!.currentA, 52.12, 0.005);
    expect(low.stepState!.outputsOut).toEqual([1]);
    // The superposition that chose the state scales each step's current by the same factor: exact on this linear board.
    near(low.stepState!.estimateA, low.stepState!.currentA, 1e-6);
  });

  it('the CT basis takes the −5 % end (53.35 A, not 52.92 A at nominal nor 52.12 A at +10 %), and says so', () => {
    const lines = [{ currentA: { before: 50, after: hand(0), change: hand(0) - 50 } }];
    const basis = ctBasisOf({ place: 'board', point: 'Glaze kiln room', lines, afterFrom: 'as-built', toleranceEnds: { low: endReading(0.95), high: endReading(1.1) } });
    expect(basis.sizedOn).toBe('step-state');
    expect(basis.capacitance).toMatchObject({ end: 'low', capacitanceFactor: 0.95 });
    near(basis.currentA, 53.35, 0.005);
    near(basis.capacitance!.stepStateA!.low, hand(4.3), 1e-4);
    near(basis.capacitance!.stepStateA!.high, hand(3.4), 1e-4);
    expect(basis.currentWords).toBe(
      '53.4 A on line B with the reactors and the fixed capacitors in and every switched step out, with the capacitors at the −5 % end of their tolerance, the end that draws more there, the largest line current there in any state of the steps (50.0 A before correction, 50.0 A with every step in at −5 % capacitance)',
    );
    // 1.25 × 53.35 = 66.7 A → 75/5; at nominal, 1.25 × 52.92 = 66.2 A → 75/5 too: the check, not the choice, moves here.
    expect(standardCtPrimaryA(1.25 * basis.currentA)).toBe(75);
    const given = controllerWarnings({ ...({} as ControllerSettings), ctChosen: false, ctPrimaryA: 53, ctBasis: basis, responseSettingA: 1 });
    expect(given.map((w) => w.code)).toEqual(['ct-below-line-current']);
    expect(given[0]!.message).toContain('(53.4 A) on line B with the reactors and the fixed capacitors in and every switched step out at the incomer of Glaze kiln room, the board the equipment is on, with the capacitors at the −5 % end of their tolerance');
  });
});
