/** BoardResult → the human-readable report of `trivar solve`. */
import { idealSourceHolds, bandDecimalsOf, percentBesideBand, voltageBesideBand, bandVoltsWords, nominalVoltageWords, nonStandardNominalNote, sourceHeldLine, bandWords, judgedNominals, labelIn, regionWords, signedPfText, worstBranch, assumedPfNote, sourceUnitsWords, type BoardResult } from '@trivar/core';
import { fixed, renderTable, renderTableWithin, section } from './textTable.js';
import { REPORT_WIDTH, wrapText } from './wrapText.js';
import { exportSentence, isExport, pfCell, varWords } from './powerFlowWords.js';
import { openNeutralBlock } from './openNeutralReport.js';

const SYSTEM_WORDS: Record<string, string> = {
  'three-phase-4wire': 'three-phase 4-wire',
  'three-phase-3wire': 'three-phase 3-wire',
  'split-phase': 'split-phase 3-wire',
  'single-phase': 'single-phase 2-wire',
};

/** A note in brackets under a table, wrapped to the report width. */
const note = (text: string) => `${wrapText(text, '  (', '   ', REPORT_WIDTH - 1)})`;

/** Short model names for the circuits table; the key under it spells them out. */
const MODEL_SHORT: Record<string, string> = { 'constant-power': 'P', 'constant-current': 'I', 'constant-impedance': 'Z', zip: 'ZIP' };

/** The voltage-drop definition, the same one `voltageDropPercent` uses everywhere. */
function dropDefinition(r: BoardResult): string {
  const to = r.neutral
    ? 'phase to the board neutral bar, so the neutral conductor\'s drop is included'
    : 'phase to the virtual neutral, the centroid of the line voltages; the open-circuit voltage is taken the same way, to the centroid of the EMFs';
  return `drop: open-circuit source voltage minus the voltage line-to-neutral loads see — ${to} — in % of nominal; negative is a rise.`;
}

/** A phase, line pair or connection (A/B/C inside) as this board's report labels it. */
export const labeller = (r: BoardResult) => (term: string) => labelIn(r.conventions.phaseNames, term);

/** The region's words for this board (center tap and grounded conductor in North America; the transformer's center tap where the file gives one). */
export const wordsOf = (r: BoardResult) => regionWords(r.conventions.region, r.board.system as Parameters<typeof regionWords>[1], r.board.suppliedByTransformer ? 'transformer' : 'source');

/** The voltage-limit verdict, judged as the warnings are; its lowest and highest printed with the decimals that show their side. */
export function voltageVerdictLine(r: BoardResult): string {
  const c = r.voltageCheck;
  const verdict = { within: 'every voltage within', under: 'BELOW the lower limit', over: 'ABOVE the upper limit', 'under-and-over': 'OUTSIDE both limits' }[c.verdict];
  return `limits ${bandWords(c.limits)} (${c.limits.preset}): ${verdict}; lowest ${percentBesideBand(c.limits, c.lowest.percent)} % at ${c.lowest.at}, highest ${percentBesideBand(c.limits, c.highest.percent)} % at ${c.highest.at}`;
}

/**
 * A voltage and its % of nominal as the tables print them: beside the board's band (voltageBesideBand)
 * where the verdict judges it, else at 0.1.
 */
function voltageCells(r: BoardResult, judged: boolean, reading: { volts: number; percent: number }): { volts: string; percent: string } {
  return judged ? voltageBesideBand(r.voltageCheck.limits, reading) : { volts: fixed(reading.volts, 1), percent: fixed(reading.percent, 1) };
}

/** The board's system; a board no neutral reaches says so, whatever the supply's system. */
function systemWords(b: BoardResult['board']): string {
  if (!b.withoutNeutral) return SYSTEM_WORDS[b.system] ?? b.system;
  return `${b.system === 'split-phase' ? 'split-phase, two lines' : 'three-phase 3-wire'}, no neutral at this board`;
}

export function headerLines(r: BoardResult): string[] {
  const b = r.board;
  const label = labeller(r);
  const volts = nominalVoltageWords(b);
  const seq = b.system.startsWith('three') ? ` · sequence ${label(b.sequence)}` : '';
  const held = sourceHeldLine(b, label);
  return [
    wrapText(b.name, ''),
    `${systemWords(b)} · ${volts} · ${b.frequencyHz} Hz${seq}${b.neutralOpen ? ' · NEUTRAL OPEN' : ''}`,
    ...(held ? [wrapText(held, '', '  ')] : []),
  ];
}

