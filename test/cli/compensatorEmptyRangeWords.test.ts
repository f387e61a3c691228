/**
 * A balancing compensator's capacitor branch whose first-order range (built around the ideal
 * capacitance) is empty at both tolerance ends. The note read "no capacitance satisfies both tolerance
 * ends — meeting the target at −5 % needs at least … µF" while the Checks, re-solving the board at −5 %,
 * found the target met and the verdict said so. Where the re-solved ends pass, the note now says the range
 * is first order around the sizing's capacitance and that the build passes when re-solved.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';

// A glass-bending works (invented): a 30 kW resistive kiln on one line pair of a 3-wire 400 V supply,
// with 10 kW of polishing motors across all three lines.
const bendingWorks = () =>
  normaliseBoard(
    parseBoard({
      name: 'Marsh glass-bending works',
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 315, impedancePercent: 4, xOverR: 3 } },
      loads: [
        { name: 'Bending kiln', connection: 'A-B', kW: 30, pf: 1, model: 'constant-impedance' },
        { name: 'Polishing motors', connection: 'ABC-delta', kW: 10, pf: 0.8 },
      ],
    }),
  );

describe('a compensator branch with an empty first-order range that passes re-solved', () => {
  const report = correctBoard(bendingWorks(), { arrangement: 'balancing-compensator' });
  const text = renderCorrectionReport(report);
  const bc = report.selection!.selections.find((s) => s.branch === 'B-C')!;

  it('has the empty range the note is about (ideal 343.4 µF: 343.4/0.95 = 361.5 above 343.4/1.1 = 312.2) and passes both ends re-solved', () => {
    expect(bc.requiredCapacitanceUF).toBeCloseTo(343.4, 1);
    expect(bc.minimumCapacitanceUF).toBeCloseTo(361.5, 1);
    expect(bc.maximumCapacitanceUF!).toBeCloseTo(312.2, 1);
    expect(bc.designCapacitanceUF).toBeCloseTo(310.8, 1);
    expect(report.status).toBe('meets-target');
    expect(report.verification.tolerance.low.check.met).toBe(true);
    expect(report.verification.tolerance.high.check.leadingLines).toEqual([]);
  });

  it('does not claim that no capacitance meets the target, and says the built µF passes re-solved', () => {
    expect(text).not.toContain('no capacitance satisfies both tolerance ends');
    expect(text).not.toMatch(/meeting the target at −5 % needs at least/);
    expect(text.replace(/\s+/g, ' ')).toContain(
      "B-C: the first-order range around the sizing's 343.4 µF is empty — keeping that much at −5 % takes at least 361.5 µF nominal, staying within every line's bounds at +10 % allows at most 312.2 µF; re-solved at both tolerance ends, the 310.8 µF built passes (see the Checks)",
    );
    expect(text).toContain('capacitance ×0.95: target met');
  });
});
