/**
 * The resonance-scan chart and the harmonic section of the report: every
 * plotted point, read back through the plot frame's stated ranges, is the
 * study's largest |Z| over the terminal pairs at that order.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildBoardReport, normaliseBoard, parseBoard, readBoardText, renderImpedanceScan, solveBoardModel, studyHarmonics, HARMONICS_CAUTIONS } from '@trivar/core';
import { parseSvg } from './svgReading.js';

const text = readFileSync(new URL('../../examples/mill-street-offices.yaml', import.meta.url), 'utf8');

describe('impedance scan chart', () => {
  it('plots each kvar level once, every point on the study figure', () => {
    const h = studyHarmonics(readBoardText(text));
    const root = parseSvg(renderImpedanceScan(h.scan));
    const plot = Array.from(root.getElementsByTagName('rect')).find((r) => r.getAttribute('class') === 'plot')!;
    const [x0, x1] = plot.getAttribute('data-x-range')!.split(' ').map(Number) as [number, number];
    const [, y1] = plot.getAttribute('data-y-range')!.split(' ').map(Number) as [number, number];
    const px = { x: Number(plot.getAttribute('x')), y: Number(plot.getAttribute('y')), w: Number(plot.getAttribute('width')), h: Number(plot.getAttribute('height')) };
    const lines = Array.from(root.getElementsByTagName('polyline'));
    const levels = new Set(h.scan.combinations.map((c) => c.capacitorKvar.toFixed(6)));
    expect(lines).toHaveLength(Math.min(7, levels.size));
    let worst = 0;
    for (const line of lines) {
      const state = h.scan.combinations.find((c) => c.label === line.getAttribute('data-state'))!;
      const points = line.getAttribute('points')!.split(' ').map((p) => p.split(',').map(Number) as [number, number]);
      expect(points).toHaveLength(h.scan.orders.length);
      points.forEach(([x, y], k) => {
        const order = x0 + ((x - px.x) / px.w) * (x1 - x0);
        const z = ((px.y + px.h - y) / px.h) * y1;
        const expected = Math.max(...state.impedanceOhm.map((pair) => pair[k]!));
        expect(Math.abs(order - h.scan.orders[k]!)).toBeLessThan(0.01);
        worst = Math.max(worst, Math.abs(z - expected) / y1);
      });
    }
    // Coordinates carry two decimals on a 230 px plot: 0.005 px is 2e-5 of the range.
    expect(worst).toBeLessThan(1e-4);
  });
});

describe('report with a harmonic study', () => {
  it('replaces the resonance estimate with the study, names IEEE 519 and carries the harmonic cautions', () => {
    const spec = parseBoard(readBoardText(text));
    const result = solveBoardModel(normaliseBoard(spec));
    const harmonics = studyHarmonics(readBoardText(text));
    const doc = buildBoardReport({ spec, result, harmonics });
    const ids = doc.sections.map((s) => s.id);
    expect(ids.filter((i) => i === 'harmonics')).toHaveLength(1);
    const section = doc.sections.find((s) => s.id === 'harmonics')!;
    const currents = section.blocks.find((b) => b.kind === 'table')!;
    if (currents.kind !== 'table') throw new Error('a table');
    expect(currents.rows.map((r) => r[0])).toEqual(['A', 'B', 'C', 'N']);
    expect(Number(currents.rows[3]![1])).toBeCloseTo(harmonics.neutral!.current.rms, 1);
    expect(section.blocks.some((b) => b.kind === 'figure' && b.name === 'impedance-scan')).toBe(true);
    const standards = doc.sections.find((s) => s.id === 'standards')!.blocks[0]!;
    if (standards.kind !== 'table') throw new Error('a table');
    expect(standards.rows.map((r) => r[0])).toContain('IEEE Std 519-2014');
    const cautions = doc.sections.find((s) => s.id === 'cautions')!.blocks[0]!;
    if (cautions.kind !== 'list') throw new Error('a list');
    for (const c of HARMONICS_CAUTIONS) expect(cautions.items).toContain(c);
  });
});
