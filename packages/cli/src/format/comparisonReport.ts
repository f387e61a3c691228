/** CorrectionComparison → the side-by-side report of `trivar correct` without an arrangement (fits 100 columns). */
import { boundFigure } from './correctionReport.js';
import { arrangementNames, levelText, riseFigureText, exemptLeadingLines, lossesPlaceWords, exemptLeadingWords, labellerOf, type Arrangement, type Region, type ArrangementOutcome, type CorrectionComparison, type HarmonicComparison, signedPfText } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { headerLines } from './solveReport.js';
import { renderCorrectionReport, renderNothingToAdd } from './correctionReport.js';
import { wrapText } from './wrapText.js';

const TWO_LINE_TABLE_NAMES = { 'star-bank': 'L-N bank', 'delta-bank': 'L-L bank' } as const;
const TWO_LINE_LEGEND = 'L-N bank: capacitors from each line to the neutral; L-L bank: capacitors across the two lines';

/**
 * The arrangements' names in the comparison's tables: the board's own words (arrangementNames), the
 * compensator shortened, on a split-phase board L-N / L-L so the table keeps to 100 columns, and on a
 * single-phase board, whose one bank is capacitors across the supply, "capacitors".
 */
export const tableNames = ({ system, region }: ComparedBoard): Readonly<Record<Arrangement, string>> => {
  const names = { ...arrangementNames(system, region), 'balancing-compensator': 'compensator' };
  // A single-phase board's one bank: capacitors across the supply, nothing to tell apart.
  if (system === 'single-phase') return { ...names, 'star-bank': 'capacitors' };
  return system === 'three-phase-4wire' || system === 'three-phase-3wire' ? names : { ...names, ...TWO_LINE_TABLE_NAMES };
};

/** What the wording reads of the board compared: its system and the region whose words it takes. */
export interface ComparedBoard {
  readonly system: string;
  readonly region: Region;
}

/** The board compared (every outcome's study is of the same board). */
export const comparedBoard = (c: CorrectionComparison): ComparedBoard => {
  const before = c.outcomes.find((o) => o.report)?.report?.verification.before;
  return before ? { system: before.board.system, region: before.conventions.region } : { system: 'three-phase-4wire', region: 'iec' };
};

const VERDICT: Record<string, string> = {
  'meets-target': 'meets',
  'meets-target-at-nominal-capacitance': 'meets at nom C',
  'already-meets-target': 'nothing to do',
  'misses-target-with-available-units': 'misses',
  infeasible: 'not reachable',
  'no-suitable-units': 'no units fit',
  'nothing-to-build': 'nothing to build',
};

/** Meets the target while it overloads what feeds the board (see compareCorrections' rule). */
const overloading = (o: ArrangementOutcome): boolean => !!o.report && o.report.status.startsWith('meets') && o.report.verification.overloadsCaused.length > 0;

/** Meets the target while its supply resonance lies near a harmonic order in a state its controller can reach (see compareCorrections' rule). */
const resonating = (o: ArrangementOutcome): boolean => !!o.report && o.report.status.startsWith('meets') && o.report.verification.resonanceNearHarmonic;

/** Arrangements that meet the target but fail the harmonic check in every variant (a comparison with harmonic data). */
function failingHarmonicCheck(c: CorrectionComparison): ReadonlySet<Arrangement> {
  const arrangements = (c as Partial<HarmonicComparison>).harmonics?.arrangements ?? [];
  return new Set(arrangements.filter((a) => a.chosen === null && a.variants.length > 0).map((a) => a.arrangement));
}

function row(o: ArrangementOutcome, names: Readonly<Record<Arrangement, string>>, failsCheck: ReadonlySet<Arrangement> = new Set()): string[] {
  const name = names[o.arrangement] ?? o.arrangement;
  if (!o.report || !o.figures) return [name, 'not applicable', '', '', '', '', '', '', '', ''];
  const f = o.figures;
  // Without units for some branches the rest may still be built: its figures are shown, the verdict says part.
  const built = (o.report.selection?.units ?? 0) > 0;
  const partBuilt = built && o.report.status === 'no-suitable-units';
  // Nothing built (no unit fits): there is no "after" to show, and the board as it stands is not one.
  const noAfter = !built && o.report.status !== 'already-meets-target';
  const verdict = partBuilt ? 'part built' : failsCheck.has(o.arrangement) && o.report.status.startsWith('meets') ? 'fails check' : overloading(o) ? 'overloads' : resonating(o) ? 'near harmonic' : (VERDICT[o.report.status] ?? o.report.status);
  return [
    name,
    // A build above the rise's flag level is never a plain verdict: the mark sends the reader to its figure below.
    `${verdict}${built && f.voltageRiseFlagged ? RISE_MARK : ''}`,
    built ? fixed(f.deliveredKvar, 1) + (f.reactorKvar > 0 ? `+L${fixed(f.reactorKvar, 1)}` : '') : '-',
    built ? fixed(f.nameplateKvar, 1) : '-',
    built ? String(f.units) : '-',
    built ? String(f.switchedSteps) : '-',
    noAfter || f.targetPfAfter === null ? '-' : signedPfText(f.targetPfAfter),
    noAfter || f.neutralCurrentA === null ? '-' : fixed(f.neutralCurrentA, 1),
    noAfter || f.negativeSequencePercent === null ? '-' : fixed(f.negativeSequencePercent, 1),
    noAfter ? '-' : fixed(f.lossesKW, 3),
  ];
}

/** Beside a verdict whose build raises the voltage above the flag level (riseFootnote). */
const RISE_MARK = '*';

