/**
 * IEEE 519 voltage limits at the board's buses (≤ 1 kV: 5 % for one harmonic,
 * 8 % THD — IEEE 519-2014 Table 1, confirmed secondary), named in the file
 * (`harmonics.voltageDistortionLimits: ieee-519`: this 400 V 50 Hz board's own region
 * would judge it against IEC 61000-2-2), on a board whose
 * harmonic voltage has a closed form: one single-phase non-linear load on a
 * supply of impedance R + jX with no feeder, so its 5th-harmonic current I5
 * returns through the phase's source impedance alone and
 *   V5(A-N) = I5·|R + j·5X|,  V5(A-B) = the same (phase B carries no 5th),
 * each as % of that bus voltage's own fundamental.
 */
import { describe, expect, it } from 'vitest';
import { studyHarmonics, type BoardSpec } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const R = 0.02;
const X = 0.2;
const board = (percent5: number): BoardSpec => ({
  name: 'kiosk row',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, impedance: { r: R, x: X } },
  loads: [
    { name: 'charger bank', connection: 'A-N', kW: 10, pf: 1, spectrum: [{ order: 5, percent: percent5 }] },
    { name: 'lights', connection: 'B-N', kW: 2, pf: 1 },
  ],
  harmonics: { voltageDistortionLimits: 'ieee-519' },
});

describe('IEEE 519 voltage limits at each bus voltage of the board', () => {
  const report = studyHarmonics(board(30));
  const bus = (name: string) => report.voltageDistortion.buses.find((b) => b.bus === name)!;
  const lineA = report.lines.find((l) => l.phase === 'A')!;
  const i5 = 0.3 * lineA.current.fundamental;
  const v5 = i5 * Math.hypot(R, 5 * X);
  const tight = { rel: 1e-9, abs: 1e-9 };

  it('the 5th on A-N is I5·|R + j5X| as % of the fundamental: 5.7 %, above 5 %, while THD stays under 8 %', () => {
    const a = bus('A-N');
    const expected = (100 * v5) / lineA.voltage.fundamental;
    expectClose(a.largest!.percent, expected, tight, 'A-N 5th, % of fundamental');
    expect(expected).toBeGreaterThan(5.6);
    expect(expected).toBeLessThan(5.8);
    expect(a.ordersAbove.map((o) => o.order)).toEqual([5]);
    expectClose(a.thdPercent!, expected, tight, 'A-N THD (only the 5th)');
    expect(a.ok).toBe(false);
    expect(report.voltageDistortion.ok).toBe(false);
    expect([report.voltageDistortion.basis, report.voltageDistortion.basisFrom, report.voltageDistortion.individualLimitPercent]).toEqual(['ieee-519', 'board file', 5]);
  });

  it('the same 5th volts on A-B are a smaller share of 400 V: within; phase B has none', () => {
    const ab = bus('A-B');
    const vab = report.lineToLine.find((p) => p.pair === 'A-B')!.voltage.fundamental;
    expectClose(ab.largest!.percent, (100 * v5) / vab, tight, 'A-B 5th');
    expect(ab.ok).toBe(true);
    expect(bus('B-N').largest!.percent).toBeLessThan(1e-9);
    expect(bus('B-N').ok).toBe(true);
  });

  it('warns once for A-N with the figure and the limit, and no THD warning', () => {
    const w = report.warnings.filter((x) => x.code.startsWith('voltage-'));
    expect(w.map((x) => x.code)).toEqual(['voltage-individual']);
    expectClose(w[0]!.value!, bus('A-N').largest!.percent, tight, 'warning value');
    expect(w[0]!.threshold).toBe(5);
    expect(w[0]!.message).toBe('a single harmonic of the board voltage is above 5 % (IEEE 519 limits for ≤ 1 kV; % of the fundamental): A-N h5 5.7 %');
  });

  it('just above the limit, the figure gets the decimals to read above it', () => {
    // I5 chosen so that V5 is 5.04 % of the fundamental: "5.04 %", never "5.0 %, above 5 %".
    const at30 = bus('A-N').largest!.percent;
    const r = studyHarmonics(board((30 * 5.04) / at30));
    const w = r.warnings.find((x) => x.code === 'voltage-individual')!;
    expect(w.message).toMatch(/: A-N h5 5\.04 %$/);
  });

  it('at 28 % the 5th is 5.3 % and still flagged; at 26 % it is 4.9 % and within', () => {
    const flagged = studyHarmonics(board(28)).voltageDistortion.buses[0]!;
    expect([flagged.largest!.percent.toFixed(1), flagged.ok]).toEqual(['5.3', false]);
    const within = studyHarmonics(board(26));
    expect(within.voltageDistortion.buses[0]!.largest!.percent.toFixed(1)).toBe('4.9');
    expect(within.voltageDistortion.ok).toBe(true);
    expect(within.warnings.filter((x) => x.code.startsWith('voltage-'))).toEqual([]);
  });
});
