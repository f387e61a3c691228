/**
 * The import graph of @trivar/core's source, read with TypeScript's own
 * pre-processor (`ts.preProcessFile`: every import, `export … from`, `import type`
 * and `import()` specifier, with comments and strings handled as the compiler
 * does) rather than a regular expression that a comment or template string fools.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, posix, relative, sep } from 'node:path';
import ts from 'typescript';

export interface ImportEdge {
  /** Importing file, relative to the source root, with forward slashes (`board/boardSchema.ts`). */
  readonly from: string;
  /** The specifier as written (`../correction/correctionSpec.js`, `zod`, `node:fs`). */
  readonly specifier: string;
  /** For a relative specifier: the imported file relative to the source root (`.js` → `.ts`); null for a package. */
  readonly to: string | null;
}

function sourceFiles(root: string, dir = root): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(root, path);
    return entry.name.endsWith('.ts') ? [relative(root, path).split(sep).join('/')] : [];
  });
}

export interface ImportGraph {
  /** Every `.ts` file under the root, relative to it. */
  readonly files: readonly string[];
  readonly edges: readonly ImportEdge[];
}

/** Every import of every `.ts` file under `root`. */
export function readImportGraph(root: string): ImportGraph {
  const files = sourceFiles(root);
  const edges = files.flatMap((from) => {
    const info = ts.preProcessFile(readFileSync(join(root, from), 'utf8'), true, true);
    return info.importedFiles.map(({ fileName: specifier }) => ({ from, specifier, to: resolveRelative(from, specifier) }));
  });
  return { files, edges };
}

/** `../x/y.js` from `a/b.ts` → `x/y.ts`; a path that leaves the root keeps its `../` so rules can see it. */
export function resolveRelative(from: string, specifier: string): string | null {
  if (!specifier.startsWith('.')) return null;
  return posix.join(posix.dirname(from), specifier).replace(/\.js$/, '.ts');
}
