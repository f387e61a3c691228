/**
 * The current-triangle drawing of a line that carries nothing prints no figure of zero to three places
 * beside the real ones: 'no current', and a plain 0 for its parts. Invented: a print works whose only
 * load, a 10 kW pf 0.75 guillotine, sits across A-B, with 4 kvar across the same pair.
 */
import { describe, expect, it } from 'vitest';
import { addHandCapacitors, normaliseBoard, parseBoard, renderCurrentTriangles, solveBoardModel } from '@trivar/core';

const board = normaliseBoard(
  parseBoard({
    name: 'Lantern Yard print works',
    supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } },
    loads: [{ name: 'Guillotine', connection: 'A-B', kW: 10, pf: 0.75 }],
  }),
);
const before = solveBoardModel(board);
const after = solveBoardModel(addHandCapacitors(board, { capacitors: [{ branch: 'A-B', kvar: 4 }] }));
const texts = [...renderCurrentTriangles(before, after).matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]!);

describe('an idle line in the current triangles', () => {
  it('line C: no current before or after, and its parts as a plain 0', () => {
    const at = texts.indexOf('line C');
    expect(texts.slice(at + 1, at + 5)).toEqual(['before no current', 'after no current', 'active 0 → 0 A', 'reactive 0 → 0 A']);
    expect(texts.join('\n')).not.toContain('0.000');
  });

  it('line A keeps its figures: 10 kW at 0.75 across 400 V is about 33 A before', () => {
    const at = texts.indexOf('line A');
    expect(texts[at + 1]).toMatch(/^before 3\d\.\d A · PF 0\.\d{3} (lag|lead)$/);
  });
});
