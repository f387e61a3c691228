/** `trivar report`: the whole study of a board or installation as one self-contained HTML file, or Markdown with SVG files. */
import { basename, dirname, extname, join } from 'node:path';
import {
  addHandCapacitors,
  buildBoardReport,
  buildInstallationReport,
  boardHasHarmonicData,
  checkHandFigures,
  compareCorrections,
  compareWithHarmonics,
  correctWithHarmonics,
  compareInstallationCorrections,
  compareInstallationWithHarmonics,
  correctInstallationWithHarmonics,
  installationHasHarmonicData,
  correctBoard,
  correctInstallation,
  InputError,
  isInstallationInput,
  labellerOf,
  normaliseBoard,
  installationInService,
  parseBoard,
  parseInstallation,
  profileSection,
  installationProfileSections,
  boardSectionIds,
  type ProfileChart,
  readBoardText,
  renderCurrentTriangles,
  renderReportHtml,
  renderReportMarkdown,
  solveBoardModel,
  solveInstallationModel,
  studyHarmonics,
  studyInstallationHarmonics,
  type Board,
  type BoardResult,
  type InstallationResult,
  type Installation,
  type InstallationSpec,
  type BoardSpec,
  type PhaseNaming,
  type ReportDocument,
  type ReportSection,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { HAND_FIGURES_ON_INSTALLATION } from '../handFiguresWording.js';
import { collapseOf, EXIT, UsageError } from '../exitCodes.js';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';
import { computeProfileStudy } from './profile.js';
import { writeInstallationProfileCharts, writeProfileCharts } from '../format/profileChartFiles.js';
import { computeInstallationProfileStudy } from './profileInstallation.js';
import { readFigures } from './check.js';

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
  /** A hand calculation to check (the figures file `trivar check` reads). */
  readonly handFigures?: string;
}

/** Report captions of the chart files, by file name. */
const CHART_CAPTIONS: Readonly<Record<string, string>> = {
  'currents.svg': 'Line and neutral currents over the period (band: lowest to highest in each column)',
  'power-factor.svg': 'Board power factor over the period',
  'load-duration.svg': 'Load-duration curves: hours each current was reached or exceeded',
  'feeder-loading.svg': "The busiest line of each board's incomer over the period, as a share of its rating",
};

const asChart = (name: string, svg: string): ProfileChart => ({ name: name.replace(/\.svg$/, ''), caption: CHART_CAPTIONS[name] ?? name, svg });

/** The profile study of the interval data, as a report section with its charts. */
async function profileReportSection(spec: BoardSpec, options: ReportCommandOptions, io: CliIo, naming: PhaseNaming): Promise<ReportSection> {
  const study = await computeProfileStudy(spec, options.profileData!, options.timeZone ? { timeZone: options.timeZone } : {}, io);
  const charts: ProfileChart[] = [];
  writeProfileCharts(study, (name, svg) => charts.push(asChart(name, svg)), labellerOf(naming));
  return profileSection(study.result, charts, naming);
}

/** The installation's profile over the interval data: an overview and a section per board, with their charts. */
async function installationProfileReportSections(spec: InstallationSpec, installation: Installation, options: ReportCommandOptions, io: CliIo, naming: PhaseNaming): Promise<ReportSection[]> {
  const study = await computeInstallationProfileStudy(spec, installation, options.profileData!, options.timeZone ? { timeZone: options.timeZone } : {}, io);
  const boards = new Map<string, ProfileChart[]>();
  const overview: ProfileChart[] = [];
  writeInstallationProfileCharts(
    study,
    (board, name, svg) => {
      if (board === null) overview.push(asChart(name, svg));
      else boards.set(board, [...(boards.get(board) ?? []), asChart(name, svg)]);
    },
    labellerOf(naming),
  );
  return installationProfileSections(study.result, { boards, overview }, boardSectionIds(study.result.boards.map((b) => b.board)), naming);
}

