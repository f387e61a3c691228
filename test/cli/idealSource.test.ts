/**
 * A supply given only by its voltage is ideal (zero source impedance): solve says so in one line and
 * speaks of no source windings where it lists the losses; a supply with a transformer keeps them.
 * Invented scenario: a kiosk row on a 230/400 V supply, with and without its 63 kVA transformer.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readBoardText, solveInstallation } from '@trivar/core';
import { runTrivar } from './runTrivar.js';

const dir = mkdtempSync(join(tmpdir(), 'trivar-ideal-source-'));
const write = (name: string, text: string): string => {
  const file = join(dir, name);
  writeFileSync(file, text);
  return file;
};
const kiosks = (supplyExtra: string) =>
  [
    'name: Kiosk row',
    `supply: { voltage: 230/400, frequencyHz: 50${supplyExtra} }`,
    'boards:',
    '  - name: Row board',
    '    loads: [ { name: Coffee, connection: L1-N, kW: 6 } ]',
    '  - name: Stall 4',
    '    fedFrom: Row board',
    '    feeder: { lengthM: 15, line: { mm2: 10 }, neutral: { mm2: 10 } }',
    '    loads: [ { name: Fridge, connection: L2-N, kW: 1.2, pf: 0.85 } ]',
    '',
  ].join('\n');
const ideal = write('ideal.yaml', kiosks(''));
const transformer = write('transformer.yaml', kiosks(', transformer: { kVA: 63, impedancePercent: 4, xOverR: 2 }'));

describe('an ideal source', () => {
  it('is marked on the main board only, and not where a transformer is given', () => {
    const r = solveInstallation(readBoardText(kiosks('')));
    expect(r.boards.map((b) => b.result.board.idealSource)).toEqual([true, undefined]);
    expect(solveInstallation(readBoardText(kiosks(', transformer: { kVA: 63, impedancePercent: 4, xOverR: 2 }'))).boards[0]!.result.board.idealSource).toBeUndefined();
  });

  it('solve says it in one line and names no source windings among the losses', () => {
    const out = runTrivar(['solve', ideal]).stdout;
    expect(out).toContain('  source      ideal (zero source impedance: no transformer or impedance given): nominal voltage at\n              its terminals whatever the load, so no drop or loss before the service feeder\n');
    expect(out).toMatch(/ {2}losses {6}0\.0\d\d kW {2}\(every feeder\)\n/);
    expect(out).not.toContain('source windings');
    const board = runTrivar(['solve', ideal, '--board', 'Row board']).stdout;
    expect(board).toMatch(/losses +0\.000 kW \(none in the ideal source; line conductors 0\.000, neutral 0\.000\)/);
    expect(board).toContain('source           ideal (zero source impedance: no transformer or impedance given)');
  });

  it('with a transformer: the source windings stay, and nothing is called ideal', () => {
    const out = runTrivar(['solve', transformer]).stdout;
    expect(out).toContain('(source windings and every feeder)');
    expect(out).not.toContain('ideal');
    expect(runTrivar(['solve', transformer, '--board', 'Row board']).stdout).toMatch(/losses +\d+\.\d{3} kW \(source \d+\.\d{3}, line conductors/);
  });

  it('the report words its losses alike: no source windings for an ideal source', () => {
    const out = join(dir, 'ideal.md');
    expect(runTrivar(['report', ideal, '--format', 'md', '-o', out]).code).toBe(0);
    const md = readFileSync(out, 'utf8');
    expect(md).toContain('- **Source:** ideal (zero source impedance)');
    expect(md).toMatch(/- \*\*Losses \(every feeder; the source is ideal\):\*\* 0\.0\d\d kW/);
    expect(md).toContain('Loss: conductor losses, the source being ideal (no windings to lose power in).');
    expect(md).not.toContain('source windings');
  });

  it('correct on an installation with an ideal source: the feeders’ note names no source windings either', () => {
    const chiller = write('chiller.yaml', kiosks('').replace('kW: 6 } ]', 'kW: 6 }, { name: Chiller, connection: L1L2L3-delta, kW: 8, pf: 0.75 } ]'));
    const out = runTrivar(['correct', chiller, '--board', 'Row board']).stdout;
    expect(out).toMatch(/loss: conductor losses, the\s+source being ideal \(no windings to lose power in\)/);
    expect(out).not.toContain('source windings');
  });
});
