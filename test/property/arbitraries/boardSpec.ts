/**
 * fast-check arbitraries for valid board files.
 *
 * Boards are kept physically sensible so the load iteration always settles:
 * loads from a few hundred VA to ~50 kVA (scaled down on 120 V systems, where
 * the same kVA means far more current), and every source, feeder and neutral
 * impedance sized from the board's own total load so that the voltage drop
 * stays a few per cent even when all of it sits on one phase. Within that,
 * everything the schema allows varies: system, nominal voltage given either
 * way, 50/60 Hz, ABC/ACB, every connection of the system, every rating form,
 * lagging/leading, generation (negative kW), each load model and ZIP mixes,
 * ideal / direct-impedance / transformer sources, and zero or non-zero feeder
 * line and neutral impedances.
 */
import fc from 'fast-check';
import type { BoardSpec, ConnectionSpec, LoadModelName, LoadSpec, SystemKind } from '@trivar/core';

export const ALL_SYSTEMS: readonly SystemKind[] = ['three-phase-4wire', 'three-phase-3wire', 'split-phase', 'single-phase'];

/** Connections a load may use on each system (written out here, not taken from core). */
export const CONNECTIONS_OF: Readonly<Record<SystemKind, readonly ConnectionSpec[]>> = {
  'three-phase-4wire': ['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'],
  'three-phase-3wire': ['A-B', 'B-C', 'C-A', 'ABC-star', 'ABC-delta'],
  'split-phase': ['A-N', 'B-N', 'A-B'],
  'single-phase': ['A-N'],
};

export type RatingForm = 'kW+pf' | 'kVA+pf' | 'A+pf' | 'kW+kvar' | 'ohms';
const RATING_FORMS: readonly RatingForm[] = ['kW+pf', 'kVA+pf', 'A+pf', 'kW+kvar', 'ohms'];

export interface BoardArbOptions {
  readonly systems?: readonly SystemKind[];
  /**
   * `ideal`: no source, feeder line or neutral impedance (bus voltages equal the
   * EMFs); `non-ideal`: some source or feeder impedance; `any` (default): either.
   */
  readonly source?: 'any' | 'ideal' | 'non-ideal';
  /** `constant-impedance` gives linear boards only; `any` (default) every model and ZIP mixes. */
  readonly models?: 'any' | 'constant-impedance';
  /** `balanced` never writes explicit EMFs; `any` (default) sometimes makes them slightly uneven. */
  readonly emf?: 'any' | 'balanced';
  /** Allow negative-kW (generating) loads; default true. */
  readonly generation?: boolean;
  readonly maxLoads?: number;
}

/** Nominal line-to-neutral and line-to-line voltages the board file implies. */
export function nominalVoltages(spec: BoardSpec): { ln: number; ll: number } {
  const { lineToLine, lineToNeutral } = spec.supply.voltage;
  const system = spec.supply.system;
  const ratio = system === 'split-phase' ? 2 : system === 'single-phase' ? 1 : Math.sqrt(3);
  const ln = lineToNeutral ?? (lineToLine ?? Number.NaN) / ratio;
  return { ln, ll: ln * ratio };
}

/** The voltage a load's `A` rating refers to: S = A × this. */
export function currentRatingVoltage(connection: ConnectionSpec, ln: number, ll: number): number {
  if (connection === 'ABC-star' || connection === 'ABC-delta') return Math.sqrt(3) * ll;
  return connection.endsWith('-N') ? ln : ll;
}

/** Branches a connection breaks into and the nominal voltage across each. */
export function branchShape(connection: ConnectionSpec, ln: number, ll: number): { count: number; voltage: number } {
  if (connection === 'ABC-star') return { count: 3, voltage: ln };
  if (connection === 'ABC-delta') return { count: 3, voltage: ll };
  return { count: 1, voltage: connection.endsWith('-N') ? ln : ll };
}

