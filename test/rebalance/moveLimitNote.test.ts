/**
 * An answer with no moves says why: the present wiring is the best found, or the move limit keeps it
 * (then what the moves it forbids would give).
 */
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoard, rebalanceBoard, type BoardSpec } from '@trivar/core';

const oneLineHeavy: BoardSpec = {
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [
    { name: 'L1', connection: 'A-N', kW: 5, pf: 0.95 },
    { name: 'L2', connection: 'A-N', kW: 4, pf: 0.9 },
    { name: 'L3', connection: 'A-N', kW: 3, pf: 1 },
    { name: 'L4', connection: 'B-N', kW: 2, pf: 0.8 },
    { name: 'L5', connection: 'C-N', kW: 1, pf: 0.9 },
  ],
} as BoardSpec;
const board = normaliseBoard(parseBoard(oneLineHeavy));

describe('rebalance: no moves, and why', () => {
  it('a move limit of 0 is named as the reason, with what the moves would give (it said the wiring was already the best)', () => {
    const r = rebalanceBoard(board, { moveLimit: 0 }, { moveTable: false });
    expect(r.moves).toEqual([]);
    expect(r.notes).toContain('The move limit of 0 allows no move, so the present wiring stays; without the limit, 2 moves would take the score from 98.49 to 27.78 (fast model).');
    expect(r.notes.some((n) => n.startsWith('The present wiring is already the best'))).toBe(false);
  });

  it('without a limit the same board moves; a balanced board is already the best', () => {
    const free = rebalanceBoard(board, {}, { moveTable: false });
    expect(free.moves.length).toBe(2);
    expect(free.score.after).toBeCloseTo(27.78, 2);
    const balanced = { ...oneLineHeavy, loads: [{ name: 'X', connection: 'A-N', kW: 2, pf: 1 }, { name: 'Y', connection: 'B-N', kW: 2, pf: 1 }, { name: 'Z', connection: 'C-N', kW: 2, pf: 1 }] } as BoardSpec;
    const r = rebalanceBoard(normaliseBoard(parseBoard(balanced)), { moveLimit: 0 }, { moveTable: false });
    expect(r.notes).toContain('The present wiring is already the best found: no moves.');
  });
});

describe('rebalance: a single-phase board', () => {
  it('says there is nothing to rebalance, with the oneLine flag (it scored the fast model without the neutral)', () => {
    const single = { supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 }, loads: [{ name: 'W1', connection: 'A-N', kW: 3, pf: 0.9 }] } as BoardSpec;
    const r = rebalanceBoard(normaliseBoard(parseBoard(single)), {});
    expect(r.oneLine).toBe(true);
    expect(r.moves).toEqual([]);
    expect(r.notes).toEqual(['A single-phase supply has one line: every circuit is on it and there is no other to move one to, so there is nothing to rebalance.']);
    expect(rebalanceBoard(board, {}, { moveTable: false }).oneLine).toBe(false);
  });

  it('scores the neutral in the fast model as the re-solve does: the line current twice, over and back', () => {
    // 3 kW at PF 0.9 on 230 V: 3000 / (230 × 0.9) = 14.49 A in the line and the same back in the neutral.
    const single = { supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 }, loads: [{ name: 'W1', connection: 'A-N', kW: 3, pf: 0.9 }] } as BoardSpec;
    const r = rebalanceBoard(normaliseBoard(parseBoard(single)), {});
    const figures = r.conditions[0]!.model.before;
    expect(figures.lineA[0]).toBeCloseTo(3000 / (230 * 0.9), 9);
    expect(figures.largestLineA).toBeCloseTo(figures.lineA[0]!, 12);
    expect(figures.neutralA).toBeCloseTo(figures.lineA[0]!, 12);
    expect(r.score.before).toBeCloseTo(2 * 3000 / (230 * 0.9), 9);
    // Nominal voltage in the fast model, the solved voltage in the re-solve (no supply impedance here: equal).
    expect(r.solvedScore!.before).toBeCloseTo(r.score.before, 6);
  });
});
