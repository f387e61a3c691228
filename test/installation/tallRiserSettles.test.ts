/**
 * A tall riser (many boards in a chain) solved at the correction trials' tolerance, 1e-13 of nominal:
 * the load iteration's round-off floor grows with the network, and on a riser of 50 boards a bank's
 * trial solves ran the iteration to its limit and reported "no solution" for a supply that carries the
 * loads easily (exit 4 from `trivar correct`). It now stops at the floor (iterationSettled.ts).
 */
import { describe, expect, it } from 'vitest';
import { compileInstallation, correctInstallation, normaliseInstallation, parseInstallation } from '@trivar/core';
import { iterationSettled, NOISE_FLOOR_CHANGE } from '../../packages/core/src/network/iterationSettled.js';

function riser(boards: number): unknown {
  const phases = ['A-N', 'B-N', 'C-N'] as const;
  return {
    name: 'tall riser',
    supply: { voltage: '400/230', frequencyHz: 50, transformer: { kVA: 2000, impedancePercent: 6, xOverR: 6 } },
    boards: Array.from({ length: boards }, (_, k) => ({
      name: `B${k}`,
      ...(k > 0 ? { fedFrom: `B${k - 1}` } : {}),
      feeder: { lengthM: 2, line: { mm2: 240 }, neutral: { mm2: 240 } },
      loads: [
        { name: `l${k}`, connection: phases[k % 3]!, kW: 0.5, pf: 0.9 },
        { name: `m${k}`, connection: 'ABC-delta' as const, kW: 0.3, pf: 0.8 },
      ],
    })),
  };
}

describe('a tall riser at a tight tolerance', () => {
  it('settles at 1e-13 on 100 boards, at the state a default solve finds (to 1e-10 of nominal)', () => {
    const installation = normaliseInstallation(parseInstallation(riser(100))).installation;
    const tight = compileInstallation(installation).network;
    tight.solve({ tolerance: 1e-13, maxIterations: 400 });
    const loose = compileInstallation(installation).network;
    loose.solve();
    let worst = 0;
    for (let v = 0; v < tight.nodeCount; v++)
      if (tight.live[v]) worst = Math.max(worst, Math.hypot(tight.voltageRe[v]! - loose.voltageRe[v]!, tight.voltageIm[v]! - loose.voltageIm[v]!) / tight.circuit.voltageBase);
    expect(worst).toBeLessThan(1e-10);
    expect(tight.lastChange).toBeLessThanOrEqual(NOISE_FLOOR_CHANGE);
    expect(tight.iterations).toBeLessThan(400);
  });

  it('a star bank on the main board of a 50-board riser is sized and verified, not refused as "no solution"', () => {
    const spec = riser(50);
    const { report } = correctInstallation(normaliseInstallation(parseInstallation(spec)).installation, { arrangement: 'star-bank', target: { pf: 0.95 } });
    expect(report.status).toBe('meets-target');
  });

  it('the stop rule: error estimate, round-off, and a change that no longer shrinks', () => {
    // Contracting by 0.5 a step: the error left is about the last change.
    expect(iterationSettled(4e-11, 8e-11, 1e-10)).toBe(true);
    expect(iterationSettled(6e-11, 1.2e-10, 1e-10)).toBe(false);
    // Slowly contracting (0.99 a step): a change of 5e-14 still leaves about 5e-12, above 1e-13.
    expect(iterationSettled(5e-14, 5.05e-14, 1e-13)).toBe(false);
    // Stopped shrinking below the tolerance, or at the noise floor above a tight one: settled.
    expect(iterationSettled(5e-14, 4e-14, 1e-13)).toBe(true);
    expect(iterationSettled(2e-13, 1.8e-13, 1e-13)).toBe(true);
    // Not shrinking but well above the noise floor: not settled (a run-away, not round-off).
    expect(iterationSettled(5e-11, 4e-11, 1e-13)).toBe(false);
    expect(iterationSettled(1e-15, 0, 1e-13)).toBe(true);
  });
});
