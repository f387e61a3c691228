/** `trivar diagram`: draw a solved board's phasors, sequence components or current triangles as SVG. */
import { correctBoard, normaliseBoard, parseBoard, readBoardText, renderCurrentTriangles, renderPhasorDiagram, renderSequenceDiagram, solveBoardModel } from '@trivar/core';
import type { CliIo } from '../io.js';
import { UsageError } from '../exitCodes.js';
import { assertNotInput, writeOutputFile } from '../outputFiles.js';

import type { DiagramView } from './diagramViews.js';
export { DIAGRAM_VIEWS, type DiagramView } from './diagramViews.js';

export interface DiagramCommandOptions {
  readonly view?: DiagramView;
  readonly withCorrection?: boolean;
  readonly output?: string;
}

export async function runDiagram(file: string, options: DiagramCommandOptions, io: CliIo): Promise<string> {
  const view = options.view ?? 'phasors';
  if (options.output) assertNotInput([options.output], [file]);
  const spec = parseBoard(readBoardText(await io.readSource(file)));
  const board = normaliseBoard(spec);
  const needsCorrection = view === 'triangles' || options.withCorrection;
  let svg: string;
  if (needsCorrection) {
    if (!spec.correction?.arrangement)
      throw new UsageError(`the ${view === 'triangles' ? 'triangles view' : '--with-correction option'} needs a correction study: add a "correction:" section with an arrangement to the board file (see trivar correct --help)`);
    const v = correctBoard(board, spec.correction).verification;
    svg = view === 'triangles' ? renderCurrentTriangles(v.before, v.after) : view === 'sequence' ? renderSequenceDiagram(v.after, { title: 'Symmetrical components with the correction in place' }) : renderPhasorDiagram(v.before, { after: v.after });
  } else {
    const result = solveBoardModel(board);
    if (view === 'sequence' && !result.sequences) throw new UsageError(`the sequence view needs a three-phase board; this one is ${result.board.system}`);
    svg = view === 'sequence' ? renderSequenceDiagram(result) : renderPhasorDiagram(result);
  }
  if (options.output) writeOutputFile(options.output, svg);
  else io.stdout(svg);
  return svg;
}
