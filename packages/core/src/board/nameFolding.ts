/**
 * Names as a reader tells them apart. Two names that differ only in the kind or number of spaces (a
 * no-break space, a thin space, a doubled space) or in characters that print as nothing (zero-width
 * spaces and joiners, a soft hyphen, a byte-order mark) look the same in every table, drawing and
 * work order, so the rules compare them in this folded form.
 */

/** Characters that print as nothing: zero-width space, non-joiner and joiner, word joiner, soft hyphen, BOM. */
const INVISIBLE = /[\u200B-\u200D\u2060\u00AD\uFEFF]/g;

/** A name with its compatibility forms unified (NFKC), invisible characters dropped and every run of spaces one plain space, trimmed. */
export const spaceFoldedName = (name: string): string => name.normalize('NFKC').replace(INVISIBLE, '').replace(/\s+/g, ' ').trim();

/** spaceFoldedName and letter case folded too: board names, which --board and the reports must tell apart. */
export const caseFoldedName = (name: string): string => spaceFoldedName(name).toLowerCase();

/** The characters of a name that are spaces other than the plain one, or invisible, as code points ("U+00A0"), once each. */
export const hiddenCharactersOf = (name: string): string[] =>
  [...new Set([...name].filter((c) => (c !== ' ' && /\s/.test(c)) || /[\u200B-\u200D\u2060\u00AD\uFEFF]/.test(c)))].map((c) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`);
