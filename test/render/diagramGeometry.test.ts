/**
 * The drawings show the solved figures: every arrow tip, read back from the
 * SVG and converted with the scale bar printed on the drawing, lands on the
 * phasor the solver returned. Checked on every example board, before/after
 * correction overlays, sequence components and current triangles, and on
 * random boards (fast-check).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  correctBoard,
  normaliseBoard,
  parseBoard,
  readBoardText,
  renderCurrentTriangles,
  renderPhasorDiagram,
  renderSequenceDiagram,
  solveBoard,
  solveBoardModel,
  type BoardResult,
  type ComplexValue,
} from '@trivar/core';
import { parseSvg, readPhasors, readScales, type DrawnPhasor } from './svgReading.js';
import { boardSpecArb } from '../property/arbitraries/boardSpec.js';
import { FigureLog } from '../support/figureLog.js';
import { fileURLToPath } from 'node:url';
import { isBoardExample } from '../support/boardExamples.js';

const figures = new FigureLog(new URL('./.diagram-geometry.json', import.meta.url));
afterAll(() => figures.write());

const EXAMPLES = new URL('../../examples/', import.meta.url);
const exampleFiles = readdirSync(EXAMPLES).filter(isBoardExample(fileURLToPath(EXAMPLES)));
const loadExample = (f: string) => parseBoard(readBoardText(readFileSync(new URL(f, EXAMPLES), 'utf8')));

/**
 * Coordinates are written with two decimals and the scale bar's length too, so a tip can be
 * off by ~0.007 px from rounding and ~1e-4 relative from the bar: 0.05 px is far below what
 * anyone can see and far above rounding.
 */
const TIP_TOLERANCE_PX = 0.05;

/** Distance between a drawn tip and where the phasor should be, px. */
function tipError(p: DrawnPhasor, expected: ComplexValue, pxPerUnit: number): number {
  const x = p.from.x + expected.re * pxPerUnit;
  const y = p.from.y - expected.im * pxPerUnit;
  return Math.hypot(p.tip.x - x, p.tip.y - y);
}

function scaleOf(svg: string, unit: string): number {
  const s = readScales(parseSvg(svg)).find((x) => x.unit === unit);
  if (!s) throw new Error(`no ${unit} scale bar`);
  return s.pxPerUnit;
}

/** Checks every phasor of `result` drawn with state `state`; returns the largest error, px. */
function checkPhasorDiagram(svg: string, result: BoardResult, state: string): number {
  const drawn = readPhasors(parseSvg(svg)).filter((p) => p.data.state === state);
  const kV = scaleOf(svg, 'V');
  const kI = scaleOf(svg, 'A');
  let worst = 0;
  let count = 0;
  for (const ph of result.phases) {
    for (const [quantity, value, k] of [
      ['voltage', ph.voltage, kV],
      ['current', ph.current, kI],
    ] as const) {
      const arrow = drawn.find((d) => d.data.quantity === quantity && d.data.phase === ph.phase);
      if (!arrow) throw new Error(`no ${quantity} arrow for ${ph.phase} (${state})`);
      worst = Math.max(worst, tipError(arrow, value, k));
      count++;
    }
  }
  if (result.neutral && !result.board.neutralOpen) {
    const n = drawn.find((d) => d.data.phase === 'N');
    if (!n) throw new Error('no neutral current arrow');
    worst = Math.max(worst, tipError(n, result.neutral.current, kI));
    count++;
  }
  expect(drawn).toHaveLength(count);
  return worst;
}

describe('phasor diagram', () => {
  it.each(exampleFiles)('arrow tips match the solved phasors: %s', (file) => {
    const result = solveBoardModel(normaliseBoard(loadExample(file)));
    const worst = checkPhasorDiagram(renderPhasorDiagram(result), result, 'only');
    figures.note('phasor tip error, px', worst, file);
    expect(worst).toBeLessThan(TIP_TOLERANCE_PX);
  });

  it('overlays before and after a correction, each on the same scale', () => {
    const spec = loadExample('riverside-cold-store.yaml');
    const v = correctBoard(normaliseBoard(spec), spec.correction).verification;
    const svg = renderPhasorDiagram(v.before, { after: v.after });
    const worst = Math.max(checkPhasorDiagram(svg, v.before, 'before'), checkPhasorDiagram(svg, v.after, 'after'));
    figures.note('phasor tip error, px', worst, 'riverside overlay');
    expect(worst).toBeLessThan(TIP_TOLERANCE_PX);
  });

  it('holds on random boards of every system (fast-check)', () => {
    fc.assert(
      fc.property(boardSpecArb({ maxLoads: 4 }), (spec) => {
        let result: BoardResult;
        try {
          result = solveBoard(spec);
        } catch {
          return; // boards beyond what the supply can deliver are not this test's subject
        }
        const worst = checkPhasorDiagram(renderPhasorDiagram(result), result, 'only');
        figures.note('phasor tip error, px (random boards)', worst, spec.name ?? null);
        expect(worst).toBeLessThan(TIP_TOLERANCE_PX);
      }),
      { numRuns: 60 },
    );
  });
});