type ModelChoice =
  | { readonly kind: 'default' }
  | { readonly kind: 'model'; readonly model: LoadModelName }
  | { readonly kind: 'zip'; readonly tenthsZ: number; readonly tenthsI: number };

interface RawLoad {
  readonly connection: ConnectionSpec;
  readonly starPoint: 'unset' | 'neutral' | 'floating';
  /** 0..1, log-scaled between the smallest and largest load size. */
  readonly size: number;
  readonly pf: number;
  readonly sense: 'unset' | 'lagging' | 'leading';
  readonly form: RatingForm;
  readonly generating: boolean;
  readonly model: ModelChoice;
}

interface RawSource {
  readonly kind: 'ideal' | 'impedance' | 'transformer';
  /** Voltage drop, as a fraction, that the source impedance alone gives at the board's total load. */
  readonly sourceDrop: number;
  readonly xOverR: number;
  readonly transformerMargin: number;
  readonly line: 'zero' | 'direct' | 'per-length';
  readonly lineDrop: number;
  readonly neutral: 'zero' | 'direct' | 'per-length';
  readonly neutralDrop: number;
  readonly lengthM: number;
}

const unit = fc.double({ min: 0, max: 1, noNaN: true });

const modelArb = (models: BoardArbOptions['models']): fc.Arbitrary<ModelChoice> =>
  models === 'constant-impedance'
    ? fc.constant({ kind: 'model', model: 'constant-impedance' } as const)
    : fc.oneof(
        fc.constant({ kind: 'default' } as const),
        fc.constantFrom(...(['constant-impedance', 'constant-current', 'constant-power'] as const)).map((model) => ({ kind: 'model', model }) as const),
        fc
          .tuple(fc.integer({ min: 0, max: 10 }), fc.integer({ min: 0, max: 10 }))
          .filter(([z, i]) => z + i <= 10)
          .map(([tenthsZ, tenthsI]) => ({ kind: 'zip', tenthsZ, tenthsI }) as const),
      );

function rawLoadArb(connections: readonly ConnectionSpec[], options: BoardArbOptions): fc.Arbitrary<RawLoad> {
  return fc.record({
    connection: fc.constantFrom(...connections),
    starPoint: fc.constantFrom('unset', 'neutral', 'floating'),
    size: unit,
    pf: fc.double({ min: 0.5, max: 1, noNaN: true }),
    sense: fc.constantFrom('unset', 'lagging', 'leading'),
    form: fc.constantFrom(...RATING_FORMS),
    // About one load in six generates, where the options allow it.
    generating: options.generation === false ? fc.constant(false) : fc.integer({ min: 0, max: 5 }).map((k) => k === 0),
    model: modelArb(options.models),
  });
}

function rawSourceArb(options: BoardArbOptions): fc.Arbitrary<RawSource> {
  const ideal = options.source === 'ideal';
  const kinds = ideal ? (['ideal'] as const) : options.source === 'non-ideal' ? (['impedance', 'transformer'] as const) : (['ideal', 'impedance', 'transformer'] as const);
  const conductor = ideal ? fc.constant('zero' as const) : fc.constantFrom('zero', 'direct', 'per-length');
  return fc.record({
    kind: fc.constantFrom(...kinds),
    sourceDrop: fc.double({ min: 0.001, max: 0.01, noNaN: true }),
    xOverR: fc.double({ min: 0, max: 10, noNaN: true }),
    transformerMargin: fc.double({ min: 3, max: 10, noNaN: true }),
    line: conductor,
    lineDrop: fc.double({ min: 0.001, max: 0.01, noNaN: true }),
    neutral: conductor,
    neutralDrop: fc.double({ min: 0.001, max: 0.01, noNaN: true }),
    lengthM: fc.double({ min: 5, max: 200, noNaN: true }),
  });
}

type Voltage = BoardSpec['supply']['voltage'];

