/**
 * The one tolerance rule of the correction tests: |actual − expected| ≤
 * abs + rel·|expected|. The absolute term keeps values that should be zero from
 * failing on rounding; the relative term scales with the quantity (V, kvar, A).
 */
import { expect } from 'vitest';

export interface Tolerance {
  readonly rel: number;
  readonly abs: number;
}

export function expectClose(actual: number, expected: number, tol: Tolerance, what = 'value'): void {
  const limit = tol.abs + tol.rel * Math.abs(expected);
  const error = Math.abs(actual - expected);
  if (!(error <= limit)) expect.fail(`${what}: ${actual} differs from ${expected} by ${error.toExponential(3)} (allowed ${limit.toExponential(3)})`);
}

export const relativeError = (actual: number, expected: number): number => Math.abs(actual - expected) / Math.abs(expected);
