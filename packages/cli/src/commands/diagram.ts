/** `trivar diagram`: draw a solved board's phasors, sequence components or current triangles, or an installation's one-line drawing, as SVG. */
import {
  correctBoard,
  correctInstallation,
  isInstallationInput,
  normaliseBoard,
  normaliseInstallation,
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
} from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';
import { boardOptionOnBoardFile, chooseBoard } from './chooseBoard.js';

import type { DiagramView } from './diagramViews.js';
export { DIAGRAM_VIEWS, type DiagramView } from './diagramViews.js';

export interface DiagramCommandOptions {
  readonly view?: DiagramView;
  readonly withCorrection?: boolean;
  readonly output?: string;
  /** Installation files: the board to draw (default the main board). */
  readonly board?: string;
}

/** The phasor or sequence drawing of one solved board. */
function drawSolved(result: BoardResult, view: 'phasors' | 'sequence'): string {
  if (view === 'sequence' && !result.sequences) throw new UsageError(`the sequence view needs a three-phase board; this one is ${result.board.system}`);
  return view === 'sequence' ? renderSequenceDiagram(result) : renderPhasorDiagram(result);
}

function drawBoard(raw: unknown, view: DiagramView, options: DiagramCommandOptions): string {
  if (options.board !== undefined) throw boardOptionOnBoardFile('--board');
  if (view === 'one-line') throw new UsageError('the one-line view draws an installation (a file with boards:); this file is a single board — try --view phasors');
  const spec = parseBoard(raw);
  const board = normaliseBoard(spec);
  if (view === 'triangles' || options.withCorrection) {
    if (!spec.correction?.arrangement) throw new UsageError(needsStudy(view));
    const v = correctBoard(board, spec.correction).verification;
    return drawCorrected(v.before, v.after, view);
  }
  return drawSolved(solveBoardModel(board), view);
}

/** Before/after drawings of one board from the file's correction study, for a board file or an installation. */
function drawCorrected(before: BoardResult, after: BoardResult, view: DiagramView): string {
  return view === 'triangles' ? renderCurrentTriangles(before, after) : view === 'sequence' ? renderSequenceDiagram(after, { title: 'Symmetrical components with the correction in place' }) : renderPhasorDiagram(before, { after });
}

const needsStudy = (view: DiagramView) =>
  `the ${view === 'triangles' ? 'triangles view' : '--with-correction option'} needs a correction study: add a "correction:" section with an arrangement to the file (see trivar correct --help)`;

function drawInstallation(raw: unknown, view: DiagramView, options: DiagramCommandOptions): string {
  const spec = parseInstallation(raw);
  const { installation } = normaliseInstallation(spec);
  if (view === 'one-line') {
    if (options.board !== undefined) throw new UsageError('the one-line view draws the whole installation: leave out --board, or choose --view phasors or sequence for one board');
    if (options.withCorrection) throw new UsageError('the one-line view draws the installation as solved: leave out --with-correction');
    return renderOneLineDiagram(solveInstallationModel(installation));
  }
  if (view === 'triangles' || options.withCorrection) {
    if (!spec.correction?.arrangement) throw new UsageError(needsStudy(view));
    // The equipment goes on the board the study names; the drawing shows --board (default: that board).
    const { board: equipmentBoard, ...study } = spec.correction;
    const effect = correctInstallation(installation, study, equipmentBoard === undefined ? {} : { board: equipmentBoard }).effect;
    const name = chooseBoard([effect.board, ...effect.before.boards.map((b) => b.name).filter((n) => n !== effect.board)], options.board);
    const at = (r: typeof effect.before) => r.boards.find((b) => b.name === name)!.result;
    return drawCorrected(at(effect.before), at(effect.after), view);
  }
  const result = solveInstallationModel(installation);
  const name = chooseBoard(result.boards.map((b) => b.name), options.board);
  return drawSolved(result.boards.find((b) => b.name === name)!.result, view);
}

export async function runDiagram(file: string, options: DiagramCommandOptions, io: CliIo): Promise<string> {
  const view = options.view ?? 'phasors';
  if (options.output) assertNotInput([options.output], [file]);
  const raw = readBoardText(await io.readSource(file));
  const svg = isInstallationInput(raw) ? drawInstallation(raw, view, options) : drawBoard(raw, view, options);
  if (options.output) writeOutputFile(options.output, svg);
  else io.stdout(svg);
  return svg;
}
