/** `trivar rebalance`: which circuits to move to which phase, on a board or any board of an installation; optional rewritten file. */
import { existsSync, realpathSync, statSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import {
  InputError,
  isInstallationInput,
  normaliseBoard,
  normaliseInstallation,
  parseBoard,
  parseInstallation,
  readBoardText,
  rebalanceBoard,
  rebalanceInstallation,
  rewriteBoardText,
  type RebalanceOptions,
  type RebalanceReport,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { renderRebalanceReport } from '../format/rebalanceReport.js';

export interface RebalanceCommandOptions {
  readonly json?: boolean;
  readonly aim?: Record<string, number>;
  readonly combine?: string;
  readonly moveLimit?: number;
  readonly nearBest?: number;
  readonly capacity?: number;
  readonly boards?: string[];
  readonly measureAt?: string;
  readonly scenarios?: boolean;
  readonly method?: 'auto' | 'exact' | 'local-search';
  readonly table?: boolean;
  readonly write?: string;
}

/** The board file's `rebalance` section with the command-line options laid over it. */
function studySpec(fromFile: Record<string, unknown> | undefined, o: RebalanceCommandOptions): Record<string, unknown> {
  const spec: Record<string, unknown> = { ...(fromFile ?? {}) };
  if (o.aim !== undefined) spec.aim = o.aim;
  if (o.combine !== undefined) spec.combine = o.combine;
  if (o.moveLimit !== undefined) spec.moveLimit = o.moveLimit;
  if (o.nearBest !== undefined) spec.nearBestPercent = o.nearBest;
  if (o.capacity !== undefined) spec.lineCapacityA = o.capacity;
  if (o.boards !== undefined) spec.boards = o.boards;
  if (o.measureAt !== undefined) spec.measureAt = o.measureAt;
  if (o.scenarios) spec.conditions = 'scenarios';
  return spec;
}

/** True when two paths name the same file (also through links). */
function sameFile(a: string, b: string): boolean {
  if (resolve(a) === resolve(b)) return true;
  if (!existsSync(a) || !existsSync(b)) return false;
  if (realpathSync(a) === realpathSync(b)) return true;
  const sa = statSync(a);
  const sb = statSync(b);
  return sa.dev === sb.dev && sa.ino === sb.ino;
}

export async function runRebalance(file: string, options: RebalanceCommandOptions, io: CliIo): Promise<RebalanceReport> {
  if (options.write !== undefined && file !== '-' && sameFile(options.write, file))
    throw new UsageError(`--write ${options.write}: that is the board file being read; write the rebalanced board to another file`);
  const text = await io.readSource(file);
  const input = readBoardText(text);
  const search: RebalanceOptions = {
    ...(options.method ? { method: options.method } : {}),
    ...(options.table === false ? { moveTable: false } : {}),
  };
  let report: RebalanceReport;
  try {
    if (isInstallationInput(input)) {
      const spec = parseInstallation(input);
      const study = studySpec(spec.rebalance as Record<string, unknown> | undefined, options);
      report = rebalanceInstallation(normaliseInstallation(spec).installation, study, search);
    } else {
      const spec = parseBoard(input);
      const study = studySpec(spec.rebalance as Record<string, unknown> | undefined, options);
      report = rebalanceBoard(normaliseBoard(spec), study, { ...search, profile: spec.profile });
    }
  } catch (error) {
    if (error instanceof InputError && error.heading.startsWith('the rebalancing study'))
      throw new InputError(
        error.issues.map((i) => {
          const path = i.path.startsWith('profile.') ? i.path : i.path ? `rebalance.${i.path}` : 'rebalance';
          return { ...i, path, message: `${path}: ${i.message.slice(i.message.indexOf(': ') + 2)}` };
        }),
        'the rebalancing study is not valid (board file rebalance section or command-line options)',
      );
    throw error;
  }
  if (options.write !== undefined) writeFileSync(options.write, rewriteBoardText(text, report.moves));
  io.stdout(options.json ? `${JSON.stringify(report, null, 2)}\n` : renderRebalanceReport(report));
  return report;
}
