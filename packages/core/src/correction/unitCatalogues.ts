/**
 * Built-in typical catalogues of low-voltage capacitor units, one per regional
 * practice, used when a study gives no catalogue. Typical catalogue practice,
 * not any vendor's range (from memory; every result that uses them says so):
 *
 * - IEC practice, 50 Hz: three-phase units (three delta elements in one case)
 *   rated 400, 415, 440, 480 and 525 V; single-phase units for line-to-neutral
 *   banks on 230 V networks rated 250 and 280 V, and for line-to-line use at the
 *   three-phase voltages.
 * - North-American practice, 60 Hz: three-phase units rated 208, 240, 480 and
 *   600 V; single-phase units at the same voltages.
 */
import type { CapacitorUnitSpec, Practice } from './correctionSpec.js';

/** A catalogue unit with its kind resolved. */
export interface CatalogueUnit {
  readonly name: string;
  readonly kind: 'three-phase' | 'single-phase';
  /** Nameplate of the whole unit, kvar (all three elements of a three-phase unit). */
  readonly ratedKvar: number;
  /** Rated voltage, V (line-to-line for a three-phase unit). */
  readonly ratedV: number;
  readonly ratedHz: 50 | 60;
}

export interface TypicalCatalogue {
  readonly practice: Practice;
  /** How reports name it. */
  readonly title: string;
  readonly units: readonly CatalogueUnit[];
}

const IEC_THREE_PHASE_KVAR = [2.5, 5, 6.25, 7.5, 10, 12.5, 15, 20, 25, 30, 40, 50];
const IEC_SINGLE_PHASE_KVAR = [0.5, 1, 1.5, 2, 2.5, 3.33, 5, 6.67, 8.33, 10];
const NA_THREE_PHASE_KVAR = [1, 1.5, 2, 2.5, 3, 4, 5, 7.5, 10, 15, 20, 25, 30, 40, 50];
const NA_SINGLE_PHASE_KVAR = [0.5, 1, 1.5, 2, 2.5, 3.33, 5, 7.5, 10];

const label = (kvar: number) => (Number.isInteger(kvar * 10) ? kvar.toString() : kvar.toFixed(2));

function units(kind: CatalogueUnit['kind'], kvars: readonly number[], volts: readonly number[], hz: 50 | 60): CatalogueUnit[] {
  const word = kind === 'three-phase' ? '3-ph' : '1-ph';
  return volts.flatMap((v) => kvars.map((kvar) => ({ name: `typical ${word} ${label(kvar)} kvar ${v} V ${hz} Hz`, kind, ratedKvar: kvar, ratedV: v, ratedHz: hz })));
}

/** The two typical catalogues, marked typical in every unit name. */
export const TYPICAL_CATALOGUES: Readonly<Record<Practice, TypicalCatalogue>> = Object.freeze({
  iec: {
    practice: 'iec',
    title: 'built-in typical IEC catalogue (50 Hz)',
    units: Object.freeze([
      ...units('three-phase', IEC_THREE_PHASE_KVAR, [400, 415, 440, 480, 525], 50),
      ...units('single-phase', IEC_SINGLE_PHASE_KVAR, [250, 280, 400, 415, 440, 480, 525], 50),
    ]),
  },
  'north-american': {
    practice: 'north-american',
    title: 'built-in typical North-American catalogue (60 Hz)',
    units: Object.freeze([
      ...units('three-phase', NA_THREE_PHASE_KVAR, [208, 240, 480, 600], 60),
      ...units('single-phase', NA_SINGLE_PHASE_KVAR, [208, 240, 480, 600], 60),
    ]),
  },
});

/** A user's catalogue entry with its defaults filled (a unit without `kind` is single-phase). */
export const catalogueUnitOf = (unit: CapacitorUnitSpec, index: number): CatalogueUnit => ({
  name: unit.name ?? `catalogue[${index}]`,
  kind: unit.kind ?? 'single-phase',
  ratedKvar: unit.ratedKvar,
  ratedV: unit.ratedV,
  ratedHz: unit.ratedHz,
});
