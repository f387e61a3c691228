/** The CLI driven in-process through runCli with a fake outside world. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { COMMAND_NAMES, createProgram, runCli } from '../../packages/cli/src/program.js';
import type { CliIo } from '../../packages/cli/src/io.js';

function fakeIo(files: Record<string, string>) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIo = {
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
    readSource: async (path) => {
      const text = files[path];
      if (text === undefined) throw new Error(`unexpected read of ${path}`);
      return text;
    },
    isTty: false,
  };
  return { io, out: () => out.join(''), err: () => err.join('') };
}

const bakery = readFileSync(new URL('../../examples/corner-bakery.yaml', import.meta.url), 'utf8');

describe('runCli in-process', () => {
  it('solve prints the report and returns 0', async () => {
    const f = fakeIo({ '-': bakery });
    expect(await runCli(['solve', '-'], f.io)).toBe(0);
    expect(f.out()).toContain('Corner bakery');
    expect(f.err()).toBe('');
  });
  it('an invalid board returns 3 and lists the field', async () => {
    const f = fakeIo({ 'b.yaml': bakery.replace('frequencyHz: 50', 'frequencyHz: 45') });
    expect(await runCli(['solve', 'b.yaml'], f.io)).toBe(3);
    expect(f.err()).toContain('supply.frequencyHz');
  });
  it('numbers as people write them: hex, binary or a figure named twice in --aim are refused (2), .95 and 1e0 are read', async () => {
    for (const args of [
      ['correct', 'b.yaml', '--pf', '0x1'],
      ['correct', 'b.yaml', '--pf', '0b1'],
      ['rebalance', 'b.yaml', '--aim', 'neutral=1,neutral=2'],
      ['rebalance', 'b.yaml', '--aim', 'neutral=0x2'],
    ]) {
      const f = fakeIo({ 'b.yaml': bakery });
      expect(await runCli(args, f.io), args.join(' ')).toBe(2);
      expect(f.err()).toMatch(/is invalid/);
    }
    for (const pf of ['.95', '9.5e-1']) {
      const f = fakeIo({ 'b.yaml': bakery });
      expect(await runCli(['correct', 'b.yaml', '--arrangement', 'star-bank', '--pf', pf], f.io)).not.toBe(2);
      expect(f.out()).toContain('PF ≥ 0.950');
    }
  });
  it('an unknown option returns 2', async () => {
    const f = fakeIo({});
    expect(await runCli(['solve', 'x', '--colour'], f.io)).toBe(2);
    expect(f.err()).toMatch(/unknown option/);
  });
  it('an unexpected failure is reported as a bug with exit 1', async () => {
    const f = fakeIo({});
    expect(await runCli(['solve', 'missing.yaml'], f.io)).toBe(1);
    expect(f.err()).toMatch(/internal error \(a bug in trivar/);
  });
});

describe('only the named command is built', () => {
  it('a run naming a command builds that command alone; without one, every command in the order help lists them', () => {
    expect(createProgram(fakeIo({}).io).commands.map((c) => c.name())).toEqual([...COMMAND_NAMES]);
    for (const name of COMMAND_NAMES) expect(createProgram(fakeIo({}).io, undefined, name).commands.map((c) => c.name())).toEqual([name]);
  });
  /** What the program with every command prints and returns: the reference runCli's output must match byte for byte. */
  async function withEveryCommand(argv: string[]) {
    const f = fakeIo({});
    let code = 0;
    try {
      await createProgram(f.io).parseAsync(argv, { from: 'user' });
    } catch (error) {
      // commander's own errors (CommanderError; commander is the CLI package's dependency, not the tests').
      const commanderCode = (error as { code?: unknown }).code;
      if (typeof commanderCode !== 'string' || !commanderCode.startsWith('commander.')) throw error;
      code = ['commander.helpDisplayed', 'commander.version', 'commander.help'].includes(commanderCode) ? 0 : 2;
    }
    return { code, out: f.out(), err: f.err() };
  }
  const argvs: string[][] = [
    [],
    ['--help'],
    ['-h'],
    ['help'],
    ['help', 'correct'],
    ['help', 'nothing'],
    ['--version'],
    ['-V'],
    ['--bogus'],
    ['slove', 'x.yaml'],
    ['corect'],
    ['Solve', 'x.yaml'],
    ['x.yaml'],
    ['solve'],
    ['solve', 'x.yaml', '--jsno'],
    ['solve', 'a', 'b'],
    ['correct', 'x.yaml', '--arrangement', 'star'],
    ['correct', 'x.yaml', '--pf', '2'],
    ['check', 'a.yaml'],
    ['schema', '--bogus'],
    ['profile', 'x.yaml', '--fill-gaps', 'zero'],
    ...COMMAND_NAMES.map((name) => [name, '--help']),
    ...COMMAND_NAMES.map((name) => ['help', name]),
  ];
  it.each(argvs.map((argv) => [argv.join(' ') || '(nothing)', argv] as const))('%s: output and exit code as with every command', async (_, argv) => {
    const f = fakeIo({});
    const code = await runCli(argv, f.io);
    expect({ code, out: f.out(), err: f.err() }).toEqual(await withEveryCommand(argv));
    expect(f.out() + f.err()).not.toBe('');
  });
});
