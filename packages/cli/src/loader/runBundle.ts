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
import { setFlagsFromString } from 'node:v8';
import { Script } from 'node:vm';
import { cacheCommand, cacheDirectory, cacheFileName, readCache, writeCache } from './codeCache.js';

/** The SHA-256 of the bundle's text, written in by build.mjs. */
declare const TRIVAR_BUNDLE_HASH: string;

/** What the bundle is called with: CommonJS's module parameters and its own URL (the parameters build.mjs's wrapper declares). */
type BundleFunction = (exports: object, require: NodeJS.Require, module: { exports: object }, filename: string, dirname: string, bundleUrl: string) => void;

// No other V8 flags are set. Tried 2026-12-05, same method: a larger young generation (node
// --min-semi-space-size=4 or 16, --semi-space-growth-factor=4; a 1,000-load solve 73 -> 80-88 ms) and
// --no-parallel-scavenge, --no-concurrent-marking, --no-incremental-marking (no change beyond noise).
// Tried 2026-12-03: v8.setFlagsFromString('--no-turbo-inlining') before the
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
// V8 optimises a function once it has run through a budget of bytecode (--interrupt-budget, 66 KB in
// Node 20). Most of a CLI run is spent once, in code that is still cold: optimising it early costs
// compilations (on a second core shared with the garbage collector) and deoptimisations that a run of
// 50-150 ms does not earn back. A budget 4.4 x larger, measured 2026-12-05 (15 interleaved runs, medians,
// own cache folder per variant, bare node 20.5-22 ms): solve of a 1,000-load board 89.5 -> 72.6-78.3 ms,
// correct corner-bakery 111.0 -> 99.7-104.2 ms, hillside-workshop 138.8 -> 122.7-125.1 ms. Budgets of
// 200 k-1 M gave the same within noise; 30 k and 60 k were slower. Hot loops of long runs (a year of
// interval data, a rebalance search) still reach optimised code, a few milliseconds later. Set before the
// bundle is compiled, so the code cache (whose header records V8's flags) is made and read under it.
setFlagsFromString('--interrupt-budget=300000');
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
