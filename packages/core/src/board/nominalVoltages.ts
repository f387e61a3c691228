/**
 * A supply's nominal line-to-neutral and line-to-line voltages, from its notation or its figures:
 * what the solver's model is built on (normaliseBoard.ts) and what the rules judge a load's draw at
 * (boardRules.ts), NaN where the figure is missing (the voltage rules report that); and the system's
 * nominal pair as the standards name it, which limits and every "% of nominal" are taken against.
 */
import type { SupplySpec } from './boardSchema.js';
import type { Board } from './boardModel.js';
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

/**
 * The star pairs U0/U of IEC 60038 Table 1: 230/400, 400/690 and, at 60 Hz, 120/208, 277/480, 347/600
 * (checked against a secondary summary of the table, the "IEC 60038" encyclopaedia entry).
 */
export const IEC_60038_STAR_PAIRS: readonly (readonly [lineToNeutralV: number, lineToLineV: number])[] = [
  [120, 208],
  [230, 400],
  [277, 480],
  [347, 600],
  [400, 690],
];

/** Those and the pairs they replaced that are still met in service: 220/380, 240/415, 380/660 (same source). */
export const STANDARD_STAR_PAIRS: readonly (readonly [lineToNeutralV: number, lineToLineV: number])[] = [
  ...IEC_60038_STAR_PAIRS,
  [220, 380],
  [240, 415],
  [380, 660],
];

/**
 * The system's nominal voltages as the standards name them, which voltage limits and every
 * "% of nominal" are taken against. A star system's two nominal figures are not exactly √3 apart
 * (400/√3 = 230.9 V, 208/√3 = 120.1 V), yet EN 50160 judges a 400 V system's phases at 230 V ± 10 %
 * and ANSI C84.1 a 208Y/120 system's at 114–126 V. So the figure the file gives sets the model's
 * source (nominalVoltagesOf) and the other is the written one ("208Y/120") or the standard pair's;
 * a figure outside the standard pairs keeps the exact ratio.
 */
export function systemNominalOf(supply: SupplySpec): { ln: number; ll: number | null } {
  const model = nominalVoltagesOf(supply);
  const system = supply.system;
  if (system !== 'three-phase-4wire' && system !== 'three-phase-3wire') return model;
  const voltage = supply.voltage;
  const written = voltage.written !== undefined ? readVoltageNotation(voltage.written, system) : null;
  if (written?.ok) return { ln: written.notation.lineToNeutralV, ll: written.notation.lineToLineV };
  const pair =
    voltage.lineToNeutral !== undefined
      ? STANDARD_STAR_PAIRS.find(([ln]) => ln === voltage.lineToNeutral)
      : STANDARD_STAR_PAIRS.find(([, ll]) => ll === voltage.lineToLine);
  return pair ? { ln: pair[0], ll: pair[1] } : model;
}

/** A board's system nominal voltages (systemNominalOf), its model's where the board carries none. */
export function judgedNominalOf(board: Pick<Board, 'nominalLineToNeutralV' | 'nominalLineToLineV' | 'systemNominal'>): { ln: number; ll: number | null } {
  const s = board.systemNominal;
  return s ? { ln: s.lineToNeutralV, ll: s.lineToLineV } : { ln: board.nominalLineToNeutralV, ll: board.nominalLineToLineV };
}

/** The system nominal voltage a load branch is judged at: line-to-neutral across a phase and the neutral or a star point, else line-to-line. */
export function judgedBranchNominal(board: Pick<Board, 'nominalLineToNeutralV' | 'nominalLineToLineV' | 'systemNominal'>, branch: { readonly to: string; readonly vNominal: number }): number {
  if (!board.systemNominal) return branch.vNominal;
  const { ln, ll } = judgedNominalOf(board);
  return branch.to === 'N' || branch.to.startsWith('star') ? ln : (ll ?? branch.vNominal);
}
