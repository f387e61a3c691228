/**
 * The layer rule of DEVELOPERS.md, read from the code's own imports: each
 * layer of @trivar/core imports only its own layer and those below it, and
 * core imports no Node module, no CLI and no package it does not declare.
 *
 *   index.ts ─▶ boardFile/ ─▶ render/ ─▶ studies ─▶ analysis/ ─▶ network/ ─▶ board/ ─▶ _internal/ ─▶ complex.ts, errors.ts
 *
 * The studies (correction/, harmonics/, profile/, rebalance/, handCheck/) share a
 * layer: one study may build on another (harmonics on correction), never on
 * render/ or on the file schema that composes them all (boardFile/).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readImportGraph, resolveRelative, type ImportEdge, type ImportGraph } from '../support/importGraph.js';

const CORE = new URL('../../packages/core/', import.meta.url);
const SOURCE_ROOT = fileURLToPath(new URL('src/', CORE));

/** Lowest first. A place is a folder (with its sub-folders) or one file of src/. */
const LAYERS: readonly { readonly name: string; readonly places: readonly string[] }[] = [
  { name: 'foundation', places: ['complex.ts', 'errors.ts'] },
  { name: 'shared numerics', places: ['_internal/'] },
  { name: 'board', places: ['board/'] },
  { name: 'network', places: ['network/'] },
  { name: 'analysis', places: ['analysis/'] },
  { name: 'studies', places: ['correction/', 'harmonics/', 'profile/', 'rebalance/', 'handCheck/'] },
  { name: 'render', places: ['render/'] },
  { name: 'board file', places: ['boardFile/'] },
  { name: 'public entry', places: ['index.ts', 'checkedHelpers.ts'] },
];

/**
 * Named exceptions to the rule, each with its reason; a stale one fails the test.
 * None today: keep it that way, or justify an entry here and in DEVELOPERS.md.
 */
const EXCEPTIONS: readonly { readonly from: string; readonly to: string; readonly why: string }[] = [];

const DECLARED_PACKAGES = new Set(Object.keys((JSON.parse(readFileSync(new URL('package.json', CORE), 'utf8')) as { dependencies: Record<string, string> }).dependencies));

function layerOf(file: string): number {
  return LAYERS.findIndex((layer) => layer.places.some((place) => (place.endsWith('/') ? file.startsWith(place) : file === place)));
}

/** The package a bare specifier names (`zod`, `@scope/name`), without any sub-path. */
const packageName = (specifier: string): string => specifier.split('/').slice(0, specifier.startsWith('@') ? 2 : 1).join('/');

/** Every import that breaks the rule, as `file → import: why`. */
function layerViolations({ files, edges }: ImportGraph): string[] {
  const problems: string[] = [];
  for (const file of files)
    if (layerOf(file) < 0) problems.push(`${file}: in no layer (put it in one of ${LAYERS.flatMap((l) => l.places).join(', ')})`);
  for (const { from, specifier, to } of edges) {
    const say = (why: string) => problems.push(`${from} → ${specifier}: ${why}`);
    if (to === null) {
      if (specifier.startsWith('node:')) say('core is pure: no Node modules (the CLI does the I/O)');
      else if (!DECLARED_PACKAGES.has(packageName(specifier))) say(`not a dependency of @trivar/core (declared: ${[...DECLARED_PACKAGES].join(', ')}); core never imports the CLI or Node built-ins`);
      continue;
    }
    if (to.startsWith('../')) {
      say('leaves core’s source (the CLI, tests or scripts are never imported by core)');
      continue;
    }
    const [a, b] = [layerOf(from), layerOf(to)];
    if (a < 0 || b < 0 || b <= a) continue;
    if (EXCEPTIONS.some((x) => x.from === from && x.to === to)) continue;
    say(`${LAYERS[a]!.name} may not import ${LAYERS[b]!.name} (a higher layer)`);
  }
  return problems;
}

describe('layer direction of @trivar/core', () => {
  const graph = readImportGraph(SOURCE_ROOT);
  const { edges } = graph;

  it('reads the real import graph (a sanity check on the reader itself)', () => {
    // Known imports of each kind: a plain import, an `import type`, and one across layers going down.
    expect(edges).toContainEqual({ from: 'board/boardSchema.ts', specifier: 'zod', to: null });
    expect(edges).toContainEqual(expect.objectContaining({ from: 'boardFile/correctionSection.ts', to: 'correction/correctionSpec.ts' }));
    expect(edges).toContainEqual(expect.objectContaining({ from: 'harmonics/harmonicsSpec.ts', to: 'board/boardSchema.ts' }));
    expect(graph.files).toContain('complex.ts'); // a file with no imports is still judged
    expect(graph.files.length).toBeGreaterThan(150);
  });

  it('every import points to the same layer or a lower one, and core imports only its declared packages', () => {
    const problems = layerViolations(graph);
    expect(problems, `imports against the layer rule (DEVELOPERS.md, "Layers"):\n  ${problems.join('\n  ')}`).toEqual([]);
  });

  it('every named exception still matches an import (no stale exceptions)', () => {
    const stale = EXCEPTIONS.filter((x) => !edges.some((e) => e.from === x.from && e.to === x.to));
    expect(stale).toEqual([]);
  });

  it('flags each kind of violation with the file and the import', () => {
    const edge = (from: string, specifier: string): ImportEdge => ({ from, specifier, to: resolveRelative(from, specifier) });
    const edges = [
      edge('board/boardSchema.ts', '../correction/correctionSpec.js'),
      edge('harmonics/studyHarmonics.ts', '../render/palette.js'),
      edge('correction/_internal/sizeBank.ts', '../../boardFile/validateBoard.js'),
      edge('network/circuit.ts', 'node:fs'),
      edge('analysis/readLoads.ts', '@trivar/cli'),
      edge('render/svgText.ts', '../../cli/src/io.js'),
      edge('stray.ts', './complex.js'),
      // Allowed: down a layer, within a layer, between studies, a declared package.
      edge('network/circuit.ts', '../board/boardModel.js'),
      edge('harmonics/correctWithHarmonics.ts', '../correction/correctBoard.js'),
      edge('boardFile/validateBoard.ts', 'zod'),
    ];
    const problems = layerViolations({ files: [...new Set(edges.map((e) => e.from))], edges });
    expect(problems).toEqual([
      'stray.ts: in no layer (put it in one of complex.ts, errors.ts, _internal/, board/, network/, analysis/, correction/, harmonics/, profile/, rebalance/, handCheck/, render/, boardFile/, index.ts, checkedHelpers.ts)',
      'board/boardSchema.ts → ../correction/correctionSpec.js: board may not import studies (a higher layer)',
      'harmonics/studyHarmonics.ts → ../render/palette.js: studies may not import render (a higher layer)',
      'correction/_internal/sizeBank.ts → ../../boardFile/validateBoard.js: studies may not import board file (a higher layer)',
      'network/circuit.ts → node:fs: core is pure: no Node modules (the CLI does the I/O)',
      'analysis/readLoads.ts → @trivar/cli: not a dependency of @trivar/core (declared: yaml, zod); core never imports the CLI or Node built-ins',
      'render/svgText.ts → ../../cli/src/io.js: leaves core’s source (the CLI, tests or scripts are never imported by core)',
    ]);
  });
});
