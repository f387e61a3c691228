/**
 * DEVELOPERS.md stays true to the layout: every source module of the packages is named there (as
 * `name.ts`, or by its name alone where a sentence speaks of its function), and every module file the
 * guide names exists. A new module without a line in the guide, or a line left behind by a rename,
 * fails here.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const GUIDE = readFileSync(join(ROOT, 'DEVELOPERS.md'), 'utf8');
/** `size{Star,Delta}Bank.ts` is the guide's short form of two files: read it as both. */
const EXPANDED_GUIDE = GUIDE.replace(/(\w*)\{([\w,]+)\}(\w*)/g, (_, head: string, alternatives: string, tail: string) =>
  alternatives
    .split(',')
    .map((a) => head + a + tail)
    .join(' '),
);

function filesUnder(folder: string, keep: (name: string) => boolean): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(folder, { withFileTypes: true })) {
    if (entry.name === 'node_modules' || entry.name === 'dist' || entry.name.startsWith('.')) continue;
    const path = join(folder, entry.name);
    if (entry.isDirectory()) out.push(...filesUnder(path, keep));
    else if (keep(entry.name)) out.push(path);
  }
  return out;
}

const isTypeScript = (name: string) => name.endsWith('.ts') && !name.endsWith('.d.ts');
const sourceModules = ['packages/core/src', 'packages/cli/src'].flatMap((folder) => filesUnder(join(ROOT, folder), isTypeScript));
const moduleName = (path: string) => path.slice(path.lastIndexOf('/') + 1, -'.ts'.length);

describe('DEVELOPERS.md and the layout of the tree', () => {
  it('has found the source modules (the walk itself works)', () => {
    expect(sourceModules.length).toBeGreaterThan(300);
    expect(sourceModules.map(moduleName)).toContain('compiledNetwork');
  });

  it('names every source module of the packages', () => {
    const unnamed = sourceModules.filter((path) => !new RegExp(`\\b${moduleName(path)}\\b`).test(EXPANDED_GUIDE)).map((path) => relative(ROOT, path));
    expect(unnamed, 'modules DEVELOPERS.md does not name: add each to its folder in "Layout"').toEqual([]);
  });

  it('names no module file that does not exist', () => {
    const everyFile = new Set(['packages', 'scripts', 'bench', 'test', 'examples'].flatMap((folder) => filesUnder(join(ROOT, folder), () => true)).map((path) => path.slice(path.lastIndexOf('/') + 1)));
    // A file name as the guide writes one: two or more characters before `.ts`, so `.d.ts` and `some.ts` in a command line are read as prose only when they are.
    const named = new Set([...EXPANDED_GUIDE.matchAll(/(?<![\w./-])([A-Za-z][\w.-]+\.(?:ts|mjs))\b/g)].map((m) => m[1]!));
    // `node scripts/dev-run.mjs some.ts`: any scratch file; profile-worker.mjs: built into dist/ from profileWorker.ts.
    const placeholders = new Set(['some.ts', 'profile-worker.mjs']);
    const missing = [...named].filter((name) => !placeholders.has(name) && !everyFile.has(name));
    expect(missing, 'file names in DEVELOPERS.md with no such file in the tree').toEqual([]);
  });
});
