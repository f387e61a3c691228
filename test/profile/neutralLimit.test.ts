/**
 * The neutral's limit in a profile is the neutral's own rating (or profile.limits.neutralA): a neutral with
 * no rating has no limit, whatever the lines are rated — as trivar solve reports it (ratingA null).
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, normaliseInstallation, parseBoard, parseInstallation, planInstallationColumns, planDrivers, driverColumns, readBoardText, solveInstallation, studyInstallationProfile } from '@trivar/core';
import { resolveLimits } from '../../packages/core/src/profile/studyProfile.js';

const board = (neutral: Record<string, unknown>) =>
  normaliseBoard(
    parseBoard({
      supply: { voltage: '230/400', frequencyHz: 50 },
      feeder: { lengthM: 20, line: { mm2: 16, material: 'copper', ratingA: 63 }, neutral: { mm2: 10, material: 'copper', ...neutral } },
      loads: [{ name: 'heater', connection: 'A-N', kW: 3 }],
    }),
  );

describe('the neutral limit of a profile', () => {
  it('is none for an unrated neutral, not the lines\' 63 A', () => {
    expect(resolveLimits(board({}), undefined).neutralA).toBeNull();
  });
  it('is the neutral\'s own rating, or profile.limits.neutralA over it', () => {
    expect(resolveLimits(board({ ratingA: 40 }), undefined).neutralA).toBe(40);
    expect(resolveLimits(board({}), { limits: { neutralA: 50 } }).neutralA).toBe(50);
  });

  it('on a split-phase installation: the service neutral (1/0 AWG Al, unrated) has no limit beside 2/0 lines rated 175 A, as solve says', () => {
    const text = `name: Split house
supply: { voltage: 120/240, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.2, xOverR: 1.8 } }
boards:
  - name: Service panel
    feeder:
      lengthFt: 60
      line: { awg: "2/0", material: aluminum, ratingA: 175 }
      neutral: { awg: "1/0", material: aluminum }
    loads:
      - { name: Range, connection: L1-L2, kW: 8, model: constant-impedance }
      - { name: Kitchen, connection: L1-N, kW: 1.8, pf: 0.95 }
`;
    const spec = parseInstallation(readBoardText(text));
    const solved = solveInstallation(readBoardText(text));
    expect(solved.boards[0]!.result.neutral!.ratingA).toBeNull();
    const { installation } = normaliseInstallation(spec);
    const plan = planInstallationColumns(installation, ['time', 'Range [x]', 'Kitchen [x]']);
    const scales = [Float64Array.of(1, 0.5), Float64Array.of(1, 1)];
    const r = studyInstallationProfile({
      installation,
      loads: plan.board.loads,
      loadBoards: plan.loadBoards,
      drivers: planDrivers(plan),
      columns: driverColumns(plan, scales, 2),
      utcMs: Float64Array.of(Date.UTC(2026, 5, 1, 10), Date.UTC(2026, 5, 1, 10, 15)),
      intervalMs: 900_000,
    }).result;
    const conductors = r.boards[0]!.before.conductors;
    expect(conductors.map((c) => [c.conductor, c.ratingA])).toEqual([
      ['A', 175],
      ['B', 175],
      ['N', null],
    ]);
    expect(conductors[2]!.hoursAboveLimit).toBeNull();
    // The neutral does carry current: the kitchen's 1.8 kW on L1 alone.
    expect(conductors[2]!.maxA).toBeGreaterThan(10);
  });
});
