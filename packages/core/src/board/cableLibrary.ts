/**
 * Conductor resistances by size, and their temperature correction.
 *
 * Metric sizes: IEC 60228, class 2 (stranded) conductors, maximum DC resistance at
 * 20 °C, Ω/km, plain copper and aluminium. Every value checked against three published
 * reproductions of the standard's Table 2 (test/reference/cableLibrary.test.ts names them).
 *
 * AWG/kcmil sizes: NEC Chapter 9 Table 8, uncoated stranded conductors, DC
 * resistance at 75 °C, Ω/kft. Table 8 lists 14–8 AWG twice, solid and stranded;
 * these are the stranded rows (feeder conductors of 8 AWG and up are stranded,
 * NEC 310.3(C)). Every value checked against two published reproductions of Table 8.
 *
 * Temperature: R_T = R_ref·(1 + α_ref·(T − T_ref)). α at 20 °C is 0.00393 /K for
 * copper and 0.00403 /K for aluminium (IEC 60228 Annex B gives the same
 * correction as factors); the NEC Table 8 note uses α at 75 °C, 0.00323 /K copper
 * and 0.00330 /K aluminium. These are DC resistances: skin and proximity effect
 * add a few per cent above about 150 mm² / 300 kcmil at 50–60 Hz (not modelled;
 * give r directly where that matters).
 *
 * Reactance (see conductorReactance): AWG/kcmil sizes take NEC Chapter 9 Table 9's
 * "XL (reactance) for all wires" in PVC or aluminium conduit, or in steel conduit where the
 * conductor says so, 60 Hz; mm² sizes 0.08 Ω/km at 50 Hz, typical of multicore LV cable. Both
 * scale with the supply frequency.
 */
