/** The broken-neutral study as a section of `trivar solve`. */
import { OPEN_NEUTRAL_BAND, OPEN_NEUTRAL_COLUMN_KEY, OPEN_NEUTRAL_METHOD, voltageBesideBand, type OpenNeutralLoadReading, type OpenNeutralStudy } from '@trivar/core';
import { fixed, renderTableWithin } from './textTable.js';
import { REPORT_WIDTH, wrapText } from './wrapText.js';

const flagWord = (f: OpenNeutralLoadReading['flag']) => (f === 'ok' ? '' : f === 'over' ? 'OVER' : 'under');

export function openNeutralBlock(study: OpenNeutralStudy, label: (phase: string) => string = (p) => p, sourceNeutralPoint = 'the source star point'): string {
  if (!study.applicable) return wrapText(`not applicable: ${study.note ?? ''}`, '  ');
  const other = study.otherStates[0];
  const impedance = study.impedanceModel;
  // The flagged figures printed with the decimals that show their side of the band they are flagged against.
  const shown = (l: { voltage: number; voltagePercent: number }) => voltageBesideBand(OPEN_NEUTRAL_BAND, { volts: l.voltage, percent: l.voltagePercent });
  const rows = study.loads.map((l, k) => [
    l.name,
    label(l.phase),
    `${shown(l).volts}${l.belowLowVoltageRule ? '*' : ''}`,
    shown(l).percent,
    flagWord(l.flag),
    ...(impedance ? [fixed(impedance.loads[k]!.voltage, 1), fixed(impedance.loads[k]!.voltagePercent, 1)] : []),
    ...(other ? [fixed(other.loads[k]!.voltage, 1), fixed(other.loads[k]!.voltagePercent, 1)] : []),
  ]);
  const table = renderTableWithin(
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
    study.reachedFromIntact ? OPEN_NEUTRAL_COLUMN_KEY.reached : OPEN_NEUTRAL_COLUMN_KEY.worstFound,
    ...(impedance ? [OPEN_NEUTRAL_COLUMN_KEY.impedanceModel] : []),
    ...(other ? [OPEN_NEUTRAL_COLUMN_KEY.otherState] : []),
    ...(study.loads.some((l) => l.belowLowVoltageRule) ? [OPEN_NEUTRAL_COLUMN_KEY.belowLowVoltageRule] : []),
  ];
  const bar = study.barVoltage ? `  neutral bar floats to ${fixed(study.barVoltage.magnitude, 1)} V from ${sourceNeutralPoint}` : '';
  return [
    wrapText(OPEN_NEUTRAL_METHOD, '  '),
    ...(bar ? [bar] : []),
    table,
    `${wrapText(key.join(' · '), '  (', '   ', REPORT_WIDTH - 1)})`,
    ...study.findings.map((f) => wrapText(f, '  ! ')),
    ...study.cautions.map((c) => wrapText(c, '  ! ')),
  ].join('\n');
}
