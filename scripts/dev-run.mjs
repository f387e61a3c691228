// Runs a TypeScript file against core's source (Node 20 cannot run .ts): bundles it to a
// temporary file with esbuild, then imports it. Usage: node scripts/dev-run.mjs file.ts [args]
import { build } from 'esbuild';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const [entry, ...args] = process.argv.slice(2);
if (!entry) throw new Error('usage: node scripts/dev-run.mjs file.ts [args]');
const outfile = join(mkdtempSync(join(tmpdir(), 'trivar-')), 'run.mjs');
await build({
  entryPoints: [resolve(entry)],
  outfile,
  bundle: true,
  platform: 'node',
  format: 'esm',
  logLevel: 'error',
  banner: { js: "import{createRequire as __r}from'node:module';const require=__r(import.meta.url);" },
});
process.argv = [process.argv[0], outfile, ...args];
await import(pathToFileURL(outfile).href);
