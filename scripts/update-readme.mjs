// Refreshes the README's shown CLI output from the built CLI (run after `npm run build`).
// test/examples/readme.test.ts fails whenever the README and the real output differ.
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const blocks = [
  ['demo-output', ['solve', 'examples/corner-bakery.yaml']],
  ['correct-output', ['correct', 'examples/riverside-cold-store.yaml']],
  ['compare-output', ['correct', 'examples/cedar-falls-print-shop.yaml']],
  ['installation-output', ['solve', 'examples/maple-court-riser.yaml']],
  ['regions-output', ['solve', 'examples/pine-hollow-cabin.yaml']],
  ['installation-correct-output', ['correct', 'examples/tannery-lane-works.yaml', '--board', 'Press shop', '--arrangement', 'star-bank']],
  ['installation-metered-output', ['correct', 'examples/tannery-lane-works.yaml', '--board', 'Press shop', '--measured-at', 'origin', '--pf', '0.97', '--arrangement', 'star-bank']],
  ['harmonics-output', ['harmonics', 'examples/mill-street-offices.yaml']],
  ['harmonics-installation-output', ['harmonics', 'examples/harrow-yard-studios.yaml']],
  ['correct-detuned-output', ['correct', 'examples/quayside-print-works.yaml']],
  ['check-output', ['check', 'examples/riverside-cold-store.yaml', 'examples/hand-figures/riverside-cold-store.yaml']],
  ['rebalance-output', ['rebalance', 'examples/larkspur-court-flats.yaml']],
  ['rebalance-installation-output', ['rebalance', 'examples/maple-court-riser.yaml', '--move-limit', '4']],
];
let readme = readFileSync('README.md', 'utf8');
for (const [marker, args] of blocks) {
  // `correct` exits 5 when a target is out of reach; the README shows that output too.
  const run = spawnSync(process.execPath, ['packages/cli/bin/trivar.js', ...args], { encoding: 'utf8' });
  const out = run.stdout.trimEnd();
  const start = `<!-- ${marker}:start -->`;
  const end = `<!-- ${marker}:end -->`;
  const [head, rest] = readme.split(start);
  const tail = rest.split(end)[1];
  readme = `${head}${start}\n\`\`\`text\n${out}\n\`\`\`\n${end}${tail}`;
}
writeFileSync('README.md', readme);

// Drawings the README shows, made by the tool itself (test/examples/readmeDrawingsAndCheck.test.ts checks them).
const images = [
  ['docs/riverside-cold-store-correction.svg', ['diagram', 'examples/riverside-cold-store.yaml', '--with-correction']],
  ['docs/maple-court-riser-one-line.svg', ['diagram', 'examples/maple-court-riser.yaml', '--view', 'one-line']],
];
for (const [file, args] of images) {
  const run = spawnSync(process.execPath, ['packages/cli/bin/trivar.js', ...args], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`trivar ${args.join(' ')} failed: ${run.stderr}`);
  writeFileSync(file, run.stdout);
}

// The load-over-time example: a generated year of 1-minute data (not committed) through
// `trivar profile` with the correction study's bank; its report block and two of its charts
// (test/examples/readmeProfile.test.ts checks them).
const profileDir = mkdtempSync(join(tmpdir(), 'trivar-readme-profile-'));
const profileData = join(profileDir, 'quay-street.csv');
const generated = spawnSync(process.execPath, ['scripts/generate-profile-example.mjs', profileData], { encoding: 'utf8' });
if (generated.status !== 0) throw new Error(`generate-profile-example failed: ${generated.stderr}`);
const profileArgs = ['profile', 'examples/quay-street-flats.yaml', '--data', profileData, '--time-zone', 'Europe/Dublin', '--correction-bank', '--charts', join(profileDir, 'charts')];
const profileRun = spawnSync(process.execPath, ['packages/cli/bin/trivar.js', ...profileArgs], { encoding: 'utf8' });
if (profileRun.status !== 0) throw new Error(`trivar ${profileArgs.join(' ')} failed: ${profileRun.stderr}`);
readme = readFileSync('README.md', 'utf8');
{
  const start = '<!-- profile-output:start -->';
  const end = '<!-- profile-output:end -->';
  const [head, rest] = readme.split(start);
  readme = `${head}${start}\n\`\`\`text\n${profileRun.stdout.trimEnd()}\n\`\`\`\n${end}${rest.split(end)[1]}`;
}
writeFileSync('README.md', readme);
for (const [committed, written] of [
  ['docs/quay-street-currents.svg', 'currents.svg'],
  ['docs/quay-street-power-factor.svg', 'power-factor.svg'],
])
  copyFileSync(join(profileDir, 'charts', written), committed);
rmSync(profileDir, { recursive: true, force: true });
