/**
 * The load-port solve (loadPortReduction.ts: the fixed part of a nodal system reduced
 * once to its ports, each solve a dense one on the ports) against a general-purpose
 * library: mathjs 15 `lusolve` (dense LU with partial pivoting) on the whole nodal
 * matrix with the port admittances stamped in, on random nodal-style systems with
 * one to six ports. The port admittances range over both signs of conductance (loads
 * and generation) and include values that leave the port matrix's L·D·Lᵀ a small
 * pivot, so the pivoted fallback is checked too. Also the small dense kernels the
 * ports use, against the same library.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { create, complexDependencies, lusolveDependencies, type FactoryFunctionMap, type MathArray, type Complex } from 'mathjs';
import { analysePattern } from '../../packages/core/src/_internal/sparseComplexLu.js';
import { invertComplexInPlace } from '../../packages/core/src/_internal/denseComplexInverse.js';
import { factorSymmetricInPlace, invertSymmetricFactored, solveSymmetricFactored } from '../../packages/core/src/_internal/symmetricComplexLdl.js';
import { LoadPortReduction } from '../../packages/core/src/network/loadPortReduction.js';

const math = create({ complexDependencies, lusolveDependencies } as FactoryFunctionMap);
type C = { re: number; im: number };
const part = fc.integer({ min: -100_000, max: 100_000 }).map((k) => k / 1000);
const complexArb = fc.record({ re: part, im: part });

function lusolve(a: C[][], b: C[]): C[] {
  const x = math.lusolve(
    a.map((row) => row.map((v) => math.complex(v.re, v.im))) as unknown as MathArray,
    b.map((v) => [math.complex(v.re, v.im)]) as unknown as MathArray,
  ) as unknown as (Complex | number)[][];
  // mathjs gives plain numbers where a result has no imaginary part.
  return x.map(([v]) => (typeof v === 'number' ? { re: v, im: 0 } : { re: v!.re, im: v!.im }));
}

const closeTo = (x: C, y: C, scale: number, what: string) => {
  const error = Math.hypot(x.re - y.re, x.im - y.im);
  expect(error, `${what}: ${JSON.stringify(x)} against ${JSON.stringify(y)}`).toBeLessThanOrEqual(1e-9 * scale);
};

/** The fixed part `fixed` (pattern from `pairs`) with right-hand side `rhs`, reduced to ports from node i to node j (-1: the reference). */
function reduce(fixed: C[][], pairs: [number, number][], rhs: C[], ports: [number, number][]) {
  const pattern = analysePattern(fixed.length, pairs);
  const baseRe = new Float64Array(pattern.slotCount);
  const baseIm = new Float64Array(pattern.slotCount);
  fixed.forEach((row, i) =>
    row.forEach((v, j) => {
      const s = pattern.slotOf(i, j);
      if (s >= 0) {
        baseRe[s] = v.re;
        baseIm[s] = v.im;
      }
    }),
  );
  const position = (v: number) => (v < 0 ? -1 : pattern.position[v]!);
  const reduction = LoadPortReduction.build(
    pattern,
    baseRe,
    baseIm,
    Float64Array.from(rhs, (b) => b.re),
    Float64Array.from(rhs, (b) => b.im),
    Int32Array.from(ports, ([i]) => position(i)),
    Int32Array.from(ports, ([, j]) => position(j)),
    new Float64Array(ports.length),
    new Float64Array(ports.length),
  );
  return { pattern, reduction };
}

/** A fixed nodal part (diagonally dominant, structurally symmetric), its sources, ports between node pairs, and admittances on them. */
const networkArb = fc.integer({ min: 2, max: 12 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    edges: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 }), complexArb), { maxLength: 2 * n }),
    diagonal: fc.array(complexArb, { minLength: n, maxLength: n }),
    rhs: fc.array(complexArb, { minLength: n, maxLength: n }),
    // A port from node i to node j, or to the reference (-1).
    ports: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: -1, max: n - 1 })), { minLength: 1, maxLength: 6 }),
    loads: fc.array(complexArb, { minLength: 6, maxLength: 6 }),
    loadScale: fc.constantFrom(1e-3, 0.1, 1, 30),
  }),
);

