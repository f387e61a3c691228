/** Hand figures checked for shape (zod) and against the board (its phases and neutral). */
import type { Board } from '../board/boardModel.js';
import { InputError, inputIssue, namingArgument, type InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { handFiguresSchema, type HandFiguresSpec } from './handFiguresSpec.js';
import { Speller } from '../board/conventions/readTradeSpellings.js';
import { inFileNaming } from '../board/conventions/issueNaming.js';
import { labellerOf, type PhaseNaming } from '../board/conventions/phaseNames.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { ONE_SHOT_PARSE } from '../_internal/oneShotParse.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { bankRatingIssue, boardNominalPair } from '../board/bankRatingCheck.js';

type Obj = Record<string, unknown>;
const isObj = (x: unknown): x is Obj => typeof x === 'object' && x !== null && !Array.isArray(x);

/** The figures with their phase terms (capacitor branches, expected line keys) in A/B/C: a file may name phases L1/L2/L3, one naming throughout. */
function readFigureSpellings(input: unknown): { input: unknown; naming: PhaseNaming | null; issues: InputIssue[] } {
  if (!isObj(input)) return { input, naming: null, issues: [] };
  const s = new Speller();
  const root: Obj = { ...input };
  if (Array.isArray(root.capacitors))
    root.capacitors = root.capacitors.map((c: unknown, i) => {
      if (!isObj(c)) return c;
      const copy = { ...c };
      s.value(copy, 'branch', `capacitors[${i}]`);
      return copy;
    });
  if (isObj(root.expected)) {
    const expected = { ...root.expected };
    s.keys(expected, 'lines', 'expected');
    root.expected = expected;
  }
  return { input: root, naming: s.first?.naming ?? null, issues: s.issues };
}

function boardRules(spec: HandFiguresSpec, board: Board): InputIssue[] {
  const issues: InputIssue[] = [];
  // The board's phases as its file names them (L1 or A).
  const label = labellerOf(conventionsOf(board).phaseNames);
  const phases = board.phases.map(label).join(', ');
  spec.capacitors.forEach((c, k) => {
    const [from, to] = c.branch.split('-') as [string, string];
    const onBoard = (p: string) => p === 'N' || board.phases.includes(p as never);
    if (!onBoard(from) || !onBoard(to))
      issues.push(inputIssue('not-on-board', `capacitors[${k}].branch`, `a branch between this board's phases (${phases})${board.hasNeutral ? ' or to N' : ''}`, label(c.branch)));
    else if (to === 'N' && !board.hasNeutral)
      issues.push(inputIssue('no-neutral', `capacitors[${k}].branch`, 'a line pair: this board has no neutral', label(c.branch)));
    else if (c.ratedV !== undefined) {
      // The kvar's voltage near the branch's: 28 for 280 made a capacitor 100 times too large (bankRatingCheck.ts).
      const rating = bankRatingIssue({ connection: to === 'N' ? 'star' : 'delta', ratedV: c.ratedV }, boardNominalPair(board), `capacitors[${k}].ratedV`);
      if (rating) issues.push(rating);
    }
  });
  for (const p of Object.keys(spec.expected?.lines ?? {}))
    if (!board.phases.includes(p as never)) issues.push(inputIssue('not-on-board', `expected.lines.${p}`, `a line of this board (${phases})`, label(p)));
  if (spec.expected?.neutralA !== undefined && !board.hasNeutral) issues.push(inputIssue('no-neutral', 'expected.neutralA', 'no neutral figure: this board has no neutral', spec.expected.neutralA));
  return issues;
}

/**
 * Validates hand figures for a board.
 * @throws {InputError} listing every problem with its field path (`capacitors[1].kvar`)
 */
export function parseHandFigures(input: unknown, board: Board): HandFiguresSpec {
  assertBoardModel(board);
  const spelt = readFigureSpellings(input);
  const parsed = handFiguresSchema.safeParse(spelt.input, ONE_SHOT_PARSE);
  const issues = namingArgument([...spelt.issues, ...(parsed.success ? boardRules(parsed.data, board) : inputIssuesFromZod(parsed.error.issues, spelt.input, [], { schema: handFiguresSchema, input: spelt.input }))], 'figures');
  // Paths point at the figures as written (expected.lines.L2, not .B).
  if (issues.length || !parsed.success) throw new InputError(inFileNaming(issues, spelt.naming), 'the hand figures are not valid');
  return parsed.data;
}
