/**
 * The correction's two small exact optimisers (vertex-enumeration LP, active-set-enumeration QP)
 * against a general-purpose solver: HiGHS (the `highs` npm package, test-only) on generated
 * programmes with small integer data, one row in four without coefficients (0 ≤ bound: dropped or
 * infeasible). Asserted: the same verdict (a point or none); for the LP the same optimal value of
 * the first objective (1e-6); for the QP a feasible point whose objective is no worse than HiGHS's (1e-7).
 */
import highsDefault from 'highs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveLinearProgram } from '../../packages/core/src/correction/_internal/linearProgram.js';
import { solveQuadraticProgram } from '../../packages/core/src/correction/_internal/quadraticProgram.js';

// The package's types are written as CommonJS; under vitest the ES build's default export is the loader.
const loadHighs = highsDefault as unknown as (typeof import('highs'))['default'];

const coefficient = fc.integer({ min: -5, max: 5 });
const term = (a: number, name: string) => `${a < 0 ? '-' : '+'} ${Math.abs(a)} ${name}`;
const names = (n: number) => Array.from({ length: n }, (_, i) => `x${i}`);

/** `rows·x ≤ bounds` (LP) or `rows·x ≥ bounds` (QP) as CPLEX-LP constraint lines. */
const constraintLines = (rows: readonly (readonly number[])[], bounds: readonly number[], sense: '<=' | '>=') =>
  rows.map((row, i) => ` c${i}: ${row.map((a, j) => term(a, `x${j}`)).join(' ')} ${sense} ${bounds[i]}`);

interface HighsAnswer {
  status: string;
  objective: number;
  x: number[];
}

let solver: ReturnType<typeof loadHighs> | undefined;
/** HiGHS's answer, or null where HiGHS itself fails (its wasm build aborts on a few QPs; a fresh instance follows). */
async function solveWithHighs(text: string, n: number): Promise<HighsAnswer | null> {
  const highs = await (solver ??= loadHighs());
  let r: ReturnType<typeof highs.solve>;
  try {
    r = highs.solve(text);
  } catch {
    solver = undefined;
    return null;
  }
  return { status: r.Status, objective: r.ObjectiveValue, x: names(n).map((v) => (r.Columns[v] as { Primal: number } | undefined)?.Primal ?? 0) };
}

