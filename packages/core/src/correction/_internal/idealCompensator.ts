/**
 * The ideal balancing compensator (reactors allowed) on the solved board:
 * Newton's method on residual = 0 with minimum-norm steps (J⁺ = Jᵀ(JJᵀ)⁻¹),
 * which settles on the exact Gyugyi / Steinmetz values on an ideal source and
 * follows the solved voltages otherwise.
 *
 * With line-to-neutral branches there are six susceptances for five conditions:
 * moving q kvar into every delta branch and out of every star branch leaves the
 * line currents (almost) unchanged. Along that null direction the solution with
 * the least reactor kvar is taken, ties going to the least total kvar — so a
 * capacitor-only solution is found whenever one exists.
 */
import { multiply, multiplyVector, solveLinear, transpose, maxAbs } from './realMatrix.js';
import { probeJacobian, type BoardProbe, type ProbeState } from './boardProbe.js';
import { compensatorResidual, type ResidualBases } from './compensatorResidual.js';

export interface IdealOutcome {
  readonly state: ProbeState;
  readonly converged: boolean;
  readonly iterations: number;
  readonly residualNorm: number;
}

const RESIDUAL_TOLERANCE = 1e-12;

/**
 * @param finalJacobian whether the Jacobian at the state reached is wanted (the first run's, for the
 *   null direction); otherwise none is formed there, since no step is taken from it (n column solves saved)
 */
function newton(probe: BoardProbe, start: readonly number[], bases: ResidualBases, maxIterations: number, step: number, finalJacobian: boolean) {
  let state = probe.at(start);
  let iterations = 0;
  let r = compensatorResidual(state, bases);
  let jacobian: number[][] = [];
  while (iterations < maxIterations) {
    const settled = maxAbs(r) < RESIDUAL_TOLERANCE && iterations > 0;
    if (settled && !finalJacobian) break;
    jacobian = probeJacobian(probe, state, (s) => compensatorResidual(s, bases), step);
    if (settled) break;
    iterations++;
    const jjt = multiply(jacobian, transpose(jacobian));
    const y = solveLinear(jjt, r);
    if (!y) break;
    const delta = multiplyVector(transpose(jacobian), y);
    state = probe.at(state.kvar.map((x, i) => x - delta[i]!));
    r = compensatorResidual(state, bases);
    if (maxAbs(delta) < 1e-14 * bases.powerKVA) break;
  }
  return { state, iterations, r, jacobian };
}

/** Unit vector spanning the null space of a full-row-rank m×(m+1) Jacobian. */
function nullDirection(jacobian: readonly (readonly number[])[]): number[] | null {
  const n = jacobian[0]?.length ?? 0;
  const jjt = multiply(jacobian, transpose(jacobian));
  let best: number[] | null = null;
  let bestNorm = 0;
  for (let k = 0; k < n; k++) {
    const y = solveLinear(jjt, jacobian.map((row) => row[k]!));
    if (!y) return null;
    const v = multiplyVector(transpose(jacobian), y).map((p, i) => (i === k ? 1 : 0) - p);
    const norm = Math.hypot(...v);
    if (norm > bestNorm) {
      best = v.map((x) => x / norm);
      bestNorm = norm;
    }
  }
  return best;
}

/** Point along x + q·ν with the least reactor kvar, then the least total kvar (both piecewise linear in q). */
function leastReactorShift(x: readonly number[], nu: readonly number[]): number {
  const cost = (q: number) => {
    const v = x.map((xi, i) => xi + q * nu[i]!);
    return [v.reduce((s, vi) => s + Math.max(0, -vi), 0), v.reduce((s, vi) => s + Math.abs(vi), 0)] as const;
  };
  const candidates = [0, ...x.flatMap((xi, i) => (Math.abs(nu[i]!) > 1e-12 ? [-xi / nu[i]!] : []))];
  let best = 0;
  let bestCost = cost(0);
  for (const q of candidates) {
    const c = cost(q);
    const scale = 1e-12 * Math.max(1, bestCost[1]);
    if (c[0] < bestCost[0] - scale || (Math.abs(c[0] - bestCost[0]) <= scale && c[1] < bestCost[1] - scale)) {
      best = q;
      bestCost = c;
    }
  }
  return best;
}

export function solveIdealCompensator(probe: BoardProbe, bases: ResidualBases, maxIterations: number): IdealOutcome {
  const n = probe.slots.length;
  const step = 1e-4 * bases.powerKVA;
  let run = newton(probe, new Array<number>(n).fill(0), bases, maxIterations, step, true);
  let iterations = run.iterations;
  if (run.jacobian.length < n) {
    const nu = nullDirection(run.jacobian);
    if (nu) {
      const q = leastReactorShift(run.state.kvar, nu);
      run = newton(probe, run.state.kvar.map((x, i) => x + q * nu[i]!), bases, maxIterations, step, false);
      iterations += run.iterations;
    }
  }
  const residualNorm = Math.hypot(...run.r);
  return { state: run.state, converged: residualNorm < 1e-9, iterations, residualNorm };
}
