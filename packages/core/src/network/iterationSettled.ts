/**
 * When the load iteration (re-solve with each load's admittance at the last voltage) stops: the
 * rule every fixed-point path shares (compiledNetwork.ts, and the profile kernels).
 */

/** A voltage change (fraction of nominal) this small is round-off: the iteration has settled. */
export const ROUND_OFF_CHANGE = 1e-14;

/**
 * A change (fraction of nominal) at most this large that has stopped shrinking is the iteration's
 * round-off floor, which grows with the network: about 1e-13 on a riser of 50 boards, 2e-13 on one
 * of 100 (measured). Far below any tolerance a study reports against (the default is 1e-10).
 */
export const NOISE_FLOOR_CHANGE = 1e-11;

/**
 * A step that shrinks by `ratio` each time leaves an error of about change·ratio/(1 − ratio): stop on
 * that estimate, not on the step alone, so slowly contracting boards are as accurate as fast ones.
 * Two floors: a change of ROUND_OFF_CHANGE, and a change that has stopped shrinking (ratio ≥ 1)
 * within the tolerance or NOISE_FLOOR_CHANGE. A contracting iteration's changes grow again only at
 * its round-off floor, which on a large network lies above a tight tolerance such as the correction
 * trials' 1e-13 of nominal; iterating on would only stir the last digits.
 * @param change the last step's largest voltage change, fraction of nominal
 * @param previousChange the step before's (0 before the second step)
 */
export function iterationSettled(change: number, previousChange: number, tolerance: number): boolean {
  const ratio = previousChange > 0 ? change / previousChange : 0;
  return change <= tolerance * Math.max(0, 1 - ratio) || change <= ROUND_OFF_CHANGE || (ratio >= 1 && change <= Math.max(tolerance, NOISE_FLOOR_CHANGE));
}
