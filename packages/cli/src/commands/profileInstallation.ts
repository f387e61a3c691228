/** `trivar profile` on an installation file: the interval data through every board and feeder at once. */
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import {
  judgedNominalOf,
  boardSectionIds,
  checkIntervalSequence,
  driverColumns,
  type Installation,
  type SwitchingFromBank,
  installationBoardIndex,
  labellerOf,
  installationInService,
  withoutBankOn,
  listedBanksInService,
  parseInstallation,
  planDrivers,
  planInstallationColumns,
  studyInstallationProfile,
  studyInstallationScenarios,
  conventionsOf,
  type InstallationProfileStudy,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { profileCollapseOf, UsageError } from '../exitCodes.js';
import { boardIndexOption } from './boardIndexOption.js';
import { writeResult } from '../writeResult.js';
import { readCsvHeader, readIntervalRows } from '../read/intervalCsv.js';
import { timeZoneOption } from '../read/timeZoneOption.js';
import { renderInstallationProfileReport, renderInstallationScenarioReport } from '../format/installationProfileReport.js';
import { startProgress } from '../progress.js';
import { assertNotInput, makeOutputFolder, writeOutputFile } from '../outputFiles.js';
import { installationIntervalCsv, installationSummaryCsv } from '../format/profileCsv.js';
import { CHART_FILES, FEEDER_CHART_FILE, writeInstallationProfileCharts } from '../format/profileChartFiles.js';
import { refuseDataOnlyOptions, refusePfWithoutBank, type ProfileCommandOptions } from './profile.js';
import { inFileSection } from './correct.js';
import { installationCorrection, switchedBankOf } from './fileCorrectionStudy.js';

/** A folder per board for its charts, named after the board (`Mill intake` → `mill-intake`), unique. */
export function chartFolders(names: readonly string[]): Map<string, string> {
  const ids = boardSectionIds(names);
  return new Map(names.map((n) => [n, ids.get(n)!.replace(/^board-/, '')]));
}

/**
 * The bank trivar correct designs for the installation (its correction section, on the board
 * `--board` or `correction.board` names), as simulator steps and controller settings.
 */
function designedInstallationBank(
  spec: ReturnType<typeof parseInstallation>,
  installation: Installation,
  boardOption: string | undefined,
): { bank: SwitchingFromBank; board: string | undefined; measuredAt: string | undefined } {
  // No correction section: the study's defaults on the main board (or --board), as trivar correct runs on such a file.
  const { board: fileBoard, ...study } = spec.correction ?? {};
  if (fileBoard !== undefined) installationBoardIndex(installation, fileBoard, 'correction.board');
  const board = boardOption ?? fileBoard;
  let studied;
  try {
    studied = installationCorrection(installation, study, board, '--correction-bank');
  } catch (error) {
    throw inFileSection(error);
  }
  // The controller reads where the study's target is measured (target.measuredAt), as trivar correct sets it up.
  return { bank: switchedBankOf(studied, '--correction-bank', spec.correction === undefined), board, measuredAt: studied.measuredAt };
}

/** The file's `profile.scenarios` through every board at once (no interval data). */
function runInstallationScenarios(spec: ReturnType<typeof parseInstallation>, installation: Installation, options: ProfileCommandOptions, io: CliIo): null {
  if (!spec.profile?.scenarios)
    throw new UsageError('give the interval data with --data <file.csv>, or scenarios under profile.scenarios in the installation file (see trivar profile --help)');
  refuseDataOnlyOptions(options);
  const result = studyInstallationScenarios(installation, spec.profile);
  writeResult(io, result, options.json, (r) => renderInstallationScenarioReport(r, labellerOf(conventionsOf(installation.main).phaseNames)));
  return null;
}

/**
 * Reads the interval data and runs the profile study on a parsed installation (no files written);
 * `trivar profile` and `trivar report --profile-data` share it.
 */
export async function computeInstallationProfileStudy(
  spec: ReturnType<typeof parseInstallation>,
  inService: Installation,
  data: string,
  options: ProfileCommandOptions,
  io: CliIo,
): Promise<InstallationProfileStudy> {
  let installation = inService;
  if (options.board !== undefined && !options.bank && !options.correctionBank) throw new UsageError('--board places the bank: give --bank or --correction-bank too');
  if (options.correctionBank && options.bank) throw new UsageError('give either --bank (a bank sized from the profile) or --correction-bank (the correction study\'s bank), not both');
  if (options.correctionBank && options.pf !== undefined)
    throw new UsageError('--pf sets the target of a bank sized from the profile; the correction study\'s bank keeps the target of the file\'s correction section');
  refusePfWithoutBank(options);
  // Checked before any data is read, so the error names the option.
  boardIndexOption(installation, options.board, '--board');
  const designed = options.correctionBank ? designedInstallationBank(spec, installation, options.board) : undefined;
  const bankBoard = options.board ?? designed?.board;
  // The bank simulated takes the place of the file's bank in service on its board, as in trivar correct.
  const bankAt = options.bank || designed ? installationBoardIndex(installation, bankBoard, '--board') : null;
  const replacedBank = bankAt === null ? undefined : listedBanksInService(installation)[installation.banksInService?.findIndex((b) => b.boardIndex === bankAt) ?? -1];
  if (bankAt !== null) installation = withoutBankOn(installation, bankAt);
  const zone = timeZoneOption(options.timeZone);
  const plan = planInstallationColumns(installation, readCsvHeader(data), {
    ...(spec.profile?.groups ? { groups: spec.profile.groups } : {}),
    undrivenAtRating: options.unlistedAtRating ?? false,
  });
  const progress = startProgress(io);
  try {
    progress.stage('reading', 1);
    const threads = options.threads ?? Math.min(2, availableParallelism());
    const raw = await readIntervalRows(data, plan, { timeZone: zone }, threads);
    const table = checkIntervalSequence(raw, options.fillGaps ?? 'none');
    return studyInstallationProfile(
      {
        installation,
        loads: plan.board.loads,
        loadBoards: plan.loadBoards,
        drivers: planDrivers(plan),
        columns: driverColumns(plan, table.values, table.count),
        utcMs: table.utcMs,
        intervalMs: table.intervalMs,
        rowHours: table.rowHours,
        sequence: table.report,
        undriven: { loads: plan.undriven, atRating: plan.undrivenAtRating },
        columnNotes: plan.notes ?? [],
        ...(spec.profile ? { profile: spec.profile } : {}),
        ...(replacedBank ? { replacedBank } : {}),
      },
      {
        timeZone: zone,
        bank: options.bank ?? false,
        ...(bankBoard !== undefined ? { bankBoard } : {}),
        ...(designed ? { designedBank: designed.bank } : {}),
        ...(designed?.measuredAt !== undefined ? { measuredAt: designed.measuredAt, measuredAtPath: 'correction.target.measuredAt' } : {}),
        ...(options.pf !== undefined ? { targetPf: options.pf } : {}),
        onProgress: (stage, done, total) => progress.stage(stage === 'solve' ? 'solving' : 'bank', total, done),
      },
    );
  } finally {
    progress.stop();
  }
}

export async function runProfileInstallation(input: unknown, options: ProfileCommandOptions, io: CliIo, inputs: readonly string[] = []): Promise<InstallationProfileStudy | null> {
  const spec = parseInstallation(input);
  // As trivar solve has it: the banks the file lists under harmonics.banks in service.
  const installation = installationInService(spec);
  if (!options.data) return runInstallationScenarios(spec, installation, options, io);
  const folders = chartFolders([installation.main.name, ...installation.subBoards.map((b) => b.name)]);
  const chartFiles = options.charts ? [...[...folders.values()].flatMap((f) => CHART_FILES.map((name) => join(options.charts!, f, name))), join(options.charts, FEEDER_CHART_FILE)] : [];
  assertNotInput([options.summaryCsv, options.intervalsCsv, ...chartFiles].filter((x): x is string => x !== undefined), [...inputs, options.data]);
  const study = await computeInstallationProfileStudy(spec, installation, options.data, options, io);
  const label = labellerOf(study.result.phaseNames);
  if (options.summaryCsv) writeOutputFile(options.summaryCsv, installationSummaryCsv(study.result, label, spec.profile?.tariff?.currency ?? 'units'));
  if (options.intervalsCsv) writeOutputFile(options.intervalsCsv, installationIntervalCsv(study, judgedNominalOf(installation.main).ln, label));
  if (options.charts) {
    const dir = options.charts;
    for (const folder of folders.values()) makeOutputFolder(join(dir, folder));
    writeInstallationProfileCharts(study, (board, name, text) => writeOutputFile(board === null ? join(dir, name) : join(dir, folders.get(board)!, name), text), label);
  }
  writeResult(io, study.result, options.json, (r) => renderInstallationProfileReport(r, spec.profile?.tariff?.currency ?? 'units'));
  const collapsed = study.result.boards.filter((b) => (b.before.hoursCollapsed > 0 || (b.after?.hoursCollapsed ?? 0) > 0));
  const collapse = profileCollapseOf(collapsed.flatMap((b) => [b.before, b.after]), collapsed.length ? ` (${collapsed.map((b) => b.board).join(', ')})` : '');
  if (collapse) throw collapse;
  return study;
}