/** A current's angle, where the current prints as more than 0.0 A (a round-off current's angle is noise). */
const currentAngle = (i: { magnitude: number; angleDeg: number }) => (fixed(i.magnitude, 1) === '0.0' ? '' : fixed(i.angleDeg, 1));

function phaseTable(r: BoardResult): string {
  const label = labeller(r);
  // Phase voltages are judged where a neutral gives them meaning (voltageCheck.ts).
  const phasesJudged = r.neutral !== null || r.lineToLine.length === 0;
  const rows = r.phases.map((p) => [
    label(p.phase),
    voltageCells(r, phasesJudged, { volts: p.voltage.magnitude, percent: p.voltagePercent }).volts,
    fixed(p.voltage.angleDeg, 1),
    voltageCells(r, phasesJudged, { volts: p.voltage.magnitude, percent: p.voltagePercent }).percent,
    fixed(p.voltageDropPercent, 1),
    fixed(p.current.magnitude, 1),
    currentAngle(p.current),
    fixed(p.kW, 2),
    fixed(p.kvar, 2),
    pfCell(p),
    p.loadingPercent === null ? '' : fixed(p.loadingPercent, 0),
  ]);
  // A bar voltage of round-off size (a balanced board's bar sits at the star point) or no current has no angle to show.
  const barAngle = (v: { magnitude: number; angleDeg: number }) => (v.magnitude > 1e-9 * r.board.nominalLineToNeutralV ? fixed(v.angleDeg, 1) : '');
  if (r.neutral)
    rows.push([
      'N',
      r.neutral.barVoltage ? fixed(r.neutral.barVoltage.magnitude, 1) : '',
      r.neutral.barVoltage ? barAngle(r.neutral.barVoltage) : '',
      '',
      '',
      fixed(r.neutral.current.magnitude, 1),
      currentAngle(r.neutral.current),
      '',
      '',
      '',
      r.neutral.loadingPercent === null ? '' : fixed(r.neutral.loadingPercent, 0),
    ]);
  const table = renderTable(
    [
      { header: 'line', align: 'left' },
      { header: 'V' },
      { header: '∠V°' },
      { header: '%nom' },
      { header: 'drop' },
      { header: 'A' },
      { header: '∠I°' },
      { header: 'kW' },
      { header: 'kvar' },
      { header: 'PF', align: 'left' },
      { header: '%rating' },
    ],
    rows,
  );
  const ll = r.lineToLine
    .map((l) => {
      const shown = voltageCells(r, true, { volts: l.voltage.magnitude, percent: l.voltagePercent });
      return `${label(l.pair)} ${shown.volts} V (${shown.percent} %)`;
    })
    .join('   ');
  const notes = [dropDefinition(r)];
  const words = wordsOf(r);
  if (r.neutral)
    notes.push(
      words.neutralConductor === 'neutral'
        ? `N row: neutral bar voltage to ${words.sourceNeutralPoint}, and the neutral current.`
        : `N row: neutral bar voltage to ${words.sourceNeutralPoint}, and the current in the ${words.neutralConductor}.`,
    );
  // Three-phase only: on a split-phase board the two lines are 180° apart, so a load across them is in phase with both.
  // A three-phase delta load splits evenly; only a single load across two lines shifts its shares.
  if (r.board.system !== 'split-phase' && r.loads.some((l) => /^[ABC]-[ABC]$/.test(l.connection)))
    notes.push(
      'A load across two lines splits its power unevenly between them: each line’s share is shifted by 30°, one towards lagging, the other towards leading (near unity PF, one line’s share leads).',
    );
  for (const p of r.phases) {
    const sentence = exportSentence(`Line ${label(p.phase)}`, p, 'exports');
    if (sentence) notes.push(sentence);
  }
  return [table, ...notes.map(note), ...(ll ? [`  line-to-line: ${ll}`] : [])].join('\n');
}

