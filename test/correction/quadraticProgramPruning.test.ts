/**
 * The quadratic programme skips active sets that cannot win; its answer is still the plain
 * enumeration's to the last bit. The reference below is that enumeration as it stood before the
 * skipping (every active set judged, in lexicographic order).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveQuadraticProgram, type QuadraticProgram } from '../../packages/core/src/correction/_internal/quadraticProgram.js';
import { nextSubset, solveLinearInPlace } from '../../packages/core/src/correction/_internal/realMatrix.js';

const TOLERANCE = 1e-12;

function enumerateEveryActiveSet(qp: QuadraticProgram): number[] | null {
  const n = qp.c.length;
  const m = qp.rows.length;
  const norms = qp.rows.map((r) => Math.hypot(...r) || 1);
  const scale = Math.max(1, ...qp.c.map(Math.abs), ...qp.h.flat().map(Math.abs));
  // The programme on typed arrays, read in the loops below: the same values (rows of small integers
  // and of fractions alike), one element kind, so the loops over thousands of active sets stay fast.
  const h = Float64Array.from(qp.h.flat());
  const c = Float64Array.from(qp.c);
  const rows = Float64Array.from(qp.rows.flat());
  const bounds = Float64Array.from(qp.bounds);
  let best: number[] | null = null;
  let bestValue = Infinity;
  // Thousands of KKT systems per call: one typed work area for all (see solveLinearInPlace).
  const largest = n + Math.min(n, m);
  const kkt = new Float64Array(largest * (largest + 1));
  const rowOf = new Int32Array(largest);
  const sol = new Float64Array(largest);
  const hx = new Float64Array(n);
  const active = new Int32Array(Math.min(n, m));
  for (let k = 0; k <= Math.min(n, m); k++) {
    const size = n + k;
    const w = size + 1;
    // Every k-element subset of the constraints in lexicographic order, held in `active`.
    for (let i = 0; i < k; i++) active[i] = i;
    for (let more = true; more; more = nextSubset(active, k, m)) {
      // [H  −Aᵀ] [x]   [−c]
      // [A   0 ] [λ] = [ b]
      kkt.fill(0, 0, size * w);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) kkt[i * w + j] = h[i * n + j]!;
        kkt[i * w + size] = -c[i]!;
      }
      for (let a = 0; a < k; a++) {
        const row = active[a]! * n;
        for (let j = 0; j < n; j++) {
          kkt[(n + a) * w + j] = rows[row + j]!;
          kkt[j * w + n + a] = -rows[row + j]!;
        }
        kkt[(n + a) * w + size] = bounds[active[a]!]!;
      }
      if (!solveLinearInPlace(kkt, size, rowOf, sol)) continue;
      let negative = false;
      for (let a = 0; a < k; a++) if (sol[n + a]! < -TOLERANCE * scale) negative = true;
      if (negative) continue;
      let xScale = 1;
      for (let j = 0; j < n; j++) xScale = Math.max(xScale, Math.abs(sol[j]!));
      // Every row·x ≥ bound (within tolerance), each dot product summed left to right from 0 as `dot` sums it.
      let feasible = true;
      for (let i = 0; i < m && feasible; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s = s + rows[i * n + j]! * sol[j]!;
        feasible = s >= bounds[i]! - TOLERANCE * norms[i]! * xScale;
      }
      if (!feasible) continue;
      // ½·xᵀHx + cᵀx, summed in the order `0.5 * dot(x, multiplyVector(h, x)) + dot(c, x)` sums it.
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s = s + h[i * n + j]! * sol[j]!;
        hx[i] = s;
      }
      let xhx = 0;
      let cx = 0;
      for (let j = 0; j < n; j++) xhx = xhx + sol[j]! * hx[j]!;
      for (let j = 0; j < n; j++) cx = cx + c[j]! * sol[j]!;
      const value = 0.5 * xhx + cx;
      if (value < bestValue) {
        best = Array.from(sol.subarray(0, n));
        bestValue = value;
      }
    }
  }
  return best;
}

const sameBits = (a: readonly number[] | null, b: readonly number[] | null) => (a === null || b === null ? a === b : a.length === b.length && a.every((v, i) => Object.is(v, b[i])));

/** H = MᵀM + ridge·I. */
const positiveDefinite = (m: readonly (readonly number[])[], n: number, ridge: number) =>
  Array.from({ length: n }, (_, i) => Array.from({ length: n }, (__, j) => m.reduce((s, row) => s + row[i]! * row[j]!, 0) + (i === j ? ridge : 0)));

const real = fc.double({ min: -5, max: 5, noNaN: true });

describe('quadratic programme with skipped active sets', () => {
  it('gives the plain enumeration\'s answer bit for bit on general programmes', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(real, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }),
            ridge: fc.double({ min: 1e-6, max: 2, noNaN: true }),
            c: fc.array(real, { minLength: n, maxLength: n }),
            rows: fc.array(fc.array(fc.oneof(real, fc.integer({ min: -2, max: 2 })), { minLength: n, maxLength: n }), { maxLength: 12 }),
            bounds: fc.array(real, { minLength: 12, maxLength: 12 }),
          }),
        ),
        ({ n, m, ridge, c, rows, bounds }) => {
          const qp: QuadraticProgram = { h: positiveDefinite(m, n, ridge), c, rows, bounds: rows.map((_, i) => bounds[i]!) };
          expect(sameBits(solveQuadraticProgram(qp), enumerateEveryActiveSet(qp))).toBe(true);
        },
      ),
    );
  });

  it('gives the plain enumeration\'s answer bit for bit on programmes shaped like a reactor refit (outputs ≥ 0, line bounds, polygons)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 3 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(real, { minLength: n, maxLength: n }), { minLength: 4, maxLength: 4 }),
            c: fc.array(real, { minLength: n, maxLength: n }),
            lines: fc.array(fc.tuple(fc.array(real, { minLength: n, maxLength: n }), real), { maxLength: 3 }),
            circles: fc.array(fc.tuple(fc.array(real, { minLength: 2 * n, maxLength: 2 * n }), real, real, fc.double({ min: 0, max: 2, noNaN: true })), { minLength: 1, maxLength: 2 }),
          }),
        ),
        ({ n, m, c, lines, circles }) => {
          const rows: number[][] = [];
          const bounds: number[] = [];
          for (let i = 0; i < n; i++) {
            rows.push(Array.from({ length: n }, (_, j) => (j === i ? 1 : 0)));
            bounds.push(0);
          }
          for (const [g, e] of lines) {
            rows.push(g);
            bounds.push(e);
          }
          for (const [j, ox, oy, t] of circles)
            for (let k = 0; k < 12; k++) {
              const th = (2 * Math.PI * k) / 12;
              const [cx, cy] = [Math.cos(th), Math.sin(th)];
              rows.push(Array.from({ length: n }, (_, i) => -(cx * j[i]! + cy * j[n + i]!)));
              bounds.push(cx * ox + cy * oy - t * Math.cos(Math.PI / 12));
            }
          const qp: QuadraticProgram = { h: positiveDefinite(m, n, 1e-4), c, rows, bounds };
          expect(sameBits(solveQuadraticProgram(qp), enumerateEveryActiveSet(qp))).toBe(true);
        },
      ),
    );
  });
});
