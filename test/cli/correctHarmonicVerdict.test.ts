/**
 * A bank that meets the power-factor target but fails the harmonic check in every variant is not one
 * to install: the verdict line, the warnings and the exit code (5) say so, and a comparison's table
 * shows it as "fails check" — not "MEETS THE TARGET", "Warnings none" and exit 0 with the failure
 * only at the foot of the report.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const offices = 'examples/mill-street-offices.yaml';

describe('correct where no variant passes the harmonic check', () => {
  it('one arrangement: the verdict and a warning say it fails the check, exit 5', () => {
    const r = runTrivar(['correct', offices, '--arrangement', 'balancing-compensator']);
    expect(r.code).toBe(5);
    expect(r.stdout).toMatch(/^MEETS THE TARGET, BUT FAILS THE HARMONIC CHECK — balancing compensator/m);
    const warnings = r.stdout.slice(r.stdout.indexOf('\nWarnings\n'), r.stdout.indexOf('\nCautions\n')).replace(/\n {4}/g, ' ');
    expect(warnings).toMatch(/! no variant passes the harmonic check \(plain: .*\): do not install it as built/);
    const json = JSON.parse(runTrivar(['correct', offices, '--arrangement', 'balancing-compensator', '--json']).stdout) as { status: string; warnings: { code: string }[]; harmonics: { chosen: string | null } };
    expect(json.status).toBe('meets-target');
    expect(json.harmonics.chosen).toBeNull();
    expect(json.warnings.map((w) => w.code)).toContain('harmonic-check-failed');
  }, 120_000);

  it('a comparison: the row reads "fails check", and an arrangement that passes is recommended (exit 0)', () => {
    const r = runTrivar(['correct', offices]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^ {2}compensator +fails check /m);
    expect(r.stdout).toMatch(/^ {2}delta bank +meets /m);
    expect(r.stdout).toContain('fails check: meets the target, but no variant passes the harmonic check');
    // The recommended bank passes: its own verdict has no "BUT".
    expect(r.stdout).toMatch(/^MEETS THE TARGET — star bank with 7 % detuning reactors/m);
  }, 120_000);
});

describe('the variant table', () => {
  it("a star bank's capacitor voltage is line-to-neutral / (1 − p), also for a variant no unit suits; reasons are words, not status codes", () => {
    const r = runTrivar(['correct', offices, '--arrangement', 'star-bank', '--json']);
    const variants = (JSON.parse(r.stdout) as { harmonics: { variants: { name: string; capacitorVoltageV: number; reasons: string[] }[] } }).harmonics.variants;
    const ln = 400 / Math.sqrt(3);
    for (const v of variants) {
      const p = v.name === 'plain' ? 0 : Number(/([\d.]+) %/.exec(v.name)![1]) / 100;
      expect(v.capacitorVoltageV, v.name).toBeCloseTo(ln / (1 - p), 1);
      for (const reason of v.reasons) expect(reason).not.toMatch(/"[a-z-]+"/);
    }
    const compensator = JSON.parse(runTrivar(['correct', offices, '--arrangement', 'balancing-compensator', '--json']).stdout) as { harmonics: { variants: { name: string; capacitorVoltageV: number }[] } };
    // A compensator's delta branches set its highest capacitor voltage: 400 V / (1 − p).
    expect(compensator.harmonics.variants.find((v) => v.name === 'plain')!.capacitorVoltageV).toBeCloseTo(400, 1);
  }, 120_000);
});

describe('the cost of a detuned bank', () => {
  it('is its capacitors\' real nameplate, 2 per unit and its detuning reactors at twice their kvar, as its statement says', () => {
    const r = JSON.parse(runTrivar(['correct', offices, '--arrangement', 'delta-bank', '--json']).stdout) as {
      harmonics: { chosen: string };
      selection: { nameplateKvar: number; units: number; steps: { detuningFactor: number }[]; cost: { value: number; statement: string } };
    };
    const p = r.selection.steps[0]!.detuningFactor;
    expect(p).toBeGreaterThan(0);
    expect(r.selection.cost.value).toBeCloseTo(r.selection.nameplateKvar + 2 * r.selection.units + 2 * p * r.selection.nameplateKvar, 9);
    expect(r.selection.cost.statement).toContain(`the ${Math.round(100 * p)} % detuning reactors at 2 × their kvar`);
  }, 120_000);
});

describe("the bank of the file's harmonics section", () => {
  it('correct says the bank it sizes takes its place; the report says its results leave it out', () => {
    const r = JSON.parse(runTrivar(['correct', offices, '--arrangement', 'star-bank', '--json']).stdout) as { warnings: { code: string; message: string; path: string }[] };
    const w = r.warnings.find((x) => x.code === 'file-bank-replaced')!;
    expect(w.path).toBe('harmonics.bank');
    expect(w.message).toContain("the bank of the board file's harmonics section (160 kvar at 440 V, delta) is not on the board in this study");
    const dir = mkdtempSync(join(tmpdir(), 'trivar-filebank-'));
    expect(runTrivar(['report', offices, '--format', 'md', '-o', join(dir, 'r.md')]).code).toBe(0);
    const md = readFileSync(join(dir, 'r.md'), 'utf8');
    const results = md.slice(md.indexOf('## Results'));
    expect(results).toMatch(/^The board as its loads are: the capacitor bank of the file's harmonics section \(steps 40 \+ 40 \+ 40 \+ 40 kvar, 440 V units, delta\) is not in these figures/m);
  }, 120_000);
});
