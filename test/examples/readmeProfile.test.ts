/**
 * The README's load-over-time block and charts are what `trivar profile` makes of the generated
 * example year now (refresh: `npm run build && node scripts/update-readme.mjs`).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { ROOT, runTrivar, type RunResult } from '../cli/runTrivar.js';

/** The command scripts/update-readme.mjs runs for the block (the README shows it with /tmp paths). */
const args = (data: string, charts: string) => ['profile', 'examples/quay-street-flats.yaml', '--data', data, '--time-zone', 'Europe/Dublin', '--correction-bank', '--charts', charts];
/** Committed chart ← the file the tool writes. */
const CHARTS = [
  ['docs/quay-street-currents.svg', 'currents.svg'],
  ['docs/quay-street-power-factor.svg', 'power-factor.svg'],
] as const;

let dir = '';
let run: RunResult;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-readme-profile-'));
  const data = join(dir, 'quay-street.csv');
  execFileSync(process.execPath, [`${ROOT}scripts/generate-profile-example.mjs`, data], { cwd: ROOT });
  run = runTrivar(args(data, join(dir, 'charts')));
}, 300_000);

describe('README load-over-time example', () => {
  const readme = readFileSync(`${ROOT}README.md`, 'utf8');
  it('the profile block is the report of the generated year with the correction study\'s bank', () => {
    expect(run.code).toBe(0);
    const block = readme.split('<!-- profile-output:start -->')[1]!.split('<!-- profile-output:end -->')[0]!;
    const shown = block.replace(/^\s*```text\n/, '').replace(/```\s*$/, '');
    expect(shown.trimEnd()).toBe(run.stdout.trimEnd());
  });
  it.each(CHARTS)('%s is the chart the tool writes, and the README shows it', (committed, written) => {
    expect(readFileSync(`${ROOT}${committed}`, 'utf8')).toBe(readFileSync(join(dir, 'charts', written), 'utf8'));
    expect(readme).toContain(`](${committed})`);
  });
});
