/**
 * What normaliseBoard and normaliseInstallation rely on, checked before they read it.
 *
 * Why a check of what they read rather than the schema: the schema is zod, which `trivar solve`
 * deliberately never loads (start-up budget, see DEVELOPERS.md), and a spec that came out of
 * parseBoard has already been judged; running the schema again would double the cost of every
 * study on a large board. Ranges and cross-field rules stay the schema's job. What is checked here
 * is what would otherwise turn into NaN or a TypeError without a word: the kind of every field the
 * normalisation reads (a word from its list, a finite number, an object, a list). O(loads), no
 * allocation on a good spec.
 */
import { describeValue, InputError, inputIssue, type InputIssue } from '../errors.js';
import { CONNECTIONS, LOAD_MODELS, PF_SENSES, PHASE_SEQUENCES, STAR_POINTS, SYSTEMS } from './boardRanges.js';

const BOARD_HEADING = 'normaliseBoard: the spec argument is not a validated board spec (check it with parseBoard first)';
const INSTALLATION_HEADING = 'normaliseInstallation: the spec argument is not a validated installation spec (check it with parseInstallation first)';

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const at = (path: string, key: string | number) => (typeof key === 'number' ? `${path}[${key}]` : path === '' ? key : `${path}.${key}`);

/** Numeric fields anywhere under supply and feeder (impedances, transformer, emf, conductors). */
const NUMBER_KEYS = new Set([
  'lineToLine', 'lineToNeutral', 'frequencyHz', 'r', 'x', 'kVA', 'impedancePercent', 'xOverR', 'V', 'angleDeg',
  'lengthM', 'lengthFt', 'rOhmPerKm', 'xOhmPerKm', 'mm2', 'kcmil', 'temperatureC', 'parallel', 'ratingA',
]);
const LOAD_NUMBERS = ['kW', 'kvar', 'kVA', 'A', 'breakerA'] as const;

class Issues {
  readonly list: InputIssue[] = [];
  add(path: string, expected: string, value: unknown): void {
    this.list.push(inputIssue(value === undefined ? 'missing' : 'invalid_type', path, expected, value));
  }
  object(value: unknown, path: string, what = 'an object'): value is Record<string, unknown> {
    if (isObject(value)) return true;
    this.add(path, what, value);
    return false;
  }
  word(value: unknown, path: string, words: readonly string[], optional = true): void {
    if (value === undefined && optional) return;
    if (typeof value !== 'string' || !words.includes(value)) this.add(path, `one of ${words.map((w) => JSON.stringify(w)).join(', ')}`, value);
  }
  number(value: unknown, path: string): void {
    if (value !== undefined && (typeof value !== 'number' || !Number.isFinite(value))) this.add(path, 'a finite number', value);
  }
  /** Every numeric field found under `value`, at any depth (words and flags are the schema's job). */
  numbersUnder(value: unknown, path: string, depth = 0): void {
    if (!isObject(value) || depth > 4) return;
    for (const [key, v] of Object.entries(value)) {
      if (NUMBER_KEYS.has(key)) this.number(v, at(path, key));
      else if (isObject(v)) this.numbersUnder(v, at(path, key), depth + 1);
    }
  }
}

function checkSupply(supply: unknown, path: string, issues: Issues): void {
  if (!issues.object(supply, path)) return;
  issues.word(supply.system, at(path, 'system'), SYSTEMS, false);
  issues.word(supply.sequence, at(path, 'sequence'), PHASE_SEQUENCES);
  if (issues.object(supply.voltage, at(path, 'voltage'), 'an object with lineToLine or lineToNeutral, V')) {
    const { lineToLine, lineToNeutral, written } = supply.voltage;
    if (lineToLine === undefined && lineToNeutral === undefined && typeof written !== 'string') issues.add(at(path, 'voltage'), 'lineToLine or lineToNeutral, V', undefined);
  }
  if (supply.frequencyHz === undefined) issues.add(at(path, 'frequencyHz'), 'a finite number', undefined);
  issues.numbersUnder(supply, path);
}

