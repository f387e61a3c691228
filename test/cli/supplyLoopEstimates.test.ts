/**
 * The estimates `correct` and `harmonics` print beside their solves take the path the capacitor
 * current takes: on a single-phase board the line and the neutral (X_path 0.010 + 0.010 Ω), and the
 * rise from a capacitor's current is Q_C·X/V², from the reactance, not |Z|.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

const DIR = 'test/fixtures/supply-loop';
const flat = (text: string) => text.replace(/\s+/g, ' ');

describe('supply-path estimates on single-phase and split-phase boards', () => {
  it('single-phase: X_path 0.0200 Ω, h ≈ 19.8 warned near the 19th, rise 0.25 % as solved', () => {
    const r = runTrivar(['correct', `${DIR}/borehole-hut-single.yaml`]);
    expect(r.code).toBe(0);
    const text = flat(r.stdout);
    // By hand: X_path = 0.1 × 0.1 (line) + 0.1 × 0.1 (neutral) = 0.020 Ω; S_sc,X = 230²/0.020 = 2645 kVA.
    expect(text).toContain('X_path = 0.0200 Ω, the reactance of the loop out on the line and back on the neutral (S_sc,X = 2645 kVA');
    // The bank built is 405.6 µF: X_C = 1/(2π·50·405.6e-6) = 7.848 Ω, h = √(7.848/0.020) = 19.81, from X and C
    // alone (Q_C at the solved voltage over S_sc,X at nominal had put it at 19.88).
    const h = Number(/√\(S_sc,X\/Q_C\) = (\d+\.\d+)/.exec(text)?.[1]);
    expect(h).toBe(19.81);
    expect(text).toContain('within 10 % of order 19');
    expect(text).toMatch(/the bank and the supply inductance resonate near harmonic order 19\.8 \(within 10 % of the 19th\)/);
    // Rise: 6.7 kvar × 0.020 Ω / 230² = 0.25 %, the solved figure too.
    expect(text).toMatch(/≈ Q_C\/S_sc,X = 6\.7 kvar \(at the corrected board's voltage\) \/ 2645 kVA = 0\.25 % \(Q_C·X\/V²: the reactance, not \|Z\|\); solved 0\.25 %/);
  });

  it('single-phase with harmonic data: the scan peak and the estimate agree, S_sc is the loop’s 1870 kVA', () => {
    const h = runTrivar(['harmonics', `${DIR}/borehole-hut-single-harmonics.yaml`]);
    expect(h.code).toBe(0);
    // 230² / |0.02 + j0.02| = 1870 kVA (the line alone gave 3741 kVA).
    expect(h.stdout).toContain('Resonance with the supply (S_sc 1870 kVA)');
    const c = runTrivar(['correct', `${DIR}/borehole-hut-single-harmonics.yaml`]);
    expect(c.code).toBe(0);
    const estimate = Number(/√\(S_sc,X\/Q_C\) = (\d+\.\d+)/.exec(flat(c.stdout))?.[1]);
    const scanned = Number(/capacitors\s+plain \*\s+\S+\s+\S+\s+\S+\s+(\d+\.\d+)/.exec(c.stdout)?.[1]);
    expect(scanned).toBeGreaterThan(19.5);
    expect(Math.abs(estimate - scanned) / scanned).toBeLessThan(0.01);
  });

  it('split-phase behind a resistive feeder: the rise from the reactance, 0.21 % as solved (|Z| said 0.46 %)', () => {
    const r = runTrivar(['correct', `${DIR}/millrace-barn-split.yaml`]);
    expect(r.code).toBe(0);
    const text = flat(r.stdout);
    // A line-to-line bank: the two lines, 2 × 120²/0.010 = 2880 kVA; 5.9 kvar / 2880 kVA = 0.21 %.
    expect(text).toMatch(/≈ Q_C\/S_sc,X = 5\.9 kvar \(at the corrected board's voltage\) \/ 2880 kVA = 0\.21 % \(Q_C·X\/V²: the reactance, not \|Z\|\); solved 0\.21 %/);
    expect(text).not.toContain('1288 kVA');
  });

  it('a sub-board of a single-phase installation: every feeder line and neutral back to the source', () => {
    const r = runTrivar(['correct', `${DIR}/allotment-single-installation.yaml`, '--board', 'Pump shed']);
    expect(r.code).toBe(0);
    const text = flat(r.stdout);
    // 0.004 + 0.006 + 0.004 + 0.009 = 0.023 Ω; S_sc,X = 230²/0.023 = 2300 kVA.
    expect(text).toContain('X_path = 0.0230 Ω, the reactance of the loop out on the line and back on the neutral (S_sc,X = 2300 kVA');
    expect(text).toMatch(/≈ Q_C\/S_sc,X = \d+\.\d kvar \(at the corrected board's voltage\) \/ 2300 kVA/);
  });
});
