// One-step set-up behind `npm run demo` and `npm test`: installs dependencies
// with the pinned pnpm (fetched by npx, no corepack needed) when the lockfile
// changed since the last install, then builds.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';

const pnpm = JSON.parse(readFileSync('package.json', 'utf8')).packageManager; // "pnpm@x.y.z"
const stamp = 'node_modules/.trivar-install-stamp';
const lockHash = createHash('sha256').update(readFileSync('pnpm-lock.yaml')).digest('hex');
const installed = existsSync(stamp) && readFileSync(stamp, 'utf8') === lockHash;
const npx = process.platform === 'win32' ? 'npx.cmd' : 'npx';

if (!installed) {
  console.error(`trivar set-up: installing dependencies with ${pnpm} ...`);
  execFileSync(npx, ['--yes', pnpm, 'install', '--frozen-lockfile', '--reporter=silent'], { stdio: 'inherit' });
  writeFileSync(stamp, lockHash);
}
execFileSync(process.execPath, ['scripts/build.mjs'], { stdio: 'inherit' });
