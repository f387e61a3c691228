/**
 * Detuned banks inside the correction study, on the invented print works
 * whose plain bank resonates near the drives' orders:
 * - the plain bank fails the harmonic check, a detuned one is chosen (7 %:
 *   no significant 3rd harmonic), and every check of the correction study holds for it;
 * - each detuned step delivers Q_r(U/U_r)²/(1 − p) at nominal voltage (METHODS §5,
 *   confirmed worked example) and its units are rated for U(1 + margin)/(1 − p);
 * - the bank as switchable parts has, at the fundamental, exactly the susceptance the
 *   verification solved; every resonance of the chosen bank lies below its tuning order;
 * - a board whose plain bank passes keeps the plain report.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  bankOfReport,
  correctBoard,
  compareWithHarmonics,
  correctWithHarmonics,
  normaliseBoard,
  parseBoard,
  readBoardText,
  tuningOrder,
  type BoardSpec,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const example = (name: string) => parseBoard(readBoardText(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8')));

describe('detuned banks in the correction study', () => {
  const spec = example('quayside-print-works.yaml');
  const board = normaliseBoard(spec);
  const report = correctWithHarmonics(spec, board, spec.correction);
  const chosen = report.harmonics.variants.find((v) => v.name === report.harmonics.chosen)!;

  it('the plain bank resonates near an injected order; the 7 % variant is chosen and meets the target', () => {
    const plain = report.harmonics.variants[0]!;
    expect(plain.name).toBe('plain');
    expect(plain.passes).toBe(false);
    expect(plain.resonantOrders.length).toBeGreaterThan(0);
    expect(report.harmonics.chosen).toBe('detuned 7 %');
    expect(report.status).toBe('meets-target');
    expect(report.verification.check.met).toBe(true);
    expect(report.harmonics.variants.map((v) => v.name)).toEqual(['plain', 'detuned 5.67 %', 'detuned 7 %', 'detuned 14 %']);
  });

  it('every step: detuning factor p, output Q_r(U/U_r)²/(1 − p), units rated for U(1 + margin)/(1 − p)', () => {
    const p = 0.07;
    const u = board.nominalLineToLineV!;
    for (const step of report.selection!.steps) {
      expect(step.detuningFactor).toBe(p);
      expectClose(step.kvarAtNominalV, (step.nameplateKvar * (u / step.unit.ratedV) ** 2) / (1 - p), { rel: 1e-9, abs: 0 }, 'effective output');
      expect(step.unit.ratedV).toBeGreaterThanOrEqual((u * (1 + report.selection!.voltageMarginPercent / 100)) / (1 - p) - 1e-9);
    }
    expectClose(chosen.capacitorVoltageV, u / 0.93, { rel: 1e-12, abs: 0 }, 'U_C = U/(1 − p)');
  });

  it('the switchable bank has the verified susceptance at the fundamental, and resonates only below its tuning order', () => {
    const bank = bankOfReport(board, report)!;
    const added = bank.board.loads.slice(board.loads.length);
    const perBranch = new Map<string, number>();
    for (const load of added)
      for (const b of load.branches) perBranch.set(`${b.from}-${b.to}`, (perBranch.get(`${b.from}-${b.to}`) ?? 0) - b.sNominal.im / b.vNominal ** 2);
    for (const group of report.verification.equipment)
      for (const b of group.branches) expectClose(perBranch.get(`${b.from}-${b.to}`)!, b.susceptanceS, { rel: 1e-9, abs: 0 }, `branch ${b.branch}`);
    const peaks = report.harmonics.check!.scan.combinations.flatMap((c) => c.peaks);
    expect(peaks.length).toBeGreaterThan(0);
    for (const pk of peaks) expect(pk.order).toBeLessThan(tuningOrder(0.07));
    expect(report.harmonics.check!.capacitorDuty!.ok).toBe(true);
    expect(report.verification.resonanceOrder).toBeNull();
    expect(report.cautions.join(' ')).not.toContain('does not check harmonics');
  });

  it('a plain bank that passes is kept as the correction study gave it', () => {
    // Resistive heating with one small lagging motor: a small bank, resonance far above the orders present.
    const mild: BoardSpec = {
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 400, impedancePercent: 4, xOverR: 5 } },
      loads: [
        { name: 'ovens', connection: 'ABC-delta', kW: 120, pf: 1 },
        { name: 'fan', connection: 'ABC-delta', kW: 40, pf: 0.7 },
        { name: 'controls', connection: 'A-N', kW: 2, pf: 0.97, spectrum: [{ order: 3, percent: 30 }, { order: 5, percent: 10 }] },
      ],
      correction: { arrangement: 'delta-bank', target: { pf: 0.98 } },
      harmonics: { detuning: 'none' },
    };
    const parsed = parseBoard(mild);
    const b = normaliseBoard(parsed);
    const withHarmonics = correctWithHarmonics(parsed, b, parsed.correction);
    expect(withHarmonics.harmonics.chosen).toBe('plain');
    expect(withHarmonics.harmonics.variants).toHaveLength(1);
    const { harmonics, cautions, ...rest } = withHarmonics;
    const { cautions: plainCautions, ...plain } = correctBoard(b, parsed.correction);
    expect(JSON.parse(JSON.stringify(rest))).toEqual(JSON.parse(JSON.stringify(plain)));
    expect(cautions).toHaveLength(plainCautions.length);
    expect(plain.status).toBe('meets-target');
  });

  it('a board that already meets the target: no variant is sized or checked, and the report says why', () => {
    // The same bakery with its small fan: P 137 kW, Q 13.2 kvar, PF 0.995 ≥ 0.98 before anything is added.
    const met: BoardSpec = {
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 400, impedancePercent: 4, xOverR: 5 } },
      loads: [
        { name: 'ovens', connection: 'ABC-delta', kW: 120, pf: 1 },
        { name: 'fan', connection: 'ABC-delta', kW: 15, pf: 0.75 },
        { name: 'controls', connection: 'A-N', kW: 2, pf: 0.97, spectrum: [{ order: 3, percent: 30 }, { order: 5, percent: 10 }] },
      ],
      correction: { arrangement: 'delta-bank', target: { pf: 0.98 } },
    };
    const parsed = parseBoard(met);
    const r = correctWithHarmonics(parsed, normaliseBoard(parsed), parsed.correction);
    expect(r.status).toBe('already-meets-target');
    expect(r.harmonics.variants).toEqual([]);
    expect(r.harmonics.check).toBeNull();
    expect(r.harmonics.summary).toBe('no capacitors are added, so there is no bank to check against the harmonics');
  });
});

describe('the arrangement comparison with the harmonic check', () => {
  it('shows each arrangement as its passing variant and recommends one that passes', () => {
    const spec = example('quayside-print-works.yaml');
    const board = normaliseBoard(spec);
    const { arrangement: _ignored, ...study } = spec.correction!;
    const c = compareWithHarmonics(spec, board, study);
    expect(c.harmonics.arrangements.map((a) => a.arrangement)).toEqual(c.outcomes.filter((o) => o.report).map((o) => o.arrangement));
    for (const a of c.harmonics.arrangements) expect(a.variants[0]!.passes).toBe(false);
    const recommended = c.harmonics.arrangements.find((a) => a.arrangement === c.recommended)!;
    expect(recommended.chosen).not.toBeNull();
    expect(recommended.variants.find((v) => v.name === recommended.chosen)!.passes).toBe(true);
    const report = c.outcomes.find((o) => o.arrangement === c.recommended)!.report!;
    expect(report.selection!.steps.every((s) => s.detuningFactor > 0)).toBe(true);
    expect(c.why).toContain('Harmonic check');
  });
});

describe('the harmonic check of a correction judges the duty at the study’s capacitance tolerance', () => {
  const spec = example('quayside-print-works.yaml');
  const board = normaliseBoard(spec);
  it.each([
    [{ minusPercent: 0, plusPercent: 15 }, [100, 115]],
    [{ minusPercent: 10, plusPercent: 5 }, [100, 90, 105]],
  ])('tolerance %o: every state checked at capacitance %o %%', (capacitanceTolerance, ends) => {
    const report = correctWithHarmonics(spec, board, { ...spec.correction, capacitanceTolerance });
    expect(report.selection!.capacitanceTolerance).toEqual(capacitanceTolerance);
    const duty = report.harmonics.check!.capacitorDuty!;
    expect(duty.capacitanceTolerance).toEqual(capacitanceTolerance);
    expect([...new Set(duty.conditions.map((c) => c.capacitancePercent))]).toEqual(ends);
  });
  it('without one in the study, the default −5 % … +10 % (IEC 60831-1, from memory)', () => {
    const duty = correctWithHarmonics(spec, board, spec.correction).harmonics.check!.capacitorDuty!;
    expect(duty.capacitanceTolerance).toEqual({ minusPercent: 5, plusPercent: 10 });
  });
});
