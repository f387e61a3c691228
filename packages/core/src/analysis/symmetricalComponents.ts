/**
 * Fortescue's symmetrical components, phase-A reference:
 * X0 = (Xa + Xb + Xc)/3, X1 = (Xa + a·Xb + a²·Xc)/3, X2 = (Xa + a²·Xb + a·Xc)/3.
 * For an ACB board the roles of a and a² swap, so that "positive" always means
 * the sequence the supply actually runs in.
 */
import { A_OPERATOR, A_SQUARED, type ComplexValue } from '../complex.js';
import { argumentIssueError, checkNumberArgument } from '../_internal/argumentChecks.js';

export interface SequenceSet<T = ComplexValue> {
  readonly zero: T;
  readonly positive: T;
  readonly negative: T;
}

const THIRD = 1 / 3;

const isComplex = (v: unknown): v is ComplexValue => typeof v === 'object' && v !== null && typeof (v as ComplexValue).re === 'number' && typeof (v as ComplexValue).im === 'number';
const isThreePhasors = (x: unknown): x is readonly [ComplexValue, ComplexValue, ComplexValue] => Array.isArray(x) && x.length === 3 && isComplex(x[0]) && isComplex(x[1]) && isComplex(x[2]);

/**
 * The public entry: three phasors with finite parts, a sequence by name. NaN or Infinity in a part
 * is refused here, naming the part, rather than carried into every component as NaN.
 * @throws {InputError} naming `x`, `x[k].re`/`x[k].im` or `sequence`
 */
export function sequenceComponents(x: readonly [ComplexValue, ComplexValue, ComplexValue], sequence: 'ABC' | 'ACB' = 'ABC'): SequenceSet {
  if (!isThreePhasors(x)) throw argumentIssueError('x', 'three complex values [{ re, im }, { re, im }, { re, im }], phases A, B, C', x);
  x.forEach((v, k) => {
    checkNumberArgument(v.re, `x[${k}].re`, 'a finite real part');
    checkNumberArgument(v.im, `x[${k}].im`, 'a finite imaginary part');
  });
  if (sequence !== 'ABC' && sequence !== 'ACB') throw argumentIssueError('sequence', '"ABC" or "ACB"', sequence);
  return fortescueComponents(x, sequence);
}

/**
 * The components without argument checks, for the solver's own phasors (every trial solve of the
 * sizing loops reads these; a NaN there is caught by assertFiniteResult.ts on the result).
 * Written out rather than composed of `add`/`mul`/`scale` (the helpers allocate an object per
 * step): the same operations in the same order as scale(add(add(xa, mul(a, xb)), mul(a², xc)), 1/3),
 * so the same numbers to the bit.
 */
export function fortescueComponents(x: readonly [ComplexValue, ComplexValue, ComplexValue], sequence: 'ABC' | 'ACB' = 'ABC'): SequenceSet {
  const xa = x[0];
  const xb = x[1];
  const xc = x[2];
  const ab = sequence === 'ABC' ? A_OPERATOR : A_SQUARED;
  const ac = sequence === 'ABC' ? A_SQUARED : A_OPERATOR;
  // ab·xb, ac·xc (positive) and ac·xb, ab·xc (negative), as `mul` forms them.
  const abXbRe = ab.re * xb.re - ab.im * xb.im;
  const abXbIm = ab.re * xb.im + ab.im * xb.re;
  const acXcRe = ac.re * xc.re - ac.im * xc.im;
  const acXcIm = ac.re * xc.im + ac.im * xc.re;
  const acXbRe = ac.re * xb.re - ac.im * xb.im;
  const acXbIm = ac.re * xb.im + ac.im * xb.re;
  const abXcRe = ab.re * xc.re - ab.im * xc.im;
  const abXcIm = ab.re * xc.im + ab.im * xc.re;
  return {
    zero: { re: (xa.re + xb.re + xc.re) * THIRD, im: (xa.im + xb.im + xc.im) * THIRD },
    positive: { re: (xa.re + abXbRe + acXcRe) * THIRD, im: (xa.im + abXbIm + acXcIm) * THIRD },
    negative: { re: (xa.re + acXbRe + abXcRe) * THIRD, im: (xa.im + acXbIm + abXcIm) * THIRD },
  };
}
