/**
 * BoardSpec (what the user wrote) → Board (SI units, complex impedances,
 * branches). Assumes a validated spec; see `validateBoard`.
 */
import { complex, degToRad, inverse, polar, scale, conj, type ComplexValue } from '../complex.js';
import type { BoardSpec, ConductorSpec, LoadSpec } from './boardSchema.js';
import type { Board, BoardLoad, LoadBranch, Terminal, ZipFractions } from './boardModel.js';
import { phasesOf, systemHasNeutral, type PhaseId } from './systemTopology.js';

const ZIP_OF_MODEL: Record<string, ZipFractions> = {
  'constant-impedance': { z: 1, i: 0, p: 0 },
  'constant-current': { z: 0, i: 1, p: 0 },
  'constant-power': { z: 0, i: 0, p: 1 },
};

/** Angle of each phase EMF for a balanced source, degrees. */
export function balancedAnglesDeg(system: BoardSpec['supply']['system'], sequence: 'ABC' | 'ACB'): number[] {
  if (system === 'single-phase') return [0];
  if (system === 'split-phase') return [0, 180];
  return sequence === 'ABC' ? [0, -120, 120] : [0, 120, -120];
}

function nominalVoltages(spec: BoardSpec): { ln: number; ll: number | null } {
  const { lineToLine, lineToNeutral } = spec.supply.voltage;
  const ratio = spec.supply.system === 'split-phase' ? 2 : Math.sqrt(3);
  if (spec.supply.system === 'single-phase') return { ln: lineToNeutral ?? Number.NaN, ll: null };
  if (lineToNeutral !== undefined) return { ln: lineToNeutral, ll: lineToNeutral * ratio };
  const ll = lineToLine ?? Number.NaN;
  return { ln: ll / ratio, ll };
}

function conductorImpedance(c: ConductorSpec | undefined): ComplexValue {
  if (!c) return complex(0, 0);
  if (c.lengthM !== undefined) return complex(((c.rOhmPerKm ?? 0) * c.lengthM) / 1000, ((c.xOhmPerKm ?? 0) * c.lengthM) / 1000);
  return complex(c.r ?? 0, c.x ?? 0);
}

/**
 * Source impedance per line. From a transformer: |Z| = u_k·V²/S referred to the
 * board voltage, split by X/R. On a split-phase supply each half-winding is
 * taken as half the full-winding impedance (a simplification; real centre-tapped
 * units have a higher line-to-neutral impedance — common practice, no source).
 */
function sourceImpedance(spec: BoardSpec, ln: number, ll: number | null): ComplexValue {
  const { impedance, transformer, system } = spec.supply;
  if (impedance) return complex(impedance.r, impedance.x);
  if (!transformer) return complex(0, 0);
  const v = system === 'single-phase' ? ln : (ll ?? ln);
  let z = ((transformer.impedancePercent / 100) * v * v) / (transformer.kVA * 1000);
  if (system === 'split-phase') z /= 2;
  const r = z / Math.sqrt(1 + transformer.xOverR ** 2);
  return complex(r, r * transformer.xOverR);
}

/** Total complex power of a load at nominal voltage, VA, from its rating. */
function nominalPower(load: LoadSpec, branchVoltage: number, branchCount: number, lineCurrentToVA: number): ComplexValue {
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

function loadBranches(load: LoadSpec, index: number, spec: BoardSpec, ln: number, ll: number | null): BoardLoad {
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
    return { name: load.name, connection: load.connection, model, branches, origin: 'board' };
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

/** Turns a validated board spec into the solver's model. */
export function normaliseBoard(spec: BoardSpec): Board {
  const system = spec.supply.system;
  const phases = phasesOf(system);
  const sequence = spec.supply.sequence ?? 'ABC';
  const { ln, ll } = nominalVoltages(spec);
  const angles = balancedAnglesDeg(system, sequence);
  const emf = phases.map((p, k) => {
    const given = spec.supply.emf?.[p];
    return given ? polar(given.V, degToRad(given.angleDeg)) : polar(ln, degToRad(angles[k]!));
  });
  return {
    name: spec.name ?? 'board',
    system,
    phases,
    hasNeutral: systemHasNeutral(system),
    frequencyHz: spec.supply.frequencyHz,
    sequence,
    nominalLineToNeutralV: ln,
    nominalLineToLineV: ll,
    emf,
    sourceImpedance: sourceImpedance(spec, ln, ll),
    lineImpedance: conductorImpedance(spec.feeder?.line),
    neutralImpedance: conductorImpedance(spec.feeder?.neutral),
    neutralOpen: false,
    lineRatingA: spec.feeder?.line?.ratingA ?? null,
    neutralRatingA: spec.feeder?.neutral?.ratingA ?? null,
    transformerKVA: spec.supply.impedance ? null : (spec.supply.transformer?.kVA ?? null),
    loads: spec.loads.map((load, i) => loadBranches(load, i, spec, ln, ll)),
    studies: { openNeutral: spec.studies?.openNeutral ?? false },
  };
}
