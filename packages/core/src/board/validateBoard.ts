/**
 * Validation of board files: schema first (zod), then the cross-field rules.
 * `validateBoard` returns a result; `parseBoard` throws an `InputError`.
 */
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { allInputIssues } from '../_internal/zodIssues.js';
import { boardSchema, feederSchema, loadSchema, supplySchema, type BoardSpec, type LoadSpec } from './boardSchema.js';
import { BOARD_RULES, partialBoardIssues, type BoardParts } from './boardRules.js';
import { readBoardText } from './readBoardText.js';
import { readTradeSpellings } from '../conventions/readTradeSpellings.js';
import { inFileNaming } from '../conventions/issueNaming.js';

export { readBoardText };

export type BoardValidation = { ok: true; board: BoardSpec } | { ok: false; issues: InputIssue[] };

/**
 * Checks an already-parsed board object (from JSON, YAML or code).
 * @returns `{ ok: true, board }` or `{ ok: false, issues }` with every problem found.
 */
export function validateBoard(input: unknown): BoardValidation {
  // An installation file handed to a one-board function: say so, not "unknown key boards".
  if (input !== null && typeof input === 'object' && 'boards' in input && !('loads' in input))
    return {
      ok: false,
      issues: [inputIssue('installation', 'boards', 'a single board (supply, feeder, loads); this is an installation file (boards:), which `trivar solve` and solveInstallation read', 'an installation')],
    };
  const spelt = readTradeSpellings(input);
  const naming = spelt.spellings.naming;
  const parsed = boardSchema.safeParse(spelt.input);
  const shapeIssues = allInputIssues(parsed.success ? [] : parsed.error.issues, spelt.input);
  if (parsed.success && shapeIssues.length === 0) {
    const issues = [...spelt.issues, ...inFileNaming(BOARD_RULES.flatMap((rule) => rule(parsed.data)), naming)];
    return issues.length ? { ok: false, issues } : { ok: true, board: parsed.data };
  }
  return { ok: false, issues: [...spelt.issues, ...inFileNaming([...shapeIssues, ...partialBoardIssues(boardParts(spelt.input))], naming)] };
}

/** Each part of a board that passes the schema on its own (for the rules that can still run). */
function boardParts(input: unknown): BoardParts {
  const raw = (input !== null && typeof input === 'object' ? input : {}) as Record<string, unknown>;
  const supply = supplySchema.safeParse(raw.supply);
  const feeder = raw.feeder === undefined ? undefined : feederSchema.safeParse(raw.feeder);
  const loads = Array.isArray(raw.loads) ? raw.loads.map((load) => loadSchema.safeParse(load)) : [];
  return {
    supply: supply.success ? supply.data : null,
    feeder: feeder === undefined ? undefined : feeder.success ? feeder.data : null,
    // A sparse list: loads that failed the schema leave holes, so the rules keep the file's indices.
    loads: loads.reduce<(LoadSpec | undefined)[]>((list, r, i) => {
      if (r.success) list[i] = r.data;
      return list;
    }, []),
  };
}

/**
 * Validates a board object and returns it typed.
 * @throws {InputError} listing every problem, each with its field path.
 */
export function parseBoard(input: unknown): BoardSpec {
  const result = validateBoard(input);
  if (!result.ok) throw new InputError(result.issues);
  return result.board;
}

/** `readBoardText` then `parseBoard`. @throws {InputError} */
export function parseBoardText(text: string): BoardSpec {
  return parseBoard(readBoardText(text));
}
