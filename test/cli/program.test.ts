/** The CLI driven in-process through runCli with a fake outside world. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../packages/cli/src/program.js';
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
