/**
 * Test setup: reproducible fast-check runs and a core that stays silent.
 * Set TRIVAR_SEED to replay a failing property run; the seed is printed on failure.
 */
import fc from 'fast-check';
import { afterEach, beforeEach, vi } from 'vitest';

// Locally every run explores a new seed; CI replays one fixed seed so that a landing is judged on the
// same cases it was tested with (a new counterexample found locally becomes a regression test).
const CI_SEED = 20261202;
const seed = process.env.TRIVAR_SEED
  ? Number(process.env.TRIVAR_SEED)
  : process.env.CI === 'true'
    ? CI_SEED
    : Date.now() ^ (Math.random() * 0x100000000);
fc.configureGlobal({ seed, numRuns: Number(process.env.TRIVAR_RUNS ?? 100) });

// Core must not write to the console: any test that makes it do so fails.
let spies: ReturnType<typeof vi.spyOn>[] = [];
beforeEach(() => {
  spies = (['log', 'info', 'warn', 'error', 'debug'] as const).map((m) => vi.spyOn(console, m));
});
afterEach(() => {
  const calls = spies.flatMap((s) => s.mock.calls);
  for (const s of spies) s.mockRestore();
  if (calls.length) throw new Error(`a test wrote to the console: ${JSON.stringify(calls[0]).slice(0, 200)}`);
});
