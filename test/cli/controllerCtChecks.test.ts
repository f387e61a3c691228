/**
 * A current transformer given for the correction's controller is checked against what it must read:
 * a primary below the line current saturates it, and one so large that the C/k setting falls below
 * what controllers resolve leaves the smallest step unswitchable.
 */
import { describe, expect, it } from 'vitest';
import { runTrivar } from './runTrivar.js';

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
  it('so large that the C/k setting is finer than controllers resolve: warned', () => {
    const r = runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--ct', '5000', '--json']);
    const codes = (JSON.parse(r.stdout) as { warnings: { code: string }[] }).warnings.map((x) => x.code);
    expect(codes).toContain('ck-below-resolution');
    const plain = JSON.parse(runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--json']).stdout) as { warnings: { code: string }[] };
    expect(plain.warnings.map((x) => x.code)).not.toContain('ck-below-resolution');
    expect(plain.warnings.map((x) => x.code)).not.toContain('ct-below-line-current');
  }, 60_000);
});
