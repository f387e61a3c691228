/**
 * A board without a neutral is judged and reported on its line-to-line voltages only: its "phase"
 * voltages are to the mean of the three lines, a point no conductor reaches. The assumptions name an open
 * delta as such (it has no star point), and the neutral caution is given only where a board has a neutral.
 * An invented 240 V 60 Hz open-delta orchard pack house with a six-pulse drive and a delta bank, and the
 * same loads on a 208 V four-wire board.
 */
import { describe, expect, it } from 'vitest';
import { studyHarmonics, studyInstallationHarmonics } from '@trivar/core';

const NEUTRAL_CAUTION = /^Neutrals of boards/;

const loads = [
  { name: 'cooler compressor', connection: 'ABC-delta', kW: 9, pf: 0.8, spectrum: 'six-pulse-drive' },
  { name: 'grader', connection: 'A-B', kW: 4, pf: 0.75 },
];

const packHouse = {
  name: 'Quince Hill pack house',
  supply: {
    system: 'three-phase-3wire',
    voltage: { lineToLine: 240 },
    frequencyHz: 60,
    openDelta: { 'B-C': { kVA: 37.5, impedancePercent: 2.6, xOverR: 2 }, 'C-A': { kVA: 25, impedancePercent: 2.9, xOverR: 2 } },
  },
  loads,
  harmonics: { bank: { connection: 'delta', ratedV: 240, stepsKvar: [4, 4] } },
};

describe('harmonics on a board without a neutral', () => {
  const r = studyHarmonics(packHouse);

  it('judges the line-to-line voltages only, and the worst of them is the one reported', () => {
    expect(r.hasNeutral).toBe(false);
    expect(r.voltageDistortion.buses.map((b) => b.bus)).toEqual(['A-B', 'B-C', 'C-A']);
    const worst = Math.max(...r.lineToLine.map((p) => p.voltage.thdPercent!));
    expect(Math.max(...r.voltageDistortion.buses.map((b) => b.thdPercent!))).toBe(worst);
    // The mean-point voltages differ from every line-to-line one, so leaving them out changes the verdict's figures.
    expect(r.lines.some((l) => Math.abs(l.voltage.thdPercent! - worst) > 0.05)).toBe(true);
    for (const w of r.warnings.filter((x) => x.code.startsWith('voltage-'))) expect(w.message).not.toMatch(/-N /);
  });

  it('names the open delta without a wye point (a North-American board), and gives no neutral caution', () => {
    const source = r.assumptions.find((a) => a.includes('open delta'));
    expect(source).toMatch(/^the source an open delta as the file gives it: two windings meeting at line C, .*no wye point or neutral/);
    expect(r.assumptions.join('\n')).not.toMatch(/star point|wye point (earthed|grounded)/);
    expect(r.cautions.some((c) => NEUTRAL_CAUTION.test(c))).toBe(false);
  });

  it('in an installation of 3-wire boards: line-to-line buses on every board, no neutral caution', () => {
    const { harmonics: _h, loads: _l, ...supplyPart } = packHouse;
    const inst = studyInstallationHarmonics({
      ...supplyPart,
      boards: [
        { name: 'Intake', loads: [{ name: 'lights', connection: 'B-C', kW: 2 }] },
        { name: 'Grading hall', fedFrom: 'Intake', feeder: { lengthFt: 150, line: { awg: '4' } }, loads },
      ],
    });
    for (const b of inst.boards) {
      expect(b.hasNeutral).toBe(false);
      expect(b.voltageDistortion.buses.map((x) => x.bus)).toEqual(['A-B', 'B-C', 'C-A']);
    }
    expect(inst.cautions.some((c) => NEUTRAL_CAUTION.test(c))).toBe(false);
  });

  it('a four-wire board keeps its line-to-neutral buses and the neutral caution', () => {
    const shop = studyHarmonics({
      name: 'Quince Hill farm shop',
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 208 }, frequencyHz: 60, transformer: { kVA: 45, impedancePercent: 3, xOverR: 2 } },
      loads,
    });
    expect(shop.hasNeutral).toBe(true);
    expect(shop.voltageDistortion.buses.map((b) => b.bus)).toEqual(['A-N', 'B-N', 'C-N', 'A-B', 'B-C', 'C-A']);
    expect(shop.cautions.some((c) => NEUTRAL_CAUTION.test(c))).toBe(true);
  });
});
