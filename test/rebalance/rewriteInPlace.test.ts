/**
 * A rewritten file differs from the file read only in the moved loads' connection values: comments,
 * one-line flow mappings and lists, quoting, CRLF line breaks and compact JSON are kept byte for byte, so a
 * contractor's diff shows the moves and nothing else. Invented boards.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { rewriteBoardText } from '@trivar/core';
import { runTrivar } from '../cli/runTrivar.js';

/** Indices of the lines that differ (the texts keep their line count). */
function changedLines(before: string, after: string): number[] {
  const a = before.split('\n');
  const b = after.split('\n');
  expect(b.length).toBe(a.length);
  return a.flatMap((line, k) => (line === b[k] ? [] : [k]));
}

const boathouse = [
  '# Boathouse board: surveyed in spring',
  'name: Heron Reach boathouse',
  'supply: { voltage: 230/400, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }',
  'rebalance:',
  '  pinned: [Slipway winch]   # the winch stays on its own line',
  'loads:',
  '  - { name: Slipway winch, connection: A-N, kW: 3, pf: 0.8 }',
  '  - { name: Boat heaters, connection: "A-N", kW: 6 }',
  '  - name: Club room',
  "    connection: 'A-N'   # moved in 2019",
  '    kW: 5',
  '  - { name: Dock lights, connection: B-N, kW: 0.6 }',
  '  - { name: Compressor, connection: A-B, kW: 4, pf: 0.85 }',
  '',
].join('\n');

describe('rewriteBoardText keeps every byte but the moved values', () => {
  it('flow, quoted and commented YAML: only the two moved lines change, each quoted as it was', () => {
    const out = rewriteBoardText(boathouse, [
      { listPosition: 2, name: 'Boat heaters', to: 'B-N' },
      { listPosition: 3, name: 'Club room', to: 'C-N' },
    ]);
    expect(changedLines(boathouse, out)).toEqual([7, 9]);
    expect(out.split('\n')[7]).toBe('  - { name: Boat heaters, connection: "B-N", kW: 6 }');
    expect(out.split('\n')[9]).toBe("    connection: 'C-N'   # moved in 2019");
    expect(out.length).toBe(boathouse.length);
  });

  it('CRLF line breaks and a line-to-line move in L1/L2/L3 naming stay as written', () => {
    const crlf = boathouse.replace('connection: A-B', 'connection: L1-L2').replace(/connection: A-N, kW: 3/, 'connection: L1-N, kW: 3').replace(/"A-N"/, '"L1-N"').replace("'A-N'", "'L1-N'").replace('B-N, kW: 0.6', 'L2-N, kW: 0.6').split('\n').join('\r\n');
    const out = rewriteBoardText(crlf, [{ listPosition: 5, name: 'Compressor', to: 'B-C' }]);
    expect(out).toBe(crlf.replace('connection: L1-L2', 'connection: L2-L3'));
  });

  it('compact JSON stays compact: one value changes', () => {
    const json = '{"name":"Heron Reach boathouse","supply":{"voltage":"230/400","frequencyHz":50},"loads":[{"name":"Boat heaters","connection":"A-N","kW":6},{"name":"Dock lights","connection":"B-N","kW":0.6}]}';
    expect(rewriteBoardText(json, [{ listPosition: 1, name: 'Boat heaters', to: 'C-N' }])).toBe(json.replace('"connection":"A-N"', '"connection":"C-N"'));
  });

  it('a connection written through an alias goes through the document model, still onto the new connection', () => {
    const aliased = 'x: &ln A-N\nloads:\n  - { name: Boat heaters, connection: *ln, kW: 6 }\n  - { name: Dock lights, connection: B-N, kW: 0.6 }\n';
    expect(rewriteBoardText(aliased, [{ listPosition: 1, name: 'Boat heaters', to: 'C-N' }])).toContain('{ name: Boat heaters, connection: C-N, kW: 6 }');
  });

  it('an anchored value moves alone: the loads written through its alias keep their connection, in the file\'s naming', () => {
    // A pottery in L1/L2/L3 naming: the wheel's connection is anchored, the kiln and the glaze mixer take it by alias.
    const anchored = [
      'loads:',
      '  - { name: Wheel, connection: &first L1-N, kW: 9 }',
      '  - { name: Kiln, connection: *first, kW: 9 }',
      '  - { name: Glaze mixer, connection: *first, kW: 4, pf: 0.8 }',
      '',
    ].join('\n');
    const out = rewriteBoardText(anchored, [
      { listPosition: 1, name: 'Wheel', to: 'C-N' },
      { listPosition: 2, name: 'Kiln', to: 'B-N' },
    ]);
    // Before: the wheel's move rewrote the anchor (the mixer moved with it), and the kiln's alias was written "B-N" in an L1/L2/L3 file.
    expect(out).toContain('{ name: Wheel, connection: L3-N, kW: 9 }');
    expect(out).toContain('{ name: Kiln, connection: L2-N, kW: 9 }');
    expect(out).toContain('{ name: Glaze mixer, connection: L1-N, kW: 4, pf: 0.8 }');
  });

  it('trivar rebalance --write: the diff touches the moved loads\' lines only', () => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-inplace-'));
    const input = join(dir, 'boathouse.yaml');
    const out = join(dir, 'boathouse-moved.yaml');
    writeFileSync(input, boathouse);
    const r = runTrivar(['rebalance', input, '--json', '--no-table', '--write', out]);
    expect(r.code).toBe(0);
    const moves = (JSON.parse(r.stdout) as { moves: { name: string; listPosition: number }[] }).moves;
    expect(moves.length).toBeGreaterThan(0);
    const written = readFileSync(out, 'utf8');
    const lines = boathouse.split('\n');
    const changedNames = changedLines(boathouse, written).map((k) => {
      // A block-style load's connection sits below its name.
      for (let at = k; at >= 0; at--) {
        const name = /name: ([^,}]+)/.exec(lines[at]!);
        if (name) return name[1]!.trim();
      }
      return null;
    });
    expect(changedNames.sort()).toEqual(moves.map((m) => m.name).sort());
    expect(written.split('\n')[0]).toBe('# Boathouse board: surveyed in spring');
  });
});
