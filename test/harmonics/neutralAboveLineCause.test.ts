/**
 * Why a neutral carries as much as the largest line, in the warning: triplen orders adding from several
 * lines are named only where they do (more in the neutral than in any one line, and a real share of its
 * rms); a neutral whose fundamental alone reaches the most loaded line's is put down to the phase loading.
 * An invented 208Y/120 V launderette: washers on one line with a till on another, then on all three.
 */
import { describe, expect, it } from 'vitest';
import { studyHarmonics } from '@trivar/core';

const launderette = (loads: object[]) => ({
  name: 'Spindle Street launderette',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 208 }, frequencyHz: 60, transformer: { kVA: 75, impedancePercent: 3, xOverR: 2 } },
  loads,
});

describe('the neutral above the largest line: its cause', () => {
  it('washers on one line, a till on another: the phase loading, with the triplen amps quoted', () => {
    const r = studyHarmonics(
      launderette([
        { name: 'washers', connection: 'A-N', kW: 2.2, pf: 0.7, spectrum: 'switch-mode' },
        { name: 'till', connection: 'B-N', kW: 0.2, pf: 1 },
      ]),
    );
    const n = r.neutral!;
    expect(n.ratioToPhase!).toBeGreaterThan(1);
    const a = n.aboveLine!;
    expect(a.cause).toBe('phase-loading');
    // The neutral's fundamental reaches line A's; its triplen orders are line A's own (no other line has any).
    expect(a.neutralFundamentalA).toBeGreaterThanOrEqual(a.lineFundamentalA);
    expect(a.neutralTriplenA).toBeCloseTo(a.lineTriplenA, 9);
    const w = r.warnings.find((x) => x.code === 'neutral-above-phase')!;
    expect(w.message).toContain(`the cause is the phase loading: its fundamental alone is ${a.neutralFundamentalA.toFixed(1)} A against ${a.lineFundamentalA.toFixed(1)} A`);
    expect(w.message).toContain(`the triplen orders in it are ${a.neutralTriplenA.toFixed(1)} A`);
    expect(w.message).not.toMatch(/add in it from several lines/);
  });

  it('washers on every line: triplen orders add from the three lines, their amps against the neutral rms', () => {
    const r = studyHarmonics(launderette((['A', 'B', 'C'] as const).map((p) => ({ name: `washers ${p}`, connection: `${p}-N`, kW: 2.2, pf: 0.7, spectrum: 'switch-mode' }))));
    const n = r.neutral!;
    const a = n.aboveLine!;
    expect(a.cause).toBe('triplen');
    // Balanced: the fundamentals cancel, the triplens of the three lines add (about three times one line's).
    expect(a.neutralFundamentalA).toBeLessThan(0.01 * a.lineFundamentalA);
    expect(a.neutralTriplenA / a.lineTriplenA).toBeCloseTo(3, 1);
    const w = r.warnings.find((x) => x.code === 'neutral-above-phase')!;
    expect(w.message).toContain(`triplen harmonics (orders 3, 9, 15…) add in it from several lines instead of cancelling: ${a.neutralTriplenA.toFixed(1)} A of its ${n.current.rms.toFixed(1)} A rms`);
  });
});
