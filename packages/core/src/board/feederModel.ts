/**
 * A feeder as written (conductors by r/x, by ohm/km and length, or by size from
 * the cable library) → impedance per conductor. Assumes a validated spec.
 */
import { complex, scale, type ComplexValue } from '../complex.js';
import type { ConductorSpec, FeederSpec, PerPhaseConductorSpec } from './boardSchema.js';
import type { PhaseId } from './systemTopology.js';
import { labelIn, type PhaseNaming } from './conventions/phaseNames.js';
import { conductorReactance, conductorResistance, type ConductorMaterial, type ConductorSize } from './cableLibrary.js';

const METRES_PER_FOOT = 0.3048;

export const isPerPhaseLine = (line: ConductorSpec | PerPhaseConductorSpec): line is PerPhaseConductorSpec => 'A' in line || 'B' in line || 'C' in line;

export const materialOf = (c: ConductorSpec): ConductorMaterial => (c.material === 'aluminium' || c.material === 'aluminum' ? 'aluminium' : 'copper');

export function sizeOf(c: ConductorSpec): ConductorSize | null {
  if (c.mm2 !== undefined) return { mm2: c.mm2 };
  if (c.awg !== undefined) return { awg: c.awg };
  if (c.kcmil !== undefined) return { kcmil: c.kcmil };
  return null;
}

/** Route length of a conductor in metres: its own, else the feeder's; null when neither says. */
export function lengthOf(c: ConductorSpec, feeder: FeederSpec | undefined): number | null {
  if (c.lengthM !== undefined) return c.lengthM;
  if (c.lengthFt !== undefined) return c.lengthFt * METRES_PER_FOOT;
  if (feeder?.lengthM !== undefined) return feeder.lengthM;
  if (feeder?.lengthFt !== undefined) return feeder.lengthFt * METRES_PER_FOOT;
  return null;
}

/** Impedance of one conductor (of its parallel set) at the supply frequency, ohm. */
export function conductorImpedance(c: ConductorSpec | undefined, feeder: FeederSpec | undefined, frequencyHz: number): ComplexValue {
  if (!c) return complex(0, 0);
  const parallel = c.parallel ?? 1;
  let z = complex(c.r ?? 0, c.x ?? 0);
  const length = lengthOf(c, feeder);
  const size = sizeOf(c);
  if (size && length !== null) {
    const r = conductorResistance(size, materialOf(c), c.temperatureC);
    const x = c.xOhmPerKm ?? conductorReactance(size, frequencyHz, c.conduit)?.ohmPerKm ?? Number.NaN;
    z = complex(((r?.ohmPerKm ?? Number.NaN) * length) / 1000, (x * length) / 1000);
  } else if (c.rOhmPerKm !== undefined && length !== null) {
    z = complex((c.rOhmPerKm * length) / 1000, ((c.xOhmPerKm ?? 0) * length) / 1000);
  }
  return scale(z, 1 / parallel);
}

/**
 * A length at its usual precision (whole feet, 0.1 m), with more digits where that would print a real
 * length as 0 (a 0.001 ft jumper is not "0 ft"), and "< 0.01" below that.
 */
export function lengthFigure(x: number, digits: number): string {
  const usual = +x.toFixed(digits);
  if (usual !== 0 || x === 0) return String(usual);
  return x >= 0.01 ? String(+x.toPrecision(2)) : '< 0.01';
}

/** The conductor in words, e.g. `95 mm² Cu ×2, 40 m`, or null when it is given as plain ohms. */
export function describeConductor(c: ConductorSpec | undefined, feeder: FeederSpec | undefined): string | null {
  if (!c) return null;
  const size = sizeOf(c);
  const length = lengthOf(c, feeder);
  if (!size) return null;
  const r = conductorResistance(size, materialOf(c), c.temperatureC);
  const metal = materialOf(c) === 'copper' ? 'Cu' : 'Al';
  const set = (c.parallel ?? 1) > 1 ? ` ×${c.parallel}` : '';
  const len = length === null ? '' : c.lengthFt !== undefined || (c.lengthM === undefined && feeder?.lengthFt !== undefined) ? `, ${lengthFigure(length / METRES_PER_FOOT, 0)} ft` : `, ${lengthFigure(length, 1)} m`;
  const raceway = c.conduit === 'steel' ? ', steel conduit' : '';
  return `${r?.label ?? '?'} ${metal}${set}${len} at ${r ? +r.temperatureC.toFixed(1) : '?'} °C${raceway}`;
}

/**
 * The route lengths of a feeder's conductors, m, where the file gives them unalike (each line's in the
 * order of the phases, then the neutral's; null where a conductor is given as plain ohms, or absent).
 * The conductors of one feeder run together, so lengths far apart are likely a slip: the warnings judge it.
 */
