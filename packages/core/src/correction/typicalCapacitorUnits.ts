/**
 * A built-in list of typical low-voltage capacitor ratings, used when the study
 * gives no catalogue. Typical catalogue practice, not any vendor's range (from
 * memory): rated voltages 400, 415, 440, 480, 525, 690 V at 50 Hz and 240, 480,
 * 600 V at 60 Hz; element ratings are one third of the usual three-phase unit
 * ratings (2.5 … 30 kvar, a three-phase unit being three delta elements) plus
 * single-phase cans of 0.5, 1, 2 and 7.5 kvar. 280 V at 50 Hz covers star banks on
 * 230 V line-to-neutral with the 10 % margin (single-phase units for 230 V
 * networks are commonly rated 250–290 V; from memory).
 */
import type { CapacitorUnitSpec } from './correctionSpec.js';

const THREE_PHASE_UNIT_KVAR = [2.5, 5, 6.25, 7.5, 10, 12.5, 15, 20, 25, 30];
const SINGLE_PHASE_CAN_KVAR = [0.5, 1, 2, 7.5];
const VOLTAGES: Record<50 | 60, readonly number[]> = { 50: [280, 400, 415, 440, 480, 525, 690], 60: [240, 480, 600] };

const ELEMENT_KVAR = [...new Set([...THREE_PHASE_UNIT_KVAR.map((q) => q / 3), ...SINGLE_PHASE_CAN_KVAR])].sort((a, b) => a - b);

const label = (kvar: number) => (Number.isInteger(kvar * 10) ? kvar.toString() : kvar.toFixed(2));

/** Typical element ratings, marked as such in every result that uses them. */
export const TYPICAL_CAPACITOR_UNITS: readonly CapacitorUnitSpec[] = Object.freeze(
  ([50, 60] as const).flatMap((hz) =>
    VOLTAGES[hz].flatMap((v) => ELEMENT_KVAR.map((kvar) => ({ name: `typical ${label(kvar)} kvar ${v} V ${hz} Hz`, ratedKvar: kvar, ratedV: v, ratedHz: hz }))),
  ),
);
