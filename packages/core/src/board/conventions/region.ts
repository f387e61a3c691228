/**
 * The region whose conventions a board follows: its wording (center tap and grounded
 * conductor in North America; PEN and TN-C-S elsewhere), its default phase names and
 * voltage limits. Given in the file (`conventions.region`), or inferred, first rule that
 * applies wins:
 *   1. the voltage written as notation: a Y form ("208Y/120"), a split-phase pair or a
 *      North-American star pair ("120/208", "277/480", "347/600") is North-American; any
 *      other pair ("400/230", "230/400") is IEC;
 *   2. a split-phase system is North-American (the 120/240 V centre-tapped service);
 *   3. 60 Hz is North-American, 50 Hz IEC.
 * Rule 3 is a guess for 60 Hz IEC-practice countries: they set `conventions.region: iec`.
 */
import type { SystemKind } from '../boardSchema.js';
import type { VoltageNotation } from './voltageNotation.js';
import { checkObjectArgument } from '../../_internal/argumentChecks.js';

export const REGIONS = ['iec', 'north-america'] as const;
export type Region = (typeof REGIONS)[number];

/** How the region was settled, for the report. */
export type RegionBasis = 'file' | 'notation' | 'split-phase' | 'frequency';

/** Line-to-neutral voltages of the North-American star systems (ANSI C84.1 nominal system voltages, from memory). */
const NORTH_AMERICAN_STAR_LN: readonly number[] = [120, 277, 347];

export function inferRegion(input: { system: SystemKind; frequencyHz: number; notation?: VoltageNotation | null }): { region: Region; basis: RegionBasis } {
  checkObjectArgument(input, 'input', 'a supply { system, frequencyHz, notation? }', ['system', 'frequencyHz']);
  const n = input.notation;
  if (n) return { region: n.star || n.system === 'split-phase' || NORTH_AMERICAN_STAR_LN.includes(n.lineToNeutralV) ? 'north-america' : 'iec', basis: 'notation' };
  if (input.system === 'split-phase') return { region: 'north-america', basis: 'split-phase' };
  return { region: input.frequencyHz === 60 ? 'north-america' : 'iec', basis: 'frequency' };
}
