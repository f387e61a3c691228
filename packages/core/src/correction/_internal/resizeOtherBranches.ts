/**
 * The exact compensator with some branches held (a small one left out, say) and
 * the others sized again around them, on the solved board: Gauss–Newton on the
 * compensator residual (I2, I0, Q1 − target) over the free branches only —
 * minimum-norm steps while they outnumber the conditions (exact again), least
 * squares once they do not. The Q1 condition weighs most: the exact solution meets
 * the PF target with no margin (Q1 at P1·tan φ exactly), while the balance target
 * has its whole margin to take what the held branches leave.
 */
import { multiply, multiplyVector, solveLinear, transpose, maxAbs } from './realMatrix.js';
import type { BoardProbe, ProbeState } from './boardProbe.js';
import { compensatorResidual, type ResidualBases } from './compensatorResidual.js';

/** Weight of the Q1 row against the sequence-current rows (all per unit). */
const REACTIVE_ROW_WEIGHT = 1e3;

function weightedResidual(state: ProbeState, bases: ResidualBases): number[] {
  const r = compensatorResidual(state, bases);
  return r.map((x, k) => (k === r.length - 1 ? REACTIVE_ROW_WEIGHT * x : x));
}

/**
 * @param start every branch's output (kvar at nominal voltage), the held ones at their held value
 * @param free which branches are sized again
 * @returns the state reached with the least weighted residual
 */
export function resizeOtherBranches(probe: BoardProbe, start: readonly number[], free: readonly boolean[], bases: ResidualBases, maxIterations: number): ProbeState {
  const columns = free.flatMap((f, i) => (f ? [i] : []));
  let state = probe.at(start);
  let r = weightedResidual(state, bases);
  if (columns.length === 0) return state;
  const step = 1e-4 * bases.powerKVA;
  for (let iteration = 0; iteration < maxIterations && maxAbs(r) > 1e-12; iteration++) {
    const jt = columns.map((i) => {
      const x = [...state.kvar];
      x[i] = x[i]! + step;
      return weightedResidual(probe.at(x), bases).map((v, k) => (v - r[k]!) / step);
    });
    const j = transpose(jt);
    // More unknowns than conditions: the least change that zeroes the residual; fewer: least squares.
    const delta =
      columns.length >= r.length
        ? (() => {
            const y = solveLinear(multiply(j, jt), r);
            return y && multiplyVector(jt, y);
          })()
        : solveLinear(multiply(jt, j), multiplyVector(jt, r));
    if (!delta) break;
    const next = [...state.kvar];
    columns.forEach((i, c) => (next[i] = next[i]! - delta[c]!));
    const trial = probe.at(next);
    const rTrial = weightedResidual(trial, bases);
    // The problem is near linear; a step that does not lower the residual means the least squares is reached.
    if (Math.hypot(...rTrial) >= Math.hypot(...r)) break;
    [state, r] = [trial, rTrial];
    if (maxAbs(delta) < 1e-12 * bases.powerKVA) break;
  }
  return state;
}
