/**
 * The sequence components (fortescueComponents, the unchecked core of the public sequenceComponents)
 * are written out in plain arithmetic (no object per step); they must give, to the bit, what
 * Fortescue's formulas composed of the complex helpers give, infinities included.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { A_OPERATOR, A_SQUARED, add, mul, scale, type ComplexValue } from '../../packages/core/src/complex.js';
import { fortescueComponents as sequenceComponents } from '../../packages/core/src/analysis/symmetricalComponents.js';

function composed([xa, xb, xc]: readonly [ComplexValue, ComplexValue, ComplexValue], sequence: 'ABC' | 'ACB') {
  const [ab, ac] = sequence === 'ABC' ? [A_OPERATOR, A_SQUARED] : [A_SQUARED, A_OPERATOR];
  return {
    zero: scale(add(add(xa, xb), xc), 1 / 3),
    positive: scale(add(add(xa, mul(ab, xb)), mul(ac, xc)), 1 / 3),
    negative: scale(add(add(xa, mul(ac, xb)), mul(ab, xc)), 1 / 3),
  };
}

const bits = (s: { zero: ComplexValue; positive: ComplexValue; negative: ComplexValue }) => [s.zero, s.positive, s.negative].flatMap((x) => [x.re, x.im]);
const part = fc.oneof(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), fc.double({ noNaN: true }), fc.constantFrom(0, -0, 1e-300, -5e-324));
const complex = fc.record({ re: part, im: part });

describe('sequenceComponents written out', () => {
  it('equals the composed formulas bit for bit, either sequence', () => {
    fc.assert(
      fc.property(fc.tuple(complex, complex, complex), fc.constantFrom('ABC' as const, 'ACB' as const), (x, sequence) => {
        const written = bits(sequenceComponents(x, sequence));
        const plain = bits(composed(x, sequence));
        // Object.is: −0 and 0 told apart, NaN (from infinities) equal to NaN.
        written.forEach((v, k) => expect(Object.is(v, plain[k]), `component ${k}: ${v} vs ${plain[k]}`).toBe(true));
      }),
      { numRuns: 2000 },
    );
  });

  it('reads a balanced ABC set as positive sequence only', () => {
    const v = 230;
    const set = sequenceComponents([{ re: v, im: 0 }, scale(A_SQUARED, v), scale(A_OPERATOR, v)], 'ABC');
    expect(set.positive.re).toBeCloseTo(v, 9);
    expect(Math.hypot(set.negative.re, set.negative.im)).toBeLessThan(1e-9);
    expect(Math.hypot(set.zero.re, set.zero.im)).toBeLessThan(1e-9);
  });
});
