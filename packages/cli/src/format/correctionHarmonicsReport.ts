/** The harmonic comparison of plain and detuned banks, appended to `trivar correct`'s report. */
import type { Arrangement, CorrectionHarmonics, CorrectionVariant, HarmonicComparison } from '@trivar/core';
import { fixed, renderTable, section } from './textTable.js';
import { wrapText } from './wrapText.js';

/** How the section ends: where the details are. @defaultValue a board file's */
const BOARD_FILE_DETAILS = 'details: trivar harmonics on the board file; --json carries the chosen bank’s scan and duty (harmonics.check)';

/** Orders near a peak only with the other banks switched (an installation's other banks), as a cell. */
const switchedCell = (v: CorrectionVariant) => (v.resonantOrdersOtherBanksSwitched?.length ? v.resonantOrdersOtherBanksSwitched.join(' ') : '-');

export function renderCorrectionHarmonics(h: CorrectionHarmonics<unknown>, details = BOARD_FILE_DETAILS): string {
  if (h.variants.length === 0) return [section('Harmonic check'), wrapText(h.summary, '  ', '    '), ''].join('\n');
  const switched = h.variants.some((v) => v.resonantOrdersOtherBanksSwitched !== undefined);
  const rows = h.variants.map((v) => [
    `${v.name}${v.name === h.chosen ? ' *' : ''}`,
    v.tuningOrder === null ? '-' : fixed(v.tuningOrder, 2),
    fixed(v.capacitorVoltageV, 0),
    v.unitRatedV === null ? '-' : fixed(v.unitRatedV, 0),
    fixed(v.nameplateKvar, 1),
    fixed(v.deliveredKvar, 1),
    v.lowestResonanceOrder === null ? '-' : fixed(v.lowestResonanceOrder, 2),
    v.resonantOrders.length ? v.resonantOrders.join(' ') : '-',
    ...(switched ? [switchedCell(v)] : []),
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
      ...(switched ? [{ header: 'sw. h', align: 'left' as const }] : []),
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
    wrapText(
      `* = the bank above; kvar = delivered; peak h = lowest resonance of any step combination${switched ? ' with some of the bank on, every other bank on; sw. h = orders near a peak only with the other banks switched; orders near one without the new bank are not counted' : ''}; duty = worst / limit`,
      '  ',
      '    ',
    ),
    table,
    wrapText(h.summary, '  ', '    '),
    ...reactors,
    ...reasons,
    wrapText(`basis: ${h.basis}`, '  ', '    '),
    wrapText(details, '  ', '    '),
    '',
  ].join('\n');
}

/** Every arrangement's plain and detuned variants in one table (comparison mode). */
export function renderComparisonHarmonics(h: HarmonicComparison['harmonics'], names: Readonly<Record<Arrangement, string>>): string {
  // Arrangements that add nothing have no bank to check: named once below the table, not as rows of zero-kvar banks.
  const idleOnes = h.arrangements.filter((a) => a.variants.length === 0);
  // Each of them carries the same summary (nothing is added, nothing to check).
  const idle = idleOnes.length ? [wrapText(`${idleOnes.map((a) => names[a.arrangement] ?? a.arrangement).join(', ')}: ${idleOnes[0]!.summary}`, '  ', '    ')] : [];
  if (idleOnes.length === h.arrangements.length) return [section('Harmonic check'), ...idle, ''].join('\n');
  const switched = h.arrangements.some((a) => a.variants.some((v) => v.resonantOrdersOtherBanksSwitched !== undefined));
  const rows = h.arrangements.flatMap((a) =>
    a.variants.map((v, k) => [
      k === 0 ? (names[a.arrangement] ?? a.arrangement) : '',
      `${v.name}${v.name === a.chosen ? ' *' : ''}`,
      v.unitRatedV === null ? '-' : fixed(v.unitRatedV, 0),
      fixed(v.nameplateKvar, 1),
      fixed(v.deliveredKvar, 1),
      v.lowestResonanceOrder === null ? '-' : fixed(v.lowestResonanceOrder, 2),
      v.resonantOrders.length ? v.resonantOrders.join(' ') : '-',
      ...(switched ? [switchedCell(v)] : []),
      v.worstDutyRatio === null ? '-' : fixed(v.worstDutyRatio, 2),
      v.passes ? 'passes' : 'FAILS',
    ]),
  );
  // Why a variant fails, in words: the table shows resonance and duty, not a bank that could not be built or
  // misses the target. Variants of one arrangement failing for the same reasons share a line.
  const reasons = h.arrangements.flatMap((a) => {
    const byReasons = new Map<string, string[]>();
    for (const v of a.variants.filter((x) => !x.passes)) {
      const words = v.reasons.join('; ');
      byReasons.set(words, [...(byReasons.get(words) ?? []), v.name]);
    }
    return [...byReasons].map(([words, variants]) => wrapText(`${names[a.arrangement] ?? a.arrangement}, ${variants.join(', ')}: ${words}`, '  ', '    '));
  });
  return [
    section('Harmonic check of every arrangement: plain and detuned banks'),
    wrapText(
      `* = the variant each arrangement is shown as above; kvar = delivered; peak h = lowest resonance${switched ? ' with some of the bank on, every other bank on; sw. h = orders near a peak only with the other banks switched; orders near one without the new bank are not counted' : ''}; duty = worst / limit`,
      '  ',
      '    ',
    ),
    renderTable(
      [
        { header: 'arrangement', align: 'left' },
        { header: 'bank', align: 'left' },
        { header: 'unit V' },
        { header: 'plate kvar' },
        { header: 'kvar' },
        { header: 'peak h' },
        { header: 'near h', align: 'left' },
        ...(switched ? [{ header: 'sw. h', align: 'left' as const }] : []),
        { header: 'duty' },
        { header: 'check', align: 'left' },
      ],
      rows,
    ),
    ...reasons,
    ...idle,
    wrapText(`rule: ${h.rule}`, '  ', '    '),
    '',
  ].join('\n');
}
