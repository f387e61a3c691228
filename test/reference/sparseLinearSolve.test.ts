/**
 * The compiled solver's sparse LU (fixed pattern, minimum-degree order, no pivoting)
 * against a general-purpose library: mathjs 15 `lusolve` (dense LU with partial
 * pivoting), on random nodal-style systems — structurally symmetric, sparse, and
 * diagonally dominant like an admittance matrix with a path to the reference.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { create, complexDependencies, lusolveDependencies, type FactoryFunctionMap, type MathArray, type Complex } from 'mathjs';
import { analysePattern, factorInPlace, solveFactored } from '../../packages/core/src/_internal/sparseComplexLu.js';

const math = create({ complexDependencies, lusolveDependencies } as FactoryFunctionMap);
const part = fc.integer({ min: -100_000, max: 100_000 }).map((k) => k / 1000);
const complexArb = fc.record({ re: part, im: part });

const systemArb = fc.integer({ min: 1, max: 30 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    edges: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 }), complexArb), { maxLength: 3 * n }),
    diagonal: fc.array(complexArb, { minLength: n, maxLength: n }),
    rhs: fc.array(complexArb, { minLength: n, maxLength: n }),
  }),
);

describe('sparse complex LU', () => {
  it('agrees with mathjs lusolve on random sparse nodal systems', () => {
    fc.assert(
      fc.property(systemArb, ({ n, edges, diagonal, rhs }) => {
        const a = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? { re: diagonal[i]!.re + 1000 * (1 + edges.length), im: diagonal[i]!.im } : { re: 0, im: 0 })));
        for (const [i, j, y] of edges) {
          if (i === j) continue;
          a[i]![j] = { re: a[i]![j]!.re - y.re, im: a[i]![j]!.im - y.im };
          a[j]![i] = { re: a[j]![i]!.re - y.re, im: a[j]![i]!.im - y.im };
        }
        const pattern = analysePattern(n, edges.map(([i, j]) => [i, j] as const));
        const re = new Float64Array(pattern.slotCount);
        const im = new Float64Array(pattern.slotCount);
        a.forEach((row, i) =>
          row.forEach((v, j) => {
            const s = pattern.slotOf(i, j);
            if (s >= 0) {
              re[s] = v.re;
              im[s] = v.im;
            } else expect(v).toEqual({ re: 0, im: 0 });
          }),
        );
        expect(factorInPlace(pattern, re, im, 1e-13, 1)).toBe(-1);
        const bRe = Float64Array.from(rhs, (v) => v.re);
        const bIm = Float64Array.from(rhs, (v) => v.im);
        const xRe = new Float64Array(n);
        const xIm = new Float64Array(n);
        solveFactored(pattern, re, im, bRe, bIm, xRe, xIm);
        const ref = math.lusolve(
          a.map((r) => r.map((v) => math.complex(v.re, v.im))) as unknown as MathArray,
          rhs.map((v) => [math.complex(v.re, v.im)]) as unknown as MathArray,
        ) as unknown as (Complex | number)[][];
        const refX = ref.map(([v]) => (typeof v === 'number' ? { re: v, im: 0 } : { re: v!.re, im: v!.im }));
        const size = Math.max(...refX.map((v) => Math.hypot(v.re, v.im)), 1e-300);
        refX.forEach((v, i) => expect(Math.hypot(xRe[i]! - v.re, xIm[i]! - v.im)).toBeLessThanOrEqual(1e-12 * size));
      }),
      { numRuns: 200 },
    );
  });
  it('eliminates floating star points (degree 3) with no fill beyond their phase triangle', () => {
    // Nodes 0–2 phases, 3–12 star points each joined to all three phases.
    const pairs: [number, number][] = [];
    for (let s = 3; s < 13; s++) for (let ph = 0; ph < 3; ph++) pairs.push([s, ph]);
    const pattern = analysePattern(13, pairs);
    // 13 diagonals, both triangles of the 30 star–phase entries, and the 3 phase–phase pairs as fill.
    expect(pattern.slotCount).toBe(13 + 60 + 6);
    // Work grows linearly: each star's elimination updates at most its 3×3 phase block.
    expect(pattern.updateSlot.length).toBeLessThanOrEqual(9 * 13);
  });
});
