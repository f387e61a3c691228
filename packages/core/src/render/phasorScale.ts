/**
 * Scales of the drawings: how many pixels stand for one volt or ampere, and a
 * round value for the scale bar printed under the drawing.
 */

export interface PhasorScale {
  /** Pixels per unit (per V, per A). */
  readonly pxPerUnit: number;
  /** A round value (1, 2 or 5 × 10^k) the scale bar shows. */
  readonly barValue: number;
  /** Length of the scale bar, px. */
  readonly barPx: number;
  readonly unit: string;
}

/** The largest 1-2-5 number not above x (x > 0). */
export function roundDown125(x: number): number {
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  // A hair of slack so 5.0000000001 reads as 5 and 4.9999999999 as 2 is not chosen for 5.
  return (m >= 5 - 1e-9 ? 5 : m >= 2 - 1e-9 ? 2 : 1) * p;
}

/**
 * A scale that draws `largest` at `radiusPx`, with a bar close to `barTargetPx` long.
 * A zero or tiny largest value falls back to 1 unit so the drawing stays finite.
 */
export function phasorScale(largest: number, radiusPx: number, unit: string, barTargetPx = 0.5 * radiusPx): PhasorScale {
  const top = largest > 1e-9 ? largest : 1;
  const pxPerUnit = radiusPx / top;
  const barValue = roundDown125(barTargetPx / pxPerUnit);
  return { pxPerUnit, barValue, barPx: barValue * pxPerUnit, unit };
}
