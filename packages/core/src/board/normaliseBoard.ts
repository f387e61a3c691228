/**
 * A board spec (what the user wrote) → Board (SI units, complex impedances,
 * branches). Assumes a validated spec; see `validateBoard`.
 */
import { add, complex, degToRad, inverse, polar, scale, sub, conj, type ComplexValue } from '../complex.js';
import type { BoardBaseSpec, LoadBaseSpec, WindingSpec } from './boardSchema.js';
import { feederModel } from './feederModel.js';
import type { Board, BoardLoad, LoadBranch, SourceUnit, Terminal, ZipFractions } from './boardModel.js';
import { phasesOf, systemHasNeutral, type PhaseId } from './systemTopology.js';
import { nominalVoltagesOf, systemNominalOf } from './nominalVoltages.js';
import { resolveConventions } from './conventions/boardConventions.js';
import { assertNormalisableBoard } from './normalisableSpec.js';

const ZIP_OF_MODEL: Record<string, ZipFractions> = {
  'constant-impedance': { z: 1, i: 0, p: 0 },
  'constant-current': { z: 0, i: 1, p: 0 },
  'constant-power': { z: 0, i: 0, p: 1 },
};

/** Angle of each phase EMF for a balanced source, degrees. */
export function balancedAnglesDeg(system: BoardBaseSpec['supply']['system'], sequence: 'ABC' | 'ACB'): number[] {
  if (system === 'single-phase') return [0];
  if (system === 'split-phase') return [0, 180];
  return sequence === 'ABC' ? [0, -120, 120] : [0, 120, -120];
}

const nominalVoltages = (spec: BoardBaseSpec) => nominalVoltagesOf(spec.supply);

/** Impedance of a transformer (or one single-phase unit) referred to `v` volts: |Z| = u_k·V²/S, split by X/R. */
function transformerImpedance(unit: { kVA: number; impedancePercent: number; xOverR: number }, v: number): ComplexValue {
  const z = ((unit.impedancePercent / 100) * v * v) / (unit.kVA * 1000);
  const r = z / Math.sqrt(1 + unit.xOverR ** 2);
  return complex(r, r * unit.xOverR);
}

const windingImpedance = (w: WindingSpec, v: number): ComplexValue => ('kVA' in w ? transformerImpedance(w, v) : complex(w.r, w.x));

/**
 * Source impedance per line (the equal short form). From a transformer: |Z| = u_k·V²/S referred to the
 * board voltage, split by X/R. On a split-phase supply each half-winding is
 * taken as half the full-winding impedance (a simplification; real centre-tapped
 * units have a higher line-to-neutral impedance — common practice, no source).
 */
function sourceImpedance(spec: BoardBaseSpec, ln: number, ll: number | null): ComplexValue {
  const { impedance, transformer, system } = spec.supply;
  if (impedance && 'r' in impedance) return complex(impedance.r, impedance.x);
  if (!transformer) return complex(0, 0);
  const v = system === 'single-phase' ? ln : (ll ?? ln);
  const z = transformerImpedance(transformer, v);
  return system === 'split-phase' ? scale(z, 0.5) : z;
}

type UnequalSourceKey = 'sourceImpedances' | 'openDeltaCorner' | 'sourceStarImpedance' | 'sourceUnits';

