/**
 * A board made to lead by a capacitor bank written as one of its loads. Invented: the Osier Street dye
 * works, 30 kW of winders at PF 0.82 lagging (20.9 kvar) and a 50 kvar fixed bank left on, behind a
 * 315 kVA, 4.5 % transformer (S_sc = 315/0.045 = 7000 kVA). Solving warns of the leading lines; the
 * correction estimates the supply resonance from the bank already there (h ≈ √(7000/50) ≈ 11.8 with no
 * reactors) instead of "not estimated", and its summary lists only reactors that exist.
 */
import { describe, expect, it } from 'vitest';
import { compareCorrections, correctBoard, normaliseBoard, parseBoard, solveBoardModel, WARNING_THRESHOLDS, type BoardSpec, type CompensatorSizing } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';
import { expectClose } from '../support/tolerance.js';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 315, impedancePercent: 4.5, xOverR: 5 } } as const;
const dyeWorks: BoardSpec = {
  name: 'Osier Street dye works',
  supply,
  loads: [
    { name: 'Winders', connection: 'ABC-delta', kW: 30, pf: 0.82 },
    { name: 'Fixed bank left on', connection: 'ABC-delta', kW: 0, kvar: -50, model: 'constant-impedance' },
    { name: 'Dye office', connection: 'A-N', kW: 4, pf: 0.95 },
  ],
};
const board = normaliseBoard(parseBoard(dyeWorks));

