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

  describe('capacitors far beyond the load: the solved board\'s warnings, as trivar solve gives them', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-check-'));
    const garage = join(dir, 'garage.yaml');
    writeFileSync(
      garage,
      [
        'name: Garage panel',
        'supply: { voltage: 120/240, frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2, xOverR: 1.5 } }',
        'feeder: { lengthFt: 120, line: { awg: "6" }, neutral: { awg: "6" } }',
        'loads:',
        '  - { name: Welder, connection: L1-L2, kW: 5, pf: 0.7 }',
        '  - { name: Compressor, connection: L1-N, kW: 1.5, pf: 0.8 }',
        '  - { name: Workbench, connection: L1-N, kW: 1.2 }',
        '',
      ].join('\n'),
    );
    const figures = (kvar: number) => {
      const file = join(dir, `caps-${kvar}.yaml`);
      writeFileSync(file, `capacitors: [ { branch: L1-L2, kvar: ${kvar} } ]\n`);
      return file;
    };

    it('40 kvar on a 7.7 kW board: leading lines and board, the transformer overload, lead beside the board PF', () => {
      const r = runTrivar(['check', garage, figures(40)]);
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/board {2}PF \(vector\) {6}— {2}0\.222 lead {2}0\.219 lead/);
      const warnings = r.stdout.slice(r.stdout.indexOf('\nWarnings\n'), r.stdout.indexOf('\nCautions\n')).replace(/\n {4}/g, ' ');
      expect(warnings).toContain('! line L1 leads at PF 0.306 with your capacitors in: they supply more reactive power than the loads on it draw (over-correction)');
      expect(warnings).toContain('! line L2 leads at PF 0.136 with your capacitors in');
      expect(warnings).toContain('! the board leads at PF 0.219 with your capacitors in: they give 40.52 kvar at the solved voltages, against 6.23 kvar drawn by its loads');
      expect(warnings).toContain('the supply transformer is loaded to 142 % of its 25 kVA rating');
      // A split-phase service's neutral returns to the transformer's center tap, not a star point.
      expect(r.stdout.replace(/\s+/g, ' ')).toMatch(/lifts the neutral bar [\d.]+ V off the transformer center tap, so the line-to-neutral voltages become unequal/);
      const data = JSON.parse(runTrivar(['check', garage, figures(40), '--json']).stdout) as { warnings: { code: string }[]; boardPower: { solved: { sense: string } }; operatingPoint: { collapsed: boolean } };
      expect(data.warnings.map((w) => w.code)).toEqual(['hand-line-leading', 'hand-line-leading', 'hand-board-leading', 'transformer-overload']);
      expect(data.boardPower.solved.sense).toBe('leading');
      expect(data.operatingPoint.collapsed).toBe(false);
    });

    it('2000 kvar collapses the board: figures and warnings written, then the error and exit 4 that trivar solve gives', () => {
      const r = runTrivar(['check', garage, figures(2000)]);
      expect(r.code).toBe(4);
      expect(r.stdout).toContain('line-to-neutral L1-N at the board is 23.0 V, 19.2 % of nominal');
      expect(r.stderr).toMatch(/^error: no viable operating point: the supply cannot carry these loads: the board voltage has collapsed/);
    });

    it('a modest bank that leaves every line lagging warns of nothing', () => {
      const r = runTrivar(['check', garage, figures(2)]);
      expect(r.code).toBe(0);
      expect(r.stdout).toContain('\nWarnings\n  none\n');
    });
  });

  it('help is pinned', () => {
    const r = runTrivar(['check', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});
