/**
 * North-American panel numbering (common practice): odd circuits down the left, even down the right,
 * phases rotating by row. A load whose circuit number and connection disagree gets a warning naming
 * the load, the number, the phase written and the phase the numbering gives; IEC boards get none.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { solveBoard } from '@trivar/core';
import { circuitNumberMismatches, panelPhasesOf } from '../../packages/core/src/analysis/panelNumbering.js';

type Load = { name: string; circuit?: string; poles?: number; connection: string; kW: number };
const board = (supply: Record<string, unknown>, loads: Load[], conventions?: Record<string, unknown>) => ({
  name: 'Diner panel',
  supply: { frequencyHz: 60, transformer: { kVA: 75, impedancePercent: 3, xOverR: 3 }, ...supply },
  loads,
  ...(conventions ? { conventions } : {}),
});
const numberingWarnings = (b: unknown) => solveBoard(b).warnings.filter((w) => w.code === 'circuit-number-phase');

describe('the usual panel numbering', () => {
  it('rows of two circuits, phases A, B, C by row on a three-phase panel, A, B on a split-phase one', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8].map((n) => panelPhasesOf(n, 1, 3)[0])).toEqual(['A', 'A', 'B', 'B', 'C', 'C', 'A', 'A']);
    expect([1, 2, 3, 4, 5, 6].map((n) => panelPhasesOf(n, 1, 2)[0])).toEqual(['A', 'A', 'B', 'B', 'A', 'A']);
    // A two-pole breaker takes its own row and the next: circuit 5 with 7.
    expect(panelPhasesOf(5, 2, 3)).toEqual(['C', 'A']);
    expect(panelPhasesOf(12, 3, 3).sort()).toEqual(['A', 'B', 'C']);
  });

  it('law: circuits six apart on a three-phase panel (four on a split-phase one) sit on the same phases', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 80 }), fc.integer({ min: 1, max: 3 }), (n, poles) => {
        expect(panelPhasesOf(n + 6, poles, 3)).toEqual(panelPhasesOf(n, poles, 3));
        expect(panelPhasesOf(n + 4, Math.min(poles, 2), 2)).toEqual(panelPhasesOf(n, Math.min(poles, 2), 2));
        // The two circuits of a row share its phase.
        const odd = 2 * Math.ceil(n / 2) - 1;
        expect(panelPhasesOf(odd, poles, 3)).toEqual(panelPhasesOf(odd + 1, poles, 3));
      }),
    );
  });
});

describe('a circuit number that disagrees with its phase', () => {
  const loads: Load[] = [
    { name: 'Grill hood', circuit: '1', connection: 'A-N', kW: 1.2 },
    { name: 'Fryer', circuit: '3', connection: 'A-N', kW: 1.5 },
    { name: 'Cooler', circuit: '5', connection: 'B-C', kW: 3 },
    { name: 'Oven', circuit: '7', connection: 'A-B', kW: 4 },
    { name: 'Mixer', circuit: '12', connection: 'C-N', kW: 0.8 },
    { name: 'Air handler', circuit: '13', connection: 'ABC-delta', kW: 5 },
    { name: 'Sign', circuit: '2,4', connection: 'C-N', kW: 0.2 },
    { name: 'Spare feed', connection: 'B-N', kW: 0.5 },
  ];

  it('on a 208Y/120 board: a warning for each mismatch, naming load, number, phase written and phase implied', () => {
    const warnings = numberingWarnings(board({ voltage: '208Y/120' }, loads));
    expect(warnings.map((w) => w.value)).toEqual([3, 5]);
    expect(warnings[0]!.message).toBe(
      'load "Fryer" on circuit 3 is written A-N, but the usual panel numbering (odd circuits down the left, even down the right, phases A, B, C by row) puts circuit 3 on phase B: check the schedule or the connection',
    );
    expect(warnings[1]!.message).toContain('load "Cooler" on circuit 5 is written B-C');
    expect(warnings[1]!.message).toContain('puts circuit 5 (with 7) on C-A');
    // A warning, not an error: the board solves.
    expect(solveBoard(board({ voltage: '208Y/120' }, loads)).phases).toHaveLength(3);
  });

  it('on a split-phase board, phases A, B by row, line-to-line loads fit any number', () => {
    const split = [
      { name: 'Range', circuit: '2', connection: 'A-B', kW: 6 },
      { name: 'Lights', circuit: '5', connection: 'B-N', kW: 0.4 },
      { name: 'Fridge', circuit: '8', connection: 'B-N', kW: 0.3 },
    ];
    const warnings = numberingWarnings(board({ voltage: '120/240' }, split));
    expect(warnings.map((w) => w.message.match(/^load "([^"]+)" on circuit (\d+) is written (\S+),.* on phase (\w+):/)!.slice(1))).toEqual([['Lights', '5', 'B-N', 'A']]);
  });

  it('in the file’s naming (L1/L2/L3)', () => {
    const numbered: Record<string, string> = { A: 'L1', B: 'L2', C: 'L3' };
    const named = loads.map((l) => ({ ...l, connection: l.connection.replace(/[ABC]/g, (p) => numbered[p]!) }));
    const warnings = numberingWarnings(board({ voltage: '208Y/120' }, named));
    expect(warnings[0]!.message).toContain('is written L1-N, but the usual panel numbering (odd circuits down the left, even down the right, phases L1, L2, L3 by row) puts circuit 3 on phase L2');
  });

  it('never on an IEC board, even with the same numbers', () => {
    expect(numberingWarnings(board({ voltage: '230/400', frequencyHz: 50 }, loads))).toEqual([]);
    expect(numberingWarnings(board({ voltage: '208Y/120' }, loads, { region: 'iec' }))).toEqual([]);
  });

  it('a single-phase board has no rotation to judge', () => {
    const load = { name: 'x', circuit: '3', connection: 'A-N' } as never;
    expect(circuitNumberMismatches([load], 1)).toEqual([]);
    expect(circuitNumberMismatches([load], 3)).toEqual([{ kind: 'phases', name: 'x', circuit: 3, positions: [3], connection: 'A-N', poles: 1, implied: ['B'], with: [] }]);
  });
});

describe('multi-pole breakers written with every position', () => {
  const poleWarnings = (b: unknown) => solveBoard(b).warnings.filter((w) => w.code === 'circuit-number-phase' || w.code === 'circuit-number-poles');
  // A bakery's 208Y/120 panel: rows 1–2 on A, 3–4 on B, 5–6 on C, 7–8 on A again.
  const bakery = (loads: Record<string, unknown>[]) => board({ voltage: '208Y/120' }, loads as Load[]);

  it('positions 1,3 and 7,9 sit on A-B: a load written B-C there is flagged, one written A-B is not', () => {
    const warnings = poleWarnings(
      bakery([
        { name: 'Proofer', circuit: '1,3', poles: 2, connection: 'B-C', kW: 5 },
        { name: 'Deck oven', circuit: '7, 9', poles: 2, connection: 'B-C', kW: 5 },
        { name: 'Dough sheeter', circuit: '13/15', poles: 2, connection: 'A-B', kW: 2 },
        { name: 'Walk-in', circuit: '4 6', poles: 2, connection: 'B-C', kW: 2 },
      ]),
    );
    expect(warnings.map((w) => [w.code, w.value])).toEqual([
      ['circuit-number-phase', 1],
      ['circuit-number-phase', 7],
    ]);
    expect(warnings[0]!.message).toBe(
      'load "Proofer" on circuit 1,3 is written B-C, but the usual panel numbering (odd circuits down the left, even down the right, phases A, B, C by row) puts circuit 1,3 on A-B: check the schedule or the connection',
    );
    expect(warnings[1]!.message).toContain('load "Deck oven" on circuit 7,9 is written B-C');
  });

  it('a 3-pole breaker given two positions, a 1-pole one given two, and poles not in one column are flagged', () => {
    const warnings = poleWarnings(
      bakery([
        { name: 'Mixer motor', circuit: '1,3', poles: 3, connection: 'ABC-delta', kW: 3, pf: 0.8 },
        { name: 'Display case', circuit: '2,4', connection: 'C-N', kW: 0.2 },
        { name: 'Fryer', circuit: '5,6', poles: 2, connection: 'C-A', kW: 3 },
        { name: 'Exhaust fan', circuit: '8,10,12', poles: 3, connection: 'ABC-delta', kW: 1.5, pf: 0.85 },
      ]),
    );
    expect(warnings.map((w) => [w.code, w.value])).toEqual([
      ['circuit-number-poles', 1],
      ['circuit-number-poles', 2],
      ['circuit-number-poles', 5],
    ]);
    expect(warnings[0]!.message).toBe(
      'load "Mixer motor" on circuit 1,3 has a 3-pole breaker, but the circuit names 2 positions: a breaker takes one position per pole (1, 3 and 5 for a 3-pole breaker at 1); check the schedule or the poles',
    );
    expect(warnings[1]!.message).toContain('(2 alone for a 1-pole breaker)');
    expect(warnings[2]!.message).toBe(
      'load "Fryer" on circuit 5,6: the poles of one breaker sit one above the other in a column (5 and 7 for a 2-pole breaker at 5), not at 5,6; check the schedule',
    );
  });

  it('a split-phase panel: 1,3 is A-B, any two stacked positions fit a 240 V load; "1,3" and "1 / 3" are one circuit', () => {
    const result = solveBoard(
      board({ voltage: '120/240' }, [
        { name: 'Range', circuit: '1,3', poles: 2, connection: 'A-B', kW: 8 },
        { name: 'Heat strip', circuit: '1 / 3', poles: 2, connection: 'A-B', kW: 5 },
      ] as Load[]),
    );
    expect(result.warnings.filter((w) => w.code.startsWith('circuit-number-')).map((w) => w.code)).toEqual(['circuit-number-shared']);
  });

  it('positions written in words are not judged ("left 3")', () => {
    const loads = [{ name: 'Sign', circuit: 'left 3', connection: 'A-N', kW: 0.1 }];
    expect(poleWarnings(bakery(loads))).toEqual([]);
  });

  // A range names the breaker's first and last positions: "1-3" is 1 and 3, stacked (earlier left unread, so
  // a 2-pole breaker written "11-13" on B-C, which the numbering puts on C-A, passed without a word).
  it('a range is read as the positions it spans: "1-3" on B-C is flagged (1 and 3 sit on A-B), "13-15" on A-B is not', () => {
    const warnings = poleWarnings(
      bakery([
        { name: 'Spare', circuit: '1-3', poles: 2, connection: 'B-C', kW: 1 },
        { name: 'Dough sheeter', circuit: '13–15', poles: 2, connection: 'A-B', kW: 2 },
      ]),
    );
    expect(warnings.map((w) => w.message)).toEqual([
      'load "Spare" on circuit 1,3 is written B-C, but the usual panel numbering (odd circuits down the left, even down the right, phases A, B, C by row) puts circuit 1,3 on A-B: check the schedule or the connection',
    ]);
  });

  it('a range whose ends sit in two columns ("11-12") is not one breaker\'s stack, and says so', () => {
    const warnings = poleWarnings(bakery([{ name: 'Hood fan', circuit: '11-12', poles: 2, connection: 'A-B', kW: 1 }]));
    expect(warnings.map((w) => w.code)).toEqual(['circuit-number-poles']);
    expect(warnings[0]!.message).toContain('the poles of one breaker sit one above the other in a column (11 and 13 for a 2-pole breaker at 11), not at 11,12');
  });

  it('circuit 0 is no panel position: warned, alone or in a list, and a clean schedule has none', () => {
    const zero = (loads: Record<string, unknown>[]) => solveBoard(bakery(loads)).warnings.filter((w) => w.code === 'circuit-number-zero').map((w) => w.message);
    expect(zero([{ name: 'Menu board', circuit: '0', connection: 'C-N', kW: 0.2 }, { name: 'Ice maker', circuit: '0,2', poles: 2, connection: 'A-B', kW: 1 }])).toEqual([
      'load "Menu board" on circuit 0: panel positions are numbered from 1 (odd down the left, even down the right), so 0 is no position on the panel; check the schedule',
      'load "Ice maker" on circuit 0,2: panel positions are numbered from 1 (odd down the left, even down the right), so 0 is no position on the panel; check the schedule',
    ]);
    expect(zero([{ name: 'Menu board', circuit: '10', connection: 'A-N', kW: 0.2 }, { name: 'Spare', circuit: 'spare 0', connection: 'A-N', kW: 0.1 }])).toEqual([]);
  });
});

describe('breakers that would share a position', () => {
  const overlaps = (b: unknown) => solveBoard(b).warnings.filter((w) => w.code === 'circuit-positions-overlap');
  const supply = { voltage: '208Y/120' };
  it('a 1-pole circuit 4 inside a 3-pole breaker at 2 (2, 4, 6) is warned, naming both and the position', () => {
    const w = overlaps(
      board(supply, [
        { name: 'Range', circuit: '2', poles: 3, connection: 'ABC-delta', kW: 9 },
        { name: 'Toaster', circuit: '4', connection: 'B-N', kW: 1.5 },
        { name: 'Lights', circuit: '1', connection: 'A-N', kW: 0.8 },
      ]),
    );
    expect(w.map((x) => x.message)).toEqual(['loads "Range" (positions 2, 4, 6) and "Toaster" (position 4) both need position 4: a breaker position holds one pole of one breaker; check the schedule or the poles']);
  });
  it('listed positions count as written ("3,5" against a 2-pole breaker at 1: 1, 3), and a clean schedule gives none', () => {
    const w = overlaps(
      board(supply, [
        { name: 'Dryer', circuit: '1', connection: 'A-B', kW: 4 },
        { name: 'Heater', circuit: '3,5', connection: 'B-C', kW: 3 },
      ]),
    );
    expect(w.map((x) => x.value)).toEqual([3]);
    const clean = board(supply, [
      { name: 'Dryer', circuit: '1', connection: 'A-B', kW: 4 },
      { name: 'Heater', circuit: '5,7', connection: 'C-A', kW: 3 },
      { name: 'Fridge', circuit: '2', connection: 'A-N', kW: 0.5 },
    ]);
    expect(overlaps(clean)).toEqual([]);
    // The same text twice is the shared-number warning's, not a second finding here.
    const twice = board(supply, [
      { name: 'Fan 1', circuit: '8', connection: 'B-N', kW: 0.3 },
      { name: 'Fan 2', circuit: '8', connection: 'B-N', kW: 0.3 },
    ]);
    expect(overlaps(twice)).toEqual([]);
    expect(solveBoard(twice).warnings.map((x) => x.code)).toContain('circuit-number-shared');
  });
  it('IEC boards number their ways otherwise: no finding', () => {
    const iec = board({ voltage: '400/230', frequencyHz: 50 }, [
      { name: 'Oven', circuit: '2', poles: 3, connection: 'ABC-delta', kW: 9 },
      { name: 'Kettle', circuit: '4', connection: 'B-N', kW: 2 },
    ]);
    expect(overlaps(iec)).toEqual([]);
  });
});
