/**
 * What a balancing compensator must leave of the unbalance it exists to
 * remove: |I2|/|I1| and (with line-to-neutral branches on a 4-wire board) the
 * neutral current per unit of |I1|. Judged on a solved board like the PF target.
 */
import type { BoardResult } from '../analysis/boardResult.js';
import type { BalanceTargetSpec } from './correctionSpec.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { distinctDigits } from './correctionWording.js';
import { assertBalanceArguments } from './targetArguments.js';

export interface BalanceTarget {
  readonly maxNegativeSequencePercent: number;
  /** Null where the compensator has no line-to-neutral branches (a delta cannot change the neutral current). */
  readonly maxNeutralPercent: number | null;
}

export interface BalanceCheck {
  readonly target: BalanceTarget;
  /** |I2|/|I1|, %. */
  readonly negativeSequencePercent: number;
  /** |I_N|/|I1|, %; null on a board without a neutral. */
  readonly neutralPercent: number | null;
  readonly neutralA: number | null;
  readonly met: boolean;
  readonly shortfalls: readonly string[];
}

export function resolveBalanceTarget(spec: BalanceTargetSpec | undefined, lineToNeutralBranches: boolean): BalanceTarget {
  return {
    maxNegativeSequencePercent: spec?.maxNegativeSequencePercent ?? CORRECTION_DEFAULTS.maxNegativeSequencePercent,
    maxNeutralPercent: lineToNeutralBranches ? (spec?.maxNeutralPercent ?? CORRECTION_DEFAULTS.maxNeutralPercent) : null,
  };
}

/** Relative slack on the balance figures (the ideal compensator drives them to round-off). */
const SLACK_PERCENT = 1e-7;

/**
 * Judges a solved board against a balance target.
 * @throws {InputError} naming `result` when it is not a solved board, or the field of `target` that is not a percentage in the schema's range
 */
export function checkBalance(result: BoardResult, target: BalanceTarget): BalanceCheck {
  assertBalanceArguments(result, target);
  return judgeBalance(result, target);
}

/** checkBalance without the argument checks: the sizing loops judge every trial state they built. */
export function judgeBalance(result: BoardResult, target: BalanceTarget): BalanceCheck {
  const seq = result.sequences;
  const i1 = seq ? seq.current.positive.magnitude : 0;
  const negativeSequencePercent = i1 > 0 && seq ? (100 * seq.current.negative.magnitude) / i1 : 0;
  const neutralA = result.neutral ? result.neutral.current.magnitude : null;
  const neutralPercent = neutralA !== null && i1 > 0 ? (100 * neutralA) / i1 : null;
  const shortfalls: string[] = [];
  if (negativeSequencePercent > target.maxNegativeSequencePercent + SLACK_PERCENT) {
    const [v, m] = distinctDigits(negativeSequencePercent, target.maxNegativeSequencePercent, 1);
    shortfalls.push(`|I2|/|I1| is ${v} %, above the ${m} % the balancing target allows`);
  }
  if (target.maxNeutralPercent !== null && neutralPercent !== null && neutralPercent > target.maxNeutralPercent + SLACK_PERCENT) {
    const [v, m] = distinctDigits(neutralPercent, target.maxNeutralPercent, 1);
    shortfalls.push(`the neutral carries ${v} % of |I1| (${neutralA!.toFixed(1)} A), above the ${m} % the balancing target allows`);
  }
  return { target, negativeSequencePercent, neutralPercent, neutralA, met: shortfalls.length === 0, shortfalls };
}
