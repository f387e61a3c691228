/**
 * Hostile and broken input, fed to the built binary as a user (or an attacker)
 * would. Every file is generated here, in a temporary directory. Each case
 * asserts the exit code, that stderr carries no stack trace, that the process
 * stays inside a small heap (a child with --max-old-space-size: running out
 * aborts with a signal, not the expected code), and that the message names the
 * field or the file and says what is accepted.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, openSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT } from './runTrivar.js';

const DIR = mkdtempSync(join(tmpdir(), 'trivar-hostile-'));
afterAll(() => rmSync(DIR, { recursive: true, force: true }));

/** Heap cap for every child: far below what the unguarded reads needed (1.7–4 GB). */
const HEAP_MB = 128;

interface Run {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
}

function runBin(args: readonly string[], stdin?: string | Buffer | 'dev-zero'): Run {
  const r = spawnSync(process.execPath, [`--max-old-space-size=${HEAP_MB}`, `${ROOT}packages/cli/bin/trivar.js`, ...args], {
    cwd: ROOT,
    input: stdin === 'dev-zero' ? undefined : stdin,
    stdio: stdin === 'dev-zero' ? [openSync('/dev/zero', 'r'), 'pipe', 'pipe'] : 'pipe',
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
    timeout: 60_000,
  });
  return { code: r.status, signal: r.signal, stdout: r.stdout, stderr: r.stderr };
}

const file = (name: string, content: string | Buffer): string => {
  const path = join(DIR, name);
  writeFileSync(path, content);
  return path;
};

const SUPPLY = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }';
const board = (loads: string, extra = '') => `${SUPPLY}\n${extra}loads:\n${loads}\n`;
const TX100 = 'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }';
const oneLoad = board('  - { name: oven, connection: A-N, kW: 2, pf: 1 }');

interface Case {
  readonly name: string;
  /** Arguments after the command; `{file}` is replaced by the generated file's path. */
  readonly args: () => string[];
  readonly stdin?: string | Buffer | 'dev-zero';
  readonly code: number;
  /** What the message must say: the field or file, and the cause. */
  readonly says: RegExp[];
  /** What stdout must (and must not) say, for cases that print a report. */
  readonly prints?: RegExp[];
  readonly neverPrints?: RegExp[];
}

const aliasLoads = Array.from({ length: 100 }, (_, k) => `  - { name: 'circuit ${k}', connection: A-N, kW: 1, pf: ${k === 0 ? '&pf 0.9' : '*pf'} }`).join('\n');
const laughs = ['a0: &a0 [x, x, x, x, x, x, x, x, x, x]', ...Array.from({ length: 9 }, (_, k) => `a${k + 1}: &a${k + 1} [${Array(10).fill(`*a${k}`).join(', ')}]`)].join('\n');

