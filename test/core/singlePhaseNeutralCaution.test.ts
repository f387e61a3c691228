/**
 * The unprotected-neutral caution on a single-phase 2-wire board: its neutral carries the line's
 * current, which the line's breaker protects, so the caution belongs only where the neutral is
 * smaller than the line (a reduced neutral can overheat with nothing tripping). Invented board: a
 * garden studio's kiln and heat pump on an 80 m run.
 */
import { describe, expect, it } from 'vitest';
import { solveBoard } from '@trivar/core';

const unprotectedNeutral = (cautions: readonly string[]) => cautions.some((c) => /overheat without tripping/.test(c));

const studio = (neutralRatingA: number) => ({
  name: 'Garden studio board',
  supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 },
  feeder: { line: { lengthM: 80, rOhmPerKm: 1.83, xOhmPerKm: 0.09, ratingA: 40 }, neutral: { lengthM: 80, rOhmPerKm: 1.83, xOhmPerKm: 0.09, ratingA: neutralRatingA } },
  loads: [
    { name: 'Kiln', connection: 'A-N', kW: 7.5, pf: 1, model: 'constant-impedance' },
    { name: 'Heat pump', connection: 'A-N', kW: 2, pf: 0.9 },
  ],
});

describe('neutral caution on a single-phase 2-wire board', () => {
  it('is not given where the neutral is rated as the line (its breaker protects both)', () => {
    const r = solveBoard(studio(40));
    expect(r.neutral!.current.magnitude).toBeCloseTo(r.phases[0]!.current.magnitude, 9);
    expect(r.warnings.map((w) => w.code)).toContain('neutral-over-rating');
    expect(unprotectedNeutral(r.cautions)).toBe(false);
  });
  it('is given where the neutral is smaller than the line', () => {
    const r = solveBoard(studio(25));
    expect(unprotectedNeutral(r.cautions)).toBe(true);
  });
});
