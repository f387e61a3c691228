/** Hand figures checked for shape (zod) and against the board (its phases and neutral). */
import type { Board } from '../board/boardModel.js';
import { InputError, inputIssue, type InputIssue } from '../errors.js';
import { inputIssuesFromZod } from '../_internal/zodIssues.js';
import { handFiguresSchema, type HandFiguresSpec } from './handFiguresSpec.js';

function boardRules(spec: HandFiguresSpec, board: Board): InputIssue[] {
  const issues: InputIssue[] = [];
  spec.capacitors.forEach((c, k) => {
    const [from, to] = c.branch.split('-') as [string, string];
    const onBoard = (p: string) => p === 'N' || board.phases.includes(p as never);
    if (!onBoard(from) || !onBoard(to))
      issues.push(inputIssue('not-on-board', `capacitors[${k}].branch`, `a branch between this board's phases (${board.phases.join(', ')})${board.hasNeutral ? ' or to N' : ''}`, c.branch));
    else if (to === 'N' && !board.hasNeutral)
      issues.push(inputIssue('no-neutral', `capacitors[${k}].branch`, 'a line pair: this board has no neutral', c.branch));
  });
  for (const p of Object.keys(spec.expected?.lines ?? {}))
    if (!board.phases.includes(p as never)) issues.push(inputIssue('not-on-board', `expected.lines.${p}`, `a line of this board (${board.phases.join(', ')})`, p));
  if (spec.expected?.neutralA !== undefined && !board.hasNeutral) issues.push(inputIssue('no-neutral', 'expected.neutralA', 'no neutral figure: this board has no neutral', spec.expected.neutralA));
  return issues;
}

/**
 * Validates hand figures for a board.
 * @throws {InputError} listing every problem with its field path (`capacitors[1].kvar`)
 */
export function parseHandFigures(input: unknown, board: Board): HandFiguresSpec {
  const parsed = handFiguresSchema.safeParse(input);
  const issues = parsed.success ? boardRules(parsed.data, board) : inputIssuesFromZod(parsed.error.issues, input);
  if (issues.length || !parsed.success) throw new InputError(issues, 'the hand figures are not valid');
  return parsed.data;
}
