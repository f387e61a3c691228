/** CorrectionComparison → the side-by-side report of `trivar correct` without an arrangement (fits 100 columns). */
import { boundFigure } from './correctionReport.js';
import type { ArrangementOutcome, CorrectionComparison } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { headerLines } from './solveReport.js';
import { renderCorrectionReport } from './correctionReport.js';
import { wrapText } from './wrapText.js';

const NAMES: Record<string, string> = { 'star-bank': 'star bank', 'delta-bank': 'delta bank', 'balancing-compensator': 'compensator' };

const VERDICT: Record<string, string> = {
  'meets-target': 'meets',
  'meets-target-at-nominal-capacitance': 'meets at nom C',
  'already-meets-target': 'nothing to do',
  'misses-target-with-available-units': 'misses',
  infeasible: 'not reachable',
  'no-suitable-units': 'no units fit',
};

function row(o: ArrangementOutcome): string[] {
  const name = NAMES[o.arrangement] ?? o.arrangement;
  if (!o.report || !o.figures) return [name, 'not applicable', '', '', '', '', '', '', '', ''];
  const f = o.figures;
  const built = o.report.status !== 'no-suitable-units';
  return [
    name,
    VERDICT[o.report.status] ?? o.report.status,
    built ? fixed(f.deliveredKvar, 1) + (f.reactorKvar > 0 ? `+L${fixed(f.reactorKvar, 1)}` : '') : '-',
    built ? fixed(f.nameplateKvar, 1) : '-',
    built ? String(f.units) : '-',
    built ? String(f.switchedSteps) : '-',
    f.targetPfAfter === null ? '-' : fixed(f.targetPfAfter, 3),
    f.neutralCurrentA === null ? '-' : fixed(f.neutralCurrentA, 1),
    f.negativeSequencePercent === null ? '-' : fixed(f.negativeSequencePercent, 1),
    fixed(f.lossesKW, 3),
  ];
}

export function renderComparisonReport(c: CorrectionComparison): string {
  const first = c.outcomes.find((o) => o.report)?.report;
  const parts: string[] = [];
  if (first) {
    parts.push(headerLines(first.verification.before).slice(0, 2).join('\n'));
    parts.push(wrapText(`target: ${first.target.statement}; PF ≥ ${boundFigure(first.target.pf)}`, '', '  '));
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
        c.outcomes.map(row),
      ) +
      '\n' +
      [
        'delivered: kvar at the solved voltage (+L: reactor kvar); nom C: at nominal capacitance only; plate: nameplate kvar; PF after: the PF the target is defined on (per-line: the lowest line); neutral: A after; loss: source + feeder after',
        ...c.outcomes.filter((o) => o.notApplicable).map((o) => `${NAMES[o.arrangement]}: ${o.notApplicable}`),
      ]
        .map((l) => wrapText(l, '  ', '    '))
        .join('\n'),
  );
  parts.push(section('Recommendation') + wrapText(c.why, '  ', '    ') + '\n' + wrapText(`(rule: ${c.rule})`, '  ', '    '));
  const chosen = c.outcomes.find((o) => o.arrangement === c.recommended)?.report;
  if (chosen) parts.push(section(`The recommended ${NAMES[chosen.arrangement]} in full`) + '\n' + renderCorrectionReport(chosen).trimEnd());
  return `${parts.join('\n')}\n`;
}
