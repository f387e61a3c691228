import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoardText } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';
import { isBoardExample } from '../support/boardExamples.js';

const coldStore = 'examples/riverside-cold-store.yaml';
const arrangements = ['star-bank', 'delta-bank', 'balancing-compensator'] as const;

describe('trivar correct (built binary)', () => {
  it.each(arrangements)('sizes a %s for the cold store and verifies it', (arrangement) => {
    const r = runTrivar(['correct', coldStore, '--arrangement', arrangement]);
    expect(r.stderr).toBe('');
    expect([0, 5]).toContain(r.code);
    expect(r.stdout).toContain('Lines, before → after');
    expect(r.stdout).toMatch(/discharge/);
    expect(r.stdout).toContain('licensed professional');
  });

  it('uses the study in the board file, and --json gives the library report', () => {
    const r = runTrivar(['correct', coldStore, '--json']);
    expect(r.code).toBe(0);
    const spec = parseBoardText(readFileSync(`${ROOT}${coldStore}`, 'utf8'));
    const expected = correctBoard(normaliseBoard(spec), spec.correction);
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
    expect(expected.status).toBe('meets-target');
  });

  it('command-line options override the board file', () => {
    const r = runTrivar(['correct', coldStore, '--arrangement', 'star-bank', '--pf', '0.97', '--json']);
    expect(r.code).toBe(0);
    const report = JSON.parse(r.stdout);
    expect(report.arrangement).toBe('star-bank');
    expect(report.target.pf).toBe(0.97);
    for (const line of report.verification.lines) expect(line.pf.after).toBeGreaterThanOrEqual(0.97 - 1e-9);
  });

  it('exits 5 with the reason when the target cannot be reached', () => {
    // The bakery's ovens across A-B make line A lead and B lag: a delta bank that may not make a line lead
    // (line A no more than it already does, line C not at all) cannot lift line B to 0.95.
    const r = runTrivar(['correct', 'examples/corner-bakery.yaml', '--arrangement', 'delta-bank']);
    expect(r.code).toBe(5);
    expect(r.stdout).toMatch(/NOT REACHABLE|MISSES/);
    const text = r.stdout.replace(/\s+/g, ' ');
    expect(text).toMatch(/even sized exactly \(before units are chosen\) the best it reaches leaves: line B is at 0\.9\d\d lagging, below the target 0\.950 lagging/);
    // Line A leads before and after (the ovens' split): the high-capacitance check says so, not "no line leads".
    expect(text).toMatch(/A 90\.4 → 90\.5 .* 0\.988 lead → 0\.988 lead/);
    expect(text).toMatch(/×1\.1: no line leads more than before \(A already led before correction\)/);
  });

  it('rejects a bad option value naming the option (exit 2)', () => {
    const r = runTrivar(['correct', coldStore, '--pf', '1.3']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--pf');
  });

  it('options that conflict with each other are a usage error (exit 2) naming them, before any study runs', () => {
    const both = runTrivar(['correct', coldStore, '--pf', '0.95', '--upper-pf', '0.9']);
    expect(both.code).toBe(2);
    expect(both.stdout).toBe('');
    expect(both.stderr).toContain('(options given: --pf 0.95 --upper-pf 0.9)');
    expect(both.stderr).toContain('--upper-pf: expected an upper bound at least the target (0.95) (received 0.9)');
    expect(both.stderr.split('\n').filter((l) => l !== '')).toHaveLength(1);
    const leading = runTrivar(['correct', coldStore, '--allow-leading', '--upper-pf', '0.97']);
    expect(leading.code).toBe(2);
    expect(leading.stderr).toContain('--upper-pf, with --allow-leading: expected either leading: allowed or an upper lagging bound');
    // An installation: the same, on the board the equipment goes on.
    const works = runTrivar(['correct', 'examples/tannery-lane-works.yaml', '--board', 'Offices', '--pf', '0.97', '--upper-pf', '0.96']);
    expect(works.code).toBe(2);
    // Without --pf the default target 0.95 would sit under 0.96: --pf is named as part of the conflict.
    expect(works.stderr).toContain('--upper-pf, with --pf: expected an upper bound at least the target (0.97) (received 0.96)');
  });

  it("an option that the file's correction section or the board cannot take: exit 2, naming the option and the field it meets", () => {
    // The quay-street file asks for pf 0.97 with an upper bound of 0.995; --pf 0.999 passes that bound.
    const bound = runTrivar(['correct', 'examples/quay-street-flats.yaml', '--pf', '0.999']);
    expect(bound.code).toBe(2);
    expect(bound.stderr).toContain('correction.target.maxLaggingPf in the board file, with --pf: expected an upper bound at least the target (0.999) (received 0.995)');
    // A split-phase board has no balancing compensator; its default target definition goes with it.
    const cabin = runTrivar(['correct', 'examples/pine-hollow-cabin.yaml', '--arrangement', 'balancing-compensator']);
    expect(cabin.code).toBe(2);
    expect(cabin.stderr).toContain('--arrangement: expected star-bank or delta-bank on a split-phase board');
    expect(cabin.stderr).toContain('target.definition (its default), with --arrangement:');
    // A problem in the file's own section stays the file's (exit 3), even with options given.
    const text = readFileSync(`${ROOT}${coldStore}`, 'utf8').replace('target: { pf: 0.95 }', 'target: { pf: 0.95, maxLaggingPf: 0.9 }');
    const own = runTrivar(['correct', '-', '--pf', '0.93'], text);
    expect(own.code).toBe(3);
    expect(own.stderr).toContain('correction.target.maxLaggingPf');
  });

  it('without an arrangement compares every arrangement side by side, recommends one and shows it in full (100 columns)', () => {
    const r = runTrivar(['correct', 'examples/corner-bakery.yaml']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Arrangements compared');
    for (const name of ['star bank', 'delta bank', 'compensator']) expect(r.stdout).toContain(`  ${name}`);
    expect(r.stdout).toMatch(/Recommendation\n {2}\w+ \w+: /);
    expect(r.stdout).toContain('Controller');
    for (const line of r.stdout.split('\n')) expect(line.length).toBeLessThanOrEqual(100);
  });

  it.each(readdirSync(`${ROOT}examples`).filter(isBoardExample(`${ROOT}examples`)).map((f) => f.slice(0, -5)))(
    'examples/%s.yaml: fits 100 columns, and a bank that is built comes with its controller settings',
    (name) => {
      const text = runTrivar(['correct', `examples/${name}.yaml`]);
      expect(text.stderr).toBe('');
      for (const line of text.stdout.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
      if (/Bank as built from units\n {2}delivered [1-9]/.test(text.stdout)) expect(text.stdout).toMatch(/C\/k of the smallest step/);
      expect(text.stdout).not.toMatch(/saves -|released -/);
    },
  );

  it('the North-American example compares the arrangements and recommends an equal-step delta bank of 480 V units', () => {
    const r = runTrivar(['correct', 'examples/cedar-falls-print-shop.yaml', '--json']);
    expect(r.code).toBe(0);
    const c = JSON.parse(r.stdout);
    expect(c.recommended).toBe('delta-bank');
    const delta = c.outcomes.find((o: { arrangement: string }) => o.arrangement === 'delta-bank').report;
    expect(delta.selection.steps.every((s: { unit: { ratedV: number }; part: string }) => s.unit.ratedV === 480 && s.part === 'balanced')).toBe(true);
    expect(delta.selection.controller.dischargeTimeS).toBe(60);
  });

  it('a split-phase board compares a line-to-line capacitor with the line-to-neutral ones', () => {
    const text = [
      'supply: { system: split-phase, voltage: { lineToNeutral: 120 }, frequencyHz: 60, transformer: { kVA: 25, impedancePercent: 2.5, xOverR: 2 } }',
      'loads:',
      '  - { name: heat pump, connection: A-B, kW: 4.5, pf: 0.82 }',
      '  - { name: kitchen, connection: A-N, kW: 1.5, pf: 0.95 }',
    ].join('\n');
    const r = runTrivar(['correct', '-', '--json'], text);
    expect(r.code).toBe(0);
    const c = JSON.parse(r.stdout);
    expect(c.outcomes.map((o: { arrangement: string }) => o.arrangement)).toEqual(['star-bank', 'delta-bank']);
    expect(c.recommended).toBe('delta-bank');
  });

  it('names the field of a bad correction section in the board file (exit 3)', () => {
    const text = readFileSync(`${ROOT}${coldStore}`, 'utf8').replace('target: { pf: 0.95 }', 'target: { pf: 1.5 }');
    const r = runTrivar(['correct', '-'], text);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('correction.target.pf');
  });

  it('help text', () => {
    const r = runTrivar(['correct', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatchSnapshot();
  });
});
