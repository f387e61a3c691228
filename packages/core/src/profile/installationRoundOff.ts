/**
 * Round-off is not data, interval by interval, across an installation. A board with nothing on in an
 * interval still reads about 1e-12 A in its feeder and 1e-13 W through it (the nodal solve's round-off);
 * summarised as data that gave "import at a leading power factor: 2 h" and a billing power factor of
 * 0.444 on a board that drew nothing. As the general solve does (analysis/noiseFloor.ts), a current below
 * NOISE_FLOOR_RELATIVE of the largest current anywhere in the installation in that interval is zero, and so
 * is a phase's power below that fraction of the largest phase power.
 */
import { NOISE_FLOOR_RELATIVE } from '../analysis/noiseFloor.js';
import type { IntervalFigures } from './solveBatch.js';

/** Sets every board's round-off currents and powers to exactly zero, in place. */
export function clearInstallationRoundOff(boards: readonly IntervalFigures[]): void {
  const n = boards[0]?.count ?? 0;
  for (let i = 0; i < n; i++) {
    let largestA = 0;
    let largestVA = 0;
    for (const f of boards) {
      largestA = Math.max(largestA, f.neutralA[i]!);
      for (let k = 0; k < f.lineA.length; k++) {
        largestA = Math.max(largestA, f.lineA[k]![i]!);
        largestVA = Math.max(largestVA, Math.hypot(f.phaseW[k]![i]!, f.phaseVar[k]![i]!));
      }
    }
    const floorA = NOISE_FLOOR_RELATIVE * largestA;
    const floorVA = NOISE_FLOOR_RELATIVE * largestVA;
    for (const f of boards) {
      if (f.neutralA[i]! < floorA) f.neutralA[i] = 0;
      for (let k = 0; k < f.lineA.length; k++) {
        if (f.lineA[k]![i]! < floorA) f.lineA[k]![i] = 0;
        if (Math.hypot(f.phaseW[k]![i]!, f.phaseVar[k]![i]!) < floorVA) f.phaseW[k]![i] = f.phaseVar[k]![i] = 0;
      }
    }
  }
}
