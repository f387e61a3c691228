/**
 * The rule for names and short labels a person writes (loads, boards, scenarios, groups, catalogue
 * units...), as zod schemas. In a module of its own so the study sections' schemas can use it without
 * evaluating the whole board-file schema (the CLI builds only what a command needs; see
 * test/cli/startupEvaluation.test.ts).
 */
import * as z from 'zod';
import { NAME_CONTROLS_MESSAGE, NAME_MAX_CHARACTERS, NAME_REFERENCE_MAX_CHARACTERS, NAME_VISIBLE, NAME_WITHOUT_CONTROLS } from './boardRanges.js';

/** Text a person reads as written: some visible character, no controls or direction overrides, at most `maxCharacters`. */
export const readableText = (maxCharacters: number) =>
  z
    .string()
    .min(1)
    .max(maxCharacters)
    // An empty name is min(1)'s to report; this catches names of spaces only.
    .regex(NAME_VISIBLE, { message: 'a name with at least one visible character' })
    .regex(NAME_WITHOUT_CONTROLS, { message: NAME_CONTROLS_MESSAGE });

/** A board, installation or circuit name: some visible text, short enough to head a table row. */
export const nameSchema = (what: string) => readableText(NAME_MAX_CHARACTERS).describe(`${what} (at most ${NAME_MAX_CHARACTERS} characters)`);

/**
 * A name a study section gives or refers to (a scenario, a group, a condition, a board or load named
 * again): the rule of a load's name, so no name a report prints holds a control or direction override.
 * A reference to a load may be written "<board>/<load>" or "<board>//<load>", hence the longer limit.
 */
export const nameReferenceSchema = (what: string) => readableText(NAME_REFERENCE_MAX_CHARACTERS).describe(what);

/** A short label printed as written (a currency beside charges): the name rule, at most `maxCharacters`. */
export const labelSchema = (what: string, maxCharacters: number) => readableText(maxCharacters).describe(what);