function loadTable(r: BoardResult): string {
  const label = labeller(r);
  const rows = r.loads.map((l) => {
    const worst = worstBranch(l);
    const shown = voltageCells(r, true, { volts: worst.voltage.magnitude, percent: worst.voltagePercent });
    return [
      l.name,
      label(l.connection),
      MODEL_SHORT[l.model] ?? l.model,
      l.energised ? shown.volts : 'dead',
      l.energised ? shown.percent : '',
      fixed(l.currentA, 1),
      fixed(l.kW, 2),
      fixed(l.kvar, 2),
      `${pfCell(l)}${l.pfAssumed ? ' *' : ''}`,
    ];
  });
  // Panel-schedule columns only when the file gives them, so a plain board's table stays as narrow as before.
  const scheduled = r.loads.some((l) => l.circuit !== null || l.breakerA !== null || l.poles !== null);
  if (scheduled)
    rows.forEach((row, k) => {
      const l = r.loads[k]!;
      row.unshift(l.circuit ?? '');
      row.push([l.breakerA !== null ? `${fixed(l.breakerA, 0)} A` : '', l.poles !== null ? `${l.poles}P` : ''].filter(Boolean).join(' '));
    });
  const notes = ['model: P constant power, I constant current, Z constant impedance, ZIP a mix · V: the voltage of the branch furthest from its nominal, above or below, as the report quotes it.'];
  if (scheduled) notes.push('no.: circuit number · breaker: rating and poles, as given in the file.');
  const asDelta = r.loads.filter(solvedAsEquivalentDelta).map((l) => `"${l.name}"`);
  if (asDelta.length)
    notes.push(
      `${asDelta.join(', ')}: a floating ${wordsOf(r).starWord} of constant-power or constant-current elements has no unique ${wordsOf(r).starWord}-point position, so it is solved as its equivalent delta (its rating shared by the three line-to-line pairs; V is line-to-line). Rate it in ohms or as constant-impedance to see its ${wordsOf(r).starWord} point.`,
    );
  if (r.loads.some((l) => l.pfAssumed)) notes.push(assumedPfNote(r.loads.filter((l) => l.pfAssumed).map((l) => l.kW)));
  for (const l of r.loads) {
    const sentence = exportSentence(`"${l.name}"`, l, 'generates');
    if (sentence) notes.push(sentence);
  }
  return [renderTableWithin(
    [
      ...(scheduled ? [{ header: 'no.', align: 'left' as const }] : []),
      { header: 'circuit', align: 'left' },
      { header: 'on', align: 'left' },
      { header: 'model', align: 'left' },
      { header: 'V' },
      { header: '%nom' },
      { header: 'A' },
      { header: 'kW' },
      { header: 'kvar' },
      { header: 'PF', align: 'left' },
      ...(scheduled ? [{ header: 'breaker', align: 'left' as const }] : []),
    ],
    rows,
    scheduled ? 1 : 0,
  ), ...notes.map(note)].join('\n');
}

/** A star load whose branches run line to line: core solved it as its equivalent delta. */
const solvedAsEquivalentDelta = (l: BoardResult['loads'][number]) =>
  l.connection === 'ABC-star' && l.branches.every((b) => b.from !== 'N' && b.to !== 'N' && b.from !== 'star' && b.to !== 'star');

