/** `trivar profile`: interval data (or the board file's scenarios) through the batch solver. */
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import {
  checkIntervalSequence,
  conventionsOf,
  labellerOf,
  type SwitchingFromBank,
  driverColumns,
  normaliseBoard,
  parseBoard,
  planColumns,
  planDrivers,
  readBoardText,
  studyProfile,
  studyScenarios,
  type GapFill,
  type ProfileStudy,
  type InstallationProfileStudy,
  InputError,
  isInstallationInput,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { profileCollapseOf, UsageError } from '../exitCodes.js';
import { inFileSection } from './correct.js';
import { boardCorrection, switchedBankOf } from './fileCorrectionStudy.js';
import { assertNotInput, makeOutputFolder, writeOutputFile } from '../outputFiles.js';
import { writeResult } from '../writeResult.js';
import { readCsvHeader, readIntervalRows } from '../read/intervalCsv.js';
import { timeZoneOption } from '../read/timeZoneOption.js';
import { renderProfileReport, renderScenarioReport } from '../format/profileReport.js';
import { intervalCsv, summaryCsv } from '../format/profileCsv.js';
import { CHART_FILES, writeProfileCharts } from '../format/profileChartFiles.js';
import { startProgress } from '../progress.js';

export interface ProfileCommandOptions {
  readonly data?: string;
  readonly timeZone?: string;
  readonly fillGaps?: GapFill;
  readonly unlistedAtRating?: boolean;
  readonly bank?: boolean;
  readonly correctionBank?: boolean;
  readonly pf?: number;
  readonly json?: boolean;
  readonly summaryCsv?: string;
  readonly intervalsCsv?: string;
  readonly charts?: string;
  readonly threads?: number;
  /** Installation files: the board the bank goes on (default: the main board). */
  readonly board?: string;
}

/**
 * The options that only interval data gives a meaning to, each with what it does there: beside scenarios
 * (no --data) they are refused, naming the option, rather than left unused with no file written.
 */
const DATA_ONLY_OPTIONS: readonly (readonly [keyof ProfileCommandOptions, string, string])[] = [
  ['bank', '--bank', 'sizes and simulates a switched bank interval by interval'],
  ['correctionBank', '--correction-bank', "simulates the correction study's bank interval by interval"],
  ['board', '--board', 'places the simulated bank on a board'],
  ['pf', '--pf', 'sets the target of the simulated bank'],
  ['charts', '--charts', "draws the intervals' currents, power factor and load duration"],
  ['summaryCsv', '--summary-csv', "writes the intervals' peaks, hours and months"],
  ['intervalsCsv', '--intervals-csv', 'writes a row per interval'],
  ['fillGaps', '--fill-gaps', "fills gaps between the data's rows"],
  ['timeZone', '--time-zone', "reads the data's times and sorts them into calendar months"],
  ['unlistedAtRating', '--unlisted-at-rating', 'keeps the loads no data column drives at their rating (a scenario\'s `others` does that)'],
];

/** @throws {UsageError} for the first option given that only interval data gives a meaning to (scenarios have no intervals). */
export function refuseDataOnlyOptions(options: ProfileCommandOptions): void {
  for (const [key, option, does] of DATA_ONLY_OPTIONS)
    if (options[key] !== undefined && options[key] !== false)
      throw new UsageError(`${option} works on interval data (it ${does}): give --data <file.csv>, or leave ${option} out to run the file's profile.scenarios, which have no intervals`);
}

/** @throws {UsageError} for --pf with no bank to take it (it would be read by nothing). */
export function refusePfWithoutBank(options: ProfileCommandOptions): void {
  if (options.pf !== undefined && !options.bank && !options.correctionBank)
    throw new UsageError('--pf sets the target of the bank --bank sizes and simulates over the data: give --bank too, or leave --pf out (no bank is simulated without it)');
}

/**
 * Reads the interval data and runs the profile study on a parsed board (no files written);
 * `trivar profile` and `trivar report --profile-data` share it.
 */
/**
 * The bank the correction study designs for this board (what `trivar correct` prints for the
 * board file's correction section), as simulator steps and controller settings.
 */
export function designedBankOf(spec: ReturnType<typeof parseBoard>, board: ReturnType<typeof normaliseBoard>): SwitchingFromBank {
  // No correction section: the study's defaults, as trivar correct runs on such a file (the output says so).
  const study = spec.correction ?? {};
  const point = spec.correction?.target?.measuredAt;
  if (point !== undefined && point !== board.name)
    throw new UsageError(
      `--correction-bank: the correction section measures its target at ${JSON.stringify(point)} (target.measuredAt); on a board file the simulated controller reads the board's own incomer, so write the board as an installation file with this one board under boards: to have it read there`,
    );
  let corrected;
  try {
    corrected = boardCorrection(board, study, '--correction-bank', spec);
  } catch (error) {
    throw inFileSection(error);
  }
  return switchedBankOf(corrected, '--correction-bank', spec.correction === undefined);
}

export async function computeProfileStudy(spec: ReturnType<typeof parseBoard>, data: string, options: ProfileCommandOptions, io: CliIo): Promise<ProfileStudy> {
  const board = normaliseBoard(spec);
  if (options.correctionBank && options.bank) throw new UsageError('give either --bank (a bank sized from the profile) or --correction-bank (the correction study\'s bank), not both');
  if (options.correctionBank && options.pf !== undefined)
    throw new UsageError('--pf sets the target of a bank sized from the profile; the correction study\'s bank keeps the target of the board file\'s correction section');
  refusePfWithoutBank(options);
  const designedBank = options.correctionBank ? designedBankOf(spec, board) : undefined;
  const zone = timeZoneOption(options.timeZone);
  const plan = planColumns(board, readCsvHeader(data), { ...(spec.profile?.groups ? { groups: spec.profile.groups } : {}), undrivenAtRating: options.unlistedAtRating ?? false });
  const progress = startProgress(io);
  // Stop the bar on every way out, or its timer keeps the process alive and the cursor hidden.
  try {
    progress.stage('reading', 1);
    const threads = options.threads ?? Math.min(2, availableParallelism());
    const raw = await readIntervalRows(data, plan, { timeZone: zone }, threads);
    const table = checkIntervalSequence(raw, options.fillGaps ?? 'none');
    const drivers = planDrivers(plan);
    const columns = driverColumns(plan, table.values, table.count);
    return studyProfile(
      {
        board: plan.board,
        drivers,
        columns,
        utcMs: table.utcMs,
        intervalMs: table.intervalMs,
        rowHours: table.rowHours,
        sequence: table.report,
        undriven: { loads: plan.undriven, atRating: plan.undrivenAtRating },
        columnNotes: plan.notes ?? [],
        ...(spec.profile ? { profile: spec.profile } : {}),
      },
      {
        timeZone: zone,
        bank: options.bank ?? false,
        ...(designedBank ? { designedBank } : {}),
        ...(options.pf !== undefined ? { targetPf: options.pf } : {}),
        onProgress: (stage, done, total) => progress.stage(stage === 'solve' ? 'solving' : 'bank', total, done),
      },
    );
  } finally {
    progress.stop();
  }
}

export async function runProfile(file: string, options: ProfileCommandOptions, io: CliIo): Promise<ProfileStudy | InstallationProfileStudy | null> {
  const input = readBoardText(await io.readSource(file));
  if (isInstallationInput(input)) {
    const { runProfileInstallation } = await import('./profileInstallation.js');
    return runProfileInstallation(input, options, io, [file]);
  }
  if (options.board !== undefined)
    throw new InputError(
      [{ code: 'not_applicable', path: '', expected: 'an installation file (with boards:) for --board', message: '--board applies to installation files (with boards:), and this is a single board' }],
      'the options do not fit the file',
    );
  const spec = parseBoard(input);
  const board = normaliseBoard(spec);
  // Tables, CSV columns and chart series name lines and phases the way the board file does.
  const label = labellerOf(conventionsOf(board).phaseNames);
  timeZoneOption(options.timeZone); // a bad --time-zone is refused even where no data is read
  if (!options.data) {
    if (!spec.profile?.scenarios) throw new UsageError('give the interval data with --data <file.csv>, or scenarios under profile.scenarios in the board file (see trivar profile --help)');
    refuseDataOnlyOptions(options);
    const result = studyScenarios(board, spec.profile);
    writeResult(io, result, options.json, (r) => renderScenarioReport(r, label));
    return null;
  }
  const chartFiles = options.charts ? CHART_FILES.map((name) => join(options.charts!, name)) : [];
  assertNotInput([options.summaryCsv, options.intervalsCsv, ...chartFiles].filter((x): x is string => x !== undefined), [file, options.data]);
  const study = await computeProfileStudy(spec, options.data, options, io);
  const currency = spec.profile?.tariff?.currency ?? 'units';
  if (options.summaryCsv) writeOutputFile(options.summaryCsv, summaryCsv(study.result, label, currency));
  if (options.intervalsCsv) writeOutputFile(options.intervalsCsv, intervalCsv(study, label));
  if (options.charts) {
    makeOutputFolder(options.charts);
    writeProfileCharts(study, (name, text) => writeOutputFile(join(options.charts!, name), text), label);
  }
  writeResult(io, study.result, options.json, (r) => renderProfileReport(r, currency, label));
  const collapse = profileCollapseOf([study.result.before, study.result.bank?.after], '');
  if (collapse) throw collapse;
  return study;
}
