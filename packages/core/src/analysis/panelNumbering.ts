/**
 * North-American panelboard numbering against the phase a load is written on. Common practice, no
 * source: circuits are numbered odd down the left column and even down the right, so circuits
 * 2k − 1 and 2k sit on row k; the bus phases rotate by row, A, B, C, A … on a three-phase panel and
 * A, B, A … on a split-phase one; a breaker of p poles at circuit n takes the rows of n, n + 2, …
 * A load whose circuit number puts it on other phases than its connection names is worth a second
 * look (a schedule copied wrong, or a phase written wrong), but panels are built other ways too:
 * a warning, never an error, and only on boards whose conventions are North-American.
 */
import type { LoadReading } from './boardResult.js';

const ROTATION = ['A', 'B', 'C'] as const;

/** A breaker position's phase under the usual numbering: its row's place in the rotation. */
const positionPhase = (position: number, phaseCount: 2 | 3) => ROTATION[(Math.ceil(position / 2) - 1) % phaseCount]!;

/** The phases the usual numbering gives a breaker of `poles` poles at circuit `circuit` on a panel of `phaseCount` phases. */
export function panelPhasesOf(circuit: number, poles: number, phaseCount: 2 | 3): string[] {
  return Array.from({ length: poles }, (_, k) => positionPhase(circuit + 2 * k, phaseCount));
}

/** A circuit number as people write one on a schedule: a whole number from 1 ("7", " 12 "); anything else is not judged. */
export const circuitNumberOf = (circuit: string | null): number | null => (circuit !== null && /^\s*[1-9]\d{0,3}\s*$/.test(circuit) ? Number(circuit) : null);

