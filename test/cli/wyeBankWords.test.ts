/**
 * A star-connected bank is a wye bank on a North-American board: `trivar correct` and `trivar report`
 * say wye bank, wye-connected, floating wye point, while an IEC board keeps star. Only the words follow
 * the board's region (conventions.region); the arrangement value stays `star-bank` on every board.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { arrangementDescriptions, arrangementNames, compareCorrections, correctBoard, normaliseBoard, parseBoard, readBoardText } from '@trivar/core';
import { runTrivar } from './runTrivar.js';

/** An invented grain elevator: three motors across the lines of a 480 V 3-wire service, unevenly loaded. */
const elevator = (region: 'north-america' | 'iec') =>
  [
    'name: Grain elevator motor board',
    `conventions: { region: ${region} }`,
    'supply: { system: three-phase-3wire, voltage: { lineToLine: 480 }, frequencyHz: 60, transformer: { kVA: 300, impedancePercent: 5.5, xOverR: 5 } }',
    'loads:',
    '  - { name: Leg drive, connection: A-B, kW: 40, pf: 0.72 }',
    '  - { name: Dryer fan, connection: B-C, kW: 15, pf: 0.8 }',
    '  - { name: Conveyor, connection: C-A, kW: 8, pf: 0.78 }',
    'correction: { arrangement: star-bank, target: { pf: 0.95 } }',
  ].join('\n');

/** An invented cannery: lighting on each line of a 480Y/277 V service; the notation makes it North-American. */
const CANNERY = [
  'name: Cannery lighting board',
  'supply: { system: three-phase-4wire, voltage: "480Y/277", frequencyHz: 60, transformer: { kVA: 500, impedancePercent: 5.75, xOverR: 5 } }',
  'loads:',
  '  - { name: HID lighting A, connection: A-N, kW: 30, pf: 0.75 }',
  '  - { name: HID lighting B, connection: B-N, kW: 12, pf: 0.75 }',
  '  - { name: Retort heaters, connection: C-N, kW: 20, pf: 0.98 }',
].join('\n');
/** Single-phase 277 V units, as a North-American star bank on 480Y/277 is built. */
const UNITS_277 = [
  { name: 'Cell 277-5', kind: 'single-phase', ratedKvar: 5, ratedV: 277, ratedHz: 60 },
  { name: 'Cell 277-10', kind: 'single-phase', ratedKvar: 10, ratedV: 277, ratedHz: 60 },
] as const;

/** Words about a star connection (the values `star-bank`, `ABC-star` and branch keys such as `A-star` are data, not words). */
const STAR_WORDS = /\bstar (bank|point|part|branches)\b|star-connected|\bin star\b|floating star|ABC star/i;
const WYE_WORDS = /\bwye (bank|point|part|branches)\b|wye-connected|\bin wye\b|floating wye|ABC wye/i;

describe('a star-connected bank in the board region’s words', () => {
  it('on a North-American 3-wire board, correct says wye bank and floating wye point', () => {
    const r = runTrivar(['correct', '-'], elevator('north-america'));
    expect(r.code).toBe(5); // the target is out of reach: the exit status says so
    expect(r.stdout).toContain('correction: wye-connected capacitor bank (one capacitor per phase)');
    expect(r.stdout).toMatch(/— wye bank: /);
    expect(r.stdout).toMatch(/floating wye point of the bank: 202\.\d\d V from the centroid/);
    expect(r.stdout).toContain('its wye point settles where the three capacitor currents sum to zero');
    expect(r.stdout.replace(/\s+/g, ' ')).toMatch(/the floating wye point of the bank sits 202\.6 V \(73 % of line-to-neutral\).*a wye bank with unequal branches/);
    expect(r.stdout).not.toMatch(STAR_WORDS);
  });

  it('the same board set to IEC says star', () => {
    const r = runTrivar(['correct', '-'], elevator('iec'));
    expect(r.code).toBe(5);
    expect(r.stdout).toContain('correction: star-connected capacitor bank (one capacitor per phase)');
    expect(r.stdout).toMatch(/floating star point of the bank: 202\.\d\d V/);
    expect(r.stdout).not.toMatch(WYE_WORDS);
  });

  it('the report (Markdown) follows the region too: arrangement, warning and the compensator standard', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-wye-'));
    const md = (region: 'north-america' | 'iec') => {
      const r = runTrivar(['report', '-', '--format', 'md', '-o', join(dir, `${region}.md`)], elevator(region));
      expect(r.code).toBe(0);
      return readFileSync(join(dir, `${region}.md`), 'utf8');
    };
    const na = md('north-america');
    expect(na).toContain('**Arrangement:** capacitor bank in wye');
    expect(na).toMatch(/the floating wye point of the bank sits 202\.6 V/);
    expect(na).toContain('delta and wye reactive branches that balance an unbalanced load');
    expect(na).not.toMatch(STAR_WORDS);
    const iec = md('iec');
    expect(iec).toContain('**Arrangement:** capacitor bank in star');
    expect(iec).toContain('delta and star reactive branches that balance an unbalanced load');
    expect(iec).not.toMatch(WYE_WORDS);
  });

  it('the library names, comparison and equipment of a North-American 4-wire board say wye; the values stay star-bank', () => {
    const board = normaliseBoard(parseBoard(readBoardText(CANNERY)));
    const star = correctBoard(board, { arrangement: 'star-bank', target: { pf: 0.95 }, catalogue: UNITS_277 });
    expect(star.arrangement).toBe('star-bank');
    expect(star.summary).toMatch(/^wye bank: \d+\.\d\d kvar delivered/);
    expect(star.verification.equipment.map((e) => e.name)).toEqual(['wye bank']);
    const c = compareCorrections(board, { target: { pf: 0.95 }, catalogue: UNITS_277 });
    const compensator = c.outcomes.find((o) => o.arrangement === 'balancing-compensator')!.report!;
    expect(compensator.verification.equipment.map((e) => e.name)).toEqual(['compensator delta part', 'compensator wye part']);
    expect(JSON.stringify(c)).not.toMatch(STAR_WORDS);
    expect(arrangementNames('three-phase-4wire', 'north-america')['star-bank']).toBe('wye bank');
    expect(arrangementNames('three-phase-4wire', 'iec')['star-bank']).toBe('star bank');
    expect(arrangementDescriptions('three-phase-3wire', 'north-america')['star-bank']).toBe('wye-connected capacitor bank (one capacitor per phase)');
    // Star and delta name nothing on a split-phase board, whatever the region.
    expect(arrangementNames('split-phase', 'north-america')['star-bank']).toBe('line-to-neutral bank');
  });
});
