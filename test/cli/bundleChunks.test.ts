/**
 * The built CLI loads only what a command runs: `trivar solve` and `trivar --version` never
 * parse the correction study, the reports or the profile reader (start-up time, see
 * DEVELOPERS.md "CLI bundle"). Checked on the built chunks by following their static imports.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ROOT } from './runTrivar.js';

const DIST = `${ROOT}packages/cli/dist/`;

/** Text of every chunk a file loads before it runs (static imports, not `import()`). */
function loadedText(start: string): string {
  const seen = new Set<string>();
  const visit = (file: string) => {
    if (seen.has(file)) return;
    seen.add(file);
    for (const m of readFileSync(DIST + file, 'utf8').matchAll(/(?:from|import)\s*"\.\/([^"]+\.js)"/g)) visit(m[1]!);
  };
  visit('trivar.js');
  visit(start);
  return [...seen].map((f) => readFileSync(DIST + f, 'utf8')).join('\n');
}
const chunkOf = (command: string) => readdirSync(DIST).find((f) => f.startsWith(`${command}-`) && f.endsWith('.js'))!;

// Strings that only the named code holds (they survive minification).
const CORRECTION = 'the board already meets the target: nothing to add';
const CSV_READER = 'the interval data cannot be read';
const BOARD_SCHEMA = 'the circuits on the board'; // a description in boardSchema.ts (zod)
const YAML_READER = 'a second YAML document starts here'; // readBoardText.ts's wording of yaml's errors
const HARMONIC_CORRECTION = 'The harmonic check below covers the spectra entered in the board file'; // correctWithHarmonics.ts

describe('CLI chunks', () => {
  it('each command is a chunk of its own, loaded on demand', () => {
    for (const command of ['solve', 'correct', 'profile', 'harmonics', 'rebalance', 'diagram', 'report', 'check', 'schema']) expect(chunkOf(command)).toBeDefined();
    expect(readFileSync(DIST + 'trivar.js', 'utf8')).toContain(`import("./${chunkOf('solve')}")`);
  });
  it('solve and start-up load no correction or profile code; correct does load the correction study', () => {
    expect(loadedText(chunkOf('solve'))).not.toContain(CORRECTION);
    expect(loadedText(chunkOf('solve'))).not.toContain(CSV_READER);
    expect(loadedText('trivar.js')).not.toContain(CORRECTION);
    expect(loadedText(chunkOf('correct'))).toContain(CORRECTION);
    expect(loadedText(chunkOf('profile'))).toContain(CSV_READER);
  });
  it('solve loads no schema: a well-formed board is checked without zod, the schemas come on demand', () => {
    expect(loadedText(chunkOf('solve'))).not.toContain(BOARD_SCHEMA);
    expect(loadedText(chunkOf('solve'))).not.toMatch(/\bZodError\b/);
    expect(loadedText(chunkOf('schemaChecks'))).toContain(BOARD_SCHEMA);
    expect(readFileSync(DIST + chunkOf('solve'), 'utf8')).toContain(`import("./${chunkOf('schemaChecks')}")`);
  });
  it('correct loads no yaml and no harmonic study: both come on demand, for files that need them', () => {
    expect(loadedText(chunkOf('correct'))).not.toContain(YAML_READER);
    expect(loadedText(chunkOf('correct'))).not.toContain(HARMONIC_CORRECTION);
    expect(loadedText(chunkOf('correctWithHarmonicData'))).toContain(HARMONIC_CORRECTION);
    // (the command's code sits in a chunk it shares with `trivar report`)
    expect(loadedText(chunkOf('correct'))).toContain(`import("./${chunkOf('yamlReading')}")`);
    expect(loadedText(chunkOf('correct'))).toContain(`import("./${chunkOf('correctWithHarmonicData')}")`);
  });
  it('solve loads no yaml: JSON and plain YAML are read without it, yaml comes on demand', () => {
    expect(loadedText(chunkOf('solve'))).not.toContain(YAML_READER);
    expect(loadedText(chunkOf('solve'))).not.toContain('MULTIPLE_DOCS');
    expect(loadedText(chunkOf('yamlReading'))).toContain(YAML_READER);
    expect(loadedText(chunkOf('yamlReading'))).toContain('MULTIPLE_DOCS');
    expect(readFileSync(DIST + chunkOf('solve'), 'utf8')).toContain(`import("./${chunkOf('yamlReading')}")`);
  });
});
