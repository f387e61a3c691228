/**
 * The capacitor-only compensator on as few branches as do its job. Its programme spreads the output
 * over every branch that helps (the ridge term prefers many small outputs to a few large ones), so a
 * balanced board gets a capacitor on all six branches where the three of a delta bank do the same:
 * twice the units, steps and contactors for one result. Smallest first, each branch with a capacitor
 * is held at zero and the others are solved again; it stays out when every target met before is still
 * met, no line bound or balance limit had to be dropped to solve, and the balance (|I2|/|I1|, the
 * neutral) is no more than CORRECTION_DEFAULTS.fewerBranchesAllowancePercent worse than on every branch.
 */
import { CORRECTION_DEFAULTS } from '../correctionDefaults.js';
import type { CompensatorReading, SparedBranch, TargetName } from '../correctionResult.js';
import type { BoardProbe } from './boardProbe.js';
import { emptyBelowKvar } from './branchReadings.js';
import { solveCapacitorOnlyCompensator, type CapacitorOnlyOutcome, type CapacitorOnlySettings } from './capacitorOnlyCompensator.js';
import { compensatorResidual, type ResidualBases } from './compensatorResidual.js';

/** Weight of the Q1 row against the sequence-current rows while a branch is left out (as in resizeOtherBranches). */
const REACTIVE_ROW_WEIGHT = 1e3;

/** After the first step, a trial goes on only while its balance is within this many allowances. */
const SCREEN_FACTOR = 4;

export interface FewerBranchesInput {
  readonly targetsMet: (outcome: CapacitorOnlyOutcome) => readonly TargetName[];
  readonly reading: (outcome: CapacitorOnlyOutcome) => CompensatorReading;
}

/** True when `after` balances no worse than `before` by more than the allowance. */
function balanceHeld(before: CompensatorReading, after: CompensatorReading, factor = 1): boolean {
  const a = factor * CORRECTION_DEFAULTS.fewerBranchesAllowancePercent;
  if (after.negativeSequenceCurrentPercent > before.negativeSequenceCurrentPercent + a) return false;
  return before.neutralPercent === null || after.neutralPercent === null || after.neutralPercent <= before.neutralPercent + a;
}

/**
 * @param outcome the capacitor-only solution on every branch the compensator may use
 * @returns the solution kept (the same one when no branch can go) and the branches left out, in the order tried
 */
export function fewerCapacitorBranches(
  probe: BoardProbe,
  bases: ResidualBases,
  settings: CapacitorOnlySettings,
  outcome: CapacitorOnlyOutcome,
  input: FewerBranchesInput,
): { outcome: CapacitorOnlyOutcome; spared: SparedBranch[] } {
  const total = outcome.state.kvar.reduce((s, q) => s + Math.abs(q), 0);
  const empty = emptyBelowKvar(total);
  const held = outcome.state.kvar.map((q) => q < empty);
  // The Q1 row weighs most while a branch is left out: the solution met the PF target with no margin
  // (Q1 on its target), and a plain least-squares compromise would trade a hair of Q1 for balance and
  // miss it; the balance has its allowance to take what the branch left out leaves.
  const trialSettings = { ...settings, weights: settings.weights.map((w, k) => (k === settings.weights.length - 1 ? REACTIVE_ROW_WEIGHT * w : w)) };
  let current = outcome;
  // Judged against the solution on every branch, so the allowance is not spent again at each branch that goes.
  const first = input.reading(outcome);
  const metFirst = input.targetsMet(outcome);
  const spared: SparedBranch[] = [];
  // Smallest first by the present outputs; after each branch that goes, the others have moved: start again.
  for (let changed = true; changed; ) {
    changed = false;
    const order = current.state.kvar.flatMap((q, i) => (held[i] || q < empty ? [] : [i])).sort((a, b) => current.state.kvar[a]! - current.state.kvar[b]! || a - b);
    if (order.length <= 1) break;
    for (const i of order) {
      const heldAtZero = held.map((h, j) => h || j === i);
      // One step first: the board is near linear in its equipment, so a branch whose step leaves the
      // balance far past the allowance is not worth the iterations that would confirm it.
      const screen = solveCapacitorOnlyCompensator(probe, bases, { ...trialSettings, heldAtZero, start: current.state, maxIterations: 1 });
      if (!balanceHeld(first, input.reading(screen), SCREEN_FACTOR)) continue;
      const trial = screen.converged ? screen : solveCapacitorOnlyCompensator(probe, bases, { ...trialSettings, heldAtZero, start: screen.state });
      const metAfter = input.targetsMet(trial);
      const keepsTargets = metFirst.every((t) => metAfter.includes(t));
      const keepsBounds = (!trial.leadingConstraintsDropped || current.leadingConstraintsDropped) && (!trial.balanceConstraintsDropped || current.balanceConstraintsDropped);
      if (!(trial.converged && keepsTargets && keepsBounds && balanceHeld(first, input.reading(trial)))) continue;
      // With it out, others sized again may have fallen to nothing: they go with it.
      const effect = { with: input.reading(current), without: input.reading(trial) };
      for (const j of [i, ...order.filter((j) => j !== i && trial.state.kvar[j]! < empty)]) {
        spared.push({ branch: probe.slots[j]!.branch, kvarAtNominalV: current.state.kvar[j]!, effect });
        held[j] = true;
      }
      current = trial;
      changed = true;
      break;
    }
  }
  if (!spared.length) return { outcome, spared };
  // The objective as the compensator states it (the weights the user gave, not the trials' Q1 weight).
  const objective = compensatorResidual(current.state, bases).reduce((sum, r, k) => sum + settings.weights[k]! * r * r, 0);
  return { outcome: { ...current, objective }, spared };
}
