/**
 * A floating star of capacitors is, exactly, a delta: Y→Δ gives
 * B_ab = B_a·B_b/ΣB (network theorem), whatever the source does. Its line
 * currents are homogeneous of degree one in the susceptances but not linear,
 * and with one branch empty the star point is undefined — a poor problem to
 * linearise. So a floating star bank is sized as its equivalent delta (linear
 * in the unknowns) and converted back, Δ→Y:
 *   B_a = (B_ab·B_bc + B_bc·B_ca + B_ca·B_ab) / B_bc   (cyclic).
 * A delta branch of zero would need an infinite star branch, so the sizing
 * keeps every delta branch at least `MIN_DELTA_SHARE` (ρ) of their sum ΣB_Δ;
 * since the pair products sum to at most (ΣB_Δ)²/3, every star branch then
 * stays below ΣB_Δ/(3ρ).
 */
import type { Board } from '../../board/boardModel.js';
import { kvarFromSusceptance, susceptanceFromKvar } from '../equipment.js';

export const MIN_DELTA_SHARE = 0.05;

/** Delta kvar (A-B, B-C, C-A at nominal V_LL) → star kvar (A, B, C at nominal V_LN). */
export function deltaKvarToStarKvar(board: Board, deltaKvar: readonly number[]): number[] {
  const ll = board.nominalLineToLineV ?? board.nominalLineToNeutralV;
  const ln = board.nominalLineToNeutralV;
  // Round-off below a microvar is no bank; otherwise each branch keeps its minimum share, which the
  // sizing LP enforces up to round-off (a branch a hair below it would put an infinite star element).
  const total = deltaKvar.reduce((a, b) => a + Math.max(0, b), 0);
  if (total < 1e-6) return [0, 0, 0];
  const [ab, bc, ca] = deltaKvar.map((q) => susceptanceFromKvar(Math.max(q, MIN_DELTA_SHARE * total), ll)) as [number, number, number];
  const products = ab * bc + bc * ca + ca * ab;
  if (products === 0) return [0, 0, 0];
  return [products / bc, products / ca, products / ab].map((b) => kvarFromSusceptance(b, ln));
}
