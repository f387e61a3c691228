// Prints every `trivar correct` output a speed change must leave alone: each shipped example, text and --json,
// every arrangement, and every board of the installation examples. Run before and after a change and diff:
//   node scripts/correct-outputs.mjs > /tmp/before.txt ... node scripts/correct-outputs.mjs > /tmp/after.txt
// An optional argument keeps only the runs whose arguments match it (a regular expression), e.g. 'hillside|--json'.
// (run `npm run build` first: this runs the built CLI).
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';

// TRIVAR_CLI: another build of the CLI to run instead (e.g. an unminified bundle for profiling).
const cli = process.env.TRIVAR_CLI ?? 'packages/cli/bin/trivar.js';
const examples = readdirSync('examples').filter((f) => f.endsWith('.yaml')).sort();
const runs = [];
for (const file of examples) {
  const path = `examples/${file}`;
  const text = readFileSync(path, 'utf8');
  const boards = /^boards:/m.test(text) ? [...text.matchAll(/^ {2}- name: (.+)$/gm)].map((m) => m[1].trim()) : [undefined];
  for (const board of boards) {
    const where = board === undefined ? [] : ['--board', board];
    for (const arrangement of [undefined, 'star-bank', 'delta-bank', 'balancing-compensator']) {
      const what = arrangement === undefined ? [] : ['--arrangement', arrangement];
      for (const format of [[], ['--json']]) runs.push([path, ...where, ...what, ...format]);
    }
  }
}
const only = process.argv[2] === undefined ? null : new RegExp(process.argv[2]);
for (const args of runs.filter((a) => only === null || only.test(a.join(' ')))) {
  const r = spawnSync(process.execPath, [cli, 'correct', ...args], { encoding: 'utf8', maxBuffer: 1 << 30 });
  console.log(`### trivar correct ${args.join(' ')}  (exit ${r.status})`);
  console.log(r.stdout);
  console.log(r.stderr);
}
