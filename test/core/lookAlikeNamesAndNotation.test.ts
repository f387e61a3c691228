/**
 * Input that used to pass without a word, or blamed a field the file never wrote:
 * - two loads whose names differ only in the kind of space (a no-break space) or an invisible character
 *   print alike everywhere, so they are refused as duplicates, naming the hidden character;
 * - a voltage notation that cannot be read gives its one issue, not a second at supply.system, which
 *   the file left to the notation.
 * Invented: a ferry café's board.
 */
import { describe, expect, it } from 'vitest';
import { validateBoard, validateInstallation } from '@trivar/core';

const cafe = (names: string[], supply: Record<string, unknown> = { voltage: { lineToLine: 400 }, system: 'three-phase-4wire', frequencyHz: 50 }) => ({
  name: 'Ferry café',
  supply,
  loads: names.map((name, k) => ({ name, connection: 'A-N', kW: 1 + k })),
});

const issuesOf = (input: unknown) => {
  const r = validateBoard(input);
  return r.ok ? [] : r.issues;
};

describe('load names alike but for hidden characters', () => {
  it.each([
    ['a no-break space', 'Espresso\u00A0machine', 'U+00A0'],
    ['a zero-width space', 'Espresso machine\u200B', 'U+200B'],
    ['a thin space', 'Espresso\u2009machine', 'U+2009'],
    ['two spaces', 'Espresso  machine', null],
  ])('%s: refused at loads[1].name, naming the first load and the character', (_what, second, code) => {
    const issues = issuesOf(cafe(['Espresso machine', second]));
    expect(issues.map((i) => [i.code, i.path])).toEqual([['duplicate', 'loads[1].name']]);
    expect(issues[0]!.message).toContain(`loads[0] is "Espresso machine"${code ? `; this one holds ${code}` : ''})`);
  });

  it('names that differ in letters or letter case stay distinct (a table shows the difference)', () => {
    expect(issuesOf(cafe(['Espresso machine', 'espresso machine', 'Espresso machines']))).toEqual([]);
  });
});

describe('an unreadable voltage notation', () => {
  it('"480Y277" with no system: one issue, at supply.voltage', () => {
    const issues = issuesOf(cafe(['Grill'], { voltage: '480Y277', frequencyHz: 60 }));
    expect(issues.map((i) => i.path)).toEqual(['supply.voltage']);
    expect(issues[0]!.message).toContain('(received "480Y277")');
  });

  it('a system left out with a voltage given as numbers is still asked for', () => {
    expect(issuesOf(cafe(['Grill'], { voltage: { lineToLine: 480 }, frequencyHz: 60 })).map((i) => i.path)).toContain('supply.system');
  });

  it('an installation file: the same one issue', () => {
    const r = validateInstallation({ name: 'Ferry terminal', supply: { voltage: '480Y277', frequencyHz: 60 }, boards: [{ name: 'Café', loads: [{ name: 'Grill', connection: 'A-B', kW: 2 }] }] });
    expect(r.ok ? [] : r.issues.map((i) => i.path)).toEqual(['supply.voltage']);
  });
});
