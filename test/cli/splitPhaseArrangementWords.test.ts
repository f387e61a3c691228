/**
 * On a split-phase board star and delta name nothing: `trivar correct` calls the two banks
 * line-to-neutral and line-to-line (L-N / L-L in the comparison table) in every sentence, table,
 * equipment name and heading, text,
 * JSON and HTML alike, while the arrangement values (`star-bank`, `delta-bank`) stay the data.
 * A three-phase board keeps star and delta.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildBoardReport, compareCorrections, correctBoard, normaliseBoard, parseBoard, readBoardText, renderReportHtml, solveBoardModel } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';

/** An invented farm-shop panel: a well pump across the two lines, motors on each half, all lagging. */
const FARM_SHOP = [
  'name: Farm shop panel',
  'supply: { system: split-phase, voltage: "120/240", frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2, xOverR: 2 } }',
  'loads:',
  '  - { name: Well pump, connection: A-B, kW: 3.7, pf: 0.72 }',
  '  - { name: Cooler, connection: A-N, kW: 1.5, pf: 0.7 }',
  '  - { name: Fans, connection: B-N, kW: 1.1, pf: 0.75 }',
].join('\n');
const STAR_OR_DELTA = /\b(star|delta)\b/i;

/** Every string in a JSON value, with its path. */
function strings(x: unknown, path = ''): [string, string][] {
  if (typeof x === 'string') return [[path, x]];
  if (Array.isArray(x)) return x.flatMap((v, i) => strings(v, `${path}[${i}]`));
  if (x !== null && typeof x === 'object') return Object.entries(x).flatMap(([k, v]) => strings(v, `${path}.${k}`));
  return [];
}

describe('capacitor arrangements named on a split-phase board', () => {
  const board = normaliseBoard(parseBoard(readBoardText(FARM_SHOP)));

  it('the comparison, summaries and equipment names say line-to-neutral / line-to-line; the values stay star-bank / delta-bank', () => {
    const c = compareCorrections(board, {});
    expect(c.outcomes.map((o) => o.arrangement)).toEqual(['star-bank', 'delta-bank']);
    const delta = c.outcomes.find((o) => o.arrangement === 'delta-bank')!.report!;
    expect(delta.summary).toMatch(/^line-to-line bank: \d+\.\d\d kvar delivered/);
    expect(delta.selection!.equipment.map((e) => e.name)).toEqual(['line-to-line bank A-B']);
    const star = c.outcomes.find((o) => o.arrangement === 'star-bank')!.report!;
    expect(star.verification.equipment.map((e) => e.name)).toEqual(['line-to-neutral bank A-N', 'line-to-neutral bank B-N']);
    expect(c.why).toContain('line-to-neutral bank');
    // Nothing for people says star or delta; only the arrangement values do.
    const words = strings(c).filter(([path]) => !/\.arrangement$|\.recommended$/.test(path) && !/\.(branch|connection|to|from)$/.test(path));
    expect(words.filter(([, s]) => STAR_OR_DELTA.test(s))).toEqual([]);
  });

  it('the text report of the comparison and of one arrangement', () => {
    const r = runTrivar(['correct', '-'], FARM_SHOP);
    expect(r.code).toBe(0);
    // The table's short names, explained beside it; every line within 100 columns.
    expect(r.stdout).toMatch(/^ {2}L-N bank +no units fit/m);
    expect(r.stdout).toMatch(/^ {2}L-L bank +meets/m);
    expect(r.stdout.replace(/\s+/g, ' ')).toContain('L-N bank: capacitors from each line to the neutral; L-L bank: capacitors across the two lines;');
    for (const line of r.stdout.split('\n')) expect(line.length).toBeLessThanOrEqual(100);
    expect(r.stdout).toMatch(/^ {2}line-to-line bank: meets the target/m);
    expect(r.stdout).toContain('The recommended line-to-line bank in full');
    expect(r.stdout).toContain('correction: line-to-line capacitor bank (capacitors across the two lines)');
    expect(r.stdout).not.toMatch(STAR_OR_DELTA);
    const one = runTrivar(['correct', '-', '--arrangement', 'star-bank'], FARM_SHOP);
    expect(one.stdout).toContain('correction: line-to-neutral capacitor bank (capacitors from each line to the neutral)');
    expect(one.stdout).not.toMatch(STAR_OR_DELTA);
  });

  it('the HTML report names the arrangement the same way', () => {
    const spec = parseBoard(readBoardText(FARM_SHOP));
    const report = correctBoard(board, { arrangement: 'delta-bank' });
    const html = renderReportHtml(buildBoardReport({ spec, result: solveBoardModel(board), correction: report }));
    expect(html).toContain('line-to-line capacitor bank (capacitors across the two lines)');
    expect(html).not.toMatch(/capacitor bank in (star|delta)/);
  });

  it('a three-phase board keeps star and delta', () => {
    const spec = parseBoard(readBoardText(readFileSync(`${ROOT}examples/hillside-workshop.yaml`, 'utf8')));
    const c = compareCorrections(normaliseBoard(spec), {});
    expect(c.outcomes.find((o) => o.arrangement === 'delta-bank')!.report!.summary).toMatch(/^delta bank: /);
    expect(runTrivar(['correct', 'examples/hillside-workshop.yaml', '--arrangement', 'star-bank']).stdout).toContain('correction: star-connected capacitor bank (one capacitor per phase)');
  });
});
