/**
 * Capacitor units at the voltage and frequency they are used at, the built-in
 * typical list, and the choice of units for a bank.
 * Source: Q = Q_r·(V/V_r)²·(f/f_r) from Q = 2πf·C·V² (methods notes §4, "Output vs
 * voltage/frequency"); capacitance tolerance −5/+10 % of IEC 60831-1 (from memory).
 */
import { describe, expect, it } from 'vitest';
import { capacitorOutput, selectBankUnits, sizeDeltaBank, sizeStarBank, TYPICAL_CAPACITOR_UNITS } from '@trivar/core';
import { makeBoard } from './support/boards.js';
import { expectClose } from '../support/tolerance.js';

const exact = { rel: 1e-12, abs: 0 };

describe('capacitor output follows the square law (methods notes §4)', () => {
  it('a 480 V unit used at 400 V gives (400/480)² of its rating', () => {
    const out = capacitorOutput({ ratedKvar: 25, ratedV: 480, ratedHz: 50 }, { voltageV: 400, frequencyHz: 50 });
    expectClose(out.kvar, 25 * (400 / 480) ** 2, exact, 'kvar');
    expectClose(out.kvar, 17.3611111111, { rel: 1e-10, abs: 0 }, 'kvar (worked)');
    expectClose(out.currentA, (out.kvar * 1000) / 400, exact, 'current');
    expectClose(out.ratedCurrentA, 25000 / 480, exact, 'rated current');
  });

  it('frequency: a 50 Hz unit at 60 Hz gives 6/5 of its output at the same voltage', () => {
    const out = capacitorOutput({ ratedKvar: 10, ratedV: 440, ratedHz: 50 }, { voltageV: 440, frequencyHz: 60 });
    expectClose(out.kvar, 12, exact, 'kvar');
  });

  it('capacitance from the rating: C = Q_r/(2π·f_r·V_r²)', () => {
    const out = capacitorOutput({ ratedKvar: 10, ratedV: 400, ratedHz: 50 }, { voltageV: 230, frequencyHz: 50 });
    expectClose(out.capacitanceUF, (10000 / (2 * Math.PI * 50 * 400 ** 2)) * 1e6, exact, 'µF');
    expectClose(out.capacitanceUF, 198.94367886, { rel: 1e-9, abs: 0 }, 'µF (worked)');
  });

  it('the typical list holds the rated voltages of the methods notes (plus 280 V for 230 V star banks), each unit marked typical', () => {
    const volts50 = [...new Set(TYPICAL_CAPACITOR_UNITS.filter((u) => u.ratedHz === 50).map((u) => u.ratedV))];
    const volts60 = [...new Set(TYPICAL_CAPACITOR_UNITS.filter((u) => u.ratedHz === 60).map((u) => u.ratedV))];
    expect(volts50).toEqual([280, 400, 415, 440, 480, 525, 690]);
    expect(volts60).toEqual([240, 480, 600]);
    for (const u of TYPICAL_CAPACITOR_UNITS) expect(u.name).toMatch(/^typical /);
  });
});

