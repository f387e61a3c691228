import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoardText } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

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
    expect(r.stdout).toMatch(/line B is at 0\.9\d\d lagging, below the target 0\.950 lagging/);
  });

  it('rejects a bad option value naming the option (exit 2)', () => {
    const r = runTrivar(['correct', coldStore, '--pf', '1.3']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--pf');
  });

  it('asks for an arrangement when neither the file nor the options give one', () => {
    const r = runTrivar(['correct', 'examples/corner-bakery.yaml']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--arrangement');
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
