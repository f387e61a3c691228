/**
 * The current-triangle drawing prints every current as the correction's line table does: to 0.1 A, and to two
 * significant figures only where 0.1 A would print a real current as 0.0 (the warnings' rule). A line whose
 * reactive part the bank all but cancels read "24.9 → 0.129 A" among one-decimal figures; `trivar correct`
 * prints the same figure as "24.9 → 0.1".
 *
 * Invented: the Orchard Rise pump shed, a 120/240 V split-phase board on an ideal source behind 20 m of
 * 1.0 + j0.5 ohm/km cable, a 2.4 kW irrigation pump on A-N, a 1.2 kW fan on B-N and a 4.8 kW welder across A-B.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, readBoardText, renderCurrentTriangles, solveBoardModel, type BoardResult } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const PUMP_SHED = `name: Orchard Rise pump shed
supply:
  system: split-phase
  voltage: { lineToNeutral: 120 }
  frequencyHz: 60
feeder:
  line: { lengthM: 20, rOhmPerKm: 1.0, xOhmPerKm: 0.5, ratingA: 100 }
  neutral: { lengthM: 20, rOhmPerKm: 1.0, xOhmPerKm: 0.5, ratingA: 100 }
loads:
  - { name: Irrigation pump, connection: A-N, model: constant-impedance, kW: 2.4, pf: 0.7 }
  - { name: Vent fan, connection: B-N, model: constant-impedance, kW: 1.2, pf: 0.8 }
  - { name: Welder, connection: A-B, model: constant-impedance, kW: 4.8, pf: 0.75 }
correction:
  target: { pf: 0.95 }
`;

const textsOf = (svg: string) => [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]!);

describe('current labels of the triangles drawing', () => {
  it('agree with the correction line table, one decimal each: line B reactive 24.9 → 0.1 A', () => {
    const file = join(mkdtempSync(join(tmpdir(), 'trivar-triangles-')), 'pump-shed.yaml');
    writeFileSync(file, PUMP_SHED);
    const drawing = runTrivar(['diagram', file, '--view', 'triangles']);
    expect(drawing.code).toBe(0);
    const texts = textsOf(drawing.stdout);
    const correct = runTrivar(['correct', file]);
    expect(correct.code).toBe(0);
    // The line table's rows: line, current, active part, reactive part (each "before → after"), PF.
    const table = correct.stdout.slice(correct.stdout.indexOf('Lines, before → after'));
    for (const line of ['A', 'B']) {
      const row = new RegExp(`^ {2}${line} +(\\S+ → \\S+) +(\\S+ → \\S+) +(\\S+ → \\S+) `, 'm').exec(table)!;
      const at = texts.indexOf(`line ${line}`);
      expect(texts[at + 3]).toBe(`active ${row[2]} A`);
      expect(texts[at + 4]).toBe(`reactive ${row[3]} A`);
      const [before, after] = row[1]!.split(' → ');
      expect(texts[at + 1]).toMatch(new RegExp(`^before ${before!.replace('.', '\\.')} A · PF`));
      expect(texts[at + 2]).toMatch(new RegExp(`^after ${after!.replace('.', '\\.')} A · PF`));
    }
    expect(texts).toContain('reactive 24.9 → 0.1 A');
    // Every current label has one decimal here (no figure below 0.05 A on this board).
    const figures = texts.filter((t) => /^(active|reactive|before|after) /.test(t)).flatMap((t) => [...t.matchAll(/(-?\d+\.\d+) A\b|(-?\d+\.\d+)(?= →| A$)/g)].map((m) => m[0]));
    expect(figures.length).toBeGreaterThanOrEqual(12);
    for (const f of figures) expect(f).toMatch(/^-?\d+\.\d( A)?$/);
  });

  it('a part under 0.05 A is shown to two significant figures, not as 0.0; a leading part keeps its sign', () => {
    const board = normaliseBoard(parseBoard(readBoardText(PUMP_SHED.slice(0, PUMP_SHED.indexOf('correction:')))));
    const before = solveBoardModel(board);
    // The same board with line A's reactive part set to 0.031 A, and line B's to 0.2 A leading: figures the
    // drawing must print as they are (the parts are read as Q/|V| of each line's own voltage).
    const vA = before.phases[0]!.voltage.magnitude;
    const vB = before.phases[1]!.voltage.magnitude;
    const after: BoardResult = {
      ...before,
      phases: [
        { ...before.phases[0]!, kvar: (0.031 * vA) / 1000 },
        { ...before.phases[1]!, kvar: (-0.2 * vB) / 1000, sense: 'leading' },
      ],
    };
    const texts = textsOf(renderCurrentTriangles(before, after));
    expect(texts[texts.indexOf('line A') + 4]).toMatch(/^reactive \d+\.\d → 0\.031 A$/);
    expect(texts[texts.indexOf('line B') + 4]).toMatch(/^reactive \d+\.\d → -0\.2 A$/);
  });
});
