/**
 * The shortcut past the board-file schema for `trivar correct`: a board of its own fields and a
 * `correction:` section, nothing else (riverside-cold-store.yaml). The board's fields are checked as
 * readWellFormedBoard checks them, without zod, and the section with the section's own schema. Where it
 * gives a board, it is the one validateBoard gives, key for key; anywhere else it gives undefined and
 * validateBoard words every problem as before.
 *
 * Why: `trivar correct` needs zod and the correction schema in any case, but building the whole file's
 * schema (every study's sections) and parsing the board with it took about half of reading such a file
 * (riverside: 96 → 50 ms including zod's own start, in fresh processes on a busy machine).
 * test/property/wellFormedCorrectionBoard.test.ts holds it to validateBoard.
 */
import { allInputIssues } from '../_internal/zodIssues.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';
import { readTradeSpellings } from '../board/conventions/readTradeSpellings.js';
import { wellFormedBoardShape } from '../board/wellFormedBoard.js';
import { BOARD_FILE_RULES } from './boardFileRules.js';
import type { BoardSpec } from './boardFileSchema.js';
import { correctionSection } from './correctionSection.js';

/** validateBoard's board, when `input` is a well-formed board with a valid correction section and no other study; otherwise undefined. */
export function readWellFormedCorrectionBoard(input: unknown): BoardSpec | undefined {
  if (input === null || typeof input !== 'object' || Array.isArray(input) || !Object.hasOwn(input, 'correction')) return undefined;
  // Spelt whole, as validateBoard spells it: a per-line target written L1/L2/L3 names the file's phases too.
  const spelt = readTradeSpellings(input);
  if (spelt.issues.length) return undefined;
  const { correction, ...own } = spelt.input as Record<string, unknown>;
  const board = wellFormedBoardShape(own);
  if (board === undefined) return undefined;
  const section = correctionSection.safeParse(correction, ONE_SHOT_PARSE);
  if (!section.success || allInputIssues([], correction).length) return undefined;
  // The schema's key order: the board's own fields, then the study sections, correction first.
  const spec = { ...board, correction: section.data } as BoardSpec;
  return BOARD_FILE_RULES.every((rule) => rule(spec, 'A/B/C').length === 0) ? spec : undefined;
}