/** The hand check of `board` with its triangle drawing; problems in the figures are said to be in that file. */
function handCheckOf(board: Board, figures: unknown, figuresFile: string) {
  try {
    const result = checkHandFigures(board, figures);
    const solved = (b: Board) => solveBoardModel(b, { openNeutral: false });
    const triangles = renderCurrentTriangles(solved(board), solved(addHandCapacitors(board, figures)), {
      title: 'Line current triangles — without and with your capacitors',
      changeName: 'your capacitors',
    });
    return { result, triangles };
  } catch (error) {
    if (error instanceof InputError) throw new InputError(error.issues, `the hand figures in "${figuresFile}" are not valid`);
    throw error;
  }
}

/** A report and the solve it reports (its collapse is the exit status once the report is written). */
interface Reported {
  readonly doc: ReportDocument;
  readonly result: BoardResult | InstallationResult;
}

async function boardDocument(raw: unknown, figures: unknown, options: ReportCommandOptions, io: CliIo): Promise<Reported> {
  const spec = parseBoard(raw);
  const board = normaliseBoard(spec);
  const result = solveBoardModel(board);
  // A collapsed board's report states the collapse and is written; the studies refuse that state, so they are left out.
  const viable = collapseOf(result) === null;
  const { correction, correctionComparison } = viable && options.correction !== false && spec.correction ? boardCorrectionOf(spec, board, spec.correction) : NO_CORRECTION;
  const wantsHarmonics = spec.harmonics !== undefined || spec.loads.some((l) => l.spectrum !== undefined);
  const harmonics = viable && options.harmonics !== false && wantsHarmonics ? studyHarmonics(raw) : null;
  const studySections = options.profileData ? [await profileReportSection(spec, options, io, result.conventions.phaseNames)] : [];
  const handCheck = figures === null ? null : handCheckOf(board, figures, options.handFigures!);
  return { doc: buildBoardReport({ spec, result, correction, correctionComparison, harmonics, studySections, handCheck }), result };
}

const NO_CORRECTION = { correction: null, correctionComparison: null, banksPlacement: null } as const;

/**
 * The board file's correction study: the arrangement it names, or (none named) every arrangement
 * compared and the recommended one in full, as `trivar correct` gives them — on a board with harmonic
 * data each arrangement as the variant (plain or detuned) its harmonic check chooses, as there.
 * --no-harmonics leaves out the harmonic study's section only, not this choice.
 */
function boardCorrectionOf(spec: BoardSpec, board: Board, section: NonNullable<BoardSpec['correction']>) {
  const harmonic = boardHasHarmonicData(spec);
  if (section.arrangement) return { correction: harmonic ? correctWithHarmonics(spec, board, section) : correctBoard(board, section), correctionComparison: null };
  const comparison = harmonic ? compareWithHarmonics(spec, board, section) : compareCorrections(board, section);
  const chosen = comparison.outcomes.find((o) => o.arrangement === comparison.recommended)?.report ?? null;
  return { correction: chosen, correctionComparison: comparison };
}

/**
 * The installation file's correction study on the board it names (default the main board): the
 * arrangement it names, or (none named) every arrangement compared and the recommended one in full —
 * with harmonic data, each arrangement as the variant its harmonic check chooses, as `trivar correct` gives them.
 */
function installationCorrectionOf(spec: InstallationSpec, installation: Installation, section: NonNullable<InstallationSpec['correction']>) {
  const { board, ...study } = section;
  const placement = board === undefined ? {} : { board };
  const harmonic = installationHasHarmonicData(spec);
  if (study.arrangement) {
    const c = harmonic ? correctInstallationWithHarmonics(spec, installation, study, placement) : correctInstallation(installation, study, placement);
    return { correction: { board: c.board, report: c.report, effect: c.effect }, correctionComparison: null, banksPlacement: c };
  }
  const c = harmonic ? compareInstallationWithHarmonics(spec, installation, study, placement) : compareInstallationCorrections(installation, study, placement);
  const chosen = c.comparison.outcomes.find((o) => o.arrangement === c.comparison.recommended)?.report;
  return {
    correction: chosen && c.effect ? { board: c.board, report: chosen, effect: c.effect } : null,
    correctionComparison: { board: c.board, comparison: c.comparison },
    banksPlacement: c,
  };
}