/** The phases a connection puts a load on (A-N → A, C-A → C and A); null for a three-phase load, which takes every phase. */
export function writtenPhases(connection: string): string[] | null {
  if (connection === 'ABC-star' || connection === 'ABC-delta') return null;
  return connection.split('-').filter((t) => t !== 'N');
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((p) => b.includes(p));

/** A range of positions as schedules write a multi-pole breaker: "11-13", "2–6" (a hyphen or an en dash). */
const POSITION_RANGE = /^\s*([1-9]\d{0,3})\s*[-\u2013]\s*([1-9]\d{0,3})\s*$/;

/**
 * The breaker positions a circuit names: one number ("7", the first position of a breaker of any
 * poles), every position of a multi-pole breaker ("1,3", "2/4/6", "1 3 5", "1+3"), or a range from
 * the first to the last ("11-13": 11 and 13, stacked in a column; "11-12" gives its two ends, which
 * the rules then find are not stacked); null for anything else, which is not judged.
 */
export function circuitPositionsOf(circuit: string | null): number[] | null {
  if (circuit === null || circuit.length > 80) return null;
  const range = POSITION_RANGE.exec(circuit);
  if (range) {
    const [first, last] = [Number(range[1]), Number(range[2])];
    if (last <= first) return null;
    return (last - first) % 2 === 0 ? Array.from({ length: (last - first) / 2 + 1 }, (_, k) => first + 2 * k) : [first, last];
  }
  if (!/^\s*[1-9]\d{0,3}(?:\s*[,/+&]\s*[1-9]\d{0,3}|\s+[1-9]\d{0,3})*\s*$/.test(circuit)) return null;
  return circuit.trim().split(/[\s,/+&]+/).map(Number);
}

/**
 * Loads whose circuit names position 0 ("0", "0,2", "0-2"): positions are numbered from 1, so the
 * number is a slip (or a spare written as 0) and no rule can place it.
 */
export function circuitsAtPositionZero(loads: readonly LoadReading[]): { readonly name: string; readonly circuit: string }[] {
  return loads.flatMap((load) =>
    load.origin === 'board' && load.circuit !== null && /^\s*\d{1,4}(?:\s*[,/+&\-\u2013]\s*\d{1,4}|\s+\d{1,4})*\s*$/.test(load.circuit) && load.circuit.trim().split(/[\s,/+&\-\u2013]+/).some((n) => Number(n) === 0)
      ? [{ name: load.name, circuit: load.circuit.trim() }]
      : [],
  );
}

/**
 * A load whose circuit number and connection disagree under the usual numbering:
 * `phases`: the positions sit on other phases than the connection names;
 * `pole-count`: the circuit lists more than one position, but not one per pole of the breaker;
 * `not-stacked`: the positions listed are not one above the other in one column (n, n + 2, …),
 * which is where a multi-pole breaker's poles sit.
 */
export interface CircuitNumberMismatch {
  readonly kind: 'phases' | 'pole-count' | 'not-stacked';
  readonly name: string;
  /** The first position. */
  readonly circuit: number;
  /** Every position the circuit names: the one written, or the first and those a multi-pole breaker takes below it (n + 2, …). */
  readonly positions: readonly number[];
  /** The connection as written (A/B/C). */
  readonly connection: string;
  /** The poles the breaker has: the file's, else one per line conductor the connection uses. */
  readonly poles: number;
  /** The phases the numbering gives the positions, in row order. */
  readonly implied: readonly string[];
  /** The other circuits a multi-pole breaker at `circuit` takes (n + 2, …), where the file gives one number. */
  readonly with: readonly number[];
}

/**
 * Every load whose circuit number and connection disagree under the usual numbering (worded in
 * boardWarnings.ts). `phaseCount` is the board's: 3 or 2; a single-phase board has no rotation.
 * At most one finding per load: the positions' count first, then their place, then their phases.
 */
export function circuitNumberMismatches(loads: readonly LoadReading[], phaseCount: number): CircuitNumberMismatch[] {
  if (phaseCount !== 2 && phaseCount !== 3) return [];
  return loads.flatMap((load): CircuitNumberMismatch[] => {
    const written = circuitPositionsOf(load.circuit);
    if (written === null) return [];
    const lines = writtenPhases(load.connection);
    const poles = load.poles ?? lines?.length ?? phaseCount;
    const circuit = written[0]!;
    const listed = written.length > 1;
    const positions = listed ? written : Array.from({ length: poles }, (_, k) => circuit + 2 * k);
    const implied = positions.map((n) => positionPhase(n, phaseCount));
    const finding = { name: load.name, circuit, positions, connection: load.connection, poles, implied, with: listed ? [] : positions.slice(1) };
    if (listed && written.length !== poles) return [{ kind: 'pole-count', ...finding }];
    if (listed && written.some((n, k) => n !== circuit + 2 * k)) return [{ kind: 'not-stacked', ...finding }];
    // A three-phase load fits any three stacked positions: they take A, B and C in some order.
    const fits = lines === null ? new Set(implied).size === implied.length : sameSet(lines, implied);
    return fits ? [] : [{ kind: 'phases', ...finding }];
  });
}

/** Loads of one board that give the same circuit number ("7" and " 7 " alike, "1,3" and "1 / 3"; other text as written, trimmed). */
export interface SharedCircuitNumber {
  readonly circuit: string;
  readonly names: readonly string[];
}

/**
 * Circuit numbers two or more of the board's own loads give: one breaker position holds one circuit,
 * so a schedule copied twice or a slip is likely; a warning, as a panel may be described loosely.
 */
export function sharedCircuitNumbers(loads: readonly LoadReading[]): SharedCircuitNumber[] {
  const byNumber = new Map<string, { circuit: string; names: string[] }>();
  for (const load of loads) {
    if (load.origin !== 'board' || load.circuit === null) continue;
    const positions = circuitPositionsOf(load.circuit);
    const key = positions !== null ? positions.join(',') : load.circuit.trim();
    const entry = byNumber.get(key) ?? { circuit: key, names: [] };
    entry.names.push(load.name);
    byNumber.set(key, entry);
  }
  return [...byNumber.values()].filter((e) => e.names.length > 1);
}

/** Two of a board's loads whose breakers take a position in common, under the usual numbering. */
export interface OverlappingCircuitPositions {
  readonly names: readonly [string, string];
  /** Each load's positions: those it lists, or its first and those its breaker's other poles take (n + 2, …). */
  readonly positions: readonly [readonly number[], readonly number[]];
  readonly common: readonly number[];
}

/**
 * Loads whose breakers would share a position: a 3-pole breaker at 2 takes 2, 4 and 6, so a 1-pole
 * circuit numbered 4 cannot sit there too. Loads that give the same circuit text are left to
 * sharedCircuitNumbers (one finding per slip); a circuit not written as numbers is not judged.
 */
export function overlappingCircuitPositions(loads: readonly LoadReading[], phaseCount: number): OverlappingCircuitPositions[] {
  if (phaseCount !== 2 && phaseCount !== 3) return [];
  const taken = loads.flatMap((load) => {
    if (load.origin !== 'board') return [];
    const written = circuitPositionsOf(load.circuit);
    if (written === null) return [];
    const poles = load.poles ?? writtenPhases(load.connection)?.length ?? phaseCount;
    const positions = written.length > 1 ? written : Array.from({ length: poles }, (_, k) => written[0]! + 2 * k);
    return [{ name: load.name, key: written.join(','), positions }];
  });
  // Each position's loads, one per circuit text (the same text twice is sharedCircuitNumbers' finding), so only
  // loads that meet at a position are compared and a 1,000-circuit board stays linear.
  const atPosition = new Map<number, number[]>();
  taken.forEach((t, i) => {
    for (const n of t.positions) {
      const owners = atPosition.get(n);
      if (owners === undefined) atPosition.set(n, [i]);
      else if (!owners.some((o) => taken[o]!.key === t.key)) owners.push(i);
    }
  });
  const pairs = new Map<number, { i: number; j: number; common: number[] }>();
  for (const [n, owners] of atPosition) {
    if (owners.length < 2) continue;
    for (let x = 0; x < owners.length; x++)
      for (let y = x + 1; y < owners.length; y++) {
        const i = owners[x]!;
        const j = owners[y]!;
        const key = i * taken.length + j;
        const pair = pairs.get(key) ?? { i, j, common: [] };
        pair.common.push(n);
        pairs.set(key, pair);
      }
  }
  return [...pairs.values()]
    .sort((p, q) => p.i - q.i || p.j - q.j)
    .map(({ i, j, common }) => ({ names: [taken[i]!.name, taken[j]!.name], positions: [taken[i]!.positions, taken[j]!.positions], common: common.sort((x, y) => x - y) }));
}
