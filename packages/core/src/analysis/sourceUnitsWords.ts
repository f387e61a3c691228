/**
 * A supply's rated single-phase units (a bank, an open delta) in words: the same words in the text
 * report, the HTML and Markdown reports and the overload warning.
 */
import type { SourceUnitReading } from './boardResult.js';
import { argumentIssueError, checkListArgument } from '../_internal/argumentChecks.js';

/** A unit's winding: an open delta's `A-B` as labelled (L1-L2), a bank's `A` as the phase to the star point (L1-N). */
export const unitWords = (winding: string, label: (phaseOrPair: string) => string): string => (winding.includes('-') ? label(winding) : `${label(winding)}-N`);

/** Each unit's loading: `L1-L2 216 % of 10 kVA (90.1 A), L2-L3 …`. */
export function sourceUnitsWords(units: readonly SourceUnitReading[], label: (phaseOrPair: string) => string): string {
  checkListArgument(units, 'units', "the source's rated units (a result's supply units)", (x) => typeof x === 'object' && x !== null);
  if (typeof label !== 'function') throw argumentIssueError('label', 'a function naming a phase or line pair (labellerOf(...))', label);
  return units.map((u) => `${unitWords(u.winding, label)} ${u.loadingPercent.toFixed(0)} % of ${+u.ratedKVA.toFixed(1)} kVA (${u.currentA.toFixed(1)} A)`).join(', ');
}
