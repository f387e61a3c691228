/** The README's drawing and `trivar check` output are what the tool produces now (refresh: `node scripts/update-readme.mjs`). */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from '../cli/runTrivar.js';

describe('README drawings and hand check', () => {
  const readme = readFileSync(`${ROOT}README.md`, 'utf8');
  it('docs/riverside-cold-store-correction.svg is `trivar diagram examples/riverside-cold-store.yaml --with-correction`', () => {
    const committed = readFileSync(`${ROOT}docs/riverside-cold-store-correction.svg`, 'utf8');
    expect(committed).toBe(runTrivar(['diagram', 'examples/riverside-cold-store.yaml', '--with-correction']).stdout);
    expect(readme).toContain('](docs/riverside-cold-store-correction.svg)');
  });
  it('docs/maple-court-riser-one-line.svg is `trivar diagram examples/maple-court-riser.yaml --view one-line`', () => {
    const committed = readFileSync(`${ROOT}docs/maple-court-riser-one-line.svg`, 'utf8');
    expect(committed).toBe(runTrivar(['diagram', 'examples/maple-court-riser.yaml', '--view', 'one-line']).stdout);
    expect(readme).toContain('](docs/maple-court-riser-one-line.svg)');
  });
  it('check output block matches `trivar check` on the cold store and its hand figures', () => {
    const block = readme.split('<!-- check-output:start -->')[1]!.split('<!-- check-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(runTrivar(['check', 'examples/riverside-cold-store.yaml', 'examples/hand-figures/riverside-cold-store.yaml']).stdout.trimEnd());
  });
});
