/**
 * The arrangements compared, for a report whose correction study names no
 * arrangement: every arrangement that fits the board side by side, the one
 * recommended and why — the same comparison `compareCorrections` makes, so the
 * report recommends what the correction study does.
 */
import type { CorrectionComparison } from '../../correction/compareCorrections.js';
import { arrangementNames } from '../../correction/correctionWording.js';
import { fixed } from '../svgText.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';

const VERDICT_WORDS: Readonly<Record<string, string>> = {
  'meets-target': 'meets the target',
  'meets-target-at-nominal-capacitance': 'meets it at nominal capacitance',
  'already-meets-target': 'nothing to do',
  'misses-target-with-available-units': 'misses it with the available units',
  infeasible: 'cannot reach it',
  'no-suitable-units': 'no unit suits the voltage',
};

const capitalised = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** @param system the board's system: star and delta name nothing on a split-phase or single-phase board */
export function correctionComparisonBlocks(c: CorrectionComparison, system: string): ReportBlock[] {
  const dash = '—';
  const names = arrangementNames(system);
  return [
    {
      kind: 'paragraph',
      text: 'The correction study names no arrangement, so every arrangement that fits the board was sized, built from units and verified by re-solving the board, and one is recommended.',
    },
    {
      kind: 'table',
      caption: 'Arrangements compared',
      columns: [
        { label: 'Arrangement' },
        { label: 'Verdict' },
        { label: 'kvar delivered', align: 'right' },
        { label: 'Reactor kvar', align: 'right' },
        { label: 'kvar nameplate', align: 'right' },
        { label: 'Units', align: 'right' },
        { label: 'Target PF after', align: 'right' },
        { label: 'Loss kW after', align: 'right' },
      ],
      rows: c.outcomes.map((o) => {
        const name = capitalised(names[o.arrangement]);
        const f = o.figures;
        if (!o.report || !f) return [name, 'not applicable', dash, dash, dash, dash, dash, dash];
        const built = o.report.status !== 'no-suitable-units';
        return [
          name,
          VERDICT_WORDS[o.report.status] ?? o.report.status,
          built ? fixed(f.deliveredKvar, 1) : dash,
          f.reactorKvar > 0 ? fixed(f.reactorKvar, 1) : dash,
          built ? fixed(f.nameplateKvar, 1) : dash,
          built ? String(f.units) : dash,
          f.targetPfAfter === null ? dash : fixed(f.targetPfAfter, 3),
          fixed(f.lossesKW, 3),
        ];
      }),
      note: [
        'kvar delivered at the solved voltage; target PF after: the power factor the target is defined on (per line: the lowest line); losses in the source and feeders.',
        ...c.outcomes.filter((o) => o.notApplicable).map((o) => `${names[o.arrangement]}: ${o.notApplicable}.`),
        `Rule: ${c.rule}.`,
      ].join(' '),
    },
    { kind: 'paragraph', text: c.recommended === null ? `${capitalised(c.why)}.` : `Recommended — ${c.why}. The recommended arrangement follows in full.` },
  ];
}

/** The section when no arrangement could be studied: the comparison alone. */
export function correctionComparisonSection(c: CorrectionComparison, system: string): ReportSection {
  return { id: 'correction', title: 'Correction recommendation', blocks: correctionComparisonBlocks(c, system) };
}
