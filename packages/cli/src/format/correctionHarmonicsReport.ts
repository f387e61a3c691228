/** The harmonic comparison of plain and detuned banks, appended to `trivar correct`'s report. */
import type { Arrangement, CorrectionHarmonics, HarmonicComparison } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { wrapText } from './wrapText.js';

export function renderCorrectionHarmonics(h: CorrectionHarmonics): string {
  const rows = h.variants.map((v) => [
    `${v.name}${v.name === h.chosen ? ' *' : ''}`,
    v.tuningOrder === null ? '-' : fixed(v.tuningOrder, 2),
    fixed(v.capacitorVoltageV, 0),
    v.unitRatedV === null ? '-' : fixed(v.unitRatedV, 0),
    fixed(v.nameplateKvar, 1),
    fixed(v.deliveredKvar, 1),
    v.lowestResonanceOrder === null ? '-' : fixed(v.lowestResonanceOrder, 2),
    v.resonantOrders.length ? v.resonantOrders.join(' ') : '-',
    v.worstDutyRatio === null ? '-' : fixed(v.worstDutyRatio, 2),
    v.passes ? 'passes' : 'FAILS',
  ]);
  const table = renderTable(
    [
      { header: 'bank', align: 'left' },
      { header: 'tuned' },
      { header: 'U_C V' },
      { header: 'unit V' },
      { header: 'plate kvar' },
      { header: 'kvar' },
      { header: 'peak h' },
      { header: 'near h', align: 'left' },
      { header: 'duty' },
      { header: 'check', align: 'left' },
    ],
    rows,
  );
  // The plain bank's reasons are in the summary already.
  const reasons = h.variants.filter((v) => !v.passes && (v.detuningPercent > 0 || h.chosen === null)).map((v) => wrapText(`${v.name}: ${v.reasons.join('; ')}`, '  ', '    '));
  const chosen = h.variants.find((v) => v.name === h.chosen);
  const reactors = chosen?.reactorsMilliHenry.length
    ? [
        wrapText(
          `the bank above is detuned: every step's capacitors (rated ${fixed(chosen.unitRatedV ?? 0, 0)} V, ${fixed(chosen.capacitorVoltageV, 0)} V across them at nominal voltage) sit behind a series reactor of p = ${chosen.detuningPercent} %, tuned to h = ${fixed(chosen.tuningOrder ?? 0, 2)}: ${chosen.reactorsMilliHenry.map((r) => `${fixed(r.inductanceMH, 3)} mH per branch with ${fixed(r.capacitancePerBranchUF, 1)} µF`).join(', ')}`,
          '  ',
          '    ',
        ),
      ]
    : [];
  return [
    section('Harmonic check: plain and detuned banks'),
    wrapText('* = the bank above; kvar = delivered; peak h = lowest resonance of any step combination; duty = worst / limit', '  ', '    '),
    table,
    wrapText(h.summary, '  ', '    '),
    ...reactors,
    ...reasons,
    wrapText(`basis: ${h.basis}`, '  ', '    '),
    wrapText('details: trivar harmonics on the board file; --json carries the chosen bank’s scan and duty (harmonics.check)', '  ', '    '),
    '',
  ].join('\n');
}

/** Every arrangement's plain and detuned variants in one table (comparison mode). */
export function renderComparisonHarmonics(h: HarmonicComparison['harmonics'], names: Readonly<Record<Arrangement, string>>): string {
  const rows = h.arrangements.flatMap((a) =>
    a.variants.map((v, k) => [
      k === 0 ? (names[a.arrangement] ?? a.arrangement) : '',
      `${v.name}${v.name === a.chosen ? ' *' : ''}`,
      v.unitRatedV === null ? '-' : fixed(v.unitRatedV, 0),
      fixed(v.nameplateKvar, 1),
      fixed(v.deliveredKvar, 1),
      v.lowestResonanceOrder === null ? '-' : fixed(v.lowestResonanceOrder, 2),
      v.resonantOrders.length ? v.resonantOrders.join(' ') : '-',
      v.worstDutyRatio === null ? '-' : fixed(v.worstDutyRatio, 2),
      v.passes ? 'passes' : 'FAILS',
    ]),
  );
  return [
    section('Harmonic check of every arrangement: plain and detuned banks'),
    wrapText('* = the variant each arrangement is shown as above; kvar = delivered; peak h = lowest resonance; duty = worst / limit', '  ', '    '),
    renderTable(
      [
        { header: 'arrangement', align: 'left' },
        { header: 'bank', align: 'left' },
        { header: 'unit V' },
        { header: 'plate kvar' },
        { header: 'kvar' },
        { header: 'peak h' },
        { header: 'near h', align: 'left' },
        { header: 'duty' },
        { header: 'check', align: 'left' },
      ],
      rows,
    ),
    wrapText(`rule: ${h.rule}`, '  ', '    '),
    '',
  ].join('\n');
}