function sequenceBlock(r: BoardResult): string {
  if (!r.sequences || !r.unbalance) return '  (symmetrical components apply to three-phase boards only)';
  const s = r.sequences;
  const table = renderTable(
    [{ header: '', align: 'left' }, { header: 'zero' }, { header: 'positive' }, { header: 'negative' }],
    [
      ['voltage V', fixed(s.voltage.zero.magnitude, 2), fixed(s.voltage.positive.magnitude, 2), fixed(s.voltage.negative.magnitude, 2)],
      ['current A', fixed(s.current.zero.magnitude, 2), fixed(s.current.positive.magnitude, 2), fixed(s.current.negative.magnitude, 2)],
    ],
  );
  const u = r.unbalance;
  const lines = [
    `voltage unbalance factor |V2|/|V1| (IEC)   ${fixed(u.voltageFactorPercent, 2)} %`,
    `zero-sequence voltage |V0|/|V1|            ${fixed(u.zeroSequenceVoltagePercent, 2)} %`,
    `line-voltage unbalance rate (NEMA MG 1)    ${fixed(u.lineVoltageRatePercent, 2)} %`,
    `phase-voltage unbalance rate (IEEE)        ${fixed(u.phaseVoltageRatePercent, 2)} %`,
    // Ratios of currents the tables print as 0.0 A (a few milliamperes) would contradict them: shown as "-".
    ...(printsAsNoCurrent(r)
      ? [`current |I2|/|I1|, |I0|/|I1|               -, - (line currents below 0.05 A)`, `line-current deviation from average        -`]
      : [
          `current |I2|/|I1|, |I0|/|I1|               ${fixed(u.currentNegativePercent, 1)} %, ${fixed(u.currentZeroPercent, 1)} %`,
          `line-current deviation from average        ${fixed(u.currentDeviationPercent, 1)} %`,
        ]),
    `three-phase motor derating (NEMA MG 1)     ${u.motorDeratingFactor === null ? 'above 5 %: operation not recommended' : `× ${fixed(u.motorDeratingFactor, 2)}`}`,
  ];
  return `${table}\n${lines.map((l) => `  ${l}`).join('\n')}`;
}

/** Every line current prints as 0.0 A: ratios and power factors of such currents are not shown beside them. */
const printsAsNoCurrent = (r: BoardResult): boolean => r.phases.every((p) => fixed(p.current.magnitude, 1) === '0.0');

function powerFactorBlock(r: BoardResult): string {
  const pf = r.powerFactor;
  // A PF beside an apparent power that prints as 0.00 kVA is not shown, as a line's PF cell is not.
  const pfOf = (x: { kVA: number; pf: number | null }) => (fixed(x.kVA, 2) === '0.00' ? '-' : signedPfText(x.pf));
  const rows: string[][] = [
    ['vector  |ΣS|', fixed(pf.vector.kVA, 2), pfOf(pf.vector)],
    ['arithmetic  Σ|V||I|', fixed(pf.arithmetic.kVA, 2), pfOf(pf.arithmetic)],
  ];
  if (pf.effective) rows.push(['effective  3·Ve·Ie (IEEE 1459)', fixed(pf.effective.kVA, 2), pfOf(pf.effective)]);
  if (pf.positiveSequence) rows.push(['positive sequence  3·V1·I1', fixed(pf.positiveSequence.kVA, 2), pfOf(pf.positiveSequence)]);
  // S_U1 is an apparent power with no power factor of its own: a row of the table, its PF cell empty.
  if (pf.unbalancedKVA !== null) rows.push(['unbalanced  S_U1 (IEEE 1459)', fixed(pf.unbalancedKVA, 2), '']);
  return renderTable([{ header: 'definition', align: 'left' }, { header: 'kVA' }, { header: 'PF' }], rows);
}

/** "7.600 kW exported; the board absorbs 1.200 kvar", or "…, with no reactive power" when none flows. */
function exportedWords(kW: number, kvar: number): string {
  const vars = varWords(kvar, 3);
  return `${fixed(-kW, 3)} kW exported${vars === 'no reactive power' ? ', with no reactive power' : `; the board ${vars}`}`;
}

