/**
 * On a sub-board the correction compares the losses of that board's own feeder (BoardResult.losses), and
 * says so: "its feeder from <board>", not "source + feeder". Checked on the Offices board of the project's
 * Tannery Lane example against the installation solve's feeder reading.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { boardOfInstallation, compareCorrections, correctBoard, normaliseInstallation, parseInstallation, readBoardText, solveInstallationModel } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';
import { renderComparisonReport } from '../../packages/cli/src/format/comparisonReport.js';

const works = normaliseInstallation(parseInstallation(readBoardText(readFileSync(new URL('../../examples/tannery-lane-works.yaml', import.meta.url), 'utf8')))).installation;
const index = works.subBoards.findIndex((b) => b.name === 'Offices') + 1;
const offices = boardOfInstallation(works, index);

describe('losses compared on a sub-board', () => {
  it('are its own feeder’s, as the installation solve reads that feeder, and are labelled so', () => {
    const solved = solveInstallationModel(works);
    const feeder = solved.feeders.find((f) => f.board === 'Offices')!;
    const r = correctBoard(offices, { arrangement: 'star-bank' });
    expect(r.verification.before.incomer).not.toBeNull();
    expect(r.verification.before.losses.totalKW).toBeCloseTo(feeder.lossesKW, 9);
    expect(r.verification.before.losses.totalKW).toBeLessThan(solved.totals.lossesKW);
    const text = renderCorrectionReport(r);
    expect(text).toContain(`losses (its feeder from ${feeder.from}) ${r.verification.before.losses.totalKW.toFixed(3)} kW`);
    expect(text).not.toContain('source + feeder');
    const compared = renderComparisonReport(compareCorrections(offices, {})).replace(/\s+/g, ' ');
    expect(compared).toContain(`loss: its feeder from ${feeder.from} after`);
  });
});
