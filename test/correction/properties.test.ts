/**
 * Laws of the correction study over random lagging boards (fast-check):
 * - a capacitor bank never has negative capacitance, and never makes a line
 *   lead that did not lead before (the default never-leading target);
 * - whenever the study says the target is met, every constrained power factor
 *   of the re-solved board meets it;
 * - the corrected board in the report re-solves to exactly the reported figures;
 * - on an ideal source with line-to-neutral loads a star bank per phase is
 *   P_x·(tan φ_x − tan φ_target) (PFC identity, methods notes §7);
 * - a capacitor-only compensator is never worse than no compensator.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  boardPowerFactor,
  checkTarget,
  correctBoard,
  CORRECTION_DEFAULTS,
  sizeBalancingCompensator,
  sizeStarBank,
  solveBoardModel,
  type Board,
  type CompensatorSizing,
  type CorrectionReport,
  type TargetDefinition,
} from '@trivar/core';
import { laggingBoardArb, runs } from './support/arbitraries.js';
import { makeBoard } from './support/boards.js';
import { expectPlainData } from './support/plainData.js';

/** Round-off allowed on a bound, of the line's kVA: the re-solve lands a figure on its bound to about 1e-9 (a line held at unity was seen at −1.3e-9·S). */
const SLACK = 1e-8;
const targetArb = fc.record({
  pf: fc.double({ min: 0.85, max: 0.99, noNaN: true }),
  definition: fc.constantFrom<TargetDefinition>('per-line', 'effective', 'vector', 'positive-sequence'),
});

/** The laws every report must satisfy, checked on an independent re-solve. */
function assertReportLaws(report: CorrectionReport): void {
  const v = report.verification;
  const resolved = solveBoardModel(v.board);
  expect(resolved).toEqual(v.after);
  expectPlainData(report);
  for (const b of v.branches) if (b.element !== 'reactor') expect(b.susceptanceS).toBeGreaterThanOrEqual(0);
  // Reported branch outputs are what the re-solved board's added loads draw (capacitive = negative Q there).
  const added = resolved.loads.filter((l) => l.origin === 'added');
  const drawn = added.reduce((s, l) => s + l.kvar, 0);
  const reported = v.branches.reduce((s, b) => s + b.kvarAtAppliedV, 0);
  expect(Math.abs(drawn + reported)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(reported)));
  // No line that lagged before leads after.
  resolved.phases.forEach((p, k) => {
    const before = v.before.phases[k]!;
    if (before.kvar >= 0 && p.kVA > 1e-6 * v.before.totals.kVA) expect(p.kvar).toBeGreaterThanOrEqual(-SLACK * p.kVA);
  });
  if (report.status === 'meets-target' || report.status === 'meets-target-at-nominal-capacitance') {
    const t = report.target;
    if (t.definition === 'per-line')
      resolved.phases.forEach((p, k) => {
        if (p.kVA > 1e-6 * v.before.totals.kVA) expect(p.pf).toBeGreaterThanOrEqual(t.lines[k]!.minPf - SLACK);
      });
    else expect(boardPowerFactor(resolved, t.definition)!).toBeGreaterThanOrEqual(t.pf - SLACK);
    expect(checkTarget(resolved, t, v.before).met).toBe(true);
  }
}

