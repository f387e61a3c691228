/**
 * A file with harmonic spectra: the rebalancing neutral figures are the fundamental's, and the
 * triplen orders stay whatever moves. The report says so and gives the neutral's rms now and after
 * from the harmonic study, against its rating.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { installationInService, parseInstallation, readBoardText, rebalanceInstallation, studyInstallationHarmonics, rewriteBoardText, withHarmonicNeutral, normaliseBoard, parseBoard, rebalanceBoard } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const file = 'examples/harrow-yard-studios.yaml';
const text = readFileSync(new URL(`../../${file}`, import.meta.url), 'utf8');

describe('rebalance: neutral with harmonics', () => {
  // As trivar rebalance has it: the file's banks in service.
  const spec = parseInstallation(readBoardText(text));
  const plain = rebalanceInstallation(installationInService(spec), spec.rebalance ?? {}, { moveTable: false });
  const report = withHarmonicNeutral(plain, text);

  it('gives each board\'s neutral rms now and after, the harmonic study\'s figures (Studios ground 178.3 → 177.7 A, 162 % of 110 A)', () => {
    const ground = report.harmonicNeutral!.find((n) => n.board === 'Studios ground')!;
    expect(ground.ratingA).toBe(110);
    expect(ground.before.rmsA).toBeCloseTo(178.33, 2);
    expect(ground.after.rmsA).toBeCloseTo(177.7, 1);
    expect(ground.before.loadingPercent).toBeCloseTo(162.1, 1);
    // The fundamental neutral the rebalancing tables show falls from 14.9 to 2.7 A; the rms hardly moves.
    const fundamental = report.conditions.find((c) => c.board === 'Studios ground')!.solved;
    expect(fundamental.before.neutralA).toBeCloseTo(14.9, 1);
    expect(fundamental.after.neutralA).toBeCloseTo(2.7, 1);
    // Those are trivar harmonics' own figures on the file before and after the moves.
    const after = studyInstallationHarmonics(readBoardText(rewriteBoardText(text, report.moves))).boards.find((b) => b.board === 'Studios ground')!;
    expect(ground.after.rmsA).toBe(after.neutral!.current.rms);
    expect(ground.after.triplenA).toBe(after.triplenNeutralA);
  });

  it('says the figures are the fundamental only and the triplen currents are not moved (no note before)', () => {
    expect(plain.notes.some((n) => n.includes('fundamental only'))).toBe(false);
    const note = report.notes.at(-1)!;
    expect(note).toMatch(/^The loads have harmonic spectra: the neutral currents above are the fundamental only\. The triplen orders \(3, 9, 15…\) add in the neutral whatever line a circuit is on/);
    expect(note).toContain('"Studios ground" 178.3 → 177.7 A (162 % → 162 % of its 110 A rating: still above it)');
  });

  it('a file without harmonic data is left as it is', () => {
    const flats = readFileSync(new URL('../../examples/larkspur-court-flats.yaml', import.meta.url), 'utf8');
    const board = parseBoard(readBoardText(flats));
    const r = rebalanceBoard(normaliseBoard(board), board.rebalance ?? {}, { moveTable: false });
    expect(withHarmonicNeutral(r, flats)).toBe(r);
  });

  it('the CLI carries it in the text and the JSON', () => {
    const json = runTrivar(['rebalance', file, '--no-table', '--json']);
    expect(json.code).toBe(0);
    const r = JSON.parse(json.stdout) as typeof report;
    expect(r.harmonicNeutral!.map((n) => n.board)).toEqual(['Main switchboard', 'Workshop', 'Studios ground', 'Studios upper']);
    const shown = runTrivar(['rebalance', file, '--no-table']);
    expect(shown.stdout).toContain('the neutral currents above are the fundamental only');
  });
});
