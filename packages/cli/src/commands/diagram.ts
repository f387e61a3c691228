/** `trivar diagram`: draw a solved board's phasors, sequence components or current triangles, or an installation's one-line drawing, as SVG. */
import {
  arrangementNames,
  isInstallationInput,
  normaliseBoard,
  installationInService,
  parseBoard,
  parseInstallation,
  readBoardText,
  renderCurrentTriangles,
  renderOneLineDiagram,
  renderPhasorDiagram,
  renderSequenceDiagram,
  solveBoardModel,
  solveInstallationModel,
  type BoardResult,
  type InstallationResult,
  type NumericalError,
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { collapseOf, UsageError } from '../exitCodes.js';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';
import { boardOptionOnBoardFile, chooseBoard } from './chooseBoard.js';
import { boardCorrection, installationCorrection, type FileCorrection } from './fileCorrectionStudy.js';

import type { DiagramView } from './diagramViews.js';
export { DIAGRAM_VIEWS, type DiagramView } from './diagramViews.js';

export interface DiagramCommandOptions {
  readonly view?: DiagramView;
  readonly withCorrection?: boolean;
  readonly output?: string;
  /** Installation files: the board to draw (default the main board). */
  readonly board?: string;
}

/**
 * The sequence view of a board that has no sequence components: one refusal (exit 2, the view asked for does not
 * fit the file), the same whether or not a correction is drawn, made before any study runs.
 */
function assertViewFits(view: DiagramView, system: string): void {
  if (view === 'sequence' && system !== 'three-phase-4wire' && system !== 'three-phase-3wire')
    throw new UsageError(`the sequence view needs a three-phase board; this one is ${system}`);
}

/** The phasor or sequence drawing of one solved board. */
function drawSolved(result: BoardResult, view: 'phasors' | 'sequence'): string {
  assertViewFits(view, result.board.system);
  return view === 'sequence' ? renderSequenceDiagram(result) : renderPhasorDiagram(result);
}

/** A drawing, and the collapse of the state it draws (the exit status once it is written, as for `trivar solve`). */
interface Drawn {
  readonly svg: string;
  readonly collapse: NumericalError | null;
}
const studied = (svg: string): Drawn => ({ svg, collapse: null });
const solved = (result: BoardResult | InstallationResult, svg: string): Drawn => ({ svg, collapse: collapseOf(result) });

function drawBoard(raw: unknown, view: DiagramView, options: DiagramCommandOptions): Drawn {
  if (options.board !== undefined) throw boardOptionOnBoardFile('--board');
  if (view === 'one-line') throw new UsageError('the one-line view draws an installation (a file with boards:); this file is a single board — try --view phasors');
  const spec = parseBoard(raw);
  const board = normaliseBoard(spec);
  assertViewFits(view, board.system);
  if (view === 'triangles' || options.withCorrection) {
    if (!spec.correction) throw new UsageError(needsStudy(view));
    const study = boardCorrection(board, spec.correction, optionName(view), spec);
    assertDrawable(study, optionName(view));
    // A correction study refuses a collapsed board (exit 4) before anything is drawn.
    return studied(drawCorrected(study.report.verification.before, study.report.verification.after, view, study.recommended));
  }
  const result = solveBoardModel(board);
  return solved(result, drawSolved(result, view));
}

/**
 * Before/after drawings of one board from the file's correction study, for a board file or an installation;
 * the title names the arrangement where trivar correct chose it (the file names none).
 */
function drawCorrected(before: BoardResult, after: BoardResult, view: DiagramView, recommended: string | null): string {
  const chosen = recommended === null ? '' : ` the recommended ${recommended}`;
  if (view === 'triangles') return renderCurrentTriangles(before, after, recommended === null ? {} : { title: `Line current triangles — before and after${chosen}` });
  if (view === 'sequence') return renderSequenceDiagram(after, { title: `Symmetrical components with${chosen || ' the correction'} in place` });
  return renderPhasorDiagram(before, { after, ...(recommended === null ? {} : { title: `Phasors at the board — before and after${chosen}` }) });
}

const optionName = (view: DiagramView) => (view === 'triangles' ? '--view triangles' : '--with-correction');

const needsStudy = (view: DiagramView) =>
  `the ${view === 'triangles' ? 'triangles view' : '--with-correction option'} needs a correction study: add a "correction:" section to the file (with an arrangement, or without one for the arrangement trivar correct recommends; see trivar correct --help)`;

/** An "after" with no bank as built would draw equipment no catalogue unit makes: refused, saying why. */
function assertDrawable(study: FileCorrection, option: string): void {
  const r = study.report;
  if (r.status === 'nothing-to-build') throw new UsageError(`${option}: the correction study has nothing to build for this board (${r.nothingToBuild?.why ?? r.summary}), so there is no correction to draw (trivar correct shows why)`);
  if (r.status !== 'no-suitable-units') return;
  const name = study.recommended ?? arrangementNames(r.verification.before.board.system, r.verification.before.conventions.region)[r.arrangement];
  throw new UsageError(
    `${option}: no unit of the catalogue suits the ${name}${r.selection?.unbuildable ? ` (${r.selection.unbuildable.message})` : ''}, so there is no correction as built to draw (trivar correct shows the sizing); give a catalogue (correction.catalogue) or name another arrangement (correction.arrangement)`,
  );
}

function drawInstallation(raw: unknown, view: DiagramView, options: DiagramCommandOptions): Drawn {
  const spec = parseInstallation(raw);
  // The banks the file lists in service, as trivar solve takes them.
  const installation = installationInService(spec);
  if (view === 'one-line') {
    if (options.board !== undefined) throw new UsageError('the one-line view draws the whole installation: leave out --board, or choose --view phasors or sequence for one board');
    if (options.withCorrection) throw new UsageError('the one-line view draws the installation as solved: leave out --with-correction');
    const whole = solveInstallationModel(installation);
    return solved(whole, renderOneLineDiagram(whole));
  }
  assertViewFits(view, installation.main.system);
  if (view === 'triangles' || options.withCorrection) {
    if (!spec.correction) throw new UsageError(needsStudy(view));
    // The equipment goes on the board the study names; the drawing shows --board (default: that board).
    const { board: equipmentBoard, ...study } = spec.correction;
    const corrected = installationCorrection(installation, study, equipmentBoard, optionName(view));
    assertDrawable(corrected, optionName(view));
    const effect = corrected.effect;
    const name = chooseBoard([effect.board, ...effect.before.boards.map((b) => b.name).filter((n) => n !== effect.board)], options.board);
    const at = (r: typeof effect.before) => r.boards.find((b) => b.name === name)!.result;
    return studied(drawCorrected(at(effect.before), at(effect.after), view, corrected.recommended));
  }
  const result = solveInstallationModel(installation);
  const name = chooseBoard(result.boards.map((b) => b.name), options.board);
  return solved(result, drawSolved(result.boards.find((b) => b.name === name)!.result, view));
}

export async function runDiagram(file: string, options: DiagramCommandOptions, io: CliIo): Promise<string> {
  const view = options.view ?? 'phasors';
  if (options.output) assertNotInput([options.output], [file]);
  const raw = readBoardText(await io.readSource(file));
  const { svg, collapse } = isInstallationInput(raw) ? drawInstallation(raw, view, options) : drawBoard(raw, view, options);
  if (options.output) writeOutputFile(options.output, svg);
  else io.stdout(svg);
  // As `trivar solve`: the drawing of a collapsed state is written, then the collapse is the exit status.
  if (collapse) throw collapse;
  return svg;
}