import { PHYSICAL_RANGES, type CONDUIT_KINDS } from './boardRanges.js';
import { argumentIssueError, checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';
import { ownEntry } from '../_internal/ownEntry.js';

export type ConductorMaterial = 'copper' | 'aluminium';

/** IEC 60228 class 2, Ω/km at 20 °C. */
const IEC_60228_CLASS_2: Record<ConductorMaterial, Readonly<Record<string, number>>> = {
  copper: {
    '1.5': 12.1, '2.5': 7.41, '4': 4.61, '6': 3.08, '10': 1.83, '16': 1.15, '25': 0.727, '35': 0.524, '50': 0.387,
    '70': 0.268, '95': 0.193, '120': 0.153, '150': 0.124, '185': 0.0991, '240': 0.0754, '300': 0.0601, '400': 0.047,
    '500': 0.0366, '630': 0.0283,
  },
  aluminium: {
    '10': 3.08, '16': 1.91, '25': 1.2, '35': 0.868, '50': 0.641, '70': 0.443, '95': 0.32, '120': 0.253, '150': 0.206,
    '185': 0.164, '240': 0.125, '300': 0.1, '400': 0.0778, '500': 0.0605, '630': 0.0469, '800': 0.0367, '1000': 0.0291,
  },
};

/** NEC Chapter 9 Table 8, uncoated stranded (the stranded rows of 14–8 AWG), Ω/kft at 75 °C. Keys: AWG as written ("4/0"), kcmil as "250 kcmil". */
const NEC_TABLE_8: Record<ConductorMaterial, Readonly<Record<string, number>>> = {
  copper: {
    '14': 3.14, '12': 1.98, '10': 1.24, '8': 0.778, '6': 0.491, '4': 0.308, '3': 0.245, '2': 0.194, '1': 0.154,
    '1/0': 0.122, '2/0': 0.0967, '3/0': 0.0766, '4/0': 0.0608,
    '250 kcmil': 0.0515, '300 kcmil': 0.0429, '350 kcmil': 0.0367, '400 kcmil': 0.0321, '500 kcmil': 0.0258,
    '600 kcmil': 0.0214, '700 kcmil': 0.0184, '750 kcmil': 0.0171, '800 kcmil': 0.0161, '900 kcmil': 0.0143, '1000 kcmil': 0.0129,
  },
  aluminium: {
    '12': 3.25, '10': 2.04, '8': 1.28, '6': 0.808, '4': 0.508, '3': 0.403, '2': 0.319, '1': 0.253,
    '1/0': 0.201, '2/0': 0.159, '3/0': 0.126, '4/0': 0.1,
    '250 kcmil': 0.0847, '300 kcmil': 0.0707, '350 kcmil': 0.0605, '400 kcmil': 0.0529, '500 kcmil': 0.0424,
    '600 kcmil': 0.0353, '700 kcmil': 0.0303, '750 kcmil': 0.0282, '800 kcmil': 0.0265, '900 kcmil': 0.0235, '1000 kcmil': 0.0212,
  },
};

const ALPHA_20: Record<ConductorMaterial, number> = { copper: 0.00393, aluminium: 0.00403 };
const ALPHA_75: Record<ConductorMaterial, number> = { copper: 0.00323, aluminium: 0.0033 };
const FEET_PER_KM = 1000 / 0.3048;

/**
 * Reactance of an mm² library conductor when none is stated, Ω/km at 50 Hz: multicore LV cable,
 * 0.07–0.1 Ω/km by size (common practice; the per-conductor formula X = 0.0628·ln(2s/(a·d)) mΩ/m at
 * 50 Hz gives 0.10 for 2.5 mm² PVC and 0.07 for 95–240 mm² XLPE cores, see
 * test/reference/cableLibrary.test.ts). One value for every size: mm² cables come in too many
 * constructions (multicore, single-core trefoil or flat) for a per-size table to be the better guess.
 */
export const DEFAULT_CABLE_REACTANCE_OHM_PER_KM = 0.08;
/** The frequency DEFAULT_CABLE_REACTANCE_OHM_PER_KM is stated at, Hz. */
const DEFAULT_CABLE_REACTANCE_HZ = 50;

/**
 * NEC Chapter 9 Table 9 (600 V cables, three single conductors in conduit, 60 Hz, 75 °C),
 * "XL (reactance) for all wires", Ω to neutral per 1000 ft, by raceway: PVC and aluminium conduits
 * (non-magnetic) and steel conduit (about 25 % higher: the steel wall adds flux linkage). Each value
 * checked against two published reproductions of the table (sfasoft.com "A.C. for 600 Volt"; studylib
 * "AC Resistance and Reactance", NEC Table 9), and 14 AWG–350 kcmil a third (brunsengineering.com
 * "NEC Table 9"). Table 9 has no 700, 800 or 900 kcmil row: those are interpolated linearly in kcmil
 * between the neighbouring rows (600/750 and 750/1000), marked so in the source words.
 */
const NEC_TABLE_9_XL_OHM_PER_KFT: Readonly<Record<ConduitKind, Readonly<Record<string, number>>>> = {
  'non-magnetic': {
    '14': 0.058, '12': 0.054, '10': 0.05, '8': 0.052, '6': 0.051, '4': 0.048, '3': 0.047, '2': 0.045, '1': 0.046,
    '1/0': 0.044, '2/0': 0.043, '3/0': 0.042, '4/0': 0.041,
    '250 kcmil': 0.041, '300 kcmil': 0.041, '350 kcmil': 0.04, '400 kcmil': 0.04, '500 kcmil': 0.039,
    '600 kcmil': 0.039, '750 kcmil': 0.038, '1000 kcmil': 0.037,
  },
  steel: {
    '14': 0.073, '12': 0.068, '10': 0.063, '8': 0.065, '6': 0.064, '4': 0.06, '3': 0.059, '2': 0.057, '1': 0.057,
    '1/0': 0.055, '2/0': 0.054, '3/0': 0.052, '4/0': 0.051,
    '250 kcmil': 0.052, '300 kcmil': 0.051, '350 kcmil': 0.05, '400 kcmil': 0.049, '500 kcmil': 0.048,
    '600 kcmil': 0.048, '750 kcmil': 0.048, '1000 kcmil': 0.046,
  },
};
export type ConduitKind = (typeof CONDUIT_KINDS)[number];
const CONDUIT_WORDS: Record<ConduitKind, string> = { 'non-magnetic': 'PVC or aluminium conduit', steel: 'steel conduit' };
const NEC_TABLE_9_HZ = 60;
const TABLE_9_KCMIL = [250, 300, 350, 400, 500, 600, 750, 1000];

export interface ConductorReactance {
  /** Reactance at the supply frequency, Ω/km. */
  readonly ohmPerKm: number;
  /** Where the value comes from, in words. */
  readonly source: string;
}

/** Table 9's reactance of a kcmil size, Ω/kft: its row, or the line between the neighbouring rows. */
function table9Kcmil(column: Readonly<Record<string, number>>, kcmil: number): { value: number; interpolated: boolean } | null {
  const own = column[`${kcmil} kcmil`];
  if (own !== undefined) return { value: own, interpolated: false };
  const above = TABLE_9_KCMIL.findIndex((k) => k > kcmil);
  if (above <= 0) return null;
  const lo = TABLE_9_KCMIL[above - 1]!;
  const hi = TABLE_9_KCMIL[above]!;
  const xLo = column[`${lo} kcmil`]!;
  const xHi = column[`${hi} kcmil`]!;
  return { value: xLo + ((xHi - xLo) * (kcmil - lo)) / (hi - lo), interpolated: true };
}

/**
 * The reactance a library conductor takes when the file gives no `xOhmPerKm`, at `frequencyHz`
 * (X ∝ f): NEC Chapter 9 Table 9 for AWG/kcmil sizes in the given raceway (default PVC or aluminium
 * conduit), DEFAULT_CABLE_REACTANCE_OHM_PER_KM for mm² (which `conduit` does not change: the rules
 * refuse the pair). Null for an AWG size outside Table 9's range.
 */
export function conductorReactance(size: ConductorSize, frequencyHz: number, conduit: ConduitKind = 'non-magnetic'): ConductorReactance | null {
  checkObjectArgument(size, 'size', 'a conductor size: { mm2 }, { awg } or { kcmil }');
  if (!('mm2' in size) && !('awg' in size) && !('kcmil' in size)) throw argumentIssueError('size', 'a conductor size: { mm2 }, { awg } or { kcmil }', size);
  checkNumberArgument(frequencyHz, 'frequencyHz', 'a frequency, Hz, above 0', (x) => x > 0);
  if ('mm2' in size)
    return {
      ohmPerKm: (DEFAULT_CABLE_REACTANCE_OHM_PER_KM * frequencyHz) / DEFAULT_CABLE_REACTANCE_HZ,
      source: `${DEFAULT_CABLE_REACTANCE_OHM_PER_KM} Ω/km at ${DEFAULT_CABLE_REACTANCE_HZ} Hz, typical of multicore LV cable (common practice)`,
    };
  const column = NEC_TABLE_9_XL_OHM_PER_KFT[conduit];
  const row = 'awg' in size ? (column[size.awg] === undefined ? null : { value: column[size.awg]!, interpolated: false }) : table9Kcmil(column, size.kcmil);
  if (!row) return null;
  return {
    ohmPerKm: ((row.value * FEET_PER_KM) / 1000) * (frequencyHz / NEC_TABLE_9_HZ),
    source: `NEC Chapter 9 Table 9, ${CONDUIT_WORDS[conduit]}, ${row.interpolated ? 'interpolated between the neighbouring sizes' : `${row.value} Ω/kft`} at ${NEC_TABLE_9_HZ} Hz`,
  };
}
/** Operating temperature assumed when none is given, °C: the usual PVC limit for metric sizes, the NEC table's own for AWG. */
export const DEFAULT_CONDUCTOR_TEMPERATURE_C = { metric: 70, northAmerican: 75 } as const;

export type ConductorSize = { readonly mm2: number } | { readonly awg: string } | { readonly kcmil: number };

export interface ConductorResistance {
  /** Resistance at the operating temperature, Ω/km. */
  readonly ohmPerKm: number;
  /** The table value before the temperature correction, in the table's own unit. */
  readonly tableValue: number;
  readonly tableUnit: 'ohm/km at 20 °C' | 'ohm/kft at 75 °C';
  readonly table: 'IEC 60228 class 2' | 'NEC Chapter 9 Table 8';
  readonly temperatureC: number;
  /** R_T / R_table. */
  readonly temperatureFactor: number;
  /** The size in words, e.g. `95 mm²`, `4/0 AWG`, `250 kcmil`. */
  readonly label: string;
}

/** The sizes each table has, for error messages. */
export function tabulatedSizes(size: ConductorSize, material: ConductorMaterial): string[] {
  // Smallest conductor first, as the tables print them. Object.keys puts integer-like keys ('4', '14')
  // before the others ('1.5', '1/0'), so the order is restored here.
  if ('mm2' in size) return Object.keys(IEC_60228_CLASS_2[material]).sort((a, b) => Number(a) - Number(b));
  return Object.keys(NEC_TABLE_8[material])
    .filter((k) => ('kcmil' in size ? k.endsWith('kcmil') : !k.endsWith('kcmil')))
    .sort((a, b) => gaugeOrder(a) - gaugeOrder(b));
}

/** Sort key, smallest conductor first: 14 AWG … 1 AWG, then 1/0 … 4/0, then kcmil by size. */
function gaugeOrder(key: string): number {
  if (key.endsWith(' kcmil')) return Number(key.slice(0, -' kcmil'.length));
  if (key.endsWith('/0')) return Number(key.slice(0, -2));
  return -Number(key);
}

/** Resistance of one conductor at `temperatureC`, or null when the size is not in the table. */
export function conductorResistance(size: ConductorSize, material: ConductorMaterial, temperatureC?: number): ConductorResistance | null {
  if (typeof size !== 'object' || size === null || !('mm2' in size || 'awg' in size || 'kcmil' in size)) throw argumentIssueError('size', 'a conductor size { mm2 }, { awg } or { kcmil }', size);
  if (material !== 'copper' && material !== 'aluminium') throw argumentIssueError('material', '"copper" or "aluminium"', material);
  // The board file's range: the linear temperature law holds there (it would reach zero resistance near −235 °C).
  const { min, max } = PHYSICAL_RANGES.conductorTemperatureC;
  if (temperatureC !== undefined) checkNumberArgument(temperatureC, 'temperatureC', `a conductor temperature from ${min} to ${max} °C`, (t) => t >= min && t <= max);
  if ('mm2' in size) {
    const value = ownEntry(IEC_60228_CLASS_2[material], String(size.mm2));
    if (value === undefined) return null;
    const t = temperatureC ?? DEFAULT_CONDUCTOR_TEMPERATURE_C.metric;
    const factor = 1 + ALPHA_20[material] * (t - 20);
    return { ohmPerKm: value * factor, tableValue: value, tableUnit: 'ohm/km at 20 °C', table: 'IEC 60228 class 2', temperatureC: t, temperatureFactor: factor, label: `${size.mm2} mm²` };
  }
  const key = 'awg' in size ? size.awg : `${size.kcmil} kcmil`;
  const value = ownEntry(NEC_TABLE_8[material], key);
  if (value === undefined) return null;
  const t = temperatureC ?? DEFAULT_CONDUCTOR_TEMPERATURE_C.northAmerican;
  const factor = 1 + ALPHA_75[material] * (t - 75);
  return {
    ohmPerKm: value * factor * FEET_PER_KM / 1000,
    tableValue: value,
    tableUnit: 'ohm/kft at 75 °C',
    table: 'NEC Chapter 9 Table 8',
    temperatureC: t,
    temperatureFactor: factor,
    label: 'awg' in size ? `${size.awg} AWG` : key,
  };
}
