/**
 * A load written in ohms is held to the same limit as one rated in kVA (PHYSICAL_RANGES.loadKVA,
 * 100,000 kVA) through its draw at nominal voltage, branches × V²/|Z|. Before, 1e-12 ohm drew
 * 5.3e13 kW without a word and 5e-324 ohm failed in the solve, naming the result.
 */
import { describe, expect, it } from 'vitest';
import { solveBoard, validateBoard, validateInstallation } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
const boardWith = (load: object) => ({ supply, loads: [{ name: 'test heater', ...load }] });
const issuesOf = (spec: unknown) => {
  const v = validateBoard(spec);
  return v.ok ? [] : v.issues;
};

describe('a load in ohms within the kVA limit', () => {
  it('refuses an impedance drawing more than 100,000 kVA, at loads[0].ohms, with the least |Z| accepted', () => {
    // 400/√3 = 230.94 V; 230.94² / 100,000,000 VA = 0.000533 ohm, printed rounded up.
    for (const r of [1e-12, 5e-324, 0.00053]) {
      const [issue, ...rest] = issuesOf(boardWith({ connection: 'A-N', ohms: { r, x: 0 } }));
      expect(rest).toEqual([]);
      expect(issue?.path).toBe('loads[0].ohms');
      expect(issue?.message).toMatch(/at most 100,000 kVA at nominal voltage \(231 V across it\): \|Z\| at least 0\.000534 ohm/);
    }
  });

  it('judges a delta branch at line-to-line voltage over three branches', () => {
    // 3 × 400² / 1e8 = 0.0048 ohm.
    expect(issuesOf(boardWith({ connection: 'ABC-delta', ohms: { r: 0.004, x: 0.001 } }))[0]?.message).toMatch(/400 V across each of 3 branches\): \|Z\| at least 0\.00480 ohm/);
    expect(issuesOf(boardWith({ connection: 'ABC-delta', ohms: { r: 0.0048, x: 0.0001 } }))).toEqual([]);
  });

  it('solves one just inside the limit: 0.000534 ohm draws 99,875 kW (230.94² / 0.000534)', () => {
    const result = solveBoard(boardWith({ connection: 'A-N', ohms: { r: 0.000534, x: 0 } }));
    expect(result.loads[0]!.kW).toBeCloseTo(230.94 ** 2 / 0.000534 / 1000, -1);
  });

  it('holds a sub-board load in an installation to the same limit, at its own path', () => {
    const v = validateInstallation({
      supply,
      boards: [
        { name: 'main', loads: [] },
        { name: 'forge', fedFrom: 'main', feeder: { lengthM: 20, line: { mm2: 95 }, neutral: { mm2: 95 } }, loads: [{ name: 'arc', connection: 'A-B', ohms: { r: 1e-9, x: 0 } }] },
      ],
    });
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.issues.map((i) => i.path)).toEqual(['boards[1].loads[0].ohms']);
  });
});
