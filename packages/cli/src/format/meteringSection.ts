/** Where a correction target is measured, when that is not the equipment's board: its readings before → after. */
import { meteringPointWords, type BeforeAfter, type MeteringReadings, signedPfText } from '@trivar/core';
import { fixed, section } from './textTable.js';
import { wrapText } from './wrapText.js';

const arrow = (x: BeforeAfter, digits: number, unit = '') => `${fixed(x.before, digits)}${unit} → ${fixed(x.after, digits)}${unit}`;
const pfArrow = (x: BeforeAfter) => `${signedPfText(x.before)} → ${signedPfText(x.after)}`;

/** `lines`: the per-line table, rendered as the board's own lines are. */
export function meteringSection(m: MeteringReadings, lines: string): string {
  const pf = m.powerFactor;
  const rows = [
    ...(pf.effective ? [`PF effective (IEEE 1459)     ${pfArrow(pf.effective)}`] : []),
    `PF vector                    ${pf.vector ? pfArrow(pf.vector) : '-'}`,
    ...(pf.positiveSequence ? [`PF positive sequence         ${pfArrow(pf.positiveSequence)}`] : []),
    `through it                   ${arrow(m.kW, 2, ' kW')}, ${arrow(m.kvar, 2, ' kvar')} (+ lagging)`,
  ];
  return (
    section(`Where the target is measured, before → after (the whole installation re-solved)`) +
    `${wrapText(`at ${meteringPointWords(m.point)}: the feeders between it and the equipment carry reactive power of their own and change the voltage, and both are in these figures`, '  ', '  ')}\n` +
    `${lines}\n` +
    rows.map((r) => `  ${r}`).join('\n')
  );
}
