/**
 * The lowest voltage an installation reports is the one its limits judge: a line-to-line welder pulls
 * its pair below the band while every phase voltage stays inside it. The totals, the board summary,
 * the one-line drawing and the scenario study read that voltage, so none of them sits beside an
 * UNDER verdict with a figure inside the band.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from '../cli/runTrivar.js';
import { normaliseInstallation, parseInstallation, renderOneLineDiagram, solveInstallation, studyInstallationScenarios, type InstallationSpec } from '@trivar/core';

const spec = {
  name: 'Welding bay check',
  supply: { voltage: '230/400', frequencyHz: 50, transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 } },
  conventions: { voltageLimits: { underPercent: 5, overPercent: 5 } },
  boards: [
    { name: 'Main', loads: [] },
    { name: 'Welding bay', fedFrom: 'Main', feeder: { lengthM: 60, line: { mm2: 25 }, neutral: { mm2: 25 } }, loads: [{ name: 'Welder', connection: 'A-B', kW: 52, pf: 0.9 }] },
  ],
  profile: { scenarios: [{ name: 'welding', hours: 2, loads: { Welder: 1 } }, { name: 'idle', hours: 22, loads: { Welder: 0 } }] },
} as unknown as InstallationSpec;

describe('the lowest voltage judged, not the lowest phase voltage', () => {
  const r = solveInstallation(spec);
  const bay = r.boards.find((b) => b.name === 'Welding bay')!.result;
  const ab = bay.lineToLine.find((l) => l.pair === 'A-B')!;

  it('totals name the line-to-line pair below the band, as the verdict does', () => {
    const phaseLowest = Math.min(...bay.phases.map((p) => p.voltagePercent));
    expect(phaseLowest).toBeGreaterThan(95); // every phase inside ±5 %
    expect(ab.voltagePercent).toBeLessThan(95);
    expect(bay.voltageCheck.verdict).toBe('under');
    expect(r.totals.lowestVoltagePercent).toBe(ab.voltagePercent);
    expect(r.totals.lowestVoltageBoard).toBe('Welding bay');
    expect(r.totals.lowestVoltageAt).toBe('line-to-line A-B');
  });

  it('the one-line drawing gives the board the same range', () => {
    const svg = renderOneLineDiagram(r);
    expect(svg).toContain(`data-min-voltage-percent="${ab.voltagePercent.toFixed(1)}"`);
  });

  it('the scenario study judges the pair too: the welding scenario is outside the band', () => {
    const { installation } = normaliseInstallation(parseInstallation(spec));
    const study = studyInstallationScenarios(installation, parseInstallation(spec).profile!);
    const board = study.boards.find((b) => b.board === 'Welding bay')!;
    const welding = board.scenarios.find((s) => s.name === 'welding')!;
    expect(welding.lowestVoltagePercent).toBeCloseTo(ab.voltagePercent, 6);
    expect(board.outsideBand).toEqual(['welding']);
  });
});

describe('interval data: hours outside the band count the line-to-line voltages', () => {
  it('three hours of welding are three hours below 95 %, the A-B row giving the lowest figure', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-judged-'));
    const { profile: _p, ...board } = spec as unknown as Record<string, unknown>;
    writeFileSync(join(dir, 'bay.json'), JSON.stringify(board));
    writeFileSync(join(dir, 'bay.csv'), 'time,Welder [x]\n2026-03-01T00:00,1\n2026-03-01T01:00,1\n2026-03-01T02:00,1\n');
    const out = runTrivar(['profile', join(dir, 'bay.json'), '--data', join(dir, 'bay.csv'), '--json']);
    expect(out.code).toBe(0);
    const result = JSON.parse(out.stdout) as { boards: { board: string; before: { hoursVoltageLow: number; voltages: { phase: string; minPercent: number }[] } }[] };
    const bay = result.boards.find((b) => b.board === 'Welding bay')!.before;
    expect(bay.hoursVoltageLow).toBe(3);
    const lowest = bay.voltages.reduce((a, b) => (b.minPercent < a.minPercent ? b : a));
    expect(lowest.phase).toBe('A-B');
    const solved = solveInstallation(spec).boards.find((b) => b.name === 'Welding bay')!.result;
    expect(lowest.minPercent).toBeCloseTo(solved.lineToLine[0]!.voltagePercent, 6);
  });
});
