/**
 * The linear programme asks each vertex first about the row that ruled out the last one; its answer
 * is still the plain vertex enumeration's to the last bit (support/plainVertexEnumeration.ts), ties
 * and degenerate vertices included.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLinearProgram, type LinearProgram } from '../../packages/core/src/correction/_internal/linearProgram.js';
import { enumerateEveryVertex } from './support/plainVertexEnumeration.js';
import { sameBits } from './support/plainActiveSetEnumeration.js';

/** Decimal data as the sizing produces, small integers for ties and degenerate vertices, and any doubles. */
const real = fc.integer({ min: -5000, max: 5000 }).map((v) => v / 997);
const small = fc.integer({ min: -2, max: 2 });
const entry = fc.oneof(real, small, fc.double({ min: -5, max: 5, noNaN: true }));

describe('linear programme: vertex enumeration', () => {
  it('gives the plain enumeration\'s answer bit for bit on general programmes (no to four unknowns, one to three objectives)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 4 }).chain((d) =>
          fc.record({
            rows: fc.array(fc.array(entry, { minLength: d, maxLength: d }), { maxLength: 13 }),
            bounds: fc.array(entry, { minLength: 13, maxLength: 13 }),
            objectives: fc.array(fc.array(fc.oneof(small, real), { minLength: d, maxLength: d }), { minLength: 1, maxLength: 3 }),
          }),
        ),
        ({ rows, bounds, objectives }) => {
          const lp: LinearProgram = { rows, bounds: rows.map((_, i) => bounds[i]!), objectives };
          expect(sameBits(solveLinearProgram(lp), enumerateEveryVertex(lp))).toBe(true);
        },
      ),
      { numRuns: 400 },
    );
  });

  it('gives the plain enumeration\'s answer bit for bit on programmes shaped like line-target sizing (bands, x ≥ 0, shares, slack)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 3 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            lines: fc.array(fc.record({ g: fc.array(real, { minLength: n, maxLength: n }), high: real, low: real, w: fc.integer({ min: 1, max: 50 }).map((v) => v / 10), highFinite: fc.boolean() }), { minLength: 1, maxLength: 3 }),
            relax: fc.boolean(),
            minShare: fc.constantFrom(0, 0.05, 0.2),
          }),
        ),
        ({ n, lines, relax, minShare }) => {
          // The rows sizeForLineTargets builds: Q − high·|P| ≤ w·s, Q − low·|P| ≥ 0 (or ≥ −w·s), x ≥ 0, s ≥ 0, shares.
          const rows: number[][] = [];
          const bounds: number[] = [];
          for (const { g, high, low, w, highFinite } of lines) {
            if (highFinite) {
              rows.push([...g, -w]);
              bounds.push(-high);
            }
            rows.push([...g.map((v) => -v), relax ? -w : 0]);
            bounds.push(low);
          }
          for (let i = 0; i <= n; i++) {
            const row = new Array<number>(n + 1).fill(0);
            row[i] = -1;
            rows.push(row);
            bounds.push(0);
            if (minShare > 0 && i < n) {
              rows.push([...Array.from({ length: n }, (_, j) => minShare - (j === i ? 1 : 0)), 0]);
              bounds.push(0);
            }
          }
          const lp: LinearProgram = { rows, bounds, objectives: [[...new Array<number>(n).fill(0), 1], [...new Array<number>(n).fill(1), 0]] };
          expect(sameBits(solveLinearProgram(lp), enumerateEveryVertex(lp))).toBe(true);
        },
      ),
      { numRuns: 400 },
    );
  });

  it('keeps the first of tied vertices in the enumeration\'s order', () => {
    // The unit square cut by x + y ≥ 1, minimise x + y: the whole edge from (0, 1) to (1, 0) is optimal.
    // The enumeration meets (0, 1) first (rows 0 and 3: x = 0, y = 1), (1, 0) later (rows 1 and 2), a tie it keeps.
    const lp: LinearProgram = { rows: [[-1, 0], [0, -1], [1, 0], [0, 1], [-1, -1]], bounds: [0, 0, 1, 1, -1], objectives: [[1, 1]] };
    expect(sameBits(solveLinearProgram(lp), enumerateEveryVertex(lp))).toBe(true);
    expect(solveLinearProgram(lp)!.map((v) => v + 0)).toEqual([0, 1]);
  });
});
