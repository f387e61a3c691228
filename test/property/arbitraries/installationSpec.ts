/**
 * Random installations in the file format: a radial tree of 2–20 boards with
 * unequal conductors (some of zero impedance, some from the cable library),
 * and the supplies whose impedances differ per phase or per sequence — equal,
 * per phase, transformer with a zero-sequence impedance, a bank of unequal
 * single-phase units, an open delta.
 */
import fc from 'fast-check';
import type { ConnectionSpec, InstallationSpec, LoadSpec, SystemKind } from '@trivar/core';

export type SupplyShape = 'equal' | 'per-phase' | 'zero-sequence' | 'bank' | 'open-delta' | 'ideal';

export const SHAPES_OF: Readonly<Record<'three-phase-4wire' | 'three-phase-3wire' | 'split-phase', readonly SupplyShape[]>> = {
  'three-phase-4wire': ['equal', 'per-phase', 'zero-sequence', 'bank', 'ideal'],
  'three-phase-3wire': ['equal', 'per-phase', 'bank', 'open-delta'],
  'split-phase': ['equal', 'per-phase', 'ideal'],
};

const CONNECTIONS: Readonly<Record<keyof typeof SHAPES_OF, readonly ConnectionSpec[]>> = {
  'three-phase-4wire': ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'],
  'three-phase-3wire': ['A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'],
  'split-phase': ['A-N', 'B-N', 'A-B'],
};

// Values below 1e-4 ohm become exact zeros: a denormal conductor is a short the solver rightly cannot resolve.
const ohm = (max: number) => fc.double({ min: 0, max, noNaN: true }).map((v) => (v < 1e-4 ? 0 : v));
const impedanceArb = fc.record({ r: fc.double({ min: 0.002, max: 0.02, noNaN: true }), x: fc.double({ min: 0.002, max: 0.03, noNaN: true }) });
const unitArb = fc.oneof(
  impedanceArb,
  fc.record({ kVA: fc.double({ min: 100, max: 500, noNaN: true }), impedancePercent: fc.double({ min: 2, max: 6, noNaN: true }), xOverR: fc.double({ min: 0.5, max: 5, noNaN: true }) }),
);

/** A conductor: plain ohms (zero sometimes, so boards merge), ohm/km, or a library size. */
const conductorArb = fc.oneof(
  { weight: 2, arbitrary: fc.record({ r: ohm(0.012), x: ohm(0.008) }) },
  { weight: 1, arbitrary: fc.constant({ r: 0, x: 0 }) },
  { weight: 1, arbitrary: fc.record({ lengthM: fc.double({ min: 5, max: 30, noNaN: true }), rOhmPerKm: fc.double({ min: 0.05, max: 0.5, noNaN: true }), xOhmPerKm: fc.double({ min: 0.01, max: 0.1, noNaN: true }) }) },
  {
    weight: 1,
    arbitrary: fc.record({
      lengthFt: fc.double({ min: 20, max: 100, noNaN: true }),
      mm2: fc.constantFrom(50, 70, 95, 120, 185, 240),
      material: fc.constantFrom('copper', 'aluminium'),
      temperatureC: fc.double({ min: 20, max: 90, noNaN: true }),
    }),
  },
);

const loadArb = (system: keyof typeof SHAPES_OF, name: string, ln: number): fc.Arbitrary<LoadSpec> =>
  fc
    .record({
      connection: fc.constantFrom(...CONNECTIONS[system]),
      kVA: fc.double({ min: 0.2, max: 3, noNaN: true }),
      pf: fc.double({ min: 0.6, max: 1, noNaN: true }),
      form: fc.constantFrom('ohms', 'kW', 'kW-current', 'kvar'),
      floating: fc.boolean(),
    })
    .map(({ connection, kVA, pf, form, floating }): LoadSpec => {
      const star = connection === 'ABC-star' ? { starPoint: floating || system === 'three-phase-3wire' ? ('floating' as const) : ('neutral' as const) } : {};
      const v = connection.endsWith('-N') || connection === 'ABC-star' ? ln : system === 'split-phase' ? 2 * ln : Math.sqrt(3) * ln;
      if (form === 'ohms' || (star.starPoint === 'floating' && form !== 'kW')) {
        const s = (kVA * 1000) / (connection.startsWith('ABC') ? 3 : 1);
        const z = (v * v) / s;
        return { name, connection, ...star, ohms: { r: z * pf, x: z * Math.sqrt(1 - pf * pf) } };
      }
      if (form === 'kvar') return { name, connection, ...star, kW: kVA * pf, kvar: -kVA * 0.3 };
      return { name, connection, ...star, kW: kVA * pf, pf, ...(form === 'kW-current' ? { model: 'constant-current' as const } : {}) };
    });

