/** How the file's capacitor banks in service at the fundamental are named in text reports (solve, correct). */
import type { OtherBankInService } from '@trivar/core';
import { fixed } from './textTable.js';

const kvar = (x: number) => (Number.isInteger(x) ? String(x) : fixed(x, 2));

/** "Finishing shop 50 kvar rated (every step: 25+25 kvar; 440 V units)", delivered kvar after it when given. */
export function bankInServiceWords(b: OtherBankInService, deliveredKvar?: number): string {
  const all = b.stepsInService.length === b.stepsKvar.length;
  const steps = all
    ? `every step: ${b.stepsKvar.map(kvar).join('+')} kvar`
    : b.stepsInService.length
      ? `step${b.stepsInService.length === 1 ? '' : 's'} ${b.stepsInService.join('+')} of ${b.stepsKvar.map(kvar).join('+')} kvar`
      : `no step of ${b.stepsKvar.map(kvar).join('+')} kvar`;
  const parts = [b.fixedKvar > 0 ? `fixed ${kvar(b.fixedKvar)} kvar, ${steps}` : steps, `${kvar(b.ratedV)} V units`, ...(b.detuningPercent > 0 ? [`detuned ${kvar(b.detuningPercent)} %`] : [])];
  const delivered = deliveredKvar === undefined ? '' : `, ${fixed(deliveredKvar, 2)} kvar delivered`;
  return `${b.board} ${kvar(b.ratedKvarInService)} kvar rated (${parts.join('; ')})${delivered}`;
}
