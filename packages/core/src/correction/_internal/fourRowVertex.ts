/**
 * The vertex of four constraint rows in four unknowns: `solveLinearInPlace` for n = 4, written out.
 *
 * Why written out: the line-target LP (linearProgram.ts) solves 210 of these per programme and a
 * `trivar correct` run solves a dozen or so programmes, too few for V8 to optimise the loop early, so
 * most of them run in the interpreter and baseline code, where every loop test and index sum is paid
 * for. With this and the nested loops in linearProgram.ts, the programmes of `trivar correct
 * hillside-workshop` (16 of them, 3,360 vertices) took 9.9 ms instead of 18.6 (medians of 8 runs,
 * 2026-12-03). It performs the same floating-point
 * operations in the same order as `solveLinearInPlace` (partial pivoting by position, first largest
 * pivot wins, pivots at or below 1e-13 of the largest entry count as singular), so it gives the same
 * bits and the same verdict on singular systems (test/correction/fourRowVertex.test.ts). Entries the
 * general code computes but never reads again (a column below its pivot) are not computed here.
 *
 * Row r of the system is coefficients `flat[4r .. 4r+3]` and right-hand side `rhs[r]`.
 */
const RELATIVE_PIVOT = 1e-13;

/** Solves rows r0..r3 (in that order) into `x`; false when the system counts as singular. */
export function solveFourRows(flat: Float64Array, rhs: Float64Array, r0: number, r1: number, r2: number, r3: number, x: Float64Array): boolean {
  // Position p's row: ap, bp, cp, dp (coefficients), ep (right-hand side).
  let a0 = flat[4 * r0]!, b0 = flat[4 * r0 + 1]!, c0 = flat[4 * r0 + 2]!, d0 = flat[4 * r0 + 3]!, e0 = rhs[r0]!;
  let a1 = flat[4 * r1]!, b1 = flat[4 * r1 + 1]!, c1 = flat[4 * r1 + 2]!, d1 = flat[4 * r1 + 3]!, e1 = rhs[r1]!;
  let a2 = flat[4 * r2]!, b2 = flat[4 * r2 + 1]!, c2 = flat[4 * r2 + 2]!, d2 = flat[4 * r2 + 3]!, e2 = rhs[r2]!;
  let a3 = flat[4 * r3]!, b3 = flat[4 * r3 + 1]!, c3 = flat[4 * r3 + 2]!, d3 = flat[4 * r3 + 3]!, e3 = rhs[r3]!;
  const largest = Math.max(
    Math.abs(a0), Math.abs(b0), Math.abs(c0), Math.abs(d0),
    Math.abs(a1), Math.abs(b1), Math.abs(c1), Math.abs(d1),
    Math.abs(a2), Math.abs(b2), Math.abs(c2), Math.abs(d2),
    Math.abs(a3), Math.abs(b3), Math.abs(c3), Math.abs(d3),
  );
  if (largest === 0) return false;
  const limit = RELATIVE_PIVOT * largest;
  let t: number;

  // Column a: pivot among positions 0..3, swapped into position 0.
  let p = 0;
  let big = Math.abs(a0);
  if (Math.abs(a1) > big) { p = 1; big = Math.abs(a1); }
  if (Math.abs(a2) > big) { p = 2; big = Math.abs(a2); }
  if (Math.abs(a3) > big) { p = 3; big = Math.abs(a3); }
  if (big <= limit) return false;
  if (p === 1) { t = a0; a0 = a1; a1 = t; t = b0; b0 = b1; b1 = t; t = c0; c0 = c1; c1 = t; t = d0; d0 = d1; d1 = t; t = e0; e0 = e1; e1 = t; }
  else if (p === 2) { t = a0; a0 = a2; a2 = t; t = b0; b0 = b2; b2 = t; t = c0; c0 = c2; c2 = t; t = d0; d0 = d2; d2 = t; t = e0; e0 = e2; e2 = t; }
  else if (p === 3) { t = a0; a0 = a3; a3 = t; t = b0; b0 = b3; b3 = t; t = c0; c0 = c3; c3 = t; t = d0; d0 = d3; d3 = t; t = e0; e0 = e3; e3 = t; }
  let f = a1 / a0;
  if (f !== 0) { b1 = b1 - f * b0; c1 = c1 - f * c0; d1 = d1 - f * d0; e1 = e1 - f * e0; }
  f = a2 / a0;
  if (f !== 0) { b2 = b2 - f * b0; c2 = c2 - f * c0; d2 = d2 - f * d0; e2 = e2 - f * e0; }
  f = a3 / a0;
  if (f !== 0) { b3 = b3 - f * b0; c3 = c3 - f * c0; d3 = d3 - f * d0; e3 = e3 - f * e0; }

  // Column b: positions 1..3.
  p = 1;
  big = Math.abs(b1);
  if (Math.abs(b2) > big) { p = 2; big = Math.abs(b2); }
  if (Math.abs(b3) > big) { p = 3; big = Math.abs(b3); }
  if (big <= limit) return false;
  if (p === 2) { t = b1; b1 = b2; b2 = t; t = c1; c1 = c2; c2 = t; t = d1; d1 = d2; d2 = t; t = e1; e1 = e2; e2 = t; }
  else if (p === 3) { t = b1; b1 = b3; b3 = t; t = c1; c1 = c3; c3 = t; t = d1; d1 = d3; d3 = t; t = e1; e1 = e3; e3 = t; }
  f = b2 / b1;
  if (f !== 0) { c2 = c2 - f * c1; d2 = d2 - f * d1; e2 = e2 - f * e1; }
  f = b3 / b1;
  if (f !== 0) { c3 = c3 - f * c1; d3 = d3 - f * d1; e3 = e3 - f * e1; }

  // Column c: positions 2..3.
  p = 2;
  big = Math.abs(c2);
  if (Math.abs(c3) > big) { p = 3; big = Math.abs(c3); }
  if (big <= limit) return false;
  if (p === 3) { t = c2; c2 = c3; c3 = t; t = d2; d2 = d3; d3 = t; t = e2; e2 = e3; e3 = t; }
  f = c3 / c2;
  if (f !== 0) { d3 = d3 - f * d2; e3 = e3 - f * e2; }

  // Column d: position 3 alone.
  if (Math.abs(d3) <= limit) return false;

  // Back-substitution, each sum taken left to right as solveLinearInPlace takes it.
  const x3 = e3 / d3;
  const x2 = (e2 - d2 * x3) / c2;
  const x1 = (e1 - c1 * x2 - d1 * x3) / b1;
  const x0 = (e0 - b0 * x1 - c0 * x2 - d0 * x3) / a0;
  x[0] = x0;
  x[1] = x1;
  x[2] = x2;
  x[3] = x3;
  return true;
}
