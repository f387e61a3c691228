/** Runs the built `trivar` binary as a user would. `npm test` builds it first. */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const BIN = `${ROOT}packages/cli/bin/trivar.js`;

export interface RunResult {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

export function runTrivar(args: readonly string[], input?: string): RunResult {
  if (!existsSync(`${ROOT}packages/cli/dist/trivar.js`)) throw new Error('the CLI is not built: run `npm run build` (npm test does it)');
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, input, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024, env: { ...process.env, NO_COLOR: '1' } });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
