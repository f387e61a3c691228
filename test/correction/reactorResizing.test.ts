/**
 * A balancing compensator built from units: the capacitors come in unit steps,
 * so the reactors sized beside the exact capacitors are sized again beside the
 * capacitors as built (refitReactors), with the balance target held where the
 * reactors can hold it. Checked by re-solving with the reactors as sized and as
 * re-sized, on the hillside workshop (capacitors rounded down: PF1+ 0.874, neutral 22.2 % of
 * |I1|; re-sized 0.895). The study also builds the capacitors rounded up and keeps that build there.
 */
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  addCorrectionEquipment,
  checkBalance,
  checkTarget,
  correctBoard,
  CORRECTION_DEFAULTS,
  selectBankUnits,
  sizeBalancingCompensator,
  normaliseBoard,
  parseBoardText,
  solveBoardModel,
  type Board,
  type CorrectionReport,
  type EquipmentGroup,
} from '@trivar/core';
import { expectClose } from '../support/tolerance.js';
import { refitReactors } from '../../packages/core/src/correction/_internal/refitReactors.js';

const boardOf = (file: string): Board => normaliseBoard(parseBoardText(readFileSync(new URL(`../../examples/${file}`, import.meta.url), 'utf8')));

/** The verified build with each re-sized reactor put back to its value as sized. */
function withSizedReactors(r: CorrectionReport): EquipmentGroup[] {
  const sized = new Map(r.reactorResizing!.reactors.map((x) => [x.branch, x.sizedKvar]));
  return r.verification.equipment.map((g) => ({
    ...g,
    branches: g.branches.map((b) => {
      const q = sized.get(b.branch);
      if (q === undefined) return b;
      const s = (-q * 1000) / b.vNominal ** 2;
      return { ...b, susceptanceS: s, fixedSusceptanceS: s };
    }),
  }));
}

describe('hillside workshop: capacitors rounded down beside the reactors, the reactors re-sized around them', () => {
  // The build the study weighs as "rounded down": each capacitor at most its requirement.
  const board = boardOf('hillside-workshop.yaml');
  const sizing = sizeBalancingCompensator(board, {});
  const down = selectBankUnits(sizing.ideal, { practice: 'iec' });
  const refit = refitReactors(board, down.equipment, {
    target: sizing.target,
    balance: sizing.balance,
    includeZeroSequence: sizing.branchesUsed === 'delta-and-star',
    weights: sizing.weights,
    maxIterations: CORRECTION_DEFAULTS.maxIterations,
  })!;
  const asSized = solveBoardModel(addCorrectionEquipment(board, down.equipment));
  const asBuilt = solveBoardModel(addCorrectionEquipment(board, refit.equipment));
  const before = solveBoardModel(board);

  it('with the reactors as sized, the built capacitors miss both targets (PF1+ 0.874, neutral 22.2 % of |I1|)', () => {
    expectClose(asSized.powerFactor.positiveSequence!.pf!, 0.874, { rel: 0, abs: 5e-4 });
    const balance = checkBalance(asSized, sizing.balance);
    expect(balance.met).toBe(false);
    expectClose(balance.neutralPercent!, 22.2, { rel: 0, abs: 0.05 });
  });

  it('re-sized, the balance target is met and PF1+ rises to 0.895, still short of 0.95', () => {
    expect(refit.used).toBe(true);
    expect(refit.reactors.map((x) => x.branch)).toEqual(['B-C', 'A-N', 'B-N']);
    expect(checkBalance(asBuilt, sizing.balance).met).toBe(true);
    expectClose(asBuilt.powerFactor.positiveSequence!.pf!, 0.895, { rel: 0, abs: 5e-4 });
    expect(checkTarget(asBuilt, sizing.target, before).met).toBe(false);
    // The capacitors are the units chosen; only the reactors moved.
    const capacitors = (groups: readonly EquipmentGroup[]) => groups.flatMap((g) => g.branches.filter((b) => b.susceptanceS > 0).map((b) => [b.branch, b.susceptanceS]));
    expect(capacitors(refit.equipment)).toEqual(capacitors(down.equipment));
  });
});

