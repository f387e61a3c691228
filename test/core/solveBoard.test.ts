import { describe, expect, it } from 'vitest';
import { solveBoard } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;

describe('solveBoard on an ideal source', () => {
  it('a single 2.3 kW heater on phase A returns all its current in the neutral', () => {
    const r = solveBoard({ supply, loads: [{ name: 'heater', connection: 'A-N', kW: 2.3, pf: 1 }] });
    const ia = 2300 / (400 / Math.sqrt(3));
    expect(r.phases[0]!.current.magnitude).toBeCloseTo(ia, 9);
    expect(r.neutral!.current.magnitude).toBeCloseTo(ia, 9);
    expect(r.phases[1]!.current.magnitude).toBeLessThan(1e-12);
    // The neutral is phase A's return, no more than the heaviest phase: no warning (NEC 310.15(E)(1)).
    expect(r.warnings.map((w) => w.code)).not.toContain('neutral-above-phase');
  });
  it('a heater on A beside a leading load of 0.9 × its current on B: the neutral carries 1.65 × the heaviest phase, and says so', () => {
    // Ideal source: I_A = I at 0°, I_B = 0.9·I at −120° + 60° (PF 0.5 leading) = −60°, so
    // |I_A + I_B| = I·|1 + 0.9·e^(−j60°)| = I·√(1.45² + (0.9·sin 60°)²) (phasor sum, METHODS §1).
    const r = solveBoard({
      supply,
      loads: [
        { name: 'heater', connection: 'A-N', kW: 2.3, pf: 1 },
        { name: 'capacitive', connection: 'B-N', kW: 0.9 * 1.15, pf: 0.5, sense: 'leading' },
      ],
    });
    const i = 2300 / (400 / Math.sqrt(3));
    const neutral = i * Math.hypot(1.45, 0.9 * Math.sin(Math.PI / 3));
    expect(r.neutral!.current.magnitude).toBeCloseTo(neutral, 9);
    const w = r.warnings.find((x) => x.code === 'neutral-above-phase');
    expect(w?.threshold).toBeCloseTo(i, 9);
    expect(w?.message).toBe(`neutral carries ${neutral.toFixed(1)} A, more than the heaviest phase (A, ${i.toFixed(1)} A): no phase breaker limits it, so the neutral must be rated for this current`);
    expect(r.cautions.some((c) => c.startsWith('A neutral carrying more current than a phase conductor'))).toBe(true);
  });
});

describe('a reduced neutral without a rating', () => {
  // Invented: a shop board behind a feeder whose neutral has 4 × the line conductors' resistance
  // (a quarter of their area), 10 kW on A and 6 kW on B, nothing on C.
  const feeder = (neutralR: number, neutralRating?: number) => ({ line: { r: 0.02, x: 0.01 }, neutral: { r: neutralR, x: 0.01, ...(neutralRating ? { ratingA: neutralRating } : {}) } });
  const shop = (neutralR: number, neutralRating?: number) =>
    solveBoard({ supply, feeder: feeder(neutralR, neutralRating), loads: [{ name: 'ovens', connection: 'A-N', kW: 10 }, { name: 'lights', connection: 'B-N', kW: 6 }] });

  it('heating more per metre than the heaviest phase (I²R) is warned of, below that phase current', () => {
    const r = shop(0.08);
    const ia = r.phases[0]!.current.magnitude;
    const ib = r.phases[1]!.current.magnitude;
    const n = r.neutral!.current.magnitude;
    // The neutral carries less than line A (phasors 120° apart: |I_A + I_B| < I_A when I_B < I_A) …
    expect(n).toBeLessThan(ia);
    expect(n).toBeCloseTo(Math.sqrt(ia * ia + ib * ib - ia * ib), 0);
    // … but at 4 × the resistance it heats more: I_N²·4R > I_A²·R once I_N > I_A/2.
    const w = r.warnings.find((x) => x.code === 'neutral-reduced-heating');
    expect(w?.threshold).toBeCloseTo(ia / 2, 9);
    expect(w?.message).toContain(`carries ${n.toFixed(1)} A: it heats more per metre than the heaviest phase (A, ${ia.toFixed(1)} A)`);
    expect(r.warnings.map((x) => x.code)).not.toContain('neutral-above-phase');
  });

  it('a full-size neutral, or one with its rating given, is judged by the other rules only', () => {
    expect(shop(0.02).warnings.map((x) => x.code)).not.toContain('neutral-reduced-heating');
    expect(shop(0.08, 63).warnings.map((x) => x.code)).not.toContain('neutral-reduced-heating');
  });
});
