/**
 * A board written with L1/L2/L3 reads as L-names through `trivar correct`, `check`, `profile` and
 * `report` — text, the wording fields of the JSON, CSV files, charts and the HTML — with the same figures
 * as the same board written A/B/C; the A/B/C file keeps its letters and shows no L-name. A split-phase
 * board reads as two lines, never a third.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { checkHandFigures, correctBoard, labellerOf, normaliseBoard, parseBoard, readBoardText, studyHarmonics, studyScenarios } from '@trivar/core';
import { renderCorrectionReport } from '../../packages/cli/src/format/correctionReport.js';
import { renderHandCheckReport } from '../../packages/cli/src/format/handCheckReport.js';
import { renderHarmonicsReport } from '../../packages/cli/src/format/harmonicsReport.js';
import { renderScenarioReport } from '../../packages/cli/src/format/profileReport.js';
import { figuresOf, inNumberedNames, LETTERED_LABEL, NUMBERED_LABEL, textOfMarkup } from '../support/phaseNaming.js';
import { ROOT, runTrivar } from '../cli/runTrivar.js';

const example = (file: string) => readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8');
const boardOf = (text: string) => normaliseBoard(parseBoard(readBoardText(text)));

/** Every sentence of a study result: the JSON fields written for people, not data keys. */
function sentencesOf(x: unknown, key = ''): string[] {
  if (typeof x === 'string') return /message|summary|reasons|why|shortfalls|statement|explanation|note|text|finding/i.test(key) ? [x] : [];
  if (Array.isArray(x)) return x.flatMap((y) => sentencesOf(y, key));
  if (x && typeof x === 'object') return Object.entries(x).flatMap(([k, v]) => sentencesOf(v, k));
  return [];
}

/** Every number and flag of a result in order: the figures two namings must share (data keys stay A/B/C in both). */
function figureLeaves(x: unknown): (number | boolean | null)[] {
  if (typeof x === 'number' || typeof x === 'boolean' || x === null) return [x];
  if (Array.isArray(x)) return x.flatMap(figureLeaves);
  if (x && typeof x === 'object') return Object.values(x).flatMap(figureLeaves);
  return [];
}

describe('correct follows the file naming', () => {
  for (const [file, arrangements] of [
    ['riverside-cold-store.yaml', ['delta-bank', 'star-bank', 'balancing-compensator']],
    ['hillside-workshop.yaml', ['balancing-compensator', 'star-bank']],
  ] as const)
    for (const arrangement of arrangements)
      it(`${file}, ${arrangement}: L-names in text and sentences, the same figures`, () => {
        const text = example(file);
        const numbered = inNumberedNames(text);
        expect(numbered).not.toBe(text);
        const spec = { arrangement, lightLoad: { fraction: 0.3 } };
        const lettered = correctBoard(boardOf(text), spec);
        const named = correctBoard(boardOf(numbered), spec);
        expect(named.verification.before.conventions.phaseNames).toBe('L1/L2/L3');
        expect(figureLeaves(named)).toEqual(figureLeaves(lettered));
        const namedText = renderCorrectionReport(named);
        const letteredText = renderCorrectionReport(lettered);
        expect(namedText).toMatch(/L1/);
        expect(namedText).not.toMatch(LETTERED_LABEL);
        for (const s of sentencesOf(named)) expect(s).not.toMatch(LETTERED_LABEL);
        expect(figuresOf(namedText)).toEqual(figuresOf(letteredText));
        // The A/B/C file keeps its letters.
        expect(letteredText).not.toMatch(NUMBERED_LABEL);
        expect(letteredText).toMatch(/^ {2}A {4}/m);
        for (const s of sentencesOf(lettered)) expect(s).not.toMatch(NUMBERED_LABEL);
      });
});

/** Every equipment name in a result: the `name` of each object that also has `branches` (equipment groups, the loads they add). */
function equipmentNamesOf(x: unknown): string[] {
  if (Array.isArray(x)) return x.flatMap(equipmentNamesOf);
  if (!x || typeof x !== 'object') return [];
  const here = 'name' in x && 'branches' in x && typeof x.name === 'string' && /bank|compensator/.test(x.name) ? [x.name] : [];
  return [...here, ...Object.values(x).flatMap(equipmentNamesOf)];
}

