/**
 * Validation of installation files (and of board files, which are one-board
 * installations): schema first, then the tree and board rules.
 */
import { InputError, type InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { validateBoard } from './validateBoard.js';
import { installationSchema, type InstallationSpec } from './installationSchema.js';
import { INSTALLATION_RULES } from './installationRules.js';
import { readTradeSpellings } from '../conventions/readTradeSpellings.js';
import { inFileNaming } from '../conventions/issueNaming.js';

export type InstallationValidation = { ok: true; installation: InstallationSpec } | { ok: false; issues: InputIssue[] };

/** True when a parsed file describes an installation (it has `boards`) rather than one board. */
export const isInstallationInput = (input: unknown): boolean => typeof input === 'object' && input !== null && 'boards' in input;

/**
 * Checks an installation object; a board object (supply, feeder, loads) is
 * accepted too and becomes the installation with that one board.
 */
export function validateInstallation(input: unknown): InstallationValidation {
  if (!isInstallationInput(input)) {
    const board = validateBoard(input);
    if (!board.ok) return board;
    const { feeder, loads, name, supply, studies, correction, note, conventions } = board.board;
    return {
      ok: true,
      installation: {
        ...(name ? { name } : {}),
        ...(note ? { note } : {}),
        supply,
        ...(conventions ? { conventions } : {}),
        boards: [{ name: name ?? 'board', loads, ...(feeder ? { feeder } : {}) }],
        ...(studies ? { studies } : {}),
        ...(correction ? { correction } : {}),
      },
    };
  }
  const spelt = readTradeSpellings(input);
  const parsed = installationSchema.safeParse(spelt.input);
  const naming = spelt.spellings.naming;
  if (!parsed.success) return { ok: false, issues: [...spelt.issues, ...inFileNaming(inputIssuesFromZod(parsed.error.issues, spelt.input), naming)] };
  const issues = [...spelt.issues, ...inFileNaming(INSTALLATION_RULES.flatMap((rule) => rule(parsed.data)), naming)];
  return issues.length ? { ok: false, issues } : { ok: true, installation: parsed.data };
}

/** @throws {InputError} listing every problem, each with its field path. */
export function parseInstallation(input: unknown): InstallationSpec {
  const result = validateInstallation(input);
  if (!result.ok) throw new InputError(result.issues, isInstallationInput(input) ? 'the installation is not valid' : 'the board is not valid');
  return result.installation;
}
