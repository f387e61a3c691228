// Refreshes the README's shown CLI output from the built CLI (run after `npm run build`).
// test/examples/readme.test.ts fails whenever the README and the real output differ.
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';

const blocks = [
  ['demo-output', ['solve', 'examples/corner-bakery.yaml']],
  ['correct-output', ['correct', 'examples/riverside-cold-store.yaml']],
  ['compare-output', ['correct', 'examples/cedar-falls-print-shop.yaml']],
  ['installation-output', ['solve', 'examples/maple-court-riser.yaml']],
  ['installation-correct-output', ['correct', 'examples/tannery-lane-works.yaml', '--board', 'Press shop', '--arrangement', 'star-bank']],
  ['harmonics-output', ['harmonics', 'examples/mill-street-offices.yaml']],
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
