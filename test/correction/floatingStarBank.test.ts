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
  it('needs units rated for the line-to-line voltage plus margin (an element reaches V_LL as the star point moves)', () => {
    const report = correctBoard(board([{ name: 'fans', connection: 'ABC-delta', kW: 20, pf: 0.8 }]), { arrangement: 'star-bank', target: { pf: 0.95 } });
    expect(report.selection).not.toBeNull();
    for (const s of report.selection!.selections) {
      expect(s.highestVoltageV).toBeCloseTo(400, 9);
      expect(s.requiredRatedV).toBeCloseTo(440, 9);
      expect(s.unit!.ratedV).toBeGreaterThanOrEqual(440);
    }
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
