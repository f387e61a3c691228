/** The drawings the README shows are what the tool draws now (refresh: `node scripts/update-readme.mjs`). */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from '../cli/runTrivar.js';

describe('README drawings', () => {
  it('docs/riverside-cold-store-correction.svg is `trivar diagram examples/riverside-cold-store.yaml --with-correction`', () => {
    const committed = readFileSync(`${ROOT}docs/riverside-cold-store-correction.svg`, 'utf8');
    expect(committed).toBe(runTrivar(['diagram', 'examples/riverside-cold-store.yaml', '--with-correction']).stdout);
    expect(readFileSync(`${ROOT}README.md`, 'utf8')).toContain('](docs/riverside-cold-store-correction.svg)');
  });
});
