/** Worker thread: reads one byte range of an interval-data CSV (see read/intervalCsv.ts). */
import { parentPort, workerData } from 'node:worker_threads';
import { InputError, type ColumnPlan, type RowReaderOptions } from '@trivar/core';
import { readCsvRange, type CsvRange } from './read/intervalCsv.js';

const job = workerData as { range: CsvRange; plan: ColumnPlan; options: RowReaderOptions; skipHeader: boolean };
try {
  const raw = await readCsvRange(job.range, job.plan, job.options, job.skipHeader);
  // Copy out of the reader's over-sized buffers so only the rows cross, then transfer them.
  const own = { ...raw, utcMs: raw.utcMs.slice(), rows: raw.rows.slice(), values: raw.values.map((v) => v.slice()) };
  parentPort!.postMessage({ ok: true, raw: own }, [own.utcMs.buffer, own.rows.buffer, ...own.values.map((v) => v.buffer)]);
} catch (error) {
  if (error instanceof InputError) parentPort!.postMessage({ ok: false, issues: error.issues, heading: error.message.split(':\n')[0] });
  else parentPort!.postMessage({ ok: false, message: error instanceof Error ? (error.stack ?? error.message) : String(error) });
}
