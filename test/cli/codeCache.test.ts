/**
 * The CLI's compiled-code cache (packages/cli/src/loader): kept per user, named for the bundle and the
 * Node build, written whole after a run that did its work, and never trusted blindly: a damaged cache
 * or a folder others can write is not used, and the output is the same with or without it.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { cacheCommand, cacheDirectory, cacheFileName } from '../../packages/cli/src/loader/codeCache.js';
import { ROOT } from './runTrivar.js';

let dir = '';
beforeEach(() => {
  dir = join(mkdtempSync(join(tmpdir(), 'trivar-cache-test-')), 'cache');
});
afterEach(() => rmSync(join(dir, '..'), { recursive: true, force: true }));

function trivar(args: readonly string[], env: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [`${ROOT}packages/cli/bin/trivar.js`, ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', TRIVAR_NO_CODE_CACHE: '', TRIVAR_CODE_CACHE_DIR: dir, ...env },
  });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}
const cacheFiles = () => (existsSync(dir) ? readdirSync(dir).filter((f) => f.endsWith('.v8')) : []);
const SOLVE = ['solve', 'examples/corner-bakery.yaml'];

describe('code cache of the CLI bundle', () => {
  it('is written by the first run, in a folder and file only this user can use, and read by the next', () => {
    const uncached = trivar(SOLVE, { TRIVAR_NO_CODE_CACHE: '1', TRIVAR_CODE_CACHE_DIR: '' });
    const first = trivar(SOLVE);
    expect(first).toEqual(uncached);
    const [file] = cacheFiles();
    expect(cacheFiles()).toEqual([expect.stringMatching(/^solve-[0-9a-f]{8}-[0-9a-f]{16}\.v8$/)]);
    expect(statSync(dir).mode & 0o777).toBe(0o700);
    expect(statSync(join(dir, file!)).mode & 0o777).toBe(0o600);
    const written = statSync(join(dir, file!)).mtimeMs;
    expect(trivar(SOLVE)).toEqual(uncached);
    // Accepted, so left as it was.
    expect(statSync(join(dir, file!)).mtimeMs).toBe(written);
  });
  it('a damaged cache is not used: the output is unchanged and a sound cache replaces it', () => {
    const expected = trivar(SOLVE);
    const file = join(dir, cacheFiles()[0]!);
    const sound = readFileSync(file);
    // A wrong header V8 refuses itself; a damaged body only the file's digest catches (V8 would crash on it).
    const flipped = Buffer.from(sound);
    flipped.fill(0xff, sound.length >> 2, (sound.length >> 2) + 8);
    for (const damaged of [Buffer.from('not a code cache'), sound.subarray(0, sound.length >> 1), Buffer.alloc(sound.length, 7), flipped]) {
      writeFileSync(file, damaged);
      expect(trivar(SOLVE)).toEqual(expected);
      expect(readFileSync(file).equals(damaged)).toBe(false);
      expect(readFileSync(file).length).toBeGreaterThan(1000);
    }
  });
  it('is not written when the user opts out, nor after a run that failed', () => {
    expect(trivar(SOLVE, { TRIVAR_NO_CODE_CACHE: '1' }).code).toBe(0);
    expect(existsSync(dir)).toBe(false);
    expect(trivar(['solve', 'examples/no-such-board.yaml']).code).toBe(3);
    expect(cacheFiles()).toEqual([]);
  });
  it.skipIf(process.platform === 'win32')('a folder other users can write is neither read nor written', () => {
    mkdirSync(dir, { mode: 0o700 });
    chmodSync(dir, 0o777);
    expect(trivar(SOLVE).code).toBe(0);
    expect(cacheFiles()).toEqual([]);
  });
  it('keeps one cache per command, named for the bundle text and the Node build', () => {
    expect(trivar(['--version']).code).toBe(0);
    expect(trivar(SOLVE).code).toBe(0);
    expect(cacheFiles().map((f) => f.split('-')[0]).sort()).toEqual(['none', 'solve']);
    expect(cacheFileName('a', 'solve')).not.toBe(cacheFileName('b', 'solve'));
    expect(cacheFileName('a', 'solve')).not.toBe(cacheFileName('a', 'correct'));
    expect(cacheFileName('a', 'solve', '/one/dist/trivar-bundle.js')).not.toBe(cacheFileName('a', 'solve', '/two/dist/trivar-bundle.js'));
    expect(cacheCommand(['correct', 'x.yaml'])).toBe('correct');
    expect(cacheCommand(['--version'])).toBe('none');
    expect(cacheCommand(['../../x'])).toBe('none');
  });
  it('two copies of trivar keep a cache each; a rebuilt copy replaces only its own', () => {
    // A global install beside a project's own, or two checkouts: one name per command had each evict the other's cache.
    const copy = join(dir, '..', 'copy');
    cpSync(`${ROOT}packages/cli/dist`, join(copy, 'dist'), { recursive: true });
    const runCopy = () => spawnSync(process.execPath, [join(copy, 'dist', 'trivar.js'), ...SOLVE], { cwd: ROOT, encoding: 'utf8', env: { ...process.env, TRIVAR_NO_CODE_CACHE: '', TRIVAR_CODE_CACHE_DIR: dir } });
    expect(trivar(SOLVE).code).toBe(0);
    const [own] = cacheFiles();
    expect(runCopy().status).toBe(0);
    expect(cacheFiles()).toHaveLength(2);
    expect(cacheFiles()).toContain(own);
    const [copyCache] = cacheFiles().filter((f) => f !== own);
    // The copy rebuilt (its bundle's modification time changes the build part of the name): its old cache goes, the other copy's stays.
    const bundle = join(copy, 'dist', 'trivar-bundle.js');
    utimesSync(bundle, new Date(), new Date(Date.now() + 5000));
    expect(runCopy().status).toBe(0);
    expect(cacheFiles()).toHaveLength(2);
    expect(cacheFiles()).toContain(own);
    expect(cacheFiles()).not.toContain(copyCache);
  });
  it('lives in the per-user cache folder, never beside the input', () => {
    const home = () => '/home/ana';
    expect(cacheDirectory({}, 'linux', home)).toBe('/home/ana/.cache/trivar/code-cache');
    expect(cacheDirectory({ XDG_CACHE_HOME: '/var/cache/ana' }, 'linux', home)).toBe('/var/cache/ana/trivar/code-cache');
    expect(cacheDirectory({ XDG_CACHE_HOME: 'relative' }, 'linux', home)).toBe('/home/ana/.cache/trivar/code-cache');
    expect(cacheDirectory({}, 'darwin', home)).toBe('/home/ana/Library/Caches/trivar/code-cache');
    expect(cacheDirectory({ LOCALAPPDATA: 'C:\\Users\\ana\\AppData\\Local' }, 'win32', home)).toMatch(/trivar.code-cache$/);
    expect(cacheDirectory({ TRIVAR_CODE_CACHE_DIR: '/tmp/mine' }, 'linux', home)).toBe('/tmp/mine');
    expect(cacheDirectory({ TRIVAR_NO_CODE_CACHE: '1', TRIVAR_CODE_CACHE_DIR: '/tmp/mine' }, 'linux', home)).toBeNull();
    expect(
      cacheDirectory({}, 'linux', () => {
        throw new Error('no home');
      }),
    ).toBeNull();
  });
});
