/**
 * An installation's answer never contradicts itself: each board's voltage verdict agrees with its
 * voltage warnings, a feeder over its rating is warned about exactly when a line current exceeds it,
 * a circuit over its breaker likewise, and the totals add up (source = loads + losses).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildInstallationReport, parseInstallation, readBoardText, solveInstallation, type InstallationResult } from '@trivar/core';
import { expectClose } from '../support/tolerance.js';

const example = (file: string) => readBoardText(readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8'));
const SUPPLY = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;

/** Two boards: the sub-board's feeder rated 60 A carrying `kW` on phase A, its oven on a `breakerA` breaker. */
const stressed = (kW: number, breakerA: number) =>
  solveInstallation({
    supply: SUPPLY,
    boards: [
      { name: 'Main', loads: [] },
      {
        name: 'Bakehouse',
        fedFrom: 'Main',
        feeder: { lengthM: 60, line: { mm2: 10, ratingA: 60 }, neutral: { mm2: 10, ratingA: 60 } },
        loads: [{ name: 'oven', connection: 'A-N', kW, breakerA }],
      },
    ],
  });

function expectConsistent(r: InstallationResult) {
  for (const b of r.boards) {
    const res = b.result;
    const voltageWarnings = res.warnings.filter((w) => /voltage$/.test(w.code) && w.code !== 'voltage-unbalance');
    expect(res.voltageCheck.verdict === 'within', `${b.name}: verdict ${res.voltageCheck.verdict} against ${voltageWarnings.length} voltage warnings`).toBe(voltageWarnings.length === 0);
    const feeder = r.feeders.find((f) => f.board === b.name)!;
    const overRating = feeder.lines.some((l) => l.loadingPercent !== null && l.loadingPercent > 100);
    expect(res.warnings.some((w) => w.code === 'line-over-rating'), `${b.name}: line rating`).toBe(overRating);
    const overBreaker = res.loads.some((l) => l.breakerA !== null && l.currentA > l.breakerA);
    expect(res.warnings.some((w) => w.code === 'circuit-over-breaker'), `${b.name}: breakers`).toBe(overBreaker);
  }
  const { sourceKW, loadKW, lossesKW } = r.totals;
  expectClose(sourceKW, loadKW + lossesKW, { rel: 1e-9, abs: 1e-9 }, 'source = loads + losses');
  // What each feeder delivers = its board's loads + its own losses + what the board passes on.
  for (const b of r.boards) {
    const passedOn = r.boards.filter((c) => c.fedFrom === b.name).reduce((t, c) => t + c.result.source.kW, 0);
    const feeder = r.feeders.find((f) => f.board === b.name)!;
    expectClose(b.result.source.kW, b.result.totals.kW + feeder.lossesKW + passedOn, { rel: 1e-9, abs: 1e-9 }, `${b.name}: fed kW`);
  }
}

describe('an installation result agrees with itself', () => {
  it.each(['maple-court-riser.yaml', 'tannery-lane-works.yaml'])('%s', (file) => expectConsistent(solveInstallation(example(file))));
  it('a circuit over its breaker and a feeder over its rating are warned about; within them, not', () => {
    // 5 kW at about 230 V draws about 22 A: over a 16 A breaker, within a 25 A one.
    const over = stressed(5, 16);
    expectConsistent(over);
    const oven = over.boards[1]!.result.loads[0]!;
    expect(oven.currentA).toBeGreaterThan(16);
    expect(over.boards[1]!.result.warnings.find((w) => w.code === 'circuit-over-breaker')!.message).toMatch(/circuit "oven" draws 2\d\.\d A, above its 16 A breaker/);
    expectConsistent(stressed(5, 25));
    expect(stressed(5, 25).boards[1]!.result.warnings.map((w) => w.code)).not.toContain('circuit-over-breaker');
    // 16 kW on one phase: about 75 A in line A and the neutral, over the 60 A feeder, and a voltage dip.
    const heavy = stressed(16, 100);
    expectConsistent(heavy);
    expect(heavy.boards[1]!.result.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['line-over-rating', 'neutral-over-rating']));
  });
});

describe('units and labels the trade writes', () => {
  it('208Y/120 with AWG and kcmil feeders in feet: notation kept, sizes and lengths in their own units', () => {
    const spec = parseInstallation(
      readBoardText(`supply: { voltage: 208Y/120, frequencyHz: 60 }
boards:
  - { name: MDP, feeder: { lengthFt: 40, line: { kcmil: 350 }, neutral: { kcmil: 350 } }, loads: [] }
  - { name: Panel A, fedFrom: MDP, feeder: { lengthFt: 120, line: { awg: '1/0', material: aluminum }, neutral: { awg: '1/0', material: aluminum } }, loads: [{ name: dryers, connection: A-N, kW: 6 }] }
`),
    );
    const r = solveInstallation(spec);
    expect(r.boards[0]!.result.conventions.voltageNotation).toBe('208Y/120 V');
    expect(buildInstallationReport({ spec, result: r }).subtitle).toMatch(/ · 208Y\/120 V · 60 Hz$/);
    expect(r.feeders.map((f) => f.description)).toEqual(['350 kcmil Cu, 40 ft at 75 °C', '1/0 AWG Al, 120 ft at 75 °C']);
  });
  it.each([
    [{ system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, '230/400 V'], // the IEC 60038 pair, not 400/√3 = 230.9
    [{ voltage: '230/400', frequencyHz: 50 }, '230/400 V'],
    [{ system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 }, '120/240 V'],
    [{ system: 'three-phase-3wire', voltage: { lineToLine: 480 }, frequencyHz: 60 }, '480 V'],
  ])('supply %o is written %s in the installation report', (supply, words) => {
    const spec = parseInstallation({ supply, boards: [{ name: 'Main', loads: [{ name: 'x', connection: 'A-B', kW: 1 }] }] });
    // One board is "1 board", not "1 boards".
    expect(buildInstallationReport({ spec, result: solveInstallation(spec) }).subtitle).toBe(`Installation report · 1 board · ${words} · ${supply.frequencyHz} Hz`);
  });
  it('a feeder to an exporting board reports the phase whose voltage rises most, not its mildest', () => {
    // 34 kW of export on a 60 m, 10 mm² sub-feeder, 4 kW of it on phase B alone: phase B rises most.
    const r = solveInstallation({
      supply: { ...SUPPLY, transformer: { kVA: 200, impedancePercent: 4, xOverR: 3 } },
      boards: [
        { name: 'Main', feeder: { lengthM: 20, line: { mm2: 95 }, neutral: { mm2: 95 } }, loads: [{ name: 'house', connection: 'A-N', kW: 2, pf: 0.95 }] },
        { name: 'Roof', fedFrom: 'Main', feeder: { lengthM: 60, line: { mm2: 10 }, neutral: { mm2: 10 } }, loads: [{ name: 'PV', connection: 'ABC-star', kW: -30 }, { name: 'PV B', connection: 'B-N', kW: -4 }] },
      ],
    });
    const roof = r.feeders[1]!;
    const drops = roof.lines.map((l) => l.voltageDropPercent);
    expect(Math.max(...drops)).toBeLessThan(0); // every phase rises
    expect(roof.voltageDropPercent).toBe(Math.min(...drops));
    expect(roof.lines[1]!.voltageDropPercent).toBe(roof.voltageDropPercent);
    // Hand check (common practice, no source): phase B's rise is about (I_B + I_N)·R of 60 m of 10 mm² copper at 70 °C.
    expect(roof.voltageDropPercent).toBeLessThan(-3.5);
  });
});
