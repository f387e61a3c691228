/**
 * The plain-YAML fast path (board/plainYamlText.ts) against yaml itself (the general reader,
 * readYamlText): wherever the fast path gives data, yaml gives the same data, value for value
 * and key for key, and no error; everywhere else it steps aside. Held on the shipped examples,
 * on generated board-like documents in block and flow style with tricky scalars, comments and
 * odd spacing, and on those documents with characters inserted, deleted or replaced.
 */
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import { readPlainYamlText, resolvePlain } from '../../packages/core/src/board/plainYamlText.js';
import { readYamlText } from '../../packages/core/src/board/readBoardText.js';

/** 'fast' when the fast path read it (and yaml agrees), 'aside' when it stepped aside. */
function agrees(text: string): 'fast' | 'aside' {
  const fast = readPlainYamlText(text);
  if (fast === undefined) return 'aside';
  let general: unknown;
  expect(() => (general = readYamlText(text)), `yaml refuses what the fast path read: ${JSON.stringify(text)}`).not.toThrow();
  expect(isDeepStrictEqual(fast, general), `${JSON.stringify(text)}: fast ${JSON.stringify(fast)}, yaml ${JSON.stringify(general)}`).toBe(true);
  expect(JSON.stringify(fast)).toBe(JSON.stringify(general)); // key order too
  return 'fast';
}

// Plain scalars yaml resolves to every type, and text that looks like them (YAML 1.2 core schema).
const SCALARS = [
  ...['0', '-0', '+0', '1', '-1', '007', '0o17', '0o8', '0x1F', '0X1F', '0xg', '1.5', '-1.5', '.5', '5.', '1e3', '1E-3', '1.e3', '.e3', '+.5', '-.5'],
  ...['.inf', '-.inf', '+.inf', '.Inf', '.INF', '.nan', '.NaN', '.NAN', 'nan', 'inf', 'null', 'Null', 'NULL', 'nULL', '~', 'true', 'True', 'TRUE', 'tRUE'],
  ...['false', 'False', 'yes', 'no', 'on', 'off', 'y', 'A-N', 'ABC-star', 'three-phase-4wire', 'Deck oven 1', 'Corner bakery — main board', '400/230'],
  ...['208Y/120', 'x', 'a b', 'a  b', 'R&D', "O'Brien", 'say "hi"', 'a,b', 'a, b', '12:30', 'a:b', 'a#b', 'a #b', '-x', '-5 apples', '$schema', '(1)'],
  ...['°C', 'mm²', '0.060000000000000005', '1_000', '0b11', '12345678901234567890', '9007199254740993', '1e400', '-1e400', '<<', '@x', '`x`', '%x'],
  ...['!x', '&x', '*x', '|', '>', '?', '-', ':', '', "'q'", '"dq"', '"a\\"b"', '"a\\\\b"', '"a\\nb"', "'it''s'", '"é"', '"x" y', "''", '""'],
  ...['[1, 2]', '{a: 1}', '[]', '{}', '[a, [b, c]]', '{ a: { b: 1 } }', '[ x , y ]', '{a: 1,}', '{ a }', '{a: }', '[a: 1]', '{"a":1}', '{ "a": 1 }', "{ 'k': v }"],
];
const KEYS = ['name', 'kW', 'pf', 'connection', 'supply', 'loads', 'A', 'A-B', 'flats A', '"quoted key"', "'single'", '1', 'true', 'null', '~', '$schema', '__proto__', 'a b', 'x', 'name'];

type Doc = { kind: 'map'; entries: [string, Doc][] } | { kind: 'list'; items: Doc[] } | { kind: 'scalar'; text: string };
const { node: docArb } = fc.letrec<{ node: Doc; map: Doc; list: Doc }>((tie) => ({
  node: fc.oneof({ maxDepth: 3, depthIdentifier: 'doc' }, fc.constantFrom(...SCALARS).map((text): Doc => ({ kind: 'scalar', text })), tie('map'), tie('list')),
  map: fc.array(fc.tuple(fc.constantFrom(...KEYS), tie('node')), { minLength: 1, maxLength: 4 }).map((entries): Doc => ({ kind: 'map', entries })),
  list: fc.array(tie('node'), { minLength: 1, maxLength: 3 }).map((items): Doc => ({ kind: 'list', items })),
}));

/** How a document is written: indents, spaces after ":" and "-", comments, line ends. */
interface Style {
  readonly indent: number;
  readonly listIndent: number;
  readonly colonSpaces: string;
  readonly dashSpaces: string;
  readonly comment: string;
  readonly blank: string;
  readonly newline: string;
}
const styleArb: fc.Arbitrary<Style> = fc.record({
  indent: fc.constantFrom(1, 2, 4),
  listIndent: fc.constantFrom(0, 2, 3),
  colonSpaces: fc.constantFrom(' ', ' ', '  ', ''),
  dashSpaces: fc.constantFrom(' ', '   '),
  comment: fc.constantFrom('', '', ' # note', '  #x', '#y', ' '),
  blank: fc.constantFrom('', '', '\n', '\n# comment', '\n   # indented comment', '\n  '),
  newline: fc.constantFrom('\n', '\n', '\r\n'),
});

