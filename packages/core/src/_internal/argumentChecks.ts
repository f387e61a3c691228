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
