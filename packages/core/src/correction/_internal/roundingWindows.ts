/**
 * Windows for rounding a three-branch bank to units under per-line targets, where each branch's own
 * window does not hold: the branch's limit (the least-kvar bank that puts every line at its bound) can
 * sit below its requirement on a delta bank, whose branches each serve two lines, so no build inside
 * every branch's window exists and rounding one branch at a time misses a line.
 *
 * Found instead: per branch [low, high] (kvar at nominal voltage) such that any design state with every
 * branch inside its window meets every line's target at the lowest capacitance (−tol) and keeps every
 * line within its bound at the highest (+tol). Line ℓ's band expressions Q_ℓ − τ·|P_ℓ| are linear in
 * the outputs x about the sized bank (g·x + e, the sizing loop's linearisation); over a box
 * [(1 − tol⁻)·low, (1 + tol⁺)·high] the largest is Σ g⁺·(1 + tol⁺)·high + g⁻·(1 − tol⁻)·low + e and
 * the smallest the other way round, so the windows are an LP in `low` once each width is fixed:
 *   minimise Σ low   subject to   max over the box of (Q − τ_high·|P|) ≤ 0,  min of (Q − τ_low·|P|) ≥ 0,
 *   high = low + w·(sized output), low ≥ 0, branches the sizing left empty held at zero,
 * for every w of WIDTH_SHARES that is feasible and whose corners hold when re-solved (the study
 * re-solves the bank as built too).
 */
import type { ProbeState, BoardProbe } from './boardProbe.js';
import { probeJacobian } from './boardProbe.js';
import { solveLinearProgram } from './linearProgram.js';
import type { LineBand } from './sizeForLineTargets.js';

export interface RoundingWindows {
  /**
   * Sets of windows, narrowest first (the least kvar at their low ends): per branch, the ends as
   * design-state output at nominal voltage, kvar. Units that fit a narrow set cost less; a wide set
   * is easier to fit; the unit choice tries each.
   */
  readonly sets: readonly { readonly lowKvar: readonly number[]; readonly highKvar: readonly number[] }[];
  /** The capacitance tolerance the windows hold across, fractions. */
  readonly tolerance: { readonly minus: number; readonly plus: number };
}

/** Widths, each a share of the branch's sized output: from a sliver to a quarter (room for most trim units). */
const WIDTH_SHARES = [0.03, 0.06, 0.1, 0.15, 0.25] as const;

/**
 * Room kept inside both ends, in τ = Q/|P| of each line (ΔPF about 3e-5 at 0.95): the corners are found to
 * first order, and one exactly at a bound can land a hair past it when re-solved (at PF 1, just leading).
 */
const TAU_MARGIN = 1e-4;

/** Round-off allowed in a corner's re-solved band test, per unit of the line's apparent power (the equal bank's window's). */
const SLACK = 1e-9;

/** LPs per width: the first, then again with the margins the corners showed were short. */
const ATTEMPTS = 3;

/** Probe step for the linearisation, per unit of the board's kVA (the sizing loop's). */
const STEP_SHARE = 1e-4;

/**
 * @param sized the sizing's state (its outputs, kvar; every branch ≥ 0)
 * @returns null where no width of WIDTH_SHARES has windows (or nothing is sized)
 */
