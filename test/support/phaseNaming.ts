/**
 * The same board file in the other phase naming, and checks that a report keeps to one naming.
 * The rewrite touches only phase terms the file reader translates (connections, capacitor
 * branches, `on:` of pinned circuits, keys that are exactly a phase); names stay as written.
 */

const PAIR: Readonly<Record<string, string>> = { 'A-N': 'L1-N', 'B-N': 'L2-N', 'C-N': 'L3-N', 'A-B': 'L1-L2', 'B-C': 'L2-L3', 'C-A': 'L3-L1', 'ABC-star': 'L1L2L3-star', 'ABC-delta': 'L1L2L3-delta' };

/** A board, installation or hand-figures file (YAML) written with L1/L2/L3 instead of A/B/C. */
export function inNumberedNames(text: string): string {
  return text
    .replace(/\b(connection|branch|on): (ABC-star|ABC-delta|[ABC]-[ABCN])\b/g, (_, key: string, term: string) => `${key}: ${PAIR[term] ?? term}`)
    .replace(/^(\s+)([ABC]): /gm, (_, indent: string, p: string) => `${indent}L${'ABC'.indexOf(p) + 1}: `)
    .replace(/([{,] )([ABC]): /g, (_, before: string, p: string) => `${before}L${'ABC'.indexOf(p) + 1}: `);
}

/**
 * A phase, pair or branch label in A/B/C letters: a pair anywhere ("A-B", "C-N"), "line A", "phase B",
 * "lines A, C", the three-phase "ABC", a row label at a table's edge, or "A 0.950" in a list of figures.
 * Not a column head in amperes ("highest line A  neutral A", "line A = √(a² + r²)").
 */
export const LETTERED_LABEL = /(^|[\s(,:])(?:[ABC]-[ABCN]\b|lines? [ABC]\b(?! {2}| =)|phases? [ABC]\b|ABC\b)|^ {2}[ABC] {2}\S|(^|[\s,:])[ABC] (?:[01]\.\d{3}|\d+(?:\.\d)? ?A\b)|>[ABC]</m;
/** An L1/L2/L3 label anywhere. */
export const NUMBERED_LABEL = /\bL[123]\b|L1L2L3/;

/** The figures of a text in order, with every phase label taken out first, so two namings compare figure by figure. */
export function figuresOf(text: string): string[] {
  const bare = text.replace(/L1L2L3|\bL[123]\b|\bABC\b|\b[ABC]\b/g, '');
  return bare.match(/-?\d+(?:[.,]\d+)*/g) ?? [];
}

/** The text of an HTML or SVG document, one text node a line, entities as written. */
export const textOfMarkup = (markup: string): string =>
  markup
    .replace(/<style[\s\S]*?<\/style>/g, '')
    .replace(/<[^>]*>/g, '\n')
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '')
    .map((l) => `  ${l}  `)
    .join('\n');
