/** `trivar report`: the whole study of a board as one self-contained HTML file, or Markdown with SVG files. */
import { basename, dirname, extname, join } from 'node:path';
import { buildBoardReport, correctBoard, normaliseBoard, parseBoard, readBoardText, renderReportHtml, renderReportMarkdown, solveBoardModel } from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';

export interface ReportCommandOptions {
  readonly output?: string;
  readonly format?: 'html' | 'md';
  /** Commander's negation of --no-correction. */
  readonly correction?: boolean;
}

export async function runReport(file: string, options: ReportCommandOptions, io: CliIo, footer: string): Promise<void> {
  const format = options.format ?? 'html';
  const out = options.output;
  if (format === 'md' && !out) throw new UsageError('a Markdown report writes its figures as SVG files beside it: give the report file with -o, e.g. -o board-report.md');
  if (out) assertNotInput([out], [file]);
  const spec = parseBoard(readBoardText(await io.readSource(file)));
  const board = normaliseBoard(spec);
  const result = solveBoardModel(board);
  const correction = options.correction !== false && spec.correction?.arrangement ? correctBoard(board, spec.correction) : null;
  const doc = buildBoardReport({ spec, result, correction });
  if (format === 'html') {
    const html = renderReportHtml(doc, { footer });
    if (out) writeOutputFile(out, html);
    else io.stdout(html);
    return;
  }
  const base = basename(out!, extname(out!));
  const md = renderReportMarkdown(doc, base);
  const paths = md.files.map((f) => join(dirname(out!), f.name));
  assertNotInput(paths, [file]);
  writeOutputFile(out!, md.markdown);
  md.files.forEach((f, k) => writeOutputFile(paths[k]!, f.content));
  io.stdout(`wrote ${out} and ${paths.length} figure${paths.length === 1 ? '' : 's'} beside it\n`);
}
