/** The typed-array elimination the quadratic programme uses gives solveLinear's answers bit for bit. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLinear, solveLinearInPlace } from '../../packages/core/src/correction/_internal/realMatrix.js';

const entry = fc.oneof(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.constant(0), fc.integer({ min: -3, max: 3 }));

describe('solveLinearInPlace', () => {
  it('equals solveLinear exactly, including which systems count as singular', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 12 }).chain((n) => fc.tuple(fc.array(fc.array(entry, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }), fc.array(entry, { minLength: n, maxLength: n }))),
        ([a, b]) => {
          const n = b.length;
          const m = new Float64Array(n * (n + 1));
          a.forEach((row, r) => {
            row.forEach((v, c) => (m[r * (n + 1) + c] = v));
            m[r * (n + 1) + n] = b[r]!;
          });
          const x = new Float64Array(n);
          const ok = solveLinearInPlace(m, n, new Int32Array(n), x);
          const expected = solveLinear(a, b);
          expect(ok).toBe(expected !== null);
          if (expected) expect(Array.from(x)).toEqual(expected);
        },
      ),
      { numRuns: 500 },
    );
  });
  it('solves a known system (2x + y = 3, x − y = 0 → x = y = 1)', () => {
    const x = new Float64Array(2);
    expect(solveLinearInPlace(Float64Array.from([2, 1, 3, 1, -1, 0]), 2, new Int32Array(2), x)).toBe(true);
    expect(Array.from(x)).toEqual([1, 1]);
  });
});
