/**
 * Readings shared by sizing and verification: each equipment branch as built
 * on the solved board, and each line before and after.
 */
import type { Board } from '../../board/boardModel.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import { capacitanceUF, inductanceMH } from '../capacitorOutput.js';
import type { EquipmentGroup } from '../equipment.js';
import type { BeforeAfter, BranchSizing, LineComparison, PfBeforeAfter } from '../correctionResult.js';
import { NOISE_FLOOR_RELATIVE } from '../../analysis/noiseFloor.js';

/**
 * A branch below this fraction of the whole set's kvar (or below 1e-9 kvar)
 * counts as empty: values that small are what an iterative solution leaves
 * where the exact answer is zero, not something to build.
 */
const EMPTY_FRACTION = 1e-6;
const EMPTY_KVAR = 1e-9;

/** The output below which a branch of a set of `totalKvar` reads as empty (element `none`). */
export const emptyBelowKvar = (totalKvar: number): number => Math.max(EMPTY_KVAR, EMPTY_FRACTION * totalKvar);

/** after − before, a difference within the noise floor of the larger (two equal figures' last bits, 1e-13 kW) read as 0. */
const changeOf = (before: number, after: number): number => {
  const change = after - before;
  return Math.abs(change) <= NOISE_FLOOR_RELATIVE * Math.max(Math.abs(before), Math.abs(after)) ? 0 : change;
};

export const beforeAfter = (before: number, after: number): BeforeAfter => ({ before, after, change: changeOf(before, after) });

/** PF before and after; null on a side where the line carries no current (no PF). */
export const pfBeforeAfter = (before: number | null, after: number | null): PfBeforeAfter => ({ before, after, change: before === null || after === null ? null : changeOf(before, after) });

/**
 * Each branch of `groups` (added last to `board`, in order) as solved in `result`.
 * `limits` gives the top of the selection window per branch, S (or null).
 */
export function branchSizings(
  groups: readonly EquipmentGroup[],
  board: Board,
  result: BoardResult,
  limits: readonly (number | null)[] = [],
): BranchSizing[] {
  const first = board.loads.length - groups.length;
  const total = groups.reduce((sum, g) => sum + g.branches.reduce((t, b) => t + Math.abs(b.susceptanceS * b.vNominal ** 2) / 1000, 0), 0);
  const empty = emptyBelowKvar(total);
  let k = 0;
  return groups.flatMap((group, g) =>
    group.branches.map((b, bi): BranchSizing => {
      const reading = result.loads[first + g]!.branches[bi]!;
      const v = reading.voltage.magnitude;
      const kvarAtNominalV = (b.susceptanceS * b.vNominal ** 2) / 1000;
      const element = Math.abs(kvarAtNominalV) < empty ? 'none' : b.susceptanceS > 0 ? 'capacitor' : 'reactor';
      return {
        branch: b.branch,
        element,
        susceptanceS: b.susceptanceS,
        kvarAtNominalV,
        appliedV: v,
        kvarAtAppliedV: (b.susceptanceS * v * v) / 1000,
        currentA: Math.abs(b.susceptanceS) * v,
        capacitanceUF: element === 'capacitor' ? capacitanceUF(b.susceptanceS, board.frequencyHz) : null,
        inductanceMH: element === 'reactor' ? inductanceMH(b.susceptanceS, board.frequencyHz) : null,
        limitSusceptanceS: limits[k++] ?? null,
      };
    }),
  );
}

/** Per line: current, its active and reactive parts, PF and drop, before and after. */
export function lineComparisons(before: BoardResult, after: BoardResult): LineComparison[] {
  return before.phases.map((b, k) => {
    const a = after.phases[k]!;
    const part = (kx: number, v: number) => (v === 0 ? 0 : (kx * 1000) / v);
    return {
      phase: b.phase,
      currentA: beforeAfter(b.current.magnitude, a.current.magnitude),
      activeCurrentA: beforeAfter(part(b.kW, b.voltage.magnitude), part(a.kW, a.voltage.magnitude)),
      reactiveCurrentA: beforeAfter(part(b.kvar, b.voltage.magnitude), part(a.kvar, a.voltage.magnitude)),
      pf: pfBeforeAfter(b.pf, a.pf),
      sense: { before: b.sense, after: a.sense },
      voltageDropPercent: beforeAfter(b.voltageDropPercent, a.voltageDropPercent),
    };
  });
}
