/**
 * Floating star points against Millman's theorem:
 * V_N'N = (Ya·Va + Yb·Vb + Yc·Vc) / (Ya + Yb + Yc + Yn), Yn = 0 for no neutral.
 * (Network theorem, J. Millman 1940; see METHODS.md §8.)
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { polar, solveBoard } from '@trivar/core';

type Z = { r: number; x: number };
const inv = (z: Z) => {
  const d = z.r * z.r + z.x * z.x;
  return { re: z.r / d, im: -z.x / d };
};
const cmul = (a: { re: number; im: number }, b: { re: number; im: number }) => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const cdiv = (a: { re: number; im: number }, b: { re: number; im: number }) => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};

function millman(zs: Z[], zn: Z | null, vln: number) {
  const v = [0, -120, 120].map((deg) => polar(vln, (deg * Math.PI) / 180));
  const ys = zs.map(inv);
  let num = { re: 0, im: 0 };
  let den = zn ? inv(zn) : { re: 0, im: 0 };
  ys.forEach((y, k) => {
    const t = cmul(y, v[k]!);
    num = { re: num.re + t.re, im: num.im + t.im };
    den = { re: den.re + y.re, im: den.im + y.im };
  });
  return cdiv(num, den);
}

const zArb = fc.record({ r: fc.double({ min: 1, max: 100, noNaN: true }), x: fc.double({ min: -50, max: 50, noNaN: true }) });

describe("Millman's theorem", () => {
  it('gives the floating star point of three unequal line-to-neutral loads when the neutral is broken', () => {
    fc.assert(
      fc.property(zArb, zArb, zArb, (za, zb, zc) => {
        const vln = 400 / Math.sqrt(3);
        const board = {
          supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
          feeder: { neutral: { r: 0, x: 0 } },
          loads: [
            { name: 'a', connection: 'A-N', ohms: za },
            { name: 'b', connection: 'B-N', ohms: zb },
            { name: 'c', connection: 'C-N', ohms: zc },
          ],
        } as const;
        const r = solveBoard(board, { openNeutral: true });
        // With the neutral broken the three loads form a floating star: its point is the neutral bar.
        const expected = millman([za, zb, zc], null, vln);
        const bar = r.openNeutral!.barVoltage!;
        expect(Math.abs(bar.re - expected.re)).toBeLessThan(1e-9 * vln);
        expect(Math.abs(bar.im - expected.im)).toBeLessThan(1e-9 * vln);
      }),
      { numRuns: 60 },
    );
  });
  it('gives the neutral-bar voltage through a neutral conductor impedance', () => {
    fc.assert(
      fc.property(zArb, zArb, zArb, zArb, (za, zb, zc, zn) => {
        const vln = 400 / Math.sqrt(3);
        const zNeutral = { r: zn.r / 20, x: Math.abs(zn.x) / 20 };
        const r = solveBoard({
          supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
          feeder: { neutral: zNeutral },
          loads: [
            { name: 'a', connection: 'A-N', ohms: za },
            { name: 'b', connection: 'B-N', ohms: zb },
            { name: 'c', connection: 'C-N', ohms: zc },
          ],
        });
        const expected = millman([za, zb, zc], zNeutral, vln);
        const bar = r.neutral!.barVoltage!;
        expect(Math.abs(bar.re - expected.re)).toBeLessThan(1e-9 * vln);
        expect(Math.abs(bar.im - expected.im)).toBeLessThan(1e-9 * vln);
      }),
      { numRuns: 60 },
    );
  });
  it('puts a balanced floating star at the centroid of unbalanced line voltages (3-wire)', () => {
    // Millman with Ya = Yb = Yc: V_N' = (Va + Vb + Vc)/3, so the shift from the centroid is zero.
    const r = solveBoard({
      supply: {
        system: 'three-phase-3wire',
        voltage: { lineToLine: 400 },
        frequencyHz: 50,
        emf: { A: { V: 240, angleDeg: 0 }, B: { V: 225, angleDeg: -118 }, C: { V: 231, angleDeg: 123 } },
        impedance: { r: 0.02, x: 0.05 },
      },
      loads: [{ name: 'heater bank', connection: 'ABC-star', ohms: { r: 20, x: 4 } }],
    });
    expect(r.loads[0]!.starPointShift!.magnitude).toBeLessThan(1e-9 * 231);
  });
});
