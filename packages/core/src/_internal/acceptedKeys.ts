/**
 * The keys a schema takes at a path, for the unknown-key error: "boards[0].feeder.lenghtM"
 * should say which keys that object takes and which one was probably meant, not only
 * "see the JSON Schema". Walks zod's own schema description (`_zod.def`, the structure
 * zod 4 documents for introspection) along the path the issue names.
 */
import type { core } from 'zod';

type Def = core.$ZodTypeDef & Record<string, unknown>;
type Schema = core.$ZodType;

const defOf = (schema: Schema): Def => schema._zod.def as Def;

/** Wrappers that describe the same value as the schema inside them. */
const INNER: Readonly<Record<string, (def: Def) => Schema[]>> = {
  optional: (d) => [d.innerType as Schema],
  nullable: (d) => [d.innerType as Schema],
  default: (d) => [d.innerType as Schema],
  prefault: (d) => [d.innerType as Schema],
  nonoptional: (d) => [d.innerType as Schema],
  readonly: (d) => [d.innerType as Schema],
  catch: (d) => [d.innerType as Schema],
  // The input side: the file is read before any transform.
  pipe: (d) => [d.in as Schema],
  lazy: (d) => [(d.getter as () => Schema)()],
  union: (d) => [...(d.options as Schema[])],
  intersection: (d) => [d.left as Schema, d.right as Schema],
};

/** The schemas a value may be read by, wrappers removed; `depth` guards recursive (lazy) schemas. */
function forms(schema: Schema, depth = 0): Schema[] {
  const def = defOf(schema);
  const inner = INNER[def.type];
  if (!inner || depth > 32) return [schema];
  return inner(def).flatMap((s) => forms(s, depth + 1));
}

/** One step down the path: what reads `value[key]` under each form. */
function childForms(schema: Schema, key: PropertyKey): Schema[] {
  return forms(schema).flatMap((form): Schema[] => {
    const def = defOf(form);
    if (def.type === 'object') {
      const shape = def.shape as Record<string, Schema>;
      if (typeof key === 'string' && Object.hasOwn(shape, key)) return [shape[key]!];
      const rest = def.catchall as Schema | undefined;
      return rest && defOf(rest).type !== 'never' ? [rest] : [];
    }
    if (def.type === 'array' && typeof key === 'number') return [def.element as Schema];
    if (def.type === 'tuple' && typeof key === 'number') {
      const items = def.items as Schema[];
      const rest = def.rest as Schema | null | undefined;
      return key < items.length ? [items[key]!] : rest ? [rest] : [];
    }
    if (def.type === 'record') return [def.valueType as Schema];
    return [];
  });
}

/**
 * The keys the object at `path` takes, from the form that fits the object best (the one
 * that knows most of its keys: a union of shapes is read by the shape the user meant).
 * Null where the path does not lead to a fixed set of keys.
 */
export function acceptedKeysAt(root: Schema, path: readonly PropertyKey[], value: unknown): string[] | null {
  let here: Schema[] = [root];
  for (const key of path) here = here.flatMap((s) => childForms(s, key));
  const given = value !== null && typeof value === 'object' ? Object.keys(value) : [];
  let best: string[] | null = null;
  let bestKnown = -1;
  for (const form of here.flatMap((s) => forms(s))) {
    const def = defOf(form);
    if (def.type !== 'object') continue;
    const keys = Object.keys(def.shape as Record<string, Schema>);
    const known = given.filter((k) => keys.includes(k)).length;
    if (known > bestKnown) [best, bestKnown] = [keys, known];
  }
  return best;
}

/**
 * Edit distance with adjacent transpositions (optimal string alignment), letter case
 * ignored: "lenghtM" is one step from "lengthM", "kw" none from "kW".
 */
export function keyDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  const rows = Array.from({ length: s.length + 1 }, (_, i) => Array.from({ length: t.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= s.length; i++)
    for (let j = 1; j <= t.length; j++) {
      const cost = s[i - 1] === t[j - 1] ? 0 : 1;
      let d = Math.min(rows[i - 1]![j]! + 1, rows[i]![j - 1]! + 1, rows[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && s[i - 1] === t[j - 2] && s[i - 2] === t[j - 1]) d = Math.min(d, rows[i - 2]![j - 2]! + 1);
      rows[i]![j] = d;
    }
  return rows[s.length]![t.length]!;
}

const LONGEST_KEY = 64;

/**
 * The accepted key a mistyped one most likely meant: the nearest within one edit for
 * keys of up to four letters, two for longer ones; null when none is that near or two are
 * equally near (a guess between them would mislead).
 */
export function nearestKey(key: string, accepted: readonly string[]): string | null {
  // No key is this long: nothing to suggest, and the distance table would grow with the key.
  if (key.length > LONGEST_KEY) return null;
  const reach = key.length <= 4 ? 1 : 2;
  let best: string | null = null;
  let bestDistance = Infinity;
  let tie = false;
  for (const candidate of accepted) {
    const d = keyDistance(key, candidate);
    if (d < bestDistance) [best, bestDistance, tie] = [candidate, d, false];
    else if (d === bestDistance) tie = true;
  }
  return best !== null && bestDistance <= reach && !tie ? best : null;
}
