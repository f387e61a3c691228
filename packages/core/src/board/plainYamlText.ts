/**
 * The fast way to read a YAML board file as people write them: block mappings and lists,
 * one-line flow mappings and lists, plain and quoted scalars, comments. yaml's parser keeps
 * a node per value and took most of `trivar solve`'s time on a 1,000-load YAML board.
 *
 * Only used where the answer is certainly the one yaml gives (YAML 1.2 core schema, as
 * readYamlText reads it): anything outside that plain subset returns `undefined` and goes to
 * yaml, which also words every error. Outside it are, among others: anchors and aliases
 * (so the alias limits stay with yaml), tags, block scalars (| >), multi-line plain or
 * quoted scalars and flow collections, `?` keys, directives and document markers, tabs,
 * a repeated key, keys that read as numbers or booleans, `#` or `:` inside a plain scalar,
 * escapes in double quotes other than \" and \\. The depth and entry limits are checked
 * on the text before either reader runs (readBoardText.ts).
 * test/property/plainYamlText.test.ts holds it to yaml's reading on generated and mangled text.
 */

/** Thrown inside the reader to step aside; never leaves this module. */
const ASIDE: unique symbol = Symbol('not plain YAML');

/** Characters the subset allows: printable ASCII, and printable non-ASCII except line and paragraph separators, BOM and non-characters. */
const OUTSIDE_SUBSET = /[^\n\x20-\x7e\xa1-\u2027\u202a-\ud7ff\ue000-\ufefe\uff00-\ufffd\u{10000}-\u{10ffff}]/u;

interface Line {
  /** Leading spaces. */
  readonly indent: number;
  readonly text: string;
}

/** The text as plain data when it lies in the plain subset; otherwise undefined. */
export function readPlainYamlText(text: string): unknown {
  const body = text.includes('\r') ? text.replace(/\r\n/g, '\n') : text;
  if (OUTSIDE_SUBSET.test(body)) return undefined;
  const lines: Line[] = [];
  for (const raw of body.split('\n')) {
    let indent = 0;
    while (raw.charCodeAt(indent) === 0x20) indent++;
    if (indent === raw.length || raw[indent] === '#') continue; // blank or comment only
    if (indent === 0 && (raw.startsWith('---') || raw.startsWith('...') || raw[0] === '%')) return undefined;
    lines.push({ indent, text: raw });
  }
  if (lines.length === 0 || lines[0]!.indent !== 0) return undefined;
  try {
    const reader = new BlockReader(lines);
    const value = reader.mapping(0);
    return reader.done() ? value : undefined;
  } catch (e) {
    if (e === ASIDE) return undefined;
    throw e;
  }
}

const aside = (): never => {
  throw ASIDE;
};

class BlockReader {
  private at = 0;
  constructor(private readonly lines: readonly Line[]) {}

  done(): boolean {
    return this.at === this.lines.length;
  }

  private next(): Line | undefined {
    return this.lines[this.at];
  }

  /** A block mapping whose keys sit at `indent`; the first entry may start mid-line at `column` (after "- "). */
  mapping(indent: number, column = indent): Record<string, unknown> {
    const out: Record<string, unknown> = {};
    let first = true;
    for (let line = this.next(); line; line = this.next()) {
      const start = first ? column : line.indent;
      if (!first) {
        if (line.indent < indent) break;
        if (line.indent > indent) aside();
      }
      first = false;
      const scan = new LineScanner(line.text, start);
      const key = scan.key();
      if (Object.hasOwn(out, key)) aside(); // yaml refuses a repeated key: let it say so
      this.at++;
      out[key] = scan.atEnd() ? this.valueBelow(indent) : this.inlineValue(scan, indent);
    }
    return out;
  }

  /** A value on the key's own line: nothing deeper may follow it (that would continue a scalar). */
  private inlineValue(scan: LineScanner, indent: number): unknown {
    const value = scan.blockValue();
    const following = this.next();
    if (following && following.indent > indent) aside();
    return value;
  }

