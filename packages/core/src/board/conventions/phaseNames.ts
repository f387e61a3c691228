/**
 * The two ways the trade names the phases: A/B/C (North-American practice) and
 * L1/L2/L3 (IEC 60445 line-conductor marking). Inside trivar every phase is
 * A, B or C; these tables translate a file's spelling in and a report's labels out.
 * JSON results keep A/B/C keys whatever the naming, so a program reading them
 * needs no second spelling; `conventions.phaseLabels` in a result maps them.
 */
import type { PhaseId } from '../systemTopology.js';
import { checkWordArgument } from '../../_internal/argumentChecks.js';

export const PHASE_NAMINGS = ['A/B/C', 'L1/L2/L3'] as const;
export type PhaseNaming = (typeof PHASE_NAMINGS)[number];

const NUMBERED: Readonly<Record<PhaseId, string>> = { A: 'L1', B: 'L2', C: 'L3' };

/** A lookup table without a prototype: `term in table` and `table[term]` see only its own terms, never `constructor`. */
const ownTable = (entries: Record<string, string>): Readonly<Record<string, string>> => Object.assign(Object.create(null) as Record<string, string>, entries);

/** Every phase-bearing term trivar reads, in its A/B/C spelling → its L1/L2/L3 spelling. */
export const NUMBERED_SPELLING: Readonly<Record<string, string>> = ownTable({
  A: 'L1',
  B: 'L2',
  C: 'L3',
  'A-N': 'L1-N',
  'B-N': 'L2-N',
  'C-N': 'L3-N',
  'A-B': 'L1-L2',
  'B-C': 'L2-L3',
  'C-A': 'L3-L1',
  'ABC-star': 'L1L2L3-star',
  'ABC-delta': 'L1L2L3-delta',
  ABC: 'L1L2L3',
  ACB: 'L1L3L2',
});

const LETTERED_SPELLING: Readonly<Record<string, string>> = ownTable(Object.fromEntries(Object.entries(NUMBERED_SPELLING).map(([a, l]) => [l, a])));
/** Line pairs written the other way round (L2-L1 for L1-L2) are the same pair of lines. */
export const REVERSED_PAIRS: Readonly<Record<string, string>> = ownTable({ 'B-A': 'A-B', 'C-B': 'B-C', 'A-C': 'C-A', 'L2-L1': 'A-B', 'L3-L2': 'B-C', 'L1-L3': 'C-A' });

/** Which naming a term is written in, and its A/B/C spelling; null when it names no phase. */
export function readPhaseTerm(term: string): { naming: PhaseNaming; canonical: string } | null {
  if (term in NUMBERED_SPELLING) return { naming: 'A/B/C', canonical: term };
  if (term in LETTERED_SPELLING) return { naming: 'L1/L2/L3', canonical: LETTERED_SPELLING[term]! };
  const pair = REVERSED_PAIRS[term];
  if (pair) return { naming: term.startsWith('L') ? 'L1/L2/L3' : 'A/B/C', canonical: pair };
  return null;
}

/** A term (phase, connection, line pair, sequence) spelt in the given naming. */
export function spellIn(naming: PhaseNaming, term: string): string {
  return naming === 'L1/L2/L3' ? (NUMBERED_SPELLING[term] ?? term) : term;
}

/** A phase's label in a report. */
export const phaseLabel = (naming: PhaseNaming, phase: PhaseId): string => (naming === 'L1/L2/L3' ? NUMBERED[phase] : phase);

/** The labels of every phase, for results (JSON keys stay A/B/C). */
export function phaseLabels(naming: PhaseNaming): Readonly<Record<PhaseId, string>> {
  checkWordArgument(naming, 'naming', PHASE_NAMINGS);
  return naming === 'L1/L2/L3' ? NUMBERED : { A: 'A', B: 'B', C: 'C' };
}

/**
 * A phase, line pair, branch or connection as a report shows it. Only `labelIn` makes one, so a
 * sentence builder that takes `PhaseLabel`s cannot be handed an A/B/C key unlabelled.
 */
export type PhaseLabel = string & { readonly __phaseLabel: never };

/** A report label for a phase, line pair or connection written A/B/C ("A", "A-B", "C-N", "ABC-delta"); N and other terms stay. */
export function labelIn(naming: PhaseNaming, term: string): PhaseLabel {
  if (naming === 'A/B/C') return term as PhaseLabel;
  if (term in NUMBERED_SPELLING) return NUMBERED_SPELLING[term] as PhaseLabel;
  return term
    .split('-')
    .map((t) => (t === 'A' || t === 'B' || t === 'C' ? NUMBERED[t] : t))
    .join('-') as PhaseLabel;
}

/** The labeller of one naming: what a study hands its wording (`label(p.phase)`, `phases.map(label)`). */
export type PhaseLabeller = (term: string) => PhaseLabel;
export function labellerOf(naming: PhaseNaming): PhaseLabeller {
  // Checked once here; the labeller it returns runs per row, unchecked.
  checkWordArgument(naming, 'naming', PHASE_NAMINGS);
  return (term) => labelIn(naming, term);
}
