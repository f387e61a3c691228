/**
 * zod issues → trivar `InputIssue`s (code, field path, received, expected):
 * the one translation used by board files, correction studies and the options
 * of public functions, so every input error reads the same way.
 */
import type { core, ZodType } from 'zod';
import { formatPath, InputError, inputIssue, type InputIssue } from '../errors.js';

function expectedFor(issue: core.$ZodIssue): string {
  switch (issue.code) {
    case 'invalid_type':
      return issue.expected === 'object' ? 'an object' : issue.expected === 'array' ? 'a list' : `a ${issue.expected}`;
    case 'invalid_value':
      return `one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`;
    case 'too_small':
      if (issue.origin === 'array') return `at least ${String(issue.minimum)} item(s)`;
      if (issue.origin === 'string') return 'a non-empty text';
      return `a number ${issue.inclusive ? '>=' : '>'} ${String(issue.minimum)}`;
    case 'too_big':
      return `a number ${issue.inclusive ? '<=' : '<'} ${String(issue.maximum)}`;
    case 'unrecognized_keys':
      return 'only the documented keys (see the board JSON Schema)';
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

export function inputIssuesFromZod(issues: readonly core.$ZodIssue[], root: unknown, prefix: readonly PropertyKey[] = []): InputIssue[] {
  return issues.flatMap((issue) => {
    const path = [...prefix, ...issue.path];
    // A value that fits none of a union's forms: report the form it came closest to
    // (fewest problems, and not one whose very keys or type are wrong).
    if (issue.code === 'invalid_union' && issue.errors.length > 0) {
      const score = (branch: readonly core.$ZodIssue[]) =>
        branch.length + 100 * branch.filter((i) => i.path.length === 0 && (i.code === 'unrecognized_keys' || i.code === 'invalid_type')).length;
      const closest = [...issue.errors].sort((a, b) => score(a) - score(b))[0]!;
      return inputIssuesFromZod(closest, valueAt(root, issue.path), path);
    }
    if (issue.code === 'unrecognized_keys')
      return issue.keys.map((key) => inputIssue('unknown_key', formatPath([...path, key]), 'only the documented keys (see the board JSON Schema)', key));
    const received = valueAt(root, issue.path);
    const code =
      (issue.code === 'invalid_type' || issue.code === 'invalid_value') && received === undefined
        ? 'missing'
        : issue.code === 'too_small' || issue.code === 'too_big'
          ? 'out_of_range'
          : issue.code;
    return [inputIssue(code, formatPath(path), expectedFor(issue), received)];
  });
}

/**
 * Parses the options of a public function; throws one `InputError` naming
 * every bad field.
 * @throws {InputError}
 */
export function parseOptions<T>(schema: ZodType<T>, input: unknown, what: string): T {
  const parsed = schema.safeParse(input ?? {});
  if (!parsed.success) throw new InputError(inputIssuesFromZod(parsed.error.issues, input), `${what} are not valid`);
  return parsed.data;
}
