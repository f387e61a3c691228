/**
 * The quadratic programme's dual active-set front (dualActiveSet.ts + the reach bound in
 * quadraticProgram.ts): on degenerate programmes — many rows through the optimum, repeated rows,
 * rows without coefficients, multipliers at zero — the answer is still the plain enumeration's to
 * the last bit, and on ordinary programmes the enumeration is not needed (the route says which way
 * the answer came).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveQuadraticProgramBy, type QuadraticProgram } from '../../packages/core/src/correction/_internal/quadraticProgram.js';
import { solveByDualActiveSet } from '../../packages/core/src/correction/_internal/dualActiveSet.js';
import { enumerateEveryActiveSet, positiveDefinite, sameBits } from './support/plainActiveSetEnumeration.js';

/** Decimal data as the sizing produces (no subnormal or extreme magnitudes). */
const real = fc.integer({ min: -5000, max: 5000 }).map((v) => v / 997);
const small = fc.integer({ min: -3, max: 3 });

const dot = (a: readonly number[], b: readonly number[]) => a.reduce((s, v, i) => s + v * b[i]!, 0);

describe('quadratic programme: dual active-set front', () => {
  it('degenerate programmes (rows through one point, repeated rows, empty rows): the plain enumeration bit for bit', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(small, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }),
            c: fc.array(small, { minLength: n, maxLength: n }),
            point: fc.array(small, { minLength: n, maxLength: n }),
            // Rows through `point` (active there), each perhaps repeated, plus rows holding with room or empty.
            through: fc.array(fc.tuple(fc.array(small, { minLength: n, maxLength: n }), fc.integer({ min: 1, max: 2 })), { maxLength: 7 }),
            loose: fc.array(fc.tuple(fc.array(small, { minLength: n, maxLength: n }), fc.integer({ min: -2, max: 3 })), { maxLength: 3 }),
          }),
        ),
        ({ n, m, c, point, through, loose }) => {
          const rows: number[][] = [];
          const bounds: number[] = [];
          for (const [row, times] of through)
            for (let t = 0; t < times; t++) {
              rows.push(row);
              bounds.push(dot(row, point));
            }
          for (const [row, room] of loose) {
            rows.push(row);
            bounds.push(dot(row, point) - room);
          }
          const qp: QuadraticProgram = { h: positiveDefinite(m, n, 1), c, rows, bounds };
          expect(sameBits(solveQuadraticProgramBy(qp).x, enumerateEveryActiveSet(qp))).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('ordinary programmes are settled without enumerating: near the optimum when feasible, by a certificate when clearly infeasible', () => {
    const routes: Record<string, number> = {};
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(real, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }),
            c: fc.array(real, { minLength: n, maxLength: n }),
            rows: fc.array(fc.array(real, { minLength: n, maxLength: n }), { minLength: 1, maxLength: 12 }),
            bounds: fc.array(real, { minLength: 12, maxLength: 12 }),
          }),
        ),
        ({ n, m, c, rows, bounds }) => {
          const qp: QuadraticProgram = { h: positiveDefinite(m, n, 0.01), c, rows, bounds: rows.map((_, i) => bounds[i]!) };
          const { x, route } = solveQuadraticProgramBy(qp);
          routes[route] = (routes[route] ?? 0) + 1;
          expect(sameBits(x, enumerateEveryActiveSet(qp))).toBe(true);
          if (route === 'proven-infeasible') expect(x).toBeNull();
        },
      ),
      { numRuns: 400 },
    );
    // Observed: about 1 % enumerated (infeasible by a hair, or a near-zero row widening the scale).
    expect(routes['enumerated'] ?? 0).toBeLessThan(0.1 * 400);
    expect(routes['near-optimum']).toBeGreaterThan(0);
    expect(routes['proven-infeasible']).toBeGreaterThan(0);
  });

  it('proves a plainly infeasible programme infeasible with a Farkas certificate', () => {
    // x₀ ≥ 1, x₁ ≥ 1, x₀ + x₁ ≤ 1: u = (1, 1, 1) gives Σuᵢ·rowᵢ = 0 and Σuᵢ·bᵢ = 1 > 0.
    const h = Float64Array.from([2, 0, 0, 2]);
    const rows = Float64Array.from([1, 0, 0, 1, -1, -1]);
    const bounds = Float64Array.from([1, 1, -1]);
    const outcome = solveByDualActiveSet(h, Float64Array.from([0, 0]), rows, bounds, [1, 1, Math.SQRT2], 2, 3);
    expect(outcome?.kind).toBe('infeasible');
    const u = outcome!.kind === 'infeasible' ? outcome!.certificate : new Float64Array(3);
    expect(u.every((v) => v >= 0)).toBe(true);
    for (let j = 0; j < 2; j++) expect(Math.abs(u[0]! * rows[j]! + u[1]! * rows[2 + j]! + u[2]! * rows[4 + j]!)).toBeLessThan(1e-12);
    expect(u[0]! * 1 + u[1]! * 1 + u[2]! * -1).toBeGreaterThan(0);
    const qp: QuadraticProgram = { h: [[2, 0], [0, 2]], c: [0, 0], rows: [[1, 0], [0, 1], [-1, -1]], bounds: [1, 1, -1] };
    expect(solveQuadraticProgramBy(qp)).toEqual({ x: null, route: 'proven-infeasible' });
  });

  it('finds the textbook optimum and its multipliers', () => {
    // Minimise (x₀ − 1)² + (x₁ − 2.5)² subject to x₀ − 2x₁ ≥ −2, −x₀ − 2x₁ ≥ −6, −x₀ + 2x₁ ≥ −2, x ≥ 0
    // (Nocedal & Wright, Numerical Optimization, 2nd ed., example 16.3, from memory; checked here): optimum (1.4, 1.7), only the
    // first row active, with multiplier 0.8 (∇f = 2(x − x*) = (0.8, −1.6) = 0.8·(1, −2)).
    const h = Float64Array.from([2, 0, 0, 2]);
    const c = Float64Array.from([-2, -5]);
    const rowList = [[1, -2], [-1, -2], [-1, 2], [1, 0], [0, 1]];
    const outcome = solveByDualActiveSet(h, c, Float64Array.from(rowList.flat()), Float64Array.from([-2, -6, -2, 0, 0]), rowList.map((r) => Math.hypot(...r)), 2, 5);
    expect(outcome?.kind).toBe('optimal');
    if (outcome?.kind !== 'optimal') return;
    expect(outcome.x[0]).toBeCloseTo(1.4, 12);
    expect(outcome.x[1]).toBeCloseTo(1.7, 12);
    expect(Array.from(outcome.multipliers).map((v) => Number(v.toFixed(12)))).toEqual([0.8, 0, 0, 0, 0]);
    const qp: QuadraticProgram = { h: [[2, 0], [0, 2]], c: [-2, -5], rows: rowList, bounds: [-2, -6, -2, 0, 0] };
    const { x, route } = solveQuadraticProgramBy(qp);
    expect(route).toBe('near-optimum');
    expect(sameBits(x, enumerateEveryActiveSet(qp))).toBe(true);
  });
});
