/**
 * Which branches of a compensator are too small to build: a branch below
 * CORRECTION_DEFAULTS.negligibleBranchFraction of the compensator's total kvar
 * is left out when the board, re-solved without it and with the other branches
 * sized again around it, still meets every target the exact solution met. The
 * other branches must be sized again: the exact solution meets the PF target
 * with no margin, so merely taking a small capacitor away leaves the PF a hair
 * under it and would keep every small capacitor as "needed". The sizing decides
 * this once, so the tables, the units chosen and the build verified all show
 * the same compensator.
 */
import { CORRECTION_DEFAULTS } from '../correctionDefaults.js';
import type { CompensatorReading, SmallBranch, TargetName } from '../correctionResult.js';
import type { BoardProbe, ProbeState } from './boardProbe.js';
import { emptyBelowKvar } from './branchReadings.js';
import type { ResidualBases } from './compensatorResidual.js';
import { resizeOtherBranches } from './resizeOtherBranches.js';

/** The output below which a branch of a compensator of these outputs (kvar, any sign) is negligible. */
export function negligibleKvar(outputs: readonly number[]): number {
  return CORRECTION_DEFAULTS.negligibleBranchFraction * outputs.reduce((sum, q) => sum + Math.abs(q), 0);
}

export interface NegligibleInput {
  readonly bases: ResidualBases;
  readonly maxIterations: number;
  /** The targets a state meets (the PF target, the balance target). */
  readonly targetsMet: (s: ProbeState) => readonly TargetName[];
  /** What a state reads as: PF1+, |I2|/|I1|, neutral. */
  readonly reading: (s: ProbeState) => CompensatorReading;
}

/**
 * Smallest first, each small branch of `state` is taken out and the branches at or above the floor
 * sized again; it stays out when every target met before is still met, otherwise it is kept (needed)
 * and the state stays as it was. `small` lists every small branch in that order, with the effect of leaving
 * it out (after the ones before it).
 */
export function leaveOutNegligible(probe: BoardProbe, state: ProbeState, input: NegligibleInput): { state: ProbeState; small: SmallBranch[] } {
  const floor = negligibleKvar(state.kvar);
  // Below the empty floor a branch already reads as none (iteration noise): it goes with the small ones, unlisted.
  const empty = emptyBelowKvar(state.kvar.reduce((sum, q) => sum + Math.abs(q), 0));
  const smallest = (kvar: readonly number[], isSmall: (q: number, i: number) => boolean) =>
    kvar.flatMap((q, i) => (isSmall(q, i) ? [i] : [])).sort((a, b) => Math.abs(kvar[a]!) - Math.abs(kvar[b]!));
  let order = smallest(state.kvar, (q) => Math.abs(q) >= empty && Math.abs(q) < floor);
  if (order.length === 0) return { state, small: [] };
  // Noise-level branches are zero from the start; only the branches at or above the floor are sized again.
  let current = probe.at(state.kvar.map((q) => (Math.abs(q) < empty ? 0 : q)));
  const small: SmallBranch[] = [];
  const considered = new Set<number>();
  let firstPass = true;
  // Sized again around the ones left out, a branch can itself fall below the floor: another pass takes it
  // (a 0.04 kvar reactor is not bought where the targets hold without it).
  while (order.length) {
    const free = current.kvar.map((q) => Math.abs(q) >= floor);
    for (const i of order) {
      considered.add(i);
      const metBefore = input.targetsMet(current);
      const without = resizeOtherBranches(probe, current.kvar.map((q, j) => (j === i ? 0 : q)), free, input.bases, input.maxIterations);
      const metWithout = input.targetsMet(without);
      const missed = metBefore.filter((t) => !metWithout.includes(t));
      const leftOut = missed.length === 0;
      small.push({
        branch: probe.slots[i]!.branch,
        kvarAtNominalV: current.kvar[i]!,
        afterOthersLeftOut: !firstPass,
        leftOut,
        effect: {
          with: input.reading(current),
          without: input.reading(without),
          largestResizeKvar: Math.max(0, ...without.kvar.map((q, j) => (j === i ? 0 : Math.abs(q - current.kvar[j]!)))),
          missedWithout: missed,
        },
      });
      if (leftOut) current = without;
    }
    firstPass = false;
    order = smallest(current.kvar, (q, i) => !considered.has(i) && q !== 0 && Math.abs(q) < floor);
  }
  return { state: current, small };
}