describe('a board led by its own fixed capacitor bank', () => {
  it('solve warns of every line leading below 0.90, naming the bank and its kvar', () => {
    const result = solveBoardModel(board);
    // By hand on B and C (no office load): P 10 kW, Q 20.9/3 − 50/3 = −9.7 kvar, PF 10/√(10² + 9.7²) = 0.718 leading.
    for (const p of result.phases.slice(1)) {
      expect(p.sense).toBe('leading');
      expect(Math.abs(p.pf! - 0.718)).toBeLessThan(0.01);
    }
    const w = result.warnings.find((x) => x.code === 'line-leading')!;
    expect(w).toBeDefined();
    expect(w.threshold).toBe(WARNING_THRESHOLDS.leadingLinePf);
    expect(w.value).toBeCloseTo(Math.min(...result.phases.map((p) => p.pf!)), 12);
    expect(w.message).toContain('lines A at PF 0.855, B at PF 0.715, C at PF 0.715 lead');
    expect(w.message).toContain('"Fixed bank left on", 50.3 kvar');
  });

  it('a line a line-to-line heater makes lead, with nothing capacitive on the board, is not warned', () => {
    const heater = normaliseBoard(parseBoard({ supply, loads: [{ name: 'Drying oven', connection: 'B-C', kW: 12, pf: 1 }, { name: 'Lamps', connection: 'A-N', kW: 2, pf: 0.9 }] }));
    const result = solveBoardModel(heater);
    expect(result.phases.some((p) => p.sense === 'leading' && p.pf! < 0.9)).toBe(true);
    expect(result.warnings.map((x) => x.code)).not.toContain('line-leading');
  });

  it('only the line the capacitors make lead is warned: not one a line-to-line heater makes lead beside them', () => {
    // A resistive B-C oven makes line B lead near 0.866; 6 kvar on A-N against a 4 kW, PF 0.9 lagging load
    // (1.9 kvar) makes line A lead: P 4, Q ≈ 1.9 − 6 = −4.1 kvar, PF ≈ 0.70 leading; C lags.
    const mixed = normaliseBoard(
      parseBoard({
        supply,
        loads: [
          { name: 'Drying oven', connection: 'B-C', kW: 12, pf: 1 },
          { name: 'Dye pumps', connection: 'A-N', kW: 4, pf: 0.9 },
          { name: 'Pump capacitor', connection: 'A-N', kW: 0, kvar: -6, model: 'constant-impedance' },
          { name: 'Lamps', connection: 'C-N', kW: 2, pf: 0.9 },
        ],
      }),
    );
    const result = solveBoardModel(mixed);
    const [a, b] = result.phases;
    expect(b!.sense).toBe('leading');
    expect(b!.pf!).toBeLessThan(0.9);
    expect(a!.sense).toBe('leading');
    expect(Math.abs(a!.pf! - 0.70)).toBeLessThan(0.02);
    const w = result.warnings.filter((x) => x.code === 'line-leading');
    expect(w).toHaveLength(1);
    expect(w[0]!.message).toMatch(/^line A at PF 0\.\d{3} leads \(below 0\.90 leading/);
    expect(w[0]!.value).toBeCloseTo(a!.pf!, 12);
  });

  it('the correction works the supply resonance from the bank already on the board and the reactors it adds', () => {
    const report = correctBoard(board, { arrangement: 'balancing-compensator' });
    const c = report.verification.resonanceCapacitance;
    expect(c.addedKvar).toBe(0);
    expect(c.loadsOnBoard).toEqual(['Fixed bank left on']);
    const bank = report.verification.after.loads.find((l) => l.name === 'Fixed bank left on')!;
    expect(c.onBoardKvar).toBeCloseTo(-bank.kvar, 12);
    expect(Math.abs(c.onBoardKvar - 50)).toBeLessThan(0.5);
    expect(c.reactorKvar).toBeGreaterThan(20);
    expect(report.verification.voltageRise.shortCircuitKVA!).toBeCloseTo(7000, 6);
    // The resonance is worked from the path's reactance: X/R 5 gives S_sc,X = 7000 × √(1 + 1/25) = 7138.6 kVA.
    const sscX = c.reactanceShortCircuitKVA!;
    expect(sscX).toBeCloseTo(7000 * Math.sqrt(1.04), 6);
    // h = √((S_sc,X + Q_L)/Q_C) from X and the capacitances, at nominal voltage: 11.97 (it was 11.98 with the kvar
    // at the solved voltage over S_sc,X at nominal; 11.87 from |Z|; 11.9 without the reactors). The reactors are
    // unequal (B-C and C-A), so the network's lowest order sits a hair below the single-node figure.
    expectClose(c.singleNodeOrder!, Math.sqrt((sscX + c.reactorKvar) / c.totalKvar), { rel: 0.005, abs: 0 }, 'single-node h');
    expect(report.verification.resonanceOrder!).toBeLessThanOrEqual(c.singleNodeOrder!);
    expectClose(report.verification.resonanceOrder!, c.singleNodeOrder!, { rel: 0.001, abs: 0 }, 'lowest h');
    expect(report.verification.resonanceOrder!).toBeCloseTo(11.97, 2);
    expect(report.verification.resonanceNearOrders).toEqual([11, 13]);
    const text = renderCorrectionReport(report);
    expect(text).toContain('√((S_sc,X + Q_L)/Q_C) = 11.97');
    // One line of prose, wrapped at 100 columns: read with its line breaks as spaces.
    expect(text.replace(/\s+/g, ' ')).toContain('of leading loads already on the board (Fixed bank left on)');
    expect(text.replace(/\s+/g, ' ')).toContain("X_path = 0.0224 Ω per line, the supply path's reactance (S_sc,X = 7139 kVA");
    // The resonance is estimated (the rise is not: the reactors lower the lines they sit on, see the compensator tests).
    expect(text).not.toContain('parallel resonance with the supply: not estimated');
    // Within 10 % of the 11th: warned, naming the capacitance that resonates (none of it added here).
    const w = report.verification.warnings.find((x) => x.code === 'resonance')!;
    expect(w.message).toMatch(/^the board's own leading loads \(capacitance already in service\) and the supply inductance resonate near harmonic order 12\.0 \(within 10 % of the 11th and the 13th\)/);
  });

  it('the summary names no reactor the build does not have', () => {
    const report = correctBoard(board, { arrangement: 'balancing-compensator' });
    const ideal = (report.sizing as CompensatorSizing).ideal;
    expect(ideal.branches.find((b) => b.branch === 'A-B')!.element).toBe('none');
    expect(report.summary).not.toMatch(/0\.00 kvar reactor/);
    expect(report.summary).not.toContain('reactor on A-B');
    expect(report.summary).toContain('a 4.63 kvar reactor on B-C');
  });

  it('the recommendation says to deal with the board\'s own capacitors first, quoting the leading lines', () => {
    const c = compareCorrections(board, {});
    const warning = solveBoardModel(board).warnings.find((x) => x.code === 'line-leading')!;
    expect(c.why).toContain('note: lines A at PF 0.855, B at PF 0.715, C at PF 0.715 lead');
    expect(c.why).toContain('switching or reducing those capacitors (an automatic bank that follows the load) is the usual remedy');
    expect(c.why).toContain(warning.message.split(';')[0]!.slice(0, 60));
    // A board without capacitive loads gets no such note.
    const plain = normaliseBoard(parseBoard({ ...dyeWorks, loads: dyeWorks.loads.filter((l) => l.name !== 'Fixed bank left on') }));
    expect(compareCorrections(plain, {}).why).not.toContain('usual remedy');
  });
});

