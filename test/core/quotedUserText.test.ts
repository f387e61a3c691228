/**
 * The library's own messages quote user text escaped: a name, header or key holding an escape sequence,
 * a newline or a direction override reads in an InputError as written, JSON-style ("a\u001b[31mred"),
 * and never acts on a terminal or a log, whoever prints it. Paths and names in the data stay exact.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, InputError, normaliseBoard, parseBoard, planColumns } from '@trivar/core';
import { escapeControls, quoteText } from '../../packages/core/src/errors.js';

// C0, DEL, C1, line/paragraph separators and the direction overrides: none may reach a message raw.
const RAW_CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;

/** An invented kiln shed: one line-to-neutral load to name in interval data and options. */
const board = normaliseBoard(
  parseBoard({
    name: 'Kiln shed',
    supply: { system: 'three-phase-4wire', voltage: '400/230', frequencyHz: 50 },
    loads: [{ name: 'Kiln', connection: 'A-N', kW: 3, pf: 0.95 }],
  }),
);

/** No line of the message holds a raw control (the message's own line breaks part the heading from the issues). */
const linesClean = (e: InputError) => e.message.split('\n').every((line) => !RAW_CONTROL.test(line));

function refusal(call: () => unknown): InputError {
  try {
    call();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}

describe('user text in library messages', () => {
  it('quoteText quotes JSON-style: controls escaped, quotes and backslashes too, readable text as it is', () => {
    expect(quoteText('Mixer')).toBe('"Mixer"');
    expect(quoteText('x\ny')).toBe('"x\\ny"');
    expect(quoteText('a\u001b[31mred')).toBe('"a\\u001b[31mred"');
    expect(quoteText('tab\there\r')).toBe('"tab\\there\\r"');
    expect(quoteText('say "hi" \\ bye')).toBe('"say \\"hi\\" \\\\ bye"');
    // C1 control (CSI), DEL, a direction override and a line separator: JSON.stringify leaves these raw.
    expect(quoteText('\u009b2J\u007f k\u202eiln \u2028')).toBe('"\\u009b2J\\u007f k\\u202eiln \\u2028"');
    expect(quoteText('Four à pain 東京 🔥')).toBe('"Four à pain 東京 🔥"');
    expect(escapeControls('no controls')).toBe('no controls');
  });

  it('an interval-data header with an escape sequence is quoted escaped in the refusal', () => {
    const e = refusal(() => planColumns(board, ['time', 'a\u001b[31mred [kW]']));
    expect(linesClean(e)).toBe(true);
    expect(e.issues[0]!.message).toBe(
      'header, column 2 ("a\\u001b[31mred [kW]"): expected a load name on the board, a group from profile.groups, or "phase A/B/C" ("phase L1/L2/L3") (received "a\\u001b[31mred")',
    );
  });

  it('an option key with a newline is escaped in the message, the path kept exact', () => {
    const e = refusal(() => correctBoard(board, { arrangement: 'star-bank', lightLoad: { fraction: 0.3, perLoad: { 'x\ny': 0 } } }));
    expect(linesClean(e)).toBe(true);
    expect(e.issues[0]!.path).toBe('lightLoad.perLoad.x\ny');
    expect(e.issues[0]!.message).toMatch(/^lightLoad\.perLoad\.x\\ny: expected a key that is text without control characters .* \(received "x\\ny"\)$/);
  });

  it('an InputError escapes whatever a message put in raw (the last guard), keeping the issue paths', () => {
    const e = new InputError([{ code: 'unknown_board', path: 'boards[0].fedFrom', expected: 'a board named "Bay\u0007 2"', message: 'boards[0].fedFrom: Bay\u0007 2 is not\na board' }], 'the installation "North\u202e" is not valid');
    expect(e.message).toBe('the installation "North\\u202e" is not valid:\n  - boards[0].fedFrom: Bay\\u0007 2 is not\\na board');
    expect(e.heading).toBe('the installation "North\\u202e" is not valid');
    expect(e.issues[0]).toMatchObject({ path: 'boards[0].fedFrom', expected: 'a board named "Bay\\u0007 2"' });
  });
});
