/**
 * Symmetry laws: relabelling the phases of a board on a balanced source only
 * rotates its solution; balanced boards carry no neutral, negative- or
 * zero-sequence current; the reported symmetrical components are Fortescue's.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  analyseSolution,
  normaliseBoard,
  parseBoard,
  solveNetwork,
  type BoardResult,
  type BoardSpec,
  type ComplexValue,
  type ConnectionSpec,
  type NetworkSolution,
} from '@trivar/core';
import { C0, cAbs, cAdd, cMul, cPolarDeg, cScale } from '../support/complexMath.js';
import { expectClose, expectComplexClose } from '../support/tolerance.js';
import { balancedBoardSpecArb, boardSpecArb } from './arbitraries/boardSpec.js';
import { LAW_REL, largestCurrent } from './laws.js';

/**
 * Solved tighter than the default so that two boards that should agree are not
 * told apart by where each iteration happened to stop (1e-10 of nominal).
 */
function solveTight(spec: BoardSpec): { solution: NetworkSolution; result: BoardResult } {
  const solution = solveNetwork(normaliseBoard(spec), { tolerance: 1e-13, maxIterations: 1000 });
  return { solution, result: analyseSolution(solution) };
}

/** Line-to-line pairs are written one way only; the same pair the other way round is the same load. */
const CANONICAL_PAIR: Readonly<Record<string, ConnectionSpec>> = { 'B-A': 'A-B', 'C-B': 'B-C', 'A-C': 'C-A' };

/** Relabels one connection with `map` applied to every phase letter. */
function relabel(connection: ConnectionSpec, map: Readonly<Record<string, string>>): ConnectionSpec {
  if (connection === 'ABC-star' || connection === 'ABC-delta') return connection;
  const renamed = connection.replace(/[ABC]/g, (p) => map[p] ?? p);
  return CANONICAL_PAIR[renamed] ?? (renamed as ConnectionSpec);
}

/** The board with its loads relabelled; validated, so a relabelling slip cannot pass unnoticed. */
function relabelBoard(spec: BoardSpec, map: Readonly<Record<string, string>>): BoardSpec {
  return parseBoard({ ...spec, loads: spec.loads.map((l) => ({ ...l, connection: relabel(l.connection, map) })) });
}

/**
 * Compares a solved board with a reference whose every phasor is multiplied by
 * `turn`, with phase k of the reference read as phase `phaseMap[k]` here and
 * branch j of a three-branch load as branch `branchMap[j]`.
 */
function expectTurnedCopy(
  actual: BoardResult,
  reference: BoardResult,
  turn: ComplexValue,
  phaseMap: readonly number[],
  branchMap: (branches: number, j: number) => number,
  scales: { v: number; i: number },
): void {
  const vTol = { rel: LAW_REL, abs: LAW_REL * scales.v };
  const iTol = { rel: LAW_REL, abs: LAW_REL * scales.i };
  const turned = (z: ComplexValue) => cMul(z, turn);
  reference.phases.forEach((ref, k) => {
    const got = actual.phases[phaseMap[k]!]!;
    expectComplexClose(got.voltage, turned(ref.voltage), vTol, `phase ${got.phase} voltage (was phase ${ref.phase})`);
    expectComplexClose(got.current, turned(ref.current), iTol, `phase ${got.phase} current (was phase ${ref.phase})`);
  });
  if (reference.neutral) {
    expectComplexClose(actual.neutral!.current, turned(reference.neutral.current), iTol, 'neutral current');
    if (reference.neutral.barVoltage) expectComplexClose(actual.neutral!.barVoltage!, turned(reference.neutral.barVoltage), vTol, 'neutral bar voltage');
  }
  reference.loads.forEach((ref, li) => {
    const got = actual.loads[li]!;
    ref.branches.forEach((b, j) => {
      const gb = got.branches[branchMap(ref.branches.length, j)]!;
      expectComplexClose(gb.voltage, turned(b.voltage), vTol, `load ${ref.name} branch ${j} voltage`);
      expectComplexClose(gb.current, turned(b.current), iTol, `load ${ref.name} branch ${j} current`);
    });
    if (ref.starPointShift) expectComplexClose(got.starPointShift!, turned(ref.starPointShift), vTol, `load ${ref.name} star point`);
  });
  // Scalars do not care about labels.
  const pTol = { rel: LAW_REL, abs: (LAW_REL * scales.v * scales.i) / 1000 };
  expectClose(actual.totals.kW, reference.totals.kW, pTol, 'total kW');
  expectClose(actual.totals.kvar, reference.totals.kvar, pTol, 'total kvar');
  expectClose(actual.losses.totalKW, reference.losses.totalKW, pTol, 'loss kW');
}

