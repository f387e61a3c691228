/**
 * `trivar correct`'s study options: laid over the board file's `correction:` section, and the
 * problems they bring in told apart from the file's own. The file's section alone valid, the study
 * with the options not: the command line is wrong (exit 2), and the message names the options.
 */
import { validateCorrectionSpec, type Board, type InputIssue } from '@trivar/core';
import { UsageError } from '../exitCodes.js';

export interface CorrectStudyOptions {
  readonly arrangement?: string;
  readonly pf?: number;
  readonly definition?: string;
  readonly allowLeading?: boolean;
  readonly upperPf?: number;
  readonly lightLoad?: number;
  readonly outputs?: string;
  readonly practice?: string;
  readonly ct?: number;
  readonly measuredAt?: string;
}

interface StudyOption {
  readonly flag: string;
  /** Where the option goes in the study (the file's `correction:` section). */
  readonly path: readonly [string] | readonly [string, string];
  /** Its value in the study; undefined when not given. */
  readonly value: (o: CorrectStudyOptions) => unknown;
}

const STUDY_OPTIONS: readonly StudyOption[] = [
  { flag: '--arrangement', path: ['arrangement'], value: (o) => o.arrangement },
  { flag: '--pf', path: ['target', 'pf'], value: (o) => o.pf },
  { flag: '--definition', path: ['target', 'definition'], value: (o) => o.definition },
  { flag: '--allow-leading', path: ['target', 'leading'], value: (o) => (o.allowLeading ? 'allowed' : undefined) },
  { flag: '--upper-pf', path: ['target', 'maxLaggingPf'], value: (o) => o.upperPf },
  { flag: '--measured-at', path: ['target', 'measuredAt'], value: (o) => o.measuredAt },
  { flag: '--light-load', path: ['lightLoad', 'fraction'], value: (o) => o.lightLoad },
  { flag: '--practice', path: ['practice'], value: (o) => o.practice },
  { flag: '--outputs', path: ['controller', 'outputs'], value: (o) => (o.outputs === undefined ? undefined : Number(o.outputs)) },
  { flag: '--ct', path: ['controller', 'ctPrimaryA'], value: (o) => o.ct },
];

type Section = Record<string, unknown>;

function laidOver(fromFile: Section | undefined, given: readonly StudyOption[], o: CorrectStudyOptions): Section {
  const spec: Section = { ...(fromFile ?? {}) };
  for (const option of given) {
    const [head, leaf] = option.path;
    if (leaf === undefined) spec[head] = option.value(o);
    else spec[head] = { ...((spec[head] as Section | undefined) ?? {}), [leaf]: option.value(o) };
  }
  return spec;
}

const givenOptions = (o: CorrectStudyOptions) => STUDY_OPTIONS.filter((option) => option.value(o) !== undefined);

/** The board file's `correction` section with the command-line options laid over it. */
export function studySpec(fromFile: Section | undefined, o: CorrectStudyOptions): Section {
  return laidOver(fromFile, givenOptions(o), o);
}

const sameIssue = (a: InputIssue, b: InputIssue) => a.path === b.path && a.code === b.code;
const hasPath = (section: Section | undefined, path: string) => path.split('.').reduce<unknown>((at, key) => (at !== null && typeof at === 'object' ? (at as Section)[key] : undefined), section) !== undefined;

/**
 * Throws a usage error when the options bring a problem into a study the file alone states validly:
 * each problem named by the option that set its field (else by its field, in the file or by default),
 * with the other options it comes from.
 */
export function assertOptionsFit(fromFile: Section | undefined, o: CorrectStudyOptions, board: Board): void {
  const given = givenOptions(o);
  if (!given.length) return;
  const checked = validateCorrectionSpec(laidOver(fromFile, given, o), board);
  if (checked.ok || !validateCorrectionSpec(fromFile ?? {}, board).ok) return;
  const lines = checked.issues.map((issue) => {
    const own = given.find((option) => option.path.join('.') === issue.path);
    // The other options it comes from: without one of them the problem goes away.
    const from = given.filter((option) => {
      if (option === own) return false;
      const without = validateCorrectionSpec(laidOver(fromFile, given.filter((g) => g !== option), o), board);
      return without.ok || !without.issues.some((i) => sameIssue(i, issue));
    });
    const field = own ? own.flag : hasPath(fromFile, issue.path) ? `correction.${issue.path} in the board file` : `${issue.path} (its default)`;
    const words = issue.message.slice(issue.message.indexOf(': ') + 2);
    return `${field}${from.length ? `, with ${from.map((f) => f.flag).join(' and ')}` : ''}: ${words}`;
  });
  const asGiven = given.map((option) => (option.flag === '--allow-leading' ? option.flag : `${option.flag} ${String(option.value(o))}`)).join(' ');
  // One line: a usage error's message has its control characters escaped.
  throw new UsageError(`the command-line options do not fit together or with the board file, which alone is valid (options given: ${asGiven}): ${lines.join('; ')}`);
}

/**
 * Where the value of each study field an option sets came from, in words: the option where one was
 * given (it overrides the file), else the file's own field (`correction.controller.ctPrimaryA in the
 * file`); fields set by neither are left out (a default, or a study field no option sets).
 */
export function fieldSources(fromFile: Section | undefined, o: CorrectStudyOptions): ReadonlyMap<string, string> {
  const sources = new Map<string, string>();
  for (const option of STUDY_OPTIONS) {
    const path = option.path.join('.');
    if (option.value(o) !== undefined) sources.set(path, option.flag);
    else if (hasPath(fromFile, path)) sources.set(path, `correction.${path} in the file`);
  }
  return sources;
}

/**
 * A result whose warnings name a study field by its path in the study (`controller.ctPrimaryA`, the
 * warning's own `path`) restated to name where the value came from: the option that gave it, or the
 * file's field. For the text report: the JSON stays the library's result, whose `path` says the field.
 */
export function withFieldSources<T>(result: T, sources: ReadonlyMap<string, string>): T {
  if (!sources.size) return result;
  const restate = (value: unknown): unknown => {
    if (Array.isArray(value)) return value.map(restate);
    if (value === null || typeof value !== 'object') return value;
    const entries = Object.entries(value).map(([key, v]) => [key, restate(v)] as const);
    const restated = Object.fromEntries(entries) as Record<string, unknown>;
    const { message, path } = restated;
    const source = typeof path === 'string' ? sources.get(path) : undefined;
    if (typeof message === 'string' && typeof path === 'string' && source !== undefined && typeof restated.code === 'string') restated.message = message.split(path).join(source);
    return restated;
  };
  return restate(result) as T;
}
