/**
 * Which branches of a compensator are too small to build: a branch below
 * CORRECTION_DEFAULTS.negligibleBranchFraction of the compensator's total kvar
 * is what the supply impedance leaves in an exact solution (an 8 H reactor for
 * 0.02 kvar), not a component anyone buys. The sizing decides this once, by
 * re-solving without those branches, so the tables, the units chosen and the
 * build verified all show the same compensator.
 */
import { CORRECTION_DEFAULTS } from '../correctionDefaults.js';
import type { SmallBranch } from '../correctionResult.js';
import type { BoardProbe, ProbeState } from './boardProbe.js';
import { emptyBelowKvar } from './branchReadings.js';

/** The output below which a branch of a compensator of these outputs (kvar, any sign) is negligible. */
export function negligibleKvar(outputs: readonly number[]): number {
  return CORRECTION_DEFAULTS.negligibleBranchFraction * outputs.reduce((sum, q) => sum + Math.abs(q), 0);
}

/**
 * The solution with its negligible branches set to zero and re-solved, kept when it meets as many
 * targets as the solution as it came (`targetsMet`: more is better); otherwise the solution as it
 * came, its small branches then being needed. `small` lists them either way.
 */
export function leaveOutNegligible(probe: BoardProbe, state: ProbeState, targetsMet: (s: ProbeState) => number): { state: ProbeState; small: SmallBranch[] } {
  const floor = negligibleKvar(state.kvar);
  // Below the empty floor a branch already reads as none (iteration noise): it goes with the small ones, unlisted.
  const empty = emptyBelowKvar(state.kvar.reduce((sum, q) => sum + Math.abs(q), 0));
  const isSmall = (q: number) => Math.abs(q) >= empty && Math.abs(q) < floor;
  if (!state.kvar.some(isSmall)) return { state, small: [] };
  const trimmed = probe.at(state.kvar.map((q) => (Math.abs(q) < floor ? 0 : q)));
  const leftOut = targetsMet(trimmed) >= targetsMet(state);
  const small = state.kvar.flatMap((q, i) => (isSmall(q) ? [{ branch: probe.slots[i]!.branch, kvarAtNominalV: q, leftOut }] : []));
  return { state: leftOut ? trimmed : state, small };
}