export interface FeederRouteLengths {
  readonly lines: readonly (number | null)[];
  readonly neutral: number | null;
  /** The unit the file wrote each one in (the lines', then the neutral's), so the warning quotes each figure as written. */
  readonly lineUnits: readonly LengthUnit[];
  readonly neutralUnit: LengthUnit;
}

export type LengthUnit = 'm' | 'ft';

/** The unit a conductor's route length is written in: its own length's, else the feeder's (lengthM first, as lengthOf reads them). */
function lengthUnitOf(c: ConductorSpec | undefined, feeder: FeederSpec | undefined): LengthUnit {
  if (c?.lengthM !== undefined) return 'm';
  if (c?.lengthFt !== undefined) return 'ft';
  return feeder?.lengthM === undefined && feeder?.lengthFt !== undefined ? 'ft' : 'm';
}

export interface FeederModel {
  readonly lineImpedances: ComplexValue[];
  readonly neutralImpedance: ComplexValue;
  /** The smallest rating given for a line conductor (the weakest phase limits the feeder), A. */
  readonly lineRatingA: number | null;
  /** Each line conductor's own rating, A, in the order of the phases (null where none is given). */
  readonly lineRatingsA: readonly (number | null)[];
  readonly neutralRatingA: number | null;
  readonly description: string | null;
  /** Present only where the conductors' route lengths differ. */
  readonly unequalLengths?: FeederRouteLengths;
}

/** Route length of a conductor as its impedance reads it: null for plain ohms (no length enters). */
function routeLength(c: ConductorSpec | undefined, feeder: FeederSpec | undefined): number | null {
  if (!c || (sizeOf(c) === null && c.rOhmPerKm === undefined)) return null;
  return lengthOf(c, feeder);
}

function unequalLengths(conductors: readonly (ConductorSpec | undefined)[], neutral: ConductorSpec | undefined, feeder: FeederSpec | undefined): FeederRouteLengths | undefined {
  const lines = conductors.map((c) => routeLength(c, feeder));
  const neutralM = routeLength(neutral, feeder);
  const given = [...lines, neutralM].filter((m): m is number => m !== null);
  if (given.every((m) => m === given[0])) return undefined;
  return { lines, neutral: neutralM, lineUnits: conductors.map((c) => lengthUnitOf(c, feeder)), neutralUnit: lengthUnitOf(neutral, feeder) };
}

/**
 * The rating of a conductor's parallel set, A: `ratingA` is one conductor's (the schema says so), and
 * conductors in parallel share the current, so the set carries `parallel` × that (any grouping derating
 * is in the figure the file gives); null without a rating.
 */
export const setRatingA = (c: ConductorSpec | undefined): number | null => (c?.ratingA === undefined ? null : c.ratingA * (c.parallel ?? 1));

/** @param naming how the file names the phases: a description per phase uses it (`L1: …`) @defaultValue 'A/B/C' */
export function feederModel(feeder: FeederSpec | undefined, phases: readonly PhaseId[], frequencyHz: number, naming: PhaseNaming = 'A/B/C'): FeederModel {
  const line = feeder?.line;
  const perPhase = line && isPerPhaseLine(line) ? line : null;
  const conductorOf = (p: PhaseId): ConductorSpec | undefined => (perPhase ? perPhase[p] : (line as ConductorSpec | undefined));
  const ratings = phases.map((p) => setRatingA(conductorOf(p))).filter((a): a is number => a !== null);
  const lineWords = [...new Set(phases.map((p) => describeConductor(conductorOf(p), feeder)))];
  const neutralWords = describeConductor(feeder?.neutral, feeder);
  const lineText = lineWords.length === 1 ? lineWords[0] : lineWords.every((w) => w !== null) ? phases.map((p) => `${labelIn(naming, p)}: ${describeConductor(conductorOf(p), feeder)}`).join('; ') : null;
  const description = lineText ? (neutralWords && neutralWords !== lineText ? `${lineText}; neutral ${neutralWords}` : lineText) : null;
  const lengths = unequalLengths(phases.map(conductorOf), feeder?.neutral, feeder);
  return {
    lineImpedances: phases.map((p) => conductorImpedance(conductorOf(p), feeder, frequencyHz)),
    neutralImpedance: conductorImpedance(feeder?.neutral, feeder, frequencyHz),
    lineRatingA: ratings.length ? Math.min(...ratings) : null,
    lineRatingsA: phases.map((p) => setRatingA(conductorOf(p))),
    neutralRatingA: setRatingA(feeder?.neutral),
    description,
    ...(lengths ? { unequalLengths: lengths } : {}),
  };
}
