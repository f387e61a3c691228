/**
 * The nodal solve of a network with four unknowns (a three-phase four-wire board's
 * three phases and neutral: the commonest board there is) written out: the same LU in
 * the same elimination order as sparseComplexLu.ts's `factorInPlace` and
 * `substituteInOrder`, every operation in the same order, on locals. The sparse code
 * walks slot lists (an index load and a bounds check per entry); on four unknowns that
 * walk is most of the solve. Entries the sparse pattern leaves out are zeros here: a zero
 * multiplier subtracts ±0, so finite results are the same to the bit (the solve's
 * property test checks it), only the sign of an exact zero could differ.
 * The repetition below is the point: the loops of the sparse code unrolled for n = 4, each
 * block one pivot, row or substitution step, so that V8 keeps the entries in registers.
 *
 * The pattern is kept, with its slots renumbered positionally (`withPositionalSlots`):
 * entry (row, column) in elimination order at 4·row + column. Every other user of the
 * pattern (port reduction, transfer impedances, the dense fallback) goes through its slot
 * lists and sees the same factors.
 */
import type { SparsePattern } from './sparseComplexLu.js';

/** The same pattern with slot 4·row + column for entry (row, column) by elimination position. */
export function withPositionalSlots(p: SparsePattern): SparsePattern {
  if (p.size !== 4) throw new RangeError(`withPositionalSlots: four unknowns expected (received ${p.size})`);
  const slotOf = (i: number, j: number): number => 4 * p.position[i]! + p.position[j]!;
  // Each old slot's (row, column) by position, to renumber the slot lists.
  const renumber = new Int32Array(p.slotCount).fill(-1);
  for (let i = 0; i < 4; i++)
    for (let j = 0; j < 4; j++) {
      const s = p.slotOf(i, j);
      if (s >= 0) renumber[s] = slotOf(i, j);
    }
  const map = (slots: Int32Array) => Int32Array.from(slots, (s) => renumber[s]!);
  return {
    size: 4,
    slotCount: 16,
    slotOf,
    position: p.position,
    order: p.order,
    diagonal: map(p.diagonal),
    neighbourStart: p.neighbourStart,
    neighbourPosition: p.neighbourPosition,
    lowerSlot: map(p.lowerSlot),
    upperSlot: map(p.upperSlot),
    updateStart: p.updateStart,
    updateSlot: map(p.updateSlot),
  };
}

/**
 * Factorises the 4×4 matrix `re/im` (positional slots) in place and solves for the
 * right-hand side in `xRe/xIm` (elimination order), in place. Returns -1, or the position
 * whose pivot's squared modulus fell to `floor2` or below (then nothing is written back:
 * the caller takes the dense pivoted LU, which assembles afresh).
 */
