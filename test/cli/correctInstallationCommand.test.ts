/** `trivar correct` on installation files (built binary): --board, the effect on every board, errors. */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { correctInstallation, normaliseInstallation, parseInstallation, readBoardText } from '@trivar/core';
import { ROOT, runTrivar } from './runTrivar.js';
import { isBoardExample } from '../support/boardExamples.js';

const works = 'examples/tannery-lane-works.yaml';
const installations = readdirSync(`${ROOT}examples`).filter((f) => f.endsWith('.yaml') && !isBoardExample(`${ROOT}examples`)(f));

describe('trivar correct on an installation file', () => {
  it('--board puts the bank on that board; --json is the library result exactly', () => {
    const r = runTrivar(['correct', works, '--board', 'Press shop', '--arrangement', 'star-bank', '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const installation = normaliseInstallation(parseInstallation(readBoardText(readFileSync(`${ROOT}${works}`, 'utf8')))).installation;
    const expected = correctInstallation(installation, { arrangement: 'star-bank' }, { board: 'Press shop' });
    expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
    expect(expected.effect.boards.map((b) => b.name)).toEqual(['Main switchboard', 'Press shop', 'Offices']);
  });

  it('the text report says where the bank is, shows every board, feeder and the supply before → after', () => {
    const r = runTrivar(['correct', works, '--board', 'Press shop', '--arrangement', 'star-bank']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Tannery Lane works: correction equipment on Press shop');
    expect(r.stdout).toContain('The target is judged at the incomer of Press shop');
    expect(r.stdout).toMatch(/Main switchboard\s+98\.7→99\.3\s+112\.7→94\.7\s+10\.0→9\.6\s+0\.807→0\.973/);
    expect(r.stdout).toMatch(/└ Press shop \*/);
    expect(r.stdout).toContain('Feeders, before → after');
    expect(r.stdout).toMatch(/PF at the source\s+0\.802 → 0\.971/);
    for (const line of r.stdout.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  });

  // An installation with harmonic data checks every arrangement's plain and detuned banks on the whole installation (ferrybank-joinery: ~30 s).
  it.each(installations)('examples/%s: without options compares the arrangements at the main board within 100 columns', (file) => {
    const r = runTrivar(['correct', `examples/${file}`]);
    expect(r.stderr).toBe('');
    expect([0, 5]).toContain(r.code);
    expect(r.stdout).toMatch(/correction equipment on .* \(the main board\)/);
    // Compared, or nothing to add where the banks the file lists (in service) already meet the target at the main board.
    expect(r.stdout).toMatch(/Arrangements compared|NOTHING TO DO: the board already meets the target — every arrangement studied/);
    for (const line of r.stdout.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
  }, 180_000);

  it('says where loads leave or re-enter the voltage band', () => {
    const text = [
      'name: far barn',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 3 } }',
      'boards:',
      '  - { name: Farmhouse, loads: [{ name: house, connection: A-N, kW: 3, pf: 0.98 }] }',
      '  - name: Barn',
      '    fedFrom: Farmhouse',
      '    feeder: { lengthM: 380, line: { mm2: 25, ratingA: 100 }, neutral: { mm2: 25 } }',
      '    loads: [{ name: mill motor, connection: ABC-delta, kW: 30, pf: 0.7 }, { name: lights, connection: B-N, kW: 1, pf: 0.95 }]',
    ].join('\n');
    const r = runTrivar(['correct', '-', '--board', 'Barn', '--arrangement', 'delta-bank', '--pf', '0.98'], text);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('! Barn: 1 → 0 load(s) outside the voltage band');
  });

  it('an unknown board: exit 2 (the command line names it), naming --board and every board of the installation', () => {
    const r = runTrivar(['correct', works, '--board', 'Paint shop']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--board: expected a board of this installation: "Main switchboard", "Press shop", "Offices" (received "Paint shop")');
    expect(r.stdout).toBe('');
  });

  it('--board on a single-board file: exit 3, saying it applies to installation files', () => {
    const r = runTrivar(['correct', 'examples/riverside-cold-store.yaml', '--board', 'Main']);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('--board applies to installation files');
  });

  it("a bad study in the installation file's correction section is named at its path (exit 3)", () => {
    const text = `${readFileSync(`${ROOT}${works}`, 'utf8')}correction: { arrangement: star-bank, target: { pf: 1.5 } }\n`;
    const r = runTrivar(['correct', '-', '--board', 'Offices'], text);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('correction.target.pf');
  });
});

describe('--measured-at: the target judged away from the bank board', () => {
  it('origin: the report says where, adds the readings there, and --json is the library result exactly', () => {
    const args = ['correct', works, '--board', 'Press shop', '--measured-at', 'origin', '--pf', '0.97', '--arrangement', 'star-bank'];
    const r = runTrivar(args);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("The target is judged at the origin of the installation (the supply's terminals");
    expect(r.stdout).toContain('Where the target is measured, before → after');
    // Every line at the origin reaches 0.97, as printed.
    const block = r.stdout.split('Where the target is measured')[1]!.split('Lines, before')[0]!;
    const after = [...block.matchAll(/→ (0\.\d{3}) lag\n/g)].map((m) => Number(m[1]));
    expect(after).toHaveLength(3);
    for (const pf of after) expect(pf).toBeGreaterThanOrEqual(0.97);
    for (const line of r.stdout.split('\n')) expect(line.length, line).toBeLessThanOrEqual(100);
    const json = runTrivar([...args, '--json']);
    const installation = normaliseInstallation(parseInstallation(readBoardText(readFileSync(`${ROOT}${works}`, 'utf8')))).installation;
    const expected = correctInstallation(installation, { arrangement: 'star-bank', target: { pf: 0.97, measuredAt: 'origin' } }, { board: 'Press shop' });
    expect(JSON.parse(json.stdout)).toEqual(JSON.parse(JSON.stringify(expected)));
  });

  it('a board beside the bank: exit 2 (the command line does not fit the file), naming --measured-at and the points it accepts', () => {
    const r = runTrivar(['correct', works, '--board', 'Press shop', '--measured-at', 'Offices']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('--measured-at: expected origin');
    expect(r.stderr).toContain('"Press shop", "Main switchboard" (received "Offices")');
    expect(r.stdout).toBe('');
  });

  it('a board fed from the bank\'s board (downstream, not upstream): exit 2, naming --measured-at', () => {
    const r = runTrivar(['correct', works, '--board', 'Main switchboard', '--measured-at', 'Press shop']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('the options do not fit the installation: --measured-at: expected origin');
    expect(r.stderr).toContain('(received "Press shop")');
    expect(r.stdout).toBe('');
  });

  it("in the file's correction section: an unknown point is named at correction.target.measuredAt", () => {
    const text = `${readFileSync(`${ROOT}${works}`, 'utf8')}correction: { board: Press shop, arrangement: star-bank, target: { measuredAt: Weighbridge } }\n`;
    const r = runTrivar(['correct', '-'], text);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('correction.target.measuredAt: expected origin');
  });

  it('the HTML report of a file whose correction section measures at the origin says so, with the PF reached there', () => {
    const text = `${readFileSync(`${ROOT}${works}`, 'utf8')}correction: { board: Press shop, arrangement: star-bank, target: { pf: 0.97, measuredAt: origin } }\n`;
    const r = runTrivar(['report', '-'], text);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Target measured at');
    expect(r.stdout).toContain('the origin of the installation');
    const installation = normaliseInstallation(parseInstallation(readBoardText(text))).installation;
    const m = correctInstallation(installation, { arrangement: 'star-bank', target: { pf: 0.97, measuredAt: 'origin' } }, { board: 'Press shop' }).report.verification.metering!;
    expect(r.stdout).toContain(`${m.powerFactor.vector!.before.toFixed(3)} → ${m.powerFactor.vector!.after.toFixed(3)}`);
  });

  it('on a single-board file, origin takes in the service cable', () => {
    const r = runTrivar(['correct', 'examples/riverside-cold-store.yaml', '--measured-at', 'origin', '--arrangement', 'delta-bank']);
    expect([0, 5]).toContain(r.code);
    expect(r.stdout).toContain('measured at the origin of the installation');
  });
});

describe('the file names the board: correction.board', () => {
  const withSection = (section: string) => {
    const dir = mkdtempSync(join(tmpdir(), 'trivar-correct-'));
    const file = join(dir, 'works.yaml');
    writeFileSync(file, `${readFileSync(`${ROOT}${works}`, 'utf8')}correction: ${section}\n`);
    return file;
  };

  it('places the bank on that board, as --board does (and --board overrides it)', () => {
    const file = withSection('{ board: Press shop, arrangement: star-bank }');
    const fromFile = runTrivar(['correct', file, '--json']);
    expect(fromFile.stderr).toBe('');
    expect(fromFile.code).toBe(0);
    const byOption = runTrivar(['correct', works, '--board', 'Press shop', '--arrangement', 'star-bank', '--json']);
    expect(JSON.parse(fromFile.stdout)).toEqual(JSON.parse(byOption.stdout));
    const overridden = JSON.parse(runTrivar(['correct', file, '--board', 'Offices', '--json']).stdout) as { board: string };
    expect(overridden.board).toBe('Offices');
  });

  it('an unknown board there is an input error naming the field', () => {
    const r = runTrivar(['correct', withSection('{ board: Loft, arrangement: star-bank }')]);
    expect(r.code).toBe(3);
    expect(r.stderr).toContain('correction.board: expected a board of this installation');
  });
});
