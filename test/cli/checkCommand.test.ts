/** `trivar check` run as a user would (built binary). */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const BOARD = 'examples/riverside-cold-store.yaml';
const FIGURES = 'examples/hand-figures/riverside-cold-store.yaml';

describe('trivar check', () => {
  it('both inputs from standard input is a usage error (exit 2), not an empty board', () => {
    const r = runTrivar(['check', '-', '-'], 'capacitors: [{ branch: A-B, kvar: 5 }]\n');
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('cannot both come from standard input');
  });

  it('shows the textbook working, hand vs solved line by line, and the effects', () => {
    const r = runTrivar(['check', BOARD, FIGURES]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    for (const heading of ['Textbook working per phase', 'Hand figures against the solved board', 'Where each difference comes from', 'Cautions'])
      expect(r.stdout).toContain(heading);
    for (const effect of ['line-pair branches share unevenly', 'voltage drop at the board', 'neutral return', 'capacitor output at applied voltage', 'voltage-dependent loads'])
      expect(r.stdout).toContain(effect);
  });

  it('--json gives the same result as data', () => {
    const r = runTrivar(['check', BOARD, FIGURES, '--json']);
    expect(r.code).toBe(0);
    const data = JSON.parse(r.stdout) as { lines: { phase: string; currentA: { yours: number } }[]; effects: unknown[] };
    expect(data.lines.map((l) => l.phase)).toEqual(['A', 'B', 'C']);
    expect(data.lines[0]!.currentA.yours).toBe(166);
    expect(data.effects).toHaveLength(5);
  });

  it('bad figures: exit 3, the file and every field path named, no stack trace', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-check-'));
    const bad = join(dir, 'figures.yaml');
    writeFileSync(bad, 'capacitors:\n  - { branch: A-X, kvar: 5 }\n  - { branch: A-B }\n');
    const r = runTrivar(['check', BOARD, bad]);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain(`the hand figures in "${bad}" are not valid`);
    expect(r.stderr).toContain('capacitors[0].branch');
    expect(r.stderr).toContain('capacitors[1]');
    expect(r.stderr).not.toMatch(/at .*\.js:\d+/);
  });

  it('--diagram writes each line\'s current triangle without and with the capacitors; never over an input', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-check-'));
    const out = join(dir, 'triangles.svg');
    const r = runTrivar(['check', BOARD, FIGURES, '--json', '--diagram', out]);
    expect(r.code).toBe(0);
    const solved = (JSON.parse(r.stdout) as { lines: { currentA: { solved: number } }[] }).lines.map((l) => l.currentA.solved);
    const svg = readFileSync(out, 'utf8');
    expect(svg).toContain('data-view="triangles"');
    const after = [...svg.matchAll(/data-state="after" data-magnitude="([\d.]+)"/g)].map((m) => Number(m[1]));
    expect(after).toEqual(solved.map((a) => Number(a.toFixed(a >= 100 ? 0 : 1))));
    expect(runTrivar(['check', BOARD, FIGURES, '--diagram', FIGURES]).code).toBe(2);
  });

  it('help is pinned', () => {
    const r = runTrivar(['check', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});
