/**
 * Names a person reads: the board's, the installation's, each installation board's and each load's
 * are held to one rule (visible text, at most NAME_MAX_CHARACTERS, no control characters or direction
 * overrides), and a circuit number to CIRCUIT_MAX_CHARACTERS under the same rule; refused at the
 * field path with what is accepted. Before, a board name of spaces or 100,000 characters, any circuit
 * length, and NUL or U+202E in names were accepted.
 */
import { describe, expect, it } from 'vitest';
import { CIRCUIT_MAX_CHARACTERS, NAME_MAX_CHARACTERS, validateBoard, validateInstallation } from '@trivar/core';

const supply = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 } as const;
// An invented café: one espresso machine.
const cafe = (board: object = {}, load: object = {}) => ({ supply, ...board, loads: [{ name: 'espresso machine', connection: 'A-N', kW: 3, ...load }] });
const issues = (v: ReturnType<typeof validateBoard> | ReturnType<typeof validateInstallation>) => (v.ok ? [] : v.issues.map((i) => `${i.path}: ${i.expected}`));

describe('names', () => {
  it('states the limits: 100 characters for a name, 24 for a circuit', () => {
    expect([NAME_MAX_CHARACTERS, CIRCUIT_MAX_CHARACTERS]).toEqual([100, 24]);
  });

  it('refuses a board name of spaces only or past 100 characters, as a load name', () => {
    expect(issues(validateBoard(cafe({ name: '   ' })))).toEqual(['name: a name with at least one visible character']);
    expect(issues(validateBoard(cafe({ name: 'x'.repeat(100_000) })))[0]).toMatch(/^name: .*at most 100 characters/);
    expect(issues(validateBoard(cafe({}, { name: 'x'.repeat(101) })))[0]).toMatch(/^loads\[0\]\.name: .*at most 100 characters/);
    expect(validateBoard(cafe({ name: 'x'.repeat(100) })).ok).toBe(true);
  });

  it('refuses NUL, tab, escape, C1 controls and direction overrides or isolates in names and circuits', () => {
    for (const bad of ['Café\u0000', 'a\tb', 'x\u001b[2J', 'a\u0085b', 'reversed\u202etxt', '\u2066isolated\u2069', 'a\u2028b']) {
      expect(issues(validateBoard(cafe({ name: bad })))).toEqual([expect.stringMatching(/^name: text without control characters/)]);
      expect(issues(validateBoard(cafe({}, { name: bad })))).toEqual([expect.stringMatching(/^loads\[0\]\.name: text without control characters/)]);
      expect(issues(validateBoard(cafe({}, { circuit: bad })))).toEqual([expect.stringMatching(/^loads\[0\]\.circuit: text without control characters/)]);
    }
  });

  it('keeps other scripts, accents and emoji, and right-to-left letters without overrides', () => {
    for (const good of ['Café à Noël', '東京 店', 'שלום', 'مطبخ', 'Boiler 🔥', 'L1-12'])
      expect(validateBoard(cafe({ name: good }, { name: good, circuit: good })).ok).toBe(true);
  });

  it('holds a circuit to 24 characters of visible text', () => {
    expect(validateBoard(cafe({}, { circuit: 'x'.repeat(24) })).ok).toBe(true);
    expect(issues(validateBoard(cafe({}, { circuit: 'x'.repeat(25) })))).toEqual(['loads[0].circuit: a text of at most 24 characters']);
    expect(issues(validateBoard(cafe({}, { circuit: '  ' })))).toEqual(['loads[0].circuit: a name with at least one visible character']);
  });

  it('holds the installation and its boards to the same rule, at their paths', () => {
    const v = validateInstallation({
      name: ' ',
      supply,
      boards: [
        { name: 'Main\u202e', loads: [{ name: 'lights', connection: 'A-N', kW: 1 }] },
        { name: 'y'.repeat(101), fedFrom: 'Main', feeder: { lengthM: 10, line: { mm2: 10 }, neutral: { mm2: 10 } }, loads: [{ name: 'oven', connection: 'B-N', kW: 2 }] },
      ],
    });
    const paths = issues(v).map((i) => i.split(':')[0]);
    expect(paths).toEqual(expect.arrayContaining(['name', 'boards[0].name', 'boards[1].name']));
  });
});
