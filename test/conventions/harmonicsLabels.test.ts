/**
 * `trivar harmonics` labels phases, pairs and branches the way the board file names them: the
 * mill-street offices written with L1/L2/L3 gives the same figures as the A/B/C file, with every
 * table and warning in L-names and no A/B/C label left.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, studyHarmonics } from '@trivar/core';
import { renderHarmonicsReport } from '../../packages/cli/src/format/harmonicsReport.js';

const text = readFileSync(new URL('../../examples/mill-street-offices.yaml', import.meta.url), 'utf8');
const numbered = text
  .replace(/connection: ([ABC])-N/g, (_, p: string) => `connection: L${'ABC'.indexOf(p) + 1}-N`)
  .replace(/connection: ABC-(star|delta)/g, 'connection: L1L2L3-$1');

/** A phase, pair or branch label in A/B/C letters: a pair anywhere, "line A" in a sentence, a row label. */
const LETTERED = /(^|[\s(,])(?:[ABC]-[ABCN]\b|line [ABC]\b)|^ {2}[ABC] {2}/m;

describe('harmonics labels follow the file naming', () => {
  it('the L1/L2/L3 file reads as L-names with the same figures', () => {
    const lettered = studyHarmonics(readBoardText(text));
    const named = studyHarmonics(readBoardText(numbered));
    expect(numbered).not.toBe(text);
    expect(named.phaseNames).toBe('L1/L2/L3');
    expect(lettered.phaseNames).toBe('A/B/C');
    // Same physics: data keys stay A/B/C, figures equal.
    expect(named.lines.map((l) => l.current.rms)).toEqual(lettered.lines.map((l) => l.current.rms));
    const report = renderHarmonicsReport(named);
    expect(report).toMatch(/L1-N/);
    expect(report).toMatch(/line L1: TDD/);
    expect(report).not.toMatch(LETTERED);
    expect(named.warnings.map((w) => w.message).join('\n')).not.toMatch(LETTERED);
    // The lettered file keeps its letters.
    expect(renderHarmonicsReport(lettered)).toMatch(/line A: TDD/);
  });
});
