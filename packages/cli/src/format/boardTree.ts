/** A board's name in a table of the installation's boards, indented by its depth in the feeding tree. */

/** Deeper than this, the indent stops growing and the level is written out (a 500-board chain stays readable). */
export const MAX_TREE_INDENT = 6;

/** "Floor 2" at depth 3 → "    └ Floor 2"; at depth 40 → "            └ Floor 39 (level 40)". */
export function treeName(name: string, depth: number): string {
  if (depth <= 1) return name;
  const indent = '  '.repeat(Math.min(depth - 1, MAX_TREE_INDENT));
  return depth - 1 > MAX_TREE_INDENT ? `${indent}└ ${name} (level ${depth})` : `${indent}└ ${name}`;
}
