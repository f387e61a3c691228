/**
 * A drawing's heading as the caller gives it: an empty (or blank) title means no heading, and the <title> is
 * then the thing drawn alone — never ": name", as `renderPhasorDiagram(result, { title: '' })` gave. A title
 * that is not text is an InputError naming options.title (it was a TypeError from inside the escaping).
 *
 * Invented: the Lantern Yard print works, a 400 V board with a 10 kW guillotine across A-B, 4 kvar beside it.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  addHandCapacitors,
  InputError,
  normaliseBoard,
  parseBoard,
  readBoardText,
  renderCurrentTriangles,
  renderImpedanceScan,
  renderOneLineDiagram,
  renderPhasorDiagram,
  renderSequenceDiagram,
  solveBoardModel,
  solveInstallation,
  studyHarmonics,
} from '@trivar/core';

const board = normaliseBoard(
  parseBoard({
    name: 'Lantern Yard print works',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
    loads: [{ name: 'Guillotine', connection: 'A-B', kW: 10, pf: 0.75 }],
  }),
);
const result = solveBoardModel(board);
const after = solveBoardModel(addHandCapacitors(board, { capacitors: [{ branch: 'A-B', kvar: 4 }] }));
const example = (name: string) => readBoardText(readFileSync(new URL(`../../examples/${name}`, import.meta.url), 'utf8'));

const titleOf = (svg: string) => /<title>([^<]*)<\/title>/.exec(svg)![1];
/** The bold heading at the top of a drawing (y = 22), or null where none is drawn. */
const headingOf = (svg: string) => /<text [^>]*y="22"[^>]*font-weight="bold"[^>]*>([^<]*)<\/text>|<text [^>]*y="22"[^>]*>([^<]*)<\/text>/.exec(svg)?.slice(1).find((x) => x !== undefined) ?? null;

const drawings: readonly [string, (title: unknown) => string, string, string][] = [
  ['phasors', (title) => renderPhasorDiagram(result, { title } as never), 'Phasors at the board', 'Lantern Yard print works'],
  ['sequence', (title) => renderSequenceDiagram(result, { title } as never), 'Symmetrical components', 'Lantern Yard print works'],
  ['triangles', (title) => renderCurrentTriangles(result, after, { title } as never), 'Line current triangles — before and after', 'Lantern Yard print works'],
];

describe('drawing titles', () => {
  it.each(drawings)('%s: the default, a title of the caller’s, and none', (_, draw, fallback, name) => {
    expect(titleOf(draw(undefined))).toBe(`${fallback}: ${name}`);
    expect(headingOf(draw(undefined))).toBe(fallback);
    expect(titleOf(draw('Press hall'))).toBe(`Press hall: ${name}`);
    expect(headingOf(draw('Press hall'))).toBe('Press hall');
    for (const none of ['', '  ']) {
      const svg = draw(none);
      expect(titleOf(svg)).toBe(name);
      expect(headingOf(svg)).toBeNull();
    }
  });

  it.each(drawings)('%s: a title that is not text is refused naming options.title', (_, draw) => {
    for (const bad of [5, null, { text: 'x' }]) {
      let caught: unknown;
      try {
        draw(bad);
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(InputError);
      expect((caught as InputError).issues[0]!.path).toBe('options.title');
      expect((caught as InputError).issues[0]!.message).toMatch(/^options\.title: expected the drawing's heading as text \(''/);
    }
  });

  it('the one-line drawing and the impedance scan follow the same rule', () => {
    const riser = solveInstallation(example('maple-court-riser.yaml'));
    const name = riser.installation.name;
    expect(titleOf(renderOneLineDiagram(riser, { title: '' }))).toBe(name);
    expect(titleOf(renderOneLineDiagram(riser))).toBe(`One-line drawing of the installation: ${name}`);
    expect(() => renderOneLineDiagram(riser, { title: 7 as never })).toThrow(InputError);
    const scan = studyHarmonics(example('mill-street-offices.yaml')).scan;
    const untitled = renderImpedanceScan(scan, '');
    // The scan names no board: its <title> keeps the default words; no heading is drawn.
    expect(titleOf(untitled)).toBe('Impedance seen by harmonic currents, by bank state');
    expect(headingOf(untitled)).toBeNull();
    expect(headingOf(renderImpedanceScan(scan, 'Tuned bank, all steps'))).toBe('Tuned bank, all steps');
    expect(() => renderImpedanceScan(scan, 3 as never)).toThrow(/title: expected the drawing's heading as text/);
  });
});