describe('small exact optimisers against HiGHS', () => {
  it('linear programme: same feasibility and the same optimal value of the first objective', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 2, max: 4 }).chain((d) =>
          fc.record({
            d: fc.constant(d),
            // One row in four without a coefficient: 0 ≤ bound holds or fails whatever x is.
            rows: fc.array(
              fc.oneof(
                { weight: 3, arbitrary: fc.array(coefficient, { minLength: d, maxLength: d }) },
                { weight: 1, arbitrary: fc.constant(Array.from({ length: d }, () => 0)) },
              ),
              { minLength: 1, maxLength: 6 },
            ),
            bounds: fc.array(fc.integer({ min: -6, max: 12 }), { minLength: 6, maxLength: 6 }),
            objective: fc.array(coefficient, { minLength: d, maxLength: d }),
          }),
        ),
        async ({ d, rows, bounds, objective }) => {
          // Pointed and bounded, as every use in the sizing: 0 ≤ xᵢ ≤ 10.
          const all = [...rows, ...names(d).flatMap((_, i) => [names(d).map((__, j) => (j === i ? -1 : 0)), names(d).map((__, j) => (j === i ? 1 : 0))])];
          const b = [...rows.map((_, i) => bounds[i]!), ...names(d).flatMap(() => [0, 10])];
          const ours = solveLinearProgram({ rows: all, bounds: b, objectives: [objective] });
          const text = ['Minimize', ` obj: ${objective.map((a, j) => term(a, `x${j}`)).join(' ')}`, 'Subject To', ...constraintLines(all, b, '<='), 'Bounds', ...names(d).map((v) => ` ${v} free`), 'End'].join('\n');
          const reference = await solveWithHighs(text, d);
          fc.pre(reference !== null);
          if (reference!.status === 'Infeasible') {
            expect(ours).toBeNull();
            return;
          }
          expect(reference!.status).toBe('Optimal');
          expect(ours).not.toBeNull();
          const value = objective.reduce((s, a, j) => s + a * ours![j]!, 0);
          expect(Math.abs(value - reference!.objective)).toBeLessThan(1e-6 * Math.max(1, Math.abs(reference!.objective)));
        },
      ),
      { numRuns: 120 },
    );
  });

  it('linear programme: a row without coefficients is dropped when 0 ≤ bound holds and makes the programme infeasible when not', () => {
    // 0 ≤ x, y ≤ 2 (a square), minimise −x − y: optimum at (2, 2).
    const square = { rows: [[-1, 0], [0, -1], [1, 0], [0, 1]], bounds: [0, 0, 2, 2], objectives: [[-1, -1]] };
    const withRow = (bound: number) => ({ ...square, rows: [...square.rows, [0, 0]], bounds: [...square.bounds, bound] });
    expect(solveLinearProgram(square)).toEqual([2, 2]);
    expect(solveLinearProgram(withRow(0))).toEqual([2, 2]);
    expect(solveLinearProgram(withRow(5))).toEqual([2, 2]);
    expect(solveLinearProgram(withRow(-1))).toBeNull();
    expect(solveLinearProgram(withRow(-1e-6))).toBeNull();
    expect(solveLinearProgram(withRow(Number.NaN))).toBeNull();
  });

  it('strictly convex quadratic programme: same feasibility and the same optimum', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 1, max: 4 }).chain((n) =>
          fc.record({
            n: fc.constant(n),
            m: fc.array(fc.array(coefficient, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }),
            c: fc.array(fc.integer({ min: -20, max: 20 }), { minLength: n, maxLength: n }),
            rows: fc.array(
              fc.oneof(
                { weight: 3, arbitrary: fc.array(coefficient, { minLength: n, maxLength: n }) },
                { weight: 1, arbitrary: fc.constant(Array.from({ length: n }, () => 0)) },
              ),
              { maxLength: 8 },
            ),
            bounds: fc.array(fc.integer({ min: -8, max: 8 }), { minLength: 8, maxLength: 8 }),
          }),
        ),
        async ({ n, m, c, rows, bounds }) => {
          // H = MᵀM + I: symmetric positive definite, with integer entries.
          const h = names(n).map((_, i) => names(n).map((__, j) => m.reduce((s, row) => s + row[i]! * row[j]!, 0) + (i === j ? 1 : 0)));
          const b = rows.map((_, i) => bounds[i]!);
          const ours = solveQuadraticProgram({ h, c, rows, bounds: b });
          const quadratic = names(n).flatMap((vi, i) => names(n).flatMap((vj, j) => (j < i || h[i]![j]! === 0 ? [] : [term(j === i ? h[i]![j]! : 2 * h[i]![j]!, j === i ? `${vi} ^ 2` : `${vi} * ${vj}`)])));
          const text = [
            'Minimize',
            ` obj: ${c.map((a, j) => term(a, `x${j}`)).join(' ')} + [ ${quadratic.join(' ')} ] / 2`,
            ...(rows.length ? ['Subject To', ...constraintLines(rows, b, '>=')] : []),
            'Bounds',
            ...names(n).map((v) => ` ${v} free`),
            'End',
          ].join('\n');
          const reference = await solveWithHighs(text, n);
          fc.pre(reference !== null);
          if (reference!.status === 'Infeasible') {
            expect(ours).toBeNull();
            return;
          }
          expect(reference!.status).toBe('Optimal');
          expect(ours).not.toBeNull();
          // Ours is feasible and at least as good as HiGHS's answer (whose QP method stops within its own
          // tolerance, sometimes a few hundredths away from the optimum on an unconstrained programme).
          const x = ours!;
          rows.forEach((row, i) => expect(row.reduce((s, a, j) => s + a * x[j]!, 0)).toBeGreaterThanOrEqual(b[i]! - 1e-9 * Math.max(1, ...x.map(Math.abs))));
          const value = 0.5 * x.reduce((s, xi, i) => s + xi * h[i]!.reduce((t, hij, j) => t + hij * x[j]!, 0), 0) + c.reduce((s, ci, j) => s + ci * x[j]!, 0);
          expect(value).toBeLessThanOrEqual(reference!.objective + 1e-7 * Math.max(1, Math.abs(reference!.objective)));
        },
      ),
      { numRuns: 120 },
    );
  });
});
