/** BoardResult → the human-readable report of `trivar solve`. */
import { OPEN_NEUTRAL_METHOD as OPEN_NEUTRAL_METHOD_TEXT, type BoardResult, type OpenNeutralLoadReading, type OpenNeutralStudy, type PowerReading } from '@trivar/core';
import { fixed, renderTable, section, wrapParagraph } from './textTable.js';

const SYSTEM_WORDS: Record<string, string> = {
  'three-phase-4wire': 'three-phase 4-wire',
  'three-phase-3wire': 'three-phase 3-wire',
  'split-phase': 'split-phase 3-wire',
  'single-phase': 'single-phase 2-wire',
};

function pfText(r: Pick<PowerReading, 'pf' | 'sense' | 'kVA'>): string {
  if (r.kVA === 0) return '-';
  const sense = r.sense === 'lagging' ? ' lag' : r.sense === 'leading' ? ' lead' : '';
  return `${fixed(r.pf, 3)}${sense}`;
}

export function headerLines(r: BoardResult): string[] {
  const b = r.board;
  const volts = b.nominalLineToLineV
    ? `${fixed(b.nominalLineToLineV, 0)} V line-to-line, ${fixed(b.nominalLineToNeutralV, 1)} V line-to-neutral`
    : `${fixed(b.nominalLineToNeutralV, 0)} V`;
  const seq = b.system.startsWith('three') ? ` · sequence ${b.sequence}` : '';
  return [
    b.name,
    `${SYSTEM_WORDS[b.system] ?? b.system} · ${volts} · ${b.frequencyHz} Hz${seq}${b.neutralOpen ? ' · NEUTRAL OPEN' : ''}`,
    `solved in ${r.solve.iterations} iteration${r.solve.iterations === 1 ? '' : 's'}`,
  ];
}

function phaseTable(r: BoardResult): string {
  const rows = r.phases.map((p) => [
    p.phase,
    fixed(p.voltage.magnitude, 1),
    fixed(p.voltage.angleDeg, 1),
    fixed(p.voltagePercent, 1),
    fixed(p.current.magnitude, 1),
    fixed(p.current.angleDeg, 1),
    fixed(p.kW, 2),
    fixed(p.kvar, 2),
    pfText(p),
    p.loadingPercent === null ? '' : fixed(p.loadingPercent, 0),
  ]);
  if (r.neutral)
    rows.push([
      'N',
      r.neutral.barVoltage ? fixed(r.neutral.barVoltage.magnitude, 1) : '',
      r.neutral.barVoltage ? fixed(r.neutral.barVoltage.angleDeg, 1) : '',
      '',
      fixed(r.neutral.current.magnitude, 1),
      fixed(r.neutral.current.angleDeg, 1),
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
      { header: 'A' },
      { header: '∠I°' },
      { header: 'kW' },
      { header: 'kvar' },
      { header: 'PF', align: 'left' },
      { header: '%rating' },
    ],
    rows,
  );
  const ll = r.lineToLine.map((l) => `${l.pair} ${fixed(l.voltage.magnitude, 1)} V (${fixed(l.voltagePercent, 1)} %)`).join('   ');
  const notes: string[] = [];
  if (r.neutral) notes.push('N row: neutral bar voltage to the source star point, and the neutral current.');
  if (r.loads.some((l) => /^[ABC]-[ABC]$|delta/.test(l.connection)))
    notes.push('Line-to-line loads split their power unevenly between their two lines: one line leads, the other lags.');
  const note = notes.map((n) => `\n  (${n})`).join('');
  return table + note + (ll ? `\n  line-to-line: ${ll}` : '');
}

function loadTable(r: BoardResult): string {
  const rows = r.loads.map((l) => {
    const worst = l.branches.reduce((a, b) => (Math.abs(b.voltagePercent - 100) > Math.abs(a.voltagePercent - 100) ? b : a));
    return [
      l.name,
      l.connection,
      l.model,
      l.energised ? fixed(worst.voltage.magnitude, 1) : 'dead',
      l.energised ? fixed(worst.voltagePercent, 1) : '',
      fixed(l.currentA, 1),
      fixed(l.kW, 2),
      fixed(l.kvar, 2),
      `${pfText(l)}${l.pfAssumed ? ' *' : ''}`,
    ];
  });
  return renderTable(
    [
      { header: 'circuit', align: 'left' },
      { header: 'on', align: 'left' },
      { header: 'model', align: 'left' },
      { header: 'V' },
      { header: '%nom' },
      { header: 'A' },
      { header: 'kW' },
      { header: 'kvar' },
      { header: 'PF', align: 'left' },
    ],
    rows,
  ) + (r.loads.some((l) => l.pfAssumed) ? '\n  (* pf not given in the file: taken as 1, a resistive load)' : '');
}

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
    `current |I2|/|I1|, |I0|/|I1|               ${fixed(u.currentNegativePercent, 1)} %, ${fixed(u.currentZeroPercent, 1)} %`,
    `line-current deviation from average        ${fixed(u.currentDeviationPercent, 1)} %`,
    `three-phase motor derating (NEMA MG 1)     ${u.motorDeratingFactor === null ? 'above 5 %: operation not recommended' : `× ${fixed(u.motorDeratingFactor, 2)}`}`,
  ];
  return `${table}\n${lines.map((l) => `  ${l}`).join('\n')}`;
}

