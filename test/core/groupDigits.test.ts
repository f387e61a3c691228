/** groupDigits writes numbers exactly as toLocaleString('en') does (the schema's range messages). */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { PHYSICAL_RANGES } from '../../packages/core/src/board/boardSchema.js';
import { groupDigits } from '../../packages/core/src/_internal/groupDigits.js';

describe('groupDigits', () => {
  it('matches toLocaleString("en") on every physical range of the board schema', () => {
    for (const { min, max } of Object.values(PHYSICAL_RANGES)) for (const x of [min, max]) expect(groupDigits(x)).toBe(x.toLocaleString('en'));
  });
  it('matches toLocaleString("en") on integers, short decimals and any double', () => {
    for (const x of [0, -0, 1, 999, 1000, -1000, 12345.5, 1e7, -1e7, 0.01, 0.125, 0.0001, 1e21, 123456789.123]) expect(groupDigits(x)).toBe(x.toLocaleString('en'));
    fc.assert(fc.property(fc.integer({ min: -1e12, max: 1e12 }), fc.integer({ min: 0, max: 3 }), (n, places) => {
      const x = n / 10 ** places;
      expect(groupDigits(x)).toBe(x.toLocaleString('en'));
    }));
    fc.assert(fc.property(fc.double(), (x) => {
      expect(groupDigits(x)).toBe(x.toLocaleString('en'));
    }));
  });
});
