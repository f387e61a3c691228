/** A board name indented by its depth in the installation's tree, so a table reads as the riser does. */
export const treeName = (name: string, depth: number): string => `${'  '.repeat(depth - 1)}${depth > 1 ? '└ ' : ''}${name}`;