describe('solve through the load ports', () => {
  it('agrees with mathjs lusolve on the whole nodal matrix, and gives the loaded transfer impedance', () => {
    let reduced = 0;
    fc.assert(
      fc.property(networkArb, ({ n, edges, diagonal, rhs, ports, loads, loadScale }) => {
        const distinct = ports.filter(([i, j], k) => i !== j && ports.findIndex(([a, b]) => (a === i && b === j) || (a === j && b === i)) === k);
        if (distinct.length === 0) return;
        const fixed: C[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? { re: diagonal[i]!.re + 1000 * (1 + edges.length), im: diagonal[i]!.im } : { re: 0, im: 0 })));
        for (const [i, j, y] of edges) {
          if (i === j) continue;
          fixed[i]![j] = { re: fixed[i]![j]!.re - y.re, im: fixed[i]![j]!.im - y.im };
          fixed[j]![i] = { re: fixed[j]![i]!.re - y.re, im: fixed[j]![i]!.im - y.im };
        }
        const pairs: [number, number][] = edges.filter(([i, j]) => i !== j).map(([i, j]) => [i, j]);
        for (const [i, j] of distinct) if (j >= 0) pairs.push([i, j]);
        const { pattern, reduction } = reduce(fixed, pairs, rhs, distinct);
        // Ports that form a loop have no W: the network then takes the sparse solve, nothing to compare.
        if (!reduction) return;
        reduced++;
        const y = distinct.map((_, k) => ({ re: loads[k]!.re * loadScale, im: loads[k]!.im * loadScale }));
        y.forEach((v, k) => {
          reduction.admittanceRe[k] = v.re;
          reduction.admittanceIm[k] = v.im;
        });
        reduction.openCircuit(null, null);
        const xRe = new Float64Array(n);
        const xIm = new Float64Array(n);
        const full = fixed.map((row) => row.map((v) => ({ ...v })));
        distinct.forEach(([i, j], k) => {
          const add = (a: number, b: number, sign: number) => {
            full[a]![b] = { re: full[a]![b]!.re + sign * y[k]!.re, im: full[a]![b]!.im + sign * y[k]!.im };
          };
          add(i, i, 1);
          if (j >= 0) {
            add(j, j, 1);
            add(i, j, -1);
            add(j, i, -1);
          }
        });
        let expected: C[];
        try {
          expected = lusolve(full, rhs);
        } catch {
          expect(reduction.solvePorts(xRe, xIm)).toBe(-1);
          return;
        }
        if (expected.some((x) => !Number.isFinite(x.re) || !Number.isFinite(x.im))) return;
        const moved = reduction.solvePorts(xRe, xIm);
        if (moved < 0) return; // singular on the ports: the network takes the sparse solve
        const scale = Math.max(1, ...expected.map((x) => Math.hypot(x.re, x.im)));
        for (let v = 0; v < n; v++) closeTo({ re: xRe[pattern.position[v]!]!, im: xIm[pattern.position[v]!]! }, expected[v]!, scale, `node ${v}`);
        // Transfer impedance between ports a and b: the voltage across a for a unit current into b's ends.
        reduction.loadedTransfer();
        const q = reduction.portCount;
        distinct.forEach(([i, j], b) => {
          const unit = Array.from({ length: n }, (_, v) => ({ re: v === i ? 1 : v === j ? -1 : 0, im: 0 }));
          const response = lusolve(full, unit);
          const across = (a: number) => {
            const [f, t] = distinct[a]!;
            const at = (v: number) => (v < 0 ? { re: 0, im: 0 } : response[v]!);
            return { re: at(f).re - at(t).re, im: at(f).im - at(t).im };
          };
          const zScale = Math.max(1e-3, ...distinct.map((_, a) => Math.hypot(across(a).re, across(a).im)));
          distinct.forEach((_, a) => closeTo({ re: reduction.inverseRe[a * q + b]!, im: reduction.inverseIm[a * q + b]! }, across(a), zScale, `transfer ${a}, ${b}`));
        });
      }),
      { numRuns: 300 },
    );
    expect(reduced).toBeGreaterThan(100);
  });
});

const symmetricArb = fc.integer({ min: 1, max: 12 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    upper: fc.array(complexArb, { minLength: (n * (n + 1)) / 2, maxLength: (n * (n + 1)) / 2 }),
    rhs: fc.array(complexArb, { minLength: n, maxLength: n }),
    dominance: fc.constantFrom(0, 1, 100),
  }),
);

