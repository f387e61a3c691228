/**
 * The work order carries the file's circuit numbers (the list position apart, named so), and says
 * what a move does to a numbered circuit's breaker position: on a North-American panel the usual
 * numbering ties a number to a line, so a moved circuit needs a new one.
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, rebalanceBoard, rewriteBoardText, solveBoard, type BoardSpec } from '@trivar/core';

// The hostile board RB2: 208Y/120 V, circuit numbers 1, 3, 5-7, 9, 11, 13.
const rb2: BoardSpec = {
  name: 'RB2',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 208 }, frequencyHz: 60 },
  loads: [
    { name: 'Oven', circuit: '1', breakerA: 30, poles: 1, connection: 'A-N', kW: 3, pf: 1 },
    { name: 'Kettle', circuit: '3', breakerA: 20, poles: 1, connection: 'A-N', kW: 2, pf: 1 },
    { name: 'Dryer', circuit: '5-7', breakerA: 30, poles: 2, connection: 'A-B', kW: 5, pf: 1 },
    { name: 'Lights', circuit: '9', breakerA: 15, poles: 1, connection: 'A-N', kW: 1.5, pf: 0.9 },
    { name: 'Pump', circuit: '11', breakerA: 20, poles: 1, connection: 'A-N', kW: 1.4, pf: 0.8 },
    { name: 'Spare', circuit: '13', breakerA: 20, poles: 1, connection: 'B-N', kW: 0.1, pf: 1 },
  ],
} as BoardSpec;

describe('rebalance: circuit numbers', () => {
  const report = rebalanceBoard(normaliseBoard(parseBoard(rb2)), {}, { moveTable: false });

  it('each move carries the file\'s circuit number and, apart, its list position (the number was the list position)', () => {
    expect(report.moves.map((m) => [m.circuit, m.listPosition, m.name, m.from, m.to])).toEqual([
      ['1', 1, 'Oven', 'A-N', 'C-N'],
      ['3', 2, 'Kettle', 'A-N', 'B-N'],
      ['13', 6, 'Spare', 'B-N', 'C-N'],
    ]);
  });

  it('says what the usual numbering makes of each move: a new number, or one that already fits the new line', () => {
    expect(report.moves.map((m) => m.circuitNumber)).toEqual([
      { verdict: 'renumber', implied: ['A'], positions: [1] },
      { verdict: 'matches-new-line', implied: ['B'], positions: [3] },
      { verdict: 'renumber', implied: ['A'], positions: [13] },
    ]);
    expect(report.notes).toContain(
      '"Oven" (circuit 1), "Spare" (circuit 13) take breaker positions on their new lines: the usual panel numbering ties each circuit number to a line, so they need the numbers of the new positions. A file rewritten with these moves keeps the old numbers; re-assign them there and on the circuit chart.',
    );
  });

  it('the rewritten file keeps circuit "1" with Oven on C-N, which solve then flags: the note is true', () => {
    const text = `${JSON.stringify(rb2)}\n`;
    const written = JSON.parse(rewriteBoardText(text, report.moves)) as BoardSpec;
    expect(written.loads[0]).toMatchObject({ name: 'Oven', circuit: '1', connection: 'C-N' });
    const flagged = solveBoard(written).warnings.filter((w) => w.code === 'circuit-number-phase').map((w) => w.value);
    expect(flagged).toContain(1);
    expect(flagged).toContain(13);
  });

  it('on a board that is not North-American, a numbered circuit\'s position changes, unjudged', () => {
    const iec = { ...rb2, supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } } as BoardSpec;
    const r = rebalanceBoard(normaliseBoard(parseBoard(iec)), {}, { moveTable: false });
    expect(r.moves.length).toBeGreaterThan(0);
    for (const m of r.moves) expect(m.circuitNumber).toEqual({ verdict: 'position-changes', implied: null, positions: null });
    expect(r.notes.some((n) => n.includes('numbering'))).toBe(false);
  });

  it('a circuit the file gives no number: circuit null, no verdict', () => {
    const plain = { ...rb2, loads: rb2.loads.map(({ circuit: _c, ...l }) => l) } as BoardSpec;
    const r = rebalanceBoard(normaliseBoard(parseBoard(plain)), {}, { moveTable: false });
    expect(r.moves.map((m) => [m.circuit, m.listPosition, m.circuitNumber])).toEqual([
      [null, 1, null],
      [null, 2, null],
      [null, 6, null],
    ]);
  });
});

// An invented print shop on a 208Y/120 V panel, every move forced by a pin: rows 1–2 A, 3–4 B, 5–6 C, 7–8 A, …
const printShop: BoardSpec = {
  name: 'print shop',
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 208 }, frequencyHz: 60 },
  loads: [
    { name: 'dryer', circuit: '1,3', poles: 2, connection: 'A-B', kW: 4.5, pf: 1 },
    { name: 'oven', circuit: '2,4,6', poles: 3, connection: 'ABC-star', kW: 6, pf: 1 },
    { name: 'heater', circuit: '7', poles: 1, connection: 'A-N', kW: 1.8, pf: 1 },
    { name: 'welder', circuit: '9', poles: 2, connection: 'C-A', kW: 3, pf: 0.7 },
    { name: 'kettle', circuit: '14', poles: 2, connection: 'A-B', kW: 3, pf: 1 },
    { name: 'press', circuit: '17,20', poles: 2, connection: 'C-A', kW: 2.5, pf: 0.8 },
  ],
  rebalance: {
    pinned: [
      { circuit: 'dryer', on: 'B-C' },
      'heater',
      { circuit: 'welder', on: 'B-C' },
      { circuit: 'kettle', on: 'C-A' },
      { circuit: 'press', on: 'A-B' },
    ],
  },
} as BoardSpec;

describe('rebalance: multi-pole breakers, read as solve reads them', () => {
  const board = normaliseBoard(parseBoard(printShop));
  const report = rebalanceBoard(board, printShop.rebalance!, { moveTable: false });
  const byName = Object.fromEntries(report.moves.map((m) => [m.name, m.circuitNumber]));

  it('a 2-pole breaker listed "1,3" is judged (it was left unjudged): rows 1 and 2 are A and B, so B-C needs new numbers', () => {
    expect(report.moves.map((m) => [m.name, m.from, m.to])).toEqual([
      ['dryer', 'A-B', 'B-C'],
      ['welder', 'C-A', 'B-C'],
      ['kettle', 'A-B', 'C-A'],
      ['press', 'C-A', 'A-B'],
    ]);
    expect(byName.dryer).toEqual({ verdict: 'renumber', implied: ['A', 'B'], positions: [1, 3] });
  });

  it('a 2-pole breaker given one number takes the position below it too: 14 and 16 (rows 7, 8: A, B); 9 and 11 (rows 5, 6: B, C) already fit B-C', () => {
    expect(byName.kettle).toEqual({ verdict: 'renumber', implied: ['A', 'B'], positions: [14, 16] });
    expect(byName.welder).toEqual({ verdict: 'matches-new-line', implied: ['B', 'C'], positions: [9, 11] });
  });

  it('positions listed that are not stacked in one column describe no breaker the numbering places: not judged', () => {
    expect(byName.press).toEqual({ verdict: 'position-changes', implied: null, positions: null });
  });

  it('the note names the multi-pole circuits and asks for new numbers for each position', () => {
    expect(report.notes).toContain(
      '"dryer" (circuit 1,3, 2 poles), "kettle" (circuit 14, 2 poles) take breaker positions on their new lines: the usual panel numbering ties each circuit number to a line, so they need the numbers of the new positions. A file rewritten with these moves keeps the old numbers; re-assign them there and on the circuit chart.',
    );
  });

  it('agrees with solve on the rewritten file: it flags the circuits told to renumber, not the one whose number already fits', () => {
    const written = JSON.parse(rewriteBoardText(`${JSON.stringify(printShop)}\n`, report.moves)) as BoardSpec;
    const phaseFlags = solveBoard(written).warnings.filter((w) => w.code === 'circuit-number-phase').map((w) => w.value);
    expect(phaseFlags.sort((a, b) => Number(a) - Number(b))).toEqual([1, 14]);
    // And on the file as it stands, the welder's 9 (with 11) is what solve flags against C-A.
    expect(solveBoard(printShop).warnings.filter((w) => w.code === 'circuit-number-phase').map((w) => w.value)).toEqual([9]);
  });
});

describe('solve: circuit numbers two loads share', () => {
  it('a warning naming both loads and the number (none before)', () => {
    const spec = { ...rb2, loads: [...rb2.loads.slice(0, 1), { ...rb2.loads[1]!, circuit: ' 1 ' }, ...rb2.loads.slice(2)] } as BoardSpec;
    const shared = solveBoard(spec).warnings.filter((w) => w.code === 'circuit-number-shared');
    expect(shared.map((w) => [w.message, w.value])).toEqual([['loads "Oven" and "Kettle" both give circuit 1: one breaker position holds one circuit; check the schedule', 2]]);
    expect(solveBoard(rb2).warnings.some((w) => w.code === 'circuit-number-shared')).toBe(false);
  });
});
