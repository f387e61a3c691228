/**
 * correct estimates the supply resonance with every step of the bank in. Fewer steps in put less
 * capacitance on and raise the orders, so a switched state can sit near a harmonic order the full bank
 * misses (a balanced 4-wire bank: 7.5 with all three steps in, about 9.1 with two). The warning and the
 * check line said nothing of it; both now say the estimate is for every step in.
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

  it('says in the warning that the estimate is for every step in and that fewer steps move the orders', () => {
    expect(warning.message).toContain(
      'The estimate is for every step in: with fewer steps in the orders rise and can fall near other harmonic orders (the harmonic check, run where the board has a harmonics section, scans every step combination)',
    );
  });

  it('says the same on the check line', () => {
    expect(text).toMatch(/parallel resonance with the supply at about h = 7\.46 .*; with every step in \(with fewer steps in, the orders lie higher\)/);
  });

  it('says the same in the written report\'s resonance facts', () => {
    const section = JSON.stringify(resonanceSection(report));
    expect(section).toContain('30.0 kvar added, every step in (with fewer steps in, the orders lie higher)');
  });
});
