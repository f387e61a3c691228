/**
 * The sparse scan's several-vector kernels (sparseComplexLu.ts's `substituteColumnsInOrder`
 * and `multiplyAddColumnsInOrder`, and fourColumnSparse.ts's written-out four-vector forms)
 * against the one-vector substitution and product they stand in for: on random structurally
 * symmetric patterns and values (admittance-like magnitudes over many decades, diagonally
 * weighted as nodal matrices are, right-hand sides with exact zeros as unit vectors have),
 * every vector's result must be the same to the bit, signed zeros included.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analysePattern, factorInPlace, multiplyAddColumnsInOrder, substituteColumnsInOrder, substituteInOrder } from '../../packages/core/src/_internal/sparseComplexLu.js';
import { multiplyAddFourColumnsInOrder, substituteFourColumnsInOrder } from '../../packages/core/src/_internal/fourColumnSparse.js';

// Signed, 0.1 to 1 times a power of ten from 1e-6 to 1e6, and now and then an exact zero.
const value = fc.oneof(
  { weight: 9, arbitrary: fc.tuple(fc.double({ min: 0.1, max: 1, noNaN: true }), fc.integer({ min: -6, max: 6 }), fc.boolean()).map(([m, e, minus]) => (minus ? -m : m) * 10 ** e) },
  { weight: 1, arbitrary: fc.constant(0) },
);
// Right-hand sides: mostly zeros, as the scan's unit vectors.
const rhs = fc.oneof({ weight: 2, arbitrary: fc.constant(0) }, { weight: 1, arbitrary: value });

const caseArb = fc.integer({ min: 1, max: 14 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    links: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 })), { maxLength: 3 * n }),
    values: fc.array(value, { minLength: 2 * n * n, maxLength: 2 * n * n }),
    rhsRe: fc.array(rhs, { minLength: 4 * n, maxLength: 4 * n }),
    rhsIm: fc.array(rhs, { minLength: 4 * n, maxLength: 4 * n }),
  }),
);

/** Vector c of `t` interleaved ones (entry k at k·t + c). */
const column = (x: Float64Array, t: number, c: number) => Float64Array.from({ length: x.length / t }, (_, k) => x[k * t + c]!);
const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((v, k) => Object.is(v, b[k]));

describe('several-vector sparse kernels', () => {
  it('substitute and multiply every vector as the one-vector code does, to the bit', () => {
    let checked = 0;
    fc.assert(
      fc.property(caseArb, ({ n, links, values, rhsRe, rhsIm }) => {
        const pairs = links.filter(([i, j]) => i !== j);
        const p = analysePattern(n, pairs);
        // Symmetric values (as every stamp writes them), the diagonal outweighing its row.
        const re = new Float64Array(p.slotCount);
        const im = new Float64Array(p.slotCount);
        for (const [i, j] of pairs) {
          re[p.slotOf(i, j)] = re[p.slotOf(j, i)] = values[i * n + j]!;
          im[p.slotOf(i, j)] = im[p.slotOf(j, i)] = values[n * n + i * n + j]!;
        }
        for (let i = 0; i < n; i++) {
          const row = pairs.filter(([a, b]) => a === i || b === i).reduce((s, [a, b]) => s + Math.abs(values[a * n + b]!) + Math.abs(values[n * n + a * n + b]!), 0);
          re[p.slotOf(i, i)] = values[i * n + i]! + row + 1e-3;
          im[p.slotOf(i, i)] = values[n * n + i * n + i]!;
        }
        const lu = { re: Float64Array.from(re), im: Float64Array.from(im) };
        const scale = Math.max(...Array.from(p.diagonal, (d) => Math.abs(re[d]!) + Math.abs(im[d]!)));
        fc.pre(factorInPlace(p, lu.re, lu.im, 1e-11, scale) < 0);
        checked++;
        for (const t of [1, 3, 4]) {
          const xRe = Float64Array.from(rhsRe.slice(0, n * t));
          const xIm = Float64Array.from(rhsIm.slice(0, n * t));
          // One vector at a time, as the scan solved before.
          const alone = Array.from({ length: t }, (_, c) => {
            const vRe = column(xRe, t, c);
            const vIm = column(xIm, t, c);
            substituteInOrder(p, lu.re, lu.im, vRe, vIm, 0);
            const yRe = new Float64Array(n);
            const yIm = new Float64Array(n);
            multiplyAddColumnsInOrder(p, re, im, vRe, vIm, 1, yRe, yIm);
            return { vRe, vIm, yRe, yIm };
          });
          const forms = [
            (aRe: Float64Array, aIm: Float64Array) => substituteColumnsInOrder(p, lu.re, lu.im, aRe, aIm, t, new Float64Array(t), new Float64Array(t)),
            ...(t === 4 ? [(aRe: Float64Array, aIm: Float64Array) => substituteFourColumnsInOrder(p, lu.re, lu.im, aRe, aIm)] : []),
          ];
          const products = [
            (aRe: Float64Array, aIm: Float64Array, yRe: Float64Array, yIm: Float64Array) => multiplyAddColumnsInOrder(p, re, im, aRe, aIm, t, yRe, yIm),
            ...(t === 4 ? [(aRe: Float64Array, aIm: Float64Array, yRe: Float64Array, yIm: Float64Array) => multiplyAddFourColumnsInOrder(p, re, im, aRe, aIm, yRe, yIm)] : []),
          ];
          for (const substitute of forms) {
            const aRe = Float64Array.from(xRe);
            const aIm = Float64Array.from(xIm);
            substitute(aRe, aIm);
            alone.forEach((v, c) => {
              expect(same(column(aRe, t, c), v.vRe)).toBe(true);
              expect(same(column(aIm, t, c), v.vIm)).toBe(true);
            });
            for (const multiply of products) {
              const yRe = new Float64Array(n * t);
              const yIm = new Float64Array(n * t);
              multiply(aRe, aIm, yRe, yIm);
              alone.forEach((v, c) => {
                expect(same(column(yRe, t, c), v.yRe)).toBe(true);
                expect(same(column(yIm, t, c), v.yIm)).toBe(true);
              });
            }
          }
        }
      }),
      { numRuns: 600 },
    );
    expect(checked).toBeGreaterThan(300);
  });
});