function voltageArb(system: SystemKind): fc.Arbitrary<Voltage> {
  switch (system) {
    case 'three-phase-4wire':
    case 'three-phase-3wire':
      return fc.oneof(
        fc.constantFrom(400, 415, 380, 208, 480).map((lineToLine) => ({ lineToLine })),
        fc.constantFrom(230, 240, 120, 277).map((lineToNeutral) => ({ lineToNeutral })),
      );
    case 'split-phase':
      return fc.oneof(fc.constantFrom(240, 230).map((lineToLine) => ({ lineToLine })), fc.constantFrom(120, 115).map((lineToNeutral) => ({ lineToNeutral })));
    case 'single-phase':
      return fc.constantFrom(230, 240, 120).map((lineToNeutral) => ({ lineToNeutral }));
  }
}

const PHASES_OF: Readonly<Record<SystemKind, readonly ('A' | 'B' | 'C')[]>> = {
  'three-phase-4wire': ['A', 'B', 'C'],
  'three-phase-3wire': ['A', 'B', 'C'],
  'split-phase': ['A', 'B'],
  'single-phase': ['A'],
};

interface RawEmf {
  readonly uneven: boolean;
  readonly dv: readonly number[];
  readonly dAngle: readonly number[];
}

const emfArb = (options: BoardArbOptions): fc.Arbitrary<RawEmf> =>
  fc.record({
    // One board in four gets explicit, slightly uneven EMFs (±3 % and ±3°).
    uneven: options.emf === 'balanced' ? fc.constant(false) : fc.integer({ min: 0, max: 3 }).map((k) => k === 0),
    dv: fc.array(fc.double({ min: -0.03, max: 0.03, noNaN: true }), { minLength: 3, maxLength: 3 }),
    dAngle: fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 3, maxLength: 3 }),
  });

const floatingStar = (raw: RawLoad, system: SystemKind) =>
  raw.connection === 'ABC-star' && (system === 'three-phase-3wire' || raw.starPoint === 'floating');

/**
 * A floating star of constant-power branches has no unique operating point:
 * with line voltages unbalanced by d its star point has two solutions about
 * ±V·√(d/3) from the centroid, and the load iteration creeps between them (its
 * gain there is 1), so it may not settle. Such loads keep at most 30 % constant
 * power here, the rest constant current or impedance; that is a property of
 * the load model, not something these laws are about.
 */
function tameFloatingStar(model: ModelChoice, form: RatingForm): ModelChoice {
  const defaultIsPower = form !== 'ohms';
  if ((model.kind === 'default' && defaultIsPower) || (model.kind === 'model' && model.model === 'constant-power'))
    return { kind: 'model', model: 'constant-current' };
  if (model.kind === 'zip' && model.tenthsZ + model.tenthsI < 7) return { kind: 'zip', tenthsZ: 7 - model.tenthsI, tenthsI: model.tenthsI };
  return model;
}

/** Largest load size for a board of this line-to-neutral voltage, VA. */
const largestLoadVA = (ln: number) => 50_000 * (ln / 230) ** 2;
const smallestLoadVA = 300;

