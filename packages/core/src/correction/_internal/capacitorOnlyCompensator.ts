/**
 * The best capacitor-only balancing compensator: Gauss–Newton on the solved
 * board, each step a small convex QP,
 *   minimise  Σ wₖ·rₖ²  +  ridge·Σ yᵢ²
 *   subject to  yᵢ ≥ 0 (capacitors only)  and, unless leading is allowed,
 *               every loaded line inside its lower PF bound (linearised),
 * where r is the compensator residual (I2, I0, Q1 − Q1 target, per unit) and
 * y the branch outputs per unit of S_base. The residual is linear in the
 * susceptances on an ideal source, so one step is then exact; otherwise the
 * board is re-solved and re-linearised until y settles.
 */
import { multiply, multiplyVector, transpose, maxAbs } from './realMatrix.js';
import { solveQuadraticProgram } from './quadraticProgram.js';
import { probeJacobian, type BoardProbe, type ProbeState } from './boardProbe.js';
import { compensatorResidual, type ResidualBases } from './compensatorResidual.js';

export interface CapacitorOnlyOutcome {
  readonly state: ProbeState;
  /** Σ wₖ·rₖ² at the answer (without the ridge term). */
  readonly objective: number;
  readonly converged: boolean;
  readonly iterations: number;
  /** True when the no-leading constraints could not all hold and were dropped. */
  readonly leadingConstraintsDropped: boolean;
  /** True when balance limits were asked for and could not all hold (the objective alone then decides). */
  readonly balanceConstraintsDropped: boolean;
}

export interface CapacitorOnlySettings {
  readonly weights: readonly number[];
  readonly ridge: number;
  /** Lower bound on Q/|P| per line, or null for a line left free. */
  readonly lineLowerTan: readonly (number | null)[];
  readonly maxIterations: number;
  readonly convergence: number;
  /**
   * Keep |I2| and |I0| within these fractions of the present |I1| where possible (a balance target as
   * constraints, the objective deciding within them). Each circle is held by an inscribed polygon of
   * `BALANCE_POLYGON_SIDES` sides on the linearised residual. @defaultValue none
   */
  readonly balanceLimits?: { readonly negativeSequence: number; readonly zeroSequence: number | null };
  /** Branches held at zero (left out of the compensator). @defaultValue none */
  readonly heldAtZero?: readonly boolean[];
  /** Where the iteration starts (a solution of the same board with more branches). @defaultValue every branch at zero */
  readonly start?: ProbeState;
}

/** Sides of the polygon inscribed in a balance limit's circle: within cos(π/12) = 96.6 % of the radius. */
const BALANCE_POLYGON_SIDES = 12;

/** Rows `row·y ≥ bound` holding |offset + J·y| (entries a, a+1 of the residual) inside radius t. */
function circleRows(jy: readonly (readonly number[])[], offset: readonly number[], a: number, t: number): { rows: number[][]; bounds: number[] } {
  const rows: number[][] = [];
  const bounds: number[] = [];
  for (let k = 0; k < BALANCE_POLYGON_SIDES; k++) {
    const th = (2 * Math.PI * k) / BALANCE_POLYGON_SIDES;
    const [cx, cy] = [Math.cos(th), Math.sin(th)];
    // c·(offset + J·y) ≤ t·cos(π/K)  ⇔  (−c·J)·y ≥ c·offset − t·cos(π/K)
    rows.push(jy[a]!.map((v, i) => -(cx * v + cy * jy[a + 1]![i]!)));
    bounds.push(cx * offset[a]! + cy * offset[a + 1]! - t * Math.cos(Math.PI / BALANCE_POLYGON_SIDES));
  }
  return { rows, bounds };
}