describe('equipment names in the JSON follow the file naming', () => {
  // Invented split-phase board: a bank on it is one group per branch, each named with its branch.
  const HOUSE = `supply: { system: split-phase, voltage: { lineToNeutral: 120 }, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2, xOverR: 2 } }
loads:
  - { name: well pump, connection: A-B, kW: 5, pf: 0.7 }
  - { name: shop motor, connection: A-N, kW: 3, pf: 0.75 }
  - { name: freezer, connection: B-N, kW: 1, pf: 0.7 }
`;
  for (const [arrangement, lettered, numbered] of [
    ['star-bank', ['line-to-neutral bank A-N', 'line-to-neutral bank B-N'], ['line-to-neutral bank L1-N', 'line-to-neutral bank L2-N']],
    ['delta-bank', ['line-to-line bank A-B'], ['line-to-line bank L1-L2']],
  ] as const)
    it(`${arrangement} on a split-phase board: ${numbered.join(', ')} in an L-named file, the same figures`, () => {
      const named = correctBoard(boardOf(inNumberedNames(HOUSE)), { arrangement });
      const plain = correctBoard(boardOf(HOUSE), { arrangement });
      expect(named.verification.before.conventions.phaseNames).toBe('L1/L2/L3');
      expect(new Set(equipmentNamesOf(plain))).toEqual(new Set(lettered));
      expect(new Set(equipmentNamesOf(named))).toEqual(new Set(numbered));
      // Data keys stay A/B/C in both: the branch of each group, its connection.
      expect(named.verification.equipment.map((g) => g.branches.map((b) => b.branch))).toEqual(plain.verification.equipment.map((g) => g.branches.map((b) => b.branch)));
      expect(figureLeaves(named)).toEqual(figureLeaves(plain));
    });
});

