/**
 * The built CLI evaluates only what a command runs: `trivar solve` on a well-formed board or installation
 * and `trivar --version` never build zod's schemas, yaml's reader or the correction study, and `trivar correct` builds the harmonic study
 * only for a board with harmonic data (start-up time, see DEVELOPERS.md "CLI bundle"). The bundle is one
 * file, so this is checked on what V8 ran: the CLI runs with NODE_V8_COVERAGE, and a marker string of a
 * module counts as evaluated when the innermost code range around it ran.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from './runTrivar.js';

const BUNDLE = `${ROOT}packages/cli/dist/trivar-bundle.js`;

// Strings that only the named code holds, in code that runs when its module is evaluated (they survive minification).
const ZOD = '__zod_globalRegistry'; // zod's registry, made when zod's core is evaluated
const BOARD_SCHEMA = 'the circuits on the board'; // boardSchema.ts, when the board-file schema is built
const CORRECTION_SCHEMA = 'lowest acceptable power factor, 0 < pf <= 1; default 0.95'; // correctionSpec.ts
const YAML = 'tag:yaml.org,2002:map'; // yaml's core schema
const HARMONIC_CORRECTION = 'The harmonic check of this correction covers the spectra entered in the '; // correctWithHarmonics.ts (harmonicsChecked)

interface Range {
  readonly startOffset: number;
  readonly endOffset: number;
  readonly count: number;
}

/** Runs the built CLI under V8 coverage; returns a test for "the code around this marker ran". */
function runCovered(args: readonly string[], input?: string): (marker: string) => boolean {
  const dir = mkdtempSync(join(tmpdir(), 'trivar-coverage-'));
  try {
    const r = spawnSync(process.execPath, [`${ROOT}packages/cli/bin/trivar.js`, ...args], {
      cwd: ROOT,
      input,
      encoding: 'utf8',
      env: { ...process.env, NODE_V8_COVERAGE: dir, TRIVAR_NO_CODE_CACHE: '1' },
    });
    expect(r.status, r.stderr).toBe(0);
    const scripts = readdirSync(dir).flatMap((f) => (JSON.parse(readFileSync(join(dir, f), 'utf8')) as { result: { url: string; functions: { ranges: Range[] }[] }[] }).result);
    const bundle = scripts.find((s) => s.url.endsWith('/trivar-bundle.js'));
    if (!bundle) throw new Error('no coverage of the bundle');
    const ranges = bundle.functions.flatMap((f) => f.ranges);
    const text = readFileSync(BUNDLE, 'latin1');
    return (marker) => {
      const at = text.indexOf(marker);
      if (at < 0) throw new Error(`marker not in the bundle: ${marker}`);
      const around = ranges.filter((x) => x.startOffset <= at && at < x.endOffset).sort((a, b) => a.endOffset - a.startOffset - (b.endOffset - b.startOffset))[0]!;
      return around.count > 0;
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe('what the CLI evaluates', () => {
  it('--version: no schema, yaml or study', () => {
    const ran = runCovered(['--version']);
    for (const marker of [ZOD, BOARD_SCHEMA, CORRECTION_SCHEMA, YAML, HARMONIC_CORRECTION]) expect(ran(marker), marker).toBe(false);
  });
  it('solve on a well-formed board: no zod, no yaml, no correction study', () => {
    const ran = runCovered(['solve', 'examples/corner-bakery.yaml']);
    for (const marker of [ZOD, BOARD_SCHEMA, CORRECTION_SCHEMA, YAML, HARMONIC_CORRECTION]) expect(ran(marker), marker).toBe(false);
  });
  it('solve on a well-formed installation: no zod; on a board with a correction section: that section\'s schema only', () => {
    const installation = runCovered(['solve', 'examples/maple-court-riser.yaml']);
    for (const marker of [ZOD, BOARD_SCHEMA, CORRECTION_SCHEMA, YAML, HARMONIC_CORRECTION]) expect(installation(marker), marker).toBe(false);
    const withCorrection = runCovered(['solve', 'examples/riverside-cold-store.yaml']);
    for (const marker of [ZOD, CORRECTION_SCHEMA]) expect(withCorrection(marker), marker).toBe(true);
    for (const marker of [BOARD_SCHEMA, YAML, HARMONIC_CORRECTION]) expect(withCorrection(marker), marker).toBe(false);
  });
  it('solve reads YAML outside the plain subset with yaml, which it evaluates then', () => {
    const text = readFileSync(`${ROOT}examples/corner-bakery.yaml`, 'utf8').replace(/^supply:/m, 'supply: &mains');
    const ran = runCovered(['solve', '-'], text);
    expect(ran(YAML)).toBe(true);
    expect(ran(ZOD)).toBe(false);
  });
  it('correct builds the correction schema, the board-file schema only for a file with other studies, and the harmonic study only for harmonic data', () => {
    // A board with only a correction section: the board read without zod, the section with its own schema.
    const ran = runCovered(['correct', 'examples/riverside-cold-store.yaml']);
    for (const marker of [ZOD, CORRECTION_SCHEMA]) expect(ran(marker), marker).toBe(true);
    for (const marker of [BOARD_SCHEMA, YAML, HARMONIC_CORRECTION]) expect(ran(marker), marker).toBe(false);
    const harmonic = runCovered(['correct', 'examples/mill-street-offices.yaml']);
    for (const marker of [BOARD_SCHEMA, HARMONIC_CORRECTION]) expect(harmonic(marker), marker).toBe(true);
  });
  it('solve loads neither node:crypto (the code cache is named and checked with zlib) nor child_process (commander gets it when it spawns)', () => {
    // A preload script reports, at exit, the Node builtins the run loaded.
    const dir = mkdtempSync(join(tmpdir(), 'trivar-builtins-'));
    try {
      const report = join(dir, 'report.cjs');
      writeFileSync(report, "process.on('exit', () => require('node:fs').writeFileSync(process.env.TRIVAR_TEST_BUILTINS, process.moduleLoadList.join('\\n')));");
      const out = join(dir, 'builtins.txt');
      for (const cache of ['cold', 'warm']) {
        const r = spawnSync(process.execPath, ['--require', report, `${ROOT}packages/cli/bin/trivar.js`, 'solve', 'examples/corner-bakery.yaml'], {
          cwd: ROOT,
          encoding: 'utf8',
          env: { ...process.env, TRIVAR_TEST_BUILTINS: out, TRIVAR_CODE_CACHE_DIR: join(dir, 'cache'), TRIVAR_NO_CODE_CACHE: '' },
        });
        expect(r.status, r.stderr).toBe(0);
        const loaded = readFileSync(out, 'utf8').split('\n');
        expect(loaded, cache).toContain('NativeModule fs');
        for (const module of ['NativeModule crypto', 'NativeModule child_process']) expect(loaded, cache).not.toContain(module);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