describe('small dense complex kernels', () => {
  it('L·D·Lᵀ solves and inverts complex symmetric matrices as lusolve does, or refuses a small pivot', () => {
    fc.assert(
      fc.property(symmetricArb, ({ n, upper, rhs, dominance }) => {
        const a: C[][] = Array.from({ length: n }, () => new Array<C>(n));
        let k = 0;
        for (let i = 0; i < n; i++)
          for (let j = i; j < n; j++) {
            const v = upper[k++]!;
            a[i]![j] = i === j ? { re: v.re + dominance * 100 * n, im: v.im } : v;
            a[j]![i] = a[i]![j]!;
          }
        const re = Float64Array.from(a.flat(), (v) => v.re);
        const im = Float64Array.from(a.flat(), (v) => v.im);
        // A refused pivot sends the caller to the pivoted inverse (checked below and in the port solve).
        if (!factorSymmetricInPlace(re, im, n)) return;
        const bRe = Float64Array.from(rhs, (v) => v.re);
        const bIm = Float64Array.from(rhs, (v) => v.im);
        solveSymmetricFactored(re, im, n, bRe, bIm);
        const expected = lusolve(a, rhs);
        const scale = Math.max(1, ...expected.map((x) => Math.hypot(x.re, x.im)));
        expected.forEach((x, i) => closeTo({ re: bRe[i]!, im: bIm[i]! }, x, scale, `x[${i}]`));
        const invRe = new Float64Array(n * n);
        const invIm = new Float64Array(n * n);
        invertSymmetricFactored(re, im, n, invRe, invIm);
        // The pivoted Gauss–Jordan inverse of the same matrix.
        const gjRe = Float64Array.from(a.flat(), (v) => v.re);
        const gjIm = Float64Array.from(a.flat(), (v) => v.im);
        expect(invertComplexInPlace(gjRe, gjIm, n, new Int32Array(n))).toBe(true);
        const invScale = Math.max(1e-6, ...Array.from(gjRe, (r, i) => Math.hypot(r, gjIm[i]!)));
        for (let i = 0; i < n * n; i++) closeTo({ re: invRe[i]!, im: invIm[i]! }, { re: gjRe[i]!, im: gjIm[i]! }, invScale, `inverse entry ${i}`);
        // And A⁻¹·b is lusolve's x.
        for (let i = 0; i < n; i++) {
          let sr = 0;
          let si = 0;
          for (let j = 0; j < n; j++) {
            sr += gjRe[i * n + j]! * rhs[j]!.re - gjIm[i * n + j]! * rhs[j]!.im;
            si += gjRe[i * n + j]! * rhs[j]!.im + gjIm[i * n + j]! * rhs[j]!.re;
          }
          closeTo({ re: sr, im: si }, expected[i]!, scale, `A⁻¹b[${i}]`);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('refuses a zero leading pivot, and the pivoted inverse handles it', () => {
    const re = new Float64Array([0, 1, 1, 0]);
    const im = new Float64Array(4);
    expect(factorSymmetricInPlace(Float64Array.from(re), Float64Array.from(im), 2)).toBe(false);
    expect(invertComplexInPlace(re, im, 2, new Int32Array(2))).toBe(true);
    expect(Array.from(re)).toEqual([0, 1, 1, 0]);
  });
});

describe('solve through the load ports where L·D·Lᵀ refuses', () => {
  it('a port admittance cancelling its diagonal of W takes the pivoted inverse, and still agrees with lusolve', () => {
    // Two nodes, each to the reference through 10 S, coupled by 4 S; ports from each node to the reference.
    const fixed: C[][] = [
      [{ re: 14, im: -2 }, { re: -4, im: 1 }],
      [{ re: -4, im: 1 }, { re: 14, im: -2 }],
    ];
    const rhs: C[] = [{ re: 100, im: 0 }, { re: -50, im: 80 }];
    const { pattern, reduction: built } = reduce(fixed, [[0, 1]], rhs, [
      [0, -1],
      [1, -1],
    ]);
    const reduction = built!;
    expect(reduction).not.toBeNull();
    // Ports to the reference: W is the fixed nodal matrix itself, so −W(0,0) on port 0 leaves a zero leading pivot.
    const y: C[] = [{ re: -14, im: 2 }, { re: 3, im: -1 }];
    y.forEach((v, k) => {
      reduction.admittanceRe[k] = v.re;
      reduction.admittanceIm[k] = v.im;
    });
    reduction.openCircuit(null, null);
    const xRe = new Float64Array(2);
    const xIm = new Float64Array(2);
    expect(reduction.solvePorts(xRe, xIm)).toBeGreaterThanOrEqual(0);
    const full = fixed.map((row, i) => row.map((v, j) => (i === j ? { re: v.re + y[i]!.re, im: v.im + y[i]!.im } : v)));
    const expected = lusolve(full, rhs);
    const scale = Math.max(...expected.map((x) => Math.hypot(x.re, x.im)));
    for (let v = 0; v < 2; v++) closeTo({ re: xRe[pattern.position[v]!]!, im: xIm[pattern.position[v]!]! }, expected[v]!, scale, `node ${v}`);
    // Its inverse is the loaded transfer impedance: (W + Y)⁻¹ times (W + Y) is the identity.
    reduction.loadedTransfer();
    const q = reduction.portCount;
    for (let a = 0; a < 2; a++)
      for (let b = 0; b < 2; b++) {
        let sr = 0;
        let si = 0;
        for (let k = 0; k < 2; k++) {
          const zr = reduction.inverseRe[a * q + k]!;
          const zi = reduction.inverseIm[a * q + k]!;
          sr += zr * full[k]![b]!.re - zi * full[k]![b]!.im;
          si += zr * full[k]![b]!.im + zi * full[k]![b]!.re;
        }
        closeTo({ re: sr, im: si }, { re: a === b ? 1 : 0, im: 0 }, 1, `(W + Y)⁻¹(W + Y) at ${a}, ${b}`);
      }
  });
});