describe('check follows the file naming', () => {
  const board = example('riverside-cold-store.yaml');
  const figures = readFileSync(new URL('../../examples/hand-figures/riverside-cold-store.yaml', import.meta.url), 'utf8');

  it('the cold store and its hand figures written with L1/L2/L3: L-names throughout, the same figures', () => {
    const numberedFigures = inNumberedNames(figures);
    expect(numberedFigures).toMatch(/branch: L1-L2/);
    expect(numberedFigures).toMatch(/^ {4}L3: /m);
    const lettered = checkHandFigures(boardOf(board), readBoardText(figures));
    const named = checkHandFigures(boardOf(inNumberedNames(board)), readBoardText(numberedFigures));
    expect(figureLeaves(named)).toEqual(figureLeaves(lettered));
    const namedText = renderHandCheckReport(named, labellerOf('L1/L2/L3'));
    const letteredText = renderHandCheckReport(lettered, labellerOf('A/B/C'));
    expect(namedText).toMatch(/^ {2}L1-L2 /m);
    expect(namedText).toMatch(/L3 PF/);
    expect(namedText).not.toMatch(LETTERED_LABEL);
    for (const s of sentencesOf(named)) expect(s).not.toMatch(LETTERED_LABEL);
    expect(named.effects[0]!.explanation).toContain('a capacitor on L1-L2 takes active current off line L1 and puts it on line L2');
    expect(figuresOf(namedText)).toEqual(figuresOf(letteredText));
    expect(letteredText).not.toMatch(NUMBERED_LABEL);
    for (const s of sentencesOf(lettered)) expect(s).not.toMatch(NUMBERED_LABEL);
  });

  it('figures in either naming check the same on either board; a file mixing the two, or naming a phase twice, is refused by path', () => {
    const named = boardOf(inNumberedNames(board));
    const a = checkHandFigures(named, readBoardText(figures));
    const b = checkHandFigures(boardOf(board), readBoardText(inNumberedNames(figures)));
    expect(figureLeaves(a)).toEqual(figureLeaves(b));
    const mixed = readBoardText(inNumberedNames(figures).replace('branch: L2-L3', 'branch: B-C'));
    expect(() => checkHandFigures(named, mixed)).toThrow(/capacitors\[1\]\.branch: expected phase names in one naming throughout the file: this file names phases L1\/L2\/L3/);
    const twice = readBoardText('capacitors: [{ branch: L1-N, kvar: 5 }]\nexpected: { lines: { L1: { pf: 0.95 }, A: { pf: 0.9 } } }');
    expect(() => checkHandFigures(named, twice)).toThrow(/expected\.lines/);
    // A phase the board lacks is named in the board's naming.
    const house = boardOf(inNumberedNames(example('maple-lane-house.yaml')));
    expect(() => checkHandFigures(house, readBoardText('capacitors: [{ branch: L3-N, kvar: 1 }]'))).toThrow(/capacitors\[0\]\.branch: expected a branch between this board's phases \(L1, L2\) or to N \(received "L3-N"\)/);
  });

  it('the split-phase house: two lines named L1 and L2, no third phase anywhere', () => {
    const text = inNumberedNames(example('maple-lane-house.yaml'));
    const r = checkHandFigures(boardOf(text), readBoardText('capacitors: [{ branch: L1-N, kvar: 0.5 }, { branch: L1-L2, kvar: 1 }]\nexpected: { lines: { L2: { pf: 0.95 } } }'));
    const out = renderHandCheckReport(r, labellerOf('L1/L2/L3'));
    expect(out).toMatch(/^ {2}L1-L2 /m);
    expect(out).not.toMatch(LETTERED_LABEL);
    expect(out).not.toMatch(/\bL3\b|\bC\b|three/);
    expect(r.effects[0]!.explanation).toMatch(/split-phase board/);
  });
});

/** Runs the built CLI; the board and data files live in a temporary folder. */
describe('profile and report follow the file naming (built CLI)', () => {
  let dir = '';
  let data = '';
  const write = (name: string, text: string) => {
    writeFileSync(join(dir, name), text);
    return join(dir, name);
  };
  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), 'trivar-naming-'));
    data = join(dir, 'quay.csv');
    // The interval data of the profile command's test: invented flats, a few days of 1-minute rows.
    execFileSync(process.execPath, [`${ROOT}scripts/generate-profile-example.mjs`, data, '--days', '4'], { cwd: ROOT });
  });

  it('profile with interval data and a simulated bank: text, CSV files and charts in L-names, the same figures', () => {
    const run = (board: string, tag: string) => {
      const out = join(dir, tag);
      const r = runTrivar(['profile', board, '--data', data, '--bank', '--summary-csv', `${out}-summary.csv`, '--intervals-csv', `${out}-intervals.csv`, '--charts', `${out}-charts`]);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      const charts = readdirSync(`${out}-charts`).map((f) => textOfMarkup(readFileSync(join(`${out}-charts`, f), 'utf8'))).join('\n');
      return { text: r.stdout, summary: readFileSync(`${out}-summary.csv`, 'utf8'), intervals: readFileSync(`${out}-intervals.csv`, 'utf8'), charts };
    };
    const lettered = run(`${ROOT}examples/quay-street-flats.yaml`, 'abc');
    const named = run(write('quay-L.yaml', inNumberedNames(example('quay-street-flats.yaml'))), 'l123');
    expect(named.text).toMatch(/^ {2}line L3 /m);
    expect(named.text).not.toMatch(LETTERED_LABEL);
    expect(figuresOf(named.text)).toEqual(figuresOf(lettered.text));
    expect(named.summary).toMatch(/^peak current,line L1,/m);
    expect(named.summary).toMatch(/^lowest voltage,phase L2,/m);
    expect(named.summary).not.toMatch(/(line|phase) [ABC],/);
    expect(figuresOf(named.summary)).toEqual(figuresOf(lettered.summary));
    const header = named.intervals.slice(0, named.intervals.indexOf('\n'));
    expect(header).toMatch(/^time,line L1 A,line L2 A,line L3 A,neutral A,phase L1 %V/);
    expect(header).not.toMatch(/(line|phase) [ABC]\b/);
    expect(named.intervals.slice(header.length)).toBe(lettered.intervals.slice(lettered.intervals.indexOf('\n')));
    expect(named.charts).toMatch(/line L1/);
    expect(named.charts).not.toMatch(/line [ABC]\b/);
    // The A/B/C file keeps its letters.
    for (const t of [lettered.text, lettered.summary, lettered.intervals, lettered.charts]) expect(t).not.toMatch(NUMBERED_LABEL);
    expect(lettered.summary).toMatch(/^peak current,line A,/m);
  });

  it('profile scenarios (no interval data), also on a split-phase board: L-names, no third line', () => {
    const lettered = runTrivar(['profile', 'examples/quay-street-flats.yaml']);
    const named = runTrivar(['profile', write('quay-L.yaml', inNumberedNames(example('quay-street-flats.yaml')))]);
    expect(named.stdout).toMatch(/line L1, A/);
    expect(named.stdout).not.toMatch(LETTERED_LABEL);
    expect(figuresOf(named.stdout)).toEqual(figuresOf(lettered.stdout));
    const scenarios = '\nprofile:\n  scenarios:\n    - { name: evening, hours: 2000, loads: {}, others: 0.9 }\n    - { name: night, hours: 6760, loads: {}, others: 0.2 }\n';
    const house = runTrivar(['profile', write('house-L.yaml', inNumberedNames(example('maple-lane-house.yaml')) + scenarios)]);
    expect(house.code).toBe(0);
    expect(house.stdout).toMatch(/line L1, A {2}line L2, A/);
    expect(house.stdout).not.toMatch(/\bL3\b|line C|\bthree/);
    // The result carries the file's naming, so the renderer needs no label from its caller.
    const spec = readBoardText(inNumberedNames(example('maple-lane-house.yaml')) + scenarios) as Parameters<typeof parseBoard>[0];
    const result = studyScenarios(normaliseBoard(parseBoard(spec)), parseBoard(spec).profile!);
    expect(result.phaseNames).toBe('L1/L2/L3');
    expect(renderScenarioReport(result)).toMatch(/line L1, A {2}line L2, A/);
  });

  it('report: the correction, hand-check and load-over-time sections and their drawings in L-names', () => {
    const board = write('cold-L.yaml', inNumberedNames(example('riverside-cold-store.yaml')));
    const figures = write('hand-L.yaml', inNumberedNames(readFileSync(`${ROOT}examples/hand-figures/riverside-cold-store.yaml`, 'utf8')));
    const named = runTrivar(['report', board, '--hand-figures', figures]);
    const lettered = runTrivar(['report', 'examples/riverside-cold-store.yaml', '--hand-figures', 'examples/hand-figures/riverside-cold-store.yaml']);
    expect(named.code).toBe(0);
    const namedText = textOfMarkup(named.stdout);
    expect(namedText).toMatch(/50 Hz, L1L2L3/);
    expect(namedText).toMatch(/a capacitor on L1-L2 takes active current off line L1/);
    expect(namedText).not.toMatch(LETTERED_LABEL);
    expect(textOfMarkup(lettered.stdout)).not.toMatch(NUMBERED_LABEL);
    const profile = runTrivar(['report', write('quay-L.yaml', inNumberedNames(example('quay-street-flats.yaml'))), '--profile-data', data, '--no-correction']);
    expect(profile.code).toBe(0);
    const profileText = textOfMarkup(profile.stdout);
    expect(profileText).toMatch(/line L2/);
    expect(profileText).not.toMatch(LETTERED_LABEL);
  });
});

