// Builds what Node 20 runs: the bundled CLI and core's ESM entry with type declarations.
// esbuild bundles only the mathjs factories core imports, which keeps CLI start-up short.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { chmodSync } from 'node:fs';

const requireShim = "import{createRequire as __trivarRequire}from'node:module';const require=__trivarRequire(import.meta.url);";

await build({
  entryPoints: ['packages/cli/src/main.ts'],
  outfile: 'packages/cli/dist/trivar.js',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'esm',
  minify: true,
  legalComments: 'none',
  banner: { js: requireShim },
  logLevel: 'warning',
});
chmodSync('packages/cli/bin/trivar.js', 0o755);

// Worker thread of `trivar profile` (reads half of a large interval-data file), beside the CLI bundle.
await build({
  entryPoints: ['packages/cli/src/profileWorker.ts'],
  outfile: 'packages/cli/dist/profile-worker.js',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'esm',
  minify: true,
  legalComments: 'none',
  banner: { js: requireShim },
  logLevel: 'warning',
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
