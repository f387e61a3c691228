/**
 * Sparse complex LU of a nodal admittance matrix with a pattern fixed once.
 *
 * Why by hand: the matrices here are structurally symmetric, their pattern never
 * changes between the many solves of one network (load iteration, correction
 * sizing, harmonic orders, batches of intervals), and each is small per board but
 * an installation has thousands of them in a tree. A general sparse package would
 * redo its symbolic work per call and allocate; this one does the symbolic work
 * (ordering, fill, the slot of every update) at compile time, so a numeric
 * factorisation is a flat loop over typed arrays with no allocation.
 *
 * Ordering: greedy minimum degree. Floating star points (degree 3) and leaf boards
 * go first, so fill stays inside each board's few phase nodes and the cost grows
 * linearly with boards and loads. No pivoting: nodal matrices of passive networks
 * are complex symmetric and well behaved; a pivot that comes out small against the
 * matrix is reported so the caller can fall back to the dense pivoted LU.
 */

export interface SparsePattern {
  /** Number of unknowns. */
  readonly size: number;
  /** Number of value slots (diagonal + off-diagonal entries with fill). */
  readonly slotCount: number;
  /** Slot of entry (i, j), by unknown number (not elimination order); -1 when structurally zero. */
  slotOf(i: number, j: number): number;
  /** Elimination position of each unknown. */
  readonly position: Int32Array;
  /** Unknown eliminated at each position. */
  readonly order: Int32Array;
  /** Per position k: diagonal slot. */
  readonly diagonal: Int32Array;
  /** Per position k: range [neighbourStart[k], neighbourStart[k+1]) into the lists below. */
  readonly neighbourStart: Int32Array;
  /** Position of each later neighbour of k (ascending). */
  readonly neighbourPosition: Int32Array;
  /** Slot of L(i, k) and U(k, i) for each later neighbour i of k. */
  readonly lowerSlot: Int32Array;
  readonly upperSlot: Int32Array;
  /** Per position k: range [updateStart[k], updateStart[k+1]) into updateSlot. */
  readonly updateStart: Int32Array;
  /** Slot of (i, j) for every pair of later neighbours of k, row-major over the neighbour list. */
  readonly updateSlot: Int32Array;
}

/**
 * Builds the pattern for an n×n structurally symmetric matrix whose off-diagonal
 * non-zeros are the given pairs (each unordered pair once or more).
 */
