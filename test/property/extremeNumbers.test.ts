/**
 * The library under extreme but finite numbers (1e308, 5e-324, -0, 2^53 ... in
 * every physical field): the outcome is an InputError whose every issue names a
 * board field, a NumericalError, or a result in which every number is finite and
 * a line with no load on it carries no current and shows no PF.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError, NumericalError, solveBoard, type BoardResult } from '@trivar/core';

const extreme = fc.oneof(
  fc.constantFrom(1e308, -1e308, 1.7976931348623157e308, 5e-324, -5e-324, 1e-320, 0, -0, 1e-12, 1e-9, 1e9, 1e15, 2 ** 53, 0.9999999, 1),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
);
const maybe = <T,>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });

const CONNECTIONS = ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'] as const;

const loadArb = fc.record(
  {
    connection: fc.constantFrom(...CONNECTIONS),
    rating: fc.oneof(
      fc.record({ kW: extreme, pf: extreme }),
      fc.record({ kW: extreme, kvar: extreme }),
      fc.record({ kVA: extreme, pf: extreme }),
      fc.record({ A: extreme, pf: extreme }),
      fc.record({ ohms: fc.record({ r: extreme, x: extreme }) }),
    ),
    model: maybe(fc.constantFrom('constant-impedance', 'constant-current', 'constant-power')),
  },
  { requiredKeys: ['connection', 'rating'] },
);

const boardArb = fc.record({
  system: fc.constantFrom('three-phase-4wire', 'three-phase-3wire'),
  lineToLine: fc.oneof(fc.constantFrom(400, 415, 208), extreme),
  transformer: maybe(fc.record({ kVA: extreme, impedancePercent: fc.oneof(fc.constant(4), extreme), xOverR: fc.oneof(fc.constant(3), extreme) })),
  feeder: maybe(fc.record({ r: extreme, x: extreme })),
  loads: fc.array(loadArb, { minLength: 1, maxLength: 4 }),
});

const linesOf = (connection: string): string[] => (connection.startsWith('ABC') ? ['A', 'B', 'C'] : connection.split('-').filter((t) => t !== 'N'));

function assertAllFinite(value: unknown, path: string): void {
  if (typeof value === 'number') expect(Number.isFinite(value), path).toBe(true);
  else if (Array.isArray(value)) value.forEach((v, i) => assertAllFinite(v, `${path}[${i}]`));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) assertAllFinite(v, `${path}.${k}`);
}

describe('extreme finite numbers', () => {
  it('end in an InputError naming a field, a NumericalError, or an all-finite result with no PF on an unloaded line', () => {
    fc.assert(
      fc.property(boardArb, (b) => {
        const spec = {
          supply: { system: b.system, voltage: { lineToLine: b.lineToLine }, frequencyHz: 50, ...(b.transformer ? { transformer: b.transformer } : {}) },
          ...(b.feeder ? { feeder: { line: b.feeder, ...(b.system === 'three-phase-4wire' ? { neutral: b.feeder } : {}) } } : {}),
          loads: b.loads
            .filter((l) => b.system === 'three-phase-4wire' || !l.connection.endsWith('-N'))
            .map((l, k) => ({ name: `load ${k}`, connection: l.connection, ...l.rating, ...(l.model ? { model: l.model } : {}) })),
        };
        let result: BoardResult;
        try {
          result = solveBoard(spec);
        } catch (e) {
          if (e instanceof InputError) {
            for (const issue of e.issues) expect(issue.path).toMatch(/^(supply|feeder|loads)\b/);
            return;
          }
          if (e instanceof NumericalError) return;
          throw e;
        }
        assertAllFinite(result, 'result');
        const used = new Set(spec.loads.flatMap((l) => linesOf(l.connection)));
        for (const p of result.phases) {
          if (!used.has(p.phase)) {
            expect(p.current.magnitude, `line ${p.phase} has no load`).toBe(0);
            expect(p.pf, `line ${p.phase} has no load`).toBeNull();
          }
          expect(p.pf === null, `line ${p.phase}: PF shown iff power flows`).toBe(p.kVA === 0);
        }
      }),
      { numRuns: Number(process.env.TRIVAR_RUNS ?? 300) },
    );
  });
});
