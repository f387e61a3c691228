/**
 * The current-triangle drawing of a line that carries nothing prints no figure of zero to three places
 * beside the real ones: 'no current', and its parts as 0.0, to the 0.1 A of every other label and of correct's line
 * table (which prints such a line 0.0 → 0.0). Invented: a print works whose only
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
  it('line C: no current before or after, and its parts as 0.0 like every other label', () => {
    const at = texts.indexOf('line C');
    expect(texts.slice(at + 1, at + 5)).toEqual(['before no current', 'after no current', 'active 0.0 → 0.0 A', 'reactive 0.0 → 0.0 A']);
    expect(texts.join('\n')).not.toContain('0.000');
  });

  it('line A keeps its figures: 10 kW at 0.75 across 400 V is about 33 A before', () => {
    const at = texts.indexOf('line A');
    expect(texts[at + 1]).toMatch(/^before 3\d\.\d A · PF 0\.\d{3} (lag|lead)$/);
  });
});

describe('an idle line in diagram --with-correction, beside correct\'s line table', () => {
  it('a forge bay welder across A-B on a 3-wire supply: line C reads 0.0 → 0.0 A in the drawing as in the table', async () => {
    const { mkdtempSync, readFileSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const { runTrivar } = await import('../cli/runTrivar.js');
    const dir = mkdtempSync(join(tmpdir(), 'trivar-idle-line-'));
    const file = join(dir, 'forge-bay.yaml');
    writeFileSync(
      file,
      [
        '# Invented: a forge bay, one 18 kW welder at PF 0.65 across A-B, a delta bank to 0.95 on each line.',
        'name: Forge bay',
        'supply: { system: three-phase-3wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
        'feeder:',
        '  line: { lengthM: 60, rOhmPerKm: 0.1, xOhmPerKm: 0.08, ratingA: 160 }',
        'loads:',
        '  - { name: Welder, connection: A-B, model: constant-impedance, kW: 18, pf: 0.65 }',
        'correction: { arrangement: delta-bank, target: { pf: 0.95, definition: per-line } }',
        '',
      ].join('\n'),
    );
    const svg = join(dir, 'triangles.svg');
    const r = runTrivar(['diagram', file, '--view', 'triangles', '--with-correction', '-o', svg]);
    expect(r.stderr).toBe('');
    const labels = [...readFileSync(svg, 'utf8').matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]!);
    const at = labels.indexOf('line C');
    expect(labels.slice(at + 1, at + 5)).toEqual(['before no current', 'after no current', 'active 0.0 → 0.0 A', 'reactive 0.0 → 0.0 A']);
    // Every current label of the drawing to 0.1 A: no bare 0 among them.
    for (const l of labels.filter((t) => /^(active|reactive) /.test(t))) expect(l).toMatch(/^(active|reactive) -?\d+\.\d → -?\d+\.\d A$/);
    const row = runTrivar(['correct', file]).stdout.split('\n').find((l) => /^\s+C\s/.test(l))!;
    expect(row.trim().split(/\s{2,}/).slice(1, 4)).toEqual(['0.0 → 0.0', '0.0 → 0.0', '0.0 → 0.0']);
  });
});
