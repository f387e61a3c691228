// Start-up benchmark: wall time of `trivar solve` on a shipped example against a
// bare `node -e ""`, runs interleaved in this one script so both see the same
// machine load. Goal: median ratio <= 3. Usage: node scripts/bench-startup.mjs [runs]
import { spawnSync } from 'node:child_process';

const runs = Number(process.argv[2] ?? 15);
const cli = ['packages/cli/bin/trivar.js', 'solve', 'examples/corner-bakery.yaml'];
// Without NODE_EXTRA_CA_CERTS, as in bench/solver.bench.ts: where it is set, every node process first
// reads that certificate bundle (about 80 ms on the development machine), which is no part of a
// standard start and would hide trivar's own time in the ratio.
const env = { ...process.env };
delete env.NODE_EXTRA_CA_CERTS;

function wallMs(args) {
  const start = process.hrtime.bigint();
  const r = spawnSync(process.execPath, args, { stdio: ['ignore', 'ignore', 'inherit'], env });
  if (r.status !== 0) throw new Error(`${args.join(' ')} exited ${r.status}`);
  return Number(process.hrtime.bigint() - start) / 1e6;
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const bare = [];
const trivar = [];
wallMs(cli); // warm the file cache once
for (let i = 0; i < runs; i++) {
  bare.push(wallMs(['-e', '']));
  trivar.push(wallMs(cli));
}
const ratio = median(trivar) / median(bare);
console.log(`bare node -e "" (no NODE_EXTRA_CA_CERTS): median ${median(bare).toFixed(1)} ms over ${runs} runs`);
console.log(`trivar solve (bakery):     median ${median(trivar).toFixed(1)} ms over ${runs} runs`);
console.log(`start-up ratio:            ${ratio.toFixed(2)} x (goal <= 3)`);
process.exitCode = ratio <= 3 ? 0 : 1;
