/** The report of a board: every required section, self-contained, and the same for the same board. */
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseSvg } from './svgReading.js';
import { renderPhasorDiagram, buildBoardReport, correctBoard, normaliseBoard, parseBoard, readBoardText, renderReportHtml, renderReportMarkdown, solveBoardModel, type ReportSection } from '@trivar/core';
import { fileURLToPath } from 'node:url';
import { isBoardExample } from '../support/boardExamples.js';

const EXAMPLES = new URL('../../examples/', import.meta.url);
const exampleFiles = readdirSync(EXAMPLES).filter(isBoardExample(fileURLToPath(EXAMPLES)));

function reportOf(file: string) {
  const spec = parseBoard(readBoardText(readFileSync(new URL(file, EXAMPLES), 'utf8')));
  const board = normaliseBoard(spec);
  const result = solveBoardModel(board);
  const correction = spec.correction?.arrangement ? correctBoard(board, spec.correction) : null;
  return { spec, result, correction, doc: buildBoardReport({ spec, result, correction }) };
}

describe('board report', () => {
  it.each(exampleFiles)('has every section the board calls for: %s', (file) => {
    const { doc, correction, result, spec } = reportOf(file);
    const ids = doc.sections.map((s) => s.id);
    expect(ids.slice(0, 3)).toEqual(['installation', 'schedule', 'results']);
    expect(ids.slice(-3)).toEqual(['assumptions', 'standards', 'cautions']);
    expect(ids.includes('correction')).toBe(correction !== null);
    expect(ids.includes('harmonics')).toBe(correction?.verification.resonanceOrder != null);
    expect(ids.includes('open-neutral')).toBe(result.openNeutral?.applicable === true);
    // The schedule lists every circuit of the file with its solved current.
    const schedule = doc.sections.find((s) => s.id === 'schedule')!.blocks[0]!;
    expect(schedule.kind).toBe('table');
    if (schedule.kind === 'table') {
      expect(schedule.rows.map((r) => r[1])).toEqual(spec.loads.map((l) => l.name));
      expect(schedule.rows.map((r) => Number(r[7]))).toEqual(result.loads.filter((l) => l.origin === 'board').map((l) => Number(l.currentA.toFixed(1))));
    }
    // Safety cautions include the solver's general caution, and the capacitor cautions with a correction.
    const cautions = doc.sections.find((s) => s.id === 'cautions')!.blocks[0]!;
    if (cautions.kind !== 'list') throw new Error('cautions are a list');
    for (const c of result.cautions) expect(cautions.items).toContain(c);
    if (correction) for (const c of correction.cautions) expect(cautions.items).toContain(c);
  });

  it('the panel schedule takes circuit numbers and breaker ratings from the board file', () => {
    const { doc } = reportOf('riverside-cold-store.yaml');
    const schedule = doc.sections.find((s) => s.id === 'schedule')!.blocks[0]!;
    if (schedule.kind !== 'table') throw new Error('the schedule is a table');
    expect(schedule.columns.map((c) => c.label)).toEqual(['No.', 'Circuit', 'Phase', 'Breaker A, poles', 'Model', 'kW', 'kvar', 'A', 'PF', 'V %nom']);
    expect(schedule.rows[0]!.slice(0, 4)).toEqual(['Q1', 'Compressor rack 1', 'ABC-delta', '100']);
    const bakery = reportOf('corner-bakery.yaml').doc.sections.find((s) => s.id === 'schedule')!.blocks[0]!;
    if (bakery.kind !== 'table') throw new Error('the schedule is a table');
    // No circuit numbers in the file: none invented.
    expect(bakery.rows[0]!.slice(0, 4)).toEqual(['—', 'Deck oven 1', 'A-B', '—']);
    // Poles beside the rating, and a pf left out of the file marked as solve marks it.
    const cabin = reportOf('pine-hollow-cabin.yaml').doc.sections.find((s) => s.id === 'schedule')!.blocks[0]!;
    if (cabin.kind !== 'table') throw new Error('the schedule is a table');
    expect(cabin.rows[0]![0]).toBe('1,3');
    expect(cabin.rows[0]![3]).toBe('30 2P');
    const heaters = cabin.rows.find((r) => r[1] === 'Space heaters')!;
    expect(heaters[8]).toMatch(/ \*$/);
    expect(cabin.note).toMatch(/pf not given in the file, taken as 1/);
  });

  it('names only the standards that apply: no sequence or motor standards on a split-phase board', () => {
    const standards = (file: string) => {
      const block = reportOf(file).doc.sections.find((s) => s.id === 'standards')!.blocks[0]!;
      return block.kind === 'table' ? block.rows.map((r) => r[0]!) : [];
    };
    expect(standards('harbour-cottages.yaml')).toEqual(['IEEE Std 1459-2010']);
    expect(standards('corner-bakery.yaml')).toContain('NEMA MG 1 / ANSI C84.1 Annex D');
    expect(standards('riverside-cold-store.yaml')).toContain('IEC 60831-1');
  });

  it('HTML is one self-contained file: inline CSS and SVG, no scripts, links or remote references', () => {
    const { doc } = reportOf('riverside-cold-store.yaml');
    const html = renderReportHtml(doc);
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|url\(|https?:\/\/(?!www\.w3\.org\/2000\/svg)/i);
    expect(html.match(/<svg /g)?.length).toBe(4); // phasors, sequences, correction overlay, triangles
    expect(html).toContain('@media print');
    for (const s of doc.sections) expect(html).toContain(`<section id="${s.id}">`);
    expect(renderReportHtml(reportOf('riverside-cold-store.yaml').doc)).toBe(html);
  });

  it('escapes text from the board file', () => {
    const spec = parseBoard({
      name: '<b>Board & "co"</b>',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
      loads: [{ name: '<script>alert(1)</script>', connection: 'A-N', kW: 1, pf: 1, circuit: 'L1|2' }],
    });
    const result = solveBoardModel(normaliseBoard(spec));
    const html = renderReportHtml(buildBoardReport({ spec, result }));
    expect(html).not.toContain('<script>');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    // A board file may not name a board so (parseBoard refuses it); a spec built in code past the parser still can, and the drawing escapes it.
    const svg = renderPhasorDiagram(solveBoardModel(normaliseBoard({ ...spec, name: 'evil\u001b[2J\u0000name' })));
    expect(svg).not.toMatch(/[\u0000-\u0008\u001b]/);
    expect(() => parseSvg(svg)).not.toThrow();
    const md = renderReportMarkdown(buildBoardReport({ spec, result }), 'r').markdown;
    expect(md).toContain('L1\\|2');
    // Raw HTML nowhere in the Markdown, table cells included (a renderer would pass it through).
    expect(md).not.toMatch(/(^|[^\\])<(script|b)>/);
    expect(md).toContain('\\<script\\>alert(1)\\</script\\>');
  });

  it('Markdown links each figure to an SVG file it returns', () => {
    const { doc } = reportOf('corner-bakery.yaml');
    const md = renderReportMarkdown(doc, 'bakery');
    expect(md.files.map((f) => f.name)).toEqual(['bakery-phasors.svg', 'bakery-sequences.svg']);
    for (const f of md.files) {
      expect(md.markdown).toContain(`](${f.name})`);
      expect(f.content.startsWith('<svg')).toBe(true);
    }
    expect(md.markdown).toMatch(/^## Safety cautions$/m);
  });

  it('a study section handed in takes its place (extension point for further studies)', () => {
    const { spec, result, correction } = reportOf('riverside-cold-store.yaml');
    const harmonics: ReportSection = { id: 'harmonics', title: 'Harmonic study', blocks: [{ kind: 'paragraph', text: 'spectrum here' }] };
    const profile: ReportSection = { id: 'profile', title: 'Load profile', blocks: [{ kind: 'paragraph', text: 'a day of readings' }] };
    const doc = buildBoardReport({ spec, result, correction, studySections: [harmonics, profile] });
    const ids = doc.sections.map((s) => s.id);
    expect(ids.filter((i) => i === 'harmonics')).toHaveLength(1);
    expect(doc.sections.find((s) => s.id === 'harmonics')!.title).toBe('Harmonic study');
    expect(ids.indexOf('profile')).toBe(ids.indexOf('assumptions') - 1);
  });
});
