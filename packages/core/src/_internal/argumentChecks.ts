/**
 * Checks of the plain numbers the exported helpers take (a percentage, a temperature, a kvar): a value
 * that is not a finite number, or one the physics has no answer for, is an InputError naming the
 * argument, never NaN carried into a verdict ("within") or a figure below absolute zero.
 */
import { InputError, inputIssue } from '../errors.js';

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
