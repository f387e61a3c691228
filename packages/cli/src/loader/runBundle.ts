/**
 * dist/trivar.js (CommonJS): runs the CLI bundle (dist/trivar-bundle.js) through vm.Script with V8's code cache
 * (codeCache.ts). Why not plain ESM chunks: Node 20 has no compile cache for ES modules
 * (module.enableCompileCache is Node 22), and resolving, reading, compiling and linking some 60 chunks
 * was a third of `trivar correct`'s start-up. The bundle is one function expression (build.mjs wraps
 * it), so the file is compiled as it is and V8's coverage offsets are file offsets.
 *
 * The cache is written after a run that did its work (exit 0, or 5 from `trivar correct`): then it
 * holds every function the command ran. A cache V8 rejects (another V8 or other flags, a damaged file)
 * is simply not used, and the run writes a fresh one.
 */
import { readFileSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Script } from 'node:vm';
import { cacheCommand, cacheDirectory, cacheFileName, readCache, writeCache } from './codeCache.js';

/** The SHA-256 of the bundle's text, written in by build.mjs. */
declare const TRIVAR_BUNDLE_HASH: string;

/** What the bundle is called with: CommonJS's module parameters and its own URL (the parameters build.mjs's wrapper declares). */
type BundleFunction = (exports: object, require: NodeJS.Require, module: { exports: object }, filename: string, dirname: string, bundleUrl: string) => void;

// No V8 flags are set here. Tried 2026-12-03: v8.setFlagsFromString('--no-turbo-inlining') before the
// bundle is compiled (the code cache is still accepted on the next run). Wall time, 25 interleaved runs
// each, medians, own cache folder per variant, on 2 cores at a 1-min load average of 5.2-9.0 (so noisy):
// correct corner-bakery 1290 -> 1012 ms, hillside 1402 -> 1190, riverside 976 -> 938, but harbour-cottages
// 563 -> 727, solve of a 1,000-load board 911 -> 978, profile osier-mill day 996 -> 1143, and profile of a
// year of 1-minute data (quay-street-flats) 24.8/25.7/21.6 -> 44.6/36.7/27.9 s: long runs lose the inlined
// optimised code. Not a clear net win, so not kept.
// Nor a V8 start-up snapshot (node --build-snapshot, Node 20). Tried 2026-12-04: the bundle built into a
// snapshot, once with only its modules initialised and once after a solve and a correction had run in the
// builder; run as `node --snapshot-blob <blob> solve …`. 15 interleaved runs, medians, bare node 23.7 ms:
// solve of a 1,000-load board 91.1 ms here, 105.1 / 100.2 ms from the snapshots; correct hillside-workshop
// 142.7 ms here, 160.6 / 144.6 ms. A snapshot keeps no compiled code (every function is compiled again on
// first call), while the code cache below hands V8 the bytecode of every function the command ran.
// Built as CommonJS (build.mjs): __dirname is dist/.
const bundlePath = join(__dirname, 'trivar-bundle.js');
const bytes = readFileSync(bundlePath);
const command = cacheCommand(process.argv.slice(2));
const dir = cacheDirectory();
const stat = dir === null ? null : statSync(bundlePath);
const file = stat === null ? '' : cacheFileName(`${TRIVAR_BUNDLE_HASH}:${stat.size}:${stat.mtimeMs}`, command, bundlePath);
const cachedData = dir === null ? undefined : readCache(dir, file);
// esbuild writes ASCII only (non-ASCII characters as escapes), so latin1 is the exact and quickest decoding.
const script = new Script(bytes.toString('latin1'), { filename: bundlePath, ...(cachedData ? { cachedData } : {}) });
const run = script.runInThisContext() as BundleFunction;
if (dir !== null && (cachedData === undefined || script.cachedDataRejected === true))
  process.once('exit', (code) => {
    // 0: done; 5: `trivar correct` ran the study and the target is out of reach (exitCodes.ts, not imported: it loads core).
    if (code === 0 || code === 5) writeCache(dir, file, script.createCachedData());
  });
const module = { exports: {} };
run(module.exports, createRequire(bundlePath), module, bundlePath, dirname(bundlePath), pathToFileURL(bundlePath).href);
