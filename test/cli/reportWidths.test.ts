/**
 * Every text report fits a 100-column terminal: `solve`, `harmonics` and `rebalance` on every
 * shipped example (boards and installations), driven in-process through runCli. `correct` has
 * its own width tests (correctCommand, correctInstallationCommand) because it is slower.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../packages/cli/src/program.js';
import type { CliIo } from '../../packages/cli/src/io.js';
import { ROOT } from './runTrivar.js';

const examples = readdirSync(`${ROOT}examples`).filter((f) => f.endsWith('.yaml'));

async function run(args: string[], file: string): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = {
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
    readSource: async () => readFileSync(`${ROOT}examples/${file}`, 'utf8'),
    isTty: false,
  };
  const code = await runCli([...args, `examples/${file}`], io);
  return { code, out: out.join(''), err: err.join('') };
}

/** The widest line, counted in code points as a terminal shows them. */
const widest = (text: string) => text.split('\n').reduce((a, l) => ([...l].length > [...a].length ? l : a), '');

describe('text reports fit 100 columns', () => {
  const commands = [['solve'], ['harmonics'], ['rebalance']];
  const cases = commands.flatMap((c) => examples.map((f) => [c.join(' '), f] as const));
  it.each(cases)('trivar %s examples/%s', async (command, file) => {
    const r = await run(command.split(' '), file);
    // Installation files a command does not take are refused with a message, not a report.
    const text = r.out || r.err;
    expect(text.length).toBeGreaterThan(0);
    const line = widest(r.out);
    expect([...line].length, `widest line:\n${line}`).toBeLessThanOrEqual(100);
  }, 60_000);
});
