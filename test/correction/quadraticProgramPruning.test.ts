/**
 * The quadratic programme judges only the active sets near the optimum (or, where that is not
 * settled, enumerates skipping sets that cannot win); its answer is still the plain enumeration's
 * to the last bit (support/plainActiveSetEnumeration.ts).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { enumerateActiveSets, solveQuadraticProgram, type QuadraticProgram } from '../../packages/core/src/correction/_internal/quadraticProgram.js';
import { enumerateEveryActiveSet, positiveDefinite, sameBits } from './support/plainActiveSetEnumeration.js';


const real = fc.double({ min: -5, max: 5, noNaN: true });

describe('quadratic programme with skipped active sets', () => {
  it('gives the plain enumeration\'s answer bit for bit on general programmes', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(real, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }),
            ridge: fc.double({ min: 1e-6, max: 2, noNaN: true }),
            c: fc.array(real, { minLength: n, maxLength: n }),
            rows: fc.array(fc.array(fc.oneof(real, fc.integer({ min: -2, max: 2 })), { minLength: n, maxLength: n }), { maxLength: 12 }),
            bounds: fc.array(real, { minLength: 12, maxLength: 12 }),
          }),
        ),
        ({ n, m, ridge, c, rows, bounds }) => {
          const qp: QuadraticProgram = { h: positiveDefinite(m, n, ridge), c, rows, bounds: rows.map((_, i) => bounds[i]!) };
          const plain = enumerateEveryActiveSet(qp);
          expect(sameBits(solveQuadraticProgram(qp), plain)).toBe(true);
          // Skipping on however small a programme (by default only from 1,000 active sets).
          expect(sameBits(enumerateActiveSets(qp, 0), plain)).toBe(true);
        },
      ),
    );
  });

  it('gives the plain enumeration\'s answer bit for bit on programmes shaped like a reactor refit (outputs ≥ 0, line bounds, polygons)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 3 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(real, { minLength: n, maxLength: n }), { minLength: 4, maxLength: 4 }),
            c: fc.array(real, { minLength: n, maxLength: n }),
            lines: fc.array(fc.tuple(fc.array(real, { minLength: n, maxLength: n }), real), { maxLength: 3 }),
            circles: fc.array(fc.tuple(fc.array(real, { minLength: 2 * n, maxLength: 2 * n }), real, real, fc.double({ min: 0, max: 2, noNaN: true })), { minLength: 1, maxLength: 2 }),
          }),
        ),
        ({ n, m, c, lines, circles }) => {
          const rows: number[][] = [];
          const bounds: number[] = [];
          for (let i = 0; i < n; i++) {
            rows.push(Array.from({ length: n }, (_, j) => (j === i ? 1 : 0)));
            bounds.push(0);
          }
          for (const [g, e] of lines) {
            rows.push(g);
            bounds.push(e);
          }
          for (const [j, ox, oy, t] of circles)
            for (let k = 0; k < 12; k++) {
              const th = (2 * Math.PI * k) / 12;
              const [cx, cy] = [Math.cos(th), Math.sin(th)];
              rows.push(Array.from({ length: n }, (_, i) => -(cx * j[i]! + cy * j[n + i]!)));
              bounds.push(cx * ox + cy * oy - t * Math.cos(Math.PI / 12));
            }
          const qp: QuadraticProgram = { h: positiveDefinite(m, n, 1e-4), c, rows, bounds };
          const plain = enumerateEveryActiveSet(qp);
          expect(sameBits(solveQuadraticProgram(qp), plain)).toBe(true);
          // Skipping on however small a programme (by default only from 1,000 active sets).
          expect(sameBits(enumerateActiveSets(qp, 0), plain)).toBe(true);
        },
      ),
    );
  });
});
