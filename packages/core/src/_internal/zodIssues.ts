/**
 * zod issues → trivar `InputIssue`s (code, field path, received, expected):
 * the one translation used by board files, correction studies and the options
 * of public functions, so every input error reads the same way.
 */
import type { core, ZodType } from 'zod';
import { formatPath, InputError, inputIssue, namingArgument, type InputIssue } from '../errors.js';
import { ONE_SHOT_PARSE } from './oneShotParse.js';
import { acceptedKeysAt, nearestKey } from './acceptedKeys.js';

const DOCUMENTED_KEYS = 'only the documented keys (see the JSON Schema: `trivar schema`, or `trivar schema --installation`)';
/** Longer lists of keys are cut here: the JSON Schema has them all. */
const KEYS_LISTED = 24;
/** YAML 1.2 has no merge keys; read as 1.1 they would also change numbers (see readBoardText.ts). */
const MERGE_KEY = 'no YAML merge key: files are read as YAML 1.2, where "<<" is an ordinary key; write the fields out, or reuse a whole value with an alias (*name)';

function expectedFor(issue: core.$ZodIssue): string {
  switch (issue.code) {
    case 'invalid_type':
      return issue.expected === 'object' ? 'an object' : issue.expected === 'array' ? 'a list' : issue.expected === 'int' ? 'a whole number' : `a ${issue.expected}`;
    case 'invalid_value':
      return `one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`;
    case 'too_small':
      // Physical ranges carry their whole range as the message (see boardSchema.ts `within`).
      if (issue.message.startsWith('a number ')) return issue.message;
      if (issue.origin === 'array') return `at least ${String(issue.minimum)} item(s)`;
      if (issue.origin === 'string') return 'a non-empty text';
      return `a number ${issue.inclusive ? '>=' : '>'} ${String(issue.minimum)}`;
    case 'too_big':
      if (issue.message.startsWith('a number ')) return issue.message;
      if (issue.origin === 'string') return `a text of at most ${String(issue.maximum)} characters`;
      if (issue.origin === 'array') return `at most ${String(issue.maximum)} item(s)`;
      return `a number ${issue.inclusive ? '<=' : '<'} ${String(issue.maximum)}`;
    case 'unrecognized_keys':
      return DOCUMENTED_KEYS;
    case 'invalid_union':
      // Each alternative says what it takes: "one of "a", "b" or a list".
      return issue.errors.map((alternative) => (alternative[0] ? expectedFor(alternative[0]) : '')).filter(Boolean).join(' or ') || issue.message;
    default:
      return issue.message;
  }
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let node: unknown = root;
  for (const key of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<PropertyKey, unknown>)[key];
  }
  return node;
}

/** What an unknown key's error can name: the schema the whole input was parsed with, and that input. */
export interface ParsedWith {
  readonly schema: ZodType;
  readonly input: unknown;
}

/**
 * "one of the keys taken here ("lengthM", "line", …); nearest: "lengthM"" when the schema
 * says which keys the object at `path` takes, else the pointer to the JSON Schema.
 */
function unknownKeyExpected(key: string, path: readonly PropertyKey[], parsedWith: ParsedWith | undefined): string {
  if (key === '<<') return MERGE_KEY;
  const accepted = parsedWith ? acceptedKeysAt(parsedWith.schema, path, valueAt(parsedWith.input, path)) : null;
  if (!accepted || accepted.length === 0) return DOCUMENTED_KEYS;
  const listed = accepted.slice(0, KEYS_LISTED).map((k) => JSON.stringify(k));
  const more = accepted.length > KEYS_LISTED ? `, and ${accepted.length - KEYS_LISTED} more in \`trivar schema\`` : '';
  const nearest = nearestKey(key, accepted);
  return `one of the keys taken here (${listed.join(', ')}${more})${nearest ? `; nearest: ${JSON.stringify(nearest)}` : ''}`;
}

/**
 * @param parsedWith the schema and the whole input the issues came from, for naming the
 *   keys an object takes where a key is unknown (optional: without it the error points at the JSON Schema)
 */