describe('harmonics on a split-phase board speaks of two lines', () => {
  it('like switch-mode loads on L1 and L2: the odd harmonics cancel in the neutral, and the note says so instead of "three phases"', () => {
    // Invented cottage panel: the same desk load on each 120 V line of a 120/240 V service.
    const text = [
      'name: Test cottage panel',
      'supply: { system: split-phase, voltage: { lineToNeutral: 120 }, frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2.5, xOverR: 2 } }',
      'loads:',
      '  - { name: Desks east, connection: L1-N, kW: 2, pf: 0.97, spectrum: switch-mode }',
      '  - { name: Desks west, connection: L2-N, kW: 2, pf: 0.97, spectrum: switch-mode }',
    ].join('\n');
    const h = studyHarmonics(readBoardText(text));
    const line3 = h.lines[0]!.current.orders.find((o) => o.order === 3)!.magnitude;
    const neutral3 = h.neutral!.current.orders.find((o) => o.order === 3)?.magnitude ?? 0;
    // i₂(t) = i₁(t − T/2): each odd order of the two lines arrives in opposition at the neutral bar.
    expect(line3).toBeGreaterThan(1);
    expect(neutral3).toBeLessThan(1e-6 * line3);
    expect(h.neutral!.practice).toMatch(/^on a split-phase board the two lines are 180° apart, so odd harmonics \(triplens included\)/);
    expect(h.neutral!.practice).not.toMatch(/three phases/);
    const out = renderHarmonicsReport(h);
    expect(out).not.toMatch(/three phases|\bL3\b|\bC\b/);
    expect(out).not.toMatch(LETTERED_LABEL);
  });
});
