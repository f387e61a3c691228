/**
 * The written-out four-unknown solve (fourUnknownLu.ts) against the sparse LU it stands in
 * for (sparseComplexLu.ts): on random structurally symmetric patterns of four unknowns and
 * random values (admittance-like magnitudes over many decades, diagonally weighted as nodal
 * matrices are), the solution and every factor the pattern's slot lists reach must be the
 * same to the bit, and a pivot the sparse factorisation refuses the written-out one refuses
 * at the same position.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analysePattern, factorInPlace, substituteInOrder, type SparsePattern } from '../../packages/core/src/_internal/sparseComplexLu.js';
import { factorSolveFourInPlace, withPositionalSlots } from '../../packages/core/src/_internal/fourUnknownLu.js';

const PAIRS: [number, number][] = [[0, 1], [0, 2], [0, 3], [1, 2], [1, 3], [2, 3]];

// Signed, 0.1 to 1 times a power of ten from 1e-6 to 1e6, and now and then an exact zero.
const value = fc.oneof(
  { weight: 9, arbitrary: fc.tuple(fc.double({ min: 0.1, max: 1, noNaN: true }), fc.integer({ min: -6, max: 6 }), fc.boolean()).map(([m, e, minus]) => (minus ? -m : m) * 10 ** e) },
  { weight: 1, arbitrary: fc.constant(0) },
);

const caseArb = fc.record({
  links: fc.array(fc.boolean(), { minLength: 6, maxLength: 6 }),
  offRe: fc.array(value, { minLength: 6, maxLength: 6 }),
  offIm: fc.array(value, { minLength: 6, maxLength: 6 }),
  diagRe: fc.array(value, { minLength: 4, maxLength: 4 }),
  diagIm: fc.array(value, { minLength: 4, maxLength: 4 }),
  dominant: fc.boolean(),
  rhsRe: fc.array(value, { minLength: 4, maxLength: 4 }),
  rhsIm: fc.array(value, { minLength: 4, maxLength: 4 }),
});

type Case = typeof caseArb extends fc.Arbitrary<infer T> ? T : never;

/** The matrix of `c` in `p`'s slots, and the right-hand side by elimination position. */
function fill(p: SparsePattern, c: Case, pairs: [number, number][]): { re: Float64Array; im: Float64Array; xRe: Float64Array; xIm: Float64Array } {
  const re = new Float64Array(p.slotCount);
  const im = new Float64Array(p.slotCount);
  pairs.forEach(([i, j]) => {
    const at = PAIRS.findIndex(([a, b]) => a === i && b === j);
    re[p.slotOf(i, j)] = re[p.slotOf(j, i)] = c.offRe[at]!;
    im[p.slotOf(i, j)] = im[p.slotOf(j, i)] = c.offIm[at]!;
  });
  for (let i = 0; i < 4; i++) {
    // A nodal matrix's diagonal outweighs its row (the links sum into it) unless the case asks otherwise.
    const row = c.dominant ? pairs.filter(([a, b]) => a === i || b === i).reduce((s, [a, b]) => s + Math.hypot(c.offRe[PAIRS.findIndex(([x, y]) => x === a && y === b)]!, c.offIm[PAIRS.findIndex(([x, y]) => x === a && y === b)]!), 0) : 0;
    re[p.slotOf(i, i)] = c.diagRe[i]! + Math.sign(c.diagRe[i]! || 1) * row;
    im[p.slotOf(i, i)] = c.diagIm[i]!;
  }
  const xRe = Float64Array.from({ length: 4 }, (_, k) => c.rhsRe[p.order[k]!]!);
  const xIm = Float64Array.from({ length: 4 }, (_, k) => c.rhsIm[p.order[k]!]!);
  return { re, im, xRe, xIm };
}

/** ±0 alike: an exact zero's sign is the one thing the two may differ in. */
const bits = (a: Float64Array) => Array.from(a, (v) => (v === 0 ? 0 : v));

describe('four-unknown LU written out', () => {
  it('gives the sparse LU’s solution and factors to the bit, and refuses the same pivot', () => {
    let solved = 0;
    fc.assert(
      fc.property(caseArb, (c) => {
        const pairs = PAIRS.filter((_, k) => c.links[k]);
        const sparse = analysePattern(4, pairs);
        const dense = withPositionalSlots(sparse);
        const s = fill(sparse, c, pairs);
        const d = fill(dense, c, pairs);
        const scale = Math.max(...[0, 1, 2, 3].map((i) => Math.abs(s.re[sparse.slotOf(i, i)]!) + Math.abs(s.im[sparse.slotOf(i, i)]!)));
        const floor = 1e-11 * scale;
        const failedSparse = factorInPlace(sparse, s.re, s.im, 1e-11, scale);
        const failedDense = factorSolveFourInPlace(d.re, d.im, d.xRe, d.xIm, floor * floor);
        expect(failedDense < 0 ? -1 : sparse.order[failedDense]).toBe(failedSparse);
        if (failedSparse >= 0) return;
        solved++;
        substituteInOrder(sparse, s.re, s.im, s.xRe, s.xIm, 0);
        expect(bits(d.xRe)).toEqual(bits(s.xRe));
        expect(bits(d.xIm)).toEqual(bits(s.xIm));
        // Every slot the pattern's lists reach holds the same factor (transfer impedances read them).
        for (let i = 0; i < 4; i++)
          for (let j = 0; j < 4; j++) {
            const slot = sparse.slotOf(i, j);
            if (slot < 0) continue;
            const zeroSigned = (v: number) => (v === 0 ? 0 : v);
            expect([d.re[dense.slotOf(i, j)]!, d.im[dense.slotOf(i, j)]!].map(zeroSigned)).toEqual([s.re[slot]!, s.im[slot]!].map(zeroSigned));
          }
      }),
      { numRuns: 2000 },
    );
    expect(solved).toBeGreaterThan(1000);
  });

  it('renumbers the slot lists positionally and keeps the elimination order', () => {
    const sparse = analysePattern(4, [[0, 3], [1, 3], [2, 3]]);
    const dense = withPositionalSlots(sparse);
    expect(Array.from(dense.order)).toEqual(Array.from(sparse.order));
    expect(Array.from(dense.diagonal)).toEqual([0, 5, 10, 15]);
    expect(dense.slotCount).toBe(16);
    // The star point (unknown 3) goes last: its entries sit in row and column 3.
    expect(dense.slotOf(3, 3)).toBe(15);
    expect(() => withPositionalSlots(analysePattern(3, [[0, 1]]))).toThrow(/four unknowns/);
  });
});
