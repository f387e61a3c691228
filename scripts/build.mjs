// Builds what Node 20 runs: the bundled CLI and core's ESM entry with type declarations.
// esbuild bundles only the mathjs factories core imports, which keeps CLI start-up short.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { chmodSync, readFileSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';

const requireShim = "import{createRequire as __trivarRequire}from'node:module';const require=__trivarRequire(import.meta.url);";

/**
 * Rewrites `import { a, b } from '@trivar/core'` (and `export { … } from`) in the CLI's sources to imports from the core
 * modules that define a and b (read off core's index.ts, which only re-exports). With code
 * splitting esbuild places a module in every chunk whose entry reaches it through the import
 * graph, whichever exports are used: through the index, every command reached all of core and
 * `trivar solve` loaded the correction, harmonic, profile and drawing code. (Bundlers call this
 * barrel-file optimisation.) A name the index does not export stops the build.
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

// ESM with code splitting: each command (imported on demand in program.ts) is its own chunk beside
// trivar.js, so start-up parses only what the command runs. Old chunks are cleared first.
rmSync('packages/cli/dist', { recursive: true, force: true });
/** What every CLI bundle shares: one minified ESM file set for Node 20, with `require` available. */
const cliBundle = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'esm',
  minify: true,
  legalComments: 'none',
  banner: { js: requireShim },
  logLevel: 'warning',
};
await build({
  ...cliBundle,
  entryPoints: { trivar: 'packages/cli/src/main.ts' },
  outdir: 'packages/cli/dist',
  splitting: true,
  chunkNames: '[name]-[hash]',
  plugins: [coreImportsByModule()],
});
chmodSync('packages/cli/bin/trivar.js', 0o755);

// Worker thread of `trivar profile` (reads half of a large interval-data file), beside the CLI bundle.
await build({
  ...cliBundle,
  entryPoints: ['packages/cli/src/profileWorker.ts'],
  outfile: 'packages/cli/dist/profile-worker.js',
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
