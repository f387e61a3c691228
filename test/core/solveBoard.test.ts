import { describe, expect, it } from 'vitest';
import { solveBoard } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;

describe('solveBoard on an ideal source', () => {
  it('a single 2.3 kW heater on phase A returns all its current in the neutral', () => {
    const r = solveBoard({ supply, loads: [{ name: 'heater', connection: 'A-N', kW: 2.3, pf: 1 }] });
    const ia = 2300 / (400 / Math.sqrt(3));
    expect(r.phases[0]!.current.magnitude).toBeCloseTo(ia, 9);
    expect(r.neutral!.current.magnitude).toBeCloseTo(ia, 9);
    expect(r.phases[1]!.current.magnitude).toBeLessThan(1e-12);
    expect(r.warnings.map((w) => w.code)).toContain('neutral-above-phase');
  });
});
