/**
 * Capacitor duty at the capacitance tolerance ends and at the highest voltage
 * the board reaches [METHODS §4: current and kvar × C/C_rated]. With no
 * harmonic source the duty is the fundamental alone, and with every load off
 * it has a closed form: a bank of total Q (at U_r, per unit capacitance k) on a
 * source of reactance X per phase raises the voltage across each delta branch to
 *   V_C = U / (1 − X·B_Y),  B_Y = k·Q / (U_r²·(1 − p·k)) the star-equivalent
 * susceptance per phase (p = 0 plain), and across a detuned step's capacitor to
 * V_C / (1 − p·k). Then V pu = V_C/U_r, I pu = k·V pu, kvar pu = k·V pu².
 */
import { describe, expect, it } from 'vitest';
import { DUTY_LIMITS, studyHarmonics, type BoardSpec } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const X = 0.155;
const U = 400;
const board = (bank: NonNullable<NonNullable<BoardSpec['harmonics']>['bank']>): BoardSpec => ({
  name: 'orchard packhouse',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: U }, frequencyHz: 50, impedance: { r: 0, x: X } },
  loads: [{ name: 'graders', connection: 'ABC-star', kW: 150, pf: 1 }],
  harmonics: { bank, capacitorStandard: 'iec-60831-1' },
});
const tight = { rel: 1e-9, abs: 1e-12 };

function noLoad(qKvar: number, ratedV: number, k: number, p = 0) {
  const bStar = (k * qKvar * 1000) / (ratedV ** 2 * (1 - p * k));
  const vBranch = U / (1 - X * bStar);
  const v = vBranch / (1 - p * k) / ratedV;
  return { voltageRms: v, voltagePeak: v, currentRms: k * v, kvar: k * v * v };
}

describe('capacitor duty over the capacitance tolerance and with every load off', () => {
  it('plain 100 kvar 400 V delta bank: within at nominal with the loads on, exceeded at +10 % with every load off', () => {
    const r = studyHarmonics(board({ connection: 'delta', ratedV: 400, stepsKvar: [50, 50] }));
    const d = r.capacitorDuty!;
    expect(d.capacitanceTolerance).toEqual({ minusPercent: 5, plusPercent: 10 });
    // What the study reported before tolerance ends and load-off were checked: within.
    expect(d.worstNominal.ok).toBe(true);
    expect(d.worstNominal.figures.voltageRms).toBeLessThan(1.1);
    // The worst state and condition: both steps on, +10 % capacitance, every load off.
    expect(d.worst.label).toBe('steps 1+2');
    expect(d.worst.condition).toEqual({ capacitancePercent: 110, loads: 'off' });
    const expected = noLoad(100, 400, 1.1);
    for (const key of ['voltageRms', 'voltagePeak', 'currentRms', 'kvar'] as const) expectClose(d.worst.figures[key], expected[key], tight, key);
    expect(expected.voltageRms).toBeGreaterThan(1.11); // 1.1194 pu > 1.10 (IEC 60831-1, 8 h in 24 h)
    expect(d.ok).toBe(false);
    expectClose(d.highestCapacitorVoltageV, expected.voltageRms * 400, tight, 'highest capacitor voltage');
    const warning = r.warnings.find((w) => w.code === 'capacitor-duty' && w.message.includes('steps 1+2'))!;
    expect(warning.message).toContain('capacitance +10 %, every load off');
    expectClose(warning.value!, expected.voltageRms / DUTY_LIMITS['iec-60831-1'].limits.voltageRms, tight, 'warning ratio');
  });

  it('one step on: the same closed form with half the bank, and the −5 % end is the mildest', () => {
    const r = studyHarmonics(board({ connection: 'delta', ratedV: 400, stepsKvar: [50, 50], capacitanceTolerance: { minusPercent: 5, plusPercent: 10 } }));
    const one = r.capacitorDuty!.cases.find((c) => c.label === 'step 1')!;
    expect(one.condition).toEqual({ capacitancePercent: 110, loads: 'off' });
    expectClose(one.figures.voltageRms, noLoad(50, 400, 1.1).voltageRms, tight, 'step 1 voltage');
  });

  it('a detuned 7 % bank: p becomes 7.7 % at +10 %, and the capacitor sees V/(1 − p·k)', () => {
    const r = studyHarmonics(board({ connection: 'delta', ratedV: 480, stepsKvar: [60, 60], detuningPercent: 7 }));
    const d = r.capacitorDuty!;
    expect(d.worst.condition).toEqual({ capacitancePercent: 110, loads: 'off' });
    const expected = noLoad(120, 480, 1.1, 0.07);
    for (const key of ['voltageRms', 'currentRms', 'kvar'] as const) expectClose(d.worst.figures[key], expected[key], tight, key);
    expect(d.ok).toBe(true); // 480 V units: 0.96 pu at the worst
  });

  it('a tolerance of 0/0 leaves nominal only, and the worst is then the nominal, loads-off case', () => {
    const r = studyHarmonics(board({ connection: 'delta', ratedV: 400, stepsKvar: [50, 50], capacitanceTolerance: { minusPercent: 0, plusPercent: 0 } }));
    const d = r.capacitorDuty!;
    expect(d.worst.condition).toEqual({ capacitancePercent: 100, loads: 'off' });
    expectClose(d.worst.figures.voltageRms, noLoad(100, 400, 1).voltageRms, tight, 'nominal no-load');
  });
});
