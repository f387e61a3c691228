/**
 * `trivar correct` on a board file with harmonic data: the bank checked by scan and duty, with
 * detuned variants. Its own module, imported by correct.ts only for such files, so a plain
 * correction does not load the harmonic study.
 */
import {
  compareInstallationWithHarmonics,
  compareWithHarmonics,
  correctInstallationWithHarmonics,
  correctWithHarmonics,
  resolveInstallationHarmonics,
  type Board,
  type BoardSpec,
  type CorrectInstallationOptions,
  type HarmonicComparison,
  type HarmonicCorrectionReport,
  type HarmonicsInstallationSpec,
  type Installation,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import type { CorrectOutcome } from './correct.js';
import { writeResult } from '../writeResult.js';
import { renderCorrectionReport } from '../format/correctionReport.js';
import { renderComparisonHarmonics, renderCorrectionHarmonics } from '../format/correctionHarmonicsReport.js';
import { comparedBoard, renderComparisonReport, tableNames } from '../format/comparisonReport.js';
import { renderInstallationComparisonWithHarmonics, renderInstallationCorrectionWithHarmonics } from '../format/installationCorrectionReport.js';

/** How the text report restates a result before it is rendered (correct.ts: warnings name where a value came from). */
type Restate = <T>(result: T) => T;

/** Every arrangement compared, each with its harmonic check; writes the result. */
export function writeComparisonWithHarmonics(spec: BoardSpec, board: Board, study: Record<string, unknown>, json: boolean | undefined, io: CliIo, named: Restate = (r) => r): HarmonicComparison {
  const comparison = compareWithHarmonics(spec, board, study);
  writeResult(io, comparison, json, (shown: HarmonicComparison) => {
    const c = named(shown);
    return renderComparisonReport(c) + renderComparisonHarmonics(c.harmonics, tableNames(comparedBoard(c)));
  });
  return comparison;
}

/** One arrangement with its harmonic check; writes the result. */
export function writeCorrectionWithHarmonics(spec: BoardSpec, board: Board, study: Record<string, unknown>, json: boolean | undefined, io: CliIo, named: Restate = (r) => r): HarmonicCorrectionReport {
  const checked = correctWithHarmonics(spec, board, study);
  writeResult(io, checked, json, (shown: HarmonicCorrectionReport) => {
    const r = named(shown);
    return renderCorrectionReport(r) + renderCorrectionHarmonics(r.harmonics);
  });
  return checked;
}

/** Throws the installation file's harmonics-section errors (a bank on an unknown board…) at their paths. */
export function checkHarmonicsSection(spec: HarmonicsInstallationSpec): void {
  resolveInstallationHarmonics(spec);
}

/**
 * An installation file: the bank on its board with its harmonic check — the arrangement the study names,
 * or every arrangement compared; writes the result.
 */
export function writeInstallationWithHarmonics(
  spec: HarmonicsInstallationSpec,
  installation: Installation,
  study: Record<string, unknown>,
  placement: CorrectInstallationOptions,
  json: boolean | undefined,
  io: CliIo,
  named: Restate = (r) => r,
): CorrectOutcome {
  if (study.arrangement === undefined) {
    const compared = compareInstallationWithHarmonics(spec, installation, study, placement);
    writeResult(io, compared, json, (r) => renderInstallationComparisonWithHarmonics(named(r)));
    return { kind: 'comparison', comparison: compared.comparison };
  }
  const corrected = correctInstallationWithHarmonics(spec, installation, study, placement);
  writeResult(io, corrected, json, (r) => renderInstallationCorrectionWithHarmonics(named(r)));
  return { kind: 'single', report: corrected.report };
}
