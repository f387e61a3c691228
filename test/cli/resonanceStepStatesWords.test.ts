/**
 * correct estimates the supply resonance with every step of the bank in. Fewer steps in put less
 * capacitance on and raise the orders, so a switched state can sit near a harmonic order the full bank
 * misses (a balanced 4-wire bank: 7.5 with all three steps in, about 9.1 with two). Each state the
 * controller can reach is now judged, and the warning, the check line and the report name those near.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';
import { resonanceSection } from '../../packages/core/src/render/report/correctionSection.js';

// A malting floor (invented): kiln fans across the three lines and star-connected heaters, on a 4-wire
// supply whose neutral runs 80 m with a high reactance.
const maltingFloor = () =>
  normaliseBoard(
    parseBoard({
      name: 'Tarn malting floor',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 400, impedancePercent: 4, xOverR: 4 } },
      feeder: {
        line: { lengthM: 80, rOhmPerKm: 0.1, xOhmPerKm: 0.08, ratingA: 300 },
        neutral: { lengthM: 80, rOhmPerKm: 0.1, xOhmPerKm: 0.3, ratingA: 300 },
      },
      loads: [
        { name: 'Kiln fans', connection: 'ABC-delta', kW: 60, pf: 0.75 },
        { name: 'Germination heaters', connection: 'ABC-star', kW: 30, pf: 1 },
      ],
    }),
  );

describe('the resonance estimate of a switched star bank', () => {
  const report = correctBoard(maltingFloor(), { arrangement: 'star-bank' });
  const text = renderCorrectionReport(report).replace(/\s+/g, ' ');
  const warning = report.warnings.find((w) => w.code === 'resonance')!;

  it('estimates the full bank near the 7th (common-mode √(X_C/(X+3X_N)) = 7.46)', () => {
    expect(report.verification.resonanceOrder!).toBeCloseTo(7.46, 2);
    expect(report.selection!.steps.filter((s) => s.output !== null).length).toBeGreaterThan(1);
  });

  it('judges each state of the three equal steps: 9.14 with two in (the 9th), 12.92 with one (the 13th), the orders scaling as 1/√Q', () => {
    const states = report.verification.resonanceStepStates!.states;
    const full = report.verification.resonanceOrders;
    // Both modes, common (lines against the neutral) and differential, scale as √(Q_full/Q_state) for a balanced bank.
    expect(states.map((st) => st.outputsIn.length)).toEqual([3, 2, 1]);
    states.forEach((st, k) => {
      const scale = Math.sqrt(3 / (3 - k));
      st.orders.forEach((h, j) => expect(h).toBeCloseTo(full[j]! * scale, 9));
    });
    expect(states[1]!.lowestOrder!).toBeCloseTo(9.14, 2);
    expect(states[2]!.lowestOrder!).toBeCloseTo(12.92, 2);
    expect(states.map((st) => st.nearOrders)).toEqual([[7, 15, 17], [9, 19], [13]]);
  });

  it('names those states in a warning of their own, and the every-step-in warning points to it', () => {
    expect(warning.message).toContain('That is with every step in; states with fewer steps in lie near harmonic orders too (next warning)');
    const states = report.warnings.find((w) => w.code === 'resonance-step-state')!;
    expect(states.message).toContain('with outputs 1 and 2 in (or 1+3, 2+3: the same capacitance), 20.4 kvar, near 9.1 and 18.9 (the 9th and the 19th)');
    expect(states.message).toContain('with output 1 in (or 2, 3: the same capacitance), 10.2 kvar, near 12.9 (the 13th)');
  });

  it('says so on the check line, with the table of states under it', () => {
    expect(text).toMatch(/parallel resonance with the supply at about h = 7\.46 .*; with every step in \(each step state below\)/);
    expect(text).toContain('resonance in each step state the controller can reach (3 of 3 within 10 % of a harmonic order):');
    expect(text).toMatch(/1\+2 or 1\+3 or 2\+3 20\.4 9\.14 9th; 19th at h 18\.91/);
  });

  it('says the same in the written report\'s resonance facts and its table of states', () => {
    const section = JSON.stringify(resonanceSection(report));
    expect(section).toContain('30.0 kvar added, every step in (each step state below)');
    expect(section).toContain('Supply resonance in each step state the controller can reach');
    expect(section).toContain('With fewer steps in, 2 states put an order within 10 % of a harmonic order');
  });
});
