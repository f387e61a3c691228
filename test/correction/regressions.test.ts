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
});
