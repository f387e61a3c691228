/**
 * On a balanced board fed from an ideal source, every arrangement must give
 * the textbook per-phase rating Q = P·(tan φ1 − tan φ2).
 * Source: the PFC identity Q_C = P·(tan φ1 − tan φ2) (methods notes §7; any
 * power-factor-correction textbook).
 */
import { describe, expect, it } from 'vitest';
import { sizeDeltaBank, sizeStarBank, type TargetDefinition } from '@trivar/core';
import { makeBoard } from './support/boards.js';
import { relativeError } from '../support/tolerance.js';

const P_PER_PHASE_KW = 30;
const PF_BEFORE = 0.8;
const PF_TARGET = 0.95;
const tan = (pf: number) => Math.sqrt(1 - pf * pf) / pf;
const expectedKvar = P_PER_PHASE_KW * (tan(PF_BEFORE) - tan(PF_TARGET));

const balancedLoads = (['A', 'B', 'C'] as const).map((p) => ({ name: `line ${p} heating pumps`, connection: `${p}-N`, kW: P_PER_PHASE_KW, pf: PF_BEFORE }));
const fourWire = makeBoard('three-phase-4wire', balancedLoads);
const threeWire = makeBoard('three-phase-3wire', [{ name: 'chiller', connection: 'ABC-delta', kW: 3 * P_PER_PHASE_KW, pf: PF_BEFORE }]);

describe('balanced board, ideal source: Q = P·(tan φ1 − tan φ2) per phase (PFC identity)', () => {
  const definitions: TargetDefinition[] = ['per-line', 'effective', 'vector', 'arithmetic', 'positive-sequence'];
  for (const definition of definitions) {
    it(`star bank to neutral, ${definition} target`, () => {
      const sizing = sizeStarBank(fourWire, { target: { pf: PF_TARGET, definition } });
      expect(sizing.status).toBe('meets-target');
      for (const b of sizing.branches) expect(relativeError(b.kvarAtNominalV, expectedKvar)).toBeLessThan(1e-9);
    });
    it(`delta bank, ${definition} target`, () => {
      const sizing = sizeDeltaBank(fourWire, { target: { pf: PF_TARGET, definition } });
      expect(sizing.status).toBe('meets-target');
      for (const b of sizing.branches) expect(relativeError(b.kvarAtNominalV, expectedKvar)).toBeLessThan(1e-9);
      // A balanced delta bank moves no active current between lines.
      for (const l of sizing.lines) expect(Math.abs(l.activeCurrentA.change)).toBeLessThan(1e-9 * l.activeCurrentA.before);
    });
  }

  it('floating star bank on a 3-wire board: same rating, star point stays at the centroid', () => {
    const sizing = sizeStarBank(threeWire, { target: { pf: PF_TARGET } });
    expect(sizing.status).toBe('meets-target');
    for (const b of sizing.branches) expect(relativeError(b.kvarAtNominalV, expectedKvar)).toBeLessThan(1e-9);
    expect(sizing.starPointShift!.magnitude).toBeLessThan(1e-9);
  });

  it('the capacitance matches C = Q/(ω·V²) at the element voltage (methods notes §4)', () => {
    const star = sizeStarBank(fourWire, { target: { pf: PF_TARGET } }).branches[0]!;
    const delta = sizeDeltaBank(fourWire, { target: { pf: PF_TARGET } }).branches[0]!;
    const omega = 2 * Math.PI * 50;
    expect(relativeError(star.capacitanceUF!, ((expectedKvar * 1000) / (omega * (400 / Math.sqrt(3)) ** 2)) * 1e6)).toBeLessThan(1e-9);
    expect(relativeError(delta.capacitanceUF!, ((expectedKvar * 1000) / (omega * 400 ** 2)) * 1e6)).toBeLessThan(1e-9);
    // C_Y = 3·C_Δ for the same kvar (methods notes §4).
    expect(relativeError(star.capacitanceUF!, 3 * delta.capacitanceUF!)).toBeLessThan(1e-9);
  });

  it('per-line targets per phase: each phase gets P·(tan φ1 − tan φ_x) (PFC identity, phases independent on 4 wires)', () => {
    const perPhase = { A: 0.9, B: 0.95, C: 0.99 } as const;
    const sizing = sizeStarBank(fourWire, { target: { pf: 0.9, perPhase } });
    sizing.branches.forEach((b, k) => {
      const target = Object.values(perPhase)[k]!;
      expect(relativeError(b.kvarAtNominalV, P_PER_PHASE_KW * (tan(PF_BEFORE) - tan(target)))).toBeLessThan(1e-9);
    });
  });

  it('the selection window: up to the upper lagging bound, or to the lowest leading PF when leading is allowed (PFC identity)', () => {
    const bounded = sizeStarBank(fourWire, { target: { pf: 0.9, maxLaggingPf: 0.98 } });
    const allowed = sizeStarBank(fourWire, { target: { pf: 0.9, leading: 'allowed', minLeadingPf: 0.95 } });
    const never = sizeStarBank(fourWire, { target: { pf: 0.9 } });
    const kvarOfB = (b: number) => (b * (400 / Math.sqrt(3)) ** 2) / 1000;
    for (let k = 0; k < 3; k++) {
      // The minimum is the same in all three; only the top of the window moves.
      expect(relativeError(bounded.branches[k]!.kvarAtNominalV, P_PER_PHASE_KW * (tan(PF_BEFORE) - tan(0.9)))).toBeLessThan(1e-9);
      expect(relativeError(kvarOfB(bounded.branches[k]!.limitSusceptanceS!), P_PER_PHASE_KW * (tan(PF_BEFORE) - tan(0.98)))).toBeLessThan(1e-9);
      expect(relativeError(kvarOfB(never.branches[k]!.limitSusceptanceS!), P_PER_PHASE_KW * tan(PF_BEFORE))).toBeLessThan(1e-9);
      expect(relativeError(kvarOfB(allowed.branches[k]!.limitSusceptanceS!), P_PER_PHASE_KW * (tan(PF_BEFORE) + tan(0.95)))).toBeLessThan(1e-9);
    }
  });
});
