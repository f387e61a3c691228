/**
 * Plain complex numbers `{ re, im }` and the few operations the solver needs.
 *
 * Why not mathjs's Complex here: every public result must be plain,
 * JSON-serialisable data, and mathjs arithmetic goes through typed-function
 * dispatch on class instances. These helpers keep phasors as plain data end to
 * end; mathjs is used where it does real work (the LU solve, see
 * `_internal/linearSolve.ts`).
 */

/** A complex number as plain data. Phasors are RMS values. */
export interface ComplexValue {
  readonly re: number;
  readonly im: number;
}

/** A phasor ready for people: rectangular and polar parts (angle in degrees). */
export interface Phasor extends ComplexValue {
  readonly magnitude: number;
  readonly angleDeg: number;
}

export const ZERO: ComplexValue = Object.freeze({ re: 0, im: 0 });

export const complex = (re: number, im = 0): ComplexValue => ({ re, im });
export const add = (a: ComplexValue, b: ComplexValue): ComplexValue => ({ re: a.re + b.re, im: a.im + b.im });
export const sub = (a: ComplexValue, b: ComplexValue): ComplexValue => ({ re: a.re - b.re, im: a.im - b.im });
export const mul = (a: ComplexValue, b: ComplexValue): ComplexValue => ({
  re: a.re * b.re - a.im * b.im,
  im: a.re * b.im + a.im * b.re,
});
export const scale = (a: ComplexValue, k: number): ComplexValue => ({ re: a.re * k, im: a.im * k });
export const conj = (a: ComplexValue): ComplexValue => ({ re: a.re, im: -a.im });
export const neg = (a: ComplexValue): ComplexValue => ({ re: -a.re, im: -a.im });
export const abs = (a: ComplexValue): number => Math.hypot(a.re, a.im);
export const absSquared = (a: ComplexValue): number => a.re * a.re + a.im * a.im;
export const arg = (a: ComplexValue): number => Math.atan2(a.im, a.re);

export function div(a: ComplexValue, b: ComplexValue): ComplexValue {
  const d = absSquared(b);
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
}

export const inverse = (a: ComplexValue): ComplexValue => div({ re: 1, im: 0 }, a);

/** e^{jθ}·r, θ in radians. */
export const polar = (magnitude: number, angleRad: number): ComplexValue => ({
  re: magnitude * Math.cos(angleRad),
  im: magnitude * Math.sin(angleRad),
});

export const degToRad = (deg: number): number => (deg * Math.PI) / 180;
export const radToDeg = (rad: number): number => (rad * 180) / Math.PI;

export function sum(values: readonly ComplexValue[]): ComplexValue {
  let re = 0;
  let im = 0;
  for (const v of values) {
    re += v.re;
    im += v.im;
  }
  return { re, im };
}

export const isFiniteComplex = (a: ComplexValue): boolean => Number.isFinite(a.re) && Number.isFinite(a.im);

/**
 * Adds magnitude and angle (degrees, in (-180, 180]) to a complex value.
 * @example toPhasor({ re: 0, im: 2 }) //=> { re: 0, im: 2, magnitude: 2, angleDeg: 90 }
 */
export function toPhasor(a: ComplexValue): Phasor {
  const magnitude = abs(a);
  // A zero phasor has no angle; report 0 rather than atan2's signed zeros.
  const angleDeg = magnitude === 0 ? 0 : radToDeg(arg(a));
  return { re: a.re, im: a.im, magnitude, angleDeg: angleDeg === -180 ? 180 : angleDeg };
}

/** The Fortescue operator a = e^{j120°}. */
export const A_OPERATOR: ComplexValue = Object.freeze(polar(1, (2 * Math.PI) / 3));
export const A_SQUARED: ComplexValue = Object.freeze(polar(1, (-2 * Math.PI) / 3));
