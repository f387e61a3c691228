/**
 * The shortcut past the installation schema (boardFile/boardFileRules.ts readWellFormedInstallation)
 * against the schema itself (zod, the one judge of an installation file): wherever the shortcut gives
 * an installation, the full validation gives the same one, value for value and key for key; everywhere
 * else it steps aside. Held on the shipped examples, on random valid installations (trees of 2–20
 * boards, every supply shape), and on those with one or two parts broken, moved to an edge or given
 * an unknown key.
 */
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readBoardText, readWellFormedInstallation, validateInstallation } from '@trivar/core';
import { validateInstallationWith } from '../../packages/core/src/board/validateInstallationWith.js';
import { installationSchema } from '../../packages/core/src/boardFile/boardFileSchema.js';
import { INSTALLATION_FILE_RULES } from '../../packages/core/src/boardFile/boardFileRules.js';
import { BOARD_FILE_CHECKS } from '../../packages/core/src/boardFile/validateBoard.js';
import { oneBoardInstallation } from '../../packages/core/src/board/validateInstallationWith.js';
import { installationSpecArb } from './arbitraries/installationSpec.js';
import { applyChange } from './arbitraries/plainDataChanges.js';

/** The schema's answer, without the shortcut (validateInstallation takes the shortcut first). */
const bySchema = (input: unknown) =>
  validateInstallationWith({ schema: installationSchema, rules: INSTALLATION_FILE_RULES, board: BOARD_FILE_CHECKS, boardAsInstallation: oneBoardInstallation as never }, input);

/** The shortcut's installation equals the schema's, key order included; or the shortcut stepped aside. */
function agrees(input: unknown): 'shortcut' | 'schema' {
  const quick = readWellFormedInstallation(structuredClone(input));
  if (quick === undefined) return 'schema';
  const full = bySchema(structuredClone(input));
  expect(full.ok, `the shortcut accepted what the schema refuses: ${JSON.stringify(full.ok ? null : full.issues)}`).toBe(true);
  if (!full.ok) return 'schema';
  expect(quick).toStrictEqual(full.installation);
  expect(JSON.stringify(quick)).toBe(JSON.stringify(full.installation));
  return 'shortcut';
}

const withoutShape = <T extends { shape: unknown }>({ shape: _shape, ...spec }: T) => spec;

/** Values a changed field takes: edges, zero, negatives, words, other kinds. */
const numbers = fc.constantFrom(0, -0, 1, 2.5, 50, 60, 120, 230, 1e-9, -1, 1e308, Number.NaN, Number.POSITIVE_INFINITY, 100.0000001, 1e6);
const words = fc.constantFrom('', 'x', 'board 0', 'board 1', 'board 99', 'A-N', 'B-C', 'L1-N', 'ABC-star', '400/230', '120/240', 'copper', 'aluminum', 'gold', 'en50160-supply', ' ', 'a\u0000b', 'x'.repeat(101), 'supply');
const others = fc.constantFrom<unknown>(true, null, [], {}, { r: 0.1, x: 0.05 }, { A: { r: 0.1, x: 0.1 } }, 5, 'A-N', { underPercent: 5, overPercent: 5 });
const newKeys = fc.constantFrom('A', 'N', 'r', 'kW', 'fedFrom', 'feeder', 'voltageLimits', 'loads', 'correction', 'harmonics', 'profile', 'rebalance', 'spectrum', 'studies', 'extra', '__proto__');

describe('readWellFormedInstallation', () => {
  it('reads every shipped example installation as the schema does, and takes every one without study data', () => {
    let taken = 0;
    let installations = 0;
    for (const file of readdirSync('examples').filter((f) => f.endsWith('.yaml'))) {
      const text = readFileSync(`examples/${file}`, 'utf8');
      const input = readBoardText(text);
      if (!('boards' in (input as object))) continue;
      installations++;
      const way = agrees(input);
      if (!/^(correction|profile|harmonics|rebalance):/m.test(text) && !/\b(spectrum|linearForm):/.test(text)) {
        expect(way, file).toBe('shortcut');
        taken++;
      } else expect(way, file).toBe('schema');
    }
    expect(installations).toBeGreaterThanOrEqual(4);
    expect(taken).toBeGreaterThanOrEqual(2);
  });

  it('takes random valid installations (2–20 boards, every supply shape) and gives the schema’s', () => {
    fc.assert(
      fc.property(installationSpecArb(), (spec) => {
        expect(agrees(withoutShape(spec))).toBe('shortcut');
      }),
      { numRuns: 120 },
    );
  });

  it('never takes an installation the schema refuses, nor gives a different one, with one or two parts changed', () => {
    const change = fc.record({ at: fc.nat(), kind: fc.constantFrom('set' as const, 'set' as const, 'delete' as const), number: numbers, word: words, other: others, typed: fc.boolean(), key: newKeys });
    let taken = 0;
    let refused = 0;
    fc.assert(
      fc.property(installationSpecArb({ maxBoards: 5 }), fc.array(change, { minLength: 1, maxLength: 2 }), (spec, changes) => {
        const input = structuredClone(withoutShape(spec)) as unknown;
        for (const c of changes) applyChange(input, c);
        if (agrees(input) === 'shortcut') taken++;
        else refused++;
      }),
      { numRuns: 2500 },
    );
    // Both answers were compared often: some changes keep the file valid, many break it.
    expect(taken).toBeGreaterThan(50);
    expect(refused).toBeGreaterThan(500);
  });

  it('steps aside for study sections and study load fields, and for files the tree rules refuse', () => {
    const base = {
      supply: { system: 'three-phase-4wire', voltage: '400/230', frequencyHz: 50 },
      boards: [
        { name: 'Main', loads: [] },
        { name: 'Yard', fedFrom: 'Main', feeder: { lengthM: 30, line: { mm2: 10 }, neutral: { mm2: 10 } }, loads: [{ name: 'kiln', connection: 'A-N', kW: 2 }] },
      ],
    };
    expect(agrees(base)).toBe('shortcut');
    expect(readWellFormedInstallation({ ...base, correction: { target: { pf: 0.95 } } })).toBeUndefined();
    const spectrum = { ...base, boards: [base.boards[0], { ...base.boards[1], loads: [{ name: 'kiln', connection: 'A-N', kW: 2, spectrum: 'switch-mode' }] }] };
    expect(readWellFormedInstallation(spectrum)).toBeUndefined();
    // A feeder to an unknown board, a loop, two main boards: the rules refuse, so does the shortcut; the full check names them.
    for (const boards of [
      [base.boards[0], { ...base.boards[1], fedFrom: 'Barn' }],
      [{ ...base.boards[0], fedFrom: 'Yard' }, base.boards[1]],
      [base.boards[0], { ...base.boards[1], fedFrom: undefined }].map((b) => JSON.parse(JSON.stringify(b))),
    ]) {
      const input = { ...base, boards };
      expect(readWellFormedInstallation(input)).toBeUndefined();
      const full = validateInstallation(input);
      expect(full.ok).toBe(false);
      expect(full.ok ? null : full.issues[0]!.path).toMatch(/^boards/);
    }
    // L1/L2/L3 spelling is read as the schema's path reads it.
    const l123 = { ...base, boards: [base.boards[0], { ...base.boards[1], loads: [{ name: 'kiln', connection: 'L2-N', kW: 2 }] }] };
    expect(agrees(l123)).toBe('shortcut');
    expect(readWellFormedInstallation(l123)!.boards[1]!.loads[0]!.connection).toBe('B-N');
  });
});
