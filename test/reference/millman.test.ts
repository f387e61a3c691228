/**
 * Floating star points against Millman's theorem:
 * V_N'N = (Ya·Va + Yb·Vb + Yc·Vc) / (Ya + Yb + Yc + Yn), Yn = 0 for no neutral.
 * (Network theorem, J. Millman 1940; see METHODS.md §8.)
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { solveBoard, type BoardSpec, type ComplexValue } from '@trivar/core';
import { C0, c, cAdd, cDiv, cInv, cMul, cPolarDeg } from '../support/complexMath.js';
import { expectComplexClose } from '../support/tolerance.js';

type Z = { r: number; x: number };
const VLN = 400 / Math.sqrt(3);
const admittance = (z: Z) => cInv(c(z.r, z.x));

/** Millman's theorem, written out independently of core (balanced ABC EMFs of VLN). */
function millman(zs: readonly Z[], zn: Z | null): ComplexValue {
  const emf = [0, -120, 120].map((deg) => cPolarDeg(VLN, deg));
  const ys = zs.map(admittance);
  const num = ys.reduce((acc, y, k) => cAdd(acc, cMul(y, emf[k]!)), C0);
  const den = ys.reduce(cAdd, zn ? admittance(zn) : C0);
  return cDiv(num, den);
}

/** Three line-to-neutral impedances on a 400 V 4-wire board, with the given neutral conductor. */
const starOfThree = ([za, zb, zc]: readonly Z[], neutral: Z): BoardSpec => ({
  supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50 },
  feeder: { neutral },
  loads: [
    { name: 'a', connection: 'A-N', ohms: za! },
    { name: 'b', connection: 'B-N', ohms: zb! },
    { name: 'c', connection: 'C-N', ohms: zc! },
  ],
});

const zArb = fc.record({ r: fc.double({ min: 1, max: 100, noNaN: true }), x: fc.double({ min: -50, max: 50, noNaN: true }) });
const tolerance = { rel: 0, abs: 1e-9 * VLN };

describe("Millman's theorem", () => {
  it('gives the floating star point of three unequal line-to-neutral loads when the neutral is broken', () => {
    fc.assert(
      fc.property(fc.tuple(zArb, zArb, zArb), (zs) => {
        // With the neutral broken the three loads form a floating star: its point is the neutral bar.
        const r = solveBoard(starOfThree(zs, { r: 0, x: 0 }), { openNeutral: true });
        expectComplexClose(r.openNeutral!.barVoltage!, millman(zs, null), tolerance, 'floating star point');
      }),
      { numRuns: 60 },
    );
  });
  it('gives the neutral-bar voltage through a neutral conductor impedance', () => {
    fc.assert(
      fc.property(fc.tuple(zArb, zArb, zArb), zArb, (zs, zn) => {
        const neutral = { r: zn.r / 20, x: Math.abs(zn.x) / 20 };
        const r = solveBoard(starOfThree(zs, neutral));
        expectComplexClose(r.neutral!.barVoltage!, millman(zs, neutral), tolerance, 'neutral bar voltage');
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
    expect(r.loads[0]!.starPointShift!.magnitude).toBeLessThan(1e-9 * VLN);
  });
});
