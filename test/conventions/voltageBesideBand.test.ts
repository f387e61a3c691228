/**
 * A voltage near a band edge: the verdict judges the figure itself (past a round-off allowance of
 * 0.001 % of nominal), and every figure printed beside it shows on which side of the edge it lies.
 * The board is an invented farm: 20 kW of rooftop PV on phase A at the end of a 203 m, 0.64 Ω/km run
 * from a 100 kVA transformer, which lifts phase A to 253.05 V, just past EN 50160's 253.0 V at 230 V.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  bandVolts,
  bandVoltsWords,
  buildBoardReport,
  checkIntervalSequence,
  createRowReader,
  driverColumns,
  judgeVoltage,
  lowestVoltageChange,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  percentBesideBand,
  percentBesideEdges,
  planColumns,
  planDrivers,
  readBoardText,
  renderReportMarkdown,
  solveBoard,
  solveBoardModel,
  studyInstallationScenarios,
  studyProfile,
  voltageBesideBand,
  VOLTAGE_LIMIT_PRESETS,
} from '@trivar/core';
import { readFileSync } from 'node:fs';
import { REBALANCE_NOTES } from '../../packages/core/src/rebalance/rebalanceWording.js';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';
import { renderProfileReport } from '../../packages/cli/src/format/profileReport.js';
import { renderInstallationScenarioReport } from '../../packages/cli/src/format/installationProfileReport.js';

const EN50160 = VOLTAGE_LIMIT_PRESETS['en50160-supply'];

const farm = (pvKW: number) => ({
  name: 'Hilltop farm PV board',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 2 } },
  feeder: {
    line: { lengthM: 203, rOhmPerKm: 0.64, xOhmPerKm: 0.08, ratingA: 100 },
    neutral: { lengthM: 203, rOhmPerKm: 0.64, xOhmPerKm: 0.08, ratingA: 100 },
  },
  loads: [
    { name: 'Roof PV', connection: 'A-N', kW: -pvKW, pf: 1 },
    { name: 'Barn heaters', connection: 'B-N', kW: 3, pf: 1, model: 'constant-impedance' },
    { name: 'Milking unit', connection: 'ABC-delta', kW: 4, pf: 0.85 },
  ],
});

/** The PV output that puts phase A at `volts`, by bisection (the phase rises with the export). */
function pvFor(volts: number): number {
  let lo = 15;
  let hi = 25;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (solveBoard(farm(mid)).phases[0]!.voltage.magnitude < volts) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

describe('a voltage just past a band edge: 253.05 V against 207.0–253.0 V', () => {
  const result = solveBoard(farm(20));
  const text = renderSolveReport(result);

  it('solves phase A at 253.050 V, 110.0218 % of 230 V', () => {
    expect(result.phases[0]!.voltage.magnitude).toBeCloseTo(253.0501, 3);
    expect(result.phases[0]!.voltagePercent).toBeCloseTo(110.0218, 3);
  });

  it('reads over: the verdict, the warnings and the load named in them', () => {
    expect(result.voltageCheck.verdict).toBe('over');
    expect(result.voltageCheck.highest.at).toBe('phase A');
    const warnings = result.warnings.filter((w) => w.code.endsWith('overvoltage')).map((w) => w.message);
    expect(warnings).toEqual([
      'phase A at the board is 253.1 V, 110.02 % of nominal, outside ±10 % (en50160-supply)',
      'load "Roof PV" (A-N) sees 253.1 V, 110.02 % of nominal, outside ±10 % (en50160-supply)',
    ]);
  });

  it('prints 253.1 V beside 110.02 % in the text report, the band line at 0.1 V (253.1 already reads past 253.0)', () => {
    expect(text).toMatch(/\n {2}A +253\.1 +2\.2 +110\.02 +-9\.6 /);
    expect(text).toMatch(/\n {2}Roof PV +A-N +P +253\.1 +110\.02 +79\.0 /);
    // A figure far from the edges keeps 0.1.
    expect(text).toMatch(/\n {2}B +219\.8 +-118\.2 +95\.6 +4\.8 /);
    expect(text).toMatch(/\n {2}Barn heaters +B-N +Z +219\.8 +95\.6 /);
    expect(text).toContain('line-to-line: A-B 410.6 V (102.6 %)   B-C 395.8 V (99.0 %)   C-A 405.7 V (101.4 %)');
    expect(text.replace(/\s+/g, ' ')).toContain('limits ±10 % (en50160-supply): ABOVE the upper limit; lowest 95.6 % at phase B, highest 110.02 % at phase A');
    expect(text).toContain('on this board 230.0 V: 207.0–253.0 V line-to-neutral; 400.0 V: 360.0–440.0 V line-to-line');
  });

  it('prints the same in the Markdown report: its table of voltages against the band, margin −0.02', () => {
    const md = renderReportMarkdown(buildBoardReport({ spec: parseBoard(farm(20)), result: solveBoardModel(normaliseBoard(parseBoard(farm(20)))) }), 'farm-').markdown;
    expect(md).toContain('| A-N | 253.1 | 110.02 | 207.0 – 253.0 | -0.02 | above the band |');
    expect(md).toContain('| B-N | 219.8 | 95.6 | 207.0 – 253.0 | 5.6 | within |');
  });
});

describe('a voltage on the edge, within round-off', () => {
  const onEdge = solveBoard(farm(pvFor(253)));
  // 253.004 V is 0.0017 % past 253.0 V: past the 0.001 % allowance, printed with the decimals that show it.
  const justPast = solveBoard(farm(pvFor(253.004)));

  it('reads within and prints 253.0 V, 110.0 %', () => {
    expect(Math.abs(onEdge.phases[0]!.voltage.magnitude - 253)).toBeLessThan(1e-6);
    expect(onEdge.voltageCheck.verdict).toBe('within');
    expect(onEdge.warnings.filter((w) => w.code.endsWith('overvoltage'))).toEqual([]);
    const text = renderSolveReport(onEdge);
    expect(text).toMatch(/\n {2}A +253\.0 +[\d.]+ +110\.0 /);
    expect(text.replace(/\s+/g, ' ')).toContain('every voltage within; lowest 95.6 % at phase B, highest 110.0 % at phase A');
    expect(text).toContain('230.0 V: 207.0–253.0 V line-to-neutral');
  });

  it('4 mV past it reads over, prints 253.004 V and 110.002 %, and the band line its ends to 1 mV', () => {
    expect(justPast.voltageCheck.verdict).toBe('over');
    const text = renderSolveReport(justPast);
    expect(text).toMatch(/\n {2}A +253\.004 +[\d.]+ +110\.002 /);
    expect(text).toMatch(/\n {2}Roof PV +A-N +P +253\.004 +110\.002 /);
    expect(text).toContain('230.0 V: 207.000–253.000 V line-to-neutral; 400.0 V: 360.0–440.0 V line-to-line');
    expect(justPast.warnings.find((w) => w.code === 'board-overvoltage')!.message).toBe('phase A at the board is 253.004 V, 110.002 % of nominal, outside ±10 % (en50160-supply)');
  });
});

describe('voltageBesideBand and percentBesideBand', () => {
  it('keep the usual 0.1 far from an edge, add decimals (at most 3) only where 0.1 would sit on the edge', () => {
    expect(voltageBesideBand(EN50160, { volts: 230.04, percent: (100 * 230.04) / 230 })).toMatchObject({ side: 'within', volts: '230.0', percent: '100.0', voltsDecimals: 1, percentDecimals: 1 });
    expect(voltageBesideBand(EN50160, { volts: 253.05, percent: (100 * 253.05) / 230 })).toMatchObject({ side: 'over', volts: '253.1', percent: '110.02', voltsDecimals: 1, percentDecimals: 2 });
    expect(voltageBesideBand(EN50160, { volts: 206.96, percent: (100 * 206.96) / 230 })).toMatchObject({ side: 'under', volts: '206.96', percent: '89.98' });
    expect(percentBesideBand(EN50160, 89.9984)).toBe('89.998');
    // Round-off past an edge is printed as the edge.
    expect(percentBesideBand(EN50160, 110.0004)).toBe('110.0');
  });

  it('read a 208Y/120 board against its band printed at the same decimals: 126.095 V is past 126.094 V', () => {
    const a = VOLTAGE_LIMIT_PRESETS['c84-service-a'];
    const nominal = 208 / Math.sqrt(3);
    // The band's top is 126.0937 V, printed 126.1 at 0.1 V, as a figure 1.3 mV above it would be.
    const shown = voltageBesideBand(a, { volts: 126.095, percent: (100 * 126.095) / nominal });
    expect(shown).toMatchObject({ side: 'over', volts: '126.095', voltsDecimals: 3 });
  });

  it('print a board’s lowest before → after in a correction study against that board’s limits', () => {
    const limits = { preset: 'en50160-supply' as const, ...EN50160 };
    const effect = { before: { boards: [{ name: 'Dairy', result: { voltageCheck: { limits } } }] } } as unknown as Parameters<typeof lowestVoltageChange>[0];
    // 89.996 % is one of the loads the study counts outside the band: at 0.1 it would print 90.0.
    expect(lowestVoltageChange(effect, { name: 'Dairy', lowestVoltagePercent: { before: 89.996, after: 90.34, change: 0.344 } as never })).toEqual({ before: '89.996', after: '90.3' });
  });

  it('print the extremes a rebalancing sentence quotes beside its verdict the same way', () => {
    const before = solveBoard(farm(20)).voltageCheck;
    const after = solveBoard(farm(5)).voltageCheck;
    expect(REBALANCE_NOTES.voltagesOutside({ limits: before.limits, before, after }, null, null, false)).toBe(
      'The voltages are above its voltage limits ±10 % (en50160-supply): highest 110.02 % (phase A).',
    );
  });

  it('never print a figure on the other side of an edge from its verdict (nominal 100–1000 V, every preset, figures within 0.05 % of an edge)', () => {
    const presets = Object.keys(VOLTAGE_LIMIT_PRESETS) as (keyof typeof VOLTAGE_LIMIT_PRESETS)[];
    fc.assert(
      fc.property(fc.double({ min: 100, max: 1000, noNaN: true }), fc.constantFrom(...presets), fc.boolean(), fc.double({ min: -0.05, max: 0.05, noNaN: true }), (nominal, name, upper, offset) => {
        const limits = VOLTAGE_LIMIT_PRESETS[name];
        const edge = upper ? 100 + limits.overPercent : 100 - limits.underPercent;
        const percent = edge + offset;
        const shown = voltageBesideBand(limits, { volts: (nominal * percent) / 100, percent });
        expect(shown.side).toBe(judgeVoltage({ preset: name, ...limits }, percent));
        const band = bandVolts(limits, nominal, shown.voltsDecimals);
        const reads = (x: number, low: number, high: number) => (x < low ? 'under' : x > high ? 'over' : 'within');
        expect(reads(Number(shown.volts), Number(band.low), Number(band.high))).toBe(shown.side);
        expect(reads(Number(shown.percent), 100 - limits.underPercent, 100 + limits.overPercent)).toBe(shown.side);
        expect(shown.voltsDecimals).toBeLessThanOrEqual(3);
        expect(shown.percentDecimals).toBeLessThanOrEqual(3);
      }),
      { numRuns: 2000 },
    );
  });

  it('refuse what they cannot print, by argument', () => {
    expect(() => percentBesideBand(EN50160, Number.NaN)).toThrow(/percent: expected a voltage as a finite percentage of nominal/);
    expect(() => voltageBesideBand(EN50160, { volts: -1, percent: 50 })).toThrow(/reading\.volts/);
    expect(() => percentBesideEdges(100, 110, 90)).toThrow(/highPercent/);
    expect(() => bandVolts(EN50160, 230, 4)).toThrow(/decimals: expected a whole number of decimals from 1 to 3 \(received 4\)/);
    expect(() => bandVoltsWords({ preset: 'en50160-supply', ...EN50160 }, { lineToNeutralV: 230, lineToLineV: 400 }, { lineToNeutral: 0 })).toThrow(/decimals\.lineToNeutral/);
    expect(bandVolts(EN50160, 230, 3)).toEqual({ low: '207.000', high: '253.000' });
  });
});

describe('interval and scenario counts at an edge agree with the verdict', () => {
  it('a profile counts the interval at 253.05 V above the band, not the one at 253.0 V, and prints its highest as 110.02', () => {
    const edgeKW = pvFor(253);
    const parsed = parseBoard(farm(20));
    const board = normaliseBoard(parsed);
    const plan = planColumns(board, ['time', 'Roof PV [kW]'], { undrivenAtRating: true });
    const reader = createRowReader(plan, { timeZone: 'UTC' });
    reader.push(['2025-06-21T12:00:00Z', '-20'], 2);
    reader.push(['2025-06-21T12:15:00Z', String(-edgeKW)], 3);
    reader.push(['2025-06-21T12:30:00Z', '-5'], 4);
    const table = checkIntervalSequence(reader.finish(), 'none');
    const { result } = studyProfile({
      board: plan.board,
      drivers: planDrivers(plan),
      columns: driverColumns(plan, table.values, table.count),
      utcMs: table.utcMs,
      intervalMs: table.intervalMs,
      sequence: table.report,
      undriven: { loads: plan.undriven, atRating: plan.undrivenAtRating },
    });
    // One 15-minute interval above: the one a solve of it calls over (solveBoard(farm(20)) above).
    expect(result.before.hoursVoltageHigh).toBe(0.25);
    expect(result.before.hoursVoltageLow).toBe(0);
    const text = renderProfileReport(result, 'EUR');
    expect(text).toMatch(/\n {2}A +102\.8 +2025-06-21 12:30 +110\.02 +2025-06-21 12:00/);
    expect(text).toContain('above 110 %: 0.25 h');
  });

  it('an installation scenario whose lowest voltage lies within round-off of profile.limits is within it; one 0.003 % below is outside, printed 98.557', () => {
    const spec = parseInstallation(readBoardText(readFileSync('examples/osier-mill-studios.yaml', 'utf8')));
    const { installation } = normaliseInstallation(spec);
    const profile = spec.profile!;
    // The pottery's lowest: 97.643 % on the firing night, 98.5567 % on the studio day.
    const studioDay = studyInstallationScenarios(installation, profile).boards[1]!.scenarios.find((s) => s.name === 'studio day')!.lowestVoltagePercent;
    expect(studioDay).toBeCloseTo(98.5567, 4);
    const at = (voltageLowPercent: number) => studyInstallationScenarios(installation, { ...profile, limits: { voltageLowPercent } });
    expect(at(studioDay + 0.0005).boards[1]!.outsideBand).toEqual(['firing night']);
    const past = at(98.56);
    expect(past.boards[1]!.outsideBand).toEqual(['firing night', 'studio day']);
    // At 0.1 the studio day's lowest would print 98.6, at 0.01 98.56: on or above the 98.56 edge it is outside of.
    const text = renderInstallationScenarioReport(past);
    expect(text).toMatch(/\n {2}studio day +.* 98\.557 +100\.8 /);
    expect(text).toContain('voltage outside 98.56-105 % (profile.limits) in: firing night, studio day');
  });
});
