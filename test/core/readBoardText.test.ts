/** Board text is read one way: YAML 1.2 core schema, one document, bounded depth and alias expansion. */
import { describe, expect, it } from 'vitest';
import { InputError, readBoardText } from '@trivar/core';

const issuesOf = (text: string) => {
  try {
    readBoardText(text);
  } catch (e) {
    if (e instanceof InputError) return e.issues;
    throw e;
  }
  throw new Error('expected an InputError');
};

describe('readBoardText', () => {
  it('reads numbers the YAML 1.2 way: 012 is twelve, 1:30 is text, on is text', () => {
    expect(readBoardText('a: 012\nb: 1:30\nc: on\nd: 1_0\n')).toEqual({ a: 12, b: '1:30', c: 'on', d: '1_0' });
  });
  it('refuses a %YAML 1.1 header instead of switching to 1.1 numbers', () => {
    expect(issuesOf('%YAML 1.1\n---\na: 012\n')).toEqual([expect.objectContaining({ code: 'yaml_version', path: '' })]);
    expect(readBoardText('%YAML 1.2\n---\na: 012\n')).toEqual({ a: 12 });
  });
  it('keeps << as an ordinary key (no merges)', () => {
    expect(readBoardText('b: &b { x: 1 }\nc: { <<: *b }\n')).toEqual({ b: { x: 1 }, c: { '<<': { x: 1 } } });
  });
  it('expands ordinary anchor reuse however often it recurs, and refuses an expansion bomb by its size', () => {
    const reuse = `pf: &pf 0.9\nloads: [${Array(5000).fill('*pf').join(', ')}]\n`;
    expect((readBoardText(reuse) as { loads: number[] }).loads).toHaveLength(5000);
    const bomb = ['a0: &a0 [x, x, x, x, x, x, x, x, x, x]', ...Array.from({ length: 6 }, (_, k) => `a${k + 1}: &a${k + 1} [${Array(10).fill(`*a${k}`).join(', ')}]`)].join('\n');
    expect(issuesOf(bomb)).toEqual([expect.objectContaining({ code: 'alias_expansion' })]);
  });
  it('names a second document and refuses deep nesting before the parser sees it', () => {
    expect(issuesOf('a: 1\n---\nb: 2\n')).toEqual([expect.objectContaining({ code: 'multiple_documents' })]);
    expect(issuesOf(`${'['.repeat(65)}${']'.repeat(65)}`)).toEqual([expect.objectContaining({ code: 'too_deep' })]);
    expect(readBoardText(`${'['.repeat(60)}${']'.repeat(60)}`)).toBeInstanceOf(Array);
  });
  it('does not count brackets inside quotes or comments as nesting', () => {
    const text = `name: "${'['.repeat(100)}"\nnote: '${'{'.repeat(100)}'\n# ${'['.repeat(100)}\n`;
    expect(readBoardText(text)).toEqual({ name: '['.repeat(100), note: '{'.repeat(100) });
  });
});
