/**
 * Two readings that must mean the same wherever they are printed:
 * - a source whose EMFs are entered per phase is described by those EMFs (solve's header and power
 *   balance, the report's facts), never as the nominal voltage it is not;
 * - a circuit's voltage is the one branch furthest from its nominal, in `trivar solve` and in the report.
 * Invented scenarios: a pumping station on a sagging rural supply (241 / 226 / 233 V as measured), and a
 * boathouse where a kettle bank on A pulls the star point so a star-connected winch sees A low and B high.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBoardReport, normaliseBoard, parseBoard, readBoardText, solveBoardModel, worstBranch } from '@trivar/core';
import { runTrivar } from './runTrivar.js';

const dir = mkdtempSync(join(tmpdir(), 'trivar-source-circuit-'));
const write = (name: string, text: string): string => {
  const file = join(dir, name);
  writeFileSync(file, text);
  return file;
};

const station = [
  'name: Tarn lane pumping station',
  'supply:',
  '  system: three-phase-4wire',
  '  voltage: { lineToLine: 400 }',
  '  frequencyHz: 50',
  '  emf:',
  '    A: { V: 241, angleDeg: 0 }',
  '    B: { V: 226, angleDeg: -119 }',
  '    C: { V: 233, angleDeg: 120.5 }',
  'loads:',
  '  - { name: Lift pump, connection: ABC-delta, kW: 5.5, pf: 0.86, model: constant-impedance }',
  '',
].join('\n');

const boathouse = [
  'name: Brackenridge boathouse',
  'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
  'feeder:',
  '  line: { lengthM: 40, rOhmPerKm: 0.5, xOhmPerKm: 0.08 }',
  '  neutral: { lengthM: 40, rOhmPerKm: 0.5, xOhmPerKm: 0.08 }',
  'loads:',
  '  - { name: Winch motor, connection: ABC-star, kW: 3, pf: 0.8, model: constant-impedance }',
  '  - { name: Kettle bank, connection: A-N, kW: 6, model: constant-impedance }',
  '',
].join('\n');

describe('a source entered per phase', () => {
  const file = write('station.yaml', station);

  it('solve describes the source by the EMFs entered, not the nominal, in the header and the power balance', () => {
    const out = runTrivar(['solve', file]).stdout;
    const header = out.split('\n\n')[0]!.replace(/\n +/g, ' ');
    expect(header).toContain('source as entered per phase, not the nominal: A 241 V ∠0°, B 226 V ∠-119°, C 233 V ∠120.5° (open-circuit EMF of each phase)');
    expect(header).toContain('limits are judged at the nominal 230/400 V');
    expect(header).not.toContain('source holds 230.9 V');
    const balance = out.slice(out.indexOf('Power balance')).replace(/\n +/g, ' ');
    expect(balance).toContain('ideal (zero source impedance: no transformer or impedance given): the EMFs entered per phase at its terminals whatever the load');
    expect(balance).not.toContain('nominal voltage at its terminals');
    // An ideal source: the board's phase A is the entered 241 V, 104.8 % of the 230 V nominal.
    expect(out).toMatch(/\n {2}A +241\.0 +0\.0 +104\.8 /);
  });

  it('the JSON result carries the EMFs as entered, and a file without them has none', () => {
    const r = solveBoardModel(normaliseBoard(parseBoard(readBoardText(station))));
    expect(r.board.sourceEmf?.map((e) => [e.phase, Number(e.magnitude.toFixed(6)), Number(e.angleDeg.toFixed(6))])).toEqual([
      ['A', 241, 0],
      ['B', 226, -119],
      ['C', 233, 120.5],
    ]);
    expect(solveBoardModel(normaliseBoard(parseBoard(readBoardText(boathouse)))).board.sourceEmf).toBeUndefined();
  });

  it('the report states the same EMFs', () => {
    const spec = parseBoard(readBoardText(station));
    const result = solveBoardModel(normaliseBoard(spec));
    const facts = buildBoardReport({ spec, result, correction: null }).sections[0]!.blocks[0]!;
    if (facts.kind !== 'facts') throw new Error('the first block is the facts');
    expect(facts.items.find(([k]) => k === 'Source voltages')?.[1]).toBe('as entered per phase: A 241 V ∠0°, B 226 V ∠-119°, C 233 V ∠120.5°');
  });
});

describe("a circuit's voltage", () => {
  const spec = parseBoard(readBoardText(boathouse));
  const result = solveBoardModel(normaliseBoard(spec));
  const winch = result.loads.find((l) => l.name === 'Winch motor')!;

  it('is the branch furthest from nominal: the winch sees A below and B further above', () => {
    const percents = winch.branches.map((b) => b.voltagePercent);
    // Hand check of the model: the kettle's current through line A and the neutral lowers A and raises B
    // and C; with a 400 V source (230.9 V to neutral) judged at 230 V, B sits about 0.5 % above nominal.
    expect(percents[0]).toBeCloseTo(99.92, 1);
    expect(percents[1]).toBeCloseTo(100.51, 1);
    expect(Math.abs(percents[1]! - 100)).toBeGreaterThan(Math.abs(percents[0]! - 100));
    expect(worstBranch(winch).voltagePercent).toBe(percents[1]);
  });

  it('solve and the report quote the same figure, and each says which it is', () => {
    const out = runTrivar(['solve', write('boathouse.yaml', boathouse)]).stdout;
    const row = out.split('\n').find((l) => l.startsWith('  Winch motor'))!;
    expect(row).toContain(` ${worstBranch(winch).voltagePercent.toFixed(1)} `);
    expect(out.replace(/\n +/g, ' ')).toContain('V: the voltage of the branch furthest from its nominal, above or below, as the report quotes it.');
    const schedule = buildBoardReport({ spec, result, correction: null }).sections.find((s) => s.id === 'schedule')!.blocks[0]!;
    if (schedule.kind !== 'table') throw new Error('the schedule is a table');
    const reportRow = schedule.rows.find((r) => r[1] === 'Winch motor')!;
    expect(reportRow[9]).toBe('100.5');
    expect(schedule.note).toContain('V %nom: the voltage across the part of the circuit furthest from its nominal, above or below');
  });
});