export function roundingWindows(
  probe: BoardProbe,
  sized: ProbeState,
  targetBands: readonly LineBand[],
  limitBands: readonly LineBand[],
  tolerance: { readonly minus: number; readonly plus: number },
): RoundingWindows | null {
  const n = sized.kvar.length;
  const used = sized.kvar.map((q) => q > 0);
  if (!used.some(Boolean)) return null;
  const scale = sized.lineS.reduce((a, b) => a + b, 0);
  const lines = sized.lineQ.length;
  // Branches the sizing left empty stay empty (opening them as well found no windows, on 180 invented boards, where holding them did not).
  const jacobian = probeJacobian(probe, sized, (s) => [...s.lineP, ...s.lineQ], STEP_SHARE * scale, used.map((u) => !u));
  // g·x + e for Q_ℓ − τ·|P_ℓ| about the sized outputs (as sizeForLineTargets' bandExpression).
  const band = (line: number, tau: number) => {
    const sign = sized.lineP[line]! < 0 ? -1 : 1;
    const g = jacobian[lines + line]!.map((dq, k) => dq - tau * sign * jacobian[line]![k]!);
    const e = sized.lineQ[line]! - tau * sign * sized.lineP[line]! - g.reduce((s, gk, k) => s + gk * sized.kvar[k]!, 0);
    return { g, e };
  };
  const lowCap = 1 - tolerance.minus;
  const highCap = 1 + tolerance.plus;
  const targetLines = targetBands.map((b) => Number.isFinite(b.high));
  // Room kept per line inside each end (Q − τ·|P| units); grown by what the corners miss when re-solved.
  const targetMargin = sized.lineP.map((p) => TAU_MARGIN * Math.abs(p));
  const boundMargin = [...targetMargin];
  /** The least-kvar windows of this width at the present margins; null where there are none. */
  const windowsOf = (width: readonly number[]) => {
    const rows: number[][] = [];
    const bounds: number[] = [];
    for (let line = 0; line < lines; line++) {
      // Target: the box's worst corner (least capacitance where g < 0, most where g > 0) still at or under τ_high.
      if (targetLines[line]) {
        const { g, e } = band(line, targetBands[line]!.high);
        rows.push(g.map((gk) => (gk > 0 ? gk * highCap : gk * lowCap)));
        bounds.push(-e - targetMargin[line]! - g.reduce((s, gk, k) => s + (gk > 0 ? gk * highCap * width[k]! : 0), 0));
      }
      // Bound: the other corner still at or over τ_low.
      const { g, e } = band(line, limitBands[line]!.low);
      rows.push(g.map((gk) => -(gk > 0 ? gk * lowCap : gk * highCap)));
      bounds.push(e - boundMargin[line]! + g.reduce((s, gk, k) => s + (gk < 0 ? gk * highCap * width[k]! : 0), 0));
    }
    for (let k = 0; k < n; k++) {
      const lower = new Array<number>(n).fill(0);
      lower[k] = -1;
      rows.push(lower);
      bounds.push(0);
      if (!used[k]) {
        const upper = new Array<number>(n).fill(0);
        upper[k] = 1;
        rows.push(upper);
        bounds.push(0);
      }
    }
    const low = solveLinearProgram({ rows, bounds, objectives: [new Array<number>(n).fill(1)] });
    if (!low) return null;
    const lowKvar = low.map((x) => Math.max(0, x));
    return { lowKvar, highKvar: lowKvar.map((x, k) => x + width[k]!) };
  };
  const sets: { lowKvar: number[]; highKvar: number[] }[] = [];
  widths: for (const share of WIDTH_SHARES) {
    const width = sized.kvar.map((q, k) => (used[k] ? share * q : 0));
    for (let attempt = 0; attempt < ATTEMPTS; attempt++) {
      const set = windowsOf(width);
      if (!set) break widths; // a wider set is no more feasible than this one
      // First order grows less true with the width: a set is kept once its corners hold re-solved.
      if (cornersHold(set.lowKvar.map((x) => x * lowCap), set.highKvar.map((x) => x * highCap))) {
        sets.push(set);
        continue widths;
      }
    }
    break;
  }
  return sets.length ? { sets, tolerance } : null;

  /**
   * Every corner of the box [least, most] re-solved: each line meets its target and stays within its
   * bound (to the round-off slack). A line's τ moves one way with each branch, so its extremes over the
   * box are at corners. Where a corner misses, that line's margin grows by twice the miss.
   */
  function cornersHold(least: readonly number[], most: readonly number[]): boolean {
    const open = least.flatMap((x, k) => (most[k]! > x ? [k] : []));
    let holds = true;
    for (let corner = 0; corner < 1 << open.length; corner++) {
      const kvar = [...least];
      open.forEach((k, bit) => {
        if (corner & (1 << bit)) kvar[k] = most[k]!;
      });
      const state = probe.at(kvar);
      for (let line = 0; line < lines; line++) {
        const p = Math.abs(state.lineP[line]!);
        const q = state.lineQ[line]!;
        const slack = SLACK * state.lineS[line]!;
        const over = targetLines[line] ? q - targetBands[line]!.high * p : -Infinity;
        const under = limitBands[line]!.low * p - q;
        if (over > slack) targetMargin[line] = targetMargin[line]! + 2 * over;
        if (under > slack) boundMargin[line] = boundMargin[line]! + 2 * under;
        if (over > slack || under > slack) holds = false;
      }
    }
    return holds;
  }
}
