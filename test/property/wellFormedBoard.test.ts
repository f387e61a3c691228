/**
 * The shortcut past the board schema (boardFile/boardFileRules.ts readWellFormedBoard) against
 * the schema itself (zod, the one judge of a board file): wherever the shortcut gives a board,
 * the full validation gives the same board, value for value and key for key; everywhere else it
 * steps aside. Held on the shipped examples, on random valid boards, and on those boards with
 * one part broken, moved to a range's edge or given an unknown key.
 */
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { boardSchema, PHYSICAL_RANGES, readBoardText, validateBoard } from '@trivar/core';
import { wellFormedBoardShape } from '../../packages/core/src/board/wellFormedBoard.js';
import { readWellFormedBoard } from '../../packages/core/src/boardFile/boardFileRules.js';
import { BOARD_FILE_CHECKS } from '../../packages/core/src/boardFile/validateBoard.js';
import { validateBoardWith } from '../../packages/core/src/board/validateBoardWith.js';
import { boardSpecArb } from './arbitraries/boardSpec.js';
import { applyChange, places } from './arbitraries/plainDataChanges.js';

/** The schema's answer, without the shortcut. */
const bySchema = (input: unknown) => validateBoardWith(BOARD_FILE_CHECKS, input);

/** The shortcut's board equals the schema's, key order included; or the shortcut stepped aside. */
function agrees(input: unknown): 'shortcut' | 'schema' {
  const quick = readWellFormedBoard(structuredClone(input));
  if (quick === undefined) return 'schema';
  const full = bySchema(structuredClone(input));
  expect(full.ok, `the shortcut accepted what the schema refuses: ${JSON.stringify(full.ok ? null : full.issues)}`).toBe(true);
  if (!full.ok) return 'schema';
  expect(quick).toStrictEqual(full.board);
  expect(JSON.stringify(quick)).toBe(JSON.stringify(full.board));
  return 'shortcut';
}

const STUDY_KEYS = /^(correction|profile|harmonics|rebalance):/m;
const STUDY_LOAD_FIELDS = /\b(spectrum|linearForm):/;

/** Values a changed field takes: every range's edges and just past them, other words, other kinds. */
const edges = Object.values(PHYSICAL_RANGES).flatMap((r) => [r.min, r.max, r.min - 1e-9 * Math.max(1, Math.abs(r.min)), r.max * (1 + 1e-12) + 1e-300]);
const numberValues = [...edges, 0, -0, 1, 2, 3, 12, 13, 50, 60, 1.5, -1, -360, 361, Number.NaN, Number.POSITIVE_INFINITY, 1e308];
const numbers = fc.constantFrom(...numberValues);
const wordValues = [
  ...['', 'x', 'A-N', 'B-C', 'N-A', 'L1-N', 'ABC-star', 'ABC-delta', '400/230', '208Y/120', '120/240', '230', 'nonsense/notation', 'x'.repeat(41), '4/0', 'x'.repeat(13)],
  ...['copper', 'aluminum', 'gold', 'leading', 'lagging', 'floating', 'neutral', 'constant-current', 'constant-torque', 'three-phase-3wire', 'single-phase'],
  ...['ABC', 'ACB', 'CBA', 'switch-mode', 'en50160-supply', 'north-america', 'iec', 'A/B/C', 'L1/L2/L3'],
  // Text a tighter rule on names or notes would refuse: the shortcut must then refuse it too.
  ...[' ', '   ', ' a ', 'x'.repeat(101), 'x'.repeat(1001), 'a\u0000b', 'a\nb', '\u202e', 'é'.repeat(60)],
  // Circuits' 24 characters at and past the end; a tab, an isolate, a C1 control, a separator.
  ...['x'.repeat(24), 'x'.repeat(25), 'a\tb', '\u2066a\u2069', 'a\u0085', 'a\u2028b', 'שלום 東京'],
];
const words = fc.constantFrom(...wordValues);
const otherValues: unknown[] = [true, false, null, [], {}, { r: 0.1, x: 0.05 }, { kVA: 100, impedancePercent: 4, xOverR: 3 }, { A: { r: 0.1, x: 0.1 } }, { lineToNeutral: 230 }, 5, 'A-N'];
const others = fc.constantFrom(...otherValues);

