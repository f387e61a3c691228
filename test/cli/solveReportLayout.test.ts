/**
 * Wording and layout of the `trivar solve` text report: 100 columns, export in
 * words, one stated voltage-drop definition, the floating-star rule shown, no
 * solver internals. Rendered in-process from `solveBoard` results.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, solveBoard, type BoardSpec } from '@trivar/core';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';
import { ROOT } from './runTrivar.js';
import { isBoardExample } from '../support/boardExamples.js';

const width = (line: string) => [...line].length;
const widest = (text: string) => text.split('\n').reduce((a, l) => (width(l) > width(a) ? l : a), '');

/** An invented stress board: generation on one line, a long circuit name, a floating constant-power star. */
const flats: BoardSpec = {
  name: 'Quayside flats with rooftop generation',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
  feeder: { line: { lengthM: 80, rOhmPerKm: 0.32, xOhmPerKm: 0.08, ratingA: 160 }, neutral: { lengthM: 80, rOhmPerKm: 0.32, xOhmPerKm: 0.08, ratingA: 160 } },
  loads: [
    { name: 'Rooftop inverter on the south-facing roof of the second block', connection: 'A-N', kW: -9, pf: 0.9, sense: 'leading' },
    { name: 'Flats L1', connection: 'A-N', kW: 2, pf: 0.95 },
    { name: 'Flats L2', connection: 'B-N', kW: 5, pf: 0.95 },
    { name: 'Flats L3', connection: 'C-N', kW: 4, pf: 0.9 },
    { name: 'Lift', connection: 'ABC-star', starPoint: 'floating', kW: 7.5, pf: 0.85 },
    { name: 'Hall heaters', connection: 'B-C', ohms: { r: 40, x: 0 } },
  ],
};

describe('trivar solve report layout', () => {
  const examples = readdirSync(`${ROOT}examples`).filter(isBoardExample(`${ROOT}examples`));
  it.each(examples)('examples/%s fits 100 columns, with the broken-neutral study too', (file) => {
    const result = solveBoard(readBoardText(readFileSync(`${ROOT}examples/${file}`, 'utf8')), { openNeutral: true });
    expect(width(widest(renderSolveReport(result)))).toBeLessThanOrEqual(100);
  });

  it('a board with generation, long names and a wholly exporting supply fits 100 columns', () => {
    for (const kW of [-9, -30]) {
      const spec = { ...flats, loads: flats.loads.map((l, k) => (k === 0 ? { ...l, kW } : l)) };
      expect(width(widest(renderSolveReport(solveBoard(spec, { openNeutral: true }))))).toBeLessThanOrEqual(100);
    }
  });

  it('says nothing about the solver (iterations are in the JSON result only)', () => {
    expect(renderSolveReport(solveBoard(flats))).not.toMatch(/iteration|converge|Newton/i);
  });
});

describe('export in words', () => {
  const result = solveBoard(flats);
  const text = renderSolveReport(result);
  /** The report as running text, so a sentence reads the same wherever it wraps. */
  const prose = text.replace(/\s+/g, ' ');
  const a = result.phases[0]!;

  it('an exporting line shows "export", never lag or lead, and says which way its vars go', () => {
    expect(a.kW).toBeLessThan(0);
    const row = text.split('\n').find((l) => /^ {2}A {3}/.test(l))!;
    expect(row).toMatch(/\d\.\d{3} export/);
    expect(row).not.toMatch(/ lag| lead/);
    const vars = a.kvar < 0 ? `supplies ${Math.abs(a.kvar).toFixed(2)} kvar` : `absorbs ${a.kvar.toFixed(2)} kvar`;
    expect(prose).toContain(`Line A exports ${(-a.kW).toFixed(2)} kW and ${vars}.`);
  });

  it('a generating circuit is named with what it generates', () => {
    const pv = result.loads[0]!;
    expect(prose).toContain(`generates ${(-pv.kW).toFixed(2)} kW and supplies ${(-pv.kvar).toFixed(2)} kvar.`);
  });

  it('lines taking power keep lag/lead', () => {
    expect(text.split('\n').find((l) => /^ {2}B {3}/.test(l))).toMatch(/\d\.\d{3} lag/);
  });

  it('a supply that receives power is worded as export', () => {
    const spec = { ...flats, loads: flats.loads.map((l, k) => (k === 0 ? { ...l, kW: -30 } : l)) };
    const r = solveBoard(spec);
    expect(r.source.kW).toBeLessThan(0);
    expect(renderSolveReport(r)).toContain(`to the supply    ${(-r.source.kW).toFixed(3)} kW exported`);
  });
});

