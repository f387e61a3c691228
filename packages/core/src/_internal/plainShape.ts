/**
 * Small shape checks on plain data, for shortcuts that stand in for a zod schema on the
 * inputs it passes unchanged. Each check returns a copy of the value or NOT_THIS_SHAPE; it
 * never explains a refusal: the caller then runs the schema, which words every problem.
 * A check may refuse more than its schema (that only costs time), never accept more.
 */
export const NOT_THIS_SHAPE: unique symbol = Symbol('not this shape');

/** A value's copy as the schema would give it, or NOT_THIS_SHAPE. */
export type PlainShape = (value: unknown) => unknown;

export interface PlainField {
  readonly shape: PlainShape;
  readonly optional: boolean;
}

const isPlainObject = (value: unknown): value is Record<string, unknown> => {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return false;
  const proto = Object.getPrototypeOf(value);
  return proto === Object.prototype || proto === null;
};

/** z.number() with .min/.gt and .max: a finite number in range. */
export const numberIn =
  (min: number, max: number, above = false): PlainShape =>
  (v) =>
    typeof v === 'number' && Number.isFinite(v) && (above ? v > min : v >= min) && v <= max ? v : NOT_THIS_SHAPE;

/** z.int() with .min and .max. */
export const wholeIn =
  (min: number, max: number): PlainShape =>
  (v) =>
    Number.isSafeInteger(v) && (v as number) >= min && (v as number) <= max ? v : NOT_THIS_SHAPE;

/** z.string() with .min and .max (in UTF-16 units, as zod counts). */
export const textOf =
  (minChars = 0, maxChars = Infinity): PlainShape =>
  (v) =>
    typeof v === 'string' && v.length >= minChars && v.length <= maxChars ? v : NOT_THIS_SHAPE;

/** z.enum / z.literal with a list. */
export const oneOf =
  (values: readonly (string | number)[]): PlainShape =>
  (v) =>
    (typeof v === 'string' || typeof v === 'number') && values.includes(v) ? v : NOT_THIS_SHAPE;

export const trueOrFalse: PlainShape = (v) => (typeof v === 'boolean' ? v : NOT_THIS_SHAPE);

/** z.union: the first option that passes (zod's order). */
export const firstOf =
  (...options: PlainShape[]): PlainShape =>
  (v) => {
    for (const option of options) {
      const out = option(v);
      if (out !== NOT_THIS_SHAPE) return out;
    }
    return NOT_THIS_SHAPE;
  };

export const required = (shape: PlainShape): PlainField => ({ shape, optional: false });
export const optional = (shape: PlainShape): PlainField => ({ shape, optional: true });

/**
 * z.strictObject: a plain object with only these keys. The copy lists the keys in the
 * shape's order, as zod's output does. A key present with the value undefined is refused
 * (files cannot write one; zod's output for it is not worth copying).
 */
export function strictObjectOf(fields: Readonly<Record<string, PlainField>>): PlainShape {
  const keys = Object.keys(fields);
  const shapes = keys.map((k) => fields[k]!.shape);
  const optionals = keys.map((k) => fields[k]!.optional);
  const known = new Set(keys);
  // Absent and inherited read alike below (v[key] === undefined) only while no key is a property of every object.
  for (const key of keys) if (key in Object.prototype) throw new Error(`strictObjectOf: "${key}" is a property of every object`);
  return (v) => {
    if (!isPlainObject(v)) return NOT_THIS_SHAPE;
    const own = Object.keys(v);
    for (let k = 0; k < own.length; k++) if (!known.has(own[k]!) || v[own[k]!] === undefined) return NOT_THIS_SHAPE;
    const out: Record<string, unknown> = {};
    for (let k = 0; k < keys.length; k++) {
      const key = keys[k]!;
      const given = v[key];
      if (given === undefined) {
        if (optionals[k]) continue;
        return NOT_THIS_SHAPE;
      }
      const value = shapes[k]!(given);
      if (value === NOT_THIS_SHAPE) return NOT_THIS_SHAPE;
      out[key] = value;
    }
    return out;
  };
}

/** z.array(...).min(n): a list, each item checked. */
export const listOf =
  (item: PlainShape, minItems = 0): PlainShape =>
  (v) => {
    if (!Array.isArray(v) || v.length < minItems) return NOT_THIS_SHAPE;
    const out: unknown[] = [];
    for (let i = 0; i < v.length; i++) {
      const value = item(v[i]);
      if (value === NOT_THIS_SHAPE) return NOT_THIS_SHAPE;
      out.push(value);
    }
    return out;
  };
