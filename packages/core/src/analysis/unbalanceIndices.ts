/**
 * Voltage and current unbalance indices.
 */

/**
 * NEMA line-voltage unbalance rate (NEMA MG 1): the largest deviation of a
 * line-to-line voltage magnitude from their average, as % of the average. The
 * IEEE phase-voltage unbalance rate is the same formula on line-to-neutral magnitudes.
 * @example deviationFromAveragePercent([460, 467, 450]) //=> 1.96… (average 459 V, max deviation 9 V)
 */
export function deviationFromAveragePercent(magnitudes: readonly number[]): number {
  const average = magnitudes.reduce((s, v) => s + v, 0) / magnitudes.length;
  if (average === 0) return 0;
  return (100 * Math.max(...magnitudes.map((v) => Math.abs(v - average)))) / average;
}

/**
 * Exact voltage unbalance factor |V2|/|V1| (%) from the three line-to-line
 * magnitudes alone (IEC 61000-4-30 form): β = ΣU⁴ / (ΣU²)²,
 * u2 = √[(1 − √(3 − 6β)) / (1 + √(3 − 6β))].
 */
export function unbalanceFactorFromLineMagnitudes([uab, ubc, uca]: readonly [number, number, number]): number {
  const s2 = uab ** 2 + ubc ** 2 + uca ** 2;
  const beta = (uab ** 4 + ubc ** 4 + uca ** 4) / (s2 * s2);
  // Clamps keep rounding on a balanced set (β = 1/3, root = 1) from producing √(negative).
  const root = Math.min(1, Math.sqrt(Math.max(0, 3 - 6 * beta)));
  return 100 * Math.sqrt((1 - root) / (1 + root));
}
