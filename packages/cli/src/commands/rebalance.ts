/** `trivar rebalance`: which circuits to move to which phase, on a board or any board of an installation; optional rewritten file. */
import { sameFile, writeOutputFile } from '../outputFiles.js';
import { availableParallelism } from 'node:os';
import {
  checkIntervalSequence,
  conditionsFromInstallationIntervals,
  conditionsFromIntervals,
  driverColumns,
  planColumns,
  planDrivers,
  planInstallationColumns,
  InputError,
  isInstallationInput,
  normaliseBoard,
  installationInService,
  parseBoard,
  parseInstallation,
  readBoardText,
  rebalanceBoard,
  rebalanceInstallation,
  rewriteBoardText,
  withHarmonicNeutral,
  type Board,
  type BoardSpec,
  type Installation,
  type InstallationIntervalConditions,
  type InstallationSpec,
  type IntervalConditions,
  type RebalanceOptions,
  type RebalanceReport,
} from '@trivar/core';
import { readCsvHeader, readIntervalRows } from '../read/intervalCsv.js';
import { timeZoneOption } from '../read/timeZoneOption.js';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { renderRebalanceReport } from '../format/rebalanceReport.js';
import { assertRebalanceOptionsFit, optionsError, rebalanceStudySpec as studySpec, type RebalanceStudyOptions } from './rebalanceStudyOptions.js';
import { writeResult } from '../writeResult.js';

export interface RebalanceCommandOptions extends RebalanceStudyOptions {
  readonly json?: boolean;
  readonly method?: 'auto' | 'exact' | 'local-search';
  readonly write?: string;
}

/** The interval table of `data` read against a column plan, with the command's time zone and spread checked. */
async function readIntervals<P extends Parameters<typeof planDrivers>[0]>(plan: P, data: string, o: RebalanceCommandOptions) {
  const zone = timeZoneOption(o.timeZone);
  if (o.spread !== undefined && !(Number.isInteger(o.spread) && o.spread >= 0 && o.spread <= 50))
    throw new UsageError(`--spread: expected a whole number from 0 to 50 (received ${o.spread})`);
  const raw = await readIntervalRows(data, plan, { timeZone: zone }, Math.min(2, availableParallelism()));
  const table = checkIntervalSequence(raw, 'none');
  return { drivers: planDrivers(plan), columns: driverColumns(plan, table.values, table.count), table, spread: o.spread !== undefined ? { spread: o.spread } : {} };
}

/** Interval data → representative intervals as load conditions (rule in core's intervalConditions.ts). */
async function intervalConditions(spec: BoardSpec, board: Board, data: string, o: RebalanceCommandOptions): Promise<IntervalConditions> {
  const plan = planColumns(board, readCsvHeader(data), spec.profile?.groups ? { groups: spec.profile.groups } : {});
  const { drivers, columns, table, spread } = await readIntervals(plan, data, o);
  return conditionsFromIntervals(plan.board, drivers, columns, table.utcMs, table.intervalMs, spread);
}

/** The same on an installation: loads named per board (core's installationColumns.ts), each sub-board feeder's peak picked too. */
async function installationIntervalConditions(spec: InstallationSpec, installation: Installation, data: string, o: RebalanceCommandOptions): Promise<InstallationIntervalConditions> {
  const groups = (spec as { profile?: { groups?: Record<string, string[]> } }).profile?.groups;
  const plan = planInstallationColumns(installation, readCsvHeader(data), groups ? { groups } : {});
  const { drivers, columns, table, spread } = await readIntervals(plan, data, o);
  return conditionsFromInstallationIntervals(installation, plan, drivers, columns, table.utcMs, table.intervalMs, spread);
}

export async function runRebalance(file: string, options: RebalanceCommandOptions, io: CliIo): Promise<RebalanceReport> {
  if (options.write !== undefined && options.data !== undefined && sameFile(options.write, options.data))
    throw new UsageError(`--write ${options.write}: that is the interval data being read; write the rebalanced board to another file`);
  if (options.write !== undefined && sameFile(options.write, file))
    throw new UsageError(`--write ${options.write}: that is the board file being read${file === '-' ? ' (from standard input)' : ''}; write the rebalanced board to another file`);
  const text = await io.readSource(file);
  const input = readBoardText(text);
  const search: RebalanceOptions = {
    ...(options.method ? { method: options.method } : {}),
    ...(options.table === false ? { moveTable: false } : {}),
  };
  let report: RebalanceReport;
  let fileSection: Record<string, unknown> | undefined;
  try {
    if (isInstallationInput(input)) {
      const spec = parseInstallation(input);
      fileSection = spec.rebalance as Record<string, unknown> | undefined;
      assertRebalanceOptionsFit(fileSection, options);
      const study = studySpec(spec.rebalance as Record<string, unknown> | undefined, options);
      // As trivar solve has it: the banks the file lists under harmonics.banks in service.
      const installation = installationInService(spec);
      if (options.data !== undefined) {
        const picked = await installationIntervalConditions(spec, installation, options.data, options);
        const { conditions: _c, ...rest } = study;
        report = rebalanceInstallation(picked.installation, rest, { ...search, loadConditions: picked.conditions });
      } else report = rebalanceInstallation(installation, study, search);
    } else {
      // A board file is one board: options that choose among an installation's boards have nothing to choose.
      for (const [flag, given] of [
        ['--boards', options.boards],
        ['--measure-at', options.measureAt],
      ] as const)
        if (given !== undefined)
          throw new UsageError(`${flag} chooses among an installation's boards; ${file === '-' ? 'this' : `"${file}"`} is a board file (one board, measured where it is): leave out ${flag}`);
      const spec = parseBoard(input);
      fileSection = spec.rebalance as Record<string, unknown> | undefined;
      assertRebalanceOptionsFit(fileSection, options);
      const study = studySpec(spec.rebalance as Record<string, unknown> | undefined, options);
      const board = normaliseBoard(spec);
      if (options.data !== undefined) {
        const picked = await intervalConditions(spec, board, options.data, options);
        const { conditions: _c, ...rest } = study;
        report = rebalanceBoard(picked.board, rest, { ...search, loadConditions: picked.conditions });
      } else report = rebalanceBoard(board, study, { ...search, profile: spec.profile });
    }
  } catch (error) {
    if (error instanceof InputError && error.heading.startsWith('the rebalancing study')) {
      // A problem an option brought in is the command line's (exit 2), named by the option.
      const fromOptions = optionsError(error, fileSection, options);
      if (fromOptions) throw fromOptions;
      throw new InputError(
        error.issues.map((i) => {
          const path = i.path.startsWith('profile.') ? i.path : i.path ? `rebalance.${i.path}` : 'rebalance';
          return { ...i, path, message: `${path}: ${i.message.slice(i.message.indexOf(': ') + 2)}` };
        }),
        'the rebalancing study is not valid (board file rebalance section or command-line options)',
      );
    }
    throw error;
  }
  // With harmonic data the neutral figures are the fundamental's: the note says so, with the rms now and after.
  report = withHarmonicNeutral(report, text);
  if (options.write !== undefined) writeOutputFile(options.write, rewriteBoardText(text, report.moves));
  writeResult(io, report, options.json, renderRebalanceReport);
  return report;
}
