/**
 * One-part changes to plain data, for the tests that hold a shortcut to its schema (wellFormedBoard,
 * wellFormedInstallation): every place in a value, and a change that sets a number to another number,
 * a word to another word or anything to anything, deletes a key or an item, or adds a key.
 */

/** Every (object or list, key) pair inside `root`, and every object or list (key null: add a key there). */
export function places(root: unknown): [Record<string, unknown>, string | null][] {
  const out: [Record<string, unknown>, string | null][] = [];
  const walk = (v: unknown) => {
    if (v === null || typeof v !== 'object') return;
    const o = v as Record<string, unknown>;
    out.push([o, null]);
    for (const key of Object.keys(o)) {
      out.push([o, key]);
      walk(o[key]);
    }
  };
  walk(root);
  return out;
}

export interface Change {
  readonly at: number;
  readonly kind: 'set' | 'delete';
  readonly number: number;
  readonly word: string;
  readonly other: unknown;
  readonly typed: boolean;
  readonly key: string;
}

/** Applies `c` at place `c.at` (modulo the places there are) of `root`, in place. */
export function applyChange(root: unknown, c: Change): void {
  const all = places(root);
  const [target, key] = all[c.at % all.length]!;
  if (key === null) {
    const value = structuredClone(c.typed ? c.number : c.other); // the pool's objects are shared between runs
    if (Array.isArray(target)) target.push(value);
    else Object.defineProperty(target, c.key, { value, enumerable: true, writable: true, configurable: true });
  } else if (c.kind === 'delete') {
    if (Array.isArray(target)) target.splice(Number(key), 1);
    else delete target[key];
  } else {
    const now = target[key];
    target[key] = c.typed && typeof now === 'number' ? c.number : c.typed && typeof now === 'string' ? c.word : structuredClone(c.other);
  }
}
