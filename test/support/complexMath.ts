/**
 * Complex arithmetic for the tests. Core's own helpers are not used on purpose:
 * a law checked with the arithmetic under test could share its bugs.
 */
import type { ComplexValue } from '@trivar/core';

export const c = (re: number, im = 0): ComplexValue => ({ re, im });
export const C0: ComplexValue = c(0, 0);
export const cAdd = (a: ComplexValue, b: ComplexValue): ComplexValue => c(a.re + b.re, a.im + b.im);
export const cSub = (a: ComplexValue, b: ComplexValue): ComplexValue => c(a.re - b.re, a.im - b.im);
export const cMul = (a: ComplexValue, b: ComplexValue): ComplexValue => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
export const cScale = (a: ComplexValue, k: number): ComplexValue => c(a.re * k, a.im * k);
export const cConj = (a: ComplexValue): ComplexValue => c(a.re, -a.im);
export const cAbs = (a: ComplexValue): number => Math.hypot(a.re, a.im);
export const cDiv = (a: ComplexValue, b: ComplexValue): ComplexValue => {
  const d = b.re * b.re + b.im * b.im;
  return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d);
};
export const cInv = (a: ComplexValue): ComplexValue => cDiv(c(1), a);
export const cSum = (values: readonly ComplexValue[]): ComplexValue => values.reduce(cAdd, C0);
/** e^{jθ}·r with θ in degrees. */
export const cPolarDeg = (magnitude: number, angleDeg: number): ComplexValue =>
  c(magnitude * Math.cos((angleDeg * Math.PI) / 180), magnitude * Math.sin((angleDeg * Math.PI) / 180));
/** Complex power V·conj(I), VA. */
export const cPower = (v: ComplexValue, i: ComplexValue): ComplexValue => cMul(v, cConj(i));
