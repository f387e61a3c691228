/** `trivar profile`: interval data (or the board file's scenarios) through the batch solver. */
import { realpathSync, writeFileSync, mkdirSync, existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join, resolve } from 'node:path';
import {
  checkIntervalSequence,
  driverColumns,
  isKnownTimeZone,
  normaliseBoard,
  parseBoard,
  planColumns,
  planDrivers,
  readBoardText,
  studyProfile,
  type GapFill,
  type ProfileStudy,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { EXIT, UsageError } from '../exitCodes.js';
import { readCsvHeader, readIntervalRows } from '../read/intervalCsv.js';
import { renderProfileReport } from '../format/profileReport.js';
import { intervalCsv, summaryCsv } from '../format/profileCsv.js';
import { writeProfileCharts } from '../format/profileChartFiles.js';
import { startProgress } from '../progress.js';

export interface ProfileCommandOptions {
  readonly data?: string;
  readonly timeZone?: string;
  readonly fillGaps?: GapFill;
  readonly unlistedAtRating?: boolean;
  readonly bank?: boolean;
  readonly pf?: number;
  readonly json?: boolean;
  readonly summaryCsv?: string;
  readonly intervalsCsv?: string;
  readonly charts?: string;
  readonly threads?: number;
}

/** Refuses to write over an input file. */
function guardOutput(out: string, inputs: readonly string[]): string {
  const target = resolve(out);
  for (const input of inputs) {
    if (input === '-') continue;
    const a = existsSync(target) ? realpathSync(target) : target;
    if (existsSync(input) && realpathSync(input) === a) throw new UsageError(`refusing to write "${out}": it is an input file`);
  }
  return target;
}

export async function runProfile(file: string, options: ProfileCommandOptions, io: CliIo): Promise<ProfileStudy> {
  const spec = parseBoard(readBoardText(await io.readSource(file)));
  const board = normaliseBoard(spec);
  const zone = options.timeZone ?? 'UTC';
  if (!isKnownTimeZone(zone)) throw new UsageError(`--time-zone: "${zone}" is not a time zone this system knows (expected an IANA name such as Europe/Lisbon or America/Chicago)`);
  if (!options.data) throw new UsageError('give the interval data with --data <file.csv> (see trivar profile --help for the columns)');
  const inputs = [file, options.data];
  const outputs = {
    summary: options.summaryCsv ? guardOutput(options.summaryCsv, inputs) : null,
    intervals: options.intervalsCsv ? guardOutput(options.intervalsCsv, inputs) : null,
    charts: options.charts ? guardOutput(options.charts, inputs) : null,
  };
  const plan = planColumns(board, readCsvHeader(options.data), { ...(spec.profile?.groups ? { groups: spec.profile.groups } : {}), undrivenAtRating: options.unlistedAtRating ?? false });
  const progress = startProgress(io);
  progress.stage('reading', 1);
  const threads = options.threads ?? Math.min(2, availableParallelism());
  const raw = await readIntervalRows(options.data, plan, { timeZone: zone }, threads);
  const table = checkIntervalSequence(raw, options.fillGaps ?? 'none');
  const drivers = planDrivers(plan);
  const columns = driverColumns(plan, table.values, table.count);
  let study: ProfileStudy;
  try {
    study = studyProfile(
      {
        board: plan.board,
        drivers,
        columns,
        utcMs: table.utcMs,
        intervalMs: table.intervalMs,
        sequence: table.report,
        undriven: { loads: plan.undriven, atRating: plan.undrivenAtRating },
        ...(spec.profile ? { profile: spec.profile } : {}),
      },
      {
        timeZone: zone,
        bank: options.bank ?? false,
        ...(options.pf !== undefined ? { targetPf: options.pf } : {}),
        onProgress: (stage, done, total) => progress.stage(stage === 'solve' ? 'solving' : 'bank', total, done),
      },
    );
  } finally {
    progress.stop();
  }
  const currency = spec.profile?.tariff?.currency ?? 'units';
  if (outputs.summary) writeFileSync(outputs.summary, summaryCsv(study.result));
  if (outputs.intervals) writeFileSync(outputs.intervals, intervalCsv(study));
  if (outputs.charts) {
    mkdirSync(outputs.charts, { recursive: true });
    writeProfileCharts(study, outputs.charts, (name, text) => writeFileSync(join(outputs.charts!, name), text));
  }
  io.stdout(options.json ? `${JSON.stringify(study.result, null, 2)}\n` : renderProfileReport(study.result, currency));
  void EXIT;
  return study;
}