describe('correction laws over random lagging boards', () => {
  it('star bank on a 4-wire board with line-to-neutral loads always meets a per-line target', () => {
    fc.assert(
      fc.property(laggingBoardArb({ systems: ['three-phase-4wire'], lineToNeutralOnly: true }), fc.double({ min: 0.85, max: 0.99, noNaN: true }), (board, pf) => {
        const report = correctBoard(board, { arrangement: 'star-bank', target: { pf }, lightLoad: { fraction: 0.3 } });
        expect(report.sizing.status).not.toBe('infeasible');
        // Hardware may be too coarse for a tiny board; then it says so rather than making a line lead.
        // (nothing-to-build: not even the smallest unit or step fits the need; it says why.)
        expect(['meets-target', 'meets-target-at-nominal-capacitance', 'already-meets-target', 'misses-target-with-available-units', 'no-suitable-units', 'nothing-to-build']).toContain(report.status);
        if (report.status === 'nothing-to-build') expect(report.nothingToBuild!.why).toMatch(/needs \d+\.\d+ kvar/);
        if (report.status === 'no-suitable-units') expect(report.reasons.join(' ')).toMatch(/no unit in the/);
        if (report.status === 'misses-target-with-available-units') expect(report.verification.check.leadingLines).toEqual([]);
        assertReportLaws(report);
      }),
      { numRuns: runs(30) },
    );
  });

  it('star and delta banks, any target definition, on 3- and 4-wire boards: the laws hold whatever the status', () => {
    fc.assert(
      fc.property(laggingBoardArb(), targetArb, fc.constantFrom('star-bank' as const, 'delta-bank' as const), (board, target, arrangement) => {
        const report = correctBoard(board, { arrangement, target });
        assertReportLaws(report);
        if (report.status === 'infeasible') expect(report.reasons.length).toBeGreaterThan(0);
      }),
      { numRuns: runs(40) },
    );
  });

  it('ideal source, line-to-neutral loads: the star bank is P_x·(tan φ_x − tan φ_target) per phase (PFC identity)', () => {
    fc.assert(
      fc.property(
        laggingBoardArb({ systems: ['three-phase-4wire'], source: 'ideal', lineToNeutralOnly: true }),
        fc.double({ min: 0.85, max: 0.99, noNaN: true }),
        (board, pf) => {
          const before = solveBoardModel(board);
          const sizing = sizeStarBank(board, { target: { pf } });
          const tanT = Math.sqrt(1 - pf * pf) / pf;
          sizing.branches.forEach((b, k) => {
            const p = before.phases[k]!;
            const expected = Math.max(0, p.kvar - p.kW * tanT);
            expect(Math.abs(b.kvarAtNominalV - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, p.kVA));
          });
        },
      ),
      { numRuns: runs(40) },
    );
  });

  it('capacitor-only compensator: no negative capacitance, and never worse than nothing', () => {
    fc.assert(
      fc.property(laggingBoardArb({ source: 'ideal' }), fc.double({ min: 0.9, max: 1, noNaN: true }), (board, pf) => {
        const sizing = sizeBalancingCompensator(board, { target: { pf } });
        for (const b of sizing.capacitorOnly.branches) expect(b.susceptanceS).toBeGreaterThanOrEqual(0);
        // The ideal solution is exact unless a negligible branch was left out (negligibleBranches.ts: below 1 % of
        // the compensator, and no target it met is missed without it); then its |I2| is what the sizing says
        // leaving the last one out gave.
        const leftOut = sizing.smallBranches.filter((b) => b.leftOut);
        if (leftOut.length === 0) expect(sizing.ideal.residual.negativeSequenceCurrentPercent).toBeLessThan(1e-6);
        else {
          expect(sizing.ideal.residual.negativeSequenceCurrentPercent).toBeCloseTo(leftOut.at(-1)!.effect.without.negativeSequenceCurrentPercent, 9);
          for (const b of leftOut) expect(b.effect.missedWithout).toEqual([]);
        }
        // The objective with no compensator is that of the uncorrected board; the optimum can only be lower.
        expect(sizing.capacitorOnly.objective).toBeLessThanOrEqual(objectiveOfNothing(board, sizing) + 1e-9);
      }),
      { numRuns: runs(12) },
    );
  });

  it('capacitor-only compensator on fewer branches: fewer built, no negative capacitance, every target still met, balance within the allowance', () => {
    // Nearly balanced boards (a three-phase drive and a few small circuits), where the programme's
    // spread can mostly be trimmed (87 of 100 sampled, seed 3); on the lagging boards above, 4 of 100.
    const nearlyBalanced = fc
      .record({
        main: fc.record({ connection: fc.constantFrom('ABC-delta', 'ABC-star'), kW: fc.double({ min: 10, max: 60, noNaN: true }), pf: fc.double({ min: 0.7, max: 0.9, noNaN: true }) }),
        small: fc.array(fc.record({ connection: fc.constantFrom('A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A'), kW: fc.double({ min: 0.1, max: 2, noNaN: true }), pf: fc.double({ min: 0.7, max: 1, noNaN: true }) }), { maxLength: 3 }),
      })
      .map(({ main, small }) => makeBoard('three-phase-4wire', [{ name: 'drive', ...main }, ...small.map((l, i) => ({ name: `circuit ${i}`, ...l }))]));
    let trimmed = 0;
    fc.assert(
      fc.property(nearlyBalanced, fc.double({ min: 0.9, max: 1, noNaN: true }), (board, pf) => {
        const sizing = sizeBalancingCompensator(board, { target: { pf } });
        const fewer = sizing.fewerBranches;
        if (fewer === null) return;
        trimmed++;
        const count = (s: CompensatorSizing['capacitorOnly']) => s.branches.filter((b) => b.element !== 'none').length;
        expect(count(fewer.solution)).toBe(count(sizing.capacitorOnly) - fewer.spared.length);
        for (const b of fewer.solution.branches) expect(b.susceptanceS).toBeGreaterThanOrEqual(0);
        for (const s of fewer.spared) expect(fewer.solution.branches.find((b) => b.branch === s.branch)!.element).toBe('none');
        if (sizing.capacitorOnly.check.met) expect(fewer.solution.check.met).toBe(true);
        const allowance = CORRECTION_DEFAULTS.fewerBranchesAllowancePercent + 1e-9;
        expect(fewer.solution.residual.negativeSequenceCurrentPercent).toBeLessThanOrEqual(sizing.capacitorOnly.residual.negativeSequenceCurrentPercent + allowance);
      }),
      { numRuns: runs(20) },
    );
    expect(trimmed).toBeGreaterThan(0);
  });
});

/** Σ w·r² of the uncorrected board, with the sizing's bases (|I1| and 3·V·|I1| of the uncorrected board). */
function objectiveOfNothing(board: Board, sizing: CompensatorSizing): number {
  const before = solveBoardModel(board);
  const seq = before.sequences!.current;
  const i1 = seq.positive.magnitude;
  const ps = before.powerFactor.positiveSequence!;
  const sBase = (3 * board.nominalLineToNeutralV * i1) / 1000;
  const tanT = Math.sqrt(1 - sizing.target.pf ** 2) / sizing.target.pf;
  const w = sizing.weights;
  return (
    w.negativeSequence * (seq.negative.magnitude / i1) ** 2 +
    (sizing.branchesUsed === 'delta-and-star' ? w.zeroSequence * (seq.zero.magnitude / i1) ** 2 : 0) +
    w.reactive * ((ps.kvar - ps.kW * tanT) / sBase) ** 2
  );
}
