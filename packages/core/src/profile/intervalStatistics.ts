/** Order statistics over typed columns, with the interval at which a value occurs. */

export interface ValueAt {
  readonly value: number;
  /** Interval index of the value (the first, if it occurs more than once). */
  readonly index: number;
}

/** Largest value and where (ties: the first). */
export function maximumOf(x: Float64Array): ValueAt {
  let index = 0;
  for (let i = 1; i < x.length; i++) if (x[i]! > x[index]!) index = i;
  return { value: x.length ? x[index]! : 0, index };
}

export function minimumOf(x: Float64Array): ValueAt {
  let index = 0;
  for (let i = 1; i < x.length; i++) if (x[i]! < x[index]!) index = i;
  return { value: x.length ? x[index]! : 0, index };
}

/**
 * Nearest-rank percentiles: the value at or below which `share` of the
 * intervals fall (sorted[ceil(share·n) − 1]), and the first interval holding it.
 */
export function percentilesOf(x: Float64Array, shares: readonly number[]): ValueAt[] {
  const sorted = Float64Array.from(x).sort();
  return shares.map((share) => {
    const value = sorted.length ? sorted[Math.max(0, Math.ceil(share * sorted.length) - 1)]! : 0;
    return { value, index: x.indexOf(value) };
  });
}

/** Number of intervals where the predicate holds. */
export function countWhere(n: number, predicate: (i: number) => boolean): number {
  let c = 0;
  for (let i = 0; i < n; i++) if (predicate(i)) c++;
  return c;
}

/** Indices of the `k` largest values, largest first. */
export function topIndices(x: Float64Array, k: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < x.length; i++) {
    if (out.length < k || x[i]! > x[out[out.length - 1]!]!) {
      out.push(i);
      out.sort((a, b) => x[b]! - x[a]!);
      if (out.length > k) out.pop();
    }
  }
  return out;
}
