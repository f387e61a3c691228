/**
 * Whether equipment makes the board's balance notably worse: the current
 * unbalance |I2|/|I1| or the neutral current. A bank sized for power factor
 * alone can do either, and the verdict must not hide it.
 *
 * Thresholds (common practice, no source): |I2|/|I1| up by more than 5
 * percentage points; neutral current up by more than 10 % of its value before
 * and by more than 1 A (so a few tenths of an ampere on a nearly balanced
 * board is not reported as news).
 */
import type { BoardResult } from '../analysis/boardResult.js';

export const BALANCE_WORSENING = { negativeSequencePoints: 5, neutralFraction: 0.1, neutralMinA: 1 } as const;

export interface BalanceWorsening {
  readonly code: 'unbalance-worse' | 'neutral-worse';
  readonly before: number;
  readonly after: number;
  readonly threshold: number;
}

/** What got notably worse between the two solved boards (empty when nothing did). */
export function balanceWorsening(before: BoardResult, after: BoardResult): BalanceWorsening[] {
  const out: BalanceWorsening[] = [];
  if (before.unbalance && after.unbalance) {
    const b = before.unbalance.currentNegativePercent;
    const a = after.unbalance.currentNegativePercent;
    if (a - b > BALANCE_WORSENING.negativeSequencePoints) out.push({ code: 'unbalance-worse', before: b, after: a, threshold: BALANCE_WORSENING.negativeSequencePoints });
  }
  if (before.neutral && after.neutral) {
    const b = before.neutral.current.magnitude;
    const a = after.neutral.current.magnitude;
    if (a - b > Math.max(BALANCE_WORSENING.neutralFraction * b, BALANCE_WORSENING.neutralMinA)) out.push({ code: 'neutral-worse', before: b, after: a, threshold: BALANCE_WORSENING.neutralFraction });
  }
  return out;
}
