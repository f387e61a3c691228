/**
 * The error taxonomy of trivar's core. Every message is plain text; the CLI
 * maps each class to its exit code.
 */

/** One problem found in a board file or options object. */
export interface InputIssue {
  /** Machine-readable kind, e.g. `invalid_type`, `out_of_range`, `unknown_key`, `missing`. */
  readonly code: string;
  /** Where the problem is, as a path into the input: `loads[3].pf`. Empty for the whole input. */
  readonly path: string;
  /** The offending value, rendered as short text (omitted when there is none). */
  readonly received?: string;
  /** What is accepted there. */
  readonly expected: string;
  /** A full sentence for people. */
  readonly message: string;
}

/** Bad input: carries every problem found in one pass. */
export class InputError extends Error {
  override readonly name = 'InputError';
  readonly issues: readonly InputIssue[];
  /** What the issues are about, e.g. "the board is not valid". */
  readonly heading: string;
  constructor(issues: readonly InputIssue[], heading = 'the board is not valid') {
    super(`${heading}:\n${issues.map((i) => `  - ${i.message}`).join('\n')}`);
    this.issues = issues;
    this.heading = heading;
  }
}

/** The network could not be solved: singular, or an iteration that did not settle. */
export class NumericalError extends Error {
  override readonly name = 'NumericalError';
  /** `collapsed`: solved, but at a point the supply cannot hold (see analysis/viableOperatingPoint.ts). */
  readonly reason: 'singular' | 'no-convergence' | 'non-finite' | 'collapsed';
  constructor(reason: NumericalError['reason'], message: string) {
    super(message);
    this.reason = reason;
  }
}

/**
 * Renders a path the way people read it: `loads[3].pf`.
 * @example formatPath(['loads', 3, 'pf']) //=> 'loads[3].pf'
 */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const key of path) {
    // Keys come from the schema except unknown ones, which are user text of any length: shortened.
    const text = typeof key === 'string' && key.length > 40 ? `${key.slice(0, 37)}...` : String(key);
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? text : `.${text}`;
  }
  return out;
}

/** Short text for a received value in an error message. */
export function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? `${value.slice(0, 37)}...` : value);
  if (Array.isArray(value)) return `a list of ${value.length}`;
  if (value === null) return 'null';
  if (typeof value === 'object') return 'an object';
  return String(value);
}

/** Builds an issue with its sentence: "loads[3].pf: must be ... (received 1.2)". */
export function inputIssue(code: string, path: string, expected: string, received?: unknown): InputIssue {
  const where = path === '' ? 'board' : path;
  const got = received === undefined && code === 'missing' ? '' : ` (received ${describeValue(received)})`;
  const base = { code, path, expected, message: `${where}: expected ${expected}${got}` };
  return received === undefined ? base : { ...base, received: describeValue(received) };
}

/**
 * The issues about the whole input (path '') reworded to name the argument they are about: an option
 * object or study handed to a function is not the board, which `inputIssue` names by default.
 */
export function namingArgument(issues: readonly InputIssue[], argument: string): InputIssue[] {
  return issues.map((i) => (i.path === '' ? { ...i, message: `${argument}: expected ${i.expected}${i.received === undefined ? '' : ` (received ${i.received})`}` } : i));
}
