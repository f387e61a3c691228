/** `trivar profile` on an installation file: the interval data through every board and feeder at once. */
import { availableParallelism } from 'node:os';
import {
  checkIntervalSequence,
  driverColumns,
  installationBoardIndex,
  isKnownTimeZone,
  normaliseInstallation,
  parseInstallation,
  planDrivers,
  planInstallationColumns,
  studyInstallationProfile,
  type InstallationProfileStudy,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { writeResult } from '../writeResult.js';
import { readCsvHeader, readIntervalRows } from '../read/intervalCsv.js';
import { renderInstallationProfileReport } from '../format/installationProfileReport.js';
import { startProgress } from '../progress.js';
import type { ProfileCommandOptions } from './profile.js';

/** What installation files do not take yet, by option. */
const NOT_FOR_INSTALLATIONS: readonly [keyof ProfileCommandOptions, string][] = [
  ['correctionBank', '--correction-bank'],
  ['summaryCsv', '--summary-csv'],
  ['intervalsCsv', '--intervals-csv'],
  ['charts', '--charts'],
];

export async function runProfileInstallation(input: unknown, options: ProfileCommandOptions, io: CliIo): Promise<InstallationProfileStudy> {
  const spec = parseInstallation(input);
  const { installation } = normaliseInstallation(spec);
  for (const [key, option] of NOT_FOR_INSTALLATIONS)
    if (options[key] !== undefined && options[key] !== false) throw new UsageError(`${option} is not available for installation files yet (single board files only); leave it out to get the per-board report`);
  if (!options.data) throw new UsageError('give the interval data with --data <file.csv> (profile.scenarios are read on single board files only)');
  if (options.board !== undefined && !options.bank) throw new UsageError('--board places the bank: give --bank too');
  // Checked before any data is read, so the error names the option.
  installationBoardIndex(installation, options.board, '--board');
  const zone = options.timeZone ?? 'UTC';
  if (!isKnownTimeZone(zone)) throw new UsageError(`--time-zone: "${zone}" is not a time zone this system knows (expected an IANA name such as Europe/Lisbon or America/Chicago)`);
  const plan = planInstallationColumns(installation, readCsvHeader(options.data), {
    ...(spec.profile?.groups ? { groups: spec.profile.groups } : {}),
    undrivenAtRating: options.unlistedAtRating ?? false,
  });
  const progress = startProgress(io);
  let study: InstallationProfileStudy;
  try {
    progress.stage('reading', 1);
    const threads = options.threads ?? Math.min(2, availableParallelism());
    const raw = await readIntervalRows(options.data, plan, { timeZone: zone }, threads);
    const table = checkIntervalSequence(raw, options.fillGaps ?? 'none');
    study = studyInstallationProfile(
      {
        installation,
        loads: plan.board.loads,
        loadBoards: plan.loadBoards,
        drivers: planDrivers(plan),
        columns: driverColumns(plan, table.values, table.count),
        utcMs: table.utcMs,
        intervalMs: table.intervalMs,
        sequence: table.report,
        undriven: { loads: plan.undriven, atRating: plan.undrivenAtRating },
        ...(spec.profile ? { profile: spec.profile } : {}),
      },
      {
        timeZone: zone,
        bank: options.bank ?? false,
        ...(options.board !== undefined ? { bankBoard: options.board } : {}),
        ...(options.pf !== undefined ? { targetPf: options.pf } : {}),
        onProgress: (stage, done, total) => progress.stage(stage === 'solve' ? 'solving' : 'bank', total, done),
      },
    );
  } finally {
    progress.stop();
  }
  writeResult(io, study.result, options.json, (r) => renderInstallationProfileReport(r, spec.profile?.tariff?.currency ?? 'units'));
  return study;
}
