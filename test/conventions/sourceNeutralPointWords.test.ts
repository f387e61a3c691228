/**
 * The point a split-phase board's neutral bar voltage is measured from is named for what the file gives: the
 * transformer's center tap where the file gives a transformer, the source's where it gives only a voltage (an
 * ideal source) or an impedance. An ideal-source board read "off the transformer center tap" in `check` and
 * "to the transformer center tap" in `solve`. IEC wording: a centre tap too (a split-phase supply has no star
 * point), spelt the IEC way.
 *
 * Invented: the Orchard Rise pump shed (120/240 V, a pump on A-N, a welder across A-B) and Cedar Gap farm (a
 * farmhouse feeding a barn), each with and without a 25 kVA / 50 kVA supply transformer.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBoardReport, InputError, normaliseBoard, parseBoard, readBoardText, regionWords, renderReportMarkdown, solveBoardModel } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

const shed = (supplyExtra: string, region: string) => `name: Orchard Rise pump shed
supply: { system: split-phase, voltage: { lineToNeutral: 120 }, frequencyHz: 60${supplyExtra} }
${region ? `conventions: { region: ${region} }\n` : ''}feeder:
  line: { lengthM: 20, rOhmPerKm: 1.0, xOhmPerKm: 0.5 }
  neutral: { lengthM: 20, rOhmPerKm: 1.0, xOhmPerKm: 0.5 }
loads:
  - { name: Irrigation pump, connection: A-N, kW: 2.4, pf: 0.7 }
  - { name: Welder, connection: A-B, kW: 4.8, pf: 0.75 }
`;
const TRANSFORMER = ', transformer: { kVA: 25, impedancePercent: 2.5, xOverR: 2 }';
const IMPEDANCE = ', impedance: { r: 0.02, x: 0.03 }';
const HAND = 'capacitors:\n  - { branch: A-N, kvar: 1.5 }\n  - { branch: A-B, kvar: 2.5 }\n';

const flat = (text: string) => text.replace(/\s+/g, ' ');

describe('the source neutral point of a split-phase board', () => {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-centre-tap-'));
  const write = (name: string, text: string) => {
    const file = join(dir, name);
    writeFileSync(file, text);
    return file;
  };
  const hand = write('hand.yaml', HAND);

  it.each([
    ['north-america', 'ideal source', 'the source center tap', ''],
    ['north-america', 'source impedance', 'the source center tap', IMPEDANCE],
    ['north-america', 'transformer', 'the transformer center tap', TRANSFORMER],
    ['iec', 'ideal source', 'the source centre tap', ''],
    ['iec', 'transformer', 'the transformer centre tap', TRANSFORMER],
  ])('%s, %s: solve, check and the report say %s', (region, _, words, extra) => {
    const text = shed(extra, region === 'iec' ? 'iec' : '');
    const file = write(`shed-${region}-${extra.length}.yaml`, text);
    const solved = runTrivar(['solve', file]);
    expect(solved.code).toBe(0);
    expect(flat(solved.stdout)).toContain(`N row: neutral bar voltage to ${words},`);
    const checked = runTrivar(['check', file, hand]);
    expect(checked.code).toBe(0);
    expect(flat(checked.stdout)).toMatch(new RegExp(`lifts the neutral bar [\\d.]+ V off ${words}, so the line-to-neutral voltages become unequal`));
    const spec = parseBoard(readBoardText(text));
    const md = renderReportMarkdown(buildBoardReport({ spec, result: solveBoardModel(normaliseBoard(spec)) }), 'r').markdown;
    expect(flat(md)).toContain(`the N row gives the neutral bar voltage to ${words} and the neutral current`);
    for (const out of [solved.stdout, checked.stdout, md]) {
      expect(out).not.toMatch(/star point/);
      if (!extra.includes('transformer')) expect(out).not.toMatch(/transformer cent(er|re) tap/);
    }
  });

  it('a sub-board is fed by its installation’s supply: the barn names the transformer only where the file gives one', () => {
    const farm = (supplyExtra: string) => `name: Cedar Gap farm
supply: { voltage: 120/240, frequencyHz: 60${supplyExtra} }
boards:
  - name: Farmhouse
    loads: [ { name: Kitchen, connection: A-N, kW: 1.8 } ]
  - name: Barn
    fedFrom: Farmhouse
    feeder: { line: { lengthM: 60, rOhmPerKm: 1.0, xOhmPerKm: 0.1 }, neutral: { lengthM: 60, rOhmPerKm: 1.0, xOhmPerKm: 0.1 } }
    loads: [ { name: Heat lamps, connection: B-N, kW: 2.4 } ]
`;
    for (const [extra, words] of [
      ['', 'the source center tap'],
      [', transformer: { kVA: 50, impedancePercent: 2.5, xOverR: 2 }', 'the transformer center tap'],
    ] as const) {
      const r = runTrivar(['solve', write(`farm-${extra.length}.yaml`, farm(extra)), '--board', 'Barn']);
      expect(r.code).toBe(0);
      expect(flat(r.stdout)).toContain(`N row: neutral bar voltage to ${words},`);
    }
  });

  it('regionWords: the source by default, the transformer when asked; a word it does not know is refused naming source', () => {
    expect(regionWords('north-america', 'split-phase').sourceNeutralPoint).toBe('the source center tap');
    expect(regionWords('north-america', 'split-phase', 'transformer').sourceNeutralPoint).toBe('the transformer center tap');
    expect(regionWords('iec', 'split-phase', 'transformer').sourceNeutralPoint).toBe('the transformer centre tap');
    // Three-phase words name no winding either way.
    expect(regionWords('iec', 'three-phase-4wire', 'transformer').sourceNeutralPoint).toBe('the source star point');
    expect(regionWords('north-america', 'three-phase-4wire', 'source').sourceNeutralPoint).toBe('the source wye point');
    expect(() => regionWords('iec', 'split-phase', 'generator' as never)).toThrow(InputError);
    try {
      regionWords('iec', 'split-phase', 'generator' as never);
    } catch (e) {
      expect((e as InputError).issues[0]!.path).toBe('source');
    }
  });
});
