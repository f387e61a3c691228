/**
 * The report of an installation: every required section (description with the
 * one-line drawing, feeders, totals, one section per board with its panel
 * schedule, results and voltages against limits, closing sections), every
 * figure in it the solved one, and the same text for the same installation.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  buildInstallationReport,
  parseInstallation,
  readBoardText,
  renderReportHtml,
  renderReportMarkdown,
  solveInstallation,
  type ReportBlock,
  type ReportDocument,
  type ReportSection,
} from '@trivar/core';
import { parseSvg, readPhasors } from './svgReading.js';

const RISER = new URL('../../examples/maple-court-riser.yaml', import.meta.url);

function riser() {
  const spec = parseInstallation(readBoardText(readFileSync(RISER, 'utf8')));
  const result = solveInstallation(spec);
  return { spec, result, doc: buildInstallationReport({ spec, result }) };
}

const section = (doc: ReportDocument, id: string): ReportSection => {
  const s = doc.sections.find((x) => x.id === id);
  if (!s) throw new Error(`no section ${id}`);
  return s;
};
const tables = (s: ReportSection) => s.blocks.filter((b): b is Extract<ReportBlock, { kind: 'table' }> => b.kind === 'table');
const table = (s: ReportSection, caption: RegExp) => {
  const t = tables(s).find((b) => caption.test(b.caption));
  if (!t) throw new Error(`no table "${caption}" in ${s.id}`);
  return t;
};
const facts = (s: ReportSection) => new Map(s.blocks.flatMap((b) => (b.kind === 'facts' ? b.items : [])));

describe('installation report', () => {
  it('has every required section, in order, one per board', () => {
    const { doc, result } = riser();
    const boardIds = ['board-main-switchboard', 'board-plant-room', 'board-floor-1', 'board-floor-2', 'board-floor-3', 'board-floor-4'];
    expect(doc.sections.map((s) => s.id)).toEqual(['installation', 'feeders', 'totals', ...boardIds, 'assumptions', 'standards', 'cautions']);
    expect(doc.sections.filter((s) => s.id.startsWith('board-')).map((s) => s.title)).toEqual(result.boards.map((b) => `Board: ${b.name}`));
    expect(doc.title).toBe('Maple Court riser');
    expect(doc.subtitle).toBe('Installation report · 6 boards · 230/400 V · 50 Hz');
  });

  it('describes the source, the boards and the feeder tree, with the one-line drawing', () => {
    const { doc, spec } = riser();
    const s = section(doc, 'installation');
    const f = facts(s);
    expect(f.get('Source')).toBe('transformer 315 kVA, impedance 4.5 %, X/R 4');
    expect(f.get('Circuits')).toBe('18');
    const tree = table(s, /how each is fed/);
    expect(tree.rows.map((r) => [r[0], r[1]])).toEqual([
      ['Main switchboard', 'supply'],
      ['Plant room', 'Main switchboard'],
      ['Floor 1', 'Main switchboard'],
      ['Floor 2', 'Floor 1'],
      ['Floor 3', 'Floor 2'],
      ['Floor 4', 'Floor 3'],
    ]);
    expect(tree.rows[0]![2]).toBe('185 mm² Al, 45 m at 70 °C; neutral 95 mm² Al, 45 m at 70 °C');
    expect(tree.rows.map((r) => Number(r[3]))).toEqual(tree.rows.map((r) => spec.boards.find((b) => b.name === r[0])!.loads.length));
    const figure = s.blocks.find((b) => b.kind === 'figure');
    expect(figure?.kind === 'figure' && figure.svg).toContain('data-view="one-line"');
    // The supply as the file gives it, beside the source symbol.
    expect(figure?.kind === 'figure' && figure.svg).toContain('transformer 315 kVA, 4.5 %');
  });

  it('feeder table and totals are the solved figures', () => {
    const { doc, result } = riser();
    const t = table(section(doc, 'feeders'), /every feeder/);
    expect(t.columns.map((c) => c.label)).toEqual(['To', 'From', 'A A', 'B A', 'C A', 'N A', 'Loading %', 'Drop %', 'Loss kW']);
    result.feeders.forEach((f, k) => {
      const row = t.rows[k]!;
      expect(row[0]).toBe(f.board);
      expect(row.slice(2, 5).map(Number)).toEqual(f.lines.map((l) => Number(l.current.magnitude.toFixed(1))));
      expect(Number(row[5])).toBe(Number(f.neutral!.current.magnitude.toFixed(1)));
      expect(Number(row[7])).toBe(Number(f.voltageDropPercent.toFixed(2)));
      expect(Number(row[8])).toBe(Number(f.lossesKW.toFixed(3)));
    });
    // Service feeder: 185 mm² rated 340 A carries 191.7 A → 56 %; the riser to Floor 1 (180 A) carries 152.6 A → 85 %.
    expect(t.rows[0]![6]).toBe('56');
    expect(t.rows[2]![6]).toBe('85');
    expect(t.rows[3]![6]).toBe('—');
    const totals = facts(section(doc, 'totals'));
    expect(totals.get('Lowest voltage')).toBe(`${result.totals.lowestVoltagePercent.toFixed(1)} % of nominal, at Floor 4 (${result.totals.lowestVoltageAt})`);
    expect(totals.get('Losses (source windings and every feeder)')).toBe(`${result.totals.lossesKW.toFixed(3)} kW`);
    // Source = loads + losses (power balance), as printed.
    const source = /^([\d.]+) kW/.exec(totals.get('From the source')!)![1]!;
    expect(Number(source)).toBeCloseTo(result.totals.loadKW + result.totals.lossesKW, 2);
  });

  it('every board section: panel schedule of its own circuits, voltages against limits, phasors of that board', () => {
    const { doc, result, spec } = riser();
    for (const b of result.boards) {
      const s = doc.sections.find((x) => x.title === `Board: ${b.name}`)!;
      const schedule = table(s, /Circuits as solved/);
      expect(schedule.columns.map((c) => c.label).slice(0, 8)).toEqual(['No.', 'Circuit', 'Phase', 'Breaker A, poles', 'Model', 'kW', 'kvar', 'A']);
      const own = spec.boards.find((x) => x.name === b.name)!.loads;
      expect(schedule.rows.map((r) => r[1])).toEqual(own.map((l) => l.name));
      expect(schedule.rows.map((r) => r[2])).toEqual(own.map((l) => l.connection));
      expect(schedule.rows.map((r) => Number(r[7]))).toEqual(b.result.loads.filter((l) => l.origin === 'board').map((l) => Number(l.currentA.toFixed(1))));
      const limits = table(s, /against the limits/);
      // Three phase voltages and three line-to-line voltages, each against 230 V or 400 V ± 10 % (the IEC 60038 pair).
      expect(limits.rows.map((r) => r[0])).toEqual(['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A']);
      expect(limits.rows[0]![3]).toBe('207.0 – 253.0');
      expect(limits.rows[3]![3]).toBe('360.0 – 440.0');
      b.result.phases.forEach((p, k) => {
        expect(Number(limits.rows[k]![2])).toBe(Number(p.voltagePercent.toFixed(1)));
        expect(Number(limits.rows[k]![4])).toBeCloseTo(Math.min(p.voltagePercent - 90, 110 - p.voltagePercent), 1);
        expect(limits.rows[k]![5]).toBe('within');
      });
      const fig = s.blocks.find((x) => x.kind === 'figure');
      if (fig?.kind !== 'figure') throw new Error('a phasor figure per board');
      const arrows = readPhasors(parseSvg(fig.svg));
      expect(arrows.filter((a) => a.data.quantity === 'current' && a.data.phase !== 'N').map((a) => a.data.magnitude)).toHaveLength(3);
      expect(fig.svg).toContain(b.name);
      // The warnings of that board, and only those.
      const warnings = s.blocks.find((x) => x.kind === 'list' && x.tone === 'warning');
      expect(warnings?.kind === 'list' ? warnings.items : []).toEqual(b.result.warnings.map((w) => w.message));
    }
  });

  it('a voltage outside the band reads as such: the limits verdict agrees with the warnings', () => {
    const spec = parseInstallation({
      name: 'Long run',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
      boards: [
        { name: 'Main', loads: [] },
        { name: 'Barn', fedFrom: 'Main', feeder: { lengthM: 250, line: { mm2: 10 }, neutral: { mm2: 10 } }, loads: [{ name: 'dryer', connection: 'A-N', kW: 9, model: 'constant-impedance' }] },
      ],
    });
    const result = solveInstallation(spec);
    const doc = buildInstallationReport({ spec, result });
    const barn = result.boards.find((b) => b.name === 'Barn')!.result;
    const limits = table(section(doc, 'board-barn'), /against the limits/);
    const a = barn.phases[0]!;
    expect(a.voltagePercent).toBeLessThan(90);
    expect(limits.rows[0]![5]).toBe('below the band');
    expect(Number(limits.rows[0]![4])).toBeLessThan(0);
    expect(barn.warnings.some((w) => w.code === 'undervoltage')).toBe(true);
    // A board with no circuits says so instead of an empty schedule.
    expect(section(doc, 'board-main').blocks.some((b) => b.kind === 'paragraph' && /only feeds others/.test(b.text))).toBe(true);
  });

  it("follows the file's conventions: L1/L2/L3 in every table and drawing, and the limits it names", () => {
    const text = readFileSync(RISER, 'utf8')
      .replace(/connection: A-N/g, 'connection: L1-N')
      .replace(/connection: B-N/g, 'connection: L2-N')
      .replace(/connection: C-N/g, 'connection: L3-N')
      .replace(/connection: A-B/g, 'connection: L1-L2')
      .replace(/connection: ABC-delta/g, 'connection: L1L2L3-delta');
    const file = { ...(readBoardText(text) as object), conventions: { voltageLimits: 'c84-service-a' } };
    const spec = parseInstallation(file);
    const result = solveInstallation(file);
    expect(result.boards[0]!.result.conventions.phaseNames).toBe('L1/L2/L3');
    const doc = buildInstallationReport({ spec, result });
    const floor4 = section(doc, 'board-floor-4');
    const schedule = table(floor4, /Circuits as solved/);
    expect(schedule.rows.map((r) => r[2])).toEqual(['L1-N', 'L2-N', 'L3-N', 'L1-L2']);
    const limits = table(floor4, /against the limits/);
    expect(limits.note).toContain('±5 % of nominal (c84-service-a)');
    expect(limits.rows.map((r) => r[0])).toEqual(['L1-N', 'L2-N', 'L3-N', 'L1-L2', 'L2-L3', 'L3-L1']);
    expect(limits.rows[0]![3]).toBe('218.5 – 241.5');
    expect(limits.note).toContain('ANSI C84.1 Range A');
    // Verdicts agree with the board's own voltage check (which also judges every load).
    const floor4Result = result.boards.find((b) => b.name === 'Floor 4')!.result;
    const anyOutside = limits.rows.some((r) => r[5] !== 'within');
    if (anyOutside) expect(floor4Result.voltageCheck.verdict).not.toBe('within');
    expect(table(section(doc, 'feeders'), /every feeder/).columns.map((c) => c.label).slice(2, 6)).toEqual(['L1 A', 'L2 A', 'L3 A', 'N A']);
    const oneLine = section(doc, 'installation').blocks.find((b) => b.kind === 'figure');
    expect(oneLine?.kind === 'figure' && oneLine.svg).toMatch(/L1 [\d.]+ · L2 [\d.]+ · L3 [\d.]+ A/);
    const phasors = floor4.blocks.find((b) => b.kind === 'figure');
    expect(phasors?.kind === 'figure' && phasors.svg).toContain('font-size="0.75em">L1</tspan>');
    expect(phasors?.kind === 'figure' && phasors.svg).toContain('0° = phase-L1 source voltage');
  });

  it('cautions from every board, once each; installation assumptions stated', () => {
    const { doc, result } = riser();
    const cautions = section(doc, 'cautions').blocks[0]!;
    if (cautions.kind !== 'list') throw new Error('cautions are a list');
    const all = [...new Set(result.boards.flatMap((b) => b.result.cautions))];
    expect(cautions.items).toEqual(all);
    const assumptions = section(doc, 'assumptions').blocks[0]!;
    expect(assumptions.kind === 'list' && assumptions.items.some((i) => i.includes('radial'))).toBe(true);
  });

  it('HTML and Markdown: self-contained, figure files unique per board, the same text twice', () => {
    const { doc } = riser();
    const html = renderReportHtml(doc);
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|url\(|https?:\/\/(?!www\.w3\.org\/2000\/svg)/i);
    expect(html.match(/<svg /g)?.length).toBe(7); // one-line + one phasor diagram per board
    for (const s of doc.sections) expect(html).toContain(`<section id="${s.id}">`);
    expect(renderReportHtml(riser().doc)).toBe(html);
    const md = renderReportMarkdown(doc, 'riser');
    const names = md.files.map((f) => f.name);
    expect(new Set(names).size).toBe(names.length);
    expect(names).toContain('riser-one-line.svg');
    expect(names).toContain('riser-board-floor-4-phasors.svg');
  });
});