  /** The value of a key or "-" that ends its line: a deeper block, a list at the key's own indent, or null. */
  private valueBelow(indent: number): unknown {
    const line = this.next();
    if (!line || line.indent < indent) return null;
    if (line.indent === indent) return isListItem(line) ? this.list(indent) : null;
    return isListItem(line) ? this.list(line.indent) : this.mapping(line.indent);
  }

  /** A block list whose "-" marks sit at `indent`. */
  private list(indent: number): unknown[] {
    const out: unknown[] = [];
    for (let line = this.next(); line; line = this.next()) {
      if (line.indent < indent) break;
      if (line.indent > indent || !isListItem(line)) {
        if (line.indent > indent) aside();
        break; // a key at the same indent: the list was a mapping value written at its key's indent
      }
      let column = indent + 1;
      while (line.text.charCodeAt(column) === 0x20) column++;
      if (column === line.text.length) {
        this.at++;
        out.push(this.valueBelow(indent + 1));
        continue;
      }
      if (line.text[column] === '#') aside();
      const scan = new LineScanner(line.text, column);
      if (scan.startsMapping()) out.push(this.mapping(column, column));
      else {
        this.at++;
        out.push(this.inlineValue(scan, indent));
      }
    }
    return out;
  }
}

const isListItem = (line: Line): boolean => line.text[line.indent] === '-' && (line.text.length === line.indent + 1 || line.text[line.indent + 1] === ' ');

/** Scans one line from a position: keys, scalars and one-line flow collections. */
class LineScanner {
  private i: number;
  constructor(
    private readonly text: string,
    start: number,
  ) {
    this.i = start;
  }

  private skipSpaces(): void {
    while (this.text.charCodeAt(this.i) === 0x20) this.i++;
  }

  /** Only spaces or a comment are left. */
  atEnd(): boolean {
    this.skipSpaces();
    return this.i >= this.text.length || (this.text[this.i] === '#' && this.text[this.i - 1] === ' ');
  }

  /** Whether a `key:` starts here (looked at without moving). */
  startsMapping(): boolean {
    const c = this.text.charCodeAt(this.i);
    if (c === 0x7b || c === 0x5b) return false; // { [ : a flow collection
    const from = this.i;
    try {
      this.key();
      return true;
    } catch (e) {
      if (e !== ASIDE) throw e;
      return false;
    } finally {
      this.i = from;
    }
  }

  /** A block mapping key and its ":" (followed by a space or the line's end). */
  key(): string {
    const key = this.keyText(false);
    if (this.text[this.i] !== ':') aside();
    this.i++;
    if (this.i < this.text.length && this.text[this.i] !== ' ') aside();
    return key;
  }

  private keyText(flow: boolean): string {
    const c = this.text[this.i];
    const key = c === '"' || c === "'" ? this.quoted() : this.plain(flow, true);
    // yaml refuses implicit keys over 1024 characters; __proto__ is left to its careful reader.
    if (typeof key !== 'string' || key === '__proto__' || key.length > 1000) aside();
    this.skipSpaces();
    return key as string;
  }

  /** The rest of a block line as one value: a flow collection, a quoted or a plain scalar. */
  blockValue(): unknown {
    this.skipSpaces();
    const c = this.text[this.i];
    const value = c === '{' ? this.flowMapping() : c === '[' ? this.flowList() : c === '"' || c === "'" ? this.quoted() : this.plain(false, false);
    if (!this.atEnd()) aside();
    return value;
  }

  private flowValue(): unknown {
    const c = this.text[this.i];
    if (c === '{') return this.flowMapping();
    if (c === '[') return this.flowList();
    if (c === '"' || c === "'") return this.quoted();
    return this.plain(true, false);
  }