describe('phase relabelling on a balanced source', () => {
  it('A→B→C→A rotates every phasor by the angle from E_A to E_B (−120° ABC, +120° ACB)', () => {
    const arb = boardSpecArb({ systems: ['three-phase-4wire', 'three-phase-3wire'], emf: 'balanced' });
    fc.assert(
      fc.property(arb, (spec) => {
        const original = solveTight(spec);
        const rotated = solveTight(relabelBoard(spec, { A: 'B', B: 'C', C: 'A' }));
        const step = spec.supply.sequence === 'ACB' ? 120 : -120;
        expectTurnedCopy(rotated.result, original.result, cPolarDeg(1, step), [1, 2, 0], (n, j) => (n === 3 ? (j + 1) % 3 : j), {
          v: spec.supply.voltage.lineToNeutral ?? spec.supply.voltage.lineToLine! / Math.sqrt(3),
          i: largestCurrent(original.solution),
        });
        // Same physics, same unbalance, whatever the labels.
        const [u, w] = [rotated.result.unbalance!, original.result.unbalance!];
        expectClose(u.currentNegativePercent, w.currentNegativePercent, { rel: 1e-7, abs: 1e-9 }, 'current unbalance %');
        expectClose(u.voltageFactorPercent, w.voltageFactorPercent, { rel: 1e-7, abs: 1e-9 }, 'voltage unbalance %');
      }),
    );
  });

  it('on a split-phase board, swapping A and B negates every phasor (E_B = −E_A)', () => {
    const arb = boardSpecArb({ systems: ['split-phase'], emf: 'balanced' });
    fc.assert(
      fc.property(arb, (spec) => {
        const original = solveTight(spec);
        const swapped = solveTight(relabelBoard(spec, { A: 'B', B: 'A' }));
        // An A-B load stays A-B and sees V'_A − V'_B = −V_B + V_A, the same as
        // before, so its current is unchanged; every other phasor is negated.
        const plain = original.result.loads.map((l) => l.connection === 'A-B');
        const v = original.solution.board.nominalLineToNeutralV;
        const i = largestCurrent(original.solution);
        expectTurnedCopy(
          { ...swapped.result, loads: swapped.result.loads.filter((_, k) => !plain[k]) },
          { ...original.result, loads: original.result.loads.filter((_, k) => !plain[k]) },
          { re: -1, im: 0 },
          [1, 0],
          (_, j) => j,
          { v, i },
        );
        original.result.loads.forEach((l, k) => {
          if (plain[k]) expectComplexClose(swapped.result.loads[k]!.branches[0]!.current, l.branches[0]!.current, { rel: LAW_REL, abs: LAW_REL * i }, `A-B load ${l.name}`);
        });
      }),
    );
  });
});

