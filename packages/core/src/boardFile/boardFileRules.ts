/**
 * The board file's cross-field rules (the board's own, then the studies'), and the
 * shortcut past the schema for a file of the board's own fields. No zod here: the
 * command line reads a well-formed board without loading the schemas (validateBoard.ts
 * has the full check).
 */
import { BOARD_RULES, type BoardRule } from '../board/boardRules.js';
import { readTradeSpellings } from '../board/conventions/readTradeSpellings.js';
import { wellFormedBoardShape } from '../board/wellFormedBoard.js';
import { ruleHarmonicFields, ruleInstalledBankRating } from '../harmonics/harmonicsRules.js';
import type { BoardSpec } from './boardFileSchema.js';

/** The rules the studies add to the board's own, run after them. */
export const STUDY_BOARD_RULES = [ruleHarmonicFields, ruleInstalledBankRating] as const;

export const BOARD_FILE_RULES: readonly BoardRule<BoardSpec>[] = [...BOARD_RULES, ...STUDY_BOARD_RULES];

/**
 * The validated board, when `input` is a board file of the board's own fields (no study
 * section or study load field) that passes the schema and every rule as written; otherwise
 * undefined, and `validateBoard` gives the answer with every problem named. Where it gives a
 * board, it is the one `validateBoard` gives.
 */
export function readWellFormedBoard(input: unknown): BoardSpec | undefined {
  const spelt = readTradeSpellings(input);
  if (spelt.issues.length) return undefined;
  // The board's own fields are a BoardSpec with no study field set.
  const board = wellFormedBoardShape(spelt.input) as BoardSpec | undefined;
  return board && BOARD_FILE_RULES.every((rule) => rule(board, 'A/B/C').length === 0) ? board : undefined;
}
