/**
 * The levels a board's harmonic voltages are judged against, one table per document, each figure
 * with its source: the IEC 61000-2-2 compatibility levels of public LV networks, the EN 50160
 * supply levels at LV, and IEEE 519's flat bus limits at ≤ 1 kV. All % of the fundamental of the
 * voltage judged. An IEC board takes IEC 61000-2-2, a North-American board IEEE 519, unless
 * `harmonics.voltageDistortionLimits` names another.
 */
import type { Region } from '../board/conventions/region.js';
import { IEEE_519_VOLTAGE_LIMITS, IEEE_519_VOLTAGE_SOURCE } from './ieee519.js';

export const VOLTAGE_DISTORTION_BASES = ['iec-61000-2-2', 'en50160', 'ieee-519'] as const;
export type VoltageDistortionBasis = (typeof VOLTAGE_DISTORTION_BASES)[number];

export interface VoltageDistortionLimits {
  readonly basis: VoltageDistortionBasis;
  /** How reports name the document and what its figures are: `IEC 61000-2-2 compatibility levels`. */
  readonly name: string;
  readonly thdPercent: number;
  /** The one level every order is judged against (IEEE 519); null where each order has its own. */
  readonly flatPercent: number | null;
  /** The level of order h, % of the fundamental; null where the document gives none (EN 50160 above the 25th). */
  readonly orderPercent: (h: number) => number | null;
  readonly source: string;
}

/** A level from a formula of the order, to 0.01 %: the figure printed is the figure judged. */
const hundredths = (x: number) => Math.round(x * 100) / 100;

/**
 * IEC 61000-2-2 (ed. 2, 2002) Table 1, compatibility levels for individual harmonic voltages in public
 * LV networks, FROM MEMORY (the standard's own table could not be checked): 2nd 2 %, 3rd 5 %, 4th 1 %,
 * 5th 6 %, 6th 0.5 %, 7th 5 %, 9th 1.5 %, 11th 3.5 %, 13th 3 %, 15th 0.4 %, 21st 0.3 %, triplens 27–45
 * 0.2 %, other odd orders 17–49 2.27·(17/h) − 0.27, even orders 8–50 0.25·(10/h) + 0.25 (formula orders
 * rounded to 0.01 %), THD 8 %. Cross-checks: orders 2–13 and the 8 % THD equal EN 50160's LV table
 * (confirmed below), and the 3rd at 5 % and the 5th at 6 % are named for IEC 61000-2-2 in a published
 * engineering forum answer (confirmed secondary).
 */
function iec61000_2_2Level(h: number): number | null {
  if (h % 2 === 0) return h === 2 ? 2 : h === 4 ? 1 : h === 6 ? 0.5 : hundredths(0.25 * (10 / h) + 0.25);
  if (h % 3 === 0) return h === 3 ? 5 : h === 9 ? 1.5 : h === 15 ? 0.4 : h === 21 ? 0.3 : 0.2;
  const low: Record<number, number> = { 5: 6, 7: 5, 11: 3.5, 13: 3 };
  return low[h] ?? hundredths(2.27 * (17 / h) - 0.27);
}

/**
 * EN 50160 (2010) supply voltage at LV, 95 % of the 10-minute means of a week: odd orders not multiple
 * of 3: 5th 6 %, 7th 5 %, 11th 3.5 %, 13th 3 %, 17th 2 %, 19th, 23rd, 25th 1.5 %; multiples of 3: 3rd
 * 5 %, 9th 1.5 %, 15th and 21st 0.5 %; even: 2nd 2 %, 4th 1 %, 6th–24th 0.5 %; none above the 25th;
 * THD 8 % (orders to the 40th). Confirmed: a meter maker's EN 50160:2010 technical note and another's
 * conformance appendix list the same LV table.
 */
const EN_50160: Readonly<Record<number, number>> = { 2: 2, 3: 5, 4: 1, 5: 6, 7: 5, 9: 1.5, 11: 3.5, 13: 3, 15: 0.5, 17: 2, 19: 1.5, 21: 0.5, 23: 1.5, 25: 1.5 };
function en50160Level(h: number): number | null {
  if (h > 25) return null;
  return EN_50160[h] ?? (h % 2 === 0 ? 0.5 : null);
}

export const VOLTAGE_DISTORTION_LIMITS: Readonly<Record<VoltageDistortionBasis, VoltageDistortionLimits>> = {
  'iec-61000-2-2': {
    basis: 'iec-61000-2-2',
    name: 'IEC 61000-2-2 compatibility levels',
    thdPercent: 8,
    flatPercent: null,
    orderPercent: iec61000_2_2Level,
    source:
      'IEC 61000-2-2 Table 1, public LV networks, from memory (orders 2–13 and THD 8 % equal EN 50160’s LV table, confirmed; above: 15th 0.4 %, 21st 0.3 %, other triplens 0.2 %, odd 2.27·(17/h) − 0.27 %, even 0.25·(10/h) + 0.25 %, to 0.01 %); THD of every order solved',
  },
  'en50160': {
    basis: 'en50160',
    name: 'EN 50160 supply levels',
    thdPercent: 8,
    flatPercent: null,
    orderPercent: en50160Level,
    source:
      'EN 50160:2010 LV supply levels, 95 % of 10-minute values in a week (confirmed: meter makers’ EN 50160 notes); none above the 25th; THD 8 % of the orders to the 40th, here of every order solved (to the 50th at most: never lower)',
  },
  'ieee-519': {
    basis: 'ieee-519',
    name: 'IEEE 519 limits for ≤ 1 kV',
    thdPercent: IEEE_519_VOLTAGE_LIMITS.thdPercent,
    flatPercent: IEEE_519_VOLTAGE_LIMITS.individualPercent,
    orderPercent: () => IEEE_519_VOLTAGE_LIMITS.individualPercent,
    source: IEEE_519_VOLTAGE_SOURCE,
  },
};

/** The basis a board's region takes when the file names none: where each document is the one the trade there uses. */
export const regionVoltageDistortionBasis = (region: Region): VoltageDistortionBasis => (region === 'north-america' ? 'ieee-519' : 'iec-61000-2-2');

/** A level as printed: at most two decimals, no trailing zeros (6, 3.5, 0.56). */
export const levelText = (percent: number): string => String(Number(percent.toFixed(2)));
