/**
 * Entry checks of the public checkTarget and checkBalance. The sizing loops judge every trial state
 * with judgeTarget/judgeBalance on readings and targets they built themselves, so the checks sit at
 * the public entry only: a target with NaN in it compares false everywhere and used to come back
 * "met", a normalised board in place of a solved one was judged as balanced.
 */
import { argumentIssueError, checkNumberArgument } from '../_internal/argumentChecks.js';
import { argumentError, isObject } from '../board/modelGuards.js';
import { assertBoardResult } from '../analysis/resultGuards.js';
import type { BoardResult } from '../analysis/boardResult.js';
import type { TargetReadings } from '../analysis/analyseSolution.js';
import { TARGET_DEFINITIONS } from './correctionSpec.js';
import type { ResolvedTarget } from './correctionTarget.js';
import type { BalanceTarget } from './balanceTarget.js';

const SOLVED_EXPECTED = 'a solved board from solveBoard(...) or solveBoardModel(...)';
const PF_EXPECTED = 'a power factor above 0 and at most 1';
const isPf = (x: number): boolean => x > 0 && x <= 1;

/** The per-line readings a target is judged on: each line's kVA, kW and kvar finite. */
function assertLineReadings(value: unknown, argument: string): asserts value is Pick<BoardResult, 'phases'> {
  if (!isObject(value) || !Array.isArray(value.phases) || !value.phases.every(isObject)) throw argumentError(argument, SOLVED_EXPECTED, value, `the ${argument} argument is not a solved board`, 'solved');
  value.phases.forEach((p: Record<string, unknown>, k: number) => {
    for (const key of ['kVA', 'kW', 'kvar'] as const) checkNumberArgument(p[key], `${argument}.phases[${k}].${key}`, 'a finite number');
  });
}

/** @throws {InputError} naming `argument` (or a field of it) unless `value` holds the readings checkTarget reads */
export function assertTargetReadings(value: unknown, argument = 'result'): asserts value is TargetReadings {
  assertLineReadings(value, argument);
  const v = value as unknown as Record<string, unknown>;
  if (!isObject(v.conventions) || !isObject(v.powerFactor) || !isObject(v.powerFactor.vector)) throw argumentError(argument, SOLVED_EXPECTED, value, `the ${argument} argument is not a solved board`, 'solved');
  checkNumberArgument(v.powerFactor.vector.kVA, `${argument}.powerFactor.vector.kVA`, 'a finite number, 0 or more', (x) => x >= 0);
}

/** @throws {InputError} naming `before` unless it is omitted or holds one finite reading per line of `result` */
export function assertBeforeReadings(before: unknown, lines: number): void {
  if (before === undefined) return;
  assertLineReadings(before, 'before');
  if (before.phases.length !== lines) throw argumentIssueError('before.phases', `the same ${lines} lines as result (the board before correction)`, before.phases);
}

/**
 * @throws {InputError} naming the field of `target` that resolveTarget would not have given: an unknown
 * definition, a PF outside (0, 1], per-line minimums that are not one per line of `result`, in order.
 */
export function assertResolvedTarget(target: unknown, result: TargetReadings, argument = 'target'): asserts target is ResolvedTarget {
  if (!isObject(target)) throw argumentIssueError(argument, 'a target from resolveTarget(...)', target);
  if (!(TARGET_DEFINITIONS as readonly unknown[]).includes(target.definition))
    throw argumentIssueError(`${argument}.definition`, `one of ${TARGET_DEFINITIONS.map((d) => `"${d}"`).join(', ')}`, target.definition);
  checkNumberArgument(target.pf, `${argument}.pf`, PF_EXPECTED, isPf);
  if (target.leading !== 'never' && target.leading !== 'allowed') throw argumentIssueError(`${argument}.leading`, '"never" or "allowed"', target.leading);
  for (const key of ['minLeadingPf', 'maxLaggingPf'] as const) if (target[key] !== null) checkNumberArgument(target[key], `${argument}.${key}`, `${PF_EXPECTED}, or null`, isPf);
  const lines = target.lines;
  const perLine = target.definition === 'per-line';
  const wanted = perLine ? `one { phase, minPf } per line, in the order of result.phases (${result.phases.map((p) => p.phase).join(', ')})` : 'an empty list with a board-wide definition';
  if (!Array.isArray(lines) || lines.length !== (perLine ? result.phases.length : 0)) throw argumentIssueError(`${argument}.lines`, wanted, lines);
  lines.forEach((line: unknown, k: number) => {
    if (!isObject(line) || line.phase !== result.phases[k]!.phase) throw argumentIssueError(`${argument}.lines[${k}]`, `the line ${result.phases[k]!.phase}, as { phase, minPf }`, line);
    checkNumberArgument(line.minPf, `${argument}.lines[${k}].minPf`, PF_EXPECTED, isPf);
  });
}

/** @throws {InputError} naming `result` or the field of `target` that is not a balance target (the schema's ranges) */
export function assertBalanceArguments(result: unknown, target: unknown): asserts target is BalanceTarget {
  assertBoardResult(result);
  if (!isObject(target)) throw argumentIssueError('target', 'a balance target { maxNegativeSequencePercent, maxNeutralPercent }', target);
  checkNumberArgument(target.maxNegativeSequencePercent, 'target.maxNegativeSequencePercent', 'a percentage from 0 to 100', (x) => x >= 0 && x <= 100);
  if (target.maxNeutralPercent !== null) checkNumberArgument(target.maxNeutralPercent, 'target.maxNeutralPercent', 'a percentage from 0 to 300, or null where the compensator has no line-to-neutral branches', (x) => x >= 0 && x <= 300);
}
