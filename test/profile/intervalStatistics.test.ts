import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { percentilesOf, selectRank } from '../../packages/core/src/profile/intervalStatistics.js';

/** Nearest rank by the definition: sort, take sorted[ceil(share·n) − 1]. */
const byDefinition = (x: number[], share: number) => [...x].sort((a, b) => a - b)[Math.max(0, Math.ceil(share * x.length) - 1)]!;

describe('percentilesOf (selection, not a sort)', () => {
  it('gives the nearest-rank value of a sorted copy, and the first interval holding it', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(fc.integer({ min: -5, max: 5 }), fc.double({ min: -1e6, max: 1e6, noNaN: true })), { minLength: 1, maxLength: 300 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 4 }),
        (values, shares) => {
          const x = Float64Array.from(values);
          const before = Array.from(x);
          const got = percentilesOf(x, shares);
          shares.forEach((share, k) => {
            // −0 and +0 are one reading (the data may hold both, and a sort may put either first): compared by value.
            const want = byDefinition(values, share);
            expect(got[k]!.value === want, `${got[k]!.value} against ${want}`).toBe(true);
            expect(got[k]!.index).toBe(values.findIndex((v) => v === got[k]!.value));
          });
          // The input column is left as it was.
          expect(Array.from(x)).toEqual(before);
        },
      ),
    );
  });

  it('P95 and P99 of 1..1000 are 950 and 990 (nearest rank)', () => {
    const x = Float64Array.from({ length: 1000 }, (_, i) => 1000 - i);
    expect(percentilesOf(x, [0.95, 0.99]).map((p) => p.value)).toEqual([950, 990]);
    expect(percentilesOf(x, [0.99])[0]!.index).toBe(10);
  });

  it('selectRank puts the k-th smallest at k with smaller values before it', () => {
    const a = Float64Array.from([5, 1, 4, 1, 5, 9, 2, 6, 5, 3]);
    // Sorted: 1 1 2 3 4 5 5 5 6 9.
    expect(selectRank(a, 3, 0, a.length - 1)).toBe(3);
    expect(a[3]).toBe(3);
    expect(Math.max(...a.subarray(0, 3))).toBeLessThanOrEqual(3);
    expect(Math.min(...a.subarray(4))).toBeGreaterThanOrEqual(3);
  });
});