export function factorSolveFourInPlace(re: Float64Array, im: Float64Array, xRe: Float64Array, xIm: Float64Array, floor2: number): number {
  let a00r = re[0]!;
  let a00i = im[0]!;
  let a01r = re[1]!;
  let a01i = im[1]!;
  let a02r = re[2]!;
  let a02i = im[2]!;
  let a03r = re[3]!;
  let a03i = im[3]!;
  let a10r = re[4]!;
  let a10i = im[4]!;
  let a11r = re[5]!;
  let a11i = im[5]!;
  let a12r = re[6]!;
  let a12i = im[6]!;
  let a13r = re[7]!;
  let a13i = im[7]!;
  let a20r = re[8]!;
  let a20i = im[8]!;
  let a21r = re[9]!;
  let a21i = im[9]!;
  let a22r = re[10]!;
  let a22i = im[10]!;
  let a23r = re[11]!;
  let a23i = im[11]!;
  let a30r = re[12]!;
  let a30i = im[12]!;
  let a31r = re[13]!;
  let a31i = im[13]!;
  let a32r = re[14]!;
  let a32i = im[14]!;
  let a33r = re[15]!;
  let a33i = im[15]!;
  // pivot 0
  const d0r = a00r;
  const d0i = a00i;
  const dd0 = d0r * d0r + d0i * d0i;
  if (dd0 <= floor2) return 0;
  {
    const ar = a10r;
    const ai = a10i;
    const lr = (ar * d0r + ai * d0i) / dd0;
    const li = (ai * d0r - ar * d0i) / dd0;
    a10r = lr;
    a10i = li;
    a11r = a11r - (lr * a01r - li * a01i);
    a11i = a11i - (lr * a01i + li * a01r);
    a12r = a12r - (lr * a02r - li * a02i);
    a12i = a12i - (lr * a02i + li * a02r);
    a13r = a13r - (lr * a03r - li * a03i);
    a13i = a13i - (lr * a03i + li * a03r);
  }
  {
    const ar = a20r;
    const ai = a20i;
    const lr = (ar * d0r + ai * d0i) / dd0;
    const li = (ai * d0r - ar * d0i) / dd0;
    a20r = lr;
    a20i = li;
    a21r = a21r - (lr * a01r - li * a01i);
    a21i = a21i - (lr * a01i + li * a01r);
    a22r = a22r - (lr * a02r - li * a02i);
    a22i = a22i - (lr * a02i + li * a02r);
    a23r = a23r - (lr * a03r - li * a03i);
    a23i = a23i - (lr * a03i + li * a03r);
  }
  {
    const ar = a30r;
    const ai = a30i;
    const lr = (ar * d0r + ai * d0i) / dd0;
    const li = (ai * d0r - ar * d0i) / dd0;
    a30r = lr;
    a30i = li;
    a31r = a31r - (lr * a01r - li * a01i);
    a31i = a31i - (lr * a01i + li * a01r);
    a32r = a32r - (lr * a02r - li * a02i);
    a32i = a32i - (lr * a02i + li * a02r);
    a33r = a33r - (lr * a03r - li * a03i);
    a33i = a33i - (lr * a03i + li * a03r);
  }
  // pivot 1
  const d1r = a11r;
  const d1i = a11i;
  const dd1 = d1r * d1r + d1i * d1i;
  if (dd1 <= floor2) return 1;
  {
    const ar = a21r;
    const ai = a21i;
    const lr = (ar * d1r + ai * d1i) / dd1;
    const li = (ai * d1r - ar * d1i) / dd1;
    a21r = lr;
    a21i = li;
    a22r = a22r - (lr * a12r - li * a12i);
    a22i = a22i - (lr * a12i + li * a12r);
    a23r = a23r - (lr * a13r - li * a13i);
    a23i = a23i - (lr * a13i + li * a13r);
  }
  {
    const ar = a31r;
    const ai = a31i;
    const lr = (ar * d1r + ai * d1i) / dd1;
    const li = (ai * d1r - ar * d1i) / dd1;
    a31r = lr;
    a31i = li;
    a32r = a32r - (lr * a12r - li * a12i);
    a32i = a32i - (lr * a12i + li * a12r);
    a33r = a33r - (lr * a13r - li * a13i);
    a33i = a33i - (lr * a13i + li * a13r);
  }
  // pivot 2
  const d2r = a22r;
  const d2i = a22i;
  const dd2 = d2r * d2r + d2i * d2i;
  if (dd2 <= floor2) return 2;
  {
    const ar = a32r;
    const ai = a32i;
    const lr = (ar * d2r + ai * d2i) / dd2;
    const li = (ai * d2r - ar * d2i) / dd2;
    a32r = lr;
    a32i = li;
    a33r = a33r - (lr * a23r - li * a23i);
    a33i = a33i - (lr * a23i + li * a23r);
  }
  // pivot 3
  const d3r = a33r;
  const d3i = a33i;
  const dd3 = d3r * d3r + d3i * d3i;
  if (dd3 <= floor2) return 3;
  re[4] = a10r;
  im[4] = a10i;
  re[5] = a11r;
  im[5] = a11i;
  re[6] = a12r;
  im[6] = a12i;
  re[7] = a13r;
  im[7] = a13i;
  re[8] = a20r;
  im[8] = a20i;
  re[9] = a21r;
  im[9] = a21i;
  re[10] = a22r;
  im[10] = a22i;
  re[11] = a23r;
  im[11] = a23i;
  re[12] = a30r;
  im[12] = a30i;
  re[13] = a31r;
  im[13] = a31i;
  re[14] = a32r;
  im[14] = a32i;
  re[15] = a33r;
  im[15] = a33i;
  let x0r = xRe[0]!;
  let x0i = xIm[0]!;
  let x1r = xRe[1]!;
  let x1i = xIm[1]!;
  let x2r = xRe[2]!;
  let x2i = xIm[2]!;
  let x3r = xRe[3]!;
  let x3i = xIm[3]!;
  if (x0r !== 0 || x0i !== 0) {
    x1r = x1r - (a10r * x0r - a10i * x0i);
    x1i = x1i - (a10r * x0i + a10i * x0r);
    x2r = x2r - (a20r * x0r - a20i * x0i);
    x2i = x2i - (a20r * x0i + a20i * x0r);
    x3r = x3r - (a30r * x0r - a30i * x0i);
    x3i = x3i - (a30r * x0i + a30i * x0r);
  }
  if (x1r !== 0 || x1i !== 0) {
    x2r = x2r - (a21r * x1r - a21i * x1i);
    x2i = x2i - (a21r * x1i + a21i * x1r);
    x3r = x3r - (a31r * x1r - a31i * x1i);
    x3i = x3i - (a31r * x1i + a31i * x1r);
  }
  if (x2r !== 0 || x2i !== 0) {
    x3r = x3r - (a32r * x2r - a32i * x2i);
    x3i = x3i - (a32r * x2i + a32i * x2r);
  }
  {
    let sr = x3r;
    let si = x3i;
    x3r = (sr * d3r + si * d3i) / dd3;
    x3i = (si * d3r - sr * d3i) / dd3;
  }
  {
    let sr = x2r;
    let si = x2i;
    sr -= a23r * x3r - a23i * x3i;
    si -= a23r * x3i + a23i * x3r;
    x2r = (sr * d2r + si * d2i) / dd2;
    x2i = (si * d2r - sr * d2i) / dd2;
  }
  {
    let sr = x1r;
    let si = x1i;
    sr -= a12r * x2r - a12i * x2i;
    si -= a12r * x2i + a12i * x2r;
    sr -= a13r * x3r - a13i * x3i;
    si -= a13r * x3i + a13i * x3r;
    x1r = (sr * d1r + si * d1i) / dd1;
    x1i = (si * d1r - sr * d1i) / dd1;
  }
  {
    let sr = x0r;
    let si = x0i;
    sr -= a01r * x1r - a01i * x1i;
    si -= a01r * x1i + a01i * x1r;
    sr -= a02r * x2r - a02i * x2i;
    si -= a02r * x2i + a02i * x2r;
    sr -= a03r * x3r - a03i * x3i;
    si -= a03r * x3i + a03i * x3r;
    x0r = (sr * d0r + si * d0i) / dd0;
    x0i = (si * d0r - sr * d0i) / dd0;
  }
  xRe[0] = x0r;
  xIm[0] = x0i;
  xRe[1] = x1r;
  xIm[1] = x1i;
  xRe[2] = x2r;
  xIm[2] = x2i;
  xRe[3] = x3r;
  xIm[3] = x3i;
  return -1;
}
