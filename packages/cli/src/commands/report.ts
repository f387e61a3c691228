/** `trivar report`: the whole study of a board as one self-contained HTML file, or Markdown with SVG files. */
import { basename, dirname, extname, join } from 'node:path';
import { profileSection, studyHarmonics, type BoardSpec, type ReportSection, buildBoardReport, correctBoard, normaliseBoard, parseBoard, readBoardText, renderReportHtml, renderReportMarkdown, solveBoardModel } from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';
import { computeProfileStudy } from './profile.js';
import { writeProfileCharts } from '../format/profileChartFiles.js';

export interface ReportCommandOptions {
  readonly output?: string;
  readonly format?: 'html' | 'md';
  /** Commander's negation of --no-correction. */
  readonly correction?: boolean;
  /** Commander's negation of --no-harmonics. */
  readonly harmonics?: boolean;
  /** Interval data (CSV) for a load-profile section, as for `trivar profile --data`. */
  readonly profileData?: string;
  readonly timeZone?: string;
}

/** The profile study of the interval data, as a report section with its charts. */
async function profileReportSection(spec: BoardSpec, options: ReportCommandOptions, io: CliIo): Promise<ReportSection> {
  const study = await computeProfileStudy(spec, options.profileData!, options.timeZone ? { timeZone: options.timeZone } : {}, io);
  const charts: { name: string; caption: string; svg: string }[] = [];
  const captions: Readonly<Record<string, string>> = {
    'currents.svg': 'Line and neutral currents over the period (band: lowest to highest in each column)',
    'power-factor.svg': 'Board power factor over the period',
    'load-duration.svg': 'Load-duration curves: hours each current was reached or exceeded',
  };
  writeProfileCharts(study, (name, svg) => charts.push({ name: name.replace(/\.svg$/, ''), caption: captions[name] ?? name, svg }));
  return profileSection(study.result, charts);
}

export async function runReport(file: string, options: ReportCommandOptions, io: CliIo, footer: string): Promise<void> {
  const format = options.format ?? 'html';
  const out = options.output;
  if (format === 'md' && !out) throw new UsageError('a Markdown report writes its figures as SVG files beside it: give the report file with -o, e.g. -o board-report.md');
  const inputs = [file, ...(options.profileData ? [options.profileData] : [])];
  if (out) assertNotInput([out], inputs);
  const raw = readBoardText(await io.readSource(file));
  const spec = parseBoard(raw);
  const board = normaliseBoard(spec);
  const result = solveBoardModel(board);
  const correction = options.correction !== false && spec.correction?.arrangement ? correctBoard(board, spec.correction) : null;
  const wantsHarmonics = spec.harmonics !== undefined || spec.loads.some((l) => l.spectrum !== undefined);
  const harmonics = options.harmonics !== false && wantsHarmonics ? studyHarmonics(raw) : null;
  const studySections = options.profileData ? [await profileReportSection(spec, options, io)] : [];
  const doc = buildBoardReport({ spec, result, correction, harmonics, studySections });
  if (format === 'html') {
    const html = renderReportHtml(doc, { footer });
    if (out) writeOutputFile(out, html);
    else io.stdout(html);
    return;
  }
  const base = basename(out!, extname(out!));
  const md = renderReportMarkdown(doc, base);
  const paths = md.files.map((f) => join(dirname(out!), f.name));
  assertNotInput(paths, inputs);
  writeOutputFile(out!, md.markdown);
  md.files.forEach((f, k) => writeOutputFile(paths[k]!, f.content));
  io.stdout(`wrote ${out} and ${paths.length} figure${paths.length === 1 ? '' : 's'} beside it\n`);
}
