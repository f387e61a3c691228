/**
 * User text on a terminal: control characters shown escaped, never executed.
 * A circuit name may hold ESC sequences, newlines or NUL; on a terminal they
 * could clear the screen, retitle the window or forge a report section. Text
 * output escapes them here, in one place; JSON output stays exact.
 */

// C0 controls (tab and newline included: inside a name they would break the layout), DEL, C1 controls,
// line/paragraph separators and the bidirectional overrides that can reorder what is shown.
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const NAMED: Readonly<Record<string, string>> = { '\n': '\\n', '\r': '\\r', '\t': '\\t', '\u001b': '\\e', '\u0000': '\\0' };

/** "a\u001b[2Jb" → "a\\e[2Jb": every control character as a visible escape. */
export function escapeControlCharacters(text: string): string {
  return text.replace(CONTROL, (c) => NAMED[c] ?? `\\u{${c.codePointAt(0)!.toString(16).toUpperCase()}}`);
}

const HAS_CONTROL = new RegExp(CONTROL.source);

/**
 * True when some string or key in plain data holds a control character. Written as plain loops
 * (indexed arrays, own keys, the regular expression only on strings) because it runs once on every
 * text result, in code V8 has not optimised yet: on a 1,000-load board's result it costs 28 M
 * instructions where serialising the result to JSON and searching that text cost 57 M (cachegrind).
 */
function holdsControl(value: unknown): boolean {
  if (typeof value === 'string') return HAS_CONTROL.test(value);
  if (value === null || typeof value !== 'object') return false;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const item: unknown = value[i];
      if (typeof item === 'object' ? holdsControl(item) : typeof item === 'string' && HAS_CONTROL.test(item)) return true;
    }
    return false;
  }
  const record = value as Record<string, unknown>;
  const keys = Object.keys(record);
  for (let i = 0; i < keys.length; i++) {
    const key = keys[i]!;
    if (HAS_CONTROL.test(key)) return true;
    const item = record[key];
    if (typeof item === 'object' ? holdsControl(item) : typeof item === 'string' && HAS_CONTROL.test(item)) return true;
  }
  return false;
}

/**
 * Plain result data with every string escaped for the terminal: the data itself when nothing
 * needs escaping (the usual case; copying a 1,000-load result took 15 ms), else a deep copy.
 */
export function forTerminal<T>(value: T): T {
  return holdsControl(value) ? escapedCopy(value) : value;
}

function escapedCopy<T>(value: T): T {
  if (typeof value === 'string') return escapeControlCharacters(value) as T;
  if (Array.isArray(value)) return value.map((v) => escapedCopy(v)) as T;
  if (value !== null && typeof value === 'object') {
    const copy: Record<string, unknown> = {};
    // Keys can be user text (load names): escaped like values, and defined, not assigned, so "__proto__" stays an ordinary key.
    for (const [k, v] of Object.entries(value)) Object.defineProperty(copy, escapeControlCharacters(k), { value: escapedCopy(v), enumerable: true, writable: true, configurable: true });
    return copy as T;
  }
  return value;
}
