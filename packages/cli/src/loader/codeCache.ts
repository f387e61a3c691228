/**
 * Where the compiled-code cache of the CLI bundle lives, and under which name. The cache is V8's own
 * serialised bytecode of dist/trivar-bundle.js (vm.Script cachedData): with it a run skips parsing and
 * compiling the bundle and every function the command ran last time. It is kept per user, never beside
 * the user's files: $XDG_CACHE_HOME/trivar (else ~/.cache/trivar; ~/Library/Caches/trivar on macOS,
 * %LOCALAPPDATA%\trivar on Windows), TRIVAR_CODE_CACHE_DIR to put it elsewhere, TRIVAR_NO_CODE_CACHE=1
 * to do without. Only node builtins here: this runs before the bundle.
 */
import { lstatSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import * as zlib from 'node:zlib';

type Env = Readonly<Record<string, string | undefined>>;

/** The cache folder for this user, or null when the user asked for none or there is no home to keep it in. */
export function cacheDirectory(env: Env = process.env, platform: NodeJS.Platform = process.platform, home: () => string = homedir): string | null {
  if (env.TRIVAR_NO_CODE_CACHE !== undefined && env.TRIVAR_NO_CODE_CACHE !== '' && env.TRIVAR_NO_CODE_CACHE !== '0') return null;
  if (env.TRIVAR_CODE_CACHE_DIR) return env.TRIVAR_CODE_CACHE_DIR;
  if (platform === 'win32') return env.LOCALAPPDATA ? join(env.LOCALAPPDATA, 'trivar', 'code-cache') : null;
  let base: string;
  try {
    base = platform === 'darwin' ? join(home(), 'Library', 'Caches') : env.XDG_CACHE_HOME?.startsWith('/') ? env.XDG_CACHE_HOME : join(home(), '.cache');
  } catch {
    return null;
  }
  return join(base, 'trivar', 'code-cache');
}

/**
 * CRC-32 (zlib.crc32, Node 20.15 on), else the first 4 bytes of a SHA-1. Why not always a hash from
 * node:crypto: loading node:crypto was 38 M instructions of every run, node:zlib and its CRC of a cache
 * file 6 M. A CRC is what damage detection needs; the file name gets two of them (below).
 */
function checksum(data: Uint8Array | string): number {
  if (typeof zlib.crc32 === 'function') return zlib.crc32(data);
  // Node before 20.15 only: loaded when needed.
  return (require('node:crypto') as typeof import('node:crypto')).createHash('sha1').update(data).digest().readUInt32BE(0);
}
const hex8 = (n: number): string => n.toString(16).padStart(8, '0');

/**
 * The cache file of one command of one installed copy: `<command>-<install>-<build>.v8`. The build part
 * is named for the bundle (the build's hash of its text, and its size and modification time, so a
 * rebuilt or edited bundle never reads a cache made for another) and for the Node build (V8 itself
 * checks only its version, its flags and the source's length); its 64 bits are the checksums of the
 * name's input read forwards and backwards: two inputs of one length whose CRCs agree (CRC is linear)
 * almost never agree backwards too, so builds are told apart as well as by a 64-bit hash. The install
 * part is the checksum of the bundle's path: two copies of trivar on one machine (a global one and a
 * project's own, two checkouts) each keep their cache, where one name per command had each run of the
 * one evict the other's and start cold. One cache per command: each holds the functions that command ran.
 */
export function cacheFileName(bundle: string, command: string, install = ''): string {
  const input = `${bundle}\0${process.version}\0${process.arch}\0${command}`;
  return `${command}-${hex8(checksum(install))}-${hex8(checksum(input))}${hex8(checksum([...input].reverse().join('')))}.v8`;
}

/** The caches `file` replaces: the same command of the same installed copy, of another build. */
const supersededBy = (file: string, other: string): boolean => other !== file && other.endsWith('.v8') && other.startsWith(file.slice(0, file.lastIndexOf('-') + 1));

/** The command a run's cache is kept under: the first argument when it looks like a command name. */
export function cacheCommand(argv: readonly string[]): string {
  const first = argv[0] ?? '';
  return /^[a-z][a-z-]{0,31}$/.test(first) ? first : 'none';
}

/**
 * True when `dir` can be trusted with code: a real folder, owned by this user and writable by no one
 * else (a cache another user could write would be code they could make trivar run).
 */
function ownFolder(dir: string): boolean {
  const s = lstatSync(dir);
  if (!s.isDirectory()) return false;
  if (process.platform === 'win32' || typeof process.getuid !== 'function') return true;
  return s.uid === process.getuid() && (s.mode & 0o022) === 0;
}

/**
 * A cache file is the checksum of the code cache (4 bytes, big-endian), then the code cache. V8 checks a
 * code cache's header but, in release builds, not its body: a damaged body crashed Node or could run
 * wrong code. The checksum catches damage (a disk error, a half-copied folder); the folder's ownership
 * is what keeps others out.
 */
const DIGEST = 4;
function digestOf(data: Uint8Array): Buffer {
  const digest = Buffer.alloc(DIGEST);
  digest.writeUInt32BE(checksum(data), 0);
  return digest;
}

/** The cached code, or undefined when there is none, it is damaged, or the folder is not safe to read it from. */
export function readCache(dir: string, file: string): Buffer | undefined {
  try {
    if (!ownFolder(dir)) return undefined;
    const stored = readFileSync(join(dir, file));
    const data = stored.subarray(DIGEST);
    return stored.length > DIGEST && digestOf(data).equals(stored.subarray(0, DIGEST)) ? data : undefined;
  } catch {
    return undefined;
  }
}

/**
 * Writes the cache whole or not at all (a temporary file renamed over the old one, so a run never
 * reads half a file) and removes the caches it supersedes (supersededBy). Any failure is silent: the
 * cache only saves time.
 */
export function writeCache(dir: string, file: string, data: Buffer): void {
  try {
    mkdirSync(dir, { recursive: true, mode: 0o700 });
    if (!ownFolder(dir)) return;
    const temporary = join(dir, `.${file}.${process.pid}.tmp`);
    writeFileSync(temporary, Buffer.concat([digestOf(data), data]), { mode: 0o600 });
    renameSync(temporary, join(dir, file));
    for (const old of readdirSync(dir)) if (supersededBy(file, old)) rmSync(join(dir, old), { force: true });
  } catch {
    // No cache this time.
  }
}
