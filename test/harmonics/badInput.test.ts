/**
 * Bad harmonic input: every case is an InputError whose issue names the field
 * (code and path exactly, wording loosely) — never a stack trace or a silently
 * wrong answer.
 */
import { describe, expect, it } from 'vitest';
import { addInstalledBank, InputError, normaliseBoard, parseBoard, studyHarmonics } from '@trivar/core';

const good = () => ({
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 4 } },
  loads: [
    { name: 'desks', connection: 'A-N', kW: 6, pf: 0.97, spectrum: [{ order: 3, percent: 60 }, { order: 5, percent: 40 }] },
    { name: 'heater', connection: 'B-N', kW: 3, pf: 1 },
  ],
});
type Mutable = Record<string, any>;
const edit = (f: (b: Mutable) => void) => {
  const b = good() as Mutable;
  f(b);
  return b;
};

const cases: [string, unknown, string, string, RegExp][] = [
  ['non-integer order', edit((b) => (b.loads[0].spectrum[0].order = 2.5)), 'not_integer', 'loads[0].spectrum[0].order', /whole harmonic order/],
  ['negative order', edit((b) => (b.loads[0].spectrum[0].order = -3)), 'out_of_range', 'loads[0].spectrum[0].order', /from 2 to 50/],
  ['order 1 (the fundamental)', edit((b) => (b.loads[0].spectrum[0].order = 1)), 'out_of_range', 'loads[0].spectrum[0].order', /from 2 to 50/],
  ['order above 50', edit((b) => (b.loads[0].spectrum[1].order = 51)), 'out_of_range', 'loads[0].spectrum[1].order', /from 2 to 50/],
  ['duplicate order', edit((b) => (b.loads[0].spectrum[1].order = 3)), 'duplicate', 'loads[0].spectrum[1].order', /each order once/],
  ['percent above 100', edit((b) => (b.loads[0].spectrum[0].percent = 150)), 'out_of_range', 'loads[0].spectrum[0].percent', /<= 100/],
  ['zero percent', edit((b) => (b.loads[0].spectrum[0].percent = 0)), 'out_of_range', 'loads[0].spectrum[0].percent', /> 0/],
  [
    'implausible total',
    edit((b) => (b.loads[0].spectrum = [3, 5, 7, 9, 11].map((order) => ({ order, percent: 99 })))),
    'implausible',
    'loads[0].spectrum',
    /at most 200 %.*received 221.4/,
  ],
  ['unknown typical kind', edit((b) => (b.loads[0].spectrum = 'toaster')), 'invalid_value', 'loads[0].spectrum', /switch-mode.* or a list/],
  ['linear form on a non-linear load', edit((b) => (b.loads[0].linearForm = 'series')), 'conflict', 'loads[0].linearForm', /without a spectrum/],
  [
    'spectrum on a floating star of fixed impedance',
    edit((b) => b.loads.push({ name: 'rectifier', connection: 'ABC-star', starPoint: 'floating', ohms: { r: 10, x: 1 }, spectrum: 'six-pulse-drive' })),
    'not_applicable',
    'loads[2].spectrum',
    /ABC-delta/,
  ],
  ['background above 20 %', edit((b) => (b.harmonics = { background: [{ order: 5, percent: 30 }] })), 'out_of_range', 'harmonics.background[0].percent', /<= 20/],
  ['background duplicate', edit((b) => (b.harmonics = { background: [{ order: 5, percent: 2 }, { order: 5, percent: 1 }] })), 'duplicate', 'harmonics.background[1].order', /each order once/],
  ['scan beyond order 50', edit((b) => (b.harmonics = { scan: { maxOrder: 80 } })), 'out_of_range', 'harmonics.scan.maxOrder', /<= 50/],
  ['bank with no steps', edit((b) => (b.harmonics = { bank: { connection: 'delta', ratedV: 440, stepsKvar: [] } })), 'out_of_range', 'harmonics.bank.stepsKvar', /at least 1/],
  [
    'delta bank on a single-phase board (one line: no line pair)',
    edit((b) => {
      b.supply = { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 };
      b.loads = [{ name: 'desks', connection: 'A-N', kW: 2, pf: 0.97, spectrum: 'switch-mode' }];
      b.harmonics = { bank: { connection: 'delta', ratedV: 250, stepsKvar: [5] } };
    }),
    'not_applicable',
    'harmonics.bank.connection',
    /connection: star on a single-phase board/,
  ],
  [
    'star bank on a split-phase board (two capacitors switched together: no load connection names them)',
    edit((b) => {
      b.supply = { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 };
      b.loads = [{ name: 'desks', connection: 'A-N', kW: 2, pf: 0.97, spectrum: 'switch-mode' }];
      b.harmonics = { bank: { connection: 'star', ratedV: 240, stepsKvar: [2] } };
    }),
    'not_applicable',
    'harmonics.bank.connection',
    /connection: delta on a split-phase board/,
  ],
];

describe('bad harmonic input', () => {
  it.each(cases)('%s', (_, input, code, path, wording) => {
    let caught: unknown;
    try {
      studyHarmonics(input);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    const issues = (caught as InputError).issues;
    expect(issues.map((i) => [i.code, i.path])).toContainEqual([code, path]);
    expect(issues.find((i) => i.path === path)!.message).toMatch(wording);
  });
});

describe('addInstalledBank called directly', () => {
  it('refuses a bank the board cannot take, naming bank.connection, and places one it can', () => {
    const cabin = normaliseBoard(parseBoard({ supply: { system: 'split-phase', voltage: { lineToNeutral: 120 }, frequencyHz: 60 }, loads: [{ name: 'heater', connection: 'A-B', kW: 3 }] }));
    let caught: unknown;
    try {
      addInstalledBank(cabin, { connection: 'star', ratedV: 240, stepsKvar: [2] });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect((caught as InputError).issues.map((i) => i.path)).toEqual(['bank.connection']);
    // Across the two lines: one capacitor per step carrying the step's whole kvar at its rated voltage.
    const { board } = addInstalledBank(cabin, { connection: 'delta', ratedV: 240, stepsKvar: [2] });
    const step = board.loads.at(-1)!;
    expect(step.connection).toBe('A-B');
    expect(step.branches.map((b) => `${b.from}-${b.to}`)).toEqual(['A-B']);
    expect(-step.branches[0]!.sNominal.im).toBeCloseTo(2000, 9);
  });
});
