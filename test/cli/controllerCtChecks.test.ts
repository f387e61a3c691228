/**
 * A current transformer given for the correction's controller is checked against what it must read:
 * a primary below the line current saturates it, and one so large that the C/k setting falls below
 * what controllers resolve leaves the smallest step unswitchable.
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
  it('so large that the C/k setting is finer than controllers resolve: warned', () => {
    const r = runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--ct', '5000', '--json']);
    const codes = (JSON.parse(r.stdout) as { warnings: { code: string }[] }).warnings.map((x) => x.code);
    expect(codes).toContain('ck-below-resolution');
    const plain = JSON.parse(runTrivar(['correct', riverside, '--arrangement', 'delta-bank', '--json']).stdout) as { warnings: { code: string }[] };
    expect(plain.warnings.map((x) => x.code)).not.toContain('ck-below-resolution');
    expect(plain.warnings.map((x) => x.code)).not.toContain('ct-below-line-current');
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