function checkLoads(loads: unknown, path: string, issues: Issues): void {
  if (!Array.isArray(loads)) {
    issues.add(path, 'a list of loads', loads);
    return;
  }
  loads.forEach((load: unknown, i) => {
    const where = at(path, i);
    if (!issues.object(load, where)) return;
    if (typeof load.name !== 'string') issues.add(at(where, 'name'), 'a text', load.name);
    issues.word(load.connection, at(where, 'connection'), CONNECTIONS, false);
    issues.word(load.model, at(where, 'model'), LOAD_MODELS);
    issues.word(load.sense, at(where, 'sense'), PF_SENSES);
    issues.word(load.starPoint, at(where, 'starPoint'), STAR_POINTS);
    for (const key of LOAD_NUMBERS) issues.number(load[key], at(where, key));
    if (load.pf !== undefined && !(typeof load.pf === 'number' && load.pf > 0 && load.pf <= 1)) issues.add(at(where, 'pf'), 'a number > 0 and <= 1', load.pf);
    for (const part of ['ohms', 'zip'] as const) {
      const value = load[part];
      if (value === undefined || !issues.object(value, at(where, part))) continue;
      for (const key of part === 'ohms' ? ['r', 'x'] : ['z', 'i', 'p']) {
        if (value[key] === undefined) issues.add(at(at(where, part), key), 'a finite number', undefined);
        else issues.number(value[key], at(at(where, part), key));
      }
    }
  });
}

function fail(issues: Issues, heading: string): void {
  // Issue paths are inside the spec; the heading names the function and its argument.
  if (issues.list.length) throw new InputError(issues.list, heading);
}

/** @throws {InputError} when `spec` lacks, or has the wrong kind of, a field normaliseBoard reads */
export function assertNormalisableBoard(spec: unknown): void {
  const issues = new Issues();
  if (!isObject(spec)) {
    throw new InputError([{ ...inputIssue('invalid_type', '', 'a board spec from parseBoard(...)', spec), message: `spec: expected a board spec from parseBoard(...) (received ${describeValue(spec)})` }], BOARD_HEADING);
  }
  if (spec.name !== undefined && typeof spec.name !== 'string') issues.add('name', 'a text', spec.name);
  checkSupply(spec.supply, 'supply', issues);
  if (spec.feeder !== undefined && issues.object(spec.feeder, 'feeder')) issues.numbersUnder(spec.feeder, 'feeder');
  checkLoads(spec.loads, 'loads', issues);
  fail(issues, BOARD_HEADING);
}

/** @throws {InputError} when `spec` lacks, or has the wrong kind of, a field normaliseInstallation reads */
export function assertNormalisableInstallation(spec: unknown): void {
  const issues = new Issues();
  if (!isObject(spec)) {
    throw new InputError([{ ...inputIssue('invalid_type', '', 'an installation spec from parseInstallation(...)', spec), message: `spec: expected an installation spec from parseInstallation(...) (received ${describeValue(spec)})` }], INSTALLATION_HEADING);
  }
  checkSupply(spec.supply, 'supply', issues);
  const boards = spec.boards;
  if (!Array.isArray(boards) || boards.length === 0) {
    issues.add('boards', 'a list of boards', boards);
    return fail(issues, INSTALLATION_HEADING);
  }
  const names = new Set(boards.map((b: unknown) => (isObject(b) ? b.name : undefined)));
  let mains = 0;
  boards.forEach((board: unknown, i) => {
    const where = at('boards', i);
    if (!issues.object(board, where)) return;
    if (typeof board.name !== 'string') issues.add(at(where, 'name'), 'a text', board.name);
    if (board.fedFrom === undefined) mains++;
    else if (typeof board.fedFrom !== 'string' || !names.has(board.fedFrom)) issues.add(at(where, 'fedFrom'), 'the name of another board', board.fedFrom);
    if (board.feeder !== undefined && issues.object(board.feeder, at(where, 'feeder'))) issues.numbersUnder(board.feeder, at(where, 'feeder'));
    checkLoads(board.loads, at(where, 'loads'), issues);
  });
  if (mains !== 1) issues.add('boards', 'exactly one board without fedFrom (the main board)', `${mains} boards without fedFrom`);
  fail(issues, INSTALLATION_HEADING);
}
