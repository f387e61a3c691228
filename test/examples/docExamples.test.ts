/**
 * The figures the TSDoc examples show are what the code returns (the installation example read
 * 13.4 A where the solve gives 13.07, and a move's circuit was shown as a number).
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, rebalanceBoard, solveBoard, solveInstallation } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;

describe('TSDoc examples', () => {
  it('solveInstallation: the shed heater draws 13.07 A (3000 W at 229.5 V)', () => {
    const result = solveInstallation({
      supply,
      boards: [
        { name: 'Main', loads: [] },
        { name: 'Shed', fedFrom: 'Main', feeder: { lengthM: 40, line: { mm2: 16 }, neutral: { mm2: 16 } }, loads: [{ name: 'heater', connection: 'A-N', kW: 3 }] },
      ],
    });
    const current = result.feeders[1]!.lines[0]!.current.magnitude;
    expect(current).toBeCloseTo(13.07, 2);
    // Hand check: 1.38 ohm/km × 0.08 km out and back; V = 230.94 − I·R; I = 3000 / V.
    const r = 1.38 * 0.08;
    const handV = (230.94 + Math.sqrt(230.94 ** 2 - 4 * r * 3000)) / 2;
    expect(current).toBeCloseTo(3000 / handV, 1);
  });

  it('rebalanceBoard: each move names its circuit as written, its place in the list and what its number does', () => {
    const studio = {
      name: 'Studio',
      supply,
      loads: [
        { name: 'Kiln', connection: 'A-N', kW: 6, circuit: '1' },
        { name: 'Kitchen sockets', connection: 'A-N', kW: 3, circuit: '3' },
        { name: 'Lights', connection: 'B-N', kW: 1, circuit: '5' },
        { name: 'Heater', connection: 'C-N', kW: 2, circuit: '7' },
      ],
    };
    const report = rebalanceBoard(normaliseBoard(parseBoard(studio)), { moveLimit: 2 });
    expect(report.moves).toEqual([
      { board: 'Studio', circuit: '1', listPosition: 1, name: 'Kiln', from: 'A-N', to: 'B-N', circuitNumber: { verdict: 'position-changes', implied: null, positions: null } },
      { board: 'Studio', circuit: '5', listPosition: 3, name: 'Lights', from: 'B-N', to: 'C-N', circuitNumber: { verdict: 'position-changes', implied: null, positions: null } },
    ]);
  });

  it('solve.lastChangePercent is the last move, above the 1e-8 % tolerance, which judges the error it leaves', () => {
    const result = solveBoard({ supply: { ...supply, impedance: { r: 0.1, x: 0.05 } }, loads: [{ name: 'heater', connection: 'A-N', kW: 3 }] });
    expect(result.solve.iterations).toBeGreaterThan(1);
    expect(result.solve.lastChangePercent).toBeGreaterThan(1e-8);
    // Yet the state is within the tolerance: a constant-power load draws P·(|V|/|V assumed|)², so its
    // 3 kW drawn to 2e-10 says the magnitude it was given is the solved one to 1e-10.
    expect(Math.abs(result.loads[0]!.kW - 3) / 3).toBeLessThan(2e-10);
  });
});
