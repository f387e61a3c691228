/**
 * Issues found after the file's phase names were turned into A/B/C point back at the
 * file as written: a file in L1/L2/L3 gets `supply.emf.L2`, not `supply.emf.B`.
 * Paths are rewritten here (their schema keys only: a name the user gave stays as written), and so are
 * a schema word list's phase terms (`one of "L1-N", …`) with the phase term it received;
 * the rules word their own sentences in the naming they are handed (`issueNamingOf`).
 */
import type { InputIssue } from '../../errors.js';
import { NUMBERED_SPELLING, type PhaseNaming } from './phaseNames.js';

/**
 * A phase key of a path (`supply.emf.B`, `lineCapacityA.C`). Not one that is the user's own
 * name — a key of a name-keyed map (`conditions[0].circuits.B`, `profile.scenarios[1].loads.C`,
 * `profile.groups.A`, `lightLoad.perLoad.A`) — nor a load's current field (`loads[2].A`).
 */
const PHASE_KEY = /(?<=^|\.)(?<!(?:^|\.)(?:circuits|loads|groups|perLoad)\.)(?<!(?:^|\.)loads\[\d+\]\.)(A|B|C|A-B|B-C|C-A)(?=$|\.|\[)/g;
/** A quoted word of a schema's list ("A-N"): the lists are the schema's own words, never user text. */
const QUOTED_TERM = /"([^"]*)"/g;

const whereOf = (path: string): string => (path === '' ? 'board' : path);
const numbered = (term: string): string => NUMBERED_SPELLING[term] ?? term;

/** The naming a file's issues are worded in: the one its phase terms use (A/B/C when it names none). */
export const issueNamingOf = (used: PhaseNaming | null): PhaseNaming => used ?? 'A/B/C';

/** A schema's word-list issue ("one of "A-N", "B-N" …", a wrong value or a missing one) or an unknown key's list of the keys taken: its phase words and the phase term received, in L1/L2/L3. */
function listInFileNaming(issue: InputIssue): { expected: string; received: string | undefined } {
  const wordList = (issue.code === 'invalid_value' || issue.code === 'missing') && issue.expected.startsWith('one of "');
  const keyList = issue.code === 'unknown_key' && issue.expected.startsWith('one of the keys taken here ("');
  if (!wordList && !keyList) return { expected: issue.expected, received: issue.received };
  const expected = issue.expected.replace(QUOTED_TERM, (all, term: string) => (term in NUMBERED_SPELLING ? `"${numbered(term)}"` : all));
  const quoted = issue.received?.match(/^"(.*)"$/)?.[1];
  const received = quoted !== undefined && quoted in NUMBERED_SPELLING ? `"${numbered(quoted)}"` : issue.received;
  return { expected, received };
}

export function inFileNaming(issues: readonly InputIssue[], naming: PhaseNaming | null): InputIssue[] {
  if (naming !== 'L1/L2/L3') return [...issues];
  return issues.map((issue) => {
    const path = issue.path.replace(PHASE_KEY, numbered);
    const { expected, received } = listInFileNaming(issue);
    if (path === issue.path && expected === issue.expected && received === issue.received) return issue;
    const head = `${whereOf(issue.path)}: expected ${issue.expected}`;
    let message = issue.message;
    if (message.startsWith(head)) {
      const tail = message.slice(head.length);
      message = `${whereOf(path)}: expected ${expected}${received !== issue.received && tail === ` (received ${issue.received})` ? ` (received ${received})` : tail}`;
    } else if (message.startsWith(issue.path)) message = `${path}${message.slice(issue.path.length)}`;
    return received === undefined ? { ...issue, path, expected, message } : { ...issue, path, expected, received, message };
  });
}
