/**
 * The linear programme's plain vertex enumeration as it stood before any change for speed: every
 * choice of d active rows solved in lexicographic order, each vertex checked against every row in
 * order, the best kept by the lexicographic comparison with its tie tolerance — the reference
 * `solveLinearProgram` must match bit for bit.
 */
import type { LinearProgram } from '../../../packages/core/src/correction/_internal/linearProgram.js';
import { dot, nextSubset, solveLinearInPlace } from '../../../packages/core/src/correction/_internal/realMatrix.js';

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
export function enumerateEveryVertex(lp: LinearProgram): number[] | null {
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
  // Every vertex candidate's system in one typed work area (bit-identical to solveLinear, see solveLinearInPlace).
  const system = new Float64Array(d * (d + 1));
  const rowOf = new Int32Array(d);
  const solution = new Float64Array(d);
  const active = new Int32Array(d);
  for (let i = 0; i < d; i++) active[i] = i;
  for (let more = true; more; more = nextSubset(active, d, m)) {
    for (let r = 0; r < d; r++) {
      const row = active[r]! * d;
      for (let c = 0; c < d; c++) system[r * (d + 1) + c] = flat[row + c]!;
      system[r * (d + 1) + d] = bounds[active[r]!]!;
    }
    if (!solveLinearInPlace(system, d, rowOf, solution)) continue;
    let zScale = scale;
    for (let c = 0; c < d; c++) zScale = Math.max(zScale, Math.abs(solution[c]!));
    // Every row·z ≤ bound (within tolerance), each dot product summed left to right from 0 as `dot` sums it.
    let feasible = true;
    for (let i = 0; i < m && feasible; i++) {
      let s = 0;
      for (let c = 0; c < d; c++) s = s + flat[i * d + c]! * solution[c]!;
      feasible = s <= bounds[i]! + FEASIBILITY * zScale;
    }
    if (!feasible) continue;
    const z = Array.from(solution);
    const values = lp.objectives.map((c) => dot(c, z));
    if (!best || isBetter(values, bestValues)) {
      best = z;
      bestValues = values;
    }
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
