/**
 * The bank search skips builds whose key bound cannot beat the best so far; it must still choose
 * exactly the build the exhaustive search (every build judged) chooses, over random windows, units
 * and rules shaped as `selectBankUnits` makes them, and over windows it does not make.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { searchSet, type Need, type SetRules, type UnitChoice } from '../../packages/core/src/correction/_internal/bankSearch.js';
import { runs } from './support/arbitraries.js';

const KVARS = [0.5, 1, 1.5, 2, 2.5, 3.33, 5, 6.67, 7.5, 10, 12.5, 15, 20, 25, 30, 50];

/** A unit as `selectBankUnits` offers it: element capacitance from its nameplate. */
const choiceArb = (kind: 'three-phase' | 'single-phase', unitsPerCount: number): fc.Arbitrary<UnitChoice> =>
  fc.record({ kvar: fc.constantFrom(...KVARS), ratedV: fc.constantFrom(240, 277, 400, 415, 480), ratedHz: fc.constantFrom(50 as const, 60 as const) }).map(({ kvar, ratedV, ratedHz }) => ({
    unit: { name: `${kvar} kvar ${ratedV} V`, kind, ratedKvar: kvar, ratedV, ratedHz },
    index: null,
    elementF: ((kind === 'three-phase' ? kvar / 3 : kvar) * 1000) / (2 * Math.PI * ratedHz * ratedV ** 2),
    unitsPerCount,
  }));

/** A window as `selectBankUnits` builds it: min = nominal/(1 − tol⁻), max = limit/(1 + tol⁺), at times empty (max < min). */
const needArb: fc.Arbitrary<Need> = fc
  .record({
    nominalF: fc.oneof(fc.constant(0), fc.double({ min: 1e-6, max: 1.5e-3, noNaN: true })),
    limit: fc.oneof(fc.constant(null), fc.constant(0), fc.double({ min: 0.6, max: 2.5, noNaN: true })),
    minus: fc.double({ min: 0, max: 0.2, noNaN: true }),
    plus: fc.double({ min: 0, max: 0.2, noNaN: true }),
    fixedShare: fc.double({ min: 0, max: 1, noNaN: true }),
  })
  .map(({ nominalF, limit, minus, plus, fixedShare }) => {
    const minF = nominalF / (1 - minus);
    const limitF = limit === null ? null : limit === 0 ? 0 : Math.max(limit * nominalF, 2e-5 * limit);
    return { nominalF, minF, maxF: limitF === null ? null : limitF / (1 + plus), limitF, fixedMaxF: fixedShare * minF };
  });

const rulesArb: fc.Arbitrary<SetRules> = fc.record({
  unitCostKvar: fc.constantFrom(0, 0.5, 2, 3),
  singleLineStepsKvar: fc.constantFrom(0, 5, 25),
  minSwitchedSteps: fc.integer({ min: 1, max: 4 }),
  minStepKvar: fc.constantFrom(0, 1, 2.5, 5),
  // The least step in capacitance per branch (0: none), as selectBankUnits derives it from C/k; the
  // C/k per farad of each kind of step, and the step series kept within (Infinity: none).
  leastStepF: fc.record({ balanced: fc.constantFrom(0, 2e-5, 1e-4, 4e-4), trims: fc.array(fc.constantFrom(0, 1e-5, 6e-5, 3e-4), { minLength: 3, maxLength: 3 }) }),
  ckPerF: fc.record({ balanced: fc.double({ min: 100, max: 5000, noNaN: true }), trims: fc.array(fc.double({ min: 100, max: 5000, noNaN: true }), { minLength: 3, maxLength: 3 }) }),
  widestStepRatio: fc.constantFrom(3, 10, Infinity),
  outputs: fc.integer({ min: 1, max: 12 }),
  maxUnitsPerBranch: fc.integer({ min: 1, max: 30 }),
});

