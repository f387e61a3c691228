/**
 * A supply's nominal line-to-neutral and line-to-line voltages, from its notation or its figures:
 * what the solver's model is built on (normaliseBoard.ts) and what the rules judge a load's draw at
 * (boardRules.ts). NaN where the figure is missing: the voltage rules report that.
 */
import type { SupplySpec } from './boardSchema.js';
import { nominalOfNotation, readVoltageNotation } from './conventions/voltageNotation.js';

export function nominalVoltagesOf(supply: SupplySpec): { ln: number; ll: number | null } {
  const voltage = supply.voltage;
  const written = voltage.written !== undefined ? readVoltageNotation(voltage.written, supply.system) : null;
  if (written?.ok) return nominalOfNotation(written.notation, supply.system);
  const { lineToLine, lineToNeutral } = voltage;
  const ratio = supply.system === 'split-phase' ? 2 : Math.sqrt(3);
  if (supply.system === 'single-phase') return { ln: lineToNeutral ?? Number.NaN, ll: null };
  if (lineToNeutral !== undefined) return { ln: lineToNeutral, ll: lineToNeutral * ratio };
  const ll = lineToLine ?? Number.NaN;
  return { ln: ll / ratio, ll };
}
