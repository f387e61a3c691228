/**
 * The arrangements compared, for a report whose correction study names no
 * arrangement: every arrangement that fits the board side by side, the one
 * recommended and why — the same comparison `compareCorrections` makes, so the
 * report recommends what the correction study does. On a board with harmonic
 * data (`compareWithHarmonics`) each arrangement is the variant, plain or
 * detuned, that its harmonic check chooses, and a column says which.
 */
import type { CorrectionComparison } from '../../correction/compareCorrections.js';
import type { HarmonicComparison } from '../../harmonics/correctWithHarmonics.js';
import { arrangementNames } from '../../correction/correctionWording.js';
import type { Region } from '../../board/conventions/region.js';
import { fixed } from '../svgText.js';
import { levelText, riseFigureText } from '../../correction/voltageRiseFlag.js';
import type { ReportBlock, ReportSection } from './reportDocument.js';

const VERDICT_WORDS: Readonly<Record<string, string>> = {
  'meets-target': 'meets the target',
  'meets-target-at-nominal-capacitance': 'meets it at nominal capacitance',
  'already-meets-target': 'nothing to do',
  'misses-target-with-available-units': 'misses it with the available units',
  infeasible: 'cannot reach it',
  'no-suitable-units': 'no unit suits the voltage',
  'nothing-to-build': 'nothing to build',
};

const capitalised = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);
/** A reason may end its own sentence (the harmonic check's does); the paragraph adds the stop. */
const withoutStop = (text: string) => text.replace(/\.$/, '');

/** Where the compared losses are: a sub-board's own feeder, or the source and feeder of a main board. */
function lossesNote(c: CorrectionComparison | HarmonicComparison): string {
  const incomer = c.outcomes.find((o) => o.report)?.report?.verification.before.incomer ?? null;
  return incomer ? `losses in the board's feeder from ${incomer.fedFrom}` : 'losses in the source and feeders';
}

/**
 * @param system the board's system: star and delta name nothing on a split-phase or single-phase board
 * @param region the board's region: its word for star (wye in North America)
 */
export function correctionComparisonBlocks(c: CorrectionComparison | HarmonicComparison, system: string, region: Region): ReportBlock[] {
  const dash = '—';
  const names = arrangementNames(system, region);
  const checked = 'harmonics' in c ? c.harmonics : null;
  // The variant shown for an arrangement: the one its harmonic check chose, else the plain bank (none passes).
  const variantOf = (o: CorrectionComparison['outcomes'][number]) => {
    const a = checked?.arrangements.find((x) => x.arrangement === o.arrangement);
    // No variants: the arrangement adds nothing, so there is no bank to name.
    return !o.report || !a || a.variants.length === 0 ? dash : (a.chosen ?? 'plain (no variant passes)');
  };
  const withVariant = (row: string[], o: CorrectionComparison['outcomes'][number]) => (checked ? [row[0]!, variantOf(o), ...row.slice(1)] : row);
  return [
    {
      kind: 'paragraph',
      text: `The correction study names no arrangement, so every arrangement that fits the board was sized, built from units and verified by re-solving the board, and one is recommended.${checked ? ' The board has harmonic data, so each arrangement was also built as detuned banks and checked for resonance and capacitor duty on its harmonics, as trivar correct does; each is shown as the bank its check chooses.' : ''}`,
    },
    {
      kind: 'table',
      caption: 'Arrangements compared',
      columns: [
        { label: 'Arrangement' },
        ...(checked ? [{ label: 'Bank' }] : []),
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
        if (!o.report || !f) return withVariant([name, 'not applicable', dash, dash, dash, dash, dash, dash], o);
        // No unit fits, or nothing to build: no bank to give figures of.
        const built = o.report.status !== 'no-suitable-units' && o.report.status !== 'nothing-to-build';
        // Nothing built (no unit fits): no "after" to show; the board as it stands is not one.
        const noAfter = (o.report.selection?.units ?? 0) === 0 && o.report.status !== 'already-meets-target';
        return withVariant([
          name,
          // A build above the rise's flag level carries the flag in its verdict, with the figure.
          `${VERDICT_WORDS[o.report.status] ?? o.report.status}${!noAfter && f.voltageRiseFlagged ? `; voltage rise ${riseFigureText(f.voltageRisePercent, o.report.verification.voltageRise.flagLevelPercent)} %, above the ${levelText(o.report.verification.voltageRise.flagLevelPercent)} % flag level` : ''}`,
          built ? fixed(f.deliveredKvar, 1) : dash,
          f.reactorKvar > 0 ? fixed(f.reactorKvar, 1) : dash,
          built ? fixed(f.nameplateKvar, 1) : dash,
          built ? String(f.units) : dash,
          noAfter || f.targetPfAfter === null ? dash : fixed(f.targetPfAfter, 3),
          noAfter ? dash : fixed(f.lossesKW, 3),
        ], o);
      }),
      note: [
        `kvar delivered at the solved voltage; target PF after: the power factor the target is defined on (per line: the lowest line); ${lossesNote(c)}.`,
        ...c.outcomes.filter((o) => o.notApplicable).map((o) => `${names[o.arrangement]}: ${o.notApplicable}.`),
        ...(checked ? [`Bank: ${checked.rule}.`] : []),
        `Rule: ${c.rule}.`,
      ].join(' '),
    },
    {
      kind: 'paragraph',
      text:
        c.recommended === null
          ? `${capitalised(withoutStop(c.why))}.`
          : recommendedStatus(c) === 'nothing-to-build'
            ? `${capitalised(withoutStop(c.why))}. The study behind the verdict follows.`
            : `Recommended — ${withoutStop(c.why)}. The recommended arrangement follows in full.`,
    },
  ];
}

/** The status of the arrangement the comparison names. */
const recommendedStatus = (c: CorrectionComparison): string | null => c.outcomes.find((o) => o.arrangement === c.recommended)?.report?.status ?? null;

/** The section when no arrangement could be studied: the comparison alone. */
export function correctionComparisonSection(c: CorrectionComparison, system: string, region: Region): ReportSection {
  return { id: 'correction', title: 'Correction recommendation', blocks: correctionComparisonBlocks(c, system, region) };
}