describe('readWellFormedBoard', () => {
  it('reads every shipped example board as the schema does, and takes every one without study data', () => {
    const files = readdirSync('examples').filter((f) => f.endsWith('.yaml'));
    let taken = 0;
    for (const file of files) {
      const text = readFileSync(`examples/${file}`, 'utf8');
      const input = readBoardText(text);
      if ('boards' in (input as object)) continue;
      const way = agrees(input);
      if (!STUDY_KEYS.test(text) && !STUDY_LOAD_FIELDS.test(text)) {
        expect(way, file).toBe('shortcut');
        taken++;
      }
    }
    expect(taken).toBeGreaterThanOrEqual(4);
  });

  it('takes random valid boards, and gives the schema’s board', () => {
    fc.assert(
      fc.property(boardSpecArb({ maxLoads: 8 }), (spec) => {
        expect(agrees(spec)).toBe('shortcut');
      }),
      { numRuns: 150 },
    );
  });

  it('never takes a board the schema refuses, nor gives a different one, with any one part changed', () => {
    const newKeys = fc.constantFrom('A', 'B', 'C', 'L1', 'r', 'x', 'kW', 'kvar', 'pf', 'ohms', 'zip', 'model', 'spectrum', 'linearForm', 'correction', 'harmonics', 'emf', 'feeder', 'conventions', 'studies', 'written', 'extra', '__proto__');
    const change = fc.record({ at: fc.nat(), kind: fc.constantFrom('set' as const, 'set' as const, 'delete' as const), number: numbers, word: words, other: others, typed: fc.boolean(), key: newKeys });
    let taken = 0;
    fc.assert(
      fc.property(boardSpecArb({ maxLoads: 4 }), fc.array(change, { minLength: 1, maxLength: 2 }), (spec, changes) => {
        const board = structuredClone(spec) as unknown;
        for (const c of changes) applyChange(board, c);
        if (agrees(board) === 'shortcut') taken++;
      }),
      { numRuns: 3000 },
    );
    // The changes keep some boards valid (a range's inner edge, a valid word), so both answers were compared.
    expect(taken).toBeGreaterThan(50);
  });

  it('a circuit number written bare is read as its text by both, and one that is no whole number from 1 to 9999 by neither', () => {
    const board = (circuit: unknown) => ({ supply: { voltage: '208Y/120', frequencyHz: 60 }, loads: [{ name: 'Fryer', circuit, connection: 'A-N', kW: 2 }] });
    for (const [circuit, text] of [[7, '7'], [1, '1'], [9999, '9999'], ['1,3', '1,3']] as const) {
      expect(agrees(board(circuit))).toBe('shortcut');
      const full = bySchema(board(circuit));
      expect(full.ok && full.board.loads[0]!.circuit).toBe(text);
    }
    for (const circuit of [0, -3, 2.5, 10000, Number.NaN, true]) {
      expect(readWellFormedBoard(board(circuit))).toBeUndefined();
      const full = bySchema(board(circuit));
      // Both forms named: "a string or a whole number", "… or a number >= 1", "… or a number <= 9999" (NaN: "… or a number").
      expect(full.ok ? null : full.issues.map((i) => [i.path, i.message])).toEqual([['loads[0].circuit', expect.stringMatching(/^loads\[0\]\.circuit: expected a string or a (whole number|number|number [<>]= (1|9999)) \(received /)]]);
    }
  });

  it('agrees with the schema field by field: every field of two full boards set to every test value, deleted, or given a new key', () => {
    const conductor = { r: 0.1, x: 0.05, lengthM: 20, lengthFt: 65, rOhmPerKm: 0.5, xOhmPerKm: 0.08, mm2: 16, awg: '4/0', kcmil: 250, material: 'copper', temperatureC: 70, parallel: 2, ratingA: 63 };
    const load = { name: 'press', circuit: '7', breakerA: 32, poles: 3, connection: 'ABC-star', starPoint: 'floating', kW: 5, kvar: 1, kVA: 6, A: 9, pf: 0.9, sense: 'leading', ohms: { r: 10, x: 2 }, model: 'constant-current', zip: { z: 0.2, i: 0.3, p: 0.5 } };
    const winding = { kVA: 50, impedancePercent: 3, xOverR: 2 };
    const full = {
      $schema: './board.schema.json',
      name: 'works',
      note: 'all fields',
      supply: {
        system: 'three-phase-4wire',
        voltage: { lineToLine: 400, lineToNeutral: 230, written: '400/230' },
        frequencyHz: 50,
        sequence: 'ACB',
        emf: { A: { V: 230, angleDeg: 0 }, B: { V: 231, angleDeg: 120 }, C: { V: 229, angleDeg: -120 } },
        impedance: { r: 0.01, x: 0.02 },
        transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 },
        zeroSequence: { r: 0.02, x: 0.03 },
        bank: { A: winding, B: { r: 0.1, x: 0.2 }, C: winding },
        openDelta: { 'A-B': winding, 'B-C': { r: 0.1, x: 0.2 }, 'C-A': winding },
      },
      conventions: { region: 'iec', phaseNames: 'L1/L2/L3', voltageLimits: { underPercent: 6, overPercent: 10 } },
      feeder: { line: conductor, neutral: conductor, lengthM: 30, lengthFt: 100 },
      loads: [load, { name: 'lamp', connection: 'A-N', kW: 0.1, pf: 1 }],
      studies: { openNeutral: true },
    };
    const other = {
      ...full,
      supply: { system: 'split-phase', voltage: '120/240', frequencyHz: 60, impedance: { A: { r: 0.1, x: 0.1 }, B: { r: 0.1, x: 0.1 } } },
      conventions: { voltageLimits: 'en50160-supply' },
      feeder: { line: { A: conductor, C: conductor } },
    };
    const values = [...numberValues, ...wordValues, ...otherValues];
    let compared = 0;
    const check = (input: unknown) => {
      const quick = wellFormedBoardShape(input);
      if (quick === undefined) return;
      const parsed = boardSchema.safeParse(input);
      expect(parsed.success, JSON.stringify(input)).toBe(true);
      expect(quick).toStrictEqual(parsed.data);
      expect(JSON.stringify(quick)).toBe(JSON.stringify(parsed.data));
      compared++;
    };
    for (const base of [full, other]) {
      check(base);
      const work = structuredClone(base);
      const all = places(work);
      for (let at = 0; at < all.length; at++) {
        const [target, key] = all[at]!;
        if (key !== null) {
          // Set in place and put back: neither check changes its input.
          const was = target[key];
          for (const value of values) {
            target[key] = value;
            check(work);
          }
          target[key] = was;
        }
        const copy = structuredClone(base);
        const [t, k] = places(copy)[at]!;
        if (k === null) Object.defineProperty(t, 'extra', { value: 1, enumerable: true, writable: true, configurable: true });
        else if (Array.isArray(t)) t.splice(Number(k), 1);
        else delete t[k];
        check(copy);
      }
    }
    expect(compared).toBeGreaterThan(300);
  });

  it('steps aside for study sections and study load fields, which the schema judges', () => {
    const base = { supply: { system: 'single-phase', voltage: { lineToNeutral: 230 }, frequencyHz: 50 }, loads: [{ name: 'oven', connection: 'A-N', kW: 2, pf: 1 }] };
    expect(readWellFormedBoard(base)).toBeDefined();
    expect(readWellFormedBoard({ ...base, correction: { target: { pf: 0.95 } } })).toBeUndefined();
    expect(readWellFormedBoard({ ...base, loads: [{ ...base.loads[0], spectrum: 'switch-mode' }] })).toBeUndefined();
    // …and for a file the rules refuse (a line-to-neutral load on a board with no neutral).
    const noNeutral = { ...base, supply: { system: 'three-phase-3wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } };
    expect(readWellFormedBoard(noNeutral)).toBeUndefined();
    expect(validateBoard(noNeutral).ok).toBe(false);
  });
});
