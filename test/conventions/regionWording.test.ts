/**
 * Wording follows the board's region: a North-American split-phase (120/240 V) report
 * speaks of the center tap and the grounded conductor (neutral) and never of PEN, TN-C-S
 * or a star point; an IEC board keeps the IEC words; the region can be set in the file.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildBoardReport, normaliseBoard, parseBoard, readBoardText, renderReportMarkdown, solveBoard, solveBoardModel } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';
import { renderSolveReport } from '../../packages/cli/src/format/solveReport.js';

const ROOT = new URL('../../', import.meta.url);
const example = (name: string) => readBoardText(readFileSync(new URL(`examples/${name}`, ROOT), 'utf8')) as Record<string, unknown>;
const IEC_TERMS = /\bPEN\b|TN-C-S|TN-S|star point|\bearth(ed|ing)?\b/;
const NORTH_AMERICAN_TERMS = /cent(er|re) tap|grounded conductor|wye point|\bgrounding\b/;

describe('region wording', () => {
  it('a 120/240 V split-phase report (with the broken-neutral study) has no IEC terms', () => {
    const r = solveBoard(example('pine-hollow-cabin.yaml'));
    expect(r.conventions).toMatchObject({ region: 'north-america', regionBasis: 'notation', phaseNames: 'A/B/C' });
    const text = renderSolveReport(r);
    expect(text).not.toMatch(IEC_TERMS);
    expect(text).toMatch(/center tap/);
    expect(text).not.toMatch(/centre/);
    expect(text).toMatch(/grounded conductor \(neutral\)/);
    expect(r.openNeutral?.cautions.join(' ')).not.toMatch(IEC_TERMS);
    // Its two lines are not phases: a line-to-neutral voltage outside the limits is named A-N, never "phase A".
    const voltage = r.warnings.filter((w) => w.message.includes('at the board is'));
    expect(voltage.map((w) => w.message.split(' at the board')[0])).toEqual(['line-to-neutral A-N']);
    expect(text).not.toMatch(/\bphase [AB]\b/);
  });

  it('the split-phase report (HTML/Markdown) floats the bar from the center tap, and has no three-phase lead/lag note', () => {
    const spec = parseBoard(example('pine-hollow-cabin.yaml'));
    const result = solveBoardModel(normaliseBoard(spec));
    const md = renderReportMarkdown(buildBoardReport({ spec, result }), 'r').markdown;
    expect(md).toMatch(/The neutral bar would float to [\d.]+ V from the transformer center tap\./);
    expect(md).not.toMatch(IEC_TERMS);
    expect(renderSolveReport(result)).not.toMatch(/one line leads, the other lags/);
    // The current convention counts its two lines; a 3-wire board's sums to zero (no neutral).
    expect(md).toContain('so the two line currents add up to the neutral current');
    expect(md).not.toContain('three line currents');
    const threeWire = parseBoard({ name: 'mill', supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads: [{ name: 'saw', connection: 'A-B', kW: 3 }] });
    const md3 = renderReportMarkdown(buildBoardReport({ spec: threeWire, result: solveBoardModel(normaliseBoard(threeWire)) }), 'r').markdown;
    expect(md3).toContain('(the board has no neutral, so the three line currents add up to zero)');
  });

  it('an IEC board keeps PEN and TN-C-S and never speaks of a center tap or grounded conductor', () => {
    const text = renderSolveReport(solveBoard(example('corner-bakery.yaml')));
    expect(text).toMatch(/TN-C-S/);
    expect(text).toMatch(/\(PEN\)/);
    expect(text).not.toMatch(NORTH_AMERICAN_TERMS);
  });

  it('the file can override the inferred region', () => {
    const bakery = { ...example('corner-bakery.yaml'), conventions: { region: 'north-america' } };
    const r = solveBoard(bakery);
    expect(r.conventions).toMatchObject({ region: 'north-america', regionBasis: 'file' });
    const text = renderSolveReport(r);
    expect(text).not.toMatch(IEC_TERMS);
    expect(text).toMatch(/wye point/);
  });

  it('states the pf taken for a resistive load given by kW alone (default 1), in the report and the result', () => {
    const r = solveBoard(example('pine-hollow-cabin.yaml'));
    const heater = r.loads.find((l) => l.name === 'Space heaters')!;
    expect(heater.pfAssumed).toBe(true);
    expect(heater.pf).toBe(1);
    expect(renderSolveReport(r)).toMatch(/\*: pf not given in the file, taken as 1 \(a resistive load\)/);
  });

  // The capacitor cautions of `correct` and `harmonics` follow the region too: shorted "to ground"
  // on North-American boards (480 V at 60 Hz, 120/240 V), "to earth" on IEC boards.
  // The cabin already meets PF 0.95 (correct then shows no capacitor cautions): asked for 0.999 it needs a bank.
  it.each([
    ['cedar-falls-print-shop.yaml', 'ground', []],
    ['pine-hollow-cabin.yaml', 'ground', ['--pf', '0.999']],
    ['corner-bakery.yaml', 'earth', []],
  ])('correct and harmonics on %s speak of %s in their cautions', (file, word, target) => {
    for (const command of ['correct', 'harmonics']) {
      const r = runTrivar([command, `examples/${file}`, ...(command === 'correct' ? target : [])]);
      expect(r.stderr).toBe('');
      const cautions = r.stdout.slice(r.stdout.lastIndexOf('Cautions'));
      expect(cautions).toMatch(new RegExp(`together and to ${word} before touching`));
      if (word === 'ground') expect(r.stdout).not.toMatch(IEC_TERMS);
      else expect(r.stdout).not.toMatch(NORTH_AMERICAN_TERMS);
    }
  });
});