/** Block style at `indent`; a mapping's first key may follow "- " on the same line. */
function render(doc: Doc, indent: number, s: Style, out: string[], first: string | null = null): void {
  const pad = (k: number) => (k === 0 && first !== null ? first : ' '.repeat(indent));
  if (doc.kind === 'map')
    doc.entries.forEach(([key, value], k) => {
      if (value.kind === 'scalar') out.push(`${pad(k)}${key}:${s.colonSpaces}${value.text}${s.comment}${k === 1 ? s.blank : ''}`);
      else {
        out.push(`${pad(k)}${key}:${k === 0 ? s.comment : ''}`);
        render(value, indent + (value.kind === 'list' ? s.listIndent : s.indent), s, out);
      }
    });
  else if (doc.kind === 'list')
    doc.items.forEach((item, k) => {
      const dash = `${k === 0 && first !== null ? first : ' '.repeat(indent)}-${s.dashSpaces}`;
      if (item.kind === 'scalar') out.push(`${dash}${item.text}`);
      else if (item.kind === 'map') render(item, dash.length, s, out, dash);
      else {
        out.push(dash.trimEnd());
        render(item, indent + 2, s, out);
      }
    });
  else out.push(`${pad(0)}${doc.text}`);
}

const textOf = (doc: Doc, s: Style) => {
  const out: string[] = [];
  render(doc.kind === 'map' ? doc : { kind: 'map', entries: [['top', doc]] }, 0, s, out);
  return `${out.join(s.newline)}${s.newline}`;
};

const TRICKY = [' ', '  ', '\n', ':', ': ', '#', ' #', '-', '- ', '"', "'", '{', '}', '[', ']', ',', '&a ', '*a', '|', '\t', '\r', 'x', '0', '.', '\\', '?', '!', '\u00a0', '\u2028', '---\n', '%'];
const editArb = fc.record({ at: fc.nat(), op: fc.constantFrom('insert', 'delete', 'replace'), text: fc.constantFrom(...TRICKY) });
function edit(text: string, e: { at: number; op: string; text: string }): string {
  const at = e.at % (text.length + 1);
  return e.op === 'insert' ? text.slice(0, at) + e.text + text.slice(at) : e.op === 'delete' ? text.slice(0, at) + text.slice(at + 1) : text.slice(0, at) + e.text + text.slice(at + 1);
}

describe('readPlainYamlText', () => {
  it('reads every shipped example exactly as yaml does', () => {
    for (const file of readdirSync('examples').filter((f) => f.endsWith('.yaml'))) expect(agrees(readFileSync(`examples/${file}`, 'utf8')), file).toBe('fast');
  });

  it('reads every test scalar as yaml does: a value, in a flow mapping, in a flow list, in a block list', () => {
    let fast = 0;
    for (const t of SCALARS)
      for (const text of [`v: ${t}\n`, `v: { k: ${t} }\n`, `v: [${t}, 1]\n`, `v:\n  - ${t}\n`]) if (agrees(text) === 'fast') fast++;
    expect(fast).toBeGreaterThan(250);
    expect(resolvePlain('0.060000000000000005')).toBe(0.060000000000000005);
  });

  it('reads generated documents as yaml does, or steps aside', () => {
    let fast = 0;
    fc.assert(
      fc.property(docArb, styleArb, (doc, style) => {
        if (agrees(textOf(doc, style)) === 'fast') fast++;
      }),
      { numRuns: 1500 },
    );
    expect(fast).toBeGreaterThan(150); // most generated documents hold some scalar the fast path leaves to yaml
  });

  it('reads documents with characters inserted, deleted or replaced as yaml does, or steps aside', () => {
    let fast = 0;
    fc.assert(
      fc.property(docArb, styleArb, fc.array(editArb, { minLength: 1, maxLength: 3 }), (doc, style, edits) => {
        if (agrees(edits.reduce(edit, textOf(doc, style))) === 'fast') fast++;
      }),
      { numRuns: 3000 },
    );
    expect(fast).toBeGreaterThan(100);
  });

  it('reads long runs of spaces in a line in linear time (no regular-expression backtracking blow-up)', () => {
    const spaces = ' '.repeat(200_000);
    expect(readPlainYamlText(`v: { j: a${spaces}b${spaces}, k: c${spaces}}\n`)).toEqual({ v: { j: `a${spaces}b`, k: 'c' } });
    expect(readPlainYamlText(`v: { k${spaces}x: 1 }\n`)).toBeUndefined(); // a key that long is yaml's to refuse
    expect(readPlainYamlText(`v: { k: a${spaces}b${spaces}:\n`)).toBeUndefined();
  });

  it('steps aside for what it leaves to yaml: anchors, a repeated key, tabs, a second document, multi-line values', () => {
    for (const text of ['a: &x 1\nb: *x\n', 'a: 1\na: 2\n', 'a:\t1\n', 'a: 1\n---\nb: 2\n', 'a: one\n  two\n', 'a: "one\n  two"\n', 'a: |\n  x\n', '? a\n: 1\n', '- 1\n', ''])
      expect(readPlainYamlText(text), JSON.stringify(text)).toBeUndefined();
  });
});
