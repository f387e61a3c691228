/**
 * Laws of the bank as built (fast-check over random lagging boards): every
 * unit delivers at least the delivery floor of its nameplate at the nominal voltage across it,
 * the controller outputs are respected (or a warning says they could not be), no
 * switched step is below the minimum nameplate, the steps add up to the per-branch design, and a bank
 * that "meets the target" meets it at both ends of the capacitance tolerance.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { correctBoard } from '@trivar/core';
import { laggingBoardArb, runs } from './support/arbitraries.js';

describe('bank build laws', () => {
  it('floor, outputs, minimum step, tolerance ends', () => {
    fc.assert(
      fc.property(
        laggingBoardArb(),
        fc.constantFrom('star-bank' as const, 'delta-bank' as const),
        fc.constantFrom(6 as const, 8 as const, 12 as const),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.integer({ min: 50, max: 90 }),
        fc.double({ min: 0.85, max: 0.99, noNaN: true }),
        (board, arrangement, outputs, minStepKvar, floor, pf) => {
          const r = correctBoard(board, { arrangement, target: { pf }, controller: { outputs }, bank: { minStepKvar }, deliveryFloorPercent: floor });
          const sel = r.selection;
          if (!sel) return;
          const codes = r.warnings.map((w) => w.code);
          // The floor holds at the nominal voltage across a unit (a floating star's, as solved: its star point moves with it).
          const floating = arrangement === 'star-bank' && !board.hasNeutral;
          for (const s of sel.steps) {
            const lineToNeutral = s.branches.every((b) => b.endsWith('-N'));
            const nominalV = lineToNeutral ? board.nominalLineToNeutralV : (board.nominalLineToLineV ?? board.nominalLineToNeutralV);
            const atNominal = (nominalV / s.unit.ratedV) ** 2 * (board.frequencyHz / s.unit.ratedHz);
            expect(floating ? s.unit.deliveredFraction : atNominal).toBeGreaterThanOrEqual(floor / 100 - 1e-9);
            // No switched step below the least: never built, so no warning can excuse one.
            if (s.output !== null) expect(s.nameplateKvar).toBeGreaterThanOrEqual(minStepKvar - 1e-9);
            expect(s.detuningFactor).toBe(0);
          }
          const switched = sel.steps.filter((s) => s.output !== null);
          if (!codes.includes('outputs-short')) expect(switched.length).toBeLessThanOrEqual(outputs);
          expect(switched.map((s) => s.output)).toEqual(switched.map((_, k) => k + 1));
          // The steps add up to each branch's design capacitance.
          for (const b of sel.selections) {
            const sum = sel.steps.filter((s) => s.branches.includes(b.branch)).reduce((t, s) => t + s.capacitancePerBranchUF, 0);
            expect(Math.abs(sum - b.designCapacitanceUF)).toBeLessThanOrEqual(1e-9 * Math.max(1, b.designCapacitanceUF));
          }
          expect(Math.abs(sel.nameplateKvar - sel.steps.reduce((t, s) => t + s.nameplateKvar, 0))).toBeLessThan(1e-9);
          if (r.status === 'meets-target') {
            expect(r.verification.tolerance.low.check.met).toBe(true);
            expect(r.verification.tolerance.high.check.leadingLines).toEqual([]);
          }
        },
      ),
      { numRuns: runs(30) },
    );
  });
});
