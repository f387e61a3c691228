/**
 * Labels on the example boards do not overlap one another (boxes estimated the
 * way the renderer estimates them; the browser test measures the real text).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { correctBoard, normaliseBoard, parseBoard, readBoardText, renderPhasorDiagram, renderSequenceDiagram, solveBoard, solveBoardModel, type BoardResult } from '@trivar/core';
import { boardSpecArb } from '../property/arbitraries/boardSpec.js';
import { parseSvg, readLabels } from './svgReading.js';
import { fileURLToPath } from 'node:url';
import { isBoardExample } from '../support/boardExamples.js';

const EXAMPLES = new URL('../../examples/', import.meta.url);
const exampleFiles = readdirSync(EXAMPLES).filter(isBoardExample(fileURLToPath(EXAMPLES)));

/** Same estimate as the renderer (0.6 em per glyph, 1.25 em tall); subscripts count as full glyphs. */
const box = (l: { text: string; x: number; y: number; fontSize: number }) => ({ x: l.x, y: l.y - 0.8 * 1.25 * l.fontSize, w: 0.6 * l.fontSize * l.text.length, h: 1.25 * l.fontSize });

function overlaps(svg: string): string[] {
  const labels = readLabels(parseSvg(svg)).map((l) => ({ ...box(l), text: l.text }));
  const found: string[] = [];
  labels.forEach((a, i) =>
    labels.slice(i + 1).forEach((b) => {
      const ox = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
      const oy = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
      if (ox > 0.5 && oy > 0.5) found.push(`"${a.text}" / "${b.text}"`);
    }),
  );
  return found;
}

describe('labels', () => {
  it.each(exampleFiles)('no two labels overlap: %s', (file) => {
    const spec = parseBoard(readBoardText(readFileSync(new URL(file, EXAMPLES), 'utf8')));
    const board = normaliseBoard(spec);
    const result = solveBoardModel(board);
    const svgs = [renderPhasorDiagram(result)];
    if (result.sequences) svgs.push(renderSequenceDiagram(result));
    if (spec.correction?.arrangement) {
      const v = correctBoard(board, spec.correction).verification;
      svgs.push(renderPhasorDiagram(v.before, { after: v.after }));
    }
    for (const svg of svgs) expect(overlaps(svg)).toEqual([]);
  });
});

describe('labels on random boards', () => {
  it('no two labels overlap on boards of every system (fast-check)', () => {
    fc.assert(
      fc.property(boardSpecArb({ maxLoads: 6 }), (spec) => {
        let result: BoardResult;
        try {
          result = solveBoard(spec);
        } catch {
          return; // beyond what the supply can deliver: not this test's subject
        }
        expect(overlaps(renderPhasorDiagram(result))).toEqual([]);
        if (result.sequences) expect(overlaps(renderSequenceDiagram(result))).toEqual([]);
      }),
      { numRuns: 80 },
    );
  });
});