/** The arrangements marked with RISE_MARK, each with its rise: the flag the verdict carries, in figures. */
function riseFootnote(c: CorrectionComparison, names: Readonly<Record<Arrangement, string>>): string[] {
  const flagged = c.outcomes.filter((o) => (o.report?.selection?.units ?? 0) > 0 && o.figures?.voltageRiseFlagged);
  const level = flagged[0]?.report?.verification.voltageRise.flagLevelPercent;
  if (level === undefined) return [];
  const figures = flagged.map((o) => `${names[o.arrangement]} ${riseFigureText(o.figures!.voltageRisePercent, level)} %`).join(', ');
  return [`*: raises the board voltage above the ${levelText(level)} % flag level at design load: ${figures} (what that means here: see Recommendation)`];
}

/**
 * The lines an arrangement's verdict holds only to lead no more than before (they led before correction,
 * the same lines whichever arrangement is judged), named under the table: a "meets" beside a line's PF of
 * 0.866 leading says why. Each arrangement that judges lines so is named.
 */
function exemptFootnote(c: CorrectionComparison): string[] {
  const judged = c.outcomes.filter((o) => o.report && o.report.status.startsWith('meets') && exemptLeadingLines(o.report.verification.check).length);
  const v = judged[0]?.report?.verification;
  if (!v) return [];
  const compared = comparedBoard(c);
  const label = labellerOf(v.before.conventions.phaseNames);
  const lines = exemptLeadingLines(v.check).map((p) => ({ line: label(p), pfBefore: (v.metering?.lines ?? v.lines).find((l) => l.phase === p)!.pf.before, pfAfter: null }));
  return [`exempt (${judged.map((o) => arrangementNames(compared.system, compared.region)[o.arrangement]).join(', ')}): ${exemptLeadingWords(lines)}`];
}

export function renderComparisonReport(c: CorrectionComparison): string {
  const failing = failingHarmonicCheck(c);
  const first = c.outcomes.find((o) => o.report)?.report;
  const compared = comparedBoard(c);
  const names = tableNames(compared);
  const fullNames = arrangementNames(compared.system, compared.region);
  // Every arrangement has nothing to add: the verdict and the board's figures, not a table of zeros.
  const studied = c.outcomes.filter((o) => o.report);
  // One arrangement fits (a single-phase board's capacitors across the supply): nothing to set side by side.
  if (first && studied.length === 1 && !c.outcomes.some((o) => o.notApplicable) && first.status !== 'already-meets-target') return renderCorrectionReport(first);
  if (first && studied.every((o) => o.report!.status === 'already-meets-target'))
    return renderNothingToAdd(first, studied.length === 1 ? `a ${fullNames[first.arrangement]}` : `every arrangement studied (${studied.map((o) => fullNames[o.arrangement]).join(', ')})`);
  const parts: string[] = [];
  if (first) {
    parts.push(headerLines(first.verification.before).slice(0, 2).join('\n'));
    parts.push(wrapText(`target: ${first.target.statement}; PF ≥ ${boundFigure(first.target.pf)}${first.target.leading === 'never' ? ', never leading' : ', leading allowed'}`, '', '  '));
  }
  parts.push(
    section('Arrangements compared (each built from units and verified by re-solving the board)') +
      renderTable(
        [
          { header: 'arrangement', align: 'left' },
          { header: 'verdict', align: 'left' },
          { header: 'delivered' },
          { header: 'plate' },
          { header: 'units' },
          { header: 'steps' },
          { header: 'PF after' },
          { header: 'neutral' },
          { header: 'I2/I1 %' },
          { header: 'loss kW' },
        ],
        c.outcomes.map((o) => row(o, names, failing)),
      ) +
      '\n' +
      [
        `${names['star-bank'] === TWO_LINE_TABLE_NAMES['star-bank'] ? `${TWO_LINE_LEGEND}; ` : ''}delivered: kvar at the solved voltage (+L: reactor kvar); nom C: at nominal capacitance only;${c.outcomes.some((o) => o.report?.status === 'no-suitable-units' && (o.report.selection?.units ?? 0) > 0) ? ' part built: no unit suits some branches, the rest built without them;' : ''}${c.outcomes.some(overloading) ? ' overloads: meets the target, but with it in a conductor or the supply is above its rating (see Recommendation);' : ''}${c.outcomes.some((o) => resonating(o) && !overloading(o)) ? ' near harmonic: meets the target, but in a step state its controller can reach the supply resonance lies within 10 % of a harmonic order with typical content of 5 % or more that can reach its connection (see its warnings);' : ''}${failing.size ? ' fails check: meets the target, but no variant passes the harmonic check;' : ''} plate: nameplate kvar; PF after: the PF the target is defined on (per-line: the lowest line); neutral: A after; loss: ${lossesPlaceWords(first?.verification.before.incomer ?? null)} after`,
        ...c.outcomes.filter((o) => o.notApplicable).map((o) => `${fullNames[o.arrangement]}: ${o.notApplicable}`),
        ...exemptFootnote(c),
        ...riseFootnote(c, names),
      ]
        .map((l) => wrapText(l, '  ', '    '))
        .join('\n'),
  );
  parts.push(section('Recommendation') + wrapText(c.why, '  ', '    ') + '\n' + wrapText(`(rule: ${c.rule})`, '  ', '    '));
  const chosen = c.outcomes.find((o) => o.arrangement === c.recommended)?.report;
  // Nothing to build is no recommendation of equipment: the study behind the verdict is shown, not "the recommended" bank.
  if (chosen)
    parts.push(
      section(chosen.status === 'nothing-to-build' ? `Why nothing is built: the ${fullNames[chosen.arrangement]} studied` : `The recommended ${fullNames[chosen.arrangement]} in full`) + '\n' + renderCorrectionReport(chosen).trimEnd(),
    );
  return `${parts.join('\n')}\n`;
}