export function solveCapacitorOnlyCompensator(probe: BoardProbe, bases: ResidualBases, settings: CapacitorOnlySettings): CapacitorOnlyOutcome {
  const n = probe.slots.length;
  const sb = bases.powerKVA;
  const lines = settings.lineLowerTan.length;
  const measure = (s: ProbeState) => [...compensatorResidual(s, bases), ...s.lineP, ...s.lineQ];
  const held = settings.heldAtZero ?? new Array<boolean>(n).fill(false);
  let state = settings.start ? probe.at(settings.start.kvar.map((q, i) => (held[i] ? 0 : q))) : probe.at(new Array<number>(n).fill(0));
  let iterations = 0;
  let converged = false;
  let dropped = false;
  let balanceDropped = false;
  while (iterations < settings.maxIterations) {
    iterations++;
    const full = probeJacobian(probe, state, measure, 1e-4 * sb, held);
    const m = full.length - 2 * lines;
    const r = compensatorResidual(state, bases);
    // Per-unit Jacobian of the residual with respect to y = kvar / S_base.
    const jy = full.slice(0, m).map((row) => row.map((v) => v * sb));
    const y = state.kvar.map((x) => x / sb);
    const wj = jy.map((row, k) => row.map((v) => v * settings.weights[k]!));
    const jtwj = multiply(transpose(jy), wj);
    const offset = r.map((rk, k) => rk - jy[k]!.reduce((s, v, i) => s + v * y[i]!, 0));
    const h = jtwj.map((row, i) => row.map((v, j) => 2 * (v + (i === j ? settings.ridge : 0))));
    const c = multiplyVector(transpose(wj), offset).map((v) => 2 * v);
    const rows: number[][] = [];
    const bounds: number[] = [];
    for (let i = 0; i < n; i++) {
      rows.push(Array.from({ length: n }, (_, j) => (j === i ? 1 : 0)));
      bounds.push(0);
    }
    const boundRows: number[][] = [];
    const boundValues: number[] = [];
    settings.lineLowerTan.forEach((low, line) => {
      if (low === null) return;
      const p = state.lineP[line]!;
      const sign = p < 0 ? -1 : 1;
      const g = full[m + lines + line]!.map((dq, i) => (dq - low * sign * full[m + line]![i]!) * sb);
      const e = state.lineQ[line]! - low * sign * p - g.reduce((s, gi, i) => s + gi * y[i]!, 0);
      boundRows.push(g);
      boundValues.push(-e);
    });
    const balanceRows: number[][] = [];
    const balanceBounds: number[] = [];
    const limits = settings.balanceLimits;
    if (limits && !balanceDropped) {
      // Radii in residual units (per unit of the uncorrected |I1|), from the present |I1|.
      const i1 = state.sequences ? Math.hypot(state.sequences.current.positive.re, state.sequences.current.positive.im) / bases.currentA : 0;
      const circles = [{ at: 0, t: limits.negativeSequence * i1 }, ...(bases.includeZeroSequence && limits.zeroSequence !== null ? [{ at: 2, t: limits.zeroSequence * i1 }] : [])];
      for (const circle of circles) {
        const polygon = circleRows(jy, offset, circle.at, circle.t);
        balanceRows.push(...polygon.rows);
        balanceBounds.push(...polygon.bounds);
      }
    }
    // Held branches are zero: their columns (and their own y ≥ 0 rows) leave the programme.
    const free = held.flatMap((isHeld, i) => (isHeld ? [] : [i]));
    const pick = (row: readonly number[]) => free.map((j) => row[j]!);
    const solveFree = (cons: readonly number[][], rhs: readonly number[]): number[] | null => {
      if (free.length === n) return solveQuadraticProgram({ h, c, rows: cons, bounds: rhs });
      const keep = cons.flatMap((_, k) => (k < n && held[k] ? [] : [k]));
      const x = solveQuadraticProgram({ h: free.map((i) => pick(h[i]!)), c: pick(c), rows: keep.map((k) => pick(cons[k]!)), bounds: keep.map((k) => rhs[k]!) });
      if (!x) return null;
      const full = new Array<number>(n).fill(0);
      free.forEach((i, k) => (full[i] = x[k]!));
      return full;
    };
    let next: number[] | null = null;
    if (balanceRows.length) {
      next = solveFree([...rows, ...(dropped ? [] : boundRows), ...balanceRows], [...bounds, ...(dropped ? [] : boundValues), ...balanceBounds]);
      if (!next) balanceDropped = true;
    }
    if (!next && !dropped) next = solveFree([...rows, ...boundRows], [...bounds, ...boundValues]);
    if (!next) {
      dropped = dropped || boundRows.length > 0;
      next = solveFree(rows, bounds);
    }
    if (!next) break;
    const kvar = next.map((v) => Math.max(0, v) * sb);
    const change = maxAbs(kvar.map((v, i) => v - state.kvar[i]!)) / sb;
    state = probe.at(kvar);
    if (change <= settings.convergence) {
      converged = true;
      break;
    }
  }
  const r = compensatorResidual(state, bases);
  const objective = r.reduce((s, rk, k) => s + settings.weights[k]! * rk * rk, 0);
  return { state, objective, converged, iterations, leadingConstraintsDropped: dropped, balanceConstraintsDropped: balanceDropped };
}
