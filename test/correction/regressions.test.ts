/** Boards that once broke the sizing, kept so they stay fixed. */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard } from '@trivar/core';

describe('correction regressions', () => {
  it('a small load on a 480 V board meets a per-line target exactly (the LP may not trade a hair of PF for kvar)', () => {
    // Found by the property test (seed -579787016): the LP's feasibility tolerance let a vertex sit
    // 4e-9 (relative, in Q/P) past the PF bound and win on cost.
    const board = normaliseBoard(
      parseBoard({
        supply: { system: 'three-phase-4wire', voltage: { lineToLine: 480 }, frequencyHz: 60, sequence: 'ACB', impedance: { r: 0.12075103813279202, x: 0.12075103813279242 } },
        loads: [{ name: 'load 1', connection: 'A-N', kW: 0.5, kvar: 2 / 3, model: 'constant-impedance' }],
      }),
    );
    const pf = 0.9686693349030627;
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf }, lightLoad: { fraction: 0.3 } });
    expect(report.sizing.status).toBe('meets-target');
    const a = report.sizing.arrangement === 'star-bank' ? report.sizing.check.lines[0]! : null;
    expect(a!.meetsMinimum).toBe(true);
    expect(Math.abs(a!.pf! - pf) / pf).toBeLessThan(1e-10);
  });

  it('a floating star whose delta sizing is round-off with one branch at zero is no bank (not an infinite element)', () => {
    // Found by the bank-build property (seed -1945660194): the LP left 1e-12 kvar on two delta branches and
    // 0 on the third, and the Δ→Y map made the star element opposite the zero branch infinite (singular network).
    const board = normaliseBoard(
      parseBoard({
        supply: { system: 'three-phase-3wire', voltage: { lineToLine: 480 }, frequencyHz: 60, impedance: { r: 0.1447098804278048, x: 0.23558489108296043 } },
        loads: [{ name: 'load 1', connection: 'A-B', kW: 0.5, kvar: 2 / 3, model: 'constant-impedance' }],
      }),
    );
    const report = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.85 } });
    expect(report.reasons.length).toBeGreaterThan(0);
    expect(report.sizing.arrangement === 'star-bank' && report.sizing.branches.every((b) => b.element === 'none')).toBe(true);
  });
});