/** The unequal-source fields of a board: per-phase impedances, open-delta corner, star-point return. */
function unequalSource(spec: BoardBaseSpec, phases: readonly PhaseId[], ln: number, ll: number | null): Partial<Pick<Board, UnequalSourceKey>> {
  const { impedance, bank, openDelta, zeroSequence } = spec.supply;
  const out: { -readonly [K in UnequalSourceKey]?: Board[K] } = {};
  const units: SourceUnit[] = [];
  if (impedance && !('r' in impedance)) out.sourceImpedances = phases.map((p) => (impedance[p] ? complex(impedance[p].r, impedance[p].x) : complex(0, 0)));
  if (bank) {
    out.sourceImpedances = phases.map((p) => (bank[p] ? windingImpedance(bank[p], ln) : complex(0, 0)));
    for (const p of phases) {
      const w = bank[p];
      if (w && 'kVA' in w) units.push({ winding: p, kVA: w.kVA, ratedV: ln, line: p });
    }
  }
  if (openDelta) {
    const pairs = (['A-B', 'B-C', 'C-A'] as const).filter((k) => openDelta[k] !== undefined);
    const [first, second] = pairs.map((k) => k.split('-') as [PhaseId, PhaseId]);
    const corner = first!.find((p) => second!.includes(p))!;
    out.openDeltaCorner = corner;
    out.sourceImpedances = phases.map((p) => {
      if (p === corner) return complex(0, 0);
      const key = pairs.find((k) => k.includes(p))!;
      return windingImpedance(openDelta[key]!, ll ?? ln);
    });
    for (const key of pairs) {
      const w = openDelta[key]!;
      if ('kVA' in w) units.push({ winding: key, kVA: w.kVA, ratedV: ll ?? ln, line: key.split('-').find((p) => p !== corner) as PhaseId });
    }
  }
  if (units.length) out.sourceUnits = units;
  if (zeroSequence) {
    const z1 = sourceImpedance(spec, ln, ll);
    const z0 = complex(zeroSequence.r, zeroSequence.x);
    const zn = scale(sub(z0, z1), 1 / 3);
    // Z0 equal to Z1 up to round-off leaves a star-point return of ~1e-19 ohm, which would
    // stamp an admittance of ~1e18 and wreck the solve; below 1e-9 of |Z1| it is no impedance at all.
    if (Math.hypot(zn.re, zn.im) > 1e-9 * Math.max(Math.hypot(z1.re, z1.im), Math.hypot(z0.re, z0.im))) out.sourceStarImpedance = zn;
  }
  return out;
}

const mean = (zs: readonly ComplexValue[]) => scale(zs.reduce(add, complex(0, 0)), 1 / zs.length);

/** Total complex power of a load at nominal voltage, VA, from its rating. */
function nominalPower(load: LoadBaseSpec, branchVoltage: number, branchCount: number, lineCurrentToVA: number): ComplexValue {
  const sign = load.sense === 'leading' ? -1 : 1;
  const reactiveShare = (pf: number) => Math.sqrt(1 - pf * pf);
  if (load.ohms) {
    const y = inverse(complex(load.ohms.r, load.ohms.x));
    return scale(conj(y), branchVoltage * branchVoltage * branchCount);
  }
  if (load.kvar !== undefined) return complex((load.kW ?? 0) * 1000, load.kvar * 1000);
  const pf = load.pf ?? 1;
  if (load.kW !== undefined) {
    const p = load.kW * 1000;
    return complex(p, (sign * Math.abs(p) * reactiveShare(pf)) / pf);
  }
  const s = load.kVA !== undefined ? load.kVA * 1000 : (load.A ?? 0) * lineCurrentToVA;
  return complex(s * pf, sign * s * reactiveShare(pf));
}

function loadBranches(load: LoadBaseSpec, index: number, spec: BoardBaseSpec, ln: number, ll: number | null): BoardLoad {
  const zip = load.zip ?? ZIP_OF_MODEL[load.model ?? (load.ohms ? 'constant-impedance' : 'constant-power')]!;
  const model = load.zip ? 'zip' : (load.model ?? (load.ohms ? 'constant-impedance' : 'constant-power'));
  const llV = ll ?? ln;
  const make = (
    pairs: [Terminal, Terminal][],
    vNominal: number,
    lineCurrentToVA: number,
    total = nominalPower(load, vNominal, pairs.length, lineCurrentToVA),
  ): BoardLoad => {
    const share = scale(total, 1 / pairs.length);
    const branches: LoadBranch[] = pairs.map(([from, to]) => ({ from, to, sNominal: share, vNominal, zip }));
    const pfAssumed = load.kW !== undefined && load.pf === undefined && load.kvar === undefined;
    const schedule = {
      ...(load.circuit !== undefined ? { circuit: load.circuit } : {}),
      ...(load.breakerA !== undefined ? { breakerA: load.breakerA } : {}),
      ...(load.poles !== undefined ? { poles: load.poles } : {}),
      ...(load.continuous !== undefined ? { continuous: load.continuous } : {}),
    };
    return {
      name: load.name,
      connection: load.connection,
      model,
      branches,
      origin: 'board',
      ...(pfAssumed ? { pfAssumed } : {}),
      ...(Object.keys(schedule).length ? { schedule } : {}),
    };
  };
  const c = load.connection;
  if (c === 'ABC-star') {
    const floating = load.starPoint === 'floating' || !systemHasNeutral(spec.supply.system);
    // A floating star of voltage-dependent elements has no unique operating point (the star point
    // can settle in more than one place), so such a load is taken as its equivalent delta: the same
    // rating spread over the three line-to-line pairs. Constant-impedance stars keep their real star
    // point, whose shift is reported.
    if (floating && zip.z !== 1)
      return make([['A', 'B'], ['B', 'C'], ['C', 'A']], llV, Math.sqrt(3) * llV, nominalPower(load, ln, 3, Math.sqrt(3) * llV));
    const star: Terminal = floating ? `star:${index}` : 'N';
    return make([['A', star], ['B', star], ['C', star]], ln, Math.sqrt(3) * llV);
  }
  if (c === 'ABC-delta') return make([['A', 'B'], ['B', 'C'], ['C', 'A']], llV, Math.sqrt(3) * llV);
  const [from, to] = c.split('-') as [PhaseId, PhaseId | 'N'];
  const v = to === 'N' ? ln : llV;
  return make([[from, to]], v, v);
}

