/**
 * The whole study through `correctBoard`, and `verifyCorrection` on its own:
 * statuses, the light-load check, the voltage rise and resonance estimates,
 * and the promise that the reported figures are what a re-solve gives.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, solveBoardModel, verifyCorrection, type EquipmentGroup } from '@trivar/core';
import { bakeryLoads, makeBoard } from './support/boards.js';
import { expectClose } from '../support/tolerance.js';
import { expectPlainData } from './support/plainData.js';

const transformer = { kVA: 160, impedancePercent: 4, xOverR: 3 };
const bakery = makeBoard('three-phase-4wire', bakeryLoads, { transformer });

describe('correctBoard on an uneven 4-wire board behind a 160 kVA transformer', () => {
  for (const arrangement of ['star-bank', 'delta-bank', 'balancing-compensator'] as const) {
    it(`${arrangement}: meets a per-line 0.95 target with units chosen, verified by re-solving`, () => {
      const report = correctBoard(bakery, { arrangement, target: { pf: 0.95, definition: 'per-line' }, lightLoad: { fraction: 0.3 } });
      // The capacitor-only compensator's branches have a narrow window (no limit known beyond its own
      // requirement), so its units may meet the target at nominal capacitance only; the banks meet it across the tolerance.
      if (arrangement === 'balancing-compensator') {
        expect(['meets-target', 'meets-target-at-nominal-capacitance']).toContain(report.status);
        expect(report.verification.check.met).toBe(true);
        expect(report.verification.tolerance.high.check.leadingLines).toEqual([]);
        return;
      }
      expect(report.status).toBe('meets-target');
      expect(report.verification.check.met).toBe(true);
      for (const line of report.verification.lines) {
        expect(line.pf.after).toBeGreaterThanOrEqual(0.95 - 1e-9);
        expect(line.sense.after).not.toBe('leading');
      }
      // At the low end of the capacitance tolerance the target still holds; at the high end no line leads.
      expect(report.verification.tolerance.low.check.met).toBe(true);
      expect(report.verification.tolerance.high.check.leadingLines).toEqual([]);
      // The fixed part at light load, +10 % capacitance, makes no line lead.
      expect(report.verification.lightLoad!.ok).toBe(true);
      // Correction releases apparent power and cuts losses.
      expect(report.verification.releasedKVA.vector).toBeGreaterThan(0);
      expect(report.verification.lossReductionKW).toBeGreaterThan(0);
      expectPlainData(report);
      // Re-solving the corrected board reproduces the reported figures exactly.
      expect(solveBoardModel(report.verification.board)).toEqual(report.verification.after);
      expect(report.cautions.join(' ')).toMatch(/75 V.*3 minutes.*50 V.*1 minute/);
      expect(report.cautions.join(' ')).toMatch(/licensed professional/);
    });
  }

  it('the compensator report carries the ideal solution, re-solved, with its reactors', () => {
    const withKiln = makeBoard('three-phase-4wire', [...bakeryLoads, { name: 'kiln element', connection: 'A-B', kW: 15, pf: 1 }], { transformer });
    const report = correctBoard(withKiln, { arrangement: 'balancing-compensator', target: { pf: 1 } });
    expect(report.idealVerification).not.toBeNull();
    const ideal = report.idealVerification!;
    expect(ideal.unbalance!.negativeSequenceCurrentPercent.after).toBeLessThan(1e-6);
    expect(ideal.neutralCurrentA!.after).toBeLessThan(1e-6);
    expect(ideal.branches.some((b) => b.element === 'reactor')).toBe(true);
    expect(ideal.branches.filter((b) => b.element === 'reactor').every((b) => b.inductanceMH! > 0)).toBe(true);
  });

  it("a compensator's reactors withhold the Q_C/S_sc,X rise estimate; the solved rise still decides the flag", () => {
    const withKiln = makeBoard('three-phase-4wire', [...bakeryLoads, { name: 'kiln element', connection: 'A-B', kW: 15, pf: 1 }], { transformer });
    const compensator = correctBoard(withKiln, { arrangement: 'balancing-compensator', target: { pf: 1 } }).verification.voltageRise;
    // Capacitors raise the lines they sit on and reactors lower theirs: the net kvar estimates neither.
    expect(compensator.estimateWithheld).toBe('reactors');
    expect(compensator.estimatePercent).toBeNull();
    expect(compensator.flagged).toBe(compensator.solvedPercent > compensator.flagLevelPercent);
    // A capacitor-only bank keeps its first-order estimate.
    const bank = correctBoard(withKiln, { arrangement: 'star-bank', target: { pf: 0.95 } }).verification.voltageRise;
    expect(bank.estimateWithheld).toBeNull();
    expect(bank.estimatePercent).toBeGreaterThan(0);
  });

  it('a board that already meets the target: nothing to add, said as a warning', () => {
    const board = makeBoard('three-phase-4wire', [{ name: 'heaters', connection: 'ABC-star', kW: 20, pf: 0.99 }]);
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.95 } });
    expect(report.status).toBe('already-meets-target');
    expect(report.selection).toBeNull();
    expect(report.warnings.map((w) => w.code)).toContain('nothing-to-do');
    expect(report.verification.equipment).toEqual([]);
  });

  it('"never leading" is judged on what the equipment changes: a line its own loads make lead passes if it leads no more', () => {
    const board = makeBoard('three-phase-4wire', [
      { name: 'LED drivers', connection: 'A-N', kW: 3, pf: 0.9, sense: 'leading' },
      { name: 'compressor', connection: 'B-N', kW: 5, pf: 0.75 },
    ]);
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.95 } });
    expect(report.status).toBe('meets-target');
    expect(report.verification.check.leadingBefore).toEqual(['A']);
    expect(report.verification.check.leadingLines).toEqual([]);
    // Line B is corrected, line A is left alone.
    const [a, b] = report.verification.lines;
    expect(b!.pf.after).toBeGreaterThanOrEqual(0.95 - 1e-9);
    expectClose(a!.pf.after!, a!.pf.before!, { rel: 1e-9, abs: 0 }, 'line A');
  });

  it('a bank left fully connected that is too big for the light load is flagged', () => {
    const report = correctBoard(bakery, { arrangement: 'star-bank', target: { pf: 0.98 } });
    const allFixed = report.selection!.equipment.map((g) => ({ ...g, branches: g.branches.map((b) => ({ ...b, fixedSusceptanceS: b.susceptanceS })) }));
    const v = verifyCorrection(bakery, { equipment: allFixed, target: { pf: 0.98 }, lightLoad: { fraction: 0.1 } });
    expect(v.lightLoad!.ok).toBe(false);
    expect(v.warnings.map((w) => w.code)).toContain('light-load-leading');
  });

  it('a board-wide IEEE 1459 effective target: an equal three-phase bank cannot reach it before a line leads, a proportional one can', () => {
    const equal = correctBoard(bakery, { arrangement: 'delta-bank', target: { pf: 0.95, definition: 'effective' } });
    expect(equal.status).toBe('infeasible');
    expect(equal.reasons.join(' ')).toMatch(/effective power factor is 0\.9\d\d, below the target 0\.950/);
    const kvar = equal.sizing.arrangement === 'delta-bank' ? equal.sizing.branches.map((b) => b.kvarAtNominalV) : [];
    expectClose(kvar[1]!, kvar[0]!, { rel: 1e-12, abs: 0 }, 'equal share');
    // The best reachable stays on the never-leading side, also with the chosen units.
    expect(equal.verification.check.leadingLines).toEqual([]);
    const proportional = correctBoard(bakery, { arrangement: 'delta-bank', share: 'proportional', target: { pf: 0.95, definition: 'effective' } });
    expect(proportional.status).toBe('meets-target');
    expect(proportional.verification.powerFactor.effective!.after).toBeGreaterThanOrEqual(0.95);
  });
});

describe('correctBoard on single-phase and split-phase boards', () => {
  it('split-phase 120/240 V, 60 Hz: one capacitor per half, line-to-neutral', () => {
    const board = makeBoard(
      'split-phase',
      [
        { name: 'well pump', connection: 'A-N', kW: 1.2, pf: 0.7 },
        { name: 'shop compressor', connection: 'B-N', kW: 1.5, pf: 0.75 },
      ],
      { lineToNeutral: 120, frequencyHz: 60 },
    );
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.95 } });
    expect(report.verification.branches.map((b) => b.branch)).toEqual(['A-N', 'B-N']);
    expect(report.verification.check.leadingLines).toEqual([]);
    // The lowest typical North-American rating is 208 V: at 120 V a unit would give a third of its
    // rating, below the 65 % delivery floor, so no unit suits a 120 V capacitor.
    expect(report.status).toBe('no-suitable-units');
    expect(report.reasons.join(' ')).toMatch(/typical North-American catalogue \(60 Hz\) fits A-N, B-N/);
    expectPlainData(report);
  });

  it('split-phase 120/240 V, 60 Hz: a line-to-line capacitor (the "delta" bank of a split-phase board) from 240 V units', () => {
    const board = makeBoard(
      'split-phase',
      [
        { name: 'well pump', connection: 'A-B', kW: 1.8, pf: 0.72 },
        { name: 'shop compressor', connection: 'A-B', kW: 1.5, pf: 0.75 },
      ],
      { lineToNeutral: 120, frequencyHz: 60 },
    );
    const report = correctBoard(board, { arrangement: 'delta-bank', target: { pf: 0.95 } });
    expect(report.verification.branches.map((b) => b.branch)).toEqual(['A-B']);
    expect(report.status).toBe('meets-target');
    for (const step of report.selection!.steps) {
      expect(step.unit.ratedV).toBe(240);
      expect(step.kind).toBe('single-phase');
    }
  });

  it('single-phase 230 V: a board-wide vector target', () => {
    const board = makeBoard('single-phase', [{ name: 'cold counter', connection: 'A-N', kW: 2, pf: 0.72 }]);
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.9, definition: 'vector' } });
    const sizing = report.sizing;
    if (sizing.arrangement === 'balancing-compensator') return expect.fail('a star bank was asked for');
    expect(sizing.status).toBe('meets-target');
    const tan = (pf: number) => Math.sqrt(1 - pf * pf) / pf;
    expectClose(sizing.branches[0]!.kvarAtNominalV, 2 * (tan(0.72) - tan(0.9)), { rel: 1e-9, abs: 0 }, 'PFC identity');
  });
});

describe('verifyCorrection: voltage rise and resonance of a bank on a transformer', () => {
  // 300 kvar on a 1000 kVA, 6 % transformer: ΔV/V ≈ Qc/S_sc ≈ 1.8 % (IEEE Std 1036, from memory);
  // h_r = √(S_sc/Q_C) (methods notes §5).
  const board = makeBoard('three-phase-3wire', [{ name: 'lighting', connection: 'ABC-delta', kW: 1, pf: 1 }], {
    transformer: { kVA: 1000, impedancePercent: 6, xOverR: 8 },
  });
  const b = 100e3 / 400 ** 2;
  const bank: EquipmentGroup[] = [
    {
      name: 'test bank',
      connection: 'ABC-delta',
      branches: (
        [
          ['A', 'B'],
          ['B', 'C'],
          ['C', 'A'],
        ] as const
      ).map(([from, to]) => ({ branch: `${from}-${to}`, from, to, vNominal: 400, susceptanceS: b, fixedSusceptanceS: b })),
    },
  ];
  const v = verifyCorrection(board, { equipment: bank });

  it('short-circuit power S_T/u_k and the rise estimate Qc/S_sc,X (the reactance raises the voltage, not |Z|)', () => {
    expectClose(v.voltageRise.shortCircuitKVA!, 1000 / 0.06, { rel: 1e-12, abs: 0 }, 'S_sc');
    // X/R 8: S_sc,X = 16.667 MVA × √(1 + 1/64) = 16.796 MVA; ΔV/V ≈ Qc·X/V² = Qc/S_sc,X.
    expectClose(v.voltageRise.reactanceShortCircuitKVA!, (1000 / 0.06) * Math.sqrt(1 + 1 / 64), { rel: 1e-12, abs: 0 }, 'S_sc,X');
    expectClose(v.voltageRise.estimatePercent!, (100 * v.voltageRise.capacitorKvar) / ((1000 / 0.06) * Math.sqrt(1 + 1 / 64)), { rel: 1e-12, abs: 0 }, 'estimate');
    // The bank gives a little over 300 kvar because it raises its own voltage.
    expect(v.voltageRise.capacitorKvar).toBeGreaterThan(300);
    expect(v.voltageRise.estimatePercent!).toBeGreaterThan(1.8);
    expect(v.voltageRise.estimatePercent!).toBeLessThan(1.9);
    // The solved rise agrees with the estimate within a tenth (the estimate ignores R and the loads).
    expectClose(v.voltageRise.solvedPercent, v.voltageRise.estimatePercent!, { rel: 0.1, abs: 0 }, 'solved rise');
    expect(v.voltageRise.flagged).toBe(false);
  });

  it('resonance order √(X_C/X) ≈ 7.48: from the reactance, S_sc,X = S_sc·√(1 + (R/X)²)', () => {
    // X/R 8: S_sc,X = 16.667 MVA × √(1 + 1/64) = 16.796 MVA; 300 kvar at nominal voltage (X_C and X alone, not the
    // kvar at the raised solved voltage, which gave 7.35): √(16 796/300) = 7.482 (√(S_sc/Q_C) from |Z| gives 7.454).
    expectClose(v.resonanceOrder!, Math.sqrt(((1000 / 0.06) * Math.sqrt(1 + 1 / 64)) / 300), { rel: 1e-12, abs: 0 }, 'h_r');
    expectClose(v.resonanceCapacitance.supplyReactanceOhm!, (0.06 * 400 ** 2) / 1e6 * (8 / Math.sqrt(65)), { rel: 1e-12, abs: 0 }, 'X_path');
    expect(v.resonanceNearOrders).toEqual([7]);
    expect(v.resonanceOrder!).toBeCloseTo(7.4825, 4);
    expect(v.warnings.map((w) => w.code)).toContain('resonance');
  });

  it('a stated rise limit below the rise flags it', () => {
    const flagged = verifyCorrection(board, { equipment: bank, voltageRiseLimitPercent: 1 });
    expect(flagged.voltageRise.flagged).toBe(true);
    expect(flagged.warnings.map((w) => w.code)).toContain('voltage-rise');
  });
});
