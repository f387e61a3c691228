/**
 * `trivar rebalance`'s study options: laid over the board file's `rebalance:` section, options that
 * contradict each other (or the section) refused before any study runs, and the study's problems
 * that an option brought in told apart from the file's own. As for `trivar correct`
 * (correctStudyOptions.ts): the command line is wrong (exit 2), and the message names the options.
 */
import { InputError, type InputIssue } from '@trivar/core';
import { UsageError } from '../exitCodes.js';

export interface RebalanceStudyOptions {
  readonly aim?: Record<string, number>;
  readonly combine?: string;
  readonly moveLimit?: number;
  readonly nearBest?: number;
  readonly capacity?: number;
  readonly boards?: string[];
  readonly measureAt?: string;
  readonly scenarios?: boolean;
  readonly data?: string;
  readonly spread?: number;
  readonly timeZone?: string;
  /** Commander's negation of --no-table: false when --no-table is given. */
  readonly table?: boolean;
}

type Section = Record<string, unknown>;

const AIM_WORDS: Readonly<Record<string, string>> = {
  largestLine: 'largest-line',
  neutral: 'neutral',
  currentUnbalance: 'current-unbalance',
  voltageUnbalance: 'voltage-unbalance',
};

interface StudyOption {
  readonly flag: string;
  /** The field of the study it sets (the file's `rebalance:` section). */
  readonly field: string;
  /** Its value in the study; undefined when not given. */
  readonly value: (o: RebalanceStudyOptions) => unknown;
  /** The option as written, for messages. */
  readonly asGiven: (o: RebalanceStudyOptions) => string;
}

const STUDY_OPTIONS: readonly StudyOption[] = [
  { flag: '--aim', field: 'aim', value: (o) => o.aim, asGiven: (o) => `--aim ${Object.entries(o.aim ?? {}).map(([k, w]) => `${AIM_WORDS[k] ?? k}=${w}`).join(',')}` },
  { flag: '--combine', field: 'combine', value: (o) => o.combine, asGiven: (o) => `--combine ${o.combine}` },
  { flag: '--move-limit', field: 'moveLimit', value: (o) => o.moveLimit, asGiven: (o) => `--move-limit ${o.moveLimit}` },
  { flag: '--near-best', field: 'nearBestPercent', value: (o) => o.nearBest, asGiven: (o) => `--near-best ${o.nearBest}` },
  { flag: '--capacity', field: 'lineCapacityA', value: (o) => o.capacity, asGiven: (o) => `--capacity ${o.capacity}` },
  { flag: '--boards', field: 'boards', value: (o) => o.boards, asGiven: (o) => `--boards ${(o.boards ?? []).join(',')}` },
  { flag: '--measure-at', field: 'measureAt', value: (o) => o.measureAt, asGiven: (o) => `--measure-at ${o.measureAt}` },
  { flag: '--scenarios', field: 'conditions', value: (o) => (o.scenarios ? 'scenarios' : undefined), asGiven: () => '--scenarios' },
];

const givenOptions = (o: RebalanceStudyOptions) => STUDY_OPTIONS.filter((option) => option.value(o) !== undefined);

/** The board file's `rebalance` section with the command-line options laid over it. */
export function rebalanceStudySpec(fromFile: Section | undefined, o: RebalanceStudyOptions): Section {
  const spec: Section = { ...(fromFile ?? {}) };
  for (const option of givenOptions(o)) spec[option.field] = option.value(o);
  return spec;
}

/**
 * Throws a usage error for options that contradict each other or the file's section: both named.
 * Checked before the file's data is read or any study runs.
 */
export function assertRebalanceOptionsFit(fromFile: Section | undefined, o: RebalanceStudyOptions): void {
  const problems: string[] = [];
  if (o.scenarios && o.data !== undefined)
    problems.push("--scenarios and --data both set the load conditions (the profile section's scenarios, or intervals picked from the data): give one");
  for (const [value, flag, what] of [
    [o.spread, '--spread', 'picks typical intervals from the interval data'],
    [o.timeZone, '--time-zone', 'reads the times of the interval data'],
  ] as const) {
    if (value === undefined || o.data !== undefined) continue;
    problems.push(o.scenarios ? `${flag} with --scenarios: ${flag} ${what}, and --scenarios uses the profile section's scenarios instead; leave out ${flag}` : `${flag} ${what}: give --data <csv> too, or leave out ${flag}`);
  }
  if (o.table === false) {
    // The fewest-moves choice is read off the table of best score by moves, which the report then shows.
    const nearBest = o.nearBest !== undefined ? '--near-best' : fromFile?.nearBestPercent !== undefined ? 'rebalance.nearBestPercent in the board file' : null;
    if (nearBest)
      problems.push(`--no-table with ${nearBest}: the fewest moves within a share of the best are found from the table of best score by moves allowed, which is then printed; leave out ${nearBest === '--near-best' ? 'one of them' : '--no-table'}`);
  }
  if (problems.length) throw new UsageError(`the command-line options contradict each other or the board file: ${problems.join('; ')}`);
}

/** The option that set the field an issue is at (`aim.neutral` → --aim), or undefined. */
const optionAt = (given: readonly StudyOption[], issue: InputIssue) => given.find((option) => issue.path === option.field || issue.path.startsWith(`${option.field}.`) || issue.path.startsWith(`${option.field}[`));

/**
 * A study error whose every problem is at a field an option set: the command line is wrong (exit 2),
 * each problem named by its option (and the file's pins, for a move limit they force past). Null when
 * any problem is the file's own: the error stays the file's (exit 3), as `trivar correct` keeps it.
 */
export function optionsError(error: InputError, fromFile: Section | undefined, o: RebalanceStudyOptions): UsageError | null {
  const given = givenOptions(o);
  if (!given.length) return null;
  const owned = error.issues.map((issue) => ({ issue, option: optionAt(given, issue) }));
  if (owned.some((x) => x.option === undefined)) return null;
  const lines = owned.map(({ issue, option }) => {
    // A limit below the moves the file's pins force (the one study problem that comes from two fields).
    const withPins = option!.field === 'moveLimit' && Array.isArray(fromFile?.pinned) && issue.expected.includes('pinned') ? ', with rebalance.pinned in the board file' : '';
    return `${option!.flag}${withPins}: ${issue.message.slice(issue.message.indexOf(': ') + 2)}`;
  });
  const asGiven = given.map((option) => option.asGiven(o)).join(' ');
  // One line: a usage error's message has its control characters escaped.
  return new UsageError(`the command-line options do not fit the board or its rebalance section (options given: ${asGiven}): ${lines.join('; ')}`);
}