export function analysePattern(size: number, pairs: Iterable<readonly [number, number]>): SparsePattern {
  const graph: Set<number>[] = [];
  for (let v = 0; v < size; v++) graph.push(new Set<number>());
  for (const [i, j] of pairs) {
    if (i === j) continue;
    graph[i]!.add(j);
    graph[j]!.add(i);
  }
  // Greedy minimum degree on the elimination graph (symbolic elimination as we go).
  const order = new Int32Array(size);
  const position = new Int32Array(size).fill(-1);
  const laterNeighbours: number[][] = new Array(size);
  // Lazy binary heap of (degree, node): stale entries are skipped when popped.
  const heap: number[] = [];
  const key = (v: number) => graph[v]!.size * (size + 1) + v;
  const push = (v: number) => {
    heap.push(key(v));
    for (let c = heap.length - 1; c > 0; ) {
      const parent = (c - 1) >> 1;
      if (heap[parent]! <= heap[c]!) break;
      [heap[parent], heap[c]] = [heap[c]!, heap[parent]!];
      c = parent;
    }
  };
  const pop = (): number => {
    const top = heap[0]!;
    const last = heap.pop()!;
    if (heap.length > 0) {
      heap[0] = last;
      for (let c = 0; ; ) {
        const l = 2 * c + 1;
        const r = l + 1;
        let m = c;
        if (l < heap.length && heap[l]! < heap[m]!) m = l;
        if (r < heap.length && heap[r]! < heap[m]!) m = r;
        if (m === c) break;
        [heap[m], heap[c]] = [heap[c]!, heap[m]!];
        c = m;
      }
    }
    return top;
  };
  for (let v = 0; v < size; v++) push(v);
  for (let k = 0; k < size; k++) {
    let best = -1;
    while (best < 0) {
      const entry = pop();
      const v = entry % (size + 1);
      if (position[v]! < 0 && entry === key(v)) best = v;
    }
    order[k] = best;
    position[best] = k;
    const neighbours = [...graph[best]!];
    laterNeighbours[best] = neighbours;
    for (const a of neighbours) {
      graph[a]!.delete(best);
      for (const b of neighbours) if (a !== b) graph[a]!.add(b);
      push(a);
    }
    graph[best]!.clear();
  }
  // Slots: diagonal, then each (k, i) and (i, k) for later neighbours i. Small matrices
  // (every board) index slots in a dense table; large ones (installations) in a map.
  const dense = size <= 96 ? new Int32Array(size * size).fill(-1) : null;
  const slots = dense ? null : new Map<number, number>();
  let slotCount = 0;
  const slotKey = (i: number, j: number) => i * size + j;
  const lookup = (i: number, j: number): number => (dense ? dense[slotKey(i, j)]! : (slots!.get(slotKey(i, j)) ?? -1));
  const ensure = (i: number, j: number) => {
    let s = lookup(i, j);
    if (s < 0) {
      s = slotCount++;
      if (dense) dense[slotKey(i, j)] = s;
      else slots!.set(slotKey(i, j), s);
    }
    return s;
  };
  const diagonal = new Int32Array(size);
  const neighbourStart = new Int32Array(size + 1);
  const positionsOut: number[] = [];
  const lower: number[] = [];
  const upper: number[] = [];
  const updateStart = new Int32Array(size + 1);
  const update: number[] = [];
  for (let k = 0; k < size; k++) {
    const v = order[k]!;
    diagonal[k] = ensure(v, v);
    const later = laterNeighbours[v]!.slice().sort((a, b) => position[a]! - position[b]!);
    neighbourStart[k] = positionsOut.length;
    for (const i of later) {
      positionsOut.push(position[i]!);
      lower.push(ensure(i, v));
      upper.push(ensure(v, i));
    }
    updateStart[k] = update.length;
    for (const i of later) for (const j of later) update.push(ensure(i, j));
  }
  neighbourStart[size] = positionsOut.length;
  updateStart[size] = update.length;
  return {
    size,
    slotCount,
    slotOf: lookup,
    position,
    order,
    diagonal,
    neighbourStart,
    neighbourPosition: new Int32Array(positionsOut),
    lowerSlot: new Int32Array(lower),
    upperSlot: new Int32Array(upper),
    updateStart,
    updateSlot: new Int32Array(update),
  };
}

/**
 * Factorises in place (values by slot, split re/im). Returns -1 on success, or the
 * unknown whose pivot fell to `relativePivot` × `scale` or below.
 */
export function factorInPlace(p: SparsePattern, re: Float64Array, im: Float64Array, relativePivot: number, scale: number): number {
  const floor = relativePivot * scale;
  const floor2 = floor * floor;
  const { diagonal, neighbourStart, lowerSlot, upperSlot, updateStart, updateSlot } = p;
  for (let k = 0; k < p.size; k++) {
    const d = diagonal[k]!;
    const dr = re[d]!;
    const di = im[d]!;
    const dd = dr * dr + di * di;
    // |pivot| ≤ floor, compared squared (Math.hypot cost more than the rest of a small factorisation).
    if (dd <= floor2) return p.order[k]!;
    const start = neighbourStart[k]!;
    const count = neighbourStart[k + 1]! - start;
    let u = updateStart[k]!;
    for (let a = 0; a < count; a++) {
      const ls = lowerSlot[start + a]!;
      // L(i,k) = A(i,k) / A(k,k)
      const ar = re[ls]!;
      const ai = im[ls]!;
      const lr = (ar * dr + ai * di) / dd;
      const li = (ai * dr - ar * di) / dd;
      re[ls] = lr;
      im[ls] = li;
      for (let b = 0; b < count; b++) {
        const us = upperSlot[start + b]!;
        const ur = re[us]!;
        const ui = im[us]!;
        const t = updateSlot[u++]!;
        re[t] = re[t]! - (lr * ur - li * ui);
        im[t] = im[t]! - (lr * ui + li * ur);
      }
    }
  }
  return -1;
}

