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
 * Found by selection on one copy (linear time) rather than a full sort, which
 * took a tenth of a year-long profile run; the ranks are taken largest first so
 * each later selection works on the part below the previous one.
 */
export function percentilesOf(x: Float64Array, shares: readonly number[]): ValueAt[] {
  const n = x.length;
  if (n === 0) return shares.map(() => ({ value: 0, index: 0 }));
  const work = Float64Array.from(x);
  const ranks = shares.map((share) => Math.min(n - 1, Math.max(0, Math.ceil(share * n) - 1)));
  const values = new Map<number, number>();
  let hi = n - 1;
  for (const rank of [...new Set(ranks)].sort((a, b) => b - a)) {
    values.set(rank, selectRank(work, rank, 0, hi));
    hi = rank;
  }
  return ranks.map((rank) => {
    const value = values.get(rank)!;
    return { value, index: x.indexOf(value) };
  });
}

/**
 * Rearranges a[lo..hi] so that a[k] holds the value a sorted copy would hold
 * there, everything before it ≤ and after it ≥ (Hoare's selection, median of
 * three). Hand-written: the order-statistics packages on npm sort or copy.
 */
export function selectRank(a: Float64Array, k: number, lo: number, hi: number): number {
  while (hi > lo) {
    const mid = (lo + hi) >>> 1;
    // Median of three into a[mid] as the pivot.
    if (a[mid]! < a[lo]!) swap(a, mid, lo);
    if (a[hi]! < a[lo]!) swap(a, hi, lo);
    if (a[hi]! < a[mid]!) swap(a, hi, mid);
    const pivot = a[mid]!;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i]! < pivot) i++;
      while (a[j]! > pivot) j--;
      if (i <= j) {
        swap(a, i, j);
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k]!;
  }
  return a[k]!;
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i]!;
  a[i] = a[j]!;
  a[j] = t;
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
