/**
 * Feeder inputs that solve but deserve a remark, and a feeder without a neutral: conductors of one
 * feeder given far-apart lengths are warned of; star-connected loads beyond a three-core feeder are
 * pointed at starPoint: floating first; a board no neutral reaches reads as a 3-wire board.
 * Invented scenario: a workshop yard fed from a 230/400 V main board.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError, solveInstallation, type InstallationResult } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const dir = mkdtempSync(join(tmpdir(), 'trivar-feeder-checks-'));
const writeTemp = (name: string, text: string): string => {
  const file = join(dir, name);
  writeFileSync(file, text);
  return file;
};

const supply = { voltage: '230/400', frequencyHz: 50, transformer: { kVA: 160, impedancePercent: 4, xOverR: 3 } };
const yard = (feeder: Record<string, unknown>, loads: Record<string, unknown>[] = [{ name: 'Bench sockets', connection: 'B-N', kW: 4 }]) => ({
  name: 'Yard',
  supply,
  boards: [
    { name: 'Main', loads: [{ name: 'Office', connection: 'A-N', kW: 3 }] },
    { name: 'Workshop', fedFrom: 'Main', feeder, loads },
  ],
});
const warningsOf = (r: InstallationResult, board: string, code: string) => r.boards.find((b) => b.name === board)!.result.warnings.filter((w) => w.code === code);

describe('conductors of one feeder given far-apart lengths', () => {
  it('a neutral of 0.001 m beside 20 m lines is warned of, naming both lengths', () => {
    const r = solveInstallation(yard({ lengthM: 20, line: { mm2: 16 }, neutral: { mm2: 16, lengthM: 0.001 } }));
    const [w] = warningsOf(r, 'Workshop', 'feeder-lengths-unalike');
    expect(w!.message).toBe(
      "the feeder's conductors are given different route lengths (lines 20 m, neutral < 0.01 m): the conductors of one feeder run together, so one length is likely a slip, and the solve takes each as written; check them",
    );
    expect(w!.value).toBeCloseTo(20 / 0.001, 6);
    expect(w!.threshold).toBe(1.2);
  });

  it('lines of 200 m against a 20 m neutral, and one line of three longer, in the file’s units', () => {
    const long = solveInstallation(yard({ lengthM: 20, line: { mm2: 16, lengthM: 200 }, neutral: { mm2: 16 } }));
    expect(warningsOf(long, 'Workshop', 'feeder-lengths-unalike')[0]!.message).toContain('(lines 200 m, neutral 20 m)');
    const perPhase = solveInstallation(yard({ lengthFt: 100, line: { A: { awg: '2' }, B: { awg: '2' }, C: { awg: '2', lengthFt: 150 } }, neutral: { awg: '2' } }));
    expect(warningsOf(perPhase, 'Workshop', 'feeder-lengths-unalike')[0]!.message).toContain('(A 100 ft, B 100 ft, C 150 ft, neutral 100 ft)');
    // A metric feeder with one conductor in feet: each length as written (all in feet read "A 66 ft" for the file's 20 m).
    const mixed = solveInstallation(yard({ lengthM: 20, line: { A: { mm2: 25 }, B: { mm2: 25, lengthFt: 300 }, C: { mm2: 25 } }, neutral: { mm2: 25 } }));
    expect(warningsOf(mixed, 'Workshop', 'feeder-lengths-unalike')[0]!.message).toContain('(A 20 m, B 300 ft, C 20 m, neutral 20 m)');
  });

  it('lengths alike, or within 1.2 × / 1 m of each other (terminations), are not remarked on', () => {
    expect(warningsOf(solveInstallation(yard({ lengthM: 20, line: { mm2: 16 }, neutral: { mm2: 16 } })), 'Workshop', 'feeder-lengths-unalike')).toEqual([]);
    expect(warningsOf(solveInstallation(yard({ lengthM: 20, line: { mm2: 16 }, neutral: { mm2: 16, lengthM: 21 } })), 'Workshop', 'feeder-lengths-unalike')).toEqual([]);
    // 0.5 m against 0.2 m: 2.5 ×, but only 0.3 m apart.
    expect(warningsOf(solveInstallation(yard({ lengthM: 0.5, line: { mm2: 16 }, neutral: { mm2: 16, lengthM: 0.2 } })), 'Workshop', 'feeder-lengths-unalike')).toEqual([]);
  });
});

describe('a three-core feeder (no neutral conductor)', () => {
  const motor = { name: 'Saw motor', connection: 'ABC-star', kW: 5.5, pf: 0.82 };

  it('a star-connected load beyond it is pointed to starPoint: floating first, not to a conductor of no impedance', () => {
    const bad = () => solveInstallation(yard({ lengthM: 20, line: { mm2: 16 } }, [motor]));
    expect(bad).toThrow(InputError);
    try {
      bad();
    } catch (e) {
      const issue = (e as InputError).issues.find((i) => i.path === 'boards[1].feeder.neutral')!;
      expect(issue.message).toContain('expected starPoint: floating on "Saw motor" on Workshop if its star (wye) point is not tied to a neutral (a motor\'s is not)');
      expect(issue.message).not.toContain('r: 0, x: 0');
    }
  });

  it('with line-to-neutral loads too, the neutral is asked for, and the star load pointed to starPoint: floating', () => {
    try {
      solveInstallation(yard({ lengthM: 20, line: { mm2: 16 } }, [motor, { name: 'Lamp', connection: 'A-N', kW: 0.2 }]));
      expect.unreachable();
    } catch (e) {
      const issue = (e as InputError).issues.find((i) => i.path === 'boards[1].feeder.neutral')!;
      expect(issue.message).toContain('the neutral conductor, which "Lamp" on Workshop return through');
      expect(issue.message).toContain('; and starPoint: floating on "Saw motor" on Workshop');
    }
  });

  it('the board it feeds has no neutral: read as 3-wire, no neutral reading, phase voltages to the centroid', () => {
    const r = solveInstallation(yard({ lengthM: 20, line: { mm2: 16 } }, [{ ...motor, starPoint: 'floating' }]));
    const shop = r.boards.find((b) => b.name === 'Workshop')!.result;
    expect(shop.board.withoutNeutral).toBe(true);
    expect(shop.board.system).toBe('three-phase-3wire');
    expect(shop.neutral).toBeNull();
    expect(r.feeders.find((f) => f.board === 'Workshop')!.neutral).toBeNull();
    // Phase voltages to the centroid of the line voltages (no neutral bar to read them to): they sum to zero.
    const rad = Math.PI / 180;
    const re = shop.phases.reduce((t, p) => t + p.voltage.magnitude * Math.cos(p.voltage.angleDeg * rad), 0);
    const im = shop.phases.reduce((t, p) => t + p.voltage.magnitude * Math.sin(p.voltage.angleDeg * rad), 0);
    expect(Math.hypot(re, im)).toBeLessThan(1e-6);
    // The main board keeps its neutral.
    expect(r.boards[0]!.result.board.withoutNeutral).toBeUndefined();
    expect(r.boards[0]!.result.neutral).not.toBeNull();
  });

  it('solve says so, and prints no N row for it', () => {
    const file = writeTemp('three-core.yaml', JSON.stringify(yard({ lengthM: 20, line: { mm2: 16 } }, [{ ...motor, starPoint: 'floating' }])));
    const out = runTrivar(['solve', file, '--board', 'Workshop']).stdout;
    expect(out).toContain('three-phase 3-wire, no neutral at this board · 400 V line-to-line');
    const board = out.slice(out.indexOf('At the board'), out.indexOf('Circuits'));
    expect(board).not.toMatch(/^ {2}N /m);
    expect(board).not.toContain("neutral conductor's drop is included");
    expect(out).toMatch(/^ {2}Workshop +Main +\S+ +\S+ +\S+ +- +/m);
  });

  it('the report says it among the board’s facts', () => {
    const file = writeTemp('three-core-report.yaml', JSON.stringify(yard({ lengthM: 20, line: { mm2: 16 } }, [{ ...motor, starPoint: 'floating' }])));
    const out = join(dir, 'three-core.md');
    expect(runTrivar(['report', file, '--format', 'md', '-o', out]).code).toBe(0);
    const md = readFileSync(out, 'utf8');
    const shop = md.slice(md.indexOf('## Board: Workshop'));
    expect(shop).toContain('- **Neutral:** none at this board: its feeder, or one upstream, has line conductors only');
    expect(md.slice(md.indexOf('## Board: Main'), md.indexOf('## Board: Workshop'))).not.toContain('**Neutral:**');
  });
});