/**
 * Solves with a factorised matrix. `bRe/bIm` hold the right-hand side by unknown
 * number; `workRe/workIm` (length size) receive the solution by unknown number.
 */
export function solveFactored(
  p: SparsePattern,
  re: Float64Array,
  im: Float64Array,
  bRe: Float64Array,
  bIm: Float64Array,
  xRe: Float64Array,
  xIm: Float64Array,
): void {
  const { order } = p;
  const n = p.size;
  // Work in elimination order inside xRe/xIm.
  for (let k = 0; k < n; k++) {
    xRe[k] = bRe[order[k]!]!;
    xIm[k] = bIm[order[k]!]!;
  }
  substituteInOrder(p, re, im, xRe, xIm, 0);
  // Back to unknown numbering: permute through a scratch pass over cycles is fiddly;
  // the callers keep a second buffer, so copy via bRe/bIm (which they no longer need).
  // Plain loops: a subarray view is an allocation, and cost more than the whole solve of a small board.
  for (let k = 0; k < n; k++) {
    bRe[order[k]!] = xRe[k]!;
    bIm[order[k]!] = xIm[k]!;
  }
  for (let i = 0; i < n; i++) {
    xRe[i] = bRe[i]!;
    xIm[i] = bIm[i]!;
  }
}

/**
 * Forward and back substitution with a factorised matrix, in place on a vector held in
 * elimination order (entry k is the unknown `order[k]`) at `offset` in `xRe/xIm`:
 * callers that build their right-hand side by position skip the two permutations.
 */
export function substituteInOrder(p: SparsePattern, re: Float64Array, im: Float64Array, xRe: Float64Array, xIm: Float64Array, offset: number): void {
  forwardInOrder(p, re, im, xRe, xIm, offset);
  const { diagonal, neighbourStart, neighbourPosition, upperSlot } = p;
  for (let k = p.size - 1; k >= 0; k--) {
    let sr = xRe[offset + k]!;
    let si = xIm[offset + k]!;
    for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
      const j = offset + neighbourPosition[a]!;
      const us = upperSlot[a]!;
      sr -= re[us]! * xRe[j]! - im[us]! * xIm[j]!;
      si -= re[us]! * xIm[j]! + im[us]! * xRe[j]!;
    }
    const d = diagonal[k]!;
    const dr = re[d]!;
    const di = im[d]!;
    const dd = dr * dr + di * di;
    xRe[offset + k] = (sr * dr + si * di) / dd;
    xIm[offset + k] = (si * dr - sr * di) / dd;
  }
}

/**
 * `substituteInOrder` on `t` vectors at once, interleaved: entry k of vector c at k·t + c. Each
 * vector gets the same operations in the same order as alone (so the same bits); one pass over the
 * factors serves them all, where t passes read every slot and neighbour t times.
 * @param sRe scratch of length t
 */
export function substituteColumnsInOrder(p: SparsePattern, re: Float64Array, im: Float64Array, xRe: Float64Array, xIm: Float64Array, t: number, sRe: Float64Array, sIm: Float64Array): void {
  const { diagonal, neighbourStart, neighbourPosition, lowerSlot, upperSlot } = p;
  const n = p.size;
  for (let k = 0; k < n; k++) {
    const row = k * t;
    for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
      const i = neighbourPosition[a]! * t;
      const ls = lowerSlot[a]!;
      const lr = re[ls]!;
      const li = im[ls]!;
      for (let c = 0; c < t; c++) {
        const yr = xRe[row + c]!;
        const yi = xIm[row + c]!;
        if (yr === 0 && yi === 0) continue;
        xRe[i + c] = xRe[i + c]! - (lr * yr - li * yi);
        xIm[i + c] = xIm[i + c]! - (lr * yi + li * yr);
      }
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const row = k * t;
    for (let c = 0; c < t; c++) {
      sRe[c] = xRe[row + c]!;
      sIm[c] = xIm[row + c]!;
    }
    for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
      const j = neighbourPosition[a]! * t;
      const us = upperSlot[a]!;
      const ur = re[us]!;
      const ui = im[us]!;
      for (let c = 0; c < t; c++) {
        sRe[c] = sRe[c]! - (ur * xRe[j + c]! - ui * xIm[j + c]!);
        sIm[c] = sIm[c]! - (ur * xIm[j + c]! + ui * xRe[j + c]!);
      }
    }
    const d = diagonal[k]!;
    const dr = re[d]!;
    const di = im[d]!;
    const dd = dr * dr + di * di;
    for (let c = 0; c < t; c++) {
      xRe[row + c] = (sRe[c]! * dr + sIm[c]! * di) / dd;
      xIm[row + c] = (sIm[c]! * dr - sRe[c]! * di) / dd;
    }
  }
}

