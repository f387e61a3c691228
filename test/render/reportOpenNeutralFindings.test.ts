/**
 * The report's broken-neutral section states as much as `trivar solve` does about how far its voltages can
 * be trusted: the same board with every load as a constant impedance, another solution of the same
 * equations, the loads below the low-voltage rule (marked *), and every finding and caution of the study.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildBoardReport, normaliseBoard, parseBoard, readBoardText, renderReportMarkdown, solveBoardModel, OPEN_NEUTRAL_METHOD, type ReportBlock } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const HOUSE = 'examples/maple-lane-house.yaml';

function house() {
  const spec = parseBoard(readBoardText(readFileSync(new URL(`../../${HOUSE}`, import.meta.url), 'utf8')));
  const result = solveBoardModel(normaliseBoard(spec));
  const doc = buildBoardReport({ spec, result });
  return { result, doc, section: doc.sections.find((s) => s.id === 'open-neutral')! };
}

const tableOf = (blocks: readonly ReportBlock[]) => blocks.find((b): b is Extract<ReportBlock, { kind: 'table' }> => b.kind === 'table')!;
const listOf = (blocks: readonly ReportBlock[], tone: 'warning' | 'caution') => blocks.find((b): b is Extract<ReportBlock, { kind: 'list' }> => b.kind === 'list' && b.tone === tone);

describe('report: if the neutral conductor broke', () => {
  it('lists the state reached beside the impedance model and the other solution, the loads below the low-voltage rule marked', () => {
    const { section } = house();
    const t = tableOf(section.blocks);
    expect(t.columns.map((c) => c.label)).toEqual(['Circuit', 'Line', 'V', '%nom', 'Verdict', 'V if Z', '%nom if Z', 'V alt', '%nom alt']);
    const row = (name: string) => t.rows.find((r) => r[0] === name)!;
    // The figures trivar solve prints for this board: reached 209.3 V / 28.8 V*, 127.9 V and 109.1 V as
    // impedances, 109.0 V and 127.8 V in the other solution.
    expect(row('Kitchen')).toEqual(['Kitchen', 'A', '209.3', '174.4', 'overvoltage', '127.9', '106.6', '109.0', '90.9']);
    expect(row('Bedrooms')).toEqual(['Bedrooms', 'B', '28.8*', '24.0', 'undervoltage', '109.1', '90.9', '127.8', '106.5']);
    expect(t.note).toContain('*: below the low-voltage rule, taken as an impedance');
    expect(t.note).toContain('V if Z: every load as a constant impedance');
    expect(t.note).toContain('V alt: another solution of the same equations');
  });

  it('carries every finding of the study (low-voltage rule and collapse, two solutions, load model) and its cautions', () => {
    const { section, result } = house();
    const on = result.openNeutral!;
    expect(on.findings.length).toBe(3);
    const findings = listOf(section.blocks, 'warning')!;
    expect(findings.items).toEqual(on.findings);
    expect(findings.items.join(' ')).toContain('ceases to exist at about 0.98 ohm');
    expect(findings.items.join(' ')).toContain('The open-neutral equations have 2 solutions');
    expect(findings.items.join(' ')).toContain('"Kitchen" would see 127.9 V (106.6 %) instead of 209.3 V');
    expect(listOf(section.blocks, 'caution')!.items).toEqual(on.cautions);
    expect(section.blocks[0]).toEqual({ kind: 'paragraph', text: OPEN_NEUTRAL_METHOD });
  });

  it('states no less than trivar solve on the same file: each of its findings, figures and the key to its columns', () => {
    const { doc } = house();
    const md = renderReportMarkdown(doc, 'house').markdown;
    const solved = runTrivar(['solve', HOUSE]);
    expect(solved.code).toBe(0);
    const block = solved.stdout.slice(solved.stdout.indexOf('If the neutral conductor broke'), solved.stdout.indexOf('\nWarnings'));
    // Every "!" line of solve's block, unwrapped, is a sentence of the report.
    const said = block
      .split(/\n  ! /)
      .slice(1)
      .map((s) => s.replace(/\s*\n\s*/g, ' ').trim());
    expect(said.length).toBe(5);
    const plainMd = md.replace(/\\/g, '');
    for (const s of said) expect(plainMd).toContain(s);
    for (const figure of ['127.9', '109.0', '109.1', '127.8', '28.8*']) {
      expect(block).toContain(figure);
      expect(plainMd).toContain(figure);
    }
  });
});
