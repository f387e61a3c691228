/**
 * Power factor and power-flow direction in words. Figures keep the load
 * convention (+kW consumed, +kvar absorbed); a "lag"/"lead" tag only means
 * something for power taken from the supply, so where active power flows back
 * the cell says "export" and a sentence states which way the vars go.
 */
import type { PowerReading } from '@trivar/core';
import { fixed } from './textTable.js';

/** True when the power, as printed to 2 decimals, flows back toward the supply. */
export const isExport = (kW: number): boolean => fixed(kW, 2).startsWith('-');

export function pfCell(r: Pick<PowerReading, 'pf' | 'sense' | 'kVA' | 'kW' | 'kvar'>): string {
  if (r.pf === null || fixed(r.kVA, 2) === '0.00') return '-';
  if (isExport(r.kW)) return `${fixed(r.pf, 3)} export`;
  // A sense beside vars that print as 0.00 (a 1 W lamp on a 10 kW phase) is noise: the PF reads 1.000 alone.
  const noVars = Number(fixed(Math.abs(r.kvar), 2)) === 0 && fixed(r.pf, 3) === '1.000';
  const sense = noVars ? '' : r.sense === 'lagging' ? ' lag' : r.sense === 'leading' ? ' lead' : '';
  return `${fixed(r.pf, 3)}${sense}`;
}

/** "absorbs 2.13 kvar" / "supplies 2.13 kvar" / "no reactive power", from a load-convention kvar. */
export function varWords(kvar: number, digits = 2): string {
  const shown = fixed(Math.abs(kvar), digits);
  if (Number(shown) === 0) return 'no reactive power';
  return kvar > 0 ? `absorbs ${shown} kvar` : `supplies ${shown} kvar`;
}

/** A sentence for a line or circuit that sends active power back, or null. */
export function exportSentence(who: string, r: Pick<PowerReading, 'kW' | 'kvar'>, verb: 'exports' | 'generates'): string | null {
  if (!isExport(r.kW)) return null;
  const vars = varWords(r.kvar);
  return `${who} ${verb} ${fixed(-r.kW, 2)} kW ${vars === 'no reactive power' ? 'at unity power factor' : `and ${vars}`}.`;
}

/** A board-wide PF, signed like P: an exporting board's reads as its size and "export", as a line's PF cell does. */
export const boardPfText = (pf: number): string => (fixed(pf, 3).startsWith('-') ? `${fixed(-pf, 3)} export` : fixed(pf, 3));
