/**
 * The board and installation files' cross-field rules (the board's own, then the studies'), and the
 * shortcuts past the schemas for a file of the board's or the installation's own fields. No zod here: the
 * command line reads a well-formed board without loading the schemas (validateBoard.ts
 * has the full check).
 */
import { BOARD_RULES, type BoardRule } from '../board/boardRules.js';
import { readTradeSpellings } from '../board/conventions/readTradeSpellings.js';
import { wellFormedBoardShape } from '../board/wellFormedBoard.js';
import { installationRulesWith } from '../board/installationRules.js';
import { wellFormedInstallationShape } from '../board/wellFormedInstallation.js';
import type { PhaseNaming } from '../board/conventions/phaseNames.js';
import type { InputIssue } from '../errors.js';
import { ruleHarmonicFields, ruleInstallationBankRatings, ruleInstalledBankRating } from '../harmonics/harmonicsRules.js';
import type { BoardSpec, InstallationSpec } from './boardFileSchema.js';

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

/** The installation file's rules: the tree, each board's own and the studies', then the installed banks' ratings. */
export const INSTALLATION_FILE_RULES: readonly ((spec: InstallationSpec, naming: PhaseNaming) => InputIssue[])[] = [
  ...installationRulesWith<InstallationSpec>(BOARD_FILE_RULES),
  ruleInstallationBankRatings,
];

/**
 * The validated installation, when `input` is an installation file (with `boards:`) of the installation's
 * own fields (no study section or study load field) that passes the schema and every rule as written;
 * otherwise undefined, and `validateInstallation` gives the answer with every problem named. Where it
 * gives an installation, it is the one `validateInstallation` gives.
 */
export function readWellFormedInstallation(input: unknown): InstallationSpec | undefined {
  const spelt = readTradeSpellings(input);
  if (spelt.issues.length) return undefined;
  // The installation's own fields are an InstallationSpec with no study field set.
  const spec = wellFormedInstallationShape(spelt.input) as InstallationSpec | undefined;
  return spec && INSTALLATION_FILE_RULES.every((rule) => rule(spec, 'A/B/C').length === 0) ? spec : undefined;
}