function loadSpec(raw: RawLoad, index: number, system: SystemKind, ln: number, ll: number): { load: LoadSpec; apparentVA: number } {
  const s = smallestLoadVA * (largestLoadVA(ln) / smallestLoadVA) ** raw.size;
  const angle = Math.acos(raw.pf);
  const leading = raw.sense === 'leading';
  const senseField = raw.sense === 'unset' ? {} : { sense: raw.sense };
  const gen = raw.generating ? -1 : 1;
  const base = { name: `L${index + 1}`, connection: raw.connection };
  const star =
    raw.connection === 'ABC-star' && raw.starPoint !== 'unset' && !(raw.starPoint === 'neutral' && system === 'three-phase-3wire')
      ? { starPoint: raw.starPoint }
      : {};
  let rating: Partial<LoadSpec>;
  switch (raw.form) {
    case 'kW+pf':
      rating = { kW: (gen * s * raw.pf) / 1000, pf: raw.pf, ...senseField };
      break;
    case 'kVA+pf':
      rating = { kVA: s / 1000, pf: raw.pf, ...senseField };
      break;
    case 'A+pf':
      rating = { A: s / currentRatingVoltage(raw.connection, ln, ll), pf: raw.pf, ...senseField };
      break;
    case 'kW+kvar':
      rating = { kW: (gen * s * raw.pf) / 1000, kvar: ((leading ? -1 : 1) * s * Math.sin(angle)) / 1000 };
      break;
    case 'ohms': {
      const { count, voltage } = branchShape(raw.connection, ln, ll);
      const z = (voltage * voltage * count) / s;
      rating = { ohms: { r: z * raw.pf, x: (leading ? -1 : 1) * z * Math.sin(angle) } };
      break;
    }
  }
  const m = floatingStar(raw, system) ? tameFloatingStar(raw.model, raw.form) : raw.model;
  const model =
    m.kind === 'model' ? { model: m.model } : m.kind === 'zip' ? { zip: { z: m.tenthsZ / 10, i: m.tenthsI / 10, p: (10 - m.tenthsZ - m.tenthsI) / 10 } } : {};
  return { load: { ...base, ...star, ...rating, ...model } as LoadSpec, apparentVA: s };
}

/** Source and feeder fields, sized so each element alone drops the stated fraction at the board's total load. */
function supplyImpedances(raw: RawSource, system: SystemKind, ln: number, totalVA: number) {
  const phases = PHASES_OF[system].length;
  const zBase = (ln * ln) / (totalVA / phases);
  const rx = (magnitude: number) => {
    const r = magnitude / Math.sqrt(1 + raw.xOverR ** 2);
    return { r, x: r * raw.xOverR };
  };
  const conductor = (kind: RawSource['line'], drop: number) => {
    if (kind === 'zero') return undefined;
    const { r, x } = rx(drop * zBase);
    return kind === 'direct' ? { r, x } : { lengthM: raw.lengthM, rOhmPerKm: (r * 1000) / raw.lengthM, xOhmPerKm: (x * 1000) / raw.lengthM };
  };
  const source =
    raw.kind === 'impedance'
      ? { impedance: rx(raw.sourceDrop * zBase) }
      : raw.kind === 'transformer'
        ? { transformer: { kVA: (raw.transformerMargin * totalVA) / 1000, impedancePercent: 3 + 300 * raw.sourceDrop, xOverR: raw.xOverR } }
        : {};
  const line = conductor(raw.line, raw.lineDrop);
  // A feeder with line conductors states its neutral, a zero one too: a file without it is refused where loads use it.
  const neutral = system === 'three-phase-3wire' ? undefined : (conductor(raw.neutral, raw.neutralDrop) ?? (line ? { r: 0, x: 0 } : undefined));
  const feeder = line || neutral ? { feeder: { ...(line ? { line } : {}), ...(neutral ? { neutral } : {}) } } : {};
  return { source, feeder };
}

interface RawBoard {
  readonly voltage: Voltage;
  readonly frequencyHz: 50 | 60;
  readonly sequence: 'unset' | 'ABC' | 'ACB';
  readonly loads: readonly RawLoad[];
  readonly source: RawSource;
  readonly emf: RawEmf;
}

