/**
 * Streams an interval-data CSV file through csv-parse into core's row reader.
 * Large files are split at a line boundary and read by two worker threads
 * (see profileWorker.ts); files with quoted fields are read in one stream,
 * since a quoted field may hold a line break and a split could land inside it.
 */
import { closeSync, existsSync, openSync, readSync, statSync, createReadStream } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { pipeline } from 'node:stream/promises';
import { Worker } from 'node:worker_threads';
import { parse } from 'csv-parse';
import { parse as parseSync } from 'csv-parse/sync';
import { concatRawIntervals, createRowReader, InputError, type ColumnPlan, type RawIntervals, type RowReaderOptions } from '@trivar/core';
import { EXIT, UsageError } from '../exitCodes.js';

/** Below this size one stream is faster than starting workers. */
const PARALLEL_MIN_BYTES = 4_000_000;

export interface CsvRange {
  readonly path: string;
  readonly start: number;
  /** Inclusive end byte, or undefined for the end of the file. */
  readonly end?: number;
  /** File row of the first record in the range (header = row 1). */
  readonly firstRow: number;
}

function csvError(error: unknown, firstRow: number): never {
  const e = error as { code?: string; lines?: number; message?: string };
  if (e && typeof e.code === 'string' && e.code.startsWith('CSV_'))
    throw new InputError(
      [{ code: 'syntax', path: `row ${firstRow + (e.lines ?? 1) - 1}`, expected: 'comma-separated values', message: `row ${firstRow + (e.lines ?? 1) - 1}: ${e.message ?? e.code}` }],
      'the interval data cannot be read',
    );
  throw error;
}

/** Bytes per file read: fewer, larger chunks mean fewer parser calls per year of data. */
const CHUNK_BYTES = 1 << 20;

/**
 * Reads one byte range of the file through csv-parse into a row reader, taking
 * records from 'data' events: an async-iterator step per row cost more than the
 * row reader itself (measured on a year of 1-minute rows).
 */
export async function readCsvRange(range: CsvRange, plan: ColumnPlan, options: RowReaderOptions, skipHeader: boolean): Promise<RawIntervals> {
  const reader = createRowReader(plan, options);
  const stream = createReadStream(range.path, { start: range.start, highWaterMark: CHUNK_BYTES, ...(range.end !== undefined ? { end: range.end } : {}) });
  const parser = parse({ bom: range.start === 0, relax_column_count: true });
  const headerRow = range.firstRow - 1;
  let row = skipHeader ? headerRow : range.firstRow;
  parser.on('data', (record: string[]) => {
    if (!skipHeader || row !== headerRow) reader.push(record, row);
    row++;
  });
  try {
    await pipeline(stream, parser);
  } catch (error) {
    csvError(error, range.firstRow);
  }
  return reader.finish();
}

/** The header cells (first line) of a CSV file. */
export function readCsvHeader(path: string): string[] {
  let fd: number;
  try {
    fd = openSync(path, 'r');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new UsageError(`cannot read interval data "${path}": ${code === 'ENOENT' ? 'no such file' : (code ?? 'unreadable')}`, EXIT.input);
  }
  try {
    const buffer = Buffer.alloc(65536);
    const n = readSync(fd, buffer, 0, buffer.length, 0);
    const end = buffer.subarray(0, n).indexOf(0x0a);
    const line = buffer.subarray(0, end < 0 ? n : end).toString('utf8');
    const records = parseSync(line, { bom: true }) as string[][];
    if (!records[0]) throw new InputError([{ code: 'missing', path: 'header', expected: 'a header row', message: 'row 1: expected a header row' }], 'the interval data cannot be read');
    return records[0];
  } finally {
    closeSync(fd);
  }
}

/** Byte offset just after the line break nearest past `at`, and the rows before it. */
function splitPoint(path: string, at: number): { offset: number; rowsBefore: number } | null {
  const fd = openSync(path, 'r');
  try {
    const head = Buffer.alloc(at);
    readSync(fd, head, 0, at, 0);
    if (head.indexOf(0x22) >= 0) return null; // quoted fields: read in one stream
    const window = Buffer.alloc(65536);
    const n = readSync(fd, window, 0, window.length, at);
    const nl = window.subarray(0, n).indexOf(0x0a);
    if (nl < 0) return null;
    let rows = 0;
    for (let i = head.indexOf(0x0a); i >= 0; i = head.indexOf(0x0a, i + 1)) rows++;
    for (let i = window.indexOf(0x0a); i >= 0 && i <= nl; i = window.indexOf(0x0a, i + 1)) rows++;
    return { offset: at + nl + 1, rowsBefore: rows };
  } finally {
    closeSync(fd);
  }
}

function runWorker(workerFile: string, range: CsvRange, plan: ColumnPlan, options: RowReaderOptions, skipHeader: boolean): Promise<RawIntervals> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(workerFile, { workerData: { range, plan, options, skipHeader } });
    worker.once('message', (m: { ok: true; raw: RawIntervals } | { ok: false; issues?: InputError['issues']; heading?: string; message?: string }) => {
      if (m.ok) resolve(m.raw);
      else if (m.issues) reject(new InputError(m.issues, m.heading));
      else reject(new Error(m.message));
      void worker.terminate();
    });
    worker.once('error', reject);
  });
}

/** The worker script beside the bundled CLI, when there is one (not when running from source). */
function workerScript(): string | null {
  try {
    const file = fileURLToPath(new URL('./profile-worker.mjs', import.meta.url));
    return existsSync(file) ? file : null;
  } catch {
    return null;
  }
}

/** Reads every data row of the file (after the header), in parallel where that helps. */
export async function readIntervalRows(path: string, plan: ColumnPlan, options: RowReaderOptions, threads: number): Promise<RawIntervals> {
  const size = statSync(path).size;
  const script = workerScript();
  const split = threads > 1 && size >= PARALLEL_MIN_BYTES && script ? splitPoint(path, Math.floor(size / 2)) : null;
  if (!split || !script) return readCsvRange({ path, start: 0, firstRow: 2 }, plan, options, true);
  const half = Math.ceil((options.expectedRows ?? 0) / 2);
  const parts = await Promise.all([
    runWorker(script, { path, start: 0, end: split.offset - 1, firstRow: 2 }, plan, { ...options, expectedRows: half }, true),
    runWorker(script, { path, start: split.offset, firstRow: split.rowsBefore + 1 }, plan, { ...options, expectedRows: half }, false),
  ]);
  return concatRawIntervals(parts);
}
