/**
 * Tolerance checks for numerical results.
 *
 * Every check has two terms, |actual − expected| ≤ abs + rel·|expected|:
 * the relative term scales with the quantity (a 400 A line current and a 2 A
 * branch current get the same number of correct digits), the absolute term
 * covers quantities that should be zero, where a relative bound alone could
 * never pass and a flat epsilon would mean nothing. Callers pick `abs` from the
 * size of the problem (e.g. 1e-9 × the largest current on the board), never a
 * bare constant.
 */
import type { ComplexValue } from '@trivar/core';
import { cAbs, cSub } from './complexMath.js';

export interface Tolerance {
  /** Allowed error as a fraction of |expected|. */
  readonly rel: number;
  /** Allowed error in the quantity's own unit, added to the relative term. */
  readonly abs: number;
}

/**
 * Relative disagreement |a − e| / max(|e|, floor), the figure reports quote;
 * `floor` keeps quantities that are (nearly) zero from dividing by noise.
 */
export function complexRelativeError(actual: ComplexValue, expected: ComplexValue, floor: number): number {
  return cAbs(cSub(actual, expected)) / Math.max(cAbs(expected), floor);
}

/** |a − e| / |e| for a quantity that is not zero (the figure a closing note quotes). */
export const relativeError = (actual: number, expected: number): number => Math.abs(actual - expected) / Math.abs(expected);

const describeTolerance = ({ rel, abs }: Tolerance) => `rel ${rel.toExponential(1)}, abs ${abs.toExponential(1)}`;

/** Fails unless |actual − expected| ≤ abs + rel·|expected| (and both are finite). */
export function expectClose(actual: number, expected: number, tolerance: Tolerance, what = 'value'): void {
  const error = Math.abs(actual - expected);
  const allowed = tolerance.abs + tolerance.rel * Math.abs(expected);
  if (!(Number.isFinite(actual) && Number.isFinite(expected) && error <= allowed))
    throw new Error(
      `${what}: got ${actual}, expected ${expected} (error ${error.toExponential(3)} > allowed ${allowed.toExponential(3)}; ${describeTolerance(tolerance)})`,
    );
}

/**
 * Complex version: the error is the modulus of the difference, so magnitude
 * and angle are held together (|ΔI| ≤ abs + rel·|I|).
 */
export function expectComplexClose(actual: ComplexValue, expected: ComplexValue, tolerance: Tolerance, what = 'value'): void {
  const error = cAbs(cSub(actual, expected));
  const allowed = tolerance.abs + tolerance.rel * cAbs(expected);
  const finite = [actual.re, actual.im, expected.re, expected.im].every(Number.isFinite);
  if (!(finite && error <= allowed))
    throw new Error(
      `${what}: got ${fmt(actual)}, expected ${fmt(expected)} (error ${error.toExponential(3)} > allowed ${allowed.toExponential(3)}; ${describeTolerance(tolerance)})`,
    );
}

const fmt = (z: ComplexValue) => `${z.re} ${z.im < 0 ? '−' : '+'} j${Math.abs(z.im)}`;
