/** No NaN or infinity reaches a caller: the check passes finite data through and names the first bad value's path. */
import { describe, expect, it } from 'vitest';
import { assertFiniteResult } from '../../packages/core/src/analysis/assertFiniteResult.js';
import { NumericalError } from '../../packages/core/src/errors.js';

describe('assertFiniteResult', () => {
  it('hands finite data back as it is (strings, nulls and booleans are not numbers)', () => {
    const data = { name: 'x', rows: [[1, -2.5e300, 0], [null, true]], nested: { a: { b: [{ c: 3 }] } } };
    expect(assertFiniteResult(data)).toBe(data);
  });
  for (const [bad, path] of [
    [{ rows: [[1, 2], [3, Number.NaN]] }, 'rows[1][1]'],
    [{ nested: { a: { b: [{ c: Infinity }] } } }, 'nested.a.b[0].c'],
    [{ loads: [{ kW: 1 }, { kW: -Infinity }] }, 'loads[1].kW'],
    [[0, [Number.NaN]], '[1][0]'],
  ] as const)
    it(`refuses a non-finite value and names its path (${path})`, () => {
      expect(() => assertFiniteResult(bad)).toThrow(NumericalError);
      expect(() => assertFiniteResult(bad)).toThrow(`the result has a non-finite value at ${path};`);
    });
});