describe('hillside workshop: the study rounds the capacitors up instead, and meets the target', () => {
  const board = boardOf('hillside-workshop.yaml');
  const r = correctBoard(board, { arrangement: 'balancing-compensator' });

  it('both roundings are re-solved: rounded down misses, rounded up meets at nominal capacitance and is built', () => {
    expect(r.roundingBesideReactors).toMatchObject({ used: 'up', verdictDown: 'misses', verdictUp: 'meets-at-nominal' });
    expect(r.status).toBe('meets-target-at-nominal-capacitance');
    // Cost: units plus the reactors at twice their kvar, as the arrangement comparison counts them.
    const reactorKvar = r.verification.branches.filter((b) => b.element === 'reactor').reduce((sum, b) => sum + Math.abs(b.kvarAtNominalV), 0);
    expectClose(r.roundingBesideReactors!.costUp!, r.selection!.cost.value + 2 * reactorKvar, { rel: 1e-12, abs: 1e-9 });
  });

  it('re-solved as built, PF1+ is at least 0.95 and the balance target is met', () => {
    const asBuilt = solveBoardModel(addCorrectionEquipment(board, r.verification.equipment));
    expect(asBuilt.powerFactor.positiveSequence!.pf).toBeGreaterThanOrEqual(0.95);
    expect(checkBalance(asBuilt, r.balance!.target).met).toBe(true);
    r.verification.after.phases.forEach((p, k) => expectClose(p.current.magnitude, asBuilt.phases[k]!.current.magnitude, { rel: 1e-9, abs: 1e-9 }));
    // No line leads at nominal capacitance (the target is "never leading").
    for (const p of asBuilt.phases) expect(p.kvar).toBeGreaterThan(0);
  });
});

describe('a build that meets its targets with the reactors as sized keeps them', () => {
  it('corner bakery: the compensator meets both targets, the reactors stay as sized', () => {
    const r = correctBoard(boardOf('corner-bakery.yaml'), { arrangement: 'balancing-compensator' });
    expect(r.status).toBe('meets-target');
    expect(r.reactorResizing?.used).toBe(false);
    // What is verified is the units' selection as it came, reactors included (sized values, the negligible one dropped).
    expect(r.verification.equipment).toEqual(r.selection!.equipment);
    const reactors = r.verification.equipment.flatMap((g) => g.branches.filter((b) => b.susceptanceS < 0).map((b) => b.branch));
    expect(reactors).toEqual(['C-A', 'B-N']);
  });
});

describe('re-sizing never leaves a build further from its targets (property)', () => {
  it('targets met with the re-sized reactors ≥ with the reactors as sized, whenever they are used', () => {
    const boards = ['hillside-workshop.yaml', 'corner-bakery.yaml'].map(boardOf);
    fc.assert(
      fc.property(fc.constantFrom(...boards), fc.double({ min: 0.9, max: 0.99, noNaN: true }), (board, pf) => {
        const r = correctBoard(board, { arrangement: 'balancing-compensator', target: { pf } });
        if (!r.reactorResizing?.used) return;
        const compensator = r.sizing.arrangement === 'balancing-compensator' ? r.sizing : null;
        const met = (res: ReturnType<typeof solveBoardModel>) => Number(checkTarget(res, r.target, r.verification.before).met) + Number(checkBalance(res, compensator!.balance).met);
        const asSized = solveBoardModel(addCorrectionEquipment(board, withSizedReactors(r)));
        expect(met(r.verification.after)).toBeGreaterThanOrEqual(met(asSized));
        for (const x of r.reactorResizing.reactors) expect(x.resizedKvar).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 5 },
    );
  });
});
