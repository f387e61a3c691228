/**
 * How a board file is validated, whichever study fields it carries: schema
 * first (zod), then the cross-field rules. The whole file's schema and rules
 * are composed in boardFile/ and handed in here.
 */
import type * as z from 'zod';
import { inputIssue, type InputIssue } from '../errors.js';
import { allInputIssues } from '../_internal/zodIssues.js';
import { eitherFormIssues } from './eitherFormIssues.js';
import { feederSchema, supplySchema, type BoardBaseSpec, type LoadBaseSpec } from './boardSchema.js';
import { partialBoardIssues, type BoardRule } from './boardRules.js';
import { readTradeSpellings } from './conventions/readTradeSpellings.js';
import { inFileNaming, issueNamingOf } from './conventions/issueNaming.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';
import { withConductorSizeHints } from './conductorSizeSpelling.js';

/** What a board file is checked against: its schema, one load's schema and the rules, in order. */
export interface BoardFileChecks<T extends BoardBaseSpec> {
  readonly schema: z.ZodType<T>;
  /** One load as the file writes it: loads that pass it on their own still get the load rules when the file fails elsewhere. */
  readonly load: z.ZodType<LoadBaseSpec>;
  readonly rules: readonly BoardRule<T>[];
}

export type BoardValidationOf<T> = { ok: true; board: T } | { ok: false; issues: InputIssue[] };

/**
 * Checks an already-parsed board object (from JSON, YAML or code) against `checks`.
 * @returns `{ ok: true, board }` or `{ ok: false, issues }` with every problem found.
 */
export function validateBoardWith<T extends BoardBaseSpec>(checks: BoardFileChecks<T>, input: unknown): BoardValidationOf<T> {
  // An installation file handed to a one-board function: say so, not "unknown key boards".
  if (input !== null && typeof input === 'object' && 'boards' in input && !('loads' in input))
    return {
      ok: false,
      issues: [inputIssue('installation', 'boards', 'a single board (supply, feeder, loads); this is an installation file (boards:), which `trivar solve` and solveInstallation read', 'an installation')],
    };
  // L1/L2/L3 and notation's system first, so the schema and rules read one spelling; their
  // issues then point back at the file as written.
  const spelt = readTradeSpellings(input);
  const naming = spelt.spellings.naming;
  const wording = issueNamingOf(naming);
  const parsed = checks.schema.safeParse(spelt.input, ONE_SHOT_PARSE);
  const shapeIssues = withoutUnwrittenSystem(withConductorSizeHints(allInputIssues(parsed.success ? [] : eitherFormIssues(parsed.error.issues, spelt.input), spelt.input, checks.schema), spelt.input), input);
  if (parsed.success && shapeIssues.length === 0) {
    const issues = [...spelt.issues, ...inFileNaming(checks.rules.flatMap((rule) => rule(parsed.data, wording)), naming)];
    return issues.length ? { ok: false, issues } : { ok: true, board: parsed.data };
  }
  return { ok: false, issues: [...spelt.issues, ...inFileNaming([...shapeIssues, ...partialBoardIssues(boardParts(spelt.input, checks.load), wording)], naming)] };
}

/**
 * The issues without one at supply.system where the file left the system out and wrote the voltage as a
 * notation that cannot be read ("480Y277"): the system would have come from that notation, so the
 * notation's own issue is the one to fix, and a second at a field the file never wrote only misleads.
 */
export function withoutUnwrittenSystem(issues: InputIssue[], input: unknown): InputIssue[] {
  const supply = input !== null && typeof input === 'object' ? (input as Record<string, unknown>).supply : undefined;
  if (supply === null || typeof supply !== 'object' || 'system' in supply || typeof (supply as Record<string, unknown>).voltage !== 'string') return issues;
  if (!issues.some((i) => i.path === 'supply.voltage')) return issues;
  return issues.filter((i) => i.path !== 'supply.system');
}

/** Each part of a board that passes the schema on its own (for the rules that can still run). */
function boardParts(input: unknown, loadSchema: z.ZodType<LoadBaseSpec>) {
  const raw = (input !== null && typeof input === 'object' ? input : {}) as Record<string, unknown>;
  const supply = supplySchema.safeParse(raw.supply, ONE_SHOT_PARSE);
  const feeder = raw.feeder === undefined ? undefined : feederSchema.safeParse(raw.feeder, ONE_SHOT_PARSE);
  const loads = Array.isArray(raw.loads) ? raw.loads.map((load) => loadSchema.safeParse(load, ONE_SHOT_PARSE)) : [];
  return {
    supply: supply.success ? supply.data : null,
    feeder: feeder === undefined ? undefined : feeder.success ? feeder.data : null,
    // A sparse list: loads that failed the schema leave holes, so the rules keep the file's indices.
    loads: loads.reduce<(LoadBaseSpec | undefined)[]>((list, r, i) => {
      if (r.success) list[i] = r.data;
      return list;
    }, []),
  };
}
