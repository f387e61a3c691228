// Builds what Node 20 runs: the bundled CLI and core's ESM entry with type declarations.
// esbuild bundles only the mathjs factories core imports, which keeps CLI start-up short.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { chmodSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';

const requireShim = "import{createRequire as __trivarRequire}from'node:module';const require=__trivarRequire(import.meta.url);";

/**
 * Rewrites `import { a, b } from '@trivar/core'` (and `export { … } from`) in the CLI's sources to imports from the core
 * modules that define a and b (read off core's index.ts, which only re-exports). A module that
 * imports the index initialises every module the index reaches, whichever exports it uses: through
 * it, every command's start-up (main.ts → exitCodes.ts) initialised all of core, zod's schemas
 * included. (Bundlers call this barrel-file optimisation.) A name the index does not export stops
 * the build.
 */
function coreImportsByModule() {
  const index = resolve('packages/core/src/index.ts');
  const home = new Map();
  for (const m of readFileSync(index, 'utf8').matchAll(/^export\s+\{([^}]*)\}\s+from\s+'([^']+)';/gm))
    for (const name of m[1].split(',').map((n) => n.trim()).filter(Boolean)) {
      if (name.includes(' as ')) throw new Error(`build: renamed export "${name}" in core's index.ts is not handled`);
      home.set(name, resolve('packages/core/src', m[2].replace(/\.js$/, '.ts')));
    }
  return {
    name: 'core-imports-by-module',
    setup(b) {
      b.onLoad({ filter: /[\\/]packages[\\/]cli[\\/]src[\\/].*\.ts$/ }, (args) => {
        const source = readFileSync(args.path, 'utf8');
        const contents = source.replace(/^(import|export)\s+\{([^}]*)\}\s+from\s+'@trivar\/core';/gm, (_, keyword, list) => {
          const byFile = new Map();
          for (const spec of list.split(',').map((n) => n.trim()).filter((n) => n && !n.startsWith('type '))) {
            const file = home.get(spec);
            if (!file) throw new Error(`build: ${args.path} imports "${spec}", which core's index.ts does not export as a value`);
            byFile.set(file, [...(byFile.get(file) ?? []), spec]);
          }
          return [...byFile].map(([file, names]) => `${keyword} { ${names.join(', ')} } from ${JSON.stringify(file)};`).join(' ');
        });
        const left = contents.split('\n').find((line) => /from\s+'@trivar\/core'/.test(line) && !/^(import|export)\s+type\s/.test(line));
        if (left) throw new Error(`build: ${args.path}: write core imports as "import { a, b } from '@trivar/core';" (or import type), so they can be resolved per module: ${left}`);
        return { contents, loader: 'ts' };
      });
    },
  };
}

/**
 * commander requires node:child_process at load, for subcommands that are programs of their own (trivar
 * has none); loading it (with net, dgram and the socket code it pulls in) was about 30 M instructions of
 * every run. commander gets a stand-in whose spawn loads the real module when called.
 */
function lazyChildProcessForCommander() {
  return {
    name: 'lazy-child-process-for-commander',
    setup(b) {
      b.onResolve({ filter: /^(node:)?child_process$/ }, (args) =>
        /[\\/]commander[\\/]/.test(args.importer) ? { path: 'child_process', namespace: 'trivar-lazy-builtin' } : undefined,
      );
      b.onLoad({ filter: /.*/, namespace: 'trivar-lazy-builtin' }, () => ({
        contents: "module.exports = { spawn: (...args) => require('node:child_process').spawn(...args) };",
        loader: 'js',
      }));
    },
  };
}

// The CLI is one bundle, dist/trivar-bundle.js, run by a small loader, dist/trivar.js (src/loader/), through
// vm.Script with V8's code cache. Node 20 caches no compiled code for ES modules, and as ~60 ESM chunks
// the CLI spent a third of `trivar correct`'s start-up resolving, reading, compiling and linking them.
// The bundle is CommonJS-style code (format cjs) wrapped in one function expression:
//   (function (exports, require, module, __filename, __dirname, __trivarBundleUrl) {"use strict"; ... })
// "use strict" keeps the semantics of the ES modules it is made of; import.meta.url becomes the
// bundle's URL (the profile worker is found beside it). Each command's code still evaluates only when
// that command runs: esbuild turns program.ts's `await import()` of a bundled module into a call of
// that module's lazy initialiser, so `trivar solve` never builds the correction, harmonic or schema code.
rmSync('packages/cli/dist', { recursive: true, force: true });
/** What every CLI bundle shares: minified, for Node 20, no comments kept. */
const nodeBundle = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  minify: true,
  legalComments: 'none',
  logLevel: 'warning',
};
const cli = await build({
  ...nodeBundle,
  entryPoints: ['packages/cli/src/main.ts'],
  outfile: 'packages/cli/dist/trivar-bundle.js',
  format: 'cjs',
  define: { 'import.meta.url': '__trivarBundleUrl' },
  banner: { js: '(function (exports, require, module, __filename, __dirname, __trivarBundleUrl) {"use strict";' },
  footer: { js: '\n})' },
  metafile: true,
  plugins: [coreImportsByModule(), lazyChildProcessForCommander()],
});
// vm.Script gets no module loader: an import() left in the bundle (of a file outside it) could not run.
for (const [file, output] of Object.entries(cli.metafile.outputs))
  for (const left of output.imports.filter((i) => i.kind === 'dynamic-import'))
    throw new Error(`build: ${file} keeps import("${left.path}"); import only files the bundle can hold`);
// The loader names its code cache after the bundle's hash (loader/codeCache.ts).
const bundleHash = createHash('sha256').update(readFileSync('packages/cli/dist/trivar-bundle.js')).digest('hex');
// CommonJS, like bin/trivar.js that requires it (dist/package.json, bin/package.json): an ES module entry
// starts Node's ES module loader, about 5 ms of every run (a tenth of `trivar --version`).
writeFileSync('packages/cli/dist/package.json', `${JSON.stringify({ type: 'commonjs' })}\n`);
await build({
  ...nodeBundle,
  entryPoints: ['packages/cli/src/loader/runBundle.ts'],
  outfile: 'packages/cli/dist/trivar.js',
  format: 'cjs',
  define: { TRIVAR_BUNDLE_HASH: JSON.stringify(bundleHash) },
});
chmodSync('packages/cli/bin/trivar.js', 0o755);

// Worker thread of `trivar profile` (reads half of a large interval-data file), beside the CLI bundle.
await build({
  ...nodeBundle,
  format: 'esm',
  banner: { js: requireShim },
  entryPoints: ['packages/cli/src/profileWorker.ts'],
  outfile: 'packages/cli/dist/profile-worker.mjs',
});

await build({
  entryPoints: ['packages/core/src/index.ts'],
  outfile: 'packages/core/dist/index.js',
  bundle: true,
  platform: 'neutral',
  target: 'node20',
  format: 'esm',
  packages: 'external',
  logLevel: 'warning',
});
execFileSync(process.execPath, ['node_modules/typescript/bin/tsc', '-p', 'packages/core/tsconfig.build.json'], { stdio: 'inherit' });
