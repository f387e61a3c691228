/**
 * `trivar diagram --with-correction` / `--view triangles` and `trivar profile --correction-bank` use the
 * correction the file's section gives, as `trivar correct` gives it: the arrangement it names, or — none
 * named — the one trivar correct recommends (as `trivar report` does). What they cannot draw or simulate
 * truly (no unit suits the bank; a compensator's reactors; steps only across line pairs) is refused with
 * exit 2 saying why and what is accepted: never a stack trace, a partial bank or a silently empty run.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { ROOT, runTrivar } from './runTrivar.js';

let dir = '';
const write = (name: string, text: string) => {
  const file = join(dir, name);
  writeFileSync(file, text);
  return file;
};
const example = (name: string) => readFileSync(`${ROOT}examples/${name}`, 'utf8');
/** The example's correction section with its arrangement line changed (or removed: null). */
const withArrangement = (text: string, arrangement: string | null) =>
  text.replace(/^ {2}arrangement: .*\n/m, arrangement === null ? '' : `  arrangement: ${arrangement}\n`);
const titleOf = (svg: string) => /<title>([^<]*)<\/title>/.exec(svg)?.[1];
const noTrace = (stderr: string) => expect(stderr).not.toMatch(/at .*\.js:\d+/);

/** The corner bakery with a correction section of its own (the example has none). */
const bakery = (section: string) => `${example('corner-bakery.yaml')}correction:\n${section}`;
/** Interval data driving one load of the bakery; the others stay at their rating. */
const BAKERY_DATA = 'time,Dough mixer [x]\n2025-03-01 06:00,1\n2025-03-01 06:15,0.5\n2025-03-01 06:30,0.8\n2025-03-01 06:45,1\n';

let quayData = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trivar-file-correction-'));
  // Two days of the quay-street example's invented data, as profileCommand.test.ts makes it.
  quayData = join(dir, 'quay.csv');
  execFileSync(process.execPath, [`${ROOT}scripts/generate-profile-example.mjs`, quayData, '--days', '2'], { cwd: ROOT });
});