async function installationDocument(raw: unknown, figures: unknown, options: ReportCommandOptions, io: CliIo): Promise<Reported> {
  // The hand method works on one board and its own loads; a board inside an installation also carries the
  // boards beyond it and the drops before it, which the hand check's effects do not separate.
  // As `trivar check` on an installation: the file is the wrong kind for a hand check (exit 3, input).
  if (figures !== null) throw new UsageError(`--hand-figures: ${HAND_FIGURES_ON_INSTALLATION}`, EXIT.input);
  const spec = parseInstallation(raw);
  // The banks the file lists in service, as trivar solve takes them.
  const installation = installationInService(spec);
  const result = solveInstallationModel(installation);
  // As for a board: a collapse is stated and the report written, without the studies that refuse that state.
  const viable = collapseOf(result) === null;
  const { correction, correctionComparison, banksPlacement } = viable && options.correction !== false && spec.correction ? installationCorrectionOf(spec, installation, spec.correction) : NO_CORRECTION;
  const wantsHarmonics = spec.harmonics !== undefined || spec.boards.some((b) => b.loads.some((l) => l.spectrum !== undefined));
  const harmonics = viable && options.harmonics !== false && wantsHarmonics ? studyInstallationHarmonics(raw) : null;
  const studySections = options.profileData ? await installationProfileReportSections(spec, installation, options, io, result.boards[0]!.result.conventions.phaseNames) : [];
  return { doc: buildInstallationReport({ spec, result, correction, correctionComparison, banksPlacement, harmonics, studySections }), result };
}

/** The formats a report file's extension names. */
const FORMAT_OF_EXTENSION: Readonly<Record<string, 'html' | 'md'>> = { '.html': 'html', '.htm': 'html', '.md': 'md', '.markdown': 'md' };

/**
 * The report's format: --format where given, else the one the output file's extension names, else HTML. A
 * --format that contradicts the extension is refused: Markdown in a .html file (or HTML in a .md one) opens as
 * the wrong kind of document.
 */
export function reportFormatOf(format: 'html' | 'md' | undefined, out: string | undefined): 'html' | 'md' {
  const extension = out ? extname(out).toLowerCase() : '';
  const named = FORMAT_OF_EXTENSION[extension];
  if (format && named && format !== named)
    throw new UsageError(`--format ${format} writes ${format === 'md' ? 'Markdown' : 'HTML'}, but the report file ${out} has the extension of ${named === 'md' ? 'Markdown' : 'HTML'} (${extension}): name the file ${format === 'md' ? 'e.g. report.md' : 'e.g. report.html'}, or leave out --format to follow the extension`);
  return format ?? named ?? 'html';
}

export async function runReport(file: string, options: ReportCommandOptions, io: CliIo, footer: string): Promise<void> {
  const out = options.output;
  const format = reportFormatOf(options.format, out);
  if (format === 'md' && !out) throw new UsageError('a Markdown report writes its figures as SVG files beside it: give the report file with -o, e.g. -o board-report.md');
  // As rebalance does: an option that only reads interval data is refused without the data, not silently ignored.
  if (options.timeZone !== undefined && options.profileData === undefined) throw new UsageError('--time-zone reads the times of the interval data: give --profile-data <csv> too, or leave out --time-zone');
  const inputs = [file, ...(options.profileData ? [options.profileData] : []), ...(options.handFigures ? [options.handFigures] : [])];
  if (out) assertNotInput([out], inputs);
  const raw = readBoardText(await io.readSource(file));
  const figures = options.handFigures ? readBoardText(await readFigures(options.handFigures, io)) : null;
  const { doc, result } = isInstallationInput(raw) ? await installationDocument(raw, figures, options, io) : await boardDocument(raw, figures, options, io);
  writeReport(doc, format, out, inputs, footer, io);
  // As `trivar solve`: the report says so first and is written, then a collapse anywhere is the exit status.
  const collapse = collapseOf(result);
  if (collapse) throw collapse;
}

function writeReport(doc: ReportDocument, format: 'html' | 'md', out: string | undefined, inputs: readonly string[], footer: string, io: CliIo): void {
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
