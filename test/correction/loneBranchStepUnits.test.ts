/**
 * A step on a lone branch (split-phase, single-phase) is made from the fewest, cheapest cans that give
 * its capacitance. The search splits one unit choice into steps, so a 2 kvar step was two 1 kvar cans
 * where the catalogue had a 2 kvar can of the same rating: the same µF at a higher stated cost, beside
 * "chosen for least cost". Each step is now rebuilt from the cheapest single kind of can of equal µF.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';
import { cheapestStepUnits, type UnitChoice } from '../../packages/core/src/correction/_internal/bankSearch.js';

// A cider barn (invented) on a 240/120 V split-phase service: a press motor on L1, a pump across both
// legs and a cold room on L2, with a catalogue of 0.5, 1 and 2 kvar cans at 130 V.
const ciderBarn = () =>
  normaliseBoard(
    parseBoard({
      name: 'Hollin cider barn',
      supply: { system: 'split-phase', voltage: { lineToLine: 240 }, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.5, xOverR: 2 } },
      feeder: {
        line: { lengthM: 40, rOhmPerKm: 0.3, xOhmPerKm: 0.09, ratingA: 200 },
        neutral: { lengthM: 40, rOhmPerKm: 0.3, xOhmPerKm: 0.09, ratingA: 200 },
      },
      loads: [
        { name: 'Press motor', connection: 'L1-N', kW: 3, pf: 0.7 },
        { name: 'Transfer pump', connection: 'L1-L2', kW: 5, pf: 0.75 },
        { name: 'Cold room', connection: 'L2-N', kW: 1.5, pf: 0.95 },
      ],
    }),
  );
const catalogue = [
  { name: 'Barn can 0.5', ratedKvar: 0.5, ratedV: 130, ratedHz: 60 },
  { name: 'Barn can 1', ratedKvar: 1, ratedV: 130, ratedHz: 60 },
  { name: 'Barn can 2', ratedKvar: 2, ratedV: 130, ratedHz: 60 },
];

describe('a split-phase bank from a catalogue with 1 and 2 kvar cans', () => {
  const report = correctBoard(ciderBarn(), { arrangement: 'star-bank', catalogue });
  const selection = report.selection!;

  it('makes each 2 kvar step from one 2 kvar can, not two 1 kvar cans', () => {
    const twoKvarSteps = selection.steps.filter((s) => s.nameplateKvar === 2);
    expect(twoKvarSteps.length).toBe(2);
    for (const s of twoKvarSteps) {
      expect(s.units).toBe(1);
      expect(s.unit.name).toBe('Barn can 2');
      // 2 kvar at 130 V, 60 Hz: 2000 / (2π·60·130²) = 313.9 µF, as two 1 kvar cans gave.
      expect(s.capacitancePerBranchUF).toBeCloseTo(313.9, 1);
    }
  });

  it('states the cost of what it built: 7 kvar nameplate + 2 × 5 units = 17.0 (two 1 kvar cans a step gave 21.0)', () => {
    expect(selection.units).toBe(5);
    expect(selection.nameplateKvar).toBeCloseTo(7, 9);
    expect(selection.cost.value).toBeCloseTo(17, 9);
    expect(report.status).toBe('meets-target');
  });
});

describe('cheapestStepUnits', () => {
  const can = (ratedKvar: number, ratedV: number): UnitChoice => ({
    unit: { name: `${ratedKvar} kvar ${ratedV} V`, kind: 'single-phase', ratedKvar, ratedV, ratedHz: 60 },
    index: null,
    elementF: (ratedKvar * 1000) / (2 * Math.PI * 60 * ratedV ** 2),
    unitsPerCount: 1,
  });
  const one = can(1, 130);
  const two = can(2, 130);
  const twoHigher = can(2, 140);

  it('takes one larger can of the same capacitance and leaves a step no can matches as it was', () => {
    expect(cheapestStepUnits(2, one, [one, two], 2)).toEqual({ choice: two, count: 1 });
    expect(cheapestStepUnits(3, one, [one, two], 2)).toEqual({ choice: one, count: 3 });
    // A can of another rating has another capacitance: never a match, whatever it costs.
    expect(cheapestStepUnits(2, one, [one, twoHigher], 2)).toEqual({ choice: one, count: 2 });
  });
});
