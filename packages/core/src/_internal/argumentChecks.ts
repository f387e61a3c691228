/**
 * Checks of the plain numbers the exported helpers take (a percentage, a temperature, a kvar): a value
 * that is not a finite number, or one the physics has no answer for, is an InputError naming the
 * argument, never NaN carried into a verdict ("within") or a figure below absolute zero.
 */
import { InputError, inputIssue } from '../errors.js';
import { nearestKey } from './acceptedKeys.js';

/** The InputError for one argument: "percent: expected a finite number (received NaN)". */
export function argumentIssueError(argument: string, expected: string, received: unknown): InputError {
  return new InputError([inputIssue('invalid_argument', argument, expected, received)], `the ${argument} argument is not valid`);
}

/** @throws {InputError} naming `argument` unless `value` is a finite number that `accept` takes */
export function checkNumberArgument(value: unknown, argument: string, expected: string, accept: (x: number) => boolean = () => true): asserts value is number {
  if (typeof value !== 'number' || !Number.isFinite(value) || !accept(value)) throw argumentIssueError(argument, expected, value);
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * @throws {InputError} naming `argument` unless `value` is an object (not null, a list or a primitive)
 *   holding every one of `keys`: enough to tell the thing a helper reads from a wrong argument.
 */
export function checkObjectArgument(value: unknown, argument: string, expected: string, keys: readonly string[] = []): asserts value is Record<string, unknown> {
  if (!isPlainObject(value) || keys.some((k) => !(k in value))) throw argumentIssueError(argument, expected, value);
}

/** @throws {InputError} naming `argument` unless `value` is a complex value { re, im } of finite numbers */
export function checkComplexArgument(value: unknown, argument: string): asserts value is { re: number; im: number } {
  if (!isPlainObject(value) || typeof value.re !== 'number' || typeof value.im !== 'number' || !Number.isFinite(value.re) || !Number.isFinite(value.im))
    throw argumentIssueError(argument, 'a complex value { re, im } of finite numbers', value);
}

/** @throws {InputError} naming `argument` unless `value` is a list whose every entry `accept` takes */
export function checkListArgument(value: unknown, argument: string, expected: string, accept: (x: unknown) => boolean = () => true): asserts value is readonly unknown[] {
  if (!Array.isArray(value) || !value.every(accept)) throw argumentIssueError(argument, expected, value);
}

/** @throws {InputError} naming `argument` unless `value` is a string */
export function checkTextArgument(value: unknown, argument: string, expected: string): asserts value is string {
  if (typeof value !== 'string') throw argumentIssueError(argument, expected, value);
}

/** @throws {InputError} naming `argument` unless `value` is one of `words` (a system, a region, a phase naming...) */
export function checkWordArgument<W extends string>(value: unknown, argument: string, words: readonly W[]): asserts value is W {
  if (!(words as readonly unknown[]).includes(value)) throw argumentIssueError(argument, `one of ${words.map((w) => JSON.stringify(w)).join(', ')}`, value);
}

/**
 * @throws {InputError} unless `value` is undefined (the defaults) or an object whose every key is one of
 *   `accepted`: a misspelt option (`Board` for `board`) would otherwise run silently on the default. Each
 *   unknown key is named at its path (`options.Board`) with the keys taken and the nearest one;
 *   `elsewhere` says where a key that belongs to another argument goes (`measuredAt` → the study's target).
 */
export function checkOptionKeys(value: unknown, argument: string, accepted: readonly string[], elsewhere: Readonly<Record<string, string>> = {}): asserts value is Record<string, unknown> | undefined {
  if (value === undefined) return;
  if (!isPlainObject(value)) throw argumentIssueError(argument, `an options object (${accepted.map((k) => JSON.stringify(k)).join(', ')}), or nothing for the defaults`, value);
  const unknown = Object.keys(value).filter((k) => !accepted.includes(k));
  if (Object.hasOwn(value, '__proto__') && !unknown.includes('__proto__')) unknown.push('__proto__');
  if (unknown.length === 0) return;
  const issues = unknown.map((key) => {
    const nearest = nearestKey(key, accepted);
    const taken = accepted.length ? `one of the keys taken here (${accepted.map((k) => JSON.stringify(k)).join(', ')})` : 'no keys (this function takes no options yet)';
    const hint = Object.hasOwn(elsewhere, key) ? `; ${elsewhere[key]}` : nearest ? `; nearest: ${JSON.stringify(nearest)}` : '';
    return inputIssue('unknown_key', `${argument}.${key}`, `${taken}${hint}`, key);
  });
  throw new InputError(issues, `the ${argument} argument is not valid`);
}
