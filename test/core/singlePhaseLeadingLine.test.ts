/**
 * A single-phase board made to lead by its own capacitor is warned as a three-phase or split-phase board
 * is: the voltage rise and the resonance with the supply are no different. Invented: a boathouse
 * workshop, a 4 kW water heater and a 3 kvar capacitor written as a load, both on A-N.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, solveBoardModel } from '@trivar/core';

const workshop = (system: 'single-phase' | 'three-phase-4wire') =>
  solveBoardModel(
    normaliseBoard(
      parseBoard({
        name: 'Boathouse workshop',
        supply: { system, voltage: system === 'single-phase' ? { lineToNeutral: 230 } : { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 25, impedancePercent: 3, xOverR: 1.5 } },
        feeder: { lengthM: 30, line: { mm2: 10 }, neutral: { mm2: 10 } },
        loads: [
          { name: 'Water heater', connection: 'A-N', kW: 4 },
          { name: 'Fixed capacitor', connection: 'A-N', kW: 0, kvar: -3 },
        ],
      }),
    ),
  );

describe('a leading line on a single-phase board', () => {
  it('line A leads at 4/5 = PF 0.800 (4 kW beside 3 kvar of capacitor) and the warning names the capacitor', () => {
    const r = workshop('single-phase');
    expect(r.phases[0]!.sense).toBe('leading');
    expect(r.phases[0]!.pf!).toBeCloseTo(0.8, 2);
    const w = r.warnings.find((x) => x.code === 'line-leading');
    expect(w?.message).toMatch(/^line A at PF 0\.80\d leads \(below 0\.90 leading, common practice\): the board's leading loads \("Fixed capacitor", 3\.0 kvar\)/);
    expect(w?.message).toContain('can resonate with harmonics');
  });

  it('the same two loads on a three-phase board are warned the same way', () => {
    const w = workshop('three-phase-4wire').warnings.find((x) => x.code === 'line-leading');
    expect(w?.message).toMatch(/^line A at PF 0\.80\d leads/);
  });
});
