/**
 * The README's rebalancing section shows real output and a real snippet: its
 * output block equals what the built CLI prints, and every `//=>` value in
 * examples/rebalance-quickstart.ts holds.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import * as quickstart from '../../examples/rebalance-quickstart.js';
import { ROOT, runTrivar } from '../cli/runTrivar.js';

describe('README: rebalancing', () => {
  const readme = readFileSync(`${ROOT}README.md`, 'utf8');
  it('output block matches `trivar rebalance examples/larkspur-court-flats.yaml`', () => {
    const block = readme.split('<!-- rebalance-output:start -->')[1]!.split('<!-- rebalance-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['rebalance', 'examples/larkspur-court-flats.yaml']).stdout.trimEnd());
  });

  it('output block matches `trivar rebalance examples/maple-court-riser.yaml --move-limit 4` (an installation work order)', () => {
    const block = readme.split('<!-- rebalance-installation-output:start -->')[1]!.split('<!-- rebalance-installation-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown).toMatch(/board\s+list no\.\s+circuit\s+now on\s+move to/);
    expect(shown.trimEnd()).toBe(runTrivar(['rebalance', 'examples/maple-court-riser.yaml', '--move-limit', '4']).stdout.trimEnd());
  });

  const source = readFileSync(`${ROOT}examples/rebalance-quickstart.ts`, 'utf8');
  it('shows examples/rebalance-quickstart.ts as it is', () => expect(readme).toContain(source.slice(source.indexOf('import {')).trimEnd()));
  const claims = [...source.matchAll(/^export const (\w+) = .*\/\/=> (.+)$/gm)].map((m) => [m[1]!, m[2]!] as const);
  it('has claims to check', () => expect(claims.length).toBeGreaterThanOrEqual(3));
  it.each(claims)('%s is %s', (name, written) => {
    expect((quickstart as Record<string, unknown>)[name]).toEqual(JSON.parse(written));
  });
});
