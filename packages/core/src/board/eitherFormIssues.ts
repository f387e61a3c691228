/**
 * A conductor and a source impedance may be written flat ({ mm2, … }, { r, x }) or per phase
 * ({ A, B, C }). zod tries both forms; when one form has a field of the wrong kind
 * (`mm2: "16"`) that form aborts, and zod reports the other form's complaint instead
 * ("mm2: unknown key"), which names the wrong cause; with an unknown key in either, it reports
 * both forms' complaints at once. The value is checked here against the form its shape shows
 * (any A, B or C key: per phase), so each issue says what is wrong, at the field.
 */
import type * as z from 'zod';
import type { core } from 'zod';
import { conductorSchema, impedanceSchema, perPhaseConductorSchema, perPhaseImpedanceSchema } from './boardSchema.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';

/** Where a value may take either form, by the end of its path, and its two forms. */
const EITHER_FORM: readonly { readonly at: (path: readonly PropertyKey[]) => boolean; readonly flat: z.ZodType; readonly perPhase: z.ZodType }[] = [
  { at: (p) => p.length >= 2 && p[p.length - 1] === 'line' && p[p.length - 2] === 'feeder', flat: conductorSchema, perPhase: perPhaseConductorSchema },
  { at: (p) => p.length === 2 && p[0] === 'supply' && p[1] === 'impedance', flat: impedanceSchema, perPhase: perPhaseImpedanceSchema },
];

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let node = root;
  for (const key of path) node = node !== null && typeof node === 'object' ? (node as Record<PropertyKey, unknown>)[key] : undefined;
  return node;
}

const isObject = (value: unknown): value is object => value !== null && typeof value === 'object' && !Array.isArray(value);

/** The zod issues of a file, with each either-form value's issues taken from the form it is written in. */
export function eitherFormIssues(issues: readonly core.$ZodIssue[], input: unknown): core.$ZodIssue[] {
  return issues.flatMap((issue) => {
    if (issue.code !== 'unrecognized_keys' && issue.code !== 'invalid_union') return [issue];
    const form = EITHER_FORM.find((f) => f.at(issue.path));
    const value = valueAt(input, issue.path);
    if (!form || value === undefined) return [issue];
    const schema = isObject(value) && ['A', 'B', 'C'].some((k) => k in value) ? form.perPhase : form.flat;
    const own = schema.safeParse(value, ONE_SHOT_PARSE);
    return own.success ? [issue] : own.error.issues.map((i) => ({ ...i, path: [...issue.path, ...i.path] }));
  });
}