function buildSpec(system: SystemKind, raw: RawBoard, ln: number, loads: readonly { load: LoadSpec; apparentVA: number }[]): BoardSpec {
  const totalVA = loads.reduce((s, l) => s + l.apparentVA, 0);
  const { source, feeder } = supplyImpedances(raw.source, system, ln, totalVA);
  const threePhase = system === 'three-phase-4wire' || system === 'three-phase-3wire';
  const sequence = threePhase && raw.sequence !== 'unset' ? raw.sequence : undefined;
  const nominalAngles = system === 'split-phase' ? [0, 180] : sequence === 'ACB' ? [0, 120, -120] : [0, -120, 120];
  const emf = raw.emf.uneven
    ? {
        emf: Object.fromEntries(
          PHASES_OF[system].map((p, k) => [p, { V: ln * (1 + raw.emf.dv[k]!), angleDeg: nominalAngles[k]! + raw.emf.dAngle[k]! }]),
        ),
      }
    : {};
  return {
    name: 'random board',
    supply: { system, voltage: raw.voltage, frequencyHz: raw.frequencyHz, ...(sequence ? { sequence } : {}), ...emf, ...source },
    ...feeder,
    loads: loads.map((l) => l.load),
  };
}

function boardFromRaw(system: SystemKind, raw: RawBoard): BoardSpec {
  const probe: BoardSpec = { supply: { system, voltage: raw.voltage, frequencyHz: raw.frequencyHz }, loads: [] as never };
  const { ln, ll } = nominalVoltages(probe);
  return buildSpec(system, raw, ln, raw.loads.map((l, i) => loadSpec(l, i, system, ln, ll)));
}

function rawBoardArb(system: SystemKind, loads: fc.Arbitrary<RawLoad[]>, options: BoardArbOptions): fc.Arbitrary<RawBoard> {
  return fc.record({
    voltage: voltageArb(system),
    frequencyHz: fc.constantFrom(50 as const, 60 as const),
    sequence: fc.constantFrom('unset' as const, 'ABC' as const, 'ACB' as const),
    loads,
    source: rawSourceArb(options),
    emf: emfArb(options),
  });
}

/** Random valid boards of every system and load kind (see the module comment). */
export function boardSpecArb(options: BoardArbOptions = {}): fc.Arbitrary<BoardSpec> {
  const systems = options.systems ?? ALL_SYSTEMS;
  return fc.constantFrom(...systems).chain((system) => {
    const loads = fc.array(rawLoadArb(CONNECTIONS_OF[system], options), { minLength: 1, maxLength: options.maxLoads ?? 6 });
    return rawBoardArb(system, loads, options).map((raw) => boardFromRaw(system, raw));
  });
}

/** The same load on every phase: one group of a balanced board. */
function balancedGroupArb(system: SystemKind, options: BoardArbOptions): fc.Arbitrary<RawLoad[]> {
  const groups: (readonly ConnectionSpec[])[] =
    system === 'split-phase'
      ? [['A-N', 'B-N'], ['A-B']]
      : system === 'three-phase-3wire'
        ? [['ABC-star'], ['ABC-delta'], ['A-B', 'B-C', 'C-A']]
        : [['ABC-star'], ['ABC-delta'], ['A-N', 'B-N', 'C-N'], ['A-B', 'B-C', 'C-A']];
  return fc.tuple(fc.constantFrom(...groups), rawLoadArb(['A-B'], options)).map(([connections, template]) => connections.map((connection) => ({ ...template, connection })));
}

/**
 * Balanced boards: balanced EMFs (three-phase or split-phase), symmetric
 * source and feeder, and loads that are either three-phase (ABC-star,
 * ABC-delta) or a set of identical per-phase loads. Any model and rating form.
 */
export function balancedBoardSpecArb(options: Omit<BoardArbOptions, 'emf' | 'systems'> = {}): fc.Arbitrary<BoardSpec> {
  const opts = { ...options, emf: 'balanced' as const };
  return fc.constantFrom<SystemKind>('three-phase-4wire', 'three-phase-3wire', 'split-phase').chain((system) => {
    const loads = fc.array(balancedGroupArb(system, opts), { minLength: 1, maxLength: 3 }).map((groups) => groups.flat());
    return rawBoardArb(system, loads, opts).map((raw) => boardFromRaw(system, raw));
  });
}
