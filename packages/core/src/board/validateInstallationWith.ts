/**
 * How an installation file is validated (and a board file, which is the
 * one-board installation): schema first, then the tree and board rules. The
 * whole file's schemas and rules are composed in boardFile/ and handed in here.
 */
import type * as z from 'zod';
import type { InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { withoutUnwrittenSystem } from './validateBoardWith.js';
import { eitherFormIssues } from './eitherFormIssues.js';
import type { BoardBaseSpec } from './boardSchema.js';
import type { InstallationBaseSpec } from './installationSchema.js';
import { validateBoardWith, type BoardFileChecks } from './validateBoardWith.js';
import { readTradeSpellings } from './conventions/readTradeSpellings.js';
import { isInstallationInput } from './installationInput.js';
import { inFileNaming, issueNamingOf } from './conventions/issueNaming.js';
import type { PhaseNaming } from './conventions/phaseNames.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';
import { withConductorSizeHints } from './conductorSizeSpelling.js';

/** What an installation file is checked against, and how a board file becomes one. */
export interface InstallationFileChecks<I extends InstallationBaseSpec, B extends BoardBaseSpec> {
  readonly schema: z.ZodType<I>;
  readonly rules: readonly ((spec: I, naming: PhaseNaming) => InputIssue[])[];
  /** A board file is validated as a board, then taken as the installation with that one board. */
  readonly board: BoardFileChecks<B>;
  readonly boardAsInstallation: (board: B) => I;
}

export type InstallationValidationOf<I> = { ok: true; installation: I } | { ok: false; issues: InputIssue[] };


/** The installation a board file describes: its one board under the supply (the board's own fields only). */
export function oneBoardInstallation<B extends BoardBaseSpec>(board: B) {
  const { feeder, loads, name, supply, studies, note, conventions } = board;
  return {
    ...(name ? { name } : {}),
    ...(note ? { note } : {}),
    supply,
    ...(conventions ? { conventions } : {}),
    boards: [{ name: name ?? 'board', loads: loads as B['loads'], ...(feeder ? { feeder } : {}) }],
    ...(studies ? { studies } : {}),
  };
}

/**
 * Checks an installation object against `checks`; a board object (supply,
 * feeder, loads) is accepted too and becomes the installation with that one board.
 */
export function validateInstallationWith<I extends InstallationBaseSpec, B extends BoardBaseSpec>(
  checks: InstallationFileChecks<I, B>,
  input: unknown,
): InstallationValidationOf<I> {
  if (!isInstallationInput(input)) {
    const board = validateBoardWith(checks.board, input);
    return board.ok ? { ok: true, installation: checks.boardAsInstallation(board.board) } : board;
  }
  const spelt = readTradeSpellings(input);
  const naming = spelt.spellings.naming;
  const parsed = checks.schema.safeParse(spelt.input, ONE_SHOT_PARSE);
  if (!parsed.success)
    return {
      ok: false,
      issues: [...spelt.issues, ...inFileNaming(withoutUnwrittenSystem(withConductorSizeHints(inputIssuesFromZod(eitherFormIssues(parsed.error.issues, spelt.input), spelt.input, [], { schema: checks.schema, input: spelt.input }), spelt.input), input), naming)],
    };
  const issues = [...spelt.issues, ...inFileNaming(checks.rules.flatMap((rule) => rule(parsed.data, issueNamingOf(naming))), naming)];
  return issues.length ? { ok: false, issues } : { ok: true, installation: parsed.data };
}
