/** `trivar harmonics`: the harmonic study of a board file (spectra, neutral, resonance scan, capacitor duty). */
import { readBoardText, studyHarmonics, type HarmonicsReport } from '@trivar/core';
import type { CliIo } from '../io.js';
import { renderHarmonicsReport } from '../format/harmonicsReport.js';

export interface HarmonicsCommandOptions {
  readonly json?: boolean;
}

export async function runHarmonics(file: string, options: HarmonicsCommandOptions, io: CliIo): Promise<HarmonicsReport> {
  const report = studyHarmonics(readBoardText(await io.readSource(file)));
  io.stdout(options.json ? `${JSON.stringify(report, null, 2)}\n` : renderHarmonicsReport(report));
  return report;
}