function powerBlock(r: BoardResult): string {
  const l = r.losses;
  const generating = r.loads.some((load) => isExport(load.kW));
  // A sub-board is fed by the board above it, through its feeder only (no source windings of its own).
  const feeding = r.incomer?.fedFrom ?? null;
  const supply = fixed(r.source.kW, 3).startsWith('-')
    ? `  ${(feeding ? `to ${feeding}` : 'to the supply').padEnd(16)} ${exportedWords(r.source.kW, r.source.kvar)}`
    : `  ${(feeding ? `from ${feeding}` : 'from the supply').padEnd(16)} ${fixed(r.source.kW, 3)} kW, ${fixed(r.source.kvar, 3)} kvar`;
  const row = (label: string, text: string) => `  ${label.padEnd(16)} ${text}`;
  // What the board passes on to the boards it feeds (their loads and feeders): the balance's missing term on a board that feeds others.
  const beyondKW = r.source.kW - r.totals.kW - l.totalKW;
  const beyondKvar = r.source.kvar - r.totals.kvar - l.totalKvar;
  const feedsOthers = Math.abs(beyondKW) + Math.abs(beyondKvar) > 1e-6 * Math.max(1, Math.abs(r.source.kW) + Math.abs(r.source.kvar));
  return [
    row(generating ? 'loads (net)' : 'loads', `${fixed(r.totals.kW, 3)} kW, ${fixed(r.totals.kvar, 3)} kvar`),
    row(
      'losses',
      feeding
        ? `${fixed(l.totalKW, 3)} kW (its feeder: line conductors ${fixed(l.lineFeederKW, 3)}, neutral ${fixed(l.neutralKW, 3)})`
        : `${fixed(l.totalKW, 3)} kW (${r.board.idealSource ? 'none in the ideal source;' : `source ${fixed(l.sourceKW, 3)},`} line conductors ${fixed(l.lineFeederKW, 3)}, neutral ${fixed(l.neutralKW, 3)})`,
    ),
    ...(feedsOthers ? [row('boards beyond', `${fixed(beyondKW, 3)} kW, ${fixed(beyondKvar, 3)} kvar (the boards it feeds, with their feeders)`)] : []),
    supply,
    ...(r.transformer
      ? [row('transformer', `${fixed(r.transformer.kVA, 2)} kVA at its terminals; ${fixed(r.transformer.loadingPercent, 0)} % of rated current (${fixed(r.transformer.ratedKVA, 0)} kVA)`)]
      : []),
    ...(r.board.idealSource
      ? [wrapText(`ideal (zero source impedance: no transformer or impedance given): ${idealSourceHolds(r.board)} whatever the load`, `  ${'source'.padEnd(16)} `, ' '.repeat(19))]
      : []),
    ...(r.sourceUnits ? [wrapText(sourceUnitsWords(r.sourceUnits, labeller(r)), `  ${'supply units'.padEnd(16)} `, ' '.repeat(19))] : []),
    ...(r.incomer
      ? [
          wrapText(
            `${fixed(r.incomer.kVA, 2)} kVA through the feeder from ${r.incomer.fedFrom}; ${r.incomer.loadingPercent === null ? `largest line ${fixed(r.incomer.largestLineCurrentA, 1)} A (no feeder rating given)` : `${fixed(r.incomer.loadingPercent, 0)} % of its rating (${fixed(r.incomer.ratingA!, 0)} A)`}`,
            `  ${'incomer'.padEnd(16)} `,
            ' '.repeat(19),
          ),
        ]
      : []),
    ...(generating ? [note('loads (net): consumption minus generation, load convention (+kW consumed, +kvar absorbed).')] : []),
  ].join('\n');
}

export function renderSolveReport(r: BoardResult): string {
  const parts = [
    headerLines(r).join('\n'),
    ...(r.operatingPoint.collapsed
      ? [`\nSUPPLY COLLAPSE — the supply cannot carry these loads; the figures below are not a working board:\n${r.operatingPoint.findings.map((f) => wrapText(f, '  ! ')).join('\n')}`]
      : []),
    section('At the board') + phaseTable(r),
    section('Circuits') + loadTable(r),
    section('Symmetrical components and unbalance') + sequenceBlock(r),
    section('Apparent power and power factor') + powerFactorBlock(r),
    section('Power balance') + powerBlock(r),
  ];
  const limits = r.voltageCheck.limits;
  const nonStandard = nonStandardNominalNote(r.board);
  parts.push(
    section('Voltage limits') +
      wrapText(voltageVerdictLine(r), '  ') +
      `\n${wrapText(`on this board ${bandVoltsWords(limits, judgedNominals(r), bandDecimalsOf(r))}`, '  ')}\n${wrapText(limits.source, '  (', '   ', REPORT_WIDTH - 1)})` +
      (nonStandard ? `\n${wrapText(nonStandard, '  ! ', '    ')}` : ''),
  );
  if (r.openNeutral) parts.push(section('If the neutral conductor broke') + openNeutralBlock(r.openNeutral, labeller(r), wordsOf(r).sourceNeutralPoint));
  parts.push(section('Warnings') + (r.warnings.length ? r.warnings.map((w) => wrapText(w.message, '  ! ')).join('\n') : '  none'));
  parts.push(section('Notes') + r.cautions.map((c) => wrapText(c, '  * ')).join('\n'));
  return `${parts.join('\n')}\n`;
}
