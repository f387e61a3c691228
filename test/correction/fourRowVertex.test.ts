/**
 * The written-out four-row elimination the line-target LP uses gives solveLinearInPlace's answer bit for bit,
 * including which systems count as singular, which pivot wins a tie of magnitudes, and rows picked out of
 * a larger set in any order.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLinearInPlace } from '../../packages/core/src/correction/_internal/realMatrix.js';
import { solveFourRows } from '../../packages/core/src/correction/_internal/fourRowVertex.js';

/** Small integers give exact ties of pivot magnitude, zero columns and singular systems; doubles the general case. */
const entry = fc.oneof(fc.integer({ min: -2, max: 2 }), fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.integer({ min: -5000, max: 5000 }).map((v) => v / 997), fc.constant(1e-14));

function general(flat: Float64Array, rhs: Float64Array, rows: readonly number[]): { ok: boolean; x: number[] } {
  const m = new Float64Array(20);
  rows.forEach((row, r) => {
    for (let c = 0; c < 4; c++) m[r * 5 + c] = flat[4 * row + c]!;
    m[r * 5 + 4] = rhs[row]!;
  });
  const x = new Float64Array(4);
  const ok = solveLinearInPlace(m, 4, new Int32Array(4), x);
  return { ok, x: Array.from(x) };
}

describe('solveFourRows', () => {
  it('equals solveLinearInPlace for n = 4 exactly, singular verdicts included', () => {
    fc.assert(
      fc.property(
        fc.array(entry, { minLength: 24, maxLength: 24 }),
        fc.array(entry, { minLength: 6, maxLength: 6 }),
        fc.uniqueArray(fc.integer({ min: 0, max: 5 }), { minLength: 4, maxLength: 4 }),
        (coefficients, bounds, rows) => {
          const flat = Float64Array.from(coefficients);
          const rhs = Float64Array.from(bounds);
          const x = new Float64Array(4);
          const ok = solveFourRows(flat, rhs, rows[0]!, rows[1]!, rows[2]!, rows[3]!, x);
          const expected = general(flat, rhs, rows);
          expect(ok).toBe(expected.ok);
          if (ok) expect(Object.is(x[0], expected.x[0]) && Object.is(x[1], expected.x[1]) && Object.is(x[2], expected.x[2]) && Object.is(x[3], expected.x[3])).toBe(true);
        },
      ),
      { numRuns: 3000 },
    );
  });

  it('solves a known system (x = 1, y = 2, z = 3, w = 4 from four independent rows)', () => {
    // x + y = 3, y + z = 5, z + w = 7, x + w = 5 (rows 1..4 of a five-row set; row 0 is not used).
    const flat = Float64Array.from([9, 9, 9, 9, 1, 1, 0, 0, 0, 1, 1, 0, 0, 0, 1, 1, 1, 0, 0, 1]);
    const rhs = Float64Array.from([0, 3, 5, 7, 5]);
    const x = new Float64Array(4);
    // Singular: the four rows are dependent ((1) − (2) + (3) − (4) = 0).
    expect(solveFourRows(flat, rhs, 1, 2, 3, 4, x)).toBe(false);
    const flat2 = Float64Array.from([1, 0, 0, 0, 1, 1, 0, 0, 0, 1, 1, 0, 0, 0, 1, 1]);
    expect(solveFourRows(flat2, Float64Array.from([1, 3, 5, 7]), 0, 1, 2, 3, x)).toBe(true);
    expect(Array.from(x)).toEqual([1, 2, 3, 4]);
  });
});
