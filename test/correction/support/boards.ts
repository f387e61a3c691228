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

/**
 * An invented 230/400 V board behind a 250 kVA, 4 %, X/R 3 transformer and a short feeder (line 0.02 + j0.01 Ω,
 * neutral 0.03 + j0.01 Ω): where the correction tests' uneven workshops sit, a few per cent below nominal.
 */
export function behindTransformer(name: string, loads: readonly LoadLine[]): Board {
  return normaliseBoard(
    parseBoard({
      name,
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
      feeder: { line: { r: 0.02, x: 0.01 }, neutral: { r: 0.03, x: 0.01 } },
      loads,
    }),
  );
}
