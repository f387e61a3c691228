/**
 * `trivar solve` on a board whose phase A sits 0.05 V past its band's top (an invented hillside farm
 * exporting 20 kW of PV on one phase): the built binary prints the figures beside the verdict on the
 * verdict's side of the edge.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const FARM = `name: Hilltop farm PV board
supply:
  system: three-phase-4wire
  voltage: { lineToLine: 400 }
  frequencyHz: 50
  transformer: { kVA: 100, impedancePercent: 4, xOverR: 2 }
feeder:
  line: { lengthM: 203, rOhmPerKm: 0.64, xOhmPerKm: 0.08, ratingA: 100 }
  neutral: { lengthM: 203, rOhmPerKm: 0.64, xOhmPerKm: 0.08, ratingA: 100 }
loads:
  - { name: Roof PV, connection: A-N, kW: -20, pf: 1 }
  - { name: Barn heaters, connection: B-N, kW: 3, pf: 1, model: constant-impedance }
  - { name: Milking unit, connection: ABC-delta, kW: 4, pf: 0.85 }
`;

describe('trivar solve at a band edge', () => {
  it('prints phase A at 253.1 V and 110.02 % beside "ABOVE the upper limit" and its warnings', () => {
    const r = runTrivar(['solve', '-'], FARM);
    expect(r.code).toBe(0);
    const text = r.stdout;
    expect(text).toMatch(/\n {2}A +253\.1 +2\.2 +110\.02 /);
    expect(text).toMatch(/\n {2}Roof PV +A-N +P +253\.1 +110\.02 /);
    const flat = text.replace(/\s+/g, ' ');
    expect(flat).toContain('limits ±10 % (en50160-supply): ABOVE the upper limit; lowest 95.6 % at phase B, highest 110.02 % at phase A');
    expect(flat).toContain('on this board 230.0 V: 207.0–253.0 V line-to-neutral; 400.0 V: 360.0–440.0 V line-to-line');
    expect(flat).toContain('! phase A at the board is 253.1 V, 110.02 % of nominal, outside ±10 % (en50160-supply)');
    expect(flat).toContain('! load "Roof PV" (A-N) sees 253.1 V, 110.02 % of nominal, outside ±10 % (en50160-supply)');
    expect(flat).not.toContain('every voltage within');
  });
});
