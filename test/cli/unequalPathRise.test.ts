/**
 * Where the supply path differs between the lines, no one X per line gives each line's rise: on an open
 * delta the line at the windings' common corner has no winding in its path. `trivar correct` then gives no
 * Q_C·X/V² estimate but each line's own X and solved rise; and a controller on a board without a neutral
 * reads every line with two CTs (Blondel: n − 1 elements on n wires), or one per line.
 * Board: the invented Creekbend grain farm (test/fixtures/hostile/creekbend-grain-farm.yaml: 240 V, 60 Hz,
 * open delta of 50 kVA A-B and 25 kVA B-C, 60 m of feeder).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { c, cAbs, cAdd, cConj, cMul, cScale, cSub, cPolarDeg } from '../support/complexMath.js';
import type { ComplexValue } from '@trivar/core';
import { runTrivar } from './runTrivar.js';

const FARM = 'test/fixtures/hostile/creekbend-grain-farm.yaml';
const flat = (text: string) => text.replace(/\s+/g, ' ');
const dir = mkdtempSync(join(tmpdir(), 'trivar-unequal-path-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A winding's impedance from its nameplate: z % of V²/S, split by X/R. */
const winding = (kVA: number, percent: number, xOverR: number, v = 240): ComplexValue => {
  const z = ((percent / 100) * v ** 2) / (kVA * 1000);
  const r = z / Math.sqrt(1 + xOverR ** 2);
  return c(r, xOverR * r);
};
const feeder = c(0.2 * 0.06, 0.13 * 0.06);
/** Each line's path (the per-line form of an open delta, exact with three wires): A through the A-B winding, C through B-C, B (the corner) through none. */
const paths = [cAdd(winding(50, 2.2, 2.5), feeder), feeder, cAdd(winding(25, 2.0, 2), feeder)];

