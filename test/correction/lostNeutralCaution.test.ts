/**
 * Equipment that puts capacitors from a line to the neutral carries the broken-neutral caution, in the
 * very words the broken-neutral study gives for the same capacitors, and a warning with the bank's own
 * floating figures where its branches are unequal. A bank between lines does not.
 */
import { describe, expect, it } from 'vitest';
import { correctBoard, normaliseBoard, parseBoard, solveBoard } from '@trivar/core';
import { lineToNeutralCapacitorsCaution } from '../../packages/core/src/analysis/openNeutralWording.js';

// A smallholding with a rooftop inverter exporting on L1: the lines need very different kvar.
const LOADS = [
  { name: 'Roof array', connection: 'A-N', kW: -12, pf: 1 },
  { name: 'Bulk tank chiller', connection: 'A-N', kW: 3, pf: 0.7 },
  { name: 'Slurry pump', connection: 'ABC-delta', kW: 11, pf: 0.74 },
  { name: 'Boiler element', connection: 'B-N', kW: 6, pf: 1 },
  { name: 'Barn lights', connection: 'C-N', kW: 1.5, pf: 0.85 },
];
const SUPPLY = { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 100, impedancePercent: 4, xOverR: 2.5 } };
const board = normaliseBoard(parseBoard({ name: 'Brackenfield smallholding', supply: SUPPLY, loads: LOADS }));

describe('a star bank tied to the neutral with unequal branches', () => {
  const r = correctBoard(board, { arrangement: 'star-bank' });

  it('carries the broken-neutral study’s own caution, naming its branches', () => {
    expect(r.status).toBe('meets-target');
    const caution = r.cautions.find((c) => c.startsWith('The star bank puts capacitors from line to neutral'))!;
    expect(caution).toContain('(A-N 8.33, B-N 1.00, C-N 5.00 kvar nameplate)');
    expect(caution.endsWith(lineToNeutralCapacitorsCaution('phases', 'star'))).toBe(true);
    expect(caution).toContain('correct power factor between lines (a delta or floating-star bank) rather than line to neutral');
  });

  it('warns with the bank’s own floating star point: B-N at 1.41 × line-to-neutral, 1.16 × its 280 V units', () => {
    const w = r.warnings.find((x) => x.code === 'lost-neutral-unequal-bank')!;
    // Millman over the built branches, by hand from the verified susceptances and phase voltages.
    const v = r.verification;
    const tied = v.branches.filter((b) => b.branch.endsWith('-N'));
    const u = (branch: string) => v.after.phases.find((p) => `${p.phase}-N` === branch)!.voltage;
    const sumB = tied.reduce((s, b) => s + b.susceptanceS, 0);
    const star = tied.reduce((acc, b) => ({ re: acc.re + (b.susceptanceS * u(b.branch).re) / sumB, im: acc.im + (b.susceptanceS * u(b.branch).im) / sumB }), { re: 0, im: 0 });
    const acrossB = Math.hypot(u('B-N').re - star.re, u('B-N').im - star.im);
    expect(w.value!).toBeCloseTo(acrossB, 9);
    expect(w.value!).toBeCloseTo(325.4, 1);
    // Judged against the system's nominal 230 V (IEC 60038), as every voltage verdict is.
    expect(w.threshold!).toBeCloseTo(1.1 * 230, 9);
    expect(w.message).toContain('the B-N capacitors see 325.4 V (1.41 × line-to-neutral, 1.16 × their 280 V rating)');
  });

  it('solve’s broken-neutral study says the same of the same capacitors written as loads', () => {
    const built = r.verification.branches.filter((b) => b.branch.endsWith('-N'));
    const capacitorsAsLoads = built.map((b) => ({ name: `Bank ${b.branch}`, connection: b.branch, kW: 0, kvar: -b.kvarAtAppliedV, model: 'constant-impedance' }));
    const solved = solveBoard({ name: 'Brackenfield with the bank in', supply: SUPPLY, loads: [...LOADS, ...capacitorsAsLoads], studies: { openNeutral: true } });
    expect(solved.openNeutral!.cautions).toContain(lineToNeutralCapacitorsCaution('phases', 'star'));
  });
});

describe('equipment with no capacitor from a line to the neutral', () => {
  it('a delta bank: no lost-neutral caution or warning', () => {
    const r = correctBoard(board, { arrangement: 'delta-bank' });
    expect(r.cautions.some((c) => c.includes('line to neutral'))).toBe(false);
    expect(r.warnings.some((w) => w.code === 'lost-neutral-unequal-bank')).toBe(false);
  });

  it('an equal star bank on a balanced board: the caution, but no floating warning (its star point stays at the centre)', () => {
    const balanced = normaliseBoard(parseBoard({ name: 'Kennel block', supply: SUPPLY, loads: [{ name: 'Run heaters and fans', connection: 'ABC-star', kW: 20, pf: 0.75 }] }));
    const r = correctBoard(balanced, { arrangement: 'star-bank' });
    expect(r.cautions[0]).toMatch(/^The star bank puts capacitors from line to neutral \(A-N (\d+\.\d\d), B-N \1, C-N \1 kvar nameplate\)/);
    expect(r.warnings.some((w) => w.code === 'lost-neutral-unequal-bank')).toBe(false);
  });
});
