/** Runs the README's library snippets and checks each `//=>` value written in them. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import * as solveQuickstart from '../../examples/quickstart.js';
import * as correctionQuickstart from '../../examples/correction-quickstart.js';

const snippets = [
  ['quickstart.ts', solveQuickstart],
  ['correction-quickstart.ts', correctionQuickstart],
] as const;

describe.each(snippets)('examples/%s', (file, module) => {
  const source = readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8');
  const claims = [...source.matchAll(/^export const (\w+) = .*\/\/=> (.+)$/gm)].map((m) => [m[1]!, m[2]!] as const);
  it('has claims to check', () => expect(claims.length).toBeGreaterThanOrEqual(3));
  it.each(claims)('%s is %s', (name, written) => {
    expect((module as Record<string, unknown>)[name]).toEqual(JSON.parse(written));
  });
});
