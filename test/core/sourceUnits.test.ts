/**
 * A supply of single-phase units (a bank, an open delta) given in kVA: each unit's loading is the line
 * current through it against its rated current (kVA over its rated voltage), reported and warned above
 * 100 % as a single transformer is. Hand check: an open delta of two 10 kVA units at 240 V has 41.7 A
 * rated per unit; a 30 kW, 0.85 PF motor draws about 85 A at nominal voltage, more as the voltage sags.
 */
import { describe, expect, it } from 'vitest';
import { solveBoard, solveInstallation } from '@trivar/core';

const openDelta = (kVA: number) => ({
  name: 'farm workshop',
  supply: {
    system: 'three-phase-3wire',
    voltage: { lineToLine: 240 },
    frequencyHz: 60,
    openDelta: { 'A-B': { kVA, impedancePercent: 2.5, xOverR: 2 }, 'B-C': { kVA, impedancePercent: 3, xOverR: 2 } },
  },
  loads: [{ name: 'grain auger motor', connection: 'ABC-delta', kW: 30, pf: 0.85 }],
});

describe('supply units given in kVA', () => {
  it('an open delta: each unit carries the current of its line away from the shared corner (B)', () => {
    const r = solveBoard(openDelta(10));
    const units = r.sourceUnits!;
    expect(units.map((u) => u.winding)).toEqual(['A-B', 'B-C']);
    const line = (p: string) => r.phases.find((x) => x.phase === p)!.current.magnitude;
    expect(units[0]!.currentA).toBeCloseTo(line('A'), 9);
    expect(units[1]!.currentA).toBeCloseTo(line('C'), 9);
    for (const u of units) {
      expect(u.ratedCurrentA).toBeCloseTo(10_000 / 240, 9);
      expect(u.loadingPercent).toBeCloseTo((100 * u.currentA) / u.ratedCurrentA, 9);
      expect(u.currentA).toBeGreaterThan(84); // at least the nominal-voltage current of the motor
    }
    const warned = r.warnings.filter((w) => w.code === 'source-unit-overload');
    expect(warned.map((w) => Math.round(w.value!))).toEqual(units.map((u) => Math.round(u.loadingPercent)));
    expect(warned[0]!.message).toMatch(/^the supply's single-phase unit on A-B is loaded to 2\d\d % of its 10\.0 kVA rating/);
  });

  it('units large enough are reported and not warned', () => {
    const r = solveBoard(openDelta(50));
    expect(r.sourceUnits!.every((u) => u.loadingPercent < 100)).toBe(true);
    expect(r.warnings.some((w) => w.code === 'source-unit-overload')).toBe(false);
  });

  it('a bank of unequal units: a unit per phase to the star point, rated at the line-to-neutral voltage', () => {
    const r = solveBoard({
      name: 'bank',
      supply: {
        voltage: '400/230',
        frequencyHz: 50,
        bank: { A: { kVA: 5, impedancePercent: 3, xOverR: 2 }, B: { kVA: 15, impedancePercent: 3, xOverR: 2 }, C: { r: 0.05, x: 0.05 } },
      },
      loads: [
        { name: 'kiln', connection: 'A-N', kW: 9 },
        { name: 'wheel', connection: 'B-N', kW: 1 },
      ],
    });
    // C is given as an impedance, with no rating: not listed.
    expect(r.sourceUnits!.map((u) => u.winding)).toEqual(['A', 'B']);
    const a = r.sourceUnits![0]!;
    expect(a.ratedCurrentA).toBeCloseTo(5000 / (400 / Math.sqrt(3)), 6);
    expect(a.loadingPercent).toBeGreaterThan(100);
    expect(r.warnings.filter((w) => w.code === 'source-unit-overload').map((w) => w.message.slice(0, 52))).toEqual(["the supply's single-phase unit on A-N is loaded to 1"]);
  });

  it('a sub-board of an installation fed from such a supply has no unit readings of its own', () => {
    const spec = openDelta(10);
    const inst = solveInstallation({ name: 'farm', supply: spec.supply, boards: [{ name: 'yard', loads: [] }, { name: 'shed', fedFrom: 'yard', loads: spec.loads }] });
    expect(inst.boards[0]!.result.sourceUnits!.length).toBe(2);
    expect(inst.boards[1]!.result.sourceUnits).toBeNull();
    expect(inst.boards[0]!.result.warnings.some((w) => w.code === 'source-unit-overload')).toBe(true);
  });
});
