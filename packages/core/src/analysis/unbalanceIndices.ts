/**
 * Voltage and current unbalance indices.
 */
import { argumentIssueError, checkNumberArgument } from '../_internal/argumentChecks.js';

/**
 * NEMA line-voltage unbalance rate (NEMA MG 1): the largest deviation of a
 * line-to-line voltage magnitude from their average, as % of the average. The
 * IEEE phase-voltage unbalance rate is the same formula on line-to-neutral magnitudes.
 * @param noiseFloor a largest deviation at or below this (the magnitudes' unit) is round-off: 0 %
 * @example deviationFromAveragePercent([460, 467, 450]) //=> 1.96… (average 459 V, max deviation 9 V)
 */
export function deviationFromAveragePercent(magnitudes: readonly number[], noiseFloor = 0): number {
  const average = magnitudes.reduce((s, v) => s + v, 0) / magnitudes.length;
  if (average === 0) return 0;
  const largest = Math.max(...magnitudes.map((v) => Math.abs(v - average)));
  return largest <= noiseFloor ? 0 : (100 * largest) / average;
}

/**
 * The line-to-line deviation index of three line-to-line magnitudes, %: the line-voltage unbalance rate
 * above, without an array per call (the profile's interval loops, which have the magnitudes already).
 */
export function lineDeviationPercentOf(ab: number, bc: number, ca: number): number {
  const average = (ab + bc + ca) / 3;
  return average === 0 ? 0 : (100 * Math.max(Math.abs(ab - average), Math.abs(bc - average), Math.abs(ca - average))) / average;
}

/**
 * Exact voltage unbalance factor |V2|/|V1| (%) from the three line-to-line
 * magnitudes alone (IEC 61000-4-30 form): β = ΣU⁴ / (ΣU²)²,
 * u2 = √[(1 − √(3 − 6β)) / (1 + √(3 − 6β))].
 */
export function unbalanceFactorFromLineMagnitudes(magnitudes: readonly [number, number, number]): number {
  if (!Array.isArray(magnitudes) || magnitudes.length !== 3) throw argumentIssueError('magnitudes', 'three line-to-line voltage magnitudes [Uab, Ubc, Uca]', magnitudes);
  magnitudes.forEach((u, k) => checkNumberArgument(u, `magnitudes[${k}]`, 'a line-to-line voltage magnitude, a finite number above 0', (x) => x > 0));
  const [uab, ubc, uca] = magnitudes;
  // Three line voltages add to zero, so their magnitudes close a triangle; equal to the other two's sum
  // is the flat limit (|V2| = |V1|, 100 %). A little slack for magnitudes read off a solve.
  const longest = Math.max(uab, ubc, uca);
  if (longest > (uab + ubc + uca - longest) * (1 + 1e-9))
    throw argumentIssueError('magnitudes', 'three magnitudes that can close a triangle (none longer than the other two together), as line-to-line voltages do', `[${uab}, ${ubc}, ${uca}]`);
  const s2 = uab ** 2 + ubc ** 2 + uca ** 2;
  const beta = (uab ** 4 + ubc ** 4 + uca ** 4) / (s2 * s2);
  // Clamps keep rounding on a balanced set (β = 1/3, root = 1) from producing √(negative).
  const root = Math.min(1, Math.sqrt(Math.max(0, 3 - 6 * beta)));
  return 100 * Math.sqrt((1 - root) / (1 + root));
}

/**
 * NEMA MG 1 motor derating for voltage unbalance (Figure 14-1), read at the
 * points in METHODS.md §3 (confirmed in a secondary table; graph reads,
 * ±0.01): 1.00 up to 1 %, 0.97 at 1.5 %, 0.95 at 2 %, 0.93 at 2.5 %, 0.89 at
 * 3 %, 0.85 at 3.5 %, 0.82 at 4 %, 0.78 at 4.5 %, 0.76 at 5 %; linear between.
 * Above 5 % NEMA does not recommend operation: null.
 * @param lineVoltageRatePercent the NEMA line-voltage unbalance rate, %
 * @example motorDeratingFactor(2) //=> 0.95
 */
export function motorDeratingFactor(lineVoltageRatePercent: number): number | null {
  // NaN read as "above 5 %" (null) and null as 0 % (1.00): the public entry refuses both.
  checkNumberArgument(lineVoltageRatePercent, 'lineVoltageRatePercent', 'the NEMA line-voltage unbalance rate, %, a finite number, 0 or more', (x) => x >= 0);
  return nemaDerating(lineVoltageRatePercent);
}

/** motorDeratingFactor without the argument check: the analysis of every solve reads its own figure (a NaN there is assertFiniteResult's to report). */
export function nemaDerating(lineVoltageRatePercent: number): number | null {
  const points: readonly [number, number][] = [
    [1, 1],
    [1.5, 0.97],
    [2, 0.95],
    [2.5, 0.93],
    [3, 0.89],
    [3.5, 0.85],
    [4, 0.82],
    [4.5, 0.78],
    [5, 0.76],
  ];
  const u = lineVoltageRatePercent;
  if (u <= 1) return 1;
  if (u > 5) return null;
  for (let k = 1; k < points.length; k++) {
    const [u1, f1] = points[k]!;
    const [u0, f0] = points[k - 1]!;
    if (u <= u1) return f0 + ((f1 - f0) * (u - u0)) / (u1 - u0);
  }
  return null;
}
