/**
 * Issues found after the file's phase names were turned into A/B/C point back at the
 * file as written: a file in L1/L2/L3 gets `supply.emf.L2`, not `supply.emf.B`.
 * Only path segments change (they are schema keys and indices, never user text).
 */
import type { InputIssue } from '../../errors.js';
import { NUMBERED_SPELLING, type PhaseNaming } from './phaseNames.js';

const PHASE_KEY = /(?<=^|\.)(A|B|C|A-B|B-C|C-A)(?=$|\.|\[)/g;

export function inFileNaming(issues: readonly InputIssue[], naming: PhaseNaming | null): InputIssue[] {
  if (naming !== 'L1/L2/L3') return [...issues];
  return issues.map((issue) => {
    const path = issue.path.replace(PHASE_KEY, (k) => NUMBERED_SPELLING[k] ?? k);
    if (path === issue.path) return issue;
    return { ...issue, path, message: issue.message.startsWith(issue.path) ? `${path}${issue.message.slice(issue.path.length)}` : issue.message };
  });
}
