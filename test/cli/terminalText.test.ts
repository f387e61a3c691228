/** User text reaches the terminal with its control characters escaped; JSON keeps it exact. */
import { describe, expect, it } from 'vitest';
import { escapeControlCharacters, forTerminal } from '../../packages/cli/src/format/terminalText.js';
import { runTrivar } from './runTrivar.js';

const hostileName = 'Oven\u001b[2J\u001b]0;owned\u0007\nWarnings\n  none\u0000\u009b31m\u202e';
const board = JSON.stringify({
  name: `Board\u001b[H`,
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  loads: [{ name: hostileName, connection: 'A-N', kW: 2, pf: 1 }],
});

const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u202a-\u202e]/;

describe('control characters in names', () => {
  // Names may not hold them (boardRanges.ts NAME_WITHOUT_CONTROLS): the file is refused, and the
  // message quoting the names cannot act on the terminal or forge a line either.
  it('are refused in names at their field paths, the message escaped', () => {
    const r = runTrivar(['solve', '-'], board);
    expect(r.code).toBe(3);
    expect(r.stdout).toBe('');
    expect(r.stderr).not.toMatch(CONTROL);
    expect(r.stderr).toMatch(/^ {2}- name: expected text without control characters/m);
    expect(r.stderr).toMatch(/^ {2}- loads\[0\]\.name: expected text without control characters .* \(received "Oven\\u001b\[2J\\u001b\]0;owned/m);
    expect(r.stderr.match(/^Warnings$/gm)).toBeNull();
  });
  it('other scripts and marks stay exact in JSON: accents, CJK, right-to-left letters, emoji', () => {
    const readable = 'Four à pain 東京 שלום 🔥';
    const r = runTrivar(['solve', '-', '--json'], JSON.stringify({ ...JSON.parse(board), name: 'Bakery', loads: [{ name: readable, connection: 'A-N', kW: 2, pf: 1 }] }));
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).loads[0].name).toBe(readable);
  });
  it('are escaped in error messages on stderr', () => {
    const bad = JSON.stringify({ supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 }, loads: [], ['\u001b[2Jx']: 1 });
    const r = runTrivar(['solve', '-'], bad);
    expect(r.code).toBe(3);
    expect(r.stderr).not.toMatch(CONTROL);
    // The library's message escapes the key itself (JSON-style), in the path and the value received.
    expect(r.stderr).toContain('  - \\u001b[2Jx: expected one of the keys taken here');
    expect(r.stderr).toContain('(received "\\u001b[2Jx")');
  });
  it('forTerminal hands clean data back as it is and copies it with every kind of control character escaped', () => {
    const clean = { name: 'C:\\new "quoted" Café', loads: [{ name: 'a\\tb', kW: 1 }], lone: '\ud800' };
    expect(forTerminal(clean)).toBe(clean);
    for (const c of ['\n', '\t', '\u0000', '\u001b', '\u007f', '\u0085', '\u2028', '\u202e', '\u2066']) {
      const data = { loads: [{ name: `x${c}y`, kW: 1 }] };
      const out = forTerminal(data);
      expect(out).not.toBe(data);
      expect(out.loads[0]!.name).toBe(escapeControlCharacters(`x${c}y`));
      expect(out.loads[0]!.name).not.toMatch(CONTROL);
    }
  });
  it('forTerminal finds control characters in keys and deep in nested arrays, and only own properties count', () => {
    const inKey = { rows: [[{ ['k\u001b']: 1 }]] };
    expect(Object.keys((forTerminal(inKey).rows[0]![0] as object))).toEqual(['k\\e']);
    const deep = { rows: [[1, null, ['ok', 'bad\u0007']]] };
    expect(forTerminal(deep)).not.toBe(deep);
    const inherited = Object.create({ name: 'x\u001by' }) as object;
    expect(forTerminal({ item: inherited }).item).toBe(inherited);
  });
  it('escapeControlCharacters leaves ordinary text, accents and units alone', () => {
    expect(escapeControlCharacters('Café ∠V° µF Ω — ok')).toBe('Café ∠V° µF Ω — ok');
  });
});

describe('table columns on a terminal', () => {
  it('count East Asian wide characters twice and combining marks not at all, so columns line up', async () => {
    const { renderTable, textWidth } = await import('../../packages/cli/src/format/textTable.js');
    expect(textWidth('電気')).toBe(4);
    expect(textWidth('e\u0301')).toBe(1); // e + combining acute
    expect(textWidth('∠ · Ü ☃')).toBe(7);
    const table = renderTable([{ header: 'circuit', align: 'left' }, { header: 'A' }], [['電気 oven', '4.3'], ['lamp', '0.1']]);
    const [head, rule, wide, narrow] = table.split('\n');
    // Every line puts the number column at the same terminal column.
    expect(textWidth(wide!)).toBe(textWidth(narrow!));
    expect(textWidth(rule!)).toBe(textWidth(wide!));
    expect(textWidth(head!)).toBeLessThanOrEqual(textWidth(wide!));
  });
});