describe('the floating-star rule is shown', () => {
  it('names a floating constant-power star solved as its equivalent delta', () => {
    const text = renderSolveReport(solveBoard(flats)).replace(/\s+/g, ' ');
    expect(text).toContain('"Lift": a floating star of constant-power or constant-current elements');
    expect(text).toContain('solved as its equivalent delta');
  });
  it('says nothing for a floating star rated in ohms (its real star point is solved)', () => {
    const spec = { ...flats, loads: [...flats.loads.slice(0, 4), { name: 'Lift', connection: 'ABC-star' as const, starPoint: 'floating' as const, ohms: { r: 20, x: 10 } }] };
    expect(renderSolveReport(solveBoard(spec))).not.toContain('equivalent delta');
  });
});

describe('one voltage-drop definition', () => {
  it('is stated under the phase table', () => {
    expect(renderSolveReport(solveBoard(flats))).toMatch(/drop: open-circuit source voltage minus the voltage line-to-neutral loads see/);
  });

  it("includes the neutral conductor's drop for a line-to-neutral load (closed form)", () => {
    // Ideal 230 V source, resistive load R on A-N, line and neutral conductors r each:
    // I = E/(R + 2r), the load sees E·R/(R + 2r), so the drop is 2r/(R + 2r) of E. (Ohm's law.)
    const [E, R, rc] = [230, 10, 0.25];
    const result = solveBoard({
      supply: { system: 'three-phase-4wire', voltage: { lineToNeutral: E }, frequencyHz: 50 },
      feeder: { line: { r: rc, x: 0 }, neutral: { r: rc, x: 0 } },
      loads: [{ name: 'heater', connection: 'A-N', ohms: { r: R, x: 0 } }],
    });
    const a = result.phases[0]!;
    expect(a.voltageDropPercent).toBeCloseTo((100 * 2 * rc) / (R + 2 * rc), 9);
    // The drop and the voltage shown agree: 100 − drop = %nom, the same figure the load sees.
    expect(a.voltageDropPercent + a.voltagePercent).toBeCloseTo(100, 9);
    expect(result.loads[0]!.branches[0]!.voltagePercent).toBeCloseTo(a.voltagePercent, 9);
  });
});

describe('a board of milliampere loads', () => {
  // A control cabinet's indicator lamps and a clock (invented): real currents of a few milliamperes, printed as 0.0 A.
  const text = renderSolveReport(
    solveBoard({
      name: 'control cabinet',
      supply: { voltage: '400/230', frequencyHz: 50, transformer: { kVA: 1000, impedancePercent: 6, xOverR: 10 } },
      loads: [
        { name: 'indicator', connection: 'A-N', kW: 0.000001, pf: 0.5 },
        { name: 'clock', connection: 'B-N', kW: 0.0000001 },
        { name: 'sensor', connection: 'C-A', kvar: 0.000001, kW: 0 },
      ],
    }),
  );

  it('shows no power factor beside 0.00 kVA and no current ratios beside 0.0 A', () => {
    expect(text).toMatch(/^ {2}vector {2}\|ΣS\| +0\.00 +-$/m);
    expect(text).toMatch(/^ {2}effective {2}3·Ve·Ie \(IEEE 1459\) +0\.00 +-$/m);
    expect(text).toContain('current |I2|/|I1|, |I0|/|I1|               -, - (line currents below 0.05 A)');
    expect(text).not.toMatch(/\b0\.3\d\d\b/);
  });
});
