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

describe('a reduced neutral, worded for its system', () => {
  // Invented: a workshop behind a 6 mm² line with a 4 mm² neutral (1.5 × its resistance), 7.2 kW on one line.
  const workshop = (supply: Record<string, unknown>, neutralMm2: number, loads: Record<string, unknown>[]) =>
    solveBoard({ supply, feeder: { lengthM: 25, line: { mm2: 6 }, neutral: { mm2: neutralMm2 } }, loads });
  const singlePhase230 = { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 };

  it('single-phase 230 V: the neutral carries the line current itself; the warning names the same-size rule, not an unlimited current', () => {
    const r = workshop(singlePhase230, 4, [{ name: 'charger', connection: 'A-N', kW: 7.2 }]);
    const line = r.phases[0]!.current.magnitude;
    expect(r.neutral!.current.magnitude).toBeCloseTo(line, 9);
    const w = r.warnings.find((x) => x.code === 'neutral-reduced-single-phase')!;
    // 6 mm² against 4 mm² of copper: 1.5 × the resistance (IEC 60228 class 2: 3.08 and 4.61 Ω/km at 20 °C, 1.497).
    expect(w.value).toBeCloseTo(1.5, 1);
    expect(w.message).toBe(
      `the neutral of this single-phase feeder is reduced (${w.value.toFixed(2)} × the line conductor's resistance): on two wires it carries the whole line current, ${line.toFixed(1)} A now, up to what the line's breaker, chosen for the line conductor, lets through; IEC 60364-5-52 asks for a neutral of the line conductor's cross-section on single-phase two-wire circuits, whatever the size (524.2.1, from memory): give it the line's size`,
    );
    expect(w.message).not.toContain('nothing limits it');
    expect(r.warnings.map((x) => x.code)).not.toContain('neutral-reduced-heating');
  });

  it('single-phase: a full-size neutral is not warned of; a reduced one is, however light its load', () => {
    expect(workshop(singlePhase230, 6, [{ name: 'charger', connection: 'A-N', kW: 7.2 }]).warnings.map((x) => x.code)).not.toContain('neutral-reduced-single-phase');
    expect(workshop(singlePhase230, 4, [{ name: 'clock', connection: 'A-N', kW: 0.01 }]).warnings.map((x) => x.code)).toContain('neutral-reduced-single-phase');
  });

  it('single-phase 120 V (North America): the two-wire rule in NEC terms', () => {
    const r = workshop({ system: 'single-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 }, 4, [{ name: 'heater', connection: 'A-N', kW: 1.5 }]);
    expect(r.warnings.find((x) => x.code === 'neutral-reduced-single-phase')!.message).toContain(
      "the neutral of a two-wire circuit needs the line conductor's ampacity; the NEC lets a neutral be smaller only where it carries the unbalance of a multiwire feeder or service (220.61, from memory)",
    );
  });

  it('split-phase 120/240: a reduced neutral hotter than the heaviest line is warned of with the rule for reducing it', () => {
    // 3 kW on L1 and 0.5 kW on L2: the neutral carries about 20.8 A against L1's 25 A, and at 1.5 × the resistance heats more.
    const r = workshop({ voltage: '120/240', frequencyHz: 60 }, 4, [
      { name: 'heater', connection: 'A-N', kW: 3 },
      { name: 'lights', connection: 'B-N', kW: 0.5 },
    ]);
    const w = r.warnings.find((x) => x.code === 'neutral-reduced-heating')!;
    // The two lines' currents are near opposite: the neutral carries about their difference (not exactly, the voltages differ).
    expect(w.value).toBeCloseTo(r.phases[0]!.current.magnitude - r.phases[1]!.current.magnitude, 3);
    expect(w.message).toContain("a 120/240 feeder's neutral may be smaller than its lines only where sized for the largest unbalanced load (NEC 220.61) at its ampacity (NEC 310.16; both from memory)");
    expect(r.warnings.map((x) => x.code)).not.toContain('neutral-reduced-single-phase');
  });
});
