/**
 * Power factor and power-flow direction in words. Figures keep the load
 * convention (+kW consumed, +kvar absorbed); a "lag"/"lead" tag only means
 * something for power taken from the supply, so where active power flows back
 * the cell says "export" and a sentence states which way the vars go.
 */
import { isExportKW, powerFactorText, type PowerReading } from '@trivar/core';
import { fixed } from './textTable.js';

/** True when the power, as printed to 2 decimals, flows back toward the supply. */
export const isExport = isExportKW;

/** The PF cell of every table: core's powerFactorText, the one convention for text, reports and charts. */
export function pfCell(r: Pick<PowerReading, 'pf' | 'sense' | 'kVA' | 'kW' | 'kvar'>): string {
  return powerFactorText(r);
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
