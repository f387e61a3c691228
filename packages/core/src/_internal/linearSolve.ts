/**
 * The one place mathjs is used: LU factorisation with partial pivoting of a
 * complex system. Built with `create` and only the factories it needs, so a
 * bundled CLI does not load all of mathjs. Plain `{ re, im }` in and out.
 */
import { complexDependencies, create, lupDependencies, lusolveDependencies, type Complex, type FactoryFunctionMap, type MathArray } from 'mathjs';
import type { ComplexValue } from '../complex.js';

// mathjs types each `*Dependencies` as possibly undefined under exactOptionalPropertyTypes.
const math = create({ complexDependencies, lupDependencies, lusolveDependencies } as FactoryFunctionMap);

export type LinearSolveResult =
  | { readonly ok: true; readonly x: ComplexValue[] }
  /** `column` is the unknown whose pivot vanished: the node (or source) that is not tied down. */
  | { readonly ok: false; readonly column: number };

/**
 * Solves A·x = b. A pivot smaller than `relativePivotTolerance` × the largest
 * entry of A is taken as singular and reported by column instead of dividing
 * by (almost) zero.
 */
export function solveComplexSystem(
  a: readonly (readonly ComplexValue[])[],
  b: readonly ComplexValue[],
  relativePivotTolerance = 1e-13,
): LinearSolveResult {
  let largest = 0;
  const matrix = a.map((row) =>
    row.map((v) => {
      largest = Math.max(largest, Math.hypot(v.re, v.im));
      return math.complex(v.re, v.im);
    }),
  );
  const factors = math.lup(matrix as unknown as MathArray) as unknown as { L: Complex[][]; U: Complex[][]; p: number[] };
  const u = factors.U;
  for (let k = 0; k < u.length; k++) {
    const pivot = u[k]![k]!;
    if (Math.hypot(pivot.re, pivot.im) <= relativePivotTolerance * largest) return { ok: false, column: k };
  }
  const rhs = b.map((v) => [math.complex(v.re, v.im)]);
  const raw = math.lusolve(factors as never, rhs as unknown as MathArray) as unknown as (Complex | number)[][] | { toArray(): (Complex | number)[][] };
  // Given a factorisation, lusolve answers with a DenseMatrix rather than an array.
  const solution = Array.isArray(raw) ? raw : raw.toArray();
  // Entries that come out exactly zero are plain numbers, not Complex.
  const plain = (v: Complex | number): ComplexValue => (typeof v === 'number' ? { re: v, im: 0 } : { re: v.re, im: v.im });
  return { ok: true, x: solution.map((row) => plain(row[0]!)) };
}
