/** A floating star bank: its star point moves, and its units must be rated for it. */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';

const board = (loads: object[]) =>
  normaliseBoard(
    parseBoard({
      supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 } },
      loads,
    }),
  );

describe('floating star bank', () => {
  it('is built from equal steps (no trims: unequal branches would push the star point), units rated for V_LN plus margin', () => {
    const report = correctBoard(board([{ name: 'fans', connection: 'ABC-delta', kW: 20, pf: 0.8 }]), { arrangement: 'star-bank', target: { pf: 0.95 } });
    expect(report.selection).not.toBeNull();
    expect(report.selection!.steps.every((s) => s.branches.length === 3 && s.unit.kind === 'single-phase')).toBe(true);
    for (const s of report.selection!.selections) {
      // The 230 V nominal (IEC 60038 230/400) × 1.10 = 253 V: the typical IEC single-phase 280 V unit (67 % output, above the 65 % floor).
      expect(s.requiredRatedV).toBeCloseTo(1.1 * 230, 9);
    }
    expect(report.selection!.steps[0]!.unit.ratedV).toBe(280);
    // Equal branches on a balanced board: the star point stays at the centroid, no shift warning.
    expect(report.warnings.map((w) => w.code)).not.toContain('star-point-shift');
  });
  it('warns when unequal branches push the star point more than 10 % of V_LN off the centroid', () => {
    const report = correctBoard(
      board([
        { name: 'press', connection: 'A-B', kW: 15, pf: 0.75 },
        { name: 'fans', connection: 'ABC-delta', kW: 10, pf: 0.8 },
      ]),
      { arrangement: 'star-bank', target: { pf: 0.95 } },
    );
    const w = report.warnings.find((x) => x.code === 'star-point-shift');
    expect(w).toBeDefined();
    expect(w!.value!).toBeGreaterThan(0.1 * (400 / Math.sqrt(3)));
    expect(w!.message).toMatch(/consider a delta bank/);
  });
});
