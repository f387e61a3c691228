/**
 * IEEE 519 current distortion limits for 120 V–69 kV, % of the maximum demand
 * load current I_L, by short-circuit ratio I_sc/I_L. IEEE 519-1992 Table 10.3,
 * same values in 519-2014 Table 2 [METHODS §5, confirmed]. Even orders: 25 % of
 * the odd limits (1992/2014) [confirmed].
 */

import { InputError, inputIssue } from '../errors.js';

interface Row {
  readonly label: string;
  /** Upper end of the short-circuit ratio band (exclusive). */
  readonly below: number;
  /** Limits for 3≤h<11, 11≤h<17, 17≤h<23, 23≤h<35, 35≤h≤50, then TDD. */
  readonly limits: readonly [number, number, number, number, number];
  readonly tdd: number;
}

const ROWS: readonly Row[] = [
  { label: '< 20', below: 20, limits: [4.0, 2.0, 1.5, 0.6, 0.3], tdd: 5.0 },
  { label: '20 < 50', below: 50, limits: [7.0, 3.5, 2.5, 1.0, 0.5], tdd: 8.0 },
  { label: '50 < 100', below: 100, limits: [10.0, 4.5, 4.0, 1.5, 0.7], tdd: 12.0 },
  { label: '100 < 1000', below: 1000, limits: [12.0, 5.5, 5.0, 2.0, 1.0], tdd: 15.0 },
  { label: '> 1000', below: Infinity, limits: [15.0, 7.0, 6.0, 2.5, 1.4], tdd: 20.0 },
];

export const IEEE_519_SOURCE = 'IEEE 519-2014 Table 2 (= 519-1992 Table 10.3), even orders at 25 % of the odd limits';

/**
 * Voltage distortion limits for a bus at V ≤ 1.0 kV: 5 % individual harmonic, 8 % THD, % of the
 * fundamental (IEEE 519-2014 Table 1, the range added in 2014; confirmed secondary: a published
 * summary of the 2014 changes; the 8 % THD also in a library's table of IEEE 519-2022).
 */
export const IEEE_519_VOLTAGE_LIMITS = { individualPercent: 5, thdPercent: 8 } as const;

export const IEEE_519_VOLTAGE_SOURCE = 'IEEE 519-2014 Table 1, bus voltage ≤ 1.0 kV: 5 % individual harmonic, 8 % THD';

/** The row a ratio falls in; an infinite ratio (an ideal source) in the last, which has no upper end. */
function rowOf(ratio: number): Row {
  if (!(ratio > 0)) throw new InputError([inputIssue('out_of_range', 'shortCircuitRatio', 'a short-circuit ratio I_sc/I_L above 0', ratio)], 'the IEEE 519 row cannot be found');
  return ROWS.find((r) => ratio < r.below) ?? ROWS[ROWS.length - 1]!;
}

/** The table row for a short-circuit ratio. */
export function ieee519Row(shortCircuitRatio: number): { label: string; tddPercent: number } {
  const row = rowOf(shortCircuitRatio);
  return { label: row.label, tddPercent: row.tdd };
}

/** Individual current limit of order h, % of I_L. */
export function ieee519OrderLimit(shortCircuitRatio: number, h: number): number {
  const row = rowOf(shortCircuitRatio);
  const band = h < 11 ? 0 : h < 17 ? 1 : h < 23 ? 2 : h < 35 ? 3 : 4;
  const odd = row.limits[band];
  return h % 2 === 0 ? odd * 0.25 : odd;
}
