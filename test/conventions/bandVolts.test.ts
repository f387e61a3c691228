/**
 * The voltage band in volts is printed by one rule (0.1 V, the board's own nominal) wherever it
 * appears: the text report's limits line and the HTML table of allowed volts show the same figures,
 * and no fixed example of another nominal (120 V: 114–126 V) sits beside them.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bandVolts, buildBoardReport, normaliseBoard, parseBoard, renderReportHtml, solveBoard, solveBoardModel, VOLTAGE_LIMIT_PRESETS } from '@trivar/core';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';

const DINER = {
  name: 'Diner panel',
  supply: { voltage: '208Y/120', frequencyHz: 60, transformer: { kVA: 75, impedancePercent: 3, xOverR: 3 } },
  loads: [
    { name: 'Grill hood', connection: 'A-N', kW: 1.2 },
    { name: 'Oven', connection: 'A-B', kW: 4 },
  ],
};

describe('the band in volts on a 208Y/120 board', () => {
  const result = solveBoard(DINER);
  const text = renderSolveReport(result).replace(/\s+/g, ' ');
  const html = renderReportHtml(buildBoardReport({ spec: parseBoard(DINER), result: solveBoardModel(normaliseBoard(parseBoard(DINER))) }));

  it('the limits line and the table of allowed volts give the same figures', () => {
    const line = /on this board ([\d.]+) V: ([\d.]+)–([\d.]+) V line-to-neutral; ([\d.]+) V: ([\d.]+)–([\d.]+) V line-to-line/.exec(text);
    expect(line).not.toBeNull();
    const [, ln, lnLow, lnHigh, ll, llLow, llHigh] = line!;
    // The nominal the percentages are of: 208/√3 line-to-neutral.
    expect(Number(ln)).toBeCloseTo(result.board.nominalLineToNeutralV, 1);
    expect(Number(ll)).toBe(208);
    expect(html).toContain(`${lnLow} – ${lnHigh}`);
    expect(html).toContain(`${llLow} – ${llHigh}`);
    expect([lnLow, lnHigh]).toEqual([(result.board.nominalLineToNeutralV * 0.95).toFixed(1), (result.board.nominalLineToNeutralV * 1.05).toFixed(1)]);
    // The HTML note says the same as the text.
    expect(html).toContain(`(c84-service-a), on this board ${ln} V: ${lnLow}–${lnHigh} V line-to-neutral`);
  });

  it('no fixed example of another nominal beside them', () => {
    expect(text).not.toMatch(/120 V: 114–126 V/);
    expect(result.voltageCheck.limits.source).not.toMatch(/\d V:/);
  });

  it('bandVolts: each end to 0.1 V of nominal × (1 ∓ limit)', () => {
    fc.assert(
      fc.property(fc.double({ min: 10, max: 1000, noNaN: true }), fc.constantFrom(...(Object.keys(VOLTAGE_LIMIT_PRESETS) as (keyof typeof VOLTAGE_LIMIT_PRESETS)[])), (nominal, preset) => {
        const limits = VOLTAGE_LIMIT_PRESETS[preset];
        const { low, high } = bandVolts(limits, nominal);
        expect(Math.abs(Number(low) - (nominal * (100 - limits.underPercent)) / 100)).toBeLessThanOrEqual(0.05 + 1e-9);
        expect(Math.abs(Number(high) - (nominal * (100 + limits.overPercent)) / 100)).toBeLessThanOrEqual(0.05 + 1e-9);
        expect(low).toMatch(/^\d+\.\d$/);
      }),
    );
    expect(bandVolts(VOLTAGE_LIMIT_PRESETS['c84-service-a'], 120)).toEqual({ low: '114.0', high: '126.0' });
  });
});
