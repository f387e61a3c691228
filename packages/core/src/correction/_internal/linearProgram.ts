/**
 * Exact solution of a tiny linear programme by vertex enumeration.
 *
 * Sizing a bank against per-line targets is an LP in at most four unknowns
 * (three branch ratings and one slack), so instead of a simplex code with its
 * degeneracy rules we try every choice of `d` active constraints, keep the
 * feasible vertices, and pick the best one. With ≤ 10 constraints that is a few
 * hundred 4×4 solves. Objectives are lexicographic: the first is minimised, the
 * next breaks ties among vertices equal in the first, and so on — the optimum
 * of a lexicographic LP over a pointed polyhedron is always a vertex.
 *
 * Tie rule: choices of active rows are taken in lexicographic order and a vertex replaces the
 * best so far only when it is better by more than TIE in the first objective that differs, so
 * of vertices equal within TIE the one met first stays.
 */
import { dot, nextSubset, solveLinearInPlace } from './realMatrix.js';
import { solveFourRows } from './fourRowVertex.js';

export interface LinearProgram {
  /** Each row: coefficients of one constraint `row·z ≤ bound`. */
  readonly rows: readonly (readonly number[])[];
  readonly bounds: readonly number[];
  /** Objectives to minimise, most important first. */
  readonly objectives: readonly (readonly number[])[];
}

/**
 * Relative tolerance for feasibility. It must stay well below the slack the
 * target check allows (1e-9 relative in Q/P), or a vertex a hair outside a PF
 * bound passes as feasible and wins on cost.
 */
const FEASIBILITY = 1e-11;
/** Relative tolerance for "equal" objective values in the lexicographic comparison. */
const TIE = 1e-12;

/**
 * The rows scaled to unit norm. A row without a coefficient (`0·z ≤ bound`) holds for every z or for
 * none, so it takes no part in the vertices: it is dropped when its bound is not negative and makes the
 * whole programme infeasible (null) when it is — below −FEASIBILITY times the bounds' scale, the
 * tolerance every other row is judged with at z = 0.
 */
function normalised(lp: LinearProgram): { rows: number[][]; bounds: number[] } | null {
  const rows: number[][] = [];
  const bounds: number[] = [];
  const boundScale = Math.max(1e-12, ...lp.bounds.map(Math.abs));
  let infeasible = false;
  lp.rows.forEach((row, i) => {
    const norm = Math.hypot(...row);
    if (norm === 0) {
      if (!(lp.bounds[i]! >= -FEASIBILITY * boundScale)) infeasible = true;
      return;
    }
    rows.push(row.map((v) => v / norm));
    bounds.push(lp.bounds[i]! / norm);
  });
  return infeasible ? null : { rows, bounds };
}

/**
 * The lexicographically best vertex, or null when no vertex is feasible
 * (infeasible programme, including a row without coefficients whose bound is
 * negative). The feasible set must be pointed (e.g. every variable bounded
 * below), which holds for all uses here.
 */
export function solveLinearProgram(lp: LinearProgram): number[] | null {
  const d = lp.objectives[0]?.length ?? 0;
  const programme = normalised(lp);
  if (!programme) return null;
  const { rows, bounds } = programme;
  const m = rows.length;
  const scale = Math.max(1e-12, ...bounds.map(Math.abs));
  let best: number[] | null = null;
  let bestValues: number[] = [];
  if (d > m) return best;
  // The rows on one typed array, read by the loop below over every choice of d active rows (a
  // sizing loop solves a dozen of these programmes cold, each with a few hundred vertices).
  const flat = Float64Array.from(rows.flat());
  const rhs = Float64Array.from(bounds);
  const solution = new Float64Array(d);
  let lastMissed = 0;
  /** Keeps the vertex in `solution` if it is feasible and better than the best so far. */
  const consider = (): void => {
    let zScale = scale;
    for (let c = 0; c < d; c++) zScale = Math.max(zScale, Math.abs(solution[c]!));
    // Every row·z ≤ bound (within tolerance), each dot product summed left to right from 0 as `dot` sums it.
    // The row that ruled out the last vertex is asked first: most vertices miss the same few rows,
    // and the verdict (all rows hold) does not depend on the order they are asked in.
    let feasible = true;
    for (let k = m > 0 ? -1 : 0; k < m && feasible; k++) {
      const i = k < 0 ? lastMissed : k;
      if (k === lastMissed) continue;
      let s = 0;
      if (d === 4) s = 0 + flat[4 * i]! * solution[0]! + flat[4 * i + 1]! * solution[1]! + flat[4 * i + 2]! * solution[2]! + flat[4 * i + 3]! * solution[3]!;
      else for (let c = 0; c < d; c++) s = s + flat[i * d + c]! * solution[c]!;
      feasible = s <= rhs[i]! + FEASIBILITY * zScale;
      if (!feasible) lastMissed = i;
    }
    if (!feasible) return;
    const z = Array.from(solution);
    const values = lp.objectives.map((c) => dot(c, z));
    if (!best || isBetter(values, bestValues)) {
      best = z;
      bestValues = values;
    }
  };
  if (d === 4) {
    // Every line-target sizing: choices of four rows in the order nextSubset gives them, each vertex by
    // the written-out elimination (same bits as solveLinearInPlace, see fourRowVertex.ts).
    for (let i = 0; i < m; i++)
      for (let j = i + 1; j < m; j++)
        for (let k = j + 1; k < m; k++) for (let l = k + 1; l < m; l++) if (solveFourRows(flat, rhs, i, j, k, l, solution)) consider();
    return best;
  }
  // Every vertex candidate's system in one typed work area (bit-identical to solveLinear, see solveLinearInPlace).
  const system = new Float64Array(d * (d + 1));
  const rowOf = new Int32Array(d);
  const active = new Int32Array(d);
  for (let i = 0; i < d; i++) active[i] = i;
  for (let more = true; more; more = nextSubset(active, d, m)) {
    for (let r = 0; r < d; r++) {
      const row = active[r]! * d;
      for (let c = 0; c < d; c++) system[r * (d + 1) + c] = flat[row + c]!;
      system[r * (d + 1) + d] = rhs[active[r]!]!;
    }
    if (solveLinearInPlace(system, d, rowOf, solution)) consider();
  }
  return best;
}

function isBetter(values: readonly number[], than: readonly number[]): boolean {
  for (let k = 0; k < values.length; k++) {
    const a = values[k]!;
    const b = than[k]!;
    const slack = TIE * Math.max(1, Math.abs(a), Math.abs(b));
    if (a < b - slack) return true;
    if (a > b + slack) return false;
  }
  return false;
}
