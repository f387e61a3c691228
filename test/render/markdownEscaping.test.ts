/**
 * Names from the board file are text in the Markdown report, never Markdown: a load named like an image
 * fetched a remote picture when the report was viewed, and a javascript: link passed through.
 */
import { describe, expect, it } from 'vitest';
import { buildBoardReport, normaliseBoard, parseBoard, renderReportMarkdown, solveBoardModel } from '@trivar/core';

// An invented bakery whose names a mischievous user wrote.
const spec = parseBoard({
  name: 'Bakery *bold* _it_ `code` ~gone~ #1 & $x$',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: '![t](https://tracker.example/p.png)', connection: 'A-N', kW: 2, pf: 0.9, circuit: '[x](javascript:f())' },
    { name: '1. proofer', connection: 'B-N', kW: 1.5, pf: 1 },
    { name: '- mixer **big**', connection: 'C-N', kW: 3, pf: 0.8 },
  ],
});
const markdown = renderReportMarkdown(buildBoardReport({ spec, result: solveBoardModel(normaliseBoard(spec)) }), 'bakery').markdown;
/** The Markdown with every backslash-escaped character taken out: what is left is what a renderer acts on. */
const active = markdown.replace(/\\[\s\S]/g, '');

describe('user text in the Markdown report', () => {
  it('prints a name written as an image or a link as text, escaped where it stands', () => {
    expect(markdown).toContain('\\!\\[t\\](https://tracker.example/p.png)');
    expect(markdown).toContain('\\[x\\](javascript:f())');
    // The only images left are the report's own figures, each an SVG file beside the report.
    const images = [...active.matchAll(/!\[[^\]]*\]\(([^)]*)\)/g)].map((m) => m[1]);
    expect(images).toEqual(['bakery-phasors.svg', 'bakery-sequences.svg']);
    expect(active).not.toMatch(/\]\((https?|javascript):/);
  });

  it('escapes emphasis, code, strike-through, entities, headings and maths in the board name everywhere it is written', () => {
    expect(markdown).toContain('Bakery \\*bold\\* \\_it\\_ \\`code\\` \\~gone\\~ \\#1 \\& \\$x\\$');
    expect(markdown).not.toContain('Bakery *bold*');
    expect(active).not.toMatch(/~gone~|`code`|\$x\$|_it_/);
  });

  it('keeps the names readable in table cells: mixer row escaped, no stray list or emphasis', () => {
    expect(markdown).toContain('- mixer \\*\\*big\\*\\*');
    expect(markdown).toContain('1. proofer');
    expect(active).not.toContain('**big**');
  });
});
