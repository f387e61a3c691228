/** A report of a board or installation whose supply collapsed says so before its figures, as `trivar solve` does. */
import { describe, expect, it } from 'vitest';
import { buildBoardReport, buildInstallationReport, normaliseBoard, parseBoard, parseInstallation, renderReportHtml, renderReportMarkdown, solveBoardModel, solveInstallation } from '@trivar/core';

const SUPPLY = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;

describe('reports of a collapsed supply', () => {
  it('board: the results section opens with the collapse and its findings, in HTML and Markdown', () => {
    const spec = parseBoard({
      supply: { ...SUPPLY, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
      loads: [{ name: 'plant', connection: 'ABC-delta', kW: 5000, pf: 0.9 }],
    });
    const result = solveBoardModel(normaliseBoard(spec));
    expect(result.operatingPoint.collapsed).toBe(true);
    const doc = buildBoardReport({ spec, result });
    const results = doc.sections.find((s) => s.id === 'results')!;
    expect(results.blocks[0]).toMatchObject({ kind: 'list', tone: 'warning' });
    const md = renderReportMarkdown(doc, 'r').markdown;
    expect(md).toMatch(/Supply collapse: the supply cannot carry these loads/);
    expect(md).toMatch(/the board voltage has collapsed to/);
    expect(renderReportHtml(doc)).toMatch(/Supply collapse: the supply cannot carry these loads/);
  });
  it('installation: the collapsed sub-board’s section says so; a working board’s does not', () => {
    const spec = parseInstallation({
      supply: SUPPLY,
      boards: [
        { name: 'Main', loads: [{ name: 'lights', connection: 'A-N', kW: 1 }] },
        { name: 'Far shed', fedFrom: 'Main', feeder: { lengthM: 500, line: { mm2: 2.5 }, neutral: { mm2: 2.5 } }, loads: [{ name: 'plant', connection: 'ABC-delta', kW: 200, pf: 0.9 }] },
      ],
    });
    const doc = buildInstallationReport({ spec, result: solveInstallation(spec) });
    const md = renderReportMarkdown(doc, 'r').markdown;
    const shed = md.slice(md.indexOf('Far shed', md.indexOf('## ')));
    expect(md.match(/Supply collapse: the supply cannot carry these loads/g)).toHaveLength(1);
    expect(shed).toMatch(/Supply collapse/);
    // Said first, before the feeders and totals, naming the board.
    const first = md.indexOf('Supply collapse at Far shed: the supply cannot carry these loads; the figures below are not a working installation.');
    expect(first).toBeGreaterThan(-1);
    expect(first).toBeLessThan(md.indexOf('Feeders'));
  });
});