  /** `{ key: value, ... }` closed on this line; no empty values, no trailing comma. */
  private flowMapping(): Record<string, unknown> {
    const out: Record<string, unknown> = {};
    this.i++;
    this.skipSpaces();
    if (this.text[this.i] === '}') {
      this.i++;
      return out;
    }
    for (;;) {
      if (this.simpleEntry(out)) return out;
      const key = this.keyText(true);
      if (this.text[this.i] !== ':' || this.text[this.i + 1] !== ' ') aside();
      this.i += 2;
      this.skipSpaces();
      if (Object.hasOwn(out, key)) aside();
      out[key] = this.flowValue();
      this.skipSpaces();
      const c = this.text[this.i++];
      if (c === '}') return out;
      if (c !== ',') aside();
      this.skipSpaces();
    }
  }

  /**
   * The common entry `name: plain text,` (or `}`) read by one regular expression: the same
   * key, value and position the general steps below reach. False (nothing read) for any
   * other entry, which the general steps then read or refuse. True when it closed the mapping.
   */
  private simpleEntry(out: Record<string, unknown>): boolean {
    for (;;) {
      SIMPLE_FLOW_ENTRY.lastIndex = this.i;
      const m = SIMPLE_FLOW_ENTRY.exec(this.text);
      if (m === null) return false;
      const key = trimSpaces(m[1]!);
      const text = trimSpaces(m[2]!);
      if (!isPlainStart(text.charCodeAt(0), text.charCodeAt(1)) || key === '__proto__' || key.length > 1000 || typeof resolvePlain(key) !== 'string') return false;
      if (Object.hasOwn(out, key)) aside();
      out[key] = resolvePlain(text);
      this.i = SIMPLE_FLOW_ENTRY.lastIndex;
      if (m[3] === '}') return true;
      this.skipSpaces();
    }
  }

  /** `[ value, ... ]` closed on this line; no empty entries, no `key: value` pairs, no trailing comma. */
  private flowList(): unknown[] {
    const out: unknown[] = [];
    this.i++;
    this.skipSpaces();
    if (this.text[this.i] === ']') {
      this.i++;
      return out;
    }
    for (;;) {
      out.push(this.flowValue());
      this.skipSpaces();
      const c = this.text[this.i++];
      if (c === ']') return out;
      if (c !== ',') aside();
      this.skipSpaces();
    }
  }

  /** A quoted scalar closed on this line ('' in single quotes; only \" and \\ escapes in double). */
  private quoted(): string {
    const q = this.text[this.i]!;
    let out = '';
    let from = ++this.i;
    for (;;) {
      if (this.i >= this.text.length) aside();
      const c = this.text[this.i]!;
      if (q === "'" && c === "'") {
        if (this.text[this.i + 1] !== "'") break;
        out += this.text.slice(from, this.i + 1);
        this.i += 2;
        from = this.i;
      } else if (q === '"' && c === '"') break;
      else if (q === '"' && c === '\\') {
        const e = this.text[this.i + 1];
        if (e !== '"' && e !== '\\') aside();
        out += this.text.slice(from, this.i) + e;
        this.i += 2;
        from = this.i;
      } else this.i++;
    }
    out += this.text.slice(from, this.i);
    this.i++;
    // What follows a closing quote: spaces, then ":" "," "]" "}" "#" or the line's end.
    const after = this.text[this.i];
    if (after !== undefined && after !== ' ' && after !== ':' && after !== ',' && after !== ']' && after !== '}') aside();
    return out;
  }

  /**
   * A plain scalar up to the line's end, a comment, or (in flow) `,` `]` `}`, or (a key) `: `;
   * resolved as the YAML 1.2 core schema does. Keys must read as text.
   */
  private plain(flow: boolean, isKey: boolean): unknown {
    const text = this.text;
    const start = this.i;
    if (!isPlainStart(text.charCodeAt(start), text.charCodeAt(start + 1))) aside();
    // Runs of ordinary characters are skipped by a regular expression (native); each stop decides.
    const run = flow ? FLOW_PLAIN_RUN : BLOCK_PLAIN_RUN;
    let i = start;
    for (;;) {
      run.lastIndex = i;
      run.test(text);
      i = run.lastIndex;
      if (i >= text.length) break;
      const ch = text.charCodeAt(i);
      if (ch === 0x23 /* # */) {
        if (text.charCodeAt(i - 1) === 0x20) break; // a comment
        aside();
      }
      if (ch === 0x3a /* : */) {
        if (isKey && (i + 1 === text.length || text.charCodeAt(i + 1) === 0x20)) break;
        aside();
      }
      if (flow && (ch === 0x2c || ch === 0x5d || ch === 0x7d)) break; // , ] }
      aside(); // [ { anywhere, ] } outside flow
    }
    let end = i;
    while (text.charCodeAt(end - 1) === 0x20) end--;
    this.i = end;
    const value = resolvePlain(text.slice(start, end));
    if (isKey && typeof value !== 'string') aside();
    return value;
  }
}

