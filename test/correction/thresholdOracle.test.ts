/**
 * A bisection asking the threshold oracle ends on the same bits as one that evaluates every midpoint,
 * in far fewer evaluations (the equal-share window's two bisections run this way).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createThresholdOracle, type SideReading } from '../../packages/core/src/correction/_internal/thresholdOracle.js';

/** The equal-share window's bisection: doubling from `start`, then halving to 1e-12 of the bracket. */
function bisect(isLow: (t: number) => boolean, start: number, narrow: () => void = () => {}): number {
  let ok = 0;
  let bad = start;
  while (isLow(bad)) {
    ok = bad;
    bad *= 2;
    if (bad > 1e9) break;
  }
  narrow();
  for (let i = 0; i < 50 && bad - ok > 1e-12 * bad; i++) {
    const mid = (ok + bad) / 2;
    if (isLow(mid)) ok = mid;
    else bad = mid;
  }
  return ok;
}

/** A smooth decreasing margin with its zero at `root`, curved so that regula falsi has work to do. */
const marginAt = (root: number, curve: number) => (t: number) => (root - t) * (1 + curve * t) + 1e-3 * curve * (root * root - t * t);

describe('threshold oracle', () => {
  it('gives a bisection the same end point, bit for bit, with fewer evaluations', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 1e4, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.double({ min: 1e-4, max: 10, noNaN: true }),
        (root, curve, startFraction) => {
          const margin = marginAt(root, curve);
          let plainCalls = 0;
          const plain = bisect((t) => (plainCalls++, margin(t) >= 0), startFraction * root);
          let oracleCalls = 0;
          const oracle = createThresholdOracle((t): SideReading => {
            oracleCalls++;
            const m = margin(t);
            return { low: m >= 0, margin: m };
          }, 1e-12 * root);
          // As the equal-share window does: the unequipped board (t = 0) is read first.
          oracle.isLow(0);
          const viaOracle = bisect((t) => oracle.isLow(t), startFraction * root, () => oracle.narrow());
          expect(Object.is(viaOracle, plain)).toBe(true);
          expect(oracleCalls).toBeLessThan(plainCalls);
        },
      ),
    );
  });

  it('answers from a recorded reading without evaluating, and evaluates where in doubt', () => {
    const asked: number[] = [];
    const oracle = createThresholdOracle((t) => (asked.push(t), { low: t < 5, margin: 5 - t }), 0.5);
    oracle.record(4, { low: true, margin: 1 });
    oracle.record(6, { low: false, margin: -1 });
    expect(oracle.isLow(3)).toBe(true);
    expect(oracle.isLow(7)).toBe(false);
    expect(asked).toEqual([]);
    // Within the doubt width of a solved point, or between the two: solved.
    expect(oracle.isLow(5.5)).toBe(false);
    expect(oracle.isLow(3.75)).toBe(true);
    expect(oracle.isLow(5.75)).toBe(false);
    expect(asked).toEqual([5.5, 3.75, 5.75]);
  });
});
