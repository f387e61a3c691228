/** Invented boards for the correction tests. */
import { normaliseBoard, parseBoard, type Board } from '@trivar/core';

export type SystemKind = 'three-phase-4wire' | 'three-phase-3wire' | 'single-phase' | 'split-phase';

export interface LoadLine {
  readonly name: string;
  readonly connection: string;
  readonly kW: number;
  readonly pf: number;
  readonly sense?: 'lagging' | 'leading';
  readonly model?: 'constant-impedance' | 'constant-current' | 'constant-power';
}

export function makeBoard(
  system: SystemKind,
  loads: readonly LoadLine[],
  extra: { frequencyHz?: 50 | 60; sequence?: 'ABC' | 'ACB'; lineToLine?: number; lineToNeutral?: number; transformer?: { kVA: number; impedancePercent: number; xOverR: number } } = {},
): Board {
  const voltage = extra.lineToNeutral !== undefined || system === 'single-phase' ? { lineToNeutral: extra.lineToNeutral ?? 230 } : { lineToLine: extra.lineToLine ?? 400 };
  return normaliseBoard(
    parseBoard({
      name: 'test board',
      supply: {
        system,
        voltage,
        frequencyHz: extra.frequencyHz ?? 50,
        ...(extra.sequence ? { sequence: extra.sequence } : {}),
        ...(extra.transformer ? { transformer: extra.transformer } : {}),
      },
      loads,
    }),
  );
}

/** A bakery-sized 4-wire board: ovens, mixers, a cold room; uneven and lagging. */
export const bakeryLoads: readonly LoadLine[] = [
  { name: 'deck oven fans', connection: 'A-N', kW: 9, pf: 0.72 },
  { name: 'dough mixer', connection: 'B-N', kW: 5.5, pf: 0.8 },
  { name: 'proofer', connection: 'C-N', kW: 7, pf: 0.86 },
  { name: 'cold room compressor', connection: 'ABC-delta', kW: 12, pf: 0.78 },
];
