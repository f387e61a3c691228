/**
 * Round-off is not data, interval by interval, on one board or across an installation. A board with
 * nothing on in an interval still reads about 1e-12 A in its feeder and 1e-13 W through it (the solve's
 * round-off); read as data that gave "import at a leading power factor: 2 h", a billing power factor of
 * 0.444 on a board that drew nothing, and "PF 0.6230" or "P −0.000 kW" in an interval's row. The rule is the
 * general solve's (analysis/noiseFloor.ts): a current below the larger of NOISE_FLOOR_RELATIVE of the
 * largest current anywhere in that interval and the circuit's conductor floor (its stiffest conductor's
 * round-off) is zero. A phase whose current is zero carries no power, and a phase's active or reactive
 * power below that fraction of the largest phase power — or below what a current at the floor carries at
 * nominal voltage — is zero. A |V2|/|V1| below the solve's sequence resolution is zero too.
 */
import { NOISE_FLOOR_RELATIVE, noiseFloorFor, SEQUENCE_VOLTAGE_RESOLUTION } from '../analysis/noiseFloor.js';
import type { Board } from '../board/boardModel.js';
import type { IntervalFigures } from './solveBatch.js';

/** The current below which a circuit's currents are round-off whatever it carries, A: its stiffest conductor's. */
export function conductorFloorA(boards: readonly Board[]): number {
  return Math.max(0, ...boards.map((b) => noiseFloorFor(b)(0)));
}

/**
 * Sets every board's round-off currents and powers to exactly zero, in place.
 * @param floorA the circuit's conductor floor (conductorFloorA) @param nominalV the nominal line-to-neutral voltage
 */
export function clearRoundOff(boards: readonly IntervalFigures[], floorA = 0, nominalV = 0): void {
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
    const noiseA = Math.max(NOISE_FLOOR_RELATIVE * largestA, floorA);
    const noiseVA = Math.max(NOISE_FLOOR_RELATIVE * largestVA, noiseA * nominalV);
    for (const f of boards) {
      if (f.unbalancePercent[i]! < 100 * SEQUENCE_VOLTAGE_RESOLUTION) f.unbalancePercent[i] = 0;
      if (f.lineDeviationPercent[i]! < 100 * SEQUENCE_VOLTAGE_RESOLUTION) f.lineDeviationPercent[i] = 0;
      if (f.neutralA[i]! < noiseA) f.neutralA[i] = 0;
      for (let k = 0; k < f.lineA.length; k++) {
        const idle = f.lineA[k]![i]! < noiseA;
        if (idle) f.lineA[k]![i] = 0;
        if (idle || Math.abs(f.phaseW[k]![i]!) < noiseVA) f.phaseW[k]![i] = 0;
        if (idle || Math.abs(f.phaseVar[k]![i]!) < noiseVA) f.phaseVar[k]![i] = 0;
      }
    }
  }
}
