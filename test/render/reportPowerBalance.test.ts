/**
 * A board's power balance in the report, worded as `trivar solve` words it: loads on the board, the
 * loss in its feeder (a sub-board) or in the source and feeder (the main board), the boards beyond it,
 * and what comes in from the board feeding it or from the source. The figures add up on every board.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildInstallationReport, parseInstallation, readBoardText, renderReportMarkdown, solveInstallation, type ReportSection } from '@trivar/core';

const RISER = new URL('../../examples/maple-court-riser.yaml', import.meta.url);

function riser() {
  const spec = parseInstallation(readBoardText(readFileSync(RISER, 'utf8')));
  const result = solveInstallation(spec);
  return { result, doc: buildInstallationReport({ spec, result }) };
}

const facts = (s: ReportSection) => new Map(s.blocks.flatMap((b) => (b.kind === 'facts' ? b.items : [])));
/** The first figure of a fact: "58.393 kW, 18.198 kvar" → 58.393. */
const kW = (text: string | undefined): number => {
  const m = /^(-?[\d.]+) kW/.exec(text ?? '');
  if (!m) throw new Error(`no kW figure in "${text}"`);
  return Number(m[1]);
};

describe('installation report: each board\'s power balance', () => {
  it('names the board feeding a sub-board and its own feeder, and the figures add up on every board', () => {
    const { doc, result } = riser();
    for (const b of result.boards) {
      const f = facts(doc.sections.find((s) => s.title === `Board: ${b.name}`)!);
      const loads = kW(f.get('Loads on this board'));
      const feedsOthers = result.boards.some((x) => x.fedFrom === b.name);
      const beyond = feedsOthers ? kW(f.get('Boards beyond (the boards it feeds, with their feeders)')) : 0;
      expect(f.has('Boards beyond (the boards it feeds, with their feeders)')).toBe(feedsOthers);
      const loss = kW(f.get(b.fedFrom === null ? 'Losses in source and feeder' : `Losses in its feeder (from ${b.fedFrom})`));
      const into = kW(f.get(b.fedFrom === null ? 'From the source' : `From ${b.fedFrom}`));
      // Each figure is printed to 0.001 kW: the sum is within three half-units of the last digit.
      expect(Math.abs(loads + loss + beyond - into)).toBeLessThanOrEqual(0.0015);
      // A sub-board says nothing of the source: its loss is its feeder's, what comes in comes from its parent.
      if (b.fedFrom !== null) {
        expect(f.has('From the source')).toBe(false);
        expect(f.has('Losses in source and feeder')).toBe(false);
      }
    }
  });

  it('Floor 1: 13.700 kW of loads + 0.151 kW in its feeder + 44.542 kW beyond = 58.393 kW from the Main switchboard, as solve gives them', () => {
    const { doc, result } = riser();
    const f = facts(doc.sections.find((s) => s.title === 'Board: Floor 1')!);
    expect(f.get('Loads on this board')).toBe('13.700 kW, 4.031 kvar');
    expect(f.get('Losses in its feeder (from Main switchboard)')).toBe('0.151 kW (line conductors 0.117, neutral 0.034)');
    expect(f.get('Boards beyond (the boards it feeds, with their feeders)')).toBe('44.542 kW, 14.129 kvar');
    expect(f.get('From Main switchboard')).toBe('58.393 kW, 18.198 kvar');
    // By hand: 13.700 + 0.151 + 44.542 = 58.393.
    expect(13.7 + 0.151 + 44.542).toBeCloseTo(58.393, 9);
    // The boards beyond are Floor 2 with everything past it: what enters Floor 2's feeder.
    const floor2 = result.boards.find((b) => b.name === 'Floor 2')!.result.source;
    expect(floor2.kW.toFixed(3)).toBe('44.542');
  });

  it('the main board keeps the source wording and adds the boards it feeds: 13.000 + 0.982 + 71.955 = 85.937 kW', () => {
    const { doc, result } = riser();
    const f = facts(doc.sections.find((s) => s.title === 'Board: Main switchboard')!);
    expect(f.get('Loads on this board')).toBe('13.000 kW, 8.204 kvar');
    expect(f.get('Losses in source and feeder')).toBe('0.982 kW (source 0.328, line conductors 0.525, neutral 0.129)');
    expect(f.get('Boards beyond (the boards it feeds, with their feeders)')).toBe('71.955 kW, 23.046 kvar');
    expect(f.get('From the source')).toBe('85.937 kW, 32.804 kvar');
    expect(result.totals.sourceKW.toFixed(3)).toBe('85.937');
  });

  it('the Markdown report words it the same way', () => {
    const { doc } = riser();
    const md = renderReportMarkdown(doc, 'riser').markdown;
    const floor1 = md.slice(md.indexOf('## Board: Floor 1'), md.indexOf('## Board: Floor 2'));
    expect(floor1).toContain('- **Loads on this board:** 13.700 kW, 4.031 kvar');
    expect(floor1).toContain('- **Losses in its feeder (from Main switchboard):** 0.151 kW');
    expect(floor1).toContain('- **Boards beyond (the boards it feeds, with their feeders):** 44.542 kW, 14.129 kvar');
    expect(floor1).toContain('- **From Main switchboard:** 58.393 kW, 18.198 kvar');
    expect(floor1).not.toContain('From the source');
    expect(floor1).not.toContain('Losses in source and feeder');
    // The last board of the riser feeds none: no boards-beyond line.
    const floor4 = md.slice(md.indexOf('## Board: Floor 4'));
    // 15.500 kW of loads + 0.004 kW in its feeder.
    expect(floor4).toContain('- **Loads on this board:** 15.500 kW');
    expect(floor4).toContain('- **From Floor 3:** 15.504 kW, 5.039 kvar');
    expect(floor4.slice(0, floor4.indexOf('## ', 5))).not.toContain('Boards beyond');
  });

  it('a sub-board that only exports sends its power to its parent, in solve\'s words, and still adds up', () => {
    // A smallholding on a 120/240 V service: the farmhouse panel, and a barn roof array fed back through its own feeder.
    const spec = parseInstallation({
      name: 'Hillcrest smallholding',
      supply: { voltage: '120/240', frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.2, xOverR: 1.8 } },
      boards: [
        { name: 'Farmhouse panel', loads: [{ name: 'Stove', connection: 'L1-L2', kW: 8, model: 'constant-impedance' }, { name: 'Pantry freezer', connection: 'L1-N', kW: 1.8, pf: 0.95 }] },
        { name: 'Barn array', fedFrom: 'Farmhouse panel', feeder: { lengthFt: 80, line: { awg: '10' }, neutral: { awg: '10' } }, loads: [{ name: 'Roof inverter', connection: 'L1-L2', kW: -7.6, pf: 1 }] },
      ],
    });
    const result = solveInstallation(spec);
    const doc = buildInstallationReport({ spec, result });
    const barn = facts(doc.sections.find((s) => s.title === 'Board: Barn array')!);
    const loads = kW(barn.get('Loads on this board (net: consumption minus generation)'));
    const loss = kW(barn.get('Losses in its feeder (from Farmhouse panel)'));
    const exported = /^([\d.]+) kW exported/.exec(barn.get('To Farmhouse panel') ?? '')![1]!;
    expect(loads).toBe(-7.6);
    expect(Math.abs(loads + loss + Number(exported))).toBeLessThanOrEqual(0.0015);
    expect(barn.has('From Farmhouse panel')).toBe(false);
    // The farmhouse's boards beyond are the array's export, negative in the load convention.
    const house = facts(doc.sections.find((s) => s.title === 'Board: Farmhouse panel')!);
    expect(kW(house.get('Boards beyond (the boards it feeds, with their feeders)'))).toBe(-Number(exported));
  });
});