export function inputIssuesFromZod(issues: readonly core.$ZodIssue[], root: unknown, prefix: readonly PropertyKey[] = [], parsedWith?: ParsedWith): InputIssue[] {
  return issues.flatMap((issue) => {
    const path = [...prefix, ...issue.path];
    // An object that fits none of a union's forms but has the shape of one of them (its
    // problems are all inside, e.g. a negative resistance): report that form's problems at
    // their own paths. A value of the wrong kind altogether gets "one of … or …" below.
    if (issue.code === 'invalid_union' && issue.errors.length > 0) {
      const inside = issue.errors.filter((branch) => branch.length > 0 && branch.every((i) => i.path.length > 0));
      const closest = inside.sort((a, b) => a.length - b.length)[0];
      if (closest) return inputIssuesFromZod(closest, valueAt(root, issue.path), path, parsedWith);
      // A form that took the value's kind and refused its content with its own code (a voltage
      // notation with an impossible ratio) says why, rather than "an object or a text".
      const refused = issue.errors.find((branch) => branch.length > 0 && branch.every((i) => i.code === 'custom' && typeof i.params?.code === 'string'));
      if (refused) return inputIssuesFromZod(refused, valueAt(root, issue.path), path, parsedWith);
    }
    if (issue.code === 'unrecognized_keys') {
      // Only the object's own keys: an own `__proto__` key (JSON.parse makes one) becomes the prototype of
      // zod's copy, whose keys zod then lists as this object's (`lines: { __proto__: { currentA } }` was
      // reported at `lines.currentA`); the key the file wrote is `__proto__`.
      const object = valueAt(root, issue.path);
      const own = (key: string) => typeof object !== 'object' || object === null || Object.hasOwn(object, key);
      const keys = issue.keys.filter(own);
      if (own('__proto__') && typeof object === 'object' && object !== null && !keys.includes('__proto__')) keys.push('__proto__');
      // Never none: a parse that failed says why, even where the object read is not the one zod saw.
      return (keys.length ? keys : issue.keys).map((key) => inputIssue('unknown_key', formatPath([...path, key]), unknownKeyExpected(key, path, parsedWith), key));
    }
    // A record key the key schema refused (a group or scenario load named with a control character):
    // the key is what was wrong, so the issue is the key's, received the key, not the value under it.
    if (issue.code === 'invalid_key') {
      const inner = issue.issues[0] as core.$ZodIssue | undefined;
      const key = issue.path[issue.path.length - 1];
      const expected = inner ? expectedFor({ ...inner, path: [] } as core.$ZodIssue) : issue.message;
      return [inputIssue('invalid_key', formatPath(path), `a key that is ${expected}`, typeof key === 'symbol' ? String(key) : key)];
    }
    // A refinement may report a value of its own in params.received (a spectrum's total, not the list).
    const received = issue.code === 'custom' && issue.params?.received !== undefined ? (issue.params.received as unknown) : valueAt(root, issue.path);
    // A refinement names its own code in params.code (`duplicate`, `not_integer`...).
    const own = issue.code === 'custom' && typeof issue.params?.code === 'string' ? (issue.params.code as string) : null;
    const code = own ??
      ((issue.code === 'invalid_type' || issue.code === 'invalid_value') && received === undefined
        ? 'missing'
        : issue.code === 'too_small' || issue.code === 'too_big'
          ? 'out_of_range'
          : issue.code === 'invalid_union'
            ? 'invalid_value'
            : issue.code);
    return [inputIssue(code, formatPath(path), expectedFor(issue), received)];
  });
}

/**
 * Parses the options of a public function; throws one `InputError` naming
 * every bad field.
 * @throws {InputError}
 */
export function parseOptions<T>(schema: ZodType<T>, input: unknown, what: string): T {
  const parsed = schema.safeParse(input ?? {}, ONE_SHOT_PARSE);
  const issues = namingArgument(allInputIssues(parsed.success ? [] : parsed.error.issues, input, schema), 'options');
  if (!parsed.success || issues.length) throw new InputError(issues, `${what} are not valid`);
  return parsed.data;
}

/**
 * Own `__proto__` keys anywhere in the input. zod builds records by assignment
 * and skips that key silently (`perLoad: { __proto__: 0 }` vanished); strict
 * objects report it as unknown, records do not, so it is checked here. Paths
 * zod already reported are left out by the caller.
 */
export function reservedKeyIssues(input: unknown): InputIssue[] {
  const issues: InputIssue[] = [];
  const seen = new Set<object>();
  const stack: { value: unknown; path: PropertyKey[] }[] = [{ value: input, path: [] }];
  while (stack.length) {
    const { value, path } = stack.pop()!;
    if (value === null || typeof value !== 'object' || seen.has(value)) continue;
    seen.add(value);
    if (!Array.isArray(value) && Object.hasOwn(value, '__proto__'))
      issues.push(inputIssue('reserved_key', formatPath([...path, '__proto__']), 'a key other than "__proto__" (it cannot be told apart from the object itself; rename a load called that to list it here)', '__proto__'));
    for (const [k, v] of Object.entries(value)) stack.push({ value: v, path: [...path, Array.isArray(value) ? Number(k) : k] });
  }
  return issues;
}

/** zod issues plus the `__proto__` keys zod passed over, each path once; with `schema` (the one `input` was parsed with), unknown keys name the keys accepted. */
export function allInputIssues(zodIssues: readonly core.$ZodIssue[], input: unknown, schema?: ZodType): InputIssue[] {
  const issues = inputIssuesFromZod(zodIssues, input, [], schema ? { schema, input } : undefined);
  const reported = new Set(issues.map((i) => i.path));
  return [...issues, ...reservedKeyIssues(input).filter((i) => !reported.has(i.path))];
}