function powerFactorBlock(r: BoardResult): string {
  const pf = r.powerFactor;
  const rows: string[][] = [
    ['vector  |ΣS|', fixed(pf.vector.kVA, 2), fixed(pf.vector.pf, 3)],
    ['arithmetic  Σ|V||I|', fixed(pf.arithmetic.kVA, 2), fixed(pf.arithmetic.pf, 3)],
  ];
  if (pf.effective) rows.push(['effective  3·Ve·Ie (IEEE 1459)', fixed(pf.effective.kVA, 2), fixed(pf.effective.pf, 3)]);
  if (pf.positiveSequence) rows.push(['positive sequence  3·V1·I1', fixed(pf.positiveSequence.kVA, 2), fixed(pf.positiveSequence.pf, 3)]);
  let out = renderTable([{ header: 'definition', align: 'left' }, { header: 'kVA' }, { header: 'PF' }], rows);
  if (pf.unbalancedKVA !== null) out += `\n  fundamental unbalanced power S_U1 ${fixed(pf.unbalancedKVA, 2)} kVA`;
  return out;
}

function powerBlock(r: BoardResult): string {
  const l = r.losses;
  return [
    `  loads      ${fixed(r.totals.kW, 3)} kW  ${fixed(r.totals.kvar, 3)} kvar`,
    `  losses     ${fixed(l.totalKW, 3)} kW  (source ${fixed(l.sourceKW, 3)}, line conductors ${fixed(l.lineFeederKW, 3)}, neutral ${fixed(l.neutralKW, 3)})`,
    `  from source ${fixed(r.source.kW, 3)} kW  ${fixed(r.source.kvar, 3)} kvar`,
  ].join('\n');
}

function openNeutralBlock(study: OpenNeutralStudy): string {
  if (!study.applicable) return wrapParagraph(`not applicable: ${study.note ?? ''}`, '  ');
  const other = study.otherStates[0];
  const impedance = study.impedanceModel;
  const flagWord = (f: OpenNeutralLoadReading['flag']) => (f === 'ok' ? '' : f === 'over' ? 'OVER' : 'under');
  const rows = study.loads.map((l, k) => [
    l.name,
    l.phase,
    `${fixed(l.voltage, 1)}${l.belowLowVoltageRule ? '*' : ''}`,
    fixed(l.voltagePercent, 1),
    flagWord(l.flag),
    ...(impedance ? [fixed(impedance.loads[k]!.voltage, 1), fixed(impedance.loads[k]!.voltagePercent, 1)] : []),
    ...(other ? [fixed(other.loads[k]!.voltage, 1), fixed(other.loads[k]!.voltagePercent, 1)] : []),
  ]);
  const table = renderTable(
    [
      { header: 'circuit', align: 'left' },
      { header: 'phase', align: 'left' },
      { header: 'V' },
      { header: '%nom' },
      { header: '', align: 'left' },
      ...(impedance ? [{ header: 'V if Z' }, { header: '%nom' }] : []),
      ...(other ? [{ header: 'V alt' }, { header: '%nom' }] : []),
    ],
    rows,
  );
  const key = [
    study.reachedFromIntact ? 'V: the state the board reaches' : 'V: the worst state found',
    ...(impedance ? ['V if Z: every load as a constant impedance'] : []),
    ...(other ? ['V alt: another solution of the same equations'] : []),
    ...(study.loads.some((l) => l.belowLowVoltageRule) ? ['*: below the low-voltage rule, taken as an impedance'] : []),
  ];
  const bar = study.barVoltage ? `  neutral bar floats to ${fixed(study.barVoltage.magnitude, 1)} V from the source star point` : '';
  return [
    wrapParagraph(OPEN_NEUTRAL_METHOD_TEXT, '  '),
    ...(bar ? [bar] : []),
    table,
    wrapParagraph(key.join(' · '), '  (', '   ').concat(')'),
    ...study.findings.map((f) => wrapParagraph(f, '  ! ')),
    ...study.cautions.map((c) => wrapParagraph(c, '  ! ')),
  ].join('\n');
}

export function renderSolveReport(r: BoardResult): string {
  const parts = [
    headerLines(r).join('\n'),
    section('At the board') + phaseTable(r),
    section('Circuits (worst branch voltage)') + loadTable(r),
    section('Symmetrical components and unbalance') + sequenceBlock(r),
    section('Apparent power and power factor') + powerFactorBlock(r),
    section('Power balance') + powerBlock(r),
  ];
  if (r.openNeutral) parts.push(section('If the neutral conductor broke') + openNeutralBlock(r.openNeutral));
  parts.push(section('Warnings') + (r.warnings.length ? r.warnings.map((w) => `  ! ${w.message}`).join('\n') : '  none'));
  parts.push(section('Notes') + r.cautions.map((c) => `  * ${c}`).join('\n'));
  return `${parts.join('\n')}\n`;
}
