/**
 * The IEEE 519 table at the ends of the short-circuit ratio: a source with no impedance (or one the
 * circuit merges as a direct connection, below NEGLIGIBLE_OHMS) gives no finite ratio, and a ratio
 * that is not a number is refused. A denormal source resistance (5e-324 ohm) made the ratio Infinity
 * and the table look-up crashed.
 */
import { describe, expect, it } from 'vitest';
import { ieee519OrderLimit, ieee519Row, InputError, studyHarmonics } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
// An invented office: one switch-mode server rack on phase A.
const rack = [{ name: 'server rack', connection: 'A-N', kW: 8, pf: 0.97, spectrum: 'switch-mode' }];
const withSource = (source: object) => ({ supply: { ...supply, ...source }, loads: rack, harmonics: { pcc: {} } });

describe('IEEE 519 rows at the ends of the ratio', () => {
  it('puts an infinite ratio in the last row (no upper end) and refuses NaN, 0 and negatives', () => {
    // IEEE 519-2014 Table 2, last row: TDD 20 %, 15 % for 3 ≤ h < 11.
    expect(ieee519Row(Infinity)).toEqual({ label: '> 1000', tddPercent: 20 });
    expect(ieee519OrderLimit(Infinity, 5)).toBe(15);
    expect(ieee519Row(999.9)).toEqual({ label: '100 < 1000', tddPercent: 15 });
    for (const bad of [NaN, 0, -5]) {
      expect(() => ieee519Row(bad)).toThrow(InputError);
      expect(() => ieee519OrderLimit(bad, 5)).toThrow(/shortCircuitRatio: expected a short-circuit ratio I_sc\/I_L above 0/);
    }
  });

  it('judges no ratio from a source the circuit treats as ideal, and says so', () => {
    for (const source of [{ impedance: { r: 5e-324, x: 0 } }, { impedance: { r: 0, x: 0 } }, { impedance: { r: 5e-7, x: 0 } }, { transformer: { kVA: 100, impedancePercent: 1e-310, xOverR: 3 } }]) {
      const report = studyHarmonics(withSource(source));
      expect(report.tdd).toBeNull();
      expect(report.assumptions.some((a) => a.includes('harmonics.pcc.shortCircuitRatio'))).toBe(true);
    }
  });

  it('still judges a real source: 10 mΩ gives a ratio of about 646 (230.9 V / 0.01 Ω / 35.8 A)', () => {
    const report = studyHarmonics(withSource({ impedance: { r: 0.01, x: 0 } }));
    expect(report.tdd?.shortCircuitRatio).toBeCloseTo(645.7, 0);
    expect(report.tdd?.tableRow).toBe('100 < 1000');
    expect(report.assumptions.some((a) => a.includes('harmonics.pcc.shortCircuitRatio'))).toBe(false);
  });
});