/** A three-phase set (balanced units of both kinds, trims per branch, at times an equal bank's own window) or a lone branch. */
const setArb = fc.oneof(
  fc.record({
    needs: fc.array(needArb, { minLength: 3, maxLength: 3 }),
    balanced: fc.tuple(fc.array(choiceArb('three-phase', 1), { maxLength: 5 }), fc.array(choiceArb('single-phase', 3), { maxLength: 5 })).map(([a, b]) => [...a, ...b]),
    trims: fc.array(fc.array(choiceArb('single-phase', 1), { maxLength: 6 }), { minLength: 3, maxLength: 3 }),
    equal: fc.option(needArb.map((need) => [need, need, need])),
    rules: rulesArb,
  }),
  fc.record({
    needs: fc.array(needArb, { minLength: 1, maxLength: 1 }),
    balanced: fc.array(choiceArb('single-phase', 1), { maxLength: 8 }),
    trims: fc.constant([[]] as UnitChoice[][]),
    equal: fc.constant(null),
    rules: rulesArb,
  }),
);

describe('bank search with skipped builds', () => {
  it('chooses the exhaustive search\'s build on windows shaped as selectBankUnits makes them', () => {
    fc.assert(
      fc.property(setArb, ({ needs, balanced, trims, equal, rules }) => {
        const equalNeeds = equal ?? undefined;
        const pruned = searchSet(needs, balanced, trims, rules, equalNeeds);
        const exhaustive = searchSet(needs, balanced, trims, rules, equalNeeds, { exhaustive: true });
        expect(pruned).toStrictEqual(exhaustive);
        // The same unit objects, not merely equal ones: the report names the catalogue entry chosen.
        expect(pruned.balanced?.choice).toBe(exhaustive.balanced?.choice);
        pruned.trims.forEach((t, k) => expect(t.choice).toBe(exhaustive.trims[k]!.choice));
      }),
      { numRuns: runs(400) },
    );
  });

  it('chooses the exhaustive search\'s build where ties are likely (units of equal size, windows on unit multiples)', () => {
    // Many builds share a key here, so the first one met must win in both searches.
    const unit = (kvar: number, kind: 'three-phase' | 'single-phase', unitsPerCount: number, tag: string): UnitChoice => ({
      unit: { name: `${kvar} kvar ${tag}`, kind, ratedKvar: kvar, ratedV: 400, ratedHz: 50 },
      index: null,
      elementF: ((kind === 'three-phase' ? kvar / 3 : kvar) * 1000) / (2 * Math.PI * 50 * 400 ** 2),
      unitsPerCount,
    });
    const elementOf2p5 = unit(2.5, 'single-phase', 1, '').elementF;
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 24 }), fc.integer({ min: 0, max: 8 }), fc.boolean()), { minLength: 3, maxLength: 3 }),
        rulesArb,
        (windows, rules) => {
          const needs: Need[] = windows.map(([n, extra, open]) => {
            const nominalF = n * elementOf2p5;
            const limitF = open ? null : (n + extra) * elementOf2p5;
            return { nominalF, minF: nominalF, maxF: limitF, limitF, fixedMaxF: 0 };
          });
          // Without a cost per unit, one 15 kvar unit and two of 7.5 kvar cost the same (and the two make more steps).
          const balanced = [unit(15, 'three-phase', 1, 'a'), unit(5, 'single-phase', 3, 'b'), unit(7.5, 'three-phase', 1, 'c'), unit(15, 'three-phase', 1, 'd'), unit(2.5, 'single-phase', 3, 'e')];
          const trims = [0, 1, 2].map(() => [unit(5, 'single-phase', 1, 'f'), unit(2.5, 'single-phase', 1, 'g'), unit(5, 'single-phase', 1, 'h'), unit(1.5, 'single-phase', 1, 'i'), unit(1, 'single-phase', 1, 'j')]);
          const pruned = searchSet(needs, balanced, trims, rules);
          const exhaustive = searchSet(needs, balanced, trims, rules, needs, { exhaustive: true });
          expect(pruned).toStrictEqual(exhaustive);
          expect(pruned.balanced?.choice).toBe(exhaustive.balanced?.choice);
          pruned.trims.forEach((t, k) => expect(t.choice).toBe(exhaustive.trims[k]!.choice));
        },
      ),
      { numRuns: runs(300) },
    );
  });
});
