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

/** The phases the usual numbering gives a breaker of `poles` poles at circuit `circuit` on a panel of `phaseCount` phases. */
export function panelPhasesOf(circuit: number, poles: number, phaseCount: 2 | 3): string[] {
  const row = Math.ceil(circuit / 2) - 1;
  return Array.from({ length: poles }, (_, k) => ROTATION[(row + k) % phaseCount]!);
}

/** A circuit number as people write one on a schedule: a whole number from 1 ("7", " 12 "); anything else is not judged. */
export const circuitNumberOf = (circuit: string | null): number | null => (circuit !== null && /^\s*[1-9]\d{0,3}\s*$/.test(circuit) ? Number(circuit) : null);

/** The phases a connection puts a load on (A-N → A, C-A → C and A); null for a three-phase load, which the numbering cannot contradict. */
export function writtenPhases(connection: string): string[] | null {
  if (connection === 'ABC-star' || connection === 'ABC-delta') return null;
  return connection.split('-').filter((t) => t !== 'N');
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((p) => b.includes(p));

/** A load whose circuit number puts it on other phases than its connection names. */
export interface CircuitNumberMismatch {
  readonly name: string;
  readonly circuit: number;
  /** The connection as written (A/B/C). */
  readonly connection: string;
  /** The phases the numbering gives the circuit, in row order. */
  readonly implied: readonly string[];
  /** The other circuits a multi-pole breaker at `circuit` takes (n + 2, …). */
  readonly with: readonly number[];
}

/**
 * Every load whose circuit number and connection disagree under the usual numbering (worded in
 * boardWarnings.ts). `phaseCount` is the board's: 3 or 2; a single-phase board has no rotation.
 */
export function circuitNumberMismatches(loads: readonly LoadReading[], phaseCount: number): CircuitNumberMismatch[] {
  if (phaseCount !== 2 && phaseCount !== 3) return [];
  return loads.flatMap((load) => {
    const circuit = circuitNumberOf(load.circuit);
    const written = writtenPhases(load.connection);
    if (circuit === null || written === null) return [];
    const implied = panelPhasesOf(circuit, written.length, phaseCount);
    if (sameSet(written, implied)) return [];
    return [{ name: load.name, circuit, connection: load.connection, implied, with: implied.slice(1).map((_, k) => circuit + 2 * (k + 1)) }];
  });
}

/** Loads of one board that give the same circuit number ("7" and " 7 " alike; other text as written, trimmed). */
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
    const number = circuitNumberOf(load.circuit);
    const key = number !== null ? String(number) : load.circuit.trim();
    const entry = byNumber.get(key) ?? { circuit: key, names: [] };
    entry.names.push(load.name);
    byNumber.set(key, entry);
  }
  return [...byNumber.values()].filter((e) => e.names.length > 1);
}
