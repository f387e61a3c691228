/**
 * A circuit's current against its breaker: on a North-American board a continuous load (every load
 * unless marked `continuous: false`) is warned about above 80 % of the rating — NEC 210.20(A), the
 * breaker at least 125 % of the continuous load (confirmed secondary: a manufacturer's data bulletin
 * quoting the section) —, a noncontinuous one above 100 %; elsewhere every load is judged against the
 * rated current I_n (IEC 60364-4-43, 433.1, from memory). Stiff supplies, so a constant-power load
 * draws exactly P/V.
 */
import { describe, expect, it } from 'vitest';
import { assumedPfNote, solveBoard, type BoardResult } from '@trivar/core';

/** One resistive circuit of `kW` on a breaker of `breakerA`, line-to-neutral, on a stiff supply. */
function board(region: 'north-america' | 'iec', kW: number, breakerA: number, continuous?: boolean): BoardResult {
  const northAmerica = region === 'north-america';
  return solveBoard({
    supply: northAmerica
      ? { system: 'split-phase', voltage: '120/240', frequencyHz: 60 }
      : { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
    loads: [{ name: 'heater', connection: 'A-N', kW, pf: 1, breakerA, ...(continuous === undefined ? {} : { continuous }) }],
  });
}

const breakerCodes = (r: BoardResult) => r.warnings.filter((w) => w.code.includes('breaker')).map((w) => w.code);

describe('breaker warnings by region', () => {
  it('North America: 2 kW at 120 V (16.7 A) on a 20 A breaker is above 80 %, a continuous load', () => {
    const r = board('north-america', 2, 20);
    expect(r.conventions.region).toBe('north-america');
    expect(r.loads[0]!.currentA).toBeCloseTo(2000 / 120, 9);
    expect(r.loads[0]!.continuous).toBe(true);
    const w = r.warnings.find((x) => x.code === 'continuous-load-over-breaker-share')!;
    expect(w.threshold).toBe(16);
    expect(w.value).toBeCloseTo(16.667, 3);
    expect(w.message).toContain('draws 16.7 A, above 16.0 A, 80 % of its 20 A breaker');
    expect(w.message).toContain('NEC 210.20(A)');
    expect(w.message).toContain('continuous: false');
  });

  it('North America: the same load marked continuous: false is judged at 100 %, and not warned about', () => {
    const r = board('north-america', 2, 20, false);
    expect(r.loads[0]!.continuous).toBe(false);
    expect(breakerCodes(r)).toEqual([]);
  });

  it('North America: 1.9 kW (15.8 A, 79 %) is within 80 %; 2.6 kW (21.7 A) is over the breaker itself', () => {
    expect(breakerCodes(board('north-america', 1.9, 20))).toEqual([]);
    const over = board('north-america', 2.6, 20);
    expect(breakerCodes(over)).toEqual(['circuit-over-breaker']);
    expect(over.warnings.find((w) => w.code === 'circuit-over-breaker')!.message).toContain('NEC 210.20(A)');
    expect(breakerCodes(board('north-america', 2.6, 20, false))).toEqual(['circuit-over-breaker']);
  });

  it('IEC: 3.5 kW at 230.9 V (15.2 A, 95 %) on a 16 A breaker is within I_n; 4 kW (17.3 A) is over it', () => {
    const within = board('iec', 3.5, 16);
    expect(within.conventions.region).toBe('iec');
    expect(within.loads[0]!.currentA / 16).toBeGreaterThan(0.9);
    expect(breakerCodes(within)).toEqual([]);
    const over = board('iec', 4, 16);
    const w = over.warnings.find((x) => x.code === 'circuit-over-breaker')!;
    expect(w.threshold).toBe(16);
    expect(w.message).toContain('draws 17.3 A, above its 16 A breaker (IEC 60364-4-43');
  });

  it('the warning appears exactly when the current passes the share of the rating the rule allows', () => {
    for (const kW of [1.5, 1.9, 1.93, 1.95, 2.0, 2.3, 2.4, 2.41, 2.6])
      for (const continuous of [true, false]) {
        const r = board('north-america', kW, 20, continuous);
        const amps = r.loads[0]!.currentA;
        const share = continuous ? 0.8 : 1;
        expect(breakerCodes(r).length > 0, `${kW} kW, continuous ${continuous}: ${amps} A`).toBe(amps > 20 * share);
      }
  });
  it('a circuit a hair over its breaker shows the digits that put it over, and does not claim the breaker trips', () => {
    // 3.7 kW at unity PF on 230.9 V draws 16.02 A (the supply is ideal, so the load sees its nominal voltage).
    const r = solveBoard({
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
      loads: [{ name: 'Sockets', connection: 'A-N', kW: 3.7, pf: 1, breakerA: 16 }],
    });
    const w = r.warnings.find((x) => x.code === 'circuit-over-breaker')!;
    expect(w.value).toBeGreaterThan(16);
    expect(w.value).toBeLessThan(16.05);
    expect(w.message).toMatch(/draws 16\.02 A, above its 16 A breaker/);
    expect(w.message).not.toMatch(/would trip/);
  });
});

describe('a circuit that generates (negative kW) is judged as a source, not a load', () => {
  it('North America: a 2 kW inverter feeding back 16.7 A on a 20 A breaker passes 80 %, by the output-circuit rule, even marked continuous: false', () => {
    const r = board('north-america', -2, 20, false);
    expect(r.loads[0]!.currentA).toBeCloseTo(2000 / 120, 9);
    expect(breakerCodes(r)).toEqual(['output-circuit-over-breaker-share']);
    const w = r.warnings[0]!;
    expect(w.threshold).toBe(16);
    expect(w.message).toBe(
      "circuit \"heater\" feeds back 16.7 A, above 16.0 A, 80 % of its 20 A breaker (a generating circuit: NEC 705.28/705.30 (690.8 for PV), from memory: breaker and conductors at 125 % of the source's continuous output current, so at most 80 % of the rating): give it a larger breaker and conductors",
    );
    expect(w.message).not.toMatch(/draws|210\.20|continuous load/);
  });

  it('North America: 3 kW fed back (25.0 A) is over a 20 A breaker; 1.9 kW (15.8 A) is within 80 %', () => {
    const over = board('north-america', -3, 20);
    expect(breakerCodes(over)).toEqual(['circuit-over-breaker']);
    expect(over.warnings[0]!.message).toMatch(/^circuit "heater" feeds back 25\.0 A, above its 20 A breaker \(a generating circuit: NEC 705\.28/);
    expect(over.warnings[0]!.message).toContain('too small for what the source sends back');
    expect(breakerCodes(board('north-america', -1.9, 20))).toEqual([]);
  });

  it('IEC: 4 kW fed back at 230.9 V (17.3 A) is over a 16 A breaker, worded as output; 3.5 kW is within I_n', () => {
    const over = board('iec', -4, 16);
    expect(over.warnings.find((x) => x.code === 'circuit-over-breaker')!.message).toContain("feeds back 17.3 A, above its 16 A breaker (IEC 60364-4-43: a source's output current at most the rated current I_n)");
    expect(breakerCodes(board('iec', -3.5, 16))).toEqual([]);
  });

  it('the pf footnote of a board with both calls only the consumers resistive loads', () => {
    expect(assumedPfNote([9.6, 5])).toBe('*: pf not given in the file, taken as 1 (a resistive load).');
    expect(assumedPfNote([-40])).toBe('*: pf not given in the file, taken as 1 (exporting at unity power factor).');
    expect(assumedPfNote([9.6, 5, -40])).toBe('*: pf not given in the file, taken as 1 (a resistive load; where it exports, a source at unity power factor).');
  });
});