const CASES: Case[] = [
  // 2. alias bombs are input errors; ordinary anchor reuse is not limited by a count
  { name: 'an anchor reused on 100 loads solves', args: () => ['solve', file('alias-reuse.yaml', board(aliasLoads))], code: 0, says: [] },
  { name: 'billion laughs', args: () => ['solve', file('laughs.yaml', laughs)], code: 3, says: [/aliases/, /expand/, /more than 100,000/] },
  {
    name: '45,000 aliases of one anchor are read in linear time and bounded memory',
    args: () => ['solve', file('many-aliases.yaml', board('  - { name: oven, connection: A-N, kW: 2, pf: 1 }', `spare: [&pf 1, ${Array(45_000).fill('*pf').join(',')}]\n`))],
    code: 3,
    says: [/spare: expected one of the keys taken here \(.*"supply".*"loads"/],
  },
  {
    name: 'a million entries in under 1 MB',
    args: () => ['solve', file('million.yaml', `spare:\n${'- 1\n'.repeat(250_000)}`)],
    code: 3,
    says: [/more than 50,000 entries/],
  },
  // A key given twice: JSON.parse keeps the last value, other YAML readers the first or refuse; refused with the mapping's path.
  {
    name: 'a key given twice in a load (YAML)',
    args: () => ['solve', file('twice.yaml', board('  - { name: oven, connection: A-N, kW: 2, pf: 1, kW: 3 }'))],
    code: 3,
    says: [/loads\[0\]: the key "kW" is given twice/, /keep one of the values/],
  },
  {
    name: 'a key given twice in a load (JSON)',
    args: () => ['solve', file('twice.json', '{"name": "x", "supply": {"system": "single-phase", "voltage": {"lineToNeutral": 230}, "frequencyHz": 50}, "loads": [{"name": "a", "connection": "A-N", "kW": 1, "pf": 1, "pf": 0.8}]}')],
    code: 3,
    says: [/loads\[0\]: the key "pf" is given twice \(the second time on line 1\)/],
  },
  {
    name: 'a key given twice at the top level',
    args: () => ['solve', file('twice-top.yaml', `${oneLoad}supply: again\n`)],
    code: 3,
    says: [/the top level: the key "supply" is given twice \(the second time on line \d+\)/],
  },
  { name: 'an alias that contains itself', args: () => ['solve', file('alias-loop.yaml', `${oneLoad}note: &n [*n]\n`)], code: 3, says: [/./] },
  // 3. size limit, enforced while reading
  { name: '/dev/zero as a file', args: () => ['solve', '/dev/zero'], code: 3, says: [/\/dev\/zero/, /1 MB read limit/, /--max-input-mb/] },
  { name: '/dev/zero on standard input', args: () => ['solve', '-'], stdin: 'dev-zero', code: 3, says: [/standard input/, /1 MB read limit/] },
  {
    name: 'a 3 MB quoted string',
    args: () => ['solve', file('big-string.yaml', `${oneLoad}note: "${'x'.repeat(3 * 1024 * 1024)}"\n`)],
    code: 3,
    says: [/big-string\.yaml/, /read limit/],
  },
  {
    name: 'the limit can be raised',
    args: () => ['solve', file('big-note.yaml', `${oneLoad}note: "${'x'.repeat(1536 * 1024)}"\n`), '--max-input-mb', '2'],
    code: 0,
    says: [],
  },
  { name: 'a nonsense limit', args: () => ['solve', '-', '--max-input-mb', '0'], code: 2, says: [/--max-input-mb/] },
  // 9. one reading of numbers, whatever the header says
  {
    name: '%YAML 1.1 header',
    args: () => ['solve', file('yaml11.yaml', `%YAML 1.1\n---\n${board('  - { name: oven, connection: A-N, kW: 012, pf: 1 }')}`)],
    code: 3,
    says: [/%YAML 1\.1/, /1\.2/],
  },
  { name: '%YAML 1.2 header is fine', args: () => ['solve', file('yaml12.yaml', `%YAML 1.2\n---\n${oneLoad}`)], code: 0, says: [] },
  {
    name: 'a << merge key is an unknown key, not a merge',
    args: () => ['solve', file('merge.yaml', `${SUPPLY}\nbase: &b { connection: A-N, pf: 1 }\nloads:\n  - { <<: *b, name: oven, kW: 2 }\n`)],
    code: 3,
    says: [/loads\[0\]\.<</, /base/],
  },
  // 10. clear messages: depth, documents, files, encodings, long keys
  { name: 'deep flow nesting', args: () => ['solve', file('deep.json', `${'['.repeat(50_000)}${']'.repeat(50_000)}`)], code: 3, says: [/nests more than 64 levels/] },
  {
    name: 'deep block nesting',
    args: () => ['solve', file('deep-block.yaml', Array.from({ length: 300 }, (_, k) => `${' '.repeat(k)}a:`).join('\n'))],
    code: 3,
    says: [/nests more than 64 levels/],
  },
  { name: 'two documents', args: () => ['solve', file('two-docs.yaml', `${oneLoad}---\n${oneLoad}`)], code: 3, says: [/second YAML document/, /one board/] },
  { name: 'a missing file', args: () => ['solve', join(DIR, 'nope.yaml')], code: 3, says: [/nope\.yaml/, /no such file/] },
  { name: 'a directory', args: () => ['solve', DIR], code: 3, says: [/is a directory/] },
  { name: 'a file used as a directory', args: () => ['solve', `${file('plain.yaml', oneLoad)}/board.yaml`], code: 3, says: [/plain\.yaml\/board\.yaml/, /not a directory/] },
  {
    name: 'a symbolic link loop',
    args: () => {
      const loop = join(DIR, 'loop.yaml');
      rmSync(loop, { force: true });
      symlinkSync(loop, loop);
      return ['solve', loop];
    },
    code: 3,
    says: [/loop\.yaml/, /symbolic links/],
  },
  { name: 'a name too long', args: () => ['solve', join(DIR, 'n'.repeat(300))], code: 3, says: [/too long/] },
  { name: 'binary input', args: () => ['solve', file('binary.bin', Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0, 0, 0, 9, 8]))], code: 3, says: [/binary\.bin/, /binary, not text/, /UTF-8/] },
  { name: 'UTF-16 without a byte-order mark', args: () => ['solve', file('u16.yaml', Buffer.from(oneLoad, 'utf16le'))], code: 3, says: [/UTF-16/, /save it as UTF-8/] },
  { name: 'UTF-16 with a byte-order mark is read', args: () => ['solve', file('u16bom.yaml', Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(oneLoad, 'utf16le')]))], code: 0, says: [] },
  { name: 'UTF-8 with a byte-order mark is read', args: () => ['solve', file('u8bom.yaml', `\ufeff${oneLoad}`)], code: 0, says: [] },
  { name: 'Latin-1 text', args: () => ['solve', file('latin1.yaml', Buffer.from(`${SUPPLY}\nname: caf\xe9\n`, 'latin1'))], code: 3, says: [/not UTF-8/, /line 2/] },
  {
    name: 'a 2 MB unknown key is not echoed',
    args: () => ['solve', file('long-key.json', JSON.stringify({ [`k${'y'.repeat(2_000_000)}`]: 1 })), '--max-input-mb', '3'],
    code: 3,
    says: [/kyyyy.*\.\.\./],
  },
  // 10. extreme magnitudes name the field and the accepted range
  { name: 'kW 1e308', args: () => ['solve', file('kw.yaml', board('  - { name: oven, connection: A-N, kW: 1e308, pf: 1 }'))], code: 3, says: [/loads\[0\]\.kW/, /from -100,000 to 100,000 kW/] },
  { name: 'pf 1e-320', args: () => ['solve', file('pf.yaml', board('  - { name: oven, connection: A-N, kW: 1, pf: 1e-320 }'))], code: 3, says: [/loads\[0\]\.pf/, /from 0\.01 to 1/] },
  {
    name: 'transformer 1e300 kVA',
    args: () => ['solve', file('kva.yaml', `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 1e300, impedancePercent: 4, xOverR: 3 } }\nloads: [{ name: a, connection: A-N, kW: 1, pf: 1 }]\n`)],
    code: 3,
    says: [/supply\.transformer\.kVA/, /10,000 kVA/],
  },
  {
    name: 'lineToLine 1e308 names the input field, not an output',
    args: () => ['solve', file('ll.yaml', `supply: { system: three-phase-4wire, voltage: { lineToLine: 1e308 }, frequencyHz: 50 }\nloads: [{ name: a, connection: A-N, kW: 1, pf: 1 }]\n`)],
    code: 3,
    says: [/supply\.voltage\.lineToLine/, /from 10 to 1,000 V/],
  },
  // 11. schema and cross-field problems in one pass
  {
    name: 'a schema error and a duplicate name, listed together',
    args: () => ['solve', file('two-rounds.yaml', `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 45 }\nloads:\n  - { name: oven, connection: A-N, kW: 2, pf: 1 }\n  - { name: oven, connection: B-N, kVA: 2 }\n`)],
    code: 3,
    says: [/supply\.frequencyHz/, /loads\[1\]\.name/, /loads\[1\]: expected exactly one rating/],
  },
  // 5. a __proto__ key is named, not dropped
  {
    name: 'perLoad __proto__',
    args: () => ['correct', file('proto.yaml', `${oneLoad}correction: { arrangement: delta-bank, lightLoad: { fraction: 0.3, perLoad: { __proto__: 0 } } }\n`)],
    code: 3,
    says: [/correction\.lightLoad\.perLoad\.__proto__/],
  },
  // 7. overloaded and collapsed supplies
  {
    name: '5000 kW constant-power load on a 100 kVA transformer',
    args: () => ['solve', file('collapse.yaml', `${TX100}\nloads: [{ name: plant, connection: ABC-delta, kW: 5000, pf: 0.9 }]\n`)],
    code: 4,
    says: [/no viable operating point/, /supply cannot carry/, /below 50 %/],
    prints: [/SUPPLY COLLAPSE/],
  },
  {
    name: '5000 kW of PV on a 100 kVA transformer',
    args: () => ['solve', file('pv.yaml', `${TX100}\nloads: [{ name: array, connection: ABC-delta, kW: -5000, pf: 1 }]\n`)],
    code: 4,
    says: [/supply cannot carry/],
  },
  {
    name: 'correct on a collapsed board says so instead of "nothing to do"',
    args: () => ['correct', file('tiny-tx.yaml', `supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 0.1, impedancePercent: 4, xOverR: 3 } }\nloads: [{ name: heater, connection: A-N, kW: 50, pf: 1, model: constant-impedance }]\n`), '--arrangement', 'delta-bank'],
    code: 4,
    says: [/A-N \d+\.\d % of nominal/],
    neverPrints: [/NOTHING TO DO/],
  },
  {
    name: 'a 240 kW heater on a 100 kVA transformer: loading figure and warning',
    args: () => ['solve', file('overload.yaml', `${TX100}\nloads: [{ name: heater, connection: ABC-delta, kW: 240, pf: 1, model: constant-impedance }]\n`)],
    code: 0,
    says: [],
    prints: [/transformer loaded to 2\d\d % of its 100 kVA rating|transformer is loaded to 2\d\d %/, /transformer +\d+\.\d\d kVA at its terminals/],
    neverPrints: [/Warnings\n  none/],
  },
  // 4. noise is not data
  {
    name: 'an idle line has no PF in the report (not "0.200 lag")',
    args: () => ['solve', file('idle.yaml', `${TX100}\nloads: [{ name: kettle, connection: A-N, kW: 2.2, pf: 1 }, { name: fridge, connection: B-N, kW: 0.4, pf: 0.8 }]\n`)],
    code: 0,
    says: [],
    prints: [/\n  C +[\d.]+ +[-\d.]+ +[\d.]+ +[-\d.]+ +0\.0 .* -\s/],
  },
  {
    name: 'correcting an all-zero board: it draws no power (not "exports"), nothing to do',
    args: () => ['correct', file('zero.yaml', `${SUPPLY}\nloads: [{ name: spare, connection: A-N, kW: 0, pf: 1 }]\n`), '--arrangement', 'delta-bank'],
    // Nothing drawn, nothing to do: exit 0, as the balancing compensator's verdict on the same board (was 5, "not reachable").
    code: 0,
    says: [],
    prints: [/draws no active power/],
    neverPrints: [/exports active power/],
  },
  // 10. a target just below 1 is not shown as 1.000
  {
    name: 'a target of 0.9999999 reads as itself',
    args: () => ['correct', 'examples/riverside-cold-store.yaml', '--pf', '0.9999999'],
    code: 5,
    says: [],
    prints: [/PF ≥ 0\.9999999/],
    neverPrints: [/PF ≥ 1\.000/],
  },
];

describe('hostile input: exit code, no stack trace, bounded memory, a message that names the field or file', () => {
  it.each(CASES)('$name', (c) => {
    const r = runBin(c.args(), c.stdin);
    expect(r.signal, `killed by ${r.signal ?? ''}: ${r.stderr.slice(0, 500)}`).toBeNull();
    expect(r.code, r.stderr.slice(0, 2000)).toBe(c.code);
    expect(r.stderr).not.toMatch(/\n\s+at .+[:(]\d+/);
    expect(r.stderr).not.toMatch(/internal error/);
    expect(r.stderr.length).toBeLessThan(20_000);
    for (const says of c.says) expect(r.stderr).toMatch(says);
    for (const prints of c.prints ?? []) expect(r.stdout).toMatch(prints);
    for (const never of c.neverPrints ?? []) expect(r.stdout).not.toMatch(never);
    if (c.code === 0 && c.args()[0] === 'solve' && !c.args().includes('--json')) expect(r.stdout).toMatch(/At the board/);
  });
});