/**
 * Turns a validated board spec into the solver's model.
 * @throws {InputError} for a spec lacking, or with the wrong kind of, a field it reads (see normalisableSpec.ts)
 */
export function normaliseBoard(spec: BoardBaseSpec): Board {
  assertNormalisableBoard(spec);
  return boardModelOf(spec);
}

/** normaliseBoard without the entry check: for specs built here from a checked one (an installation's boards). */
export function boardModelOf(spec: BoardBaseSpec): Board {
  const system = spec.supply.system;
  const phases = phasesOf(system);
  const sequence = spec.supply.sequence ?? 'ABC';
  const { ln, ll } = nominalVoltages(spec);
  const judged = systemNominalOf(spec.supply);
  const angles = balancedAnglesDeg(system, sequence);
  const emf = phases.map((p, k) => {
    const given = spec.supply.emf?.[p];
    return given ? polar(given.V, degToRad(given.angleDeg)) : polar(ln, degToRad(angles[k]!));
  });
  const unequal = unequalSource(spec, phases, ln, ll);
  const conventions = resolveConventions(spec, judged);
  const feeder = feederModel(spec.feeder, phases, spec.supply.frequencyHz, conventions.phaseNames);
  const first = feeder.lineImpedances[0]!;
  const unequalLines = feeder.lineImpedances.some((z) => z.re !== first.re || z.im !== first.im);
  return {
    name: spec.name ?? 'board',
    system,
    phases,
    hasNeutral: systemHasNeutral(system),
    frequencyHz: spec.supply.frequencyHz,
    sequence,
    nominalLineToNeutralV: ln,
    nominalLineToLineV: ll,
    ...(judged.ln !== ln || judged.ll !== ll ? { systemNominal: { lineToNeutralV: judged.ln, lineToLineV: judged.ll } } : {}),
    emf,
    sourceImpedance: unequal.sourceImpedances ? mean(unequal.sourceImpedances.filter((_, k) => phases[k] !== unequal.openDeltaCorner)) : sourceImpedance(spec, ln, ll),
    lineImpedance: mean(feeder.lineImpedances),
    neutralImpedance: feeder.neutralImpedance,
    neutralOpen: false,
    lineRatingA: feeder.lineRatingA,
    lineRatingsA: feeder.lineRatingsA,
    neutralRatingA: feeder.neutralRatingA,
    ...(feeder.unequalLengths ? { feederUnequalLengths: feeder.unequalLengths } : {}),
    transformerKVA: spec.supply.impedance ? null : (spec.supply.transformer?.kVA ?? null),
    loads: spec.loads.map((load, i) => loadBranches(load, i, spec, ln, ll)),
    studies: { openNeutral: spec.studies?.openNeutral ?? false },
    conventions,
    ...unequal,
    ...(unequalLines ? { lineImpedances: feeder.lineImpedances } : {}),
  };
}
