/**
 * The step before a file's schema: terms written the trade's other ways are turned into
 * trivar's one spelling, so the schema, the rules and the solver see only A/B/C and numbers.
 *   - phase names L1/L2/L3 (loads' connections, line pairs, per-phase source and feeder
 *     data, the phase sequence, pinned connections of `rebalance`, per-line `correction`
 *     targets): one naming per file, else an error naming the field that breaks it;
 *   - a supply voltage written as notation ("208Y/120", "400/230", "120/240") gives the
 *     system when the file leaves it out (the schema reads the notation itself).
 * The naming used is written into `conventions.phaseNames` when the file does not set it, so
 * reports label phases the way the file does. Works on a copy; never changes its input.
 */
import { inputIssue, type InputIssue } from '../../errors.js';
import { readPhaseTerm, type PhaseNaming } from './phaseNames.js';
import { readVoltageNotation, systemOfNotationRatio, type VoltageNotation } from './voltageNotation.js';

export interface TradeSpellings {
  /** The naming the file's phase terms use; null when it names no phase. */
  readonly naming: PhaseNaming | null;
  /** The supply voltage as notation, when written so. */
  readonly notation: VoltageNotation | null;
}

export interface SpellingReading {
  /** The input with every term in trivar's spelling (a copy where anything changed). */
  readonly input: unknown;
  readonly spellings: TradeSpellings;
  readonly issues: InputIssue[];
}

type Obj = Record<string, unknown>;
const isObj = (x: unknown): x is Obj => typeof x === 'object' && x !== null && !Array.isArray(x);

/**
 * Turns one file's phase terms into A/B/C, keeping to the naming the file starts with; used for board
 * and installation files here and for a study's own input files (hand figures).
 */
export class Speller {
  first: { naming: PhaseNaming; path: string } | null = null;
  readonly issues: InputIssue[] = [];

  /** A term's A/B/C spelling; records the naming and reports a file that mixes two. */
  term(term: string, path: string): string {
    const read = readPhaseTerm(term);
    if (!read) return term;
    if (!this.first) this.first = { naming: read.naming, path };
    else if (this.first.naming !== read.naming)
      this.issues.push(
        inputIssue(
          'mixed_phase_names',
          path,
          `phase names in one naming throughout the file: this file names phases ${this.first.naming} (first at ${this.first.path}), so write this one that way too`,
          term,
        ),
      );
    return read.canonical;
  }

  value(obj: Obj, key: string, path: string): void {
    const v = obj[key];
    if (typeof v === 'string') obj[key] = this.term(v, `${path}.${key}`);
  }

  keys(obj: Obj, key: string, path: string): void {
    const inner = obj[key];
    if (!isObj(inner)) return;
    const out: Obj = {};
    for (const [k, v] of Object.entries(inner)) {
      const name = this.term(k, `${path}.${key}.${k}`);
      if (name !== k && k in inner && name in inner)
        this.issues.push(inputIssue('duplicate_phase', `${path}.${key}.${k}`, `each phase once: ${k} and ${name} are the same phase`, k));
      // Defined, not assigned: a `__proto__` key assigned would become the copy's prototype and its
      // entries this object's keys, reported at the wrong path.
      Object.defineProperty(out, name, { value: v, enumerable: true, writable: true, configurable: true });
    }
    obj[key] = out;
  }
}

/** A shallow copy of `parent[key]` put back in its place, so edits below never reach the caller's object. */
function own(parent: Obj, key: string): Obj | null {
  const inner = parent[key];
  if (!isObj(inner)) return null;
  const copy = { ...inner };
  parent[key] = copy;
  return copy;
}

function spellSupply(s: Speller, supply: Obj, notationOut: { value: VoltageNotation | null }): void {
  s.value(supply, 'sequence', 'supply');
  for (const key of ['emf', 'bank', 'openDelta']) s.keys(supply, key, 'supply');
  if (isObj(supply.impedance) && !('r' in supply.impedance) && !('x' in supply.impedance)) s.keys(supply, 'impedance', 'supply');
  // Notation is read by the schema; here it only fills in a system the file leaves out.
  const v = supply.voltage;
  if (typeof v !== 'string' || supply.system !== undefined) return;
  const read = readVoltageNotation(v);
  if (read.ok) {
    supply.system = read.notation.system;
    notationOut.value = read.notation;
  } else {
    // The notation is wrong (out of range, say) but its ratio still names the system: the schema then
    // reports the notation alone, not also a missing system.
    const system = systemOfNotationRatio(v);
    if (system) supply.system = system;
  }
}

function spellFeeder(s: Speller, parent: Obj, path: string): void {
  const feeder = own(parent, 'feeder');
  if (feeder && isObj(feeder.line) && !['r', 'x', 'lengthM', 'lengthFt', 'rOhmPerKm', 'mm2', 'awg', 'kcmil'].some((k) => k in (feeder.line as Obj)))
    s.keys(feeder, 'line', path);
}

function spellLoads(s: Speller, parent: Obj, path: string): void {
  const loads = parent.loads;
  if (!Array.isArray(loads)) return;
  parent.loads = loads.map((load, i) => {
    if (!isObj(load) || typeof load.connection !== 'string' || !readPhaseTerm(load.connection)) return load;
    const copy = { ...load };
    s.value(copy, 'connection', `${path}[${i}]`);
    return copy;
  });
}

function spellStudies(s: Speller, root: Obj): void {
  const rebalance = own(root, 'rebalance');
  if (rebalance) {
    if (Array.isArray(rebalance.pinned))
      rebalance.pinned = rebalance.pinned.map((p, i) => {
        if (!isObj(p)) return p;
        const copy = { ...p };
        s.value(copy, 'on', `rebalance.pinned[${i}]`);
        return copy;
      });
    s.keys(rebalance, 'lineCapacityA', 'rebalance');
  }
  const correction = own(root, 'correction');
  const target = correction && own(correction, 'target');
  if (target) s.keys(target, 'perPhase', 'correction.target');
}

/** Reads a board or installation file's trade spellings (see the module comment). */
export function readTradeSpellings(input: unknown): SpellingReading {
  if (!isObj(input)) return { input, spellings: { naming: null, notation: null }, issues: [] };
  const root: Obj = { ...input };
  const s = new Speller();
  const notation = { value: null as VoltageNotation | null };
  const supply = own(root, 'supply');
  if (supply) spellSupply(s, supply, notation);
  spellFeeder(s, root, 'feeder');
  spellLoads(s, root, 'loads');
  if (Array.isArray(root.boards))
    root.boards = root.boards.map((board, i) => {
      if (!isObj(board)) return board;
      const b = { ...board };
      spellFeeder(s, b, `boards[${i}].feeder`);
      spellLoads(s, b, `boards[${i}].loads`);
      return b;
    });
  spellStudies(s, root);
  // A set phaseNames only chooses the report's labels (a validated spec, already in A/B/C, keeps
  // the naming its file used there and must validate again as it is).
  const declared = isObj(root.conventions) ? root.conventions.phaseNames : undefined;
  if (s.first && declared === undefined && (root.conventions === undefined || isObj(root.conventions)))
    root.conventions = { ...(root.conventions as Obj | undefined), phaseNames: s.first.naming };
  return { input: root, spellings: { naming: s.first?.naming ?? null, notation: notation.value }, issues: s.issues };
}
