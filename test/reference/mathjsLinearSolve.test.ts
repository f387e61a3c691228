/**
 * The solver's complex LU against a general-purpose library: mathjs 15 `lusolve`
 * (independent implementation of LU with partial pivoting).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { create, complexDependencies, lusolveDependencies, type FactoryFunctionMap, type MathArray, type Complex } from 'mathjs';
import { solveComplexSystem } from '../../packages/core/src/_internal/complexLu.js';

const math = create({ complexDependencies, lusolveDependencies } as FactoryFunctionMap);
// Values on a 0.001 grid: mathjs flushes near-underflow magnitudes to zero, which is not what is under test.
const part = fc.integer({ min: -100_000, max: 100_000 }).map((k) => k / 1000);
const complexArb = fc.record({ re: part, im: part });

describe('complex LU solve', () => {
  it('agrees with mathjs lusolve on random well-conditioned systems', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 12 }).chain((n) =>
          fc.tuple(fc.array(fc.array(complexArb, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }), fc.array(complexArb, { minLength: n, maxLength: n })),
        ),
        ([rows, b]) => {
          // Make it diagonally dominant so both solvers face a well-posed problem.
          const a = rows.map((row, i) => row.map((v, j) => (i === j ? { re: v.re + 2000, im: v.im } : v)));
          const ours = solveComplexSystem(a, b);
          expect(ours.ok).toBe(true);
          if (!ours.ok) return;
          const ref = math.lusolve(
            a.map((r) => r.map((v) => math.complex(v.re, v.im))) as unknown as MathArray,
            b.map((v) => [math.complex(v.re, v.im)]) as unknown as MathArray,
          ) as unknown as (Complex | number)[][];
          const refX = ref.map(([v]) => (typeof v === 'number' ? { re: v, im: 0 } : { re: v!.re, im: v!.im }));
          // Tolerance relative to the size of the solution vector (entries may be near zero).
          const size = Math.max(...refX.map((v) => Math.hypot(v.re, v.im)));
          refX.forEach((v, i) => {
            expect(Math.hypot(ours.x[i]!.re - v.re, ours.x[i]!.im - v.im)).toBeLessThanOrEqual(1e-12 * size);
          });
        },
      ),
      { numRuns: 200 },
    );
  });
  it('reports the column of a vanishing pivot instead of dividing by zero', () => {
    const one = { re: 1, im: 0 };
    const zero = { re: 0, im: 0 };
    const result = solveComplexSystem(
      [
        [one, one],
        [one, one],
      ],
      [one, zero],
    );
    expect(result).toEqual({ ok: false, column: 1 });
  });
  it('solves a system that needs row exchanges (zero leading pivot)', () => {
    const r = solveComplexSystem(
      [
        [{ re: 0, im: 0 }, { re: 1, im: 0 }],
        [{ re: 0, im: 2 }, { re: 0, im: 0 }],
      ],
      [{ re: 3, im: 0 }, { re: 4, im: 0 }],
    );
    expect(r.ok && r.x).toEqual([{ re: 0, im: -2 }, { re: 3, im: 0 }]);
  });
});
