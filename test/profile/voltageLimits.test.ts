/**
 * The profile's hours below / above its voltage band count against the board's own limits — the
 * ones its solve verdict uses — unless `profile.limits` sets the band: an invented 208Y/120 V shop
 * board at the end of a long 4 AWG service run, one interval lightly loaded and one heavily on
 * line A. Phase A sags to about 93 %: outside ANSI C84.1 Range A (±5 %, the North-American default),
 * inside EN 50160's ±10 %.
 */
import { describe, expect, it } from 'vitest';
import {
  boardOfInstallation,
  checkIntervalSequence,
  createRowReader,
  driverColumns,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  planColumns,
  planDrivers,
  solveBoard,
  studyProfile,
  type Board,
} from '@trivar/core';

const shop = (conventions: object, limits?: object) => ({
  name: 'Birch Road print shop',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 208 }, frequencyHz: 60 },
  conventions,
  feeder: { lengthFt: 250, line: { awg: '4', ratingA: 85 }, neutral: { awg: '4' } },
  loads: [
    { name: 'dryer', connection: 'A-N', kW: 7, pf: 1 },
    { name: 'press', connection: 'ABC-delta', kW: 3, pf: 0.85 },
  ],
  ...(limits ? { profile: { limits } } : {}),
});

/** Two 15-min intervals: the dryer at 5 % of its rating, then at 100 %. */
function profileOf(spec: ReturnType<typeof shop>) {
  const parsed = parseBoard(spec);
  const board = normaliseBoard(parsed);
  return { parsed, board, result: run(board, parsed.profile) };
}

/** The dryer (or the named load) driven by the data; the other loads at their rating. */
function run(board: Board, profile: Parameters<typeof studyProfile>[0]['profile'], driven = 'dryer') {
  const plan = planColumns(board, ['time', `${driven} [kW]`], { undrivenAtRating: true });
  const reader = createRowReader(plan, { timeZone: 'UTC' });
  reader.push(['2025-03-03T10:00:00Z', '0.35'], 2);
  reader.push(['2025-03-03T10:15:00Z', '7'], 3);
  const table = checkIntervalSequence(reader.finish(), 'none');
  return studyProfile({
    board: plan.board,
    drivers: planDrivers(plan),
    columns: driverColumns(plan, table.values, table.count),
    utcMs: table.utcMs,
    intervalMs: table.intervalMs,
    sequence: table.report,
    undriven: { loads: plan.undriven, atRating: plan.undrivenAtRating },
    ...(profile ? { profile } : {}),
  }).result;
}

describe("profile: the voltage band is the board's own limits", () => {
  it('North-American board (C84.1 Range A, ±5 %): the heavy quarter-hour counts below 95 %', () => {
    const { result } = profileOf(shop({ region: 'north-america' }));
    expect(result.limits).toMatchObject({ voltageLowPercent: 95, voltageHighPercent: 105, voltageLimitsFrom: 'c84-service-a' });
    const lowest = Math.min(...result.before.voltages.map((v) => v.minPercent));
    expect(lowest).toBeLessThan(95);
    expect(lowest).toBeGreaterThan(90);
    expect(result.before.hoursVoltageLow).toBeCloseTo(0.25, 12);
    expect(result.before.hoursVoltageHigh).toBe(0);
  });

  it('the same board held to EN 50160 (±10 %): no hour below 90 %', () => {
    const { result } = profileOf(shop({ region: 'north-america', voltageLimits: 'en50160-supply' }));
    expect(result.limits).toMatchObject({ voltageLowPercent: 90, voltageHighPercent: 110, voltageLimitsFrom: 'en50160-supply' });
    expect(result.before.hoursVoltageLow).toBe(0);
  });

  it("the profile's own limits still set the band", () => {
    const { result } = profileOf(shop({ region: 'north-america' }, { voltageLowPercent: 88 }));
    expect(result.limits).toMatchObject({ voltageLowPercent: 88, voltageHighPercent: 105, voltageLimitsFrom: 'profile.limits' });
    expect(result.before.hoursVoltageLow).toBe(0);
  });

  it('the heavy interval agrees with the board solve at full rating: the same lowest phase voltage, the same verdict', () => {
    const spec = shop({ region: 'north-america' });
    const { result } = profileOf(spec);
    const solved = solveBoard(spec);
    const lowest = Math.min(...result.before.voltages.map((v) => v.minPercent));
    expect(lowest).toBeCloseTo(Math.min(...solved.phases.map((p) => p.voltagePercent)), 6);
    expect(solved.voltageCheck.verdict).toBe('under');
  });

  it("a board of an installation takes its own voltageLimits, not the installation's", () => {
    const installation = normaliseInstallation(
      parseInstallation({
        name: 'Birch Road works',
        supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
        boards: [
          { name: 'Main', feeder: { lengthM: 10, line: { mm2: 70, ratingA: 200 }, neutral: { mm2: 70 } }, loads: [{ name: 'lights', connection: 'B-N', kW: 1, pf: 1 }] },
          {
            name: 'Darkroom',
            fedFrom: 'Main',
            voltageLimits: { underPercent: 3, overPercent: 4 },
            feeder: { lengthM: 30, line: { mm2: 10, ratingA: 50 }, neutral: { mm2: 10 } },
            loads: [{ name: 'dryer', connection: 'A-N', kW: 7, pf: 1 }],
          },
        ],
      }),
    ).installation;
    const main = run(boardOfInstallation(installation, 0), undefined, 'lights');
    const darkroom = run(boardOfInstallation(installation, 1), undefined);
    expect(main.limits).toMatchObject({ voltageLowPercent: 90, voltageHighPercent: 110, voltageLimitsFrom: 'en50160-supply' });
    expect(darkroom.limits).toMatchObject({ voltageLowPercent: 97, voltageHighPercent: 104, voltageLimitsFrom: 'custom' });
  });
});
