/**
 * The harmonic study on boards with known answers:
 * - triplen neutral: balanced identical single-phase non-linear loads → the
 *   neutral carries exactly 3 × each phase's 3rd (and 9th) and none of the 5th;
 * - the typical switch-mode spectrum's neutral/phase ratio beside its figure
 *   (1.68, METHODS §6 from memory; IEEE 1100 "up to 1.73" for pulse currents);
 * - detuning identities [METHODS §5]: p = 7 % → n_r = 3.78, U_C = U/0.93,
 *   Q_eff = Q_r(U/U_r)²/(1 − p), and the table rows for 5.67 % and 14 %;
 * - the scan's peak against h_r = √(S_sc/Q_c): the formula is exact for a
 *   lossless supply inductance with the bank alone (the peak sits within
 *   (R/X)² of it); loads beside the bank move it by a few per cent;
 * - a detuned bank cannot resonate with the supply above its tuning order.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  capacitorVoltage,
  detunedOutputKvar,
  detunedSusceptance,
  readBoardText,
  studyHarmonics,
  TYPICAL_SPECTRA,
  tuningOrder,
  type BoardSpec,
  type LoadSpec,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 4 } } as const;
const feeder = { line: { r: 0.01, x: 0.005 }, neutral: { r: 0.015, x: 0.005, ratingA: 60 } };
const phaseLoads = (template: Omit<LoadSpec, 'connection' | 'name'>): LoadSpec[] =>
  (['A-N', 'B-N', 'C-N'] as const).map((connection) => ({ ...template, name: `load ${connection}`, connection }) as LoadSpec);

describe('triplen currents in the neutral', () => {
  it('identical loads on the three phases: neutral = 3 × the per-phase 3rd and 9th exactly, no 5th', () => {
    const spec: BoardSpec = {
      supply,
      feeder,
      loads: phaseLoads({ kW: 8, pf: 0.96, spectrum: [{ order: 3, percent: 45 }, { order: 5, percent: 25 }, { order: 9, percent: 12, angleDeg: 40 }] }),
    };
    const r = studyHarmonics(spec);
    const n = r.neutral!;
    const at = (d: typeof n.current, h: number) => d.orders.find((o) => o.order === h)!.magnitude;
    for (const line of r.lines) {
      expectClose(at(n.current, 3), 3 * at(line.current, 3), { rel: 1e-12, abs: 0 }, `neutral 3rd vs 3 × line ${line.phase}`);
      expectClose(at(n.current, 9), 3 * at(line.current, 9), { rel: 1e-12, abs: 0 }, `neutral 9th vs 3 × line ${line.phase}`);
    }
    expect(at(n.current, 5)).toBeLessThan(1e-9 * at(r.lines[0]!.current, 5));
    expectClose(n.current.rms, 3 * Math.hypot(at(r.lines[0]!.current, 3), at(r.lines[0]!.current, 9)), { rel: 1e-9, abs: 1e-9 * r.lines[0]!.current.rms }, 'neutral rms');
    // 8 kW at 0.96 on 230 V is 36 A a phase: a 45 % third makes 3 × 16 A in the neutral.
    expect(n.current.rms).toBeGreaterThan(45);
    expect(n.overloaded).toBe(false);
    expect(n.triplenSharePercent).toBeGreaterThan(99.9);
    // The neutral's fundamentals cancel to round-off: no THD or share of it is shown (it was 10^17 %).
    expect(n.current.fundamental).toBeLessThan(1e-9 * n.current.rms);
    expect(n.current.thdPercent).toBeNull();
    for (const o of n.current.orders) expect(o.percentOfFundamental).toBeNull();
    for (const line of r.lines) expect(line.current.orders.find((o) => o.order === 3)!.percentOfFundamental).toBeCloseTo(45, 9);
  });

  it('the typical switch-mode spectrum gives a neutral of 1.68 × the phase current (balanced, ideal source)', () => {
    const spec: BoardSpec = { supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads: phaseLoads({ kW: 5, pf: 0.98, spectrum: 'switch-mode' }) };
    const r = studyHarmonics(spec);
    // Exact from the spectrum: I_N/I_ph = 3·√(I3² + I9² + I15²) / √(1 + Σ I_h²).
    const orders = TYPICAL_SPECTRA['switch-mode'].orders;
    const sq = (hs: number[]) => orders.filter(([h]) => hs.includes(h)).reduce((s, [, p]) => s + (p / 100) ** 2, 0);
    const expected = (3 * Math.sqrt(sq([3, 9, 15]))) / Math.sqrt(1 + sq(orders.map(([h]) => h)));
    expectClose(r.neutral!.ratioToPhase!, expected, { rel: 1e-9, abs: 0 }, 'neutral/phase');
    // Beside the published figures: 1.68 (METHODS §6, from memory) and below √3 (IEEE 1100, from memory).
    expect(Math.abs(r.neutral!.ratioToPhase! - 1.68)).toBeLessThan(0.005);
    expect(r.neutral!.ratioToPhase!).toBeLessThan(Math.sqrt(3));
    expect(r.warnings.map((w) => w.code)).toContain('neutral-above-phase');
  });
});

describe('detuned steps (METHODS §5)', () => {
  it('p = 7 %: tuning order 3.78, capacitor voltage U/0.93, effective output Q_r(U/U_r)²/(1 − p)', () => {
    expectClose(tuningOrder(0.07), 3.78, { rel: 0, abs: 0.005 }, 'n_r');
    expectClose(capacitorVoltage(400, 0.07), 400 / 0.93, { rel: 1e-15, abs: 0 }, 'U_C');
    expectClose(capacitorVoltage(400, 0.07), 430.1, { rel: 0, abs: 0.05 }, 'U_C at 400 V (table)');
    expectClose(capacitorVoltage(480, 0.07), 516.1, { rel: 0, abs: 0.05 }, 'U_C at 480 V (table)');
    expectClose(50 * tuningOrder(0.07), 189.0, { rel: 0, abs: 0.05 }, 'f_r at 50 Hz');
    expectClose(60 * tuningOrder(0.07), 226.8, { rel: 0, abs: 0.05 }, 'f_r at 60 Hz');
    expectClose(detunedOutputKvar(50, 440, 400, 0.07), (50 * (400 / 440) ** 2) / 0.93, { rel: 1e-15, abs: 0 }, 'Q_eff');
  });

  it('the other table rows: 5.67 % → 4.20 and 424.0 V; 14 % → 2.67 and 465.1 V', () => {
    expectClose(tuningOrder(0.0567), 4.2, { rel: 0, abs: 0.005 }, 'n_r 5.67 %');
    expectClose(capacitorVoltage(400, 0.0567), 424.0, { rel: 0, abs: 0.05 }, 'U_C 5.67 %');
    expectClose(tuningOrder(0.14), 2.67, { rel: 0, abs: 0.005 }, 'n_r 14 %');
    expectClose(capacitorVoltage(400, 0.14), 465.1, { rel: 0, abs: 0.05 }, 'U_C 14 %');
  });

  it('the branch is the effective capacitor at h = 1 and inductive above its tuning order', () => {
    expectClose(detunedSusceptance(0.01, 0.07, 1), 0.01, { rel: 1e-15, abs: 0 }, 'B at h = 1');
    expect(detunedSusceptance(0.01, 0.07, 3.7)).toBeGreaterThan(0);
    expect(detunedSusceptance(0.01, 0.07, 3.9)).toBeLessThan(0);
    expect(detunedSusceptance(0.01, 0.07, 5)).toBeLessThan(0);
  });
});

describe('resonance scan', () => {
  const bareBoard = (xOverR: number): BoardSpec => ({
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 500, impedancePercent: 5, xOverR } },
    loads: [{ name: 'pilot lamp', connection: 'A-N', kW: 0.0001, pf: 1 }],
    harmonics: { bank: { connection: 'delta', ratedV: 400, stepsKvar: [100, 100] }, scan: { maxOrder: 15, step: 0.05 } },
  });

  it('bank alone on a nearly lossless supply: the line-to-line peak is √(X_C/X) to (R/X)²', () => {
    const r = studyHarmonics(bareBoard(100));
    for (const c of r.scan.combinations.filter((x) => x.capacitorKvar > 0)) {
      const peak = c.peaks.find((p) => p.pair === 'A-B')!;
      // S_sc = 500/0.05 = 10 MVA from |Z|; from X alone S_sc,X = S_sc·√(1 + (R/X)²) = 10.0005 MVA;
      // 100 kvar → h_r = 10.00025; 200 kvar → 7.0713.
      expectClose(c.formulaOrder!, Math.sqrt((10_000 * Math.sqrt(1 + 1e-4)) / c.capacitorKvar), { rel: 1e-9, abs: 0 }, 'formula');
      expectClose(peak.order, c.formulaOrder!, { rel: 1e-3, abs: 0 }, `scanned peak, ${c.label}`);
    }
  });

  it('on a loaded board the loads shift the peak by a few per cent of the formula', () => {
    const spec = readBoardText(readFileSync(new URL('../../examples/mill-street-offices.yaml', import.meta.url), 'utf8'));
    const r = studyHarmonics(spec);
    for (const c of r.scan.combinations.filter((x) => x.capacitorKvar > 0)) {
      for (const p of c.peaks) expect(Math.abs(p.order - c.formulaOrder!) / c.formulaOrder!).toBeLessThan(0.05);
    }
    // Every bank state with capacitors has a peak for every pair; the bank off has none.
    expect(r.scan.combinations[0]!.peaks).toEqual([]);
    expect(r.warnings.some((w) => w.code === 'resonance' && w.threshold === 7)).toBe(true);
  });

  it('a detuned bank keeps every parallel resonance below its tuning order', () => {
    const spec = bareBoard(8);
    spec.harmonics!.bank!.detuningPercent = 7;
    spec.harmonics!.bank!.ratedV = 440;
    const r = studyHarmonics({ ...spec, loads: [{ name: 'drives', connection: 'ABC-delta', kW: 150, pf: 0.95, spectrum: 'six-pulse-drive' }] });
    const peaks = r.scan.combinations.flatMap((c) => c.peaks);
    expect(peaks.length).toBeGreaterThan(0);
    for (const p of peaks) expect(p.order).toBeLessThan(tuningOrder(0.07));
    expect(r.scan.combinations.every((c) => c.formulaOrder === null)).toBe(true);
    expect(r.capacitorDuty!.capacitorVoltageV).toBeCloseTo(400 / 0.93, 9);
  });
});

describe('capacitors above their continuous voltage while within the 8-hour limit', () => {
  // A bottling hall (invented): 400 V units on a 400 V board behind a stiff transformer; the bank's own
  // rise puts them just above their rating at the design point.
  const spec = {
    name: 'bottling hall',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 400, impedancePercent: 6, xOverR: 5 } },
    loads: [
      { name: 'conveyor drives', connection: 'ABC-delta', kW: 150, pf: 0.8 },
      { name: 'chillers', connection: 'ABC-delta', kW: 100, pf: 0.82 },
    ],
    harmonics: { background: [{ order: 5, percent: 1 }], bank: { connection: 'delta', ratedV: 400, stepsKvar: [67, 67, 67, 67] } },
  } as unknown as BoardSpec;
  const r = studyHarmonics(spec);
  const duty = r.capacitorDuty!;

  it('IEC 60831-1: the running state above 1.00 U_N is warned of, with the rating that would do', () => {
    const running = duty.continuousVoltage!;
    expect(running.limitPu).toBe(1);
    expect(running.highestPu).toBeGreaterThan(1);
    expect(running.highestPu).toBeLessThan(duty.limits.voltageRms);
    // The running state is the worst nominal-capacitance state with the loads as given.
    expect(running.highestPu).toBeGreaterThanOrEqual(duty.worstNominal.figures.voltageRms);
    expect(running.reached).toBe(true);
    const w = r.warnings.find((x) => x.code === 'capacitor-continuous-voltage')!;
    // The warning's figure is the highest of the running state, the other states in service and the fundamental.
    expect(w.value).toBe(Math.max(running.highestPu, running.anyStatePu, running.fundamentalPu));
    expect(w.value!).toBeGreaterThanOrEqual(running.highestPu);
    expect(w.message).toContain(`${running.highestPu.toFixed(3)} × their rated voltage`);
    expect(w.message).toContain(`Units rated at least ${Math.ceil((w.value! * 400) / 5) * 5} V stand it`);
  });

  it('IEEE 18 (110 % continuous): no such warning, the duty check is the continuous one', () => {
    const ieee = studyHarmonics({ ...spec, harmonics: { ...(spec as { harmonics: object }).harmonics, capacitorStandard: 'ieee-18' } } as unknown as BoardSpec);
    expect(ieee.capacitorDuty!.continuousVoltage).toBeNull();
    expect(ieee.warnings.map((x) => x.code)).not.toContain('capacitor-continuous-voltage');
  });
});
