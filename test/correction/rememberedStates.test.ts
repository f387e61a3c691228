/**
 * The probe's kept trial states: the keyed look-up finds exactly what a plain scan of the ring of
 * the last `capacity` states finds (same state, same misses), outputs told apart to the bit.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { RememberedStates } from '../../packages/core/src/correction/_internal/rememberedStates.js';

interface State {
  readonly kvar: readonly number[];
  readonly id: number;
}

/** The plain way: a ring of the last `capacity` states, scanned in full. */
function plainRing(capacity: number) {
  const states: State[] = [];
  let next = 0;
  return {
    find: (kvar: readonly number[]) => states.find((s) => s.kvar.length === kvar.length && s.kvar.every((x, i) => Object.is(x, kvar[i]))),
    add: (s: State) => {
      states[next] = s;
      next = (next + 1) % capacity;
    },
  };
}

// Few distinct values, so the same outputs come back often; −0 beside 0, and values whose weighted sums collide.
const output = fc.constantFrom(0, -0, 1, 2, 3, 0.5, 1e-300, NaN, Infinity, -Infinity, 1e16, 1e16 + 2);
const vector = fc.oneof(fc.array(output, { minLength: 3, maxLength: 3 }), fc.array(output, { minLength: 0, maxLength: 6 }));

describe('RememberedStates', () => {
  it('finds what a plain scan of the ring finds, miss for miss, state for state', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 8 }), fc.array(vector, { minLength: 1, maxLength: 10 }), fc.array(fc.nat(), { maxLength: 120 }), (capacity, pool, picks) => {
        const kept = new RememberedStates<State>(capacity);
        const plain = plainRing(capacity);
        let solved = 0;
        // Each question a fresh copy of one of a few vectors: the same outputs, another array.
        for (const kvar of picks.map((p) => [...pool[p % pool.length]!])) {
          const found = kept.find(kvar);
          expect(found).toBe(plain.find(kvar));
          if (!found) {
            const state = { kvar: [...kvar], id: solved++ };
            kept.add(state);
            plain.add(state);
          }
        }
      }),
      { numRuns: 500 },
    );
  });

  it('tells −0 from 0 and keeps only the last `capacity` states', () => {
    const kept = new RememberedStates<State>(2);
    kept.add({ kvar: [0, 1], id: 0 });
    expect(kept.find([-0, 1])).toBeUndefined();
    expect(kept.find([0, 1])?.id).toBe(0);
    kept.add({ kvar: [2, 0], id: 1 });
    kept.add({ kvar: [3, 0], id: 2 });
    expect(kept.find([0, 1])).toBeUndefined();
    expect(kept.find([2, 0])?.id).toBe(1);
    expect(kept.find([3, 0])?.id).toBe(2);
  });
});