/** A flow mapping entry of a plain key and a plain value with no character that needs a decision, then `,` or `}`. */
// Greedy runs, each ended by a character it cannot hold: no backtracking blow-up on long lines (spaces are trimmed after).
const SIMPLE_FLOW_ENTRY = /([A-Za-z_$][\w$ -]*): +([^ #:[\]{},'"][^#:[\]{},'"]*)([,}])/y;

/** Without trailing spaces (only spaces: YAML counts other space characters as content). */
function trimSpaces(text: string): string {
  let end = text.length;
  while (text.charCodeAt(end - 1) === 0x20) end--;
  return end === text.length ? text : text.slice(0, end);
}

/** Characters of a plain scalar that need no decision; the scan stops at the others. */
const BLOCK_PLAIN_RUN = /[^#:[\]{}]*/y;
const FLOW_PLAIN_RUN = /[^#:[\]{},]*/y;

/**
 * First characters a plain scalar may have here: letters, digits, _ . $ ( / + ~, "-" before a
 * digit or ".", and non-ASCII (the rest are YAML indicators, or rare enough to leave to yaml).
 */
function isPlainStart(c: number, next: number): boolean {
  if ((c >= 0x61 && c <= 0x7a) || (c >= 0x41 && c <= 0x5a) || (c >= 0x30 && c <= 0x39)) return true;
  if (c === 0x5f || c === 0x2e || c === 0x24 || c === 0x28 || c === 0x2f || c === 0x2b || c === 0x7e) return true;
  if (c === 0x2d) return (next >= 0x30 && next <= 0x39) || next === 0x2e;
  return c >= 0xa1;
}

/** A plain scalar's value under the YAML 1.2 core schema, tried in yaml's order (null, bool, int, float; else text). */
export function resolvePlain(source: string): unknown {
  const c = source.charCodeAt(0);
  // Text at once when it cannot be anything else: null and booleans start n N t T f F ~, numbers a digit, sign or ".".
  const couldBeOther = source.length === 0 || c === 0x6e || c === 0x4e || c === 0x74 || c === 0x54 || c === 0x66 || c === 0x46 || c === 0x7e || c === 0x2b || c === 0x2d || c === 0x2e || (c >= 0x30 && c <= 0x39);
  if (!couldBeOther) return source;
  if (/^(?:~|[Nn]ull|NULL)?$/.test(source)) return null;
  if (/^(?:[Tt]rue|TRUE|[Ff]alse|FALSE)$/.test(source)) return source[0] === 't' || source[0] === 'T';
  if (/^0o[0-7]+$/.test(source)) return parseInt(source.substring(2), 8);
  if (/^[-+]?[0-9]+$/.test(source)) return parseInt(source, 10);
  if (/^0x[0-9a-fA-F]+$/.test(source)) return parseInt(source.substring(2), 16);
  if (/^(?:[-+]?\.(?:inf|Inf|INF)|\.nan|\.NaN|\.NAN)$/.test(source))
    return source.slice(-3).toLowerCase() === 'nan' ? Number.NaN : source[0] === '-' ? Number.NEGATIVE_INFINITY : Number.POSITIVE_INFINITY;
  if (/^[-+]?(?:\.[0-9]+|[0-9]+(?:\.[0-9]*)?)[eE][-+]?[0-9]+$/.test(source)) return parseFloat(source);
  if (/^[-+]?(?:\.[0-9]+|[0-9]+\.[0-9]*)$/.test(source)) return parseFloat(source);
  return source;
}
