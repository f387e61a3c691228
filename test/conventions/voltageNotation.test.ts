/**
 * Voltage notation as the trade writes it: every accepted form read to the right system and
 * figures, written back the region's way and read again to the same figures, and impossible
 * pairs refused with what is accepted.
 * Nominal system voltages: IEC 60038 (230/400, 400/690) and ANSI C84.1 (120/240, 208Y/120,
 * 480Y/277, 600Y/347) — from memory.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readVoltageNotation, writeVoltageNotation, validateBoard, solveBoard } from '@trivar/core';

const cases: [string, 'three-phase-4wire' | 'split-phase', number, number][] = [
  ['208Y/120', 'three-phase-4wire', 208, 120],
  ['480Y/277', 'three-phase-4wire', 480, 277],
  ['600Y/347', 'three-phase-4wire', 600, 347],
  ['400/230', 'three-phase-4wire', 400, 230],
  ['230/400', 'three-phase-4wire', 400, 230],
  ['415/240', 'three-phase-4wire', 415, 240],
  ['120/208', 'three-phase-4wire', 208, 120],
  ['120/240', 'split-phase', 240, 120],
  ['240/120', 'split-phase', 240, 120],
  [' 208y/120 V ', 'three-phase-4wire', 208, 120],
];

describe('reading voltage notation', () => {
  it.each(cases)('%s is a %s system, %d V line-to-line and %d V line-to-neutral', (text, system, ll, ln) => {
    const read = readVoltageNotation(text);
    expect(read.ok).toBe(true);
    if (!read.ok) return;
    expect(read.notation).toMatchObject({ system, lineToLineV: ll, lineToNeutralV: ln });
  });

  const bad: [string, string | undefined, RegExp][] = [
    ['400/200', 'three-phase-4wire', /ratio of √3 .*2\.000/],
    ['120/240', 'three-phase-3wire', /ratio of √3/],
    ['400/230', 'split-phase', /ratio of 2/],
    ['480Y/300', undefined, /√3.*1\.600/],
    ['120Y/208', undefined, /line-to-line voltage first/],
    ['400/250', undefined, /neither|√3 \(1\.732, a star system\) or 2/],
    ['four hundred', undefined, /number pair like "208Y\/120"/],
    ['400/0', undefined, /above 0 V|number pair/],
    // Low voltage only, as { lineToLine } is (IEC 60038: up to 1,000 V a.c.).
    ['12470Y/7200', undefined, /from 10 to 1,000 V.*12470\/7200 is outside/],
    ['34500Y/19920', undefined, /from 10 to 1,000 V/],
    ['1/0.577', undefined, /from 10 to 1,000 V/],
  ];
  it.each(bad)('refuses %s (system %s) and says what is accepted', (text, system, message) => {
    const read = readVoltageNotation(text, system as never);
    expect(read.ok).toBe(false);
    if (!read.ok) expect(read.problem).toMatch(message);
  });

  it('writes each region its own way and reads back the same figures (round trip)', () => {
    expect(writeVoltageNotation('three-phase-4wire', 120, 208, 'north-america')).toBe('208Y/120 V');
    expect(writeVoltageNotation('three-phase-4wire', 230, 400, 'iec')).toBe('230/400 V');
    expect(writeVoltageNotation('split-phase', 120, 240, 'north-america')).toBe('120/240 V');
    fc.assert(
      // Line-to-neutral voltages whose line-to-line voltage stays within the low-voltage range (1,000 V).
      fc.property(fc.integer({ min: 50, max: 500 }), fc.boolean(), fc.constantFrom('iec', 'north-america'), (ln, split, region) => {
        const ll = split ? 2 * ln : Math.round(ln * Math.sqrt(3) * 10) / 10;
        const system = split ? 'split-phase' : 'three-phase-4wire';
        const text = writeVoltageNotation(system, ln, ll, region);
        const read = readVoltageNotation(text);
        expect(read.ok).toBe(true);
        if (!read.ok) return;
        expect(read.notation.system).toBe(system);
        expect(read.notation.lineToLineV).toBeCloseTo(ll, 6);
        expect(read.notation.lineToNeutralV).toBeCloseTo(ln, 6);
      }),
    );
  });
});

describe('notation in a board file', () => {
  const board = (voltage: unknown, system?: string) => ({
    supply: { ...(system ? { system } : {}), voltage, frequencyHz: 60 },
    loads: [{ name: 'heater', connection: 'A-B', kW: 4.8 }],
  });

  it('gives the system when the file leaves it out, and the same solve as numbers', () => {
    const written = solveBoard(board('208Y/120'));
    const numeric = solveBoard(board({ lineToLine: 208 }, 'three-phase-4wire'));
    expect(written.board.system).toBe('three-phase-4wire');
    expect(written.board.nominalLineToLineV).toBe(208);
    expect(written.phases.map((p) => p.voltage.magnitude)).toEqual(numeric.phases.map((p) => p.voltage.magnitude));
    expect(solveBoard(board('120/240')).board.system).toBe('split-phase');
    expect(solveBoard(board('120/240')).board.nominalLineToNeutralV).toBe(120);
  });

  it('a `written` key in the object form (trivar sets it) says to write the notation as the voltage itself', () => {
    const result = validateBoard(board({ written: '208Y/120' }, 'three-phase-4wire'));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const issue = result.issues.find((i) => i.path === 'supply.voltage.written')!;
    expect(issue.message).toContain('voltage: "208Y/120"');
    expect(issue.message).toContain('written with no figures beside it');
    expect(issue.message).not.toContain('- V');
  });

  const invalid: [string, unknown, string | undefined, string, RegExp][] = [
    ['a split-phase pair on a star system', '400/200', 'three-phase-4wire', 'bad_voltage_notation', /√3 \(1\.732\) for a three-phase star/],
    ['a star pair on a split-phase system', '230/400', 'split-phase', 'bad_voltage_notation', /ratio of 2 for a split-phase/],
    ['a ratio that is neither', '400/250', 'three-phase-4wire', 'bad_voltage_notation', /1\.600/],
    ['text that is no notation', '400 volts', 'three-phase-4wire', 'bad_voltage_notation', /"208Y\/120"/],
  ];
  it('an out-of-range notation with the system left out is the one problem reported (not also a missing system)', () => {
    const result = validateBoard(board('12470Y/7200', undefined));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.issues.map((i) => i.path)).toEqual(['supply.voltage']);
  });
  it.each(invalid)('%s: code and path', (_, voltage, system, code, message) => {
    const result = validateBoard(board(voltage, system));
    expect(result.ok).toBe(false);
    if (result.ok) return;
    const issue = result.issues.find((i) => i.path === 'supply.voltage');
    expect(issue?.code).toBe(code);
    expect(issue?.message).toMatch(message);
  });
});