describe('open delta: no one-X estimate, each line as solved', () => {
  const json = JSON.parse(runTrivar(['correct', FARM, '--arrangement', 'delta-bank', '--json']).stdout);
  const text = runTrivar(['correct', FARM, '--arrangement', 'delta-bank']).stdout;
  const rise = json.verification.voltageRise;

  it('the estimate is withheld, and each line’s own X is the nameplate figure (hand: z·V²/S split by X/R, plus the feeder)', () => {
    expect(rise.estimatePercent).toBeNull();
    expect(rise.estimateWithheld).toBe('unequal-path');
    expect(rise.unequalPath.openDeltaCorner).toBe('B');
    rise.unequalPath.lines.forEach((l: { phase: string; reactanceOhm: number }, k: number) => expect(l.reactanceOhm).toBeCloseTo(paths[k]!.im, 12));
    expect(rise.unequalPath.lines.map((l: { reactanceOhm: number }) => l.reactanceOhm.toFixed(4))).toEqual(['0.0313', '0.0078', '0.0490']);
    // Flagged on the solved rise alone, the largest line's.
    expect(rise.judgedPercent).toBe(rise.solvedPercent);
    expect(rise.solvedPercent).toBe(Math.max(...rise.solvedPerLine.map((l: { percent: number }) => l.percent)));
    expect(rise.flagged).toBe(rise.solvedPercent > rise.flagLevelPercent);
  });

  it('the solved rise of each line agrees with a first-order hand sum on the per-line paths (Ohm’s law, superposition)', () => {
    // The bank as built, at nominal voltages: each capacitor's current I = jωC·V across it, into the lines.
    const omega = 2 * Math.PI * 60;
    const v = [0, -120, 120].map((a) => cPolarDeg(240 / Math.sqrt(3), a));
    const lineCurrent = [c(0), c(0), c(0)];
    const index: Record<string, number> = { A: 0, B: 1, C: 2 };
    for (const b of json.verification.branches as { branch: string; capacitanceUF: number }[]) {
      if (!(b.capacitanceUF > 0)) continue;
      const [from, to] = b.branch.split('-').map((p) => index[p]!);
      const i = cMul(c(0, omega * b.capacitanceUF * 1e-6), cSub(v[from!]!, v[to!]!));
      lineCurrent[from!] = cAdd(lineCurrent[from!]!, i);
      lineCurrent[to!] = cSub(lineCurrent[to!]!, i);
    }
    // Each line's voltage falls by Z·I along its path; a 3-wire board's phase voltages are read to the
    // centroid of its line voltages, so the mean change is taken out.
    const change = lineCurrent.map((i, k) => cScale(cMul(paths[k]!, i), -1));
    const mean = cScale(cAdd(cAdd(change[0]!, change[1]!), change[2]!), 1 / 3);
    const hand = change.map((d, k) => {
      const along = cMul(cSub(d, mean), cConj(v[k]!));
      return (100 * along.re) / cAbs(v[k]!) ** 2;
    });
    rise.solvedPerLine.forEach((l: { percent: number }, k: number) => expect(Math.abs(l.percent - hand[k]!)).toBeLessThan(0.03));
    // Line B, the corner, rises most although its own path is the shortest: the one-X estimate (2.17 % on B in
    // the review) was twice the solved 1.07 %.
    expect(rise.solvedPerLine.map((l: { percent: number }) => l.percent.toFixed(2))).toEqual(['0.91', '1.07', '0.65']);
  });

  it('the text says why there is no estimate and quotes each line’s X and solved rise', () => {
    expect(flat(text)).toContain(
      "steady voltage rise: not estimated: the lines' paths to the source differ (X A 0.0313, B 0.0078, C 0.0490 Ω; line B is the open delta's corner, with no winding in its path), so Q_C·X/V² with one X per line is no line's rise; solved A 0.91 %, B 1.07 %, C 0.65 %; flag above 3 %",
    );
    expect(text).not.toMatch(/steady voltage rise: ≈/);
    // The resonance line keeps its figure, and says it is not every line's.
    expect(flat(text)).toMatch(/X_path = 0\.0402 Ω per line, the figure the orders are worked from; the lines' own paths differ \(X A 0\.0313, B 0\.0078, C 0\.0490 Ω; /);
  });

  it('the controller on a board without a neutral: two CTs, or one per line', () => {
    expect(flat(text)).toContain(
      "steps serve single lines: the controller must measure every line (two CTs do on a board without a neutral: the third line's current is minus the sum of the other two, Blondel's n − 1 elements on n wires; or one CT per line)",
    );
    // The report holds a correction where the file asks for one.
    const withStudy = join(dir, 'farm.yaml');
    writeFileSync(withStudy, `${readFileSync(FARM, 'utf8')}correction: { target: { pf: 0.95 } }\n`);
    const out = join(dir, 'farm.md');
    expect(runTrivar(['report', withStudy, '-o', out]).code).toBe(0);
    const md = readFileSync(out, 'utf8');
    expect(md).toContain("the controller measures every line (two CTs do on a board without a neutral: the third line's current is minus the sum of the other two, Blondel's n − 1 elements on n wires; or one CT per line)");
    expect(md).toMatch(/\*\*Reactance of the supply path:\*\* 0\.0402 Ω per line, the figure the orders are worked from; the lines' own paths differ \(A 0\.0313, B 0\.0078, C 0\.0490 Ω; line B is the open delta's corner/);
  });
});

describe('a board whose lines share one path keeps the one-X estimate', () => {
  it('gravel pit crusher board (4-wire, one transformer): the worst line’s estimate, no per-line X, one CT per line', () => {
    const json = JSON.parse(runTrivar(['correct', 'test/fixtures/hostile/gravel-pit-crusher.yaml', '--arrangement', 'delta-bank', '--json']).stdout);
    const rise = json.verification.voltageRise;
    expect(rise.unequalPath).toBeNull();
    expect(rise.estimateWithheld).toBeNull();
    expect(rise.estimatePercent).toBeCloseTo(4.10, 2);
    const text = runTrivar(['correct', 'test/fixtures/hostile/gravel-pit-crusher.yaml', '--arrangement', 'delta-bank']).stdout;
    expect(flat(text)).toContain('the controller must measure every line (one CT per line)');
  });
});
