/**
 * Fortescue's symmetrical components, phase-A reference:
 * X0 = (Xa + Xb + Xc)/3, X1 = (Xa + a·Xb + a²·Xc)/3, X2 = (Xa + a²·Xb + a·Xc)/3.
 * For an ACB board the roles of a and a² swap, so that "positive" always means
 * the sequence the supply actually runs in.
 */
import { A_OPERATOR, A_SQUARED, add, mul, scale, type ComplexValue } from '../complex.js';

export interface SequenceSet<T = ComplexValue> {
  readonly zero: T;
  readonly positive: T;
  readonly negative: T;
}

export function sequenceComponents(
  [xa, xb, xc]: readonly [ComplexValue, ComplexValue, ComplexValue],
  sequence: 'ABC' | 'ACB' = 'ABC',
): SequenceSet {
  const [ab, ac] = sequence === 'ABC' ? [A_OPERATOR, A_SQUARED] : [A_SQUARED, A_OPERATOR];
  return {
    zero: scale(add(add(xa, xb), xc), 1 / 3),
    positive: scale(add(add(xa, mul(ab, xb)), mul(ac, xc)), 1 / 3),
    negative: scale(add(add(xa, mul(ac, xb)), mul(ab, xc)), 1 / 3),
  };
}