/**
 * y ← y + A·x for `t` vectors interleaved as in `substituteColumnsInOrder`, A the values by slot
 * before factorising. Row k's sum takes the entries of earlier rows (added as each is reached),
 * then A(k, k), then the later neighbours in order; each vector's sums are those of it alone.
 */
export function multiplyAddColumnsInOrder(p: SparsePattern, re: Float64Array, im: Float64Array, xRe: Float64Array, xIm: Float64Array, t: number, yRe: Float64Array, yIm: Float64Array): void {
  const { diagonal, neighbourStart, neighbourPosition, lowerSlot, upperSlot } = p;
  for (let k = 0; k < p.size; k++) {
    const row = k * t;
    const d = diagonal[k]!;
    const dr = re[d]!;
    const di = im[d]!;
    for (let c = 0; c < t; c++) {
      const xr = xRe[row + c]!;
      const xi = xIm[row + c]!;
      yRe[row + c] = yRe[row + c]! + dr * xr - di * xi;
      yIm[row + c] = yIm[row + c]! + dr * xi + di * xr;
    }
    for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
      const i = neighbourPosition[a]! * t;
      const u = upperSlot[a]!; // A(k, i)
      const l = lowerSlot[a]!; // A(i, k)
      const ur = re[u]!;
      const ui = im[u]!;
      const lr = re[l]!;
      const li = im[l]!;
      for (let c = 0; c < t; c++) {
        const xr = xRe[row + c]!;
        const xi = xIm[row + c]!;
        yRe[row + c] = yRe[row + c]! + ur * xRe[i + c]! - ui * xIm[i + c]!;
        yIm[row + c] = yIm[row + c]! + ur * xIm[i + c]! + ui * xRe[i + c]!;
        yRe[i + c] = yRe[i + c]! + lr * xr - li * xi;
        yIm[i + c] = yIm[i + c]! + lr * xi + li * xr;
      }
    }
  }
}

/**
 * The forward half: x ← L⁻¹·x (L unit lower triangular), in place, in elimination order.
 * For a complex-symmetric matrix (every nodal matrix here), U = D·Lᵀ with D the pivots,
 * so aᵀ·A⁻¹·b = (L⁻¹a)ᵀ·D⁻¹·(L⁻¹b): transfer impedances need no back substitution.
 */
export function forwardInOrder(p: SparsePattern, re: Float64Array, im: Float64Array, xRe: Float64Array, xIm: Float64Array, offset: number): void {
  const { neighbourStart, neighbourPosition, lowerSlot } = p;
  for (let k = 0; k < p.size; k++) {
    const yr = xRe[offset + k]!;
    const yi = xIm[offset + k]!;
    if (yr === 0 && yi === 0) continue;
    for (let a = neighbourStart[k]!, end = neighbourStart[k + 1]!; a < end; a++) {
      const i = offset + neighbourPosition[a]!;
      const ls = lowerSlot[a]!;
      xRe[i] = xRe[i]! - (re[ls]! * yr - im[ls]! * yi);
      xIm[i] = xIm[i]! - (re[ls]! * yi + im[ls]! * yr);
    }
  }
}
