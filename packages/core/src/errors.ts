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

// C0 controls (tab and newline too: inside a name they break a message's line), DEL, C1 controls, line and
// paragraph separators and the bidirectional overrides: in a terminal or a log they can recolour, clear or
// reorder what follows, so user text never reaches a message with them raw.
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;
const HAS_CONTROL = new RegExp(CONTROL.source);
const NAMED_ESCAPES: Readonly<Record<string, string>> = { '\n': '\\n', '\r': '\\r', '\t': '\\t', '\b': '\\b', '\f': '\\f' };

/** User text with every control character written as its JSON-style escape: "a\u001b[31m" → "a\\u001b[31m". */
export function escapeControls(text: string): string {
  return text.replace(CONTROL, (c) => NAMED_ESCAPES[c] ?? `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/**
 * User text (a load's or board's name, a header, a value) quoted for a message, JSON-style: in double
 * quotes, a quote or backslash inside escaped, and every control character as an escape, so a name
 * reads as written and never acts on the screen. Every message that quotes user text goes through here.
 * @example quoteText('Mixer') //=> '"Mixer"'
 * @example quoteText('x\ny') //=> '"x\\ny"'
 */
export function quoteText(text: string): string {
  return `"${escapeControls(String(text).replace(/["\\]/g, '\\$&'))}"`;
}

/** Bad input: carries every problem found in one pass. */
export class InputError extends Error {
  override readonly name = 'InputError';
  readonly issues: readonly InputIssue[];
  /** What the issues are about, e.g. "the board is not valid". */
  readonly heading: string;
  constructor(issues: readonly InputIssue[], heading = 'the board is not valid') {
    // The last guard: a name a message did not quote through quoteText still reaches nobody raw.
    const shown = issues.map((i) => (HAS_CONTROL.test(i.message) || HAS_CONTROL.test(i.expected) ? { ...i, message: escapeControls(i.message), expected: escapeControls(i.expected) } : i));
    const title = escapeControls(heading);
    super(`${title}:\n${shown.map((i) => `  - ${i.message}`).join('\n')}`);
    this.issues = shown;
    this.heading = title;
  }
}

/** The network could not be solved: singular, or an iteration that did not settle. */
export class NumericalError extends Error {
  override readonly name = 'NumericalError';
  /** `collapsed`: solved, but at a point the supply cannot hold (see analysis/viableOperatingPoint.ts). */
  readonly reason: 'singular' | 'no-convergence' | 'non-finite' | 'collapsed';
  constructor(reason: NumericalError['reason'], message: string) {
    super(escapeControls(message));
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
    // The path stays exact (it is data); the sentences built on it escape it (inputIssue).
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
  if (typeof value === 'string') return quoteText(value.length > 40 ? `${value.slice(0, 37)}...` : value);
  if (Array.isArray(value)) return `a list of ${value.length}`;
  if (value === null) return 'null';
  if (typeof value === 'object') return 'an object';
  return String(value);
}

/** Builds an issue with its sentence: "loads[3].pf: must be ... (received 1.2)". */
export function inputIssue(code: string, path: string, expected: string, received?: unknown): InputIssue {
  const where = path === '' ? 'board' : escapeControls(path);
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
