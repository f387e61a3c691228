/** Runs the README's library snippet and checks each `//=>` value written in it. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import * as quickstart from '../../examples/quickstart.js';

const source = readFileSync(new URL('../../examples/quickstart.ts', import.meta.url), 'utf8');
const claims = [...source.matchAll(/^export const (\w+) = .*\/\/=> (.+)$/gm)].map((m) => [m[1]!, m[2]!] as const);

describe('examples/quickstart.ts', () => {
  it('has claims to check', () => expect(claims.length).toBeGreaterThanOrEqual(3));
  it.each(claims)('%s is %s', (name, written) => {
    expect((quickstart as Record<string, unknown>)[name]).toEqual(JSON.parse(written));
  });
});