describe('a correction section naming no arrangement: the one trivar correct recommends', () => {
  it('diagram draws the recommended arrangement, the same drawing as naming it, its title saying which', () => {
    // cedar-falls names none; trivar correct recommends its delta bank.
    const recommended = JSON.parse(runTrivar(['correct', 'examples/cedar-falls-print-shop.yaml', '--json']).stdout).recommended;
    expect(recommended).toBe('delta-bank');
    const named = write('cedar-named.yaml', example('cedar-falls-print-shop.yaml').replace(/^correction:\n/m, 'correction:\n  arrangement: delta-bank\n'));
    for (const [args, title] of [
      [['--with-correction'], 'Phasors at the board — before and after the recommended delta bank'],
      [['--view', 'triangles'], 'Line current triangles — before and after the recommended delta bank'],
      [['--view', 'sequence', '--with-correction'], 'Symmetrical components with the recommended delta bank in place'],
    ] as const) {
      const r = runTrivar(['diagram', 'examples/cedar-falls-print-shop.yaml', ...args]);
      expect(r.stderr).toBe('');
      expect(r.code).toBe(0);
      expect(titleOf(r.stdout)).toBe(`${title}: Cedar Falls print shop — 480 V main switchboard`);
      const plain = runTrivar(['diagram', named, ...args]).stdout;
      // Only the titles differ from the drawing of the file that names the bank.
      const untitled = (svg: string) => svg.replace(/<title>[^<]*<\/title>/, '').replace(/(font-weight="bold"[^>]*>)[^<]*</, '$1<');
      expect(untitled(r.stdout)).toBe(untitled(plain));
      if (args[1] !== 'sequence') expect(untitled(r.stdout)).toContain('data-state="after"');
    }
  });

  it('profile simulates the recommended bank: the same steps and controller as naming it', () => {
    const none = write('quay-none.yaml', withArrangement(example('quay-street-flats.yaml'), null));
    const recommended = JSON.parse(runTrivar(['correct', none, '--json']).stdout).recommended;
    expect(recommended).toBe('delta-bank');
    const r = runTrivar(['profile', none, '--data', quayData, '--correction-bank', '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const named = JSON.parse(runTrivar(['profile', 'examples/quay-street-flats.yaml', '--data', quayData, '--correction-bank', '--json']).stdout);
    // The same bank; only how it was chosen differs (bank.design, which the report words).
    const { design, ...bank } = JSON.parse(r.stdout).bank;
    const { design: namedDesign, ...namedBank } = named.bank;
    expect(bank).toEqual(namedBank);
    expect([design.recommended, namedDesign.recommended]).toEqual([true, false]);
    expect(named.bank.steps.length).toBe(4);
  });

  it('on an installation: the recommended arrangement on the board the section names', () => {
    const file = write('tannery.yaml', `${example('tannery-lane-works.yaml')}correction: { board: Press shop, target: { pf: 0.95 } }\n`);
    const compared = JSON.parse(runTrivar(['correct', file, '--json']).stdout);
    const name = { 'star-bank': 'star bank', 'delta-bank': 'delta bank', 'balancing-compensator': 'balancing compensator' }[compared.comparison.recommended as string];
    const r = runTrivar(['diagram', file, '--with-correction']);
    expect(r.code).toBe(0);
    expect(titleOf(r.stdout)).toBe(`Phasors at the board — before and after the recommended ${name}: Press shop`);
  });
});

describe('what cannot be drawn or simulated truly is refused, saying why and what is accepted', () => {
  it('a balancing compensator with reactors: drawn with them; not simulated as its capacitors alone', () => {
    const file = write('bakery-compensator.yaml', bakery('  arrangement: balancing-compensator\n'));
    const designed = JSON.parse(runTrivar(['correct', file, '--json']).stdout);
    const reactors = designed.verification.branches.filter((b: { element: string }) => b.element === 'reactor');
    expect(reactors.map((b: { branch: string }) => b.branch)).toEqual(['C-A', 'B-N']);
    // The drawing is the study's after, reactors in: the after currents are the verification's.
    const svg = runTrivar(['diagram', file, '--view', 'triangles']);
    expect(svg.code).toBe(0);
    const after = [...svg.stdout.matchAll(/data-state="after"[^>]*data-magnitude="([\d.]+)"/g)].map((m) => Number(m[1]));
    const lines = designed.verification.after.phases.map((p: { current: { magnitude: number } }) => p.current.magnitude);
    expect(after).toHaveLength(3);
    after.forEach((x, k) => expect(Math.abs(x - lines[k]!)).toBeLessThan(0.05));
    // Before: its capacitor steps ran with no reactor and no word about it.
    const data = write('bakery.csv', BAKERY_DATA);
    const r = runTrivar(['profile', file, '--data', data, '--unlisted-at-rating', '--correction-bank']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    noTrace(r.stderr);
    expect(r.stderr).toContain('--correction-bank: the balancing compensator needs reactors (17.73 kvar on C-A, 4.53 kvar on B-N) beside its capacitors');
    expect(r.stderr).toContain('the simulator switches capacitor steps that are three-phase, from a line to the neutral, or across two lines (correction.arrangement: star-bank, or delta-bank); or use --bank');
  });

  it('no unit suits the bank: nothing as built to draw or simulate', () => {
    // quay-street's compensator with a catalogue of three-phase 440 V units only: no unit fits its line-to-neutral
    // branches; before, a part of it was drawn and its line-to-line trims alone "simulated" — an empty run with no
    // bank section and exit 0.
    const threePhaseOnly = '  catalogue: [{ kind: three-phase, ratedKvar: 10, ratedV: 440, ratedHz: 50 }]\n';
    const file = write('quay-compensator.yaml', withArrangement(example('quay-street-flats.yaml'), 'balancing-compensator').replace(/^correction:\n/m, `correction:\n${threePhaseOnly}`));
    expect(JSON.parse(runTrivar(['correct', file, '--json']).stdout).status).toBe('no-suitable-units');
    const drawn = runTrivar(['diagram', file, '--with-correction']);
    expect(drawn.code).toBe(2);
    noTrace(drawn.stderr);
    expect(drawn.stderr).toMatch(/^error: --with-correction: no unit of the catalogue suits the balancing compensator \(no unit in the catalogue given in the correction fits A-N, B-N: .*\), so there is no correction as built to draw/);
    expect(drawn.stderr).toContain('give a catalogue (correction.catalogue) or name another arrangement (correction.arrangement)');
    const run = runTrivar(['profile', file, '--data', quayData, '--correction-bank']);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/^error: --correction-bank: no unit of the catalogue suits the balancing compensator .*so there is no bank as built to simulate/);
  });

  it('a split-phase line-to-line bank: its steps across the two lines are simulated, answering to both lines', () => {
    const panel = [
      'name: Farm shop panel',
      'supply: { system: split-phase, voltage: "120/240", frequencyHz: 60, transformer: { kVA: 50, impedancePercent: 2, xOverR: 2 } }',
      'loads:',
      '  - { name: Well pump, connection: L1-L2, kW: 3.7, pf: 0.72 }',
      '  - { name: Cooler, connection: L1-N, kW: 1.5, pf: 0.7 }',
      '  - { name: Fans, connection: L2-N, kW: 1.1, pf: 0.75 }',
      'correction: { target: { pf: 0.95 } }',
      '',
    ].join('\n');
    const file = write('farm.yaml', panel);
    // trivar correct recommends the line-to-line bank here.
    expect(JSON.parse(runTrivar(['correct', file, '--json']).stdout).recommended).toBe('delta-bank');
    const data = write('farm.csv', 'time,Well pump [x]\n2025-06-01 12:00,1\n2025-06-01 12:15,0.4\n');
    const r = runTrivar(['profile', file, '--data', data, '--unlisted-at-rating', '--correction-bank', '--json']);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const bank = JSON.parse(r.stdout).bank;
    const designed = JSON.parse(runTrivar(['correct', file, '--arrangement', 'delta-bank', '--json']).stdout).selection.steps;
    expect(bank.steps.map((s: { channel: string; kvar: number }) => [s.channel, s.kvar])).toEqual(designed.map((s: { kvarAtNominalV: number }) => ['A-B', s.kvarAtNominalV]));
    expect(bank.notSimulated).toBeNull();
    const text = runTrivar(['profile', file, '--data', data, '--unlisted-at-rating', '--correction-bank']).stdout;
    expect(text).toMatch(/^ +1 {2}across L1-L2 /m);
  });

  it('no correction section: the message says a section with or without an arrangement will do', () => {
    const r = runTrivar(['diagram', 'examples/corner-bakery.yaml', '--with-correction']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('add a "correction:" section to the file (with an arrangement, or without one for the arrangement trivar correct recommends');
  });
});
