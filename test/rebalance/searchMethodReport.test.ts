/**
 * What the report says of the search that ran: the method asked for, the one that gave the
 * answer, and the node budget when branch-and-bound stopped at it, with the note the text shows.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { normaliseBoard, parseBoardText, rebalanceBoard } from '@trivar/core';

const quay = normaliseBoard(parseBoardText(readFileSync(new URL('../../examples/quay-street-flats.yaml', import.meta.url), 'utf8')));

describe('rebalance: the search in the report', () => {
  it('an exact search stopped at its budget says so: method exact, budgetReached, the note', () => {
    // 29 movable circuits: 1 000 nodes is far from enough to prove anything.
    const r = rebalanceBoard(quay, {}, { method: 'exact', nodeBudget: 1000 });
    expect(r.methodAsked).toBe('exact');
    expect(r.method).toBe('exact');
    expect(r.proven).toBe(false);
    expect(r.search.nodeBudget).toBe(1000);
    expect(r.search.budgetReached).toBe(true);
    expect(r.notes).toContain('The exact search stopped at its budget of 1,000 nodes; the answer is the best found and its gap comes from the lower bound.');
  });

  it('the same without the move table (the answer is the whole limit’s own search)', () => {
    const r = rebalanceBoard(quay, {}, { method: 'exact', nodeBudget: 1000, moveTable: false });
    expect([r.method, r.search.budgetReached]).toEqual(['exact', true]);
    expect(r.notes.some((n) => n.startsWith('The exact search stopped at its budget of 1,000 nodes'))).toBe(true);
  });

  it('a local search reports no budget', () => {
    const r = rebalanceBoard(quay, {}, { method: 'local-search', moveTable: false });
    expect([r.methodAsked, r.method, r.search.nodeBudget, r.search.budgetReached, r.search.nodes]).toEqual(['local-search', 'local-search', null, false, 0]);
    expect(r.notes.some((n) => n.includes('budget'))).toBe(false);
  });

  it('auto on a small board runs branch-and-bound to the end: exact, proven, no budget reached', () => {
    const small = normaliseBoard(
      parseBoardText(`supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }
loads:
  - { name: Kiln, connection: A-N, kW: 6, pf: 1 }
  - { name: Oven, connection: A-N, kW: 3, pf: 1 }
  - { name: Lights, connection: A-N, kW: 1, pf: 0.95 }
  - { name: Pump, connection: B-N, kW: 2, pf: 0.85 }
`),
    );
    const r = rebalanceBoard(small, {}, { moveTable: false });
    expect([r.methodAsked, r.method, r.proven, r.search.nodeBudget, r.search.budgetReached]).toEqual(['auto', 'exact', true, 2_000_000, false]);
  });
});
