/** `trivar diagram`: draw a solved board's phasors, sequence components or current triangles, or an installation's one-line drawing, as SVG. */
import {
  correctBoard,
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
    if (!spec.correction?.arrangement)
      throw new UsageError(`the ${view === 'triangles' ? 'triangles view' : '--with-correction option'} needs a correction study: add a "correction:" section with an arrangement to the board file (see trivar correct --help)`);
    const v = correctBoard(board, spec.correction).verification;
    return view === 'triangles' ? renderCurrentTriangles(v.before, v.after) : view === 'sequence' ? renderSequenceDiagram(v.after, { title: 'Symmetrical components with the correction in place' }) : renderPhasorDiagram(v.before, { after: v.after });
  }
  return drawSolved(solveBoardModel(board), view);
}

function drawInstallation(raw: unknown, view: DiagramView, options: DiagramCommandOptions): string {
  if (view === 'triangles' || options.withCorrection)
    throw new UsageError(`the ${view === 'triangles' ? 'triangles view' : '--with-correction option'} draws a correction study, which this command runs on single board files; on an installation choose --view phasors, sequence or one-line`);
  const result = solveInstallationModel(normaliseInstallation(parseInstallation(raw)).installation);
  if (view === 'one-line') {
    if (options.board !== undefined) throw new UsageError('the one-line view draws the whole installation: leave out --board, or choose --view phasors or sequence for one board');
    return renderOneLineDiagram(result);
  }
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
