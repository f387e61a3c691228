/**
 * Ratings: on an ideal balanced source every load sits at its nominal voltage
 * (floating star points at the centroid), where every load model draws exactly
 * its rating. So each load's drawn power must be what its rating form says,
 * worked out here from the board file alone:
 *   kW + pf   P = kW, |Q| = |P|·tan(acos pf)     kVA + pf  P = S·pf, |Q| = S·sin(acos pf)
 *   A + pf    S = A·V (V_LN for L-N, V_LL for L-L, √3·V_LL for three-phase)
 *   kW + kvar as written                        ohms      S = n·V²/conj(Z) over its n branches
 * with Q > 0 for lagging (the default) and Q < 0 for leading.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyseSolution, judgedNominalOf, normaliseBoard, solveNetwork, type BoardSpec, type LoadSpec } from '@trivar/core';
import { c, cAbs, cConj, cDiv, cScale } from '../support/complexMath.js';
import { expectClose, expectComplexClose } from '../support/tolerance.js';
import { boardSpecArb, branchShape, currentRatingVoltage, nominalVoltages } from './arbitraries/boardSpec.js';
import { LAW_REL } from './laws.js';

/** Complex power a load's rating means at nominal voltage, VA (load convention). */
function ratedPowerOf(load: LoadSpec, spec: BoardSpec) {
  const { ln, ll } = nominalVoltages(spec);
  const sign = load.sense === 'leading' ? -1 : 1;
  const sin = (pf: number) => Math.sqrt(1 - pf * pf);
  if (load.ohms) {
    const { count, voltage } = branchShape(load.connection, ln, ll);
    return cScale(cDiv(c(voltage * voltage), cConj(c(load.ohms.r, load.ohms.x))), count);
  }
  if (load.kvar !== undefined) return c(load.kW! * 1000, load.kvar * 1000);
  const pf = load.pf!;
  if (load.kW !== undefined) return c(load.kW * 1000, (sign * Math.abs(load.kW * 1000) * sin(pf)) / pf);
  const s = load.kVA !== undefined ? load.kVA * 1000 : load.A! * currentRatingVoltage(load.connection, ln, ll);
  return c(s * pf, sign * s * sin(pf));
}

describe('load ratings on an ideal balanced source', () => {
  it('every load draws what its rating form says, whatever its voltage model', () => {
    fc.assert(
      fc.property(boardSpecArb({ source: 'ideal', emf: 'balanced' }), (spec) => {
        const board = normaliseBoard(spec);
        const judged = judgedNominalOf(board);
        const result = analyseSolution(solveNetwork(board));
        spec.loads.forEach((load, li) => {
          const got = result.loads[li]!;
          const expected = ratedPowerOf(load, spec);
          const tol = { rel: LAW_REL, abs: LAW_REL * cAbs(expected) };
          expectComplexClose(c(got.kW * 1000, got.kvar * 1000), expected, tol, `load ${load.name} (${load.connection}) power`);
          for (const b of got.branches) {
            // Each branch sits at the model's nominal; its percentage is of the system nominal (230 V where the model has 230.9 V).
            const toNeutral = b.to === 'N' || b.to === 'star';
            const { ln, ll } = nominalVoltages(spec);
            expectClose(b.voltage.magnitude, toNeutral ? ln : ll, { rel: LAW_REL, abs: 0 }, `load ${load.name} branch voltage`);
            expectClose(b.voltagePercent, (100 * b.voltage.magnitude) / (toNeutral ? judged.ln : (judged.ll ?? judged.ln)), { rel: LAW_REL, abs: 0 }, `load ${load.name} branch voltage %`);
          }
          if (load.pf !== undefined) {
            expectClose(got.pf!, load.pf, { rel: LAW_REL, abs: 0 }, `load ${load.name} pf`);
            // Core reads |Q| ≤ 1e-9·S as unity; any pf short of that keeps its sense.
            expect(got.sense).toBe(Math.sqrt(1 - load.pf ** 2) <= 1e-9 ? 'unity' : (load.sense ?? 'lagging'));
          }
          if (load.A !== undefined) {
            // A is the line current, and so is the reported currentA (for delta loads too).
            expectClose(got.currentA, load.A, { rel: LAW_REL, abs: 0 }, `load ${load.name} current`);
          }
        });
      }),
    );
  });
});