describe('balanced boards', () => {
  it('carry no neutral, negative- or zero-sequence current', () => {
    fc.assert(
      fc.property(balancedBoardSpecArb(), (spec) => {
        const { solution, result } = solveTight(spec);
        const currents = result.phases.map((p) => p.current);
        if (result.sequences) {
          const { zero, positive, negative } = result.sequences.current;
          // Relative to I1, floored at the largest current on the board so a
          // generator nearly cancelling a load cannot shrink the yardstick to noise.
          const scale = Math.max(positive.magnitude, 1e-3 * largestCurrent(solution));
          expect(negative.magnitude / scale).toBeLessThan(LAW_REL);
          expect(zero.magnitude / scale).toBeLessThan(LAW_REL);
          const v = result.sequences.voltage;
          expect(v.negative.magnitude / v.positive.magnitude).toBeLessThan(LAW_REL);
          expect(v.zero.magnitude / v.positive.magnitude).toBeLessThan(LAW_REL);
          if (result.neutral) expect(result.neutral.current.magnitude / scale).toBeLessThan(LAW_REL);
          for (const i of currents) expectClose(cAbs(i), positive.magnitude, { rel: LAW_REL, abs: LAW_REL * scale }, 'line current magnitude');
        } else {
          // Split-phase: the two halves carry equal and opposite currents.
          const scale = Math.max(cAbs(currents[0]!), 1e-3 * largestCurrent(solution));
          expect(result.neutral!.current.magnitude / scale).toBeLessThan(LAW_REL);
          expectComplexClose(currents[1]!, cScale(currents[0]!, -1), { rel: LAW_REL, abs: LAW_REL * scale }, 'I_B = −I_A');
        }
      }),
    );
  });
});

describe('symmetrical components', () => {
  it("are Fortescue's transform of the phase quantities, in the supply's own sequence", () => {
    const arb = boardSpecArb({ systems: ['three-phase-4wire', 'three-phase-3wire'] });
    fc.assert(
      fc.property(arb, (spec) => {
        const { solution, result } = solveTight(spec);
        const a = cPolarDeg(1, 120);
        const a2 = cPolarDeg(1, -120);
        // For ACB the operator roles swap so "positive" is the sequence the supply runs in.
        const [ab, ac] = result.board.sequence === 'ABC' ? [a, a2] : [a2, a];
        const tol = { rel: 1e-12, abs: 1e-12 * largestCurrent(solution) };
        const [ia, ib, ic] = result.phases.map((p): ComplexValue => p.current) as [ComplexValue, ComplexValue, ComplexValue];
        const seq = (x: ComplexValue, y: ComplexValue, z: ComplexValue) => cScale(cAdd(cAdd(x, y), z), 1 / 3);
        const i0 = seq(ia, ib, ic);
        const i1 = seq(ia, cMul(ab, ib), cMul(ac, ic));
        const i2 = seq(ia, cMul(ac, ib), cMul(ab, ic));
        const got = result.sequences!.current;
        expectComplexClose(got.zero, i0, tol, 'I0');
        expectComplexClose(got.positive, i1, tol, 'I1');
        expectComplexClose(got.negative, i2, tol, 'I2');
        // ...and they rebuild phase A; I_N is three times I0 on a 4-wire board.
        expectComplexClose(cAdd(cAdd(got.zero, got.positive), got.negative), ia, tol, 'I0 + I1 + I2 = Ia');
        if (result.neutral) expectComplexClose(result.neutral.current, cScale(i0, 3), { rel: LAW_REL, abs: LAW_REL * largestCurrent(solution) }, 'I_N = 3·I0');
        else expectComplexClose(i0, C0, { rel: 0, abs: LAW_REL * largestCurrent(solution) }, 'no I0 without a neutral');
        // A positive-sequence current at round-off (loads that cancel, such as an export and a draw of the same kW)
        // is read as none, and so is the ratio: a ratio of two round-offs (1e17 %) is not data.
        const ratio = cAbs(i1) <= tol.abs ? 0 : (100 * cAbs(i2)) / cAbs(i1);
        expectClose(result.unbalance!.currentNegativePercent, ratio, { rel: 1e-9, abs: 1e-9 }, '|I2|/|I1| %');
      }),
    );
  });
});
