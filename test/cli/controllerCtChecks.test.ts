/**
 * A current transformer given for the correction's controller is checked against what it must read:
 * a primary below the line current saturates it, and one so large that the usual steps fall below the
 * least C/k gets a bank of fewer, larger steps rather than one whose smallest step is unswitchable.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ROOT, runTrivar } from './runTrivar.js';

describe('a current transformer given for the controller', () => {
  // Riverside's cold store board draws about 208 A on its heaviest line.
  const riverside = 'examples/riverside-cold-store.yaml';
  it('below the line current: warned, with the least primary that reads it', () => {
    const r = runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--ct', '10', '--json']);
    const w = (JSON.parse(r.stdout) as { warnings: { code: string; message: string; value: number; threshold: number }[] }).warnings.find((x) => x.code === 'ct-below-line-current')!;
    expect(w.value).toBe(10);
    expect(w.threshold).toBeGreaterThan(150);
    expect(w.message).toMatch(/^the CT primary \(10 A\) is below the largest line current \(\d+\.\d A\)/);
  }, 60_000);
  it('so large that the usual steps fall below the least C/k: the bank is built of steps the controller tells apart, its setting never finer than controllers resolve', () => {
    const r = runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--ct', '5000', '--json']);
    const out = JSON.parse(r.stdout) as {
      warnings: { code: string }[];
      selection: { steps: { output: number | null; responseThresholdA: number }[]; leastStep: { responseThresholdA: number }; controller: { responseSettingA: number } };
    };
    const codes = out.warnings.map((x) => x.code);
    // On 5000/5 A the 20.66 kvar steps of the chosen CT's build read 0.030 A: below 1 % of the secondary, not built.
    expect(out.selection.leastStep.responseThresholdA).toBeCloseTo(0.05, 12);
    for (const s of out.selection.steps.filter((x) => x.output !== null)) expect(s.responseThresholdA).toBeGreaterThanOrEqual(0.05);
    expect(out.selection.controller.responseSettingA).toBeGreaterThanOrEqual(0.02);
    expect(codes).not.toContain('ck-below-resolution');
    const plain = JSON.parse(runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--json']).stdout) as { warnings: { code: string }[] };
    expect(plain.warnings.map((x) => x.code)).not.toContain('ck-below-resolution');
    expect(plain.warnings.map((x) => x.code)).not.toContain('ct-below-line-current');
  }, 60_000);
});

describe('a CT warned as too small names where its primary came from', () => {
  // Riverside's cold store draws 208.4 A on its heaviest line before correction: at least 209 A, 300 A standard.
  const riverside = 'examples/riverside-cold-store.yaml';
  const withFileCt = (amps: number) => readFileSync(join(ROOT, riverside), 'utf8').replace('  controller: { outputs: 6 }', `  controller: { outputs: 6, ctPrimaryA: ${amps} }`);
  const flat = (text: string) => text.replace(/\s+/g, ' ');
  it('--ct: the option, which set it; the JSON keeps the study field, as the library gives it', () => {
    const text = flat(runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--ct', '100']).stdout);
    expect(text).toContain('the CT primary (100 A) is below the largest line current (208.4 A) before correction');
    expect(text).toContain('raise --ct to at least 209 A (300 A is the next standard rating at or above 1.25 × it)');
    expect(text).not.toContain('raise controller.ctPrimaryA');
    const json = JSON.parse(runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--ct', '100', '--json']).stdout) as { warnings: { code: string; message: string; path: string }[] };
    const w = json.warnings.find((x) => x.code === 'ct-below-line-current')!;
    expect(w.path).toBe('controller.ctPrimaryA');
    expect(w.message).toContain('raise controller.ctPrimaryA to at least 209 A');
  }, 60_000);
  it("the file's correction.controller.ctPrimaryA: that field, in the file", () => {
    const r = runTrivar(['correct', '-', '--arrangement', 'delta-bank'], withFileCt(100));
    expect(r.code).toBe(0);
    expect(flat(r.stdout)).toContain('raise correction.controller.ctPrimaryA in the file to at least 209 A');
  }, 60_000);
  it('both: --ct overrides the file, and is the one named', () => {
    const text = flat(runTrivar(['correct', '-', '--arrangement', 'delta-bank', '--ct', '150'], withFileCt(100)).stdout);
    expect(text).toContain('the CT primary (150 A) is below the largest line current (208.4 A)');
    expect(text).toContain('raise --ct to at least 209 A');
    expect(text).not.toContain('correction.controller.ctPrimaryA in the file');
  }, 60_000);
});

describe("a compensator's reactors stay in while its capacitor steps switch", () => {
  // corner-bakery's compensator: fixed reactors C-A 17.73 kvar and B-N 4.53 kvar, three capacitor trim steps.
  // With the reactors in and every step out line B carries 95.1 A, above 90.4 A before and 65.3 A after.
  const bakery = ['correct', 'examples/corner-bakery.yaml', '--arrangement', 'balancing-compensator'];
  it('a 95 A CT is warned, against 95.1 A in that state; a 125 A CT is not', () => {
    const json = (ct: string) => JSON.parse(runTrivar([...bakery, '--ct', ct, '--json']).stdout) as { warnings: { code: string; threshold: number }[] };
    const w = json('95').warnings.find((x) => x.code === 'ct-below-line-current');
    expect(w).toBeDefined();
    expect(w!.threshold).toBeCloseTo(95.14, 2);
    expect(json('125').warnings.map((x) => x.code)).not.toContain('ct-below-line-current');
    const text = runTrivar([...bakery, '--ct', '95']).stdout.replace(/\s+/g, ' ');
    // The reactors alone draw the same at either capacitance end; every step in is named at the end the CT is read at.
    expect(text).toContain('checked against 95.1 A on line B with the reactors in and every switched step out, the largest line current there in any state of the steps (90.4 A before correction, 63.7 A with every step in at +10 % capacitance)');
  }, 60_000);
});

describe('where the CT goes, said alike in the text and the JSON', () => {
  // An invented laundry: ironers on the intake board, a steam press on a sub-board; ideal 400 V source.
  const dir = mkdtempSync(join(tmpdir(), 'trivar-ct-place-'));
  const laundry = join(dir, 'laundry.yaml');
  writeFileSync(
    laundry,
    [
      'name: Fenwick Road laundry',
      'supply: { system: three-phase-4wire, voltage: { lineToLine: 400 }, frequencyHz: 50 }',
      'boards:',
      '  - name: Intake board',
      '    loads: [ { name: Ironers, connection: ABC-delta, kW: 40, pf: 0.9 } ]',
      '  - name: Press room',
      '    fedFrom: Intake board',
      '    feeder: { lengthM: 5, line: { mm2: 95 }, neutral: { mm2: 95 } }',
      '    loads: [ { name: Steam press, connection: ABC-delta, kW: 15, pf: 0.7 } ]',
      '',
    ].join('\n'),
  );
  type Controller = { ctPrimaryA: number; responseThresholdA: number; ctBasis: { placeWords: string; currentWords: string; point: string } };
  const run = (extra: readonly string[]) => {
    const args = ['correct', laundry, '--board', 'Press room', '--arrangement', 'delta-bank', ...extra];
    const json = JSON.parse(runTrivar([...args, '--json']).stdout) as { report: { selection: { controller: Controller }; warnings: { code: string; message: string }[] } };
    return { text: runTrivar(args).stdout.replace(/\s+/g, ' '), controller: json.report.selection.controller, warnings: json.report.warnings };
  };
  it('measured at the origin: 125/5 there (1.25 × 93.9 A before), C/k 0.358 A, the same place and figure in both', () => {
    const { text, controller: c } = run(['--measured-at', 'origin']);
    expect(c.ctPrimaryA).toBe(125);
    expect(c.ctBasis.point).toBe('origin');
    expect(c.ctBasis.currentWords).toMatch(/^93\.9 A, the largest line current there before correction \(\d+\.\d A after, capacitance at −5 %\)$/);
    expect(text).toContain(`CT 125/5 A at ${c.ctBasis.placeWords}; chosen: the next standard rating at or above 1.25 × ${c.ctBasis.currentWords}; give controller.ctPrimaryA if yours differs`);
    // 6198.3 / (√3 × 400) / 25 = 0.358 A, on the controller's line and in every step's row.
    expect(text).toContain('C/k of the smallest step (6.20 kvar at nominal voltage) = 0.358 A; set 0.233 A');
    // The press room's own figure would give 1.25 × 30.9 A → 40/5 and C/k 1.118 A: neither is printed.
    expect(text).not.toContain('CT 40/5');
    expect(text).not.toContain('1.118');
  }, 60_000);
  it('a CT given: marked as given, checked against the figure where it reads, and warned when below it', () => {
    const { text, controller: c, warnings } = run(['--measured-at', 'origin', '--ct', '50']);
    expect(text).toContain(`CT 50/5 A (given) at ${c.ctBasis.placeWords}; checked against ${c.ctBasis.currentWords}`);
    expect(warnings.map((w) => w.code)).toContain('ct-below-line-current');
    // 6198.3 / (√3 × 400) / 10 = 0.8946 A; × 0.65 = 0.5815 A.
    expect(text).toContain('= 0.895 A; set 0.582 A');
    const atBoard = run(['--ct', '50']);
    expect(atBoard.text).toContain('CT 50/5 A (given) at the incomer of Press room, the board the equipment is on; checked against 30.9 A, the largest line current there before correction');
    expect(atBoard.warnings.map((w) => w.code)).not.toContain('ct-below-line-current');
  }, 60_000);
});

describe('units of another frequency', () => {
  const riverside = 'examples/riverside-cold-store.yaml';
  it('the no-unit message counts the frequency in what the nearest unit delivers, and the floor it names accepts it', () => {
    const r = runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--practice', 'north-american']);
    const text = r.stdout.replace(/\s+/g, ' ');
    // 480 V, 60 Hz units on 400 V, 50 Hz: (400/480)² × 50/60 = 57.9 %.
    expect(text).toContain('the nearest, 480 V, delivers 57.9 % there, the frequency counted (a deliveryFloorPercent of 57');
    expect(text).toContain('i.e. be rated at most 452.9 V');
    // The floor it names does accept the unit (the same file with deliveryFloorPercent: 57), and the frequency is warned.
    const dir = mkdtempSync(join(tmpdir(), 'trivar-floor-'));
    const file = join(dir, 'floor.yaml');
    const text0 = readFileSync(join(ROOT, riverside), 'utf8');
    writeFileSync(file, `${text0.slice(0, text0.indexOf('\ncorrection:'))}\ncorrection: { deliveryFloorPercent: 57 }\n`);
    const built = runTrivar(['correct', file, '--arrangement', 'delta-bank', '--practice', 'north-american']);
    expect(built.stdout).toMatch(/^MEETS THE TARGET/m);
    expect(built.stdout.replace(/\s+/g, ' ')).toMatch(/is rated for 60 Hz and used at 50 Hz/);
  }, 60_000);
});