describe('sequence view', () => {
  it.each(['corner-bakery.yaml', 'hillside-workshop.yaml'])('each panel shows its component and the phases it implies: %s', (file) => {
    const result = solveBoardModel(normaliseBoard(loadExample(file)));
    const svg = renderSequenceDiagram(result);
    const drawn = readPhasors(parseSvg(svg));
    // Fortescue (phase-A reference, ABC): phase B of the positive set lags A by 120°, of the negative set leads it.
    const rot = (z: ComplexValue, deg: number): ComplexValue => {
      const a = (deg * Math.PI) / 180;
      return { re: z.re * Math.cos(a) - z.im * Math.sin(a), im: z.re * Math.sin(a) + z.im * Math.cos(a) };
    };
    const shift = { zero: 0, positive: -120, negative: 120 } as const;
    let worst = 0;
    for (const [quantity, set, unit] of [
      ['voltage', result.sequences!.voltage, 'V'],
      ['current', result.sequences!.current, 'A'],
    ] as const) {
      const k = readScales(parseSvg(svg)).find((s) => s.unit === unit)!.pxPerUnit;
      for (const component of ['zero', 'positive', 'negative'] as const) {
        const phases = component === 'zero' ? (['A'] as const) : (['A', 'B', 'C'] as const);
        phases.forEach((phase, n) => {
          const arrow = drawn.find((d) => d.data.quantity === quantity && d.data.component === component && d.data.phase === phase)!;
          worst = Math.max(worst, tipError(arrow, rot(set[component], n * shift[component]), k));
        });
      }
    }
    figures.note('sequence tip error, px', worst, file);
    expect(worst).toBeLessThan(TIP_TOLERANCE_PX);
  });
});

describe('current triangles', () => {
  it('draw each line current before and after in the frame of its voltage, as the correction study reports it', () => {
    const spec = loadExample('riverside-cold-store.yaml');
    const v = correctBoard(normaliseBoard(spec), spec.correction).verification;
    const svg = renderCurrentTriangles(v.before, v.after);
    const drawn = readPhasors(parseSvg(svg));
    const k = scaleOf(svg, 'A');
    let worst = 0;
    for (const line of v.lines) {
      for (const state of ['before', 'after'] as const) {
        const arrow = drawn.find((d) => d.data.phase === line.phase && d.data.state === state)!;
        // The frame: voltage along +x, lagging reactive current downward (−im in the drawing's sense).
        const expected = { re: line.activeCurrentA[state], im: -line.reactiveCurrentA[state] };
        worst = Math.max(worst, tipError(arrow, expected, k));
      }
      const change = drawn.find((d) => d.data.phase === line.phase && d.data.state === 'change')!;
      const expectedChange = { re: line.activeCurrentA.change, im: -line.reactiveCurrentA.change };
      worst = Math.max(worst, tipError(change, expectedChange, k));
    }
    figures.note('triangle tip error, px', worst, 'riverside');
    expect(worst).toBeLessThan(TIP_TOLERANCE_PX);
  });
});

describe('deterministic output', () => {
  it('the same board gives the same characters, also from a JSON round trip of the result', () => {
    const spec = loadExample('corner-bakery.yaml');
    const a = solveBoardModel(normaliseBoard(spec));
    const b = JSON.parse(JSON.stringify(solveBoardModel(normaliseBoard(spec)))) as BoardResult;
    expect(renderPhasorDiagram(b)).toBe(renderPhasorDiagram(a));
    expect(renderSequenceDiagram(b)).toBe(renderSequenceDiagram(a));
    expect(renderPhasorDiagram(a)).not.toMatch(/NaN|Infinity|undefined/);
  });
});
