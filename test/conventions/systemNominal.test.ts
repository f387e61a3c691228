/**
 * Limits are judged at the system's nominal voltages as the standards name them, not at the
 * model's exact √3 ratio: EN 50160 judges a 230/400 V system's phases at 230 V ± 10 % (207–253 V),
 * ANSI C84.1 Range A a 208Y/120 system's at 114–126 V. Standard pairs: IEC 60038 Table 1 as
 * summarised in the "IEC 60038" encyclopaedia entry (230/400, 400/690; at 60 Hz 120/208, 277/480,
 * 347/600; formerly 220/380, 240/415). Range A and the EN 50160 band: METHODS.md §12.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, solveBoard, judgedNominalOf, type BoardResult } from '@trivar/core';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';

type Voltage = Record<string, unknown> | string;
const boardAt = (voltage: Voltage, emfV: number | null, extra: Record<string, unknown> = {}) => ({
  name: 'Test board',
  supply: {
    system: 'three-phase-4wire',
    frequencyHz: voltage === '208Y/120' ? 60 : 50,
    voltage,
    ...(emfV === null ? {} : { emf: { A: { V: emfV, angleDeg: 0 }, B: { V: emfV, angleDeg: -120 }, C: { V: emfV, angleDeg: 120 } } }),
  },
  loads: [{ name: 'Lamp', connection: 'A-N', kW: 0.1 }],
  ...extra,
});
const verdict = (r: BoardResult) => r.voltageCheck.verdict;

describe('system nominal voltages', () => {
  it('take the written pair, or the standard pair of the figure given, and keep the exact ratio elsewhere', () => {
    const of = (voltage: Voltage) => judgedNominalOf(normaliseBoard(parseBoard(boardAt(voltage, null))));
    expect(of({ lineToLine: 400 })).toEqual({ ln: 230, ll: 400 });
    expect(of({ lineToNeutral: 230 })).toEqual({ ln: 230, ll: 400 });
    expect(of('208Y/120')).toEqual({ ln: 120, ll: 208 });
    expect(of('400/230')).toEqual({ ln: 230, ll: 400 });
    expect(of({ lineToLine: 480 })).toEqual({ ln: 277, ll: 480 });
    expect(of({ lineToLine: 415 })).toEqual({ ln: 240, ll: 415 });
    // Not a standard figure: the model's exact √3 ratio stays.
    const odd = of({ lineToLine: 410 });
    expect(odd.ll).toBe(410);
    expect(odd.ln).toBeCloseTo(410 / Math.sqrt(3), 12);
  });

  it('leave the model alone: a 400 V source is 230.9 V to neutral and the loads draw as before', () => {
    const board = normaliseBoard(parseBoard(boardAt({ lineToLine: 400 }, null)));
    expect(board.nominalLineToNeutralV).toBeCloseTo(400 / Math.sqrt(3), 12);
    expect(Math.hypot(board.emf[0]!.re, board.emf[0]!.im)).toBeCloseTo(400 / Math.sqrt(3), 12);
    const r = solveBoard(boardAt({ lineToLine: 400 }, null));
    // Stiff source, 100 W on 230.9 V: 100.4 % of the 230 V nominal, reported as the source figures.
    expect(r.phases[0]!.voltagePercent).toBeCloseTo((100 * 400) / Math.sqrt(3) / 230, 9);
    expect(r.board).toMatchObject({ nominalLineToNeutralV: 230, nominalLineToLineV: 400 });
    expect(r.board.sourceNominal?.lineToNeutralV).toBeCloseTo(230.94, 2);
  });

  it('judge 114.05 V on a 208Y/120 board within ANSI C84.1 Range A (114–126 V) line-to-neutral, and 113.9 V under', () => {
    const range = (v: number) => solveBoard(boardAt('208Y/120', v, { conventions: { voltageLimits: 'c84-service-a' } }));
    // On 208/√3 = 120.09 V, 114.05 V would have been 94.97 %, under; on 120 V it is 95.04 %.
    expect(range(114.05).phases[0]!.voltagePercent).toBeCloseTo((100 * 114.05) / 120, 2);
    expect(range(114.05).warnings.some((w) => w.message.startsWith('phase'))).toBe(false);
    // Its line-to-line voltage, 114.05 × √3 = 197.54 V, is 94.97 % of 208 V: under 197.6 V, judged as it is
    // (it used to read as its rounding, 95.0 %), and printed so.
    expect(verdict(range(114.05))).toBe('under');
    expect(range(114.05).voltageCheck.lowest.at).toBe('line-to-line A-B');
    expect(range(114.05).warnings[0]!.message).toBe('line-to-line A-B at the board is 197.5 V, 94.97 % of nominal, outside ±5 % (c84-service-a)');
    // 114.1 V is within both ways: 95.08 % and 197.63 V.
    expect(verdict(range(114.1))).toBe('within');
    expect(verdict(range(113.9))).toBe('under');
  });

  it('judge 253.5 V on a 400 V board over EN 50160 (253 V) and 252.9 V within', () => {
    const en = (v: number) => solveBoard(boardAt({ lineToLine: 400 }, v, { conventions: { voltageLimits: 'en50160-supply' } }));
    // On 230.9 V the band would have reached 254.0 V and let 253.5 V pass.
    expect(verdict(en(253.5))).toBe('over');
    expect(verdict(en(252.9))).toBe('within');
  });

  it('print the nominal pair and the source it comes from', () => {
    const text = renderSolveReport(solveBoard(boardAt({ lineToLine: 400 }, null)));
    expect(text).toContain('400 V line-to-line, 230 V line-to-neutral');
    expect(text).not.toContain('230.9 V line-to-neutral ·');
  });
});