export interface InstallationArbOptions {
  readonly systems?: readonly (keyof typeof SHAPES_OF)[];
  readonly shapes?: readonly SupplyShape[];
  readonly minBoards?: number;
  readonly maxBoards?: number;
}

export function installationSpecArb(options: InstallationArbOptions = {}): fc.Arbitrary<InstallationSpec & { shape: SupplyShape }> {
  const systems = options.systems ?? (['three-phase-4wire', 'three-phase-3wire', 'split-phase'] as const);
  return fc
    .constantFrom(...systems)
    .chain((system) => fc.tuple(fc.constant(system), fc.constantFrom(...SHAPES_OF[system].filter((s) => !options.shapes || options.shapes.includes(s)))))
    .chain(([system, shape]) => {
      const ln = system === 'split-phase' ? 120 : 230;
      const phases = system === 'split-phase' ? (['A', 'B'] as const) : (['A', 'B', 'C'] as const);
      const perPhase = <T,>(arb: fc.Arbitrary<T>) => fc.tuple(...phases.map(() => arb)).map((xs) => Object.fromEntries(phases.map((p, k) => [p, xs[k]])));
      const supplyExtra: fc.Arbitrary<Record<string, unknown>> =
        shape === 'equal'
          ? impedanceArb.map((impedance) => ({ impedance }))
          : shape === 'per-phase'
            ? perPhase(impedanceArb).map((impedance) => ({ impedance }))
            : shape === 'zero-sequence'
              ? fc
                  .tuple(impedanceArb, fc.double({ min: 1, max: 3, noNaN: true }), fc.double({ min: 1, max: 3, noNaN: true }))
                  .map(([z1, kr, kx]) => ({ impedance: z1, zeroSequence: { r: z1.r * kr, x: z1.x * kx } }))
              : shape === 'bank'
                ? perPhase(unitArb).map((bank) => ({ bank }))
                : shape === 'open-delta'
                  ? fc
                      .tuple(fc.constantFrom(['A-B', 'B-C'], ['B-C', 'C-A'], ['A-B', 'C-A']), unitArb, unitArb)
                      .map(([pair, u, w]) => ({ openDelta: { [pair[0]!]: u, [pair[1]!]: w } }))
                  : fc.constant({});
      const count = fc.integer({ min: options.minBoards ?? 2, max: options.maxBoards ?? 20 });
      return fc.tuple(fc.constant(system as SystemKind), fc.constant(shape), supplyExtra, count).chain(([sys, sh, extra, n]) =>
        fc
          .tuple(
            fc.tuple(...Array.from({ length: n }, (_, i) => (i === 0 ? fc.constant(0) : fc.integer({ min: 0, max: i - 1 })))),
            fc.tuple(
              ...Array.from({ length: n }, (_, i) =>
                fc.record({
                  line: fc.oneof(conductorArb, perPhase(conductorArb)),
                  neutral: conductorArb,
                  loads: fc.array(fc.nat(), { minLength: 0, maxLength: 4 }).chain((ks) => fc.tuple(...ks.map((_, j) => loadArb(system, `b${i} load ${j}`, ln)))),
                }),
              ),
            ),
          )
          .map(([parents, boards]) => ({
            shape: sh,
            name: `random ${sh}`,
            supply: { system: sys, voltage: { lineToNeutral: ln }, frequencyHz: sys === 'split-phase' ? 60 : 50, ...extra } as InstallationSpec['supply'],
            boards: boards.map((b, i) => ({
              name: `board ${i}`,
              ...(i === 0 ? {} : { fedFrom: `board ${parents[i]}` }),
              feeder: { line: b.line, ...(sys === 'three-phase-3wire' ? {} : { neutral: b.neutral }) } as never,
              loads: b.loads as LoadSpec[],
            })),
          })),
      );
    });
}
