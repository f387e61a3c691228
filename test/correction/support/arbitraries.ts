/**
 * fast-check arbitraries for the correction properties: boards whose loads all
 * lag (the case capacitor correction is for), on ideal sources or behind a
 * transformer sized so the voltage stays within a few per cent.
 */
import fc from 'fast-check';
import { normaliseBoard, parseBoard, type Board, type BoardSpec } from '@trivar/core';

export type ThreePhaseSystem = 'three-phase-4wire' | 'three-phase-3wire';

const connectionsOf = (system: ThreePhaseSystem, lineToNeutralOnly: boolean): string[] => {
  if (lineToNeutralOnly) return system === 'three-phase-4wire' ? ['A-N', 'B-N', 'C-N', 'ABC-star', 'ABC-delta'] : ['ABC-star', 'ABC-delta'];
  return system === 'three-phase-4wire' ? ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'] : ['A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'];
};

export interface LaggingBoardOptions {
  readonly systems?: readonly ThreePhaseSystem[];
  readonly source?: 'ideal' | 'transformer' | 'any';
  /** Only line-to-neutral and three-phase loads (every line then lags). @defaultValue false */
  readonly lineToNeutralOnly?: boolean;
}

const loadArb = (system: ThreePhaseSystem, lineToNeutralOnly: boolean) =>
  fc.record({
    connection: fc.constantFrom(...connectionsOf(system, lineToNeutralOnly)),
    kW: fc.double({ min: 0.5, max: 25, noNaN: true }),
    pf: fc.double({ min: 0.6, max: 0.97, noNaN: true }),
    model: fc.constantFrom('constant-impedance', 'constant-current', 'constant-power'),
  });

export function laggingBoardSpecArb(options: LaggingBoardOptions = {}): fc.Arbitrary<BoardSpec> {
  const systems = options.systems ?? ['three-phase-4wire', 'three-phase-3wire'];
  const source = options.source ?? 'any';
  return fc
    .record({
      system: fc.constantFrom(...systems),
      frequencyHz: fc.constantFrom(50 as const, 60 as const),
      sequence: fc.constantFrom('ABC' as const, 'ACB' as const),
      lineToLine: fc.constantFrom(400, 415, 480),
      transformer: source === 'ideal' ? fc.constant(null) : source === 'transformer' ? fc.constant(true) : fc.boolean(),
      impedancePercent: fc.double({ min: 3, max: 6, noNaN: true }),
      xOverR: fc.double({ min: 1, max: 8, noNaN: true }),
    })
    .chain((s) =>
      fc.array(loadArb(s.system, options.lineToNeutralOnly ?? false), { minLength: 1, maxLength: 5 }).map((loads): BoardSpec => {
        const total = loads.reduce((a, l) => a + l.kW / l.pf, 0);
        return {
          name: 'random lagging board',
          supply: {
            system: s.system,
            voltage: { lineToLine: s.lineToLine },
            frequencyHz: s.frequencyHz,
            sequence: s.sequence,
            // A transformer of at least 4× the load keeps the drop to a few per cent.
            ...(s.transformer ? { transformer: { kVA: Math.max(50, 4 * total), impedancePercent: s.impedancePercent, xOverR: s.xOverR } } : {}),
          },
          loads: loads.map((l, i) => ({ name: `load ${i + 1}`, connection: l.connection as 'A-N', kW: l.kW, pf: l.pf, model: l.model as 'constant-power' })),
        };
      }),
    );
}

export const laggingBoardArb = (options: LaggingBoardOptions = {}): fc.Arbitrary<Board> =>
  laggingBoardSpecArb(options).map((spec) => normaliseBoard(parseBoard(spec)));

/** Repetitions for a heavy property: `TRIVAR_RUNS` when set, else `n`. */
export const runs = (n: number): number => (process.env.TRIVAR_RUNS ? Number(process.env.TRIVAR_RUNS) : n);
