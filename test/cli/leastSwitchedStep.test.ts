/**
 * The least switched step, as a panel builder would judge a bank: no switched step whose C/k is
 * below 1 % of the CT secondary (2 % and 2.5 kvar behind a detuning reactor), the least step stated
 * in kvar and C/k in the text and the JSON, and a build a smaller step would have fitted named with
 * its figures where the board then falls short. Two invented boards: a sawmill whose saw hall once got
 * a 2 kvar trim beside 25–30 kvar steps, and a crusher board whose 7 % detuned bank once got a 1.5 kvar
 * trim behind its own 34 mH reactor.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const SAWMILL = 'test/fixtures/steps/sawmill-site.yaml';
const CRUSHER = 'test/fixtures/steps/crusher-board-harmonics.yaml';

interface Step {
  readonly output: number | null;
  readonly part: string;
  readonly branches: readonly string[];
  readonly unit: { readonly ratedKvar: number; readonly ratedV: number; readonly kind: string };
  readonly units: number;
  readonly kvarAtNominalV: number;
  readonly responseThresholdA: number;
  readonly thresholdBasis: string;
  readonly detuningFactor: number;
}
interface Least {
  readonly detuned: boolean;
  readonly responseThresholdA: number;
  readonly shareOfSecondary: number;
  readonly ctPrimaryA: number;
  readonly ctSecondaryA: number;
  readonly floors: readonly { kind: string; voltageV: number; kvarAtNominalV: number }[];
  readonly ratio: number | null;
  readonly heldBack: { branches: readonly string[]; kvarAtNominalV: number; responseThresholdA: number } | null;
}
interface Report {
  readonly status: string;
  readonly reasons: readonly string[];
  readonly warnings: readonly { code: string; message: string }[];
  readonly selection: { readonly steps: readonly Step[]; readonly leastStep: Least; readonly controller: { ctPrimaryA: number; ctSecondaryA: number } };
}

const json = (args: readonly string[]): Report => {
  const r = runTrivar([...args, '--json']);
  expect(r.stderr).toBe('');
  const out = JSON.parse(r.stdout) as Report & { report?: Report };
  return out.selection ? out : out.report!;
};
const flat = (text: string) => text.replace(/\s+/g, ' ');
const switched = (r: Report) => r.selection.steps.filter((s) => s.output !== null);

describe('the saw hall delta bank (a 300 A board)', () => {
  const args = ['correct', SAWMILL, '--board', 'Saw hall', '--arrangement', 'delta-bank'];
  it('has no switched step below 1 % of the CT secondary, and still meets the target', () => {
    const r = json(args);
    expect(r.status).toBe('meets-target');
    const least = r.selection.leastStep;
    expect(least.detuned).toBe(false);
    expect(least.ctSecondaryA).toBe(5);
    // 1 % of a 5 A secondary (common practice, no source; the reason in CORRECTION_DEFAULTS).
    expect(least.responseThresholdA).toBeCloseTo(0.05, 12);
    for (const s of switched(r)) expect(s.responseThresholdA).toBeGreaterThanOrEqual(least.responseThresholdA);
    // The step of 2 kvar nameplate (1.65 kvar at 400 V, C/k 0.045 A) the review found is gone.
    expect(switched(r).every((s) => s.kvarAtNominalV > 2)).toBe(true);
    expect(least.heldBack).toBeNull();
  }, 60_000);

  it('C/k by hand: Q_step / (√3 · U · k_CT) for a three-phase step, √3/2 · Q / (U · k_CT) per line across a line pair (methods notes §10)', () => {
    const r = json(args);
    const k = r.selection.controller.ctPrimaryA / r.selection.controller.ctSecondaryA;
    expect(r.selection.controller.ctPrimaryA).toBe(400); // next standard rating above 1.25 × 294.2 A
    for (const s of switched(r)) {
      // The step's output at 400 V from its nameplate, Q ∝ U² (methods notes §4).
      const q = s.units * s.unit.ratedKvar * 1000 * (400 / s.unit.ratedV) ** 2;
      const hand = s.thresholdBasis === 'three-phase' ? q / (Math.sqrt(3) * 400 * k) : ((Math.sqrt(3) / 2) * q) / (400 * k);
      expect(s.responseThresholdA).toBeCloseTo(hand, 9);
    }
    // The smallest step of the build: at least the least C/k, which the old 2 kvar trim (0.045 A) was not.
    expect(Math.min(...switched(r).map((s) => s.responseThresholdA))).toBeGreaterThan(0.05);
    // The least step in kvar inverts the same formulas: 0.05 A · 80 · √3 · 400 V = 2.771 kvar three-phase,
    // 0.05 A · 80 · 400 V · 2/√3 = 1.848 kvar across a line pair.
    const floor = (kind: string) => r.selection.leastStep.floors.find((f) => f.kind === kind)!.kvarAtNominalV;
    expect(floor('three-phase')).toBeCloseTo((0.05 * 80 * Math.sqrt(3) * 400) / 1000, 9);
    expect(floor('line-pair')).toBeCloseTo((0.05 * 80 * 400 * 2) / Math.sqrt(3) / 1000, 9);
  }, 60_000);

  it('states the least step beside the build, in kvar and C/k', () => {
    const text = flat(runTrivar(args).stdout);
    expect(text).toContain('with no switched step below the least step');
    expect(text).toContain('least switched step: C/k 0.050 A on the 400/5 A CT (1 % of its 5 A secondary');
    expect(text).toContain('i.e. 2.77 kvar three-phase or 1.85 kvar across a line pair at 400 V nominal, and 1 kvar nameplate');
    expect(text).not.toContain('the minimum step');
  }, 60_000);
});

describe('the crusher board delta bank with detuning reactors', () => {
  const args = ['correct', CRUSHER, '--arrangement', 'delta-bank'];
  it('builds no detuned step below 2 % of the CT secondary or 2.5 kvar, and still meets the target', () => {
    const r = json(args);
    expect(r.status).toBe('meets-target');
    const least = r.selection.leastStep;
    expect(least.detuned).toBe(true);
    expect(least.responseThresholdA).toBeCloseTo(0.1, 12);
    const steps = switched(r);
    expect(steps.length).toBeGreaterThan(0);
    for (const s of steps) {
      expect(s.detuningFactor).toBeGreaterThan(0);
      expect(s.responseThresholdA).toBeGreaterThanOrEqual(least.responseThresholdA);
      expect(s.kvarAtNominalV).toBeGreaterThanOrEqual(2.5);
    }
    // 300/5 A: three-phase 0.1 · 60 · √3 · 400 = 4.157 kvar; across a line pair 0.1 · 60 · 400 · 2/√3 = 2.771 kvar.
    const floor = (kind: string) => least.floors.find((f) => f.kind === kind)!.kvarAtNominalV;
    expect(least.ctPrimaryA).toBe(300);
    expect(floor('three-phase')).toBeCloseTo(4.157, 3);
    expect(floor('line-pair')).toBeCloseTo(2.771, 3);
  }, 120_000);

  it('states the detuned least step in words', () => {
    const text = flat(runTrivar(args).stdout);
    expect(text).toContain('least switched step: C/k 0.100 A on the 300/5 A CT (2 % of its 5 A secondary for a detuned step, and 2.5 kvar at nominal voltage');
  }, 120_000);
});

describe('a CT so large that the small steps fall below the least', () => {
  // The hillside workshop's delta bank needs a 0.83 kvar step on A-B to fit its ranges; on a 2000/5 A CT
  // its C/k is (√3/2) · 826.4 / (400 · 400) = 0.0045 A, a tenth of the least.
  it('misses the target and says which step it would have needed, with its figures', () => {
    const r = json(['correct', 'examples/hillside-workshop.yaml', '--arrangement', 'delta-bank', '--ct', '2000']);
    expect(r.status).toBe('misses-target-with-available-units');
    const held = r.selection.leastStep.heldBack!;
    expect(held.branches).toEqual(['A-B']);
    expect(held.responseThresholdA).toBeCloseTo(((Math.sqrt(3) / 2) * held.kvarAtNominalV * 1000) / (400 * 400), 9);
    expect(held.responseThresholdA).toBeLessThan(r.selection.leastStep.responseThresholdA);
    const reason = r.reasons.find((x) => x.includes('below the least switched step'))!;
    expect(reason).toContain(`a build with a ${held.kvarAtNominalV.toFixed(2)} kvar switched step on A-B (C/k ${held.responseThresholdA.toFixed(3)} A)`);
    expect(reason).toContain('C/k 0.050 A on the 2000/5 A CT');
    for (const s of switched(r)) expect(s.responseThresholdA).toBeGreaterThanOrEqual(r.selection.leastStep.responseThresholdA);
  }, 60_000);
});
