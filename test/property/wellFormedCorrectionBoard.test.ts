/**
 * `trivar correct`'s shortcut past the board-file schema (boardFile/wellFormedCorrectionBoard.ts)
 * against validateBoard with the schema (zod, the one judge of a board file): wherever the shortcut
 * gives a board, the full validation gives the same board, value for value and key for key; everywhere
 * else it steps aside. Held on the shipped examples and on random boards with random correction
 * sections, valid and not: values out of range, unknown keys, L1/L2/L3 per-line targets, other studies.
 */
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, readWellFormedCorrectionBoard } from '@trivar/core';
import { BOARD_FILE_CHECKS } from '../../packages/core/src/boardFile/validateBoard.js';
import { validateBoardWith } from '../../packages/core/src/board/validateBoardWith.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';

/** The shortcut's board equals the schema's, key order included; or the shortcut stepped aside. */
function agrees(input: unknown): 'shortcut' | 'schema' {
  const quick = readWellFormedCorrectionBoard(structuredClone(input));
  if (quick === undefined) return 'schema';
  const full = validateBoardWith(BOARD_FILE_CHECKS, structuredClone(input));
  expect(full.ok, `the shortcut accepted what the schema refuses: ${JSON.stringify(full.ok ? null : full.issues)}`).toBe(true);
  if (!full.ok) return 'schema';
  expect(quick).toStrictEqual(full.board);
  expect(JSON.stringify(quick)).toBe(JSON.stringify(full.board));
  return 'shortcut';
}

const reserved = JSON.parse('{"__proto__": {"pf": 0.9}}') as Record<string, unknown>;
/** Correction sections of values from `v`: each field present or not. */
function sectionArb(v: { pf: fc.Arbitrary<unknown>; word: <T extends string>(...ok: T[]) => fc.Arbitrary<unknown>; fraction: fc.Arbitrary<unknown>; perPhase: fc.Arbitrary<unknown>; outputs: fc.Arbitrary<unknown>; percent: fc.Arbitrary<unknown>; extra: fc.Arbitrary<Record<string, unknown>> }) {
  return fc
    .tuple(
      fc.record(
        {
          arrangement: v.word('star-bank', 'delta-bank', 'balancing-compensator'),
          target: fc.record(
            {
              pf: v.pf,
              definition: v.word('per-line', 'effective', 'vector', 'arithmetic', 'positive-sequence'),
              leading: v.word('never', 'allowed'),
              maxLaggingPf: v.pf,
              perPhase: v.perPhase,
            },
            { requiredKeys: [] },
          ),
          starPoint: v.word('neutral', 'floating'),
          practice: v.word('iec', 'north-american'),
          controller: fc.record({ outputs: v.outputs, ctPrimaryA: fc.constantFrom(400, 150) }, { requiredKeys: [] }),
          lightLoad: fc.record({ fraction: v.fraction, perLoad: fc.constantFrom({}, { 'Load 1': 0 }) }, { requiredKeys: ['fraction'] }),
          capacitanceTolerance: fc.record({ minusPercent: v.percent, plusPercent: v.percent }, { requiredKeys: [] }),
          voltageMarginPercent: v.percent,
        },
        { requiredKeys: [] },
      ),
      v.extra,
    )
    .map(([section, extra]) => ({ ...section, ...extra }));
}
const validSection = sectionArb({
  pf: fc.constantFrom(0.95, 0.9, 1, 0.5),
  word: (...ok) => fc.constantFrom(...ok),
  fraction: fc.constantFrom(0, 0.25, 1),
  perPhase: fc.oneof(fc.record({ A: fc.constantFrom(0.95, 0.9), C: fc.constantFrom(0.92, 1) }, { requiredKeys: [] }), fc.record({ L1: fc.constant(0.95), L3: fc.constant(0.9) }, { requiredKeys: [] })),
  outputs: fc.constantFrom(6, 8, 12),
  percent: fc.constantFrom(0, 5, 10, 50),
  extra: fc.constant({}),
});
/** The same with every kind of wrong value, key and phase spelling mixed in. */
const anySection = sectionArb({
  pf: fc.constantFrom(0.95, 0.9, 1, 0, -0.9, 1.01, 'high', null),
  word: (...ok) => fc.constantFrom<unknown>(...ok, 'other', '', 3),
  fraction: fc.constantFrom(0, 0.25, 1, 1.5, -0.1, '0.2'),
  perPhase: fc.constantFrom({ A: 0.95 }, { L2: 0.9 }, { A: 0.95, L2: 0.9 }, { N: 1 }, reserved, [], 'A'),
  outputs: fc.constantFrom(6, 7, '8'),
  percent: fc.constantFrom(5, 60, -1),
  extra: fc.constantFrom<Record<string, unknown>>({}, { board: 'Main' }, { extra: 1 }, { target: null }, reserved),
});
/** Anything else beside the board: nothing mostly, or another study's section, or an unknown key. */
const besideArb = fc.constantFrom<Record<string, unknown>>({}, {}, {}, {}, {}, { studies: { openNeutral: true } }, { harmonics: {} }, { profile: {} }, { rebalance: {} }, { unknown: 1 });

describe('readWellFormedCorrectionBoard', () => {
  it('reads every shipped example board as the schema does, and takes those with only a correction section', () => {
    let taken = 0;
    for (const file of readdirSync('examples').filter((f) => f.endsWith('.yaml'))) {
      const text = readFileSync(`examples/${file}`, 'utf8');
      const input = readBoardText(text) as Record<string, unknown>;
      const way = agrees(input);
      const onlyCorrection = 'correction' in input && !/^(profile|harmonics|rebalance|boards):/m.test(text) && !/\b(spectrum|linearForm):/.test(text);
      if (onlyCorrection) {
        expect(way, file).toBe('shortcut');
        taken++;
      } else expect(way, file).toBe('schema');
    }
    // riverside-cold-store and cedar-falls-print-shop
    expect(taken).toBeGreaterThanOrEqual(2);
  });

  it('gives the schema’s board or steps aside, on random boards with random correction sections', () => {
    let taken = 0;
    let aside = 0;
    fc.assert(
      fc.property(boardSpecArb({ maxLoads: 4 }), fc.oneof(validSection, anySection), besideArb, (board, correction, beside) => {
        if (agrees({ ...board, ...beside, correction }) === 'shortcut') taken++;
        else aside++;
      }),
      { numRuns: 1500 },
    );
    // Both answers were compared often.
    expect(taken).toBeGreaterThan(50);
    expect(aside).toBeGreaterThan(50);
  });

  it('steps aside for a board without a correction section (readWellFormedBoard reads those) and for anything not a board', () => {
    const base = { supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 }, loads: [{ name: 'oven', connection: 'A-N', kW: 2, pf: 1 }] };
    expect(readWellFormedCorrectionBoard(base)).toBeUndefined();
    expect(agrees({ ...base, correction: { target: { pf: 0.95 } } })).toBe('shortcut');
    for (const input of [null, 3, 'correction', [base], { correction: {} }]) expect(readWellFormedCorrectionBoard(input)).toBeUndefined();
  });
});
