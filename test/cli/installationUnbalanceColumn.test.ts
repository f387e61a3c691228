/**
 * The Boards table of `trivar solve` on an installation has a voltage unbalance column only where a board can
 * fill it: a split-phase board has one line-to-line voltage, so no index of three. A 120/240 V installation
 * printed the column blank on every row under a legend about "the average of the three". Where some boards
 * have no index and others do, the column says "-" for them and the legend says which boards it applies to.
 *
 * Invented: Cedar Gap farm, a 120/240 V service on an ideal source: the farmhouse (a 5 kW dryer across A-B, a
 * 1.8 kW kitchen on A-N) feeding a barn 60 m on (a 6 kW welder across A-B at PF 0.8, 2.4 kW of heat lamps on B-N).
 * Hand solve (an independent complex nodal solve of the same circuit): farmhouse feeder A 62.9 A, B 67.0 A,
 * N 4.3 A; barn feeder A 30.5 A, B 47.4 A, N 19.2 A, worst drop 3.24 % (line B); losses 0.289 kW.
 */
import { describe, expect, it } from 'vitest';
import { solveInstallation } from '@trivar/core';
import { runTrivar } from './runTrivar.js';
import { renderInstallationReport } from '../../packages/cli/src/format/installationReport.js';

const FARM = {
  name: 'Cedar Gap farm',
  supply: { voltage: '120/240', frequencyHz: 60 },
  boards: [
    {
      name: 'Farmhouse',
      feeder: { line: { lengthM: 30, rOhmPerKm: 0.3, xOhmPerKm: 0.1, ratingA: 200 }, neutral: { lengthM: 30, rOhmPerKm: 0.3, xOhmPerKm: 0.1, ratingA: 200 } },
      loads: [
        { name: 'Dryer', connection: 'A-B', model: 'constant-impedance', kW: 5 },
        { name: 'Kitchen', connection: 'A-N', model: 'constant-impedance', kW: 1.8 },
      ],
    },
    {
      name: 'Barn',
      fedFrom: 'Farmhouse',
      feeder: { line: { lengthM: 60, rOhmPerKm: 1.0, xOhmPerKm: 0.1, ratingA: 60 }, neutral: { lengthM: 60, rOhmPerKm: 1.0, xOhmPerKm: 0.1, ratingA: 60 } },
      loads: [
        { name: 'Welder', connection: 'A-B', model: 'constant-impedance', kW: 6, pf: 0.8 },
        { name: 'Heat lamps', connection: 'B-N', model: 'constant-impedance', kW: 2.4 },
      ],
    },
  ],
};

const section = (out: string, heading: string) => out.slice(out.indexOf(`\n${heading}\n`), out.indexOf('\n\n', out.indexOf(`\n${heading}\n`) + 1));

describe('the Boards table on a split-phase installation', () => {
  it('has no unbalance column and no legend for it; the figures stay the hand solve’s', () => {
    const r = runTrivar(['solve', '-'], JSON.stringify(FARM));
    expect(r.code).toBe(0);
    const boards = section(r.stdout, 'Boards');
    expect(boards).toMatch(/board +min %nom +max %nom +N A +own kW +own kvar +fed kW +limits +warnings/);
    expect(r.stdout).not.toMatch(/V unbal|VUF|average of the three/);
    expect(boards).toMatch(/Farmhouse +[\d.]+ +[\d.]+ +4\.3 +6\.73 /);
    expect(boards).toMatch(/└ Barn +96\.2 +[\d.]+ +19\.2 +7\.95 /);
    const feeders = section(r.stdout, 'Feeders');
    expect(feeders).toMatch(/Farmhouse +supply +62\.9 +67\.0 +4\.3 /);
    expect(feeders).toMatch(/Barn +Farmhouse +30\.5 +47\.4 +19\.2 +3\.24 /);
    expect(r.stdout).toMatch(/losses +0\.289 kW/);
  });

  it('where only some boards have an index, the others read "-" and the legend says three-phase boards only', () => {
    const yard = {
      name: 'Tamarack yard',
      supply: { system: 'three-phase-4wire', voltage: '480Y/277', frequencyHz: 60, transformer: { kVA: 150, impedancePercent: 5, xOverR: 4 } },
      boards: [
        { name: 'Main', loads: [{ name: 'head saw', connection: 'ABC-delta', kW: 30, pf: 0.85 }] },
        { name: 'Kiln', fedFrom: 'Main', feeder: { lengthFt: 200, line: { awg: '2' }, neutral: { awg: '2' } }, loads: [{ name: 'kiln heater', connection: 'A-B', kW: 40, pf: 1 }] },
      ],
    };
    const solved = solveInstallation(yard);
    const kiln = solved.boards[1]!.result.unbalance!;
    // A result whose kiln board has no index (as a split-phase board would have) beside a main board that has one.
    const mixed = { ...solved, boards: solved.boards.map((b) => (b.name === 'Kiln' ? { ...b, result: { ...b.result, unbalance: null } } : b)) };
    const out = renderInstallationReport(mixed, { detailed: [] });
    const boards = section(out, 'Boards');
    expect(boards).toContain('V unbal. %');
    expect(boards.split('\n').find((l) => l.includes('└ Kiln'))).toMatch(/ - +[\d.]+ /);
    expect(boards.split('\n').find((l) => l.includes('Main '))).toContain(` ${solved.boards[0]!.result.unbalance!.lineVoltageRatePercent.toFixed(2)} `);
    expect(boards.replace(/\s+/g, ' ')).toContain("V unbal.: the largest deviation of a line-to-line voltage from the average of the three, as % of that average (ANSI C84.1 Annex D, from memory), on three-phase boards only ('-': a board with no three line voltages);");
    // The whole file keeps the column on every board, with its figure and no such note.
    const whole = renderInstallationReport(solved, { detailed: [] });
    expect(section(whole, 'Boards').split('\n').find((l) => l.includes('└ Kiln'))).toContain(` ${kiln.lineVoltageRatePercent.toFixed(2)} `);
    expect(whole).not.toContain('three-phase boards only');
  });
});
