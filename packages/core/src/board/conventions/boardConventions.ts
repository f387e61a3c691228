/** A board's conventions, every default settled: what reports and checks follow. */
import type { SystemKind } from '../boardSchema.js';
import type { ConventionsSpec } from './conventionsSchema.js';
import { phaseLabels, type PhaseNaming } from './phaseNames.js';
import { inferRegion, type Region, type RegionBasis } from './region.js';
import { customLimits, DEFAULT_LIMITS_OF_REGION, presetLimits, type VoltageLimitPresetName, type VoltageLimits } from './voltageLimits.js';
import { readVoltageNotation, writeVoltageNotation } from './voltageNotation.js';
import type { PhaseId } from '../systemTopology.js';

export interface BoardConventions {
  readonly region: Region;
  /** How the region was settled: given in the file, or from the notation, a split-phase system or the frequency. */
  readonly regionBasis: RegionBasis;
  readonly phaseNames: PhaseNaming;
  /** Report label of each phase; result keys stay A/B/C. */
  readonly phaseLabels: Readonly<Record<PhaseId, string>>;
  readonly voltageLimits: VoltageLimits;
  /** The nominal voltage written the region's way ("208Y/120 V", "230/400 V", "120/240 V"). */
  readonly voltageNotation: string;
}

interface ConventionsInput {
  readonly supply: { readonly system: SystemKind; readonly frequencyHz: number; readonly voltage: object };
  readonly conventions?: ConventionsSpec | undefined;
}

export function resolveConventions(spec: ConventionsInput, nominal: { ln: number; ll: number | null }): BoardConventions {
  const given = spec.conventions ?? {};
  const v = spec.supply.voltage;
  const written = 'written' in v && typeof v.written === 'string' ? readVoltageNotation(v.written, spec.supply.system) : null;
  const inferred = inferRegion({ system: spec.supply.system, frequencyHz: spec.supply.frequencyHz, notation: written?.ok ? written.notation : null });
  const region = given.region ?? inferred.region;
  const phaseNames = given.phaseNames ?? (region === 'north-america' ? 'A/B/C' : 'L1/L2/L3');
  const limits = given.voltageLimits;
  return {
    region,
    regionBasis: given.region ? 'file' : inferred.basis,
    phaseNames,
    phaseLabels: phaseLabels(phaseNames),
    voltageLimits:
      limits === undefined
        ? presetLimits(DEFAULT_LIMITS_OF_REGION[region])
        : typeof limits === 'string'
          ? presetLimits(limits as VoltageLimitPresetName)
          : customLimits(limits.underPercent, limits.overPercent),
    // A file that wrote "208Y/120" keeps its nominal figures (not 208/√3 = 120.1).
    voltageNotation: written?.ok
      ? writeVoltageNotation(spec.supply.system, written.notation.lineToNeutralV, written.notation.lineToLineV, region)
      : writeVoltageNotation(spec.supply.system, nominal.ln, nominal.ll, region),
  };
}

/** A board's conventions: those settled from its file, or the defaults for a board built in code. */
export function conventionsOf(board: {
  readonly conventions?: BoardConventions;
  readonly system: SystemKind;
  readonly frequencyHz: number;
  readonly nominalLineToNeutralV: number;
  readonly nominalLineToLineV: number | null;
  readonly systemNominal?: { readonly lineToNeutralV: number; readonly lineToLineV: number | null };
}): BoardConventions {
  return (
    board.conventions ??
    resolveConventions({ supply: { system: board.system, frequencyHz: board.frequencyHz, voltage: {} } }, board.systemNominal ? { ln: board.systemNominal.lineToNeutralV, ll: board.systemNominal.lineToLineV } : { ln: board.nominalLineToNeutralV, ll: board.nominalLineToLineV })
  );
}