describe('choosing units for a bank', () => {
  const board = makeBoard('three-phase-4wire', [
    { name: 'line A ovens', connection: 'A-N', kW: 9, pf: 0.75 },
    { name: 'line B mixers', connection: 'B-N', kW: 6, pf: 0.8 },
    { name: 'line C chillers', connection: 'C-N', kW: 7.5, pf: 0.78 },
  ]);
  const catalogue = [
    { name: 'C-480-1', ratedKvar: 1, ratedV: 480, ratedHz: 50 as const },
    { name: 'C-480-2', ratedKvar: 2, ratedV: 480, ratedHz: 50 as const },
    { name: 'C-440-1', ratedKvar: 1, ratedV: 440, ratedHz: 50 as const },
  ];

  it('each branch reaches the requirement with the low tolerance, and rated voltage covers V_LL × 1.10 on a delta bank', () => {
    const sizing = sizeDeltaBank(board, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, { catalogue, pattern: '1:2:4' });
    selection.selections.forEach((s, i) => {
      const b = sizing.branches[i]!;
      expect(s.unit!.ratedV).toBeGreaterThanOrEqual(1.1 * b.appliedV);
      expect(s.designCapacitanceUF * 0.95).toBeGreaterThanOrEqual(b.capacitanceUF! * (1 - 1e-12));
      expect(s.stepUnits.length).toBe(3);
      // The switched steps keep the 1:2:4 ratio.
      expect(s.stepUnits[1]).toBe(2 * s.stepUnits[0]!);
      expect(s.stepUnits[2]).toBe(4 * s.stepUnits[0]!);
      expectClose(s.installedKvar, s.installedUnits * s.unit!.ratedKvar, exact, 'installed kvar');
    });
  });

  it('no bank design has less installed kvar (within the 5 % slack) among all single-type 1:2:4 builds', () => {
    const sizing = sizeDeltaBank(board, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, { catalogue, pattern: '1:2:4' });
    selection.selections.forEach((s, i) => {
      const needUF = sizing.branches[i]!.capacitanceUF! / 0.95;
      let least = Infinity;
      for (const u of catalogue.filter((c) => c.ratedV >= 440)) {
        const cu = (u.ratedKvar * 1000) / (2 * Math.PI * 50 * u.ratedV ** 2) * 1e6;
        const k = Math.ceil(needUF / (7 * cu) - 1e-9);
        least = Math.min(least, 7 * k * u.ratedKvar);
      }
      expect(s.installedKvar).toBeLessThanOrEqual(least * 1.05 + 1e-9);
    });
  });

  it('a star bank needs units rated for V_LN plus margin: 280 V units at 230.9 V, output by the square law', () => {
    const sizing = sizeStarBank(board, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, {});
    expect(selection.catalogue).toBe('typical');
    expect(selection.catalogueNote).toMatch(/not any vendor/);
    for (const s of selection.selections) {
      expect(s.requiredRatedV).toBeCloseTo(1.1 * s.highestVoltageV, 9);
      // 230.9 V × 1.10 = 254 V: the lowest typical 50 Hz rating that covers it is 280 V.
      expect(s.unit!.ratedV).toBe(280);
      expectClose(s.unit!.outputKvar, s.unit!.ratedKvar * (sizing.branches[0]!.appliedV / s.unit!.ratedV) ** 2, { rel: 1e-12, abs: 0 }, 'unit output');
    }
  });

  it('units rated far above the applied voltage are flagged as under-used', () => {
    const sizing = sizeStarBank(board, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, { catalogue: [{ ratedKvar: 2.5, ratedV: 440, ratedHz: 50 }] });
    expect(selection.warnings.map((w) => w.code)).toContain('unit-underused');
  });

  it("a fixed part is only used with a light-load sizing, and stays within what the light load can take at +10 %", () => {
    const sizing = sizeStarBank(board, { target: { pf: 0.95 } });
    expect(selectBankUnits(sizing, { catalogue }).selections.every((s) => s.fixedUnits === 0)).toBe(true);
    const light = makeBoard('three-phase-4wire', [
      { name: 'line A ovens', connection: 'A-N', kW: 4.5, pf: 0.75 },
      { name: 'line B mixers', connection: 'B-N', kW: 3, pf: 0.8 },
      { name: 'line C chillers', connection: 'C-N', kW: 3.75, pf: 0.78 },
    ]);
    const lightSizing = sizeStarBank(light, { target: { pf: 0.95 } });
    const selection = selectBankUnits(sizing, { catalogue: [{ ratedKvar: 0.5, ratedV: 280, ratedHz: 50 }], lightLoad: lightSizing });
    selection.selections.forEach((s, i) => {
      expect(s.fixedUnits).toBeGreaterThan(0);
      expect(s.fixedCapacitanceUF * 1.1).toBeLessThanOrEqual(lightSizing.branches[i]!.limitSusceptanceS! / (2 * Math.PI * 50) * 1e6 * (1 + 1e-12));
    });
  });
});
