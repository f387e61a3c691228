/**
 * Invented boards for the rebalancing tests and benchmark, and an independent
 * scorer: line currents from each circuit's complex power at balanced nominal
 * voltages, written here from the circuit data (METHODS §6/§13), not taken
 * from core, so a brute-force enumeration over it checks core's model too.
 */
import fc from 'fast-check';
import type { BoardSpec, ComplexValue, ConnectionSpec, LoadSpec } from '@trivar/core';
import { C0, c, cAbs, cAdd, cConj, cDiv, cPolarDeg, cScale, cSub, cSum } from '../../support/complexMath.js';
import { seededRandom } from '../../../packages/core/src/rebalance/seededRandom.js';

export type System = 'three-phase-4wire' | 'three-phase-3wire' | 'split-phase';

/** mulberry32, for boards the benchmark and the MILP test rebuild from a seed (the search's own generator). */
export const seeded = seededRandom;

export interface BoardRecipe {
  readonly system: System;
  readonly circuits: number;
  /** Share of two-pole (line-to-line) circuits on three-phase boards. */
  readonly twoPoleShare?: number;
  /** Add one fixed three-phase load. */
  readonly threePhaseLoad?: boolean;
}

const LN = ['A-N', 'B-N', 'C-N'] as const;
const LL = ['A-B', 'B-C', 'C-A'] as const;

/**
 * A random board of small circuits as found on distribution boards: 0.3–6 kW
 * with a few up to 18 kW, PF 0.7–1 lagging or (15 %) leading, about one in ten
 * an exporting PV circuit, a share of two-pole circuits.
 */
export function randomBoard(recipe: BoardRecipe, random: () => number): BoardSpec {
  const { system, circuits } = recipe;
  const loads: LoadSpec[] = [];
  for (let i = 0; i < circuits; i++) {
    const twoPole = system === 'three-phase-3wire' || (system === 'three-phase-4wire' && random() < (recipe.twoPoleShare ?? 0.15));
    const connection: ConnectionSpec =
      system === 'split-phase' ? (random() < 0.5 ? 'A-N' : 'B-N') : twoPole ? LL[Math.floor(random() * 3)]! : LN[Math.floor(random() * 3)]!;
    const size = (0.3 + random() * 5.7) * (random() < 0.15 ? 3 : 1) * (system === 'split-phase' ? 0.5 : 1);
    const exports = random() < 0.1;
    const pf = Math.round((0.7 + 0.3 * random()) * 1000) / 1000;
    loads.push({
      name: `Circuit ${i + 1}`,
      connection,
      kW: Math.round((exports ? -size : size) * 1000) / 1000,
      pf,
      sense: random() < 0.15 ? 'leading' : 'lagging',
    });
  }
  if (recipe.threePhaseLoad && system !== 'split-phase') loads.push({ name: 'Plant motor', connection: 'ABC-delta', kW: 8 + 10 * random(), pf: 0.8 });
  const voltage = system === 'split-phase' ? { lineToNeutral: 120 } : { lineToLine: 400 };
  return { name: `random ${system} board`, supply: { system, voltage, frequencyHz: 50 }, loads };
}

/** fast-check: a small random board (for enumeration). */
export function smallBoardArb(maxCircuits: number): fc.Arbitrary<BoardSpec> {
  return fc
    .record({
      system: fc.constantFrom<System>('three-phase-4wire', 'three-phase-4wire', 'three-phase-3wire', 'split-phase'),
      circuits: fc.integer({ min: 2, max: maxCircuits }),
      threePhaseLoad: fc.boolean(),
      seed: fc.integer(),
    })
    .map(({ seed, ...recipe }) => randomBoard(recipe, seeded(seed)));
}

// ---------------------------------------------------------------------------
// Independent scoring (test-side model)

/** Complex power of a kW + pf (+ sense) circuit, VA; generation keeps its sign. */
export function circuitPower(load: LoadSpec): ComplexValue {
  const p = (load.kW ?? 0) * 1000;
  const pf = load.pf ?? 1;
  const q = (load.sense === 'leading' ? -1 : 1) * Math.abs(p) * Math.tan(Math.acos(pf));
  return c(p, q);
}

export interface Figures {
  readonly lines: number[];
  readonly neutral: number;
  readonly negative: number;
}

/** Complex line currents (phase order) of a board with the given connections and per-load factors, A. */
export function lineCurrents(spec: BoardSpec, connections: readonly ConnectionSpec[], factors?: readonly number[]): ComplexValue[] {
  const split = spec.supply.system === 'split-phase';
  const vln = split ? (spec.supply.voltage.lineToNeutral ?? 120) : (spec.supply.voltage.lineToLine ?? 400) / Math.sqrt(3);
  const v: Record<string, ComplexValue> = split
    ? { A: cPolarDeg(vln, 0), B: cPolarDeg(vln, 180), N: C0 }
    : { A: cPolarDeg(vln, 0), B: cPolarDeg(vln, -120), C: cPolarDeg(vln, 120), N: C0 };
  const lines = split ? ['A', 'B'] : ['A', 'B', 'C'];
  const current: Record<string, ComplexValue> = { A: C0, B: C0, C: C0 };
  const branch = (from: string, to: string, s: ComplexValue) => {
    const i = cConj(cDiv(s, cSub(v[from]!, v[to]!)));
    current[from] = cAdd(current[from]!, i);
    if (to !== 'N') current[to] = cSub(current[to]!, i);
  };
  spec.loads.forEach((load, k) => {
    const s = cScale(circuitPower(load), factors?.[k] ?? 1);
    const conn = connections[k]!;
    if (conn === 'ABC-delta') for (const [a, b] of [['A', 'B'], ['B', 'C'], ['C', 'A']] as const) branch(a, b, cScale(s, 1 / 3));
    else {
      const [a, b] = conn.split('-') as [string, string];
      branch(a, b, s);
    }
  });
  return lines.map((x) => current[x]!);
}

/** Line, neutral and negative-sequence currents of a board with the given connections and per-load factors. */
export function boardFigures(spec: BoardSpec, connections: readonly ConnectionSpec[], factors?: readonly number[]): Figures {
  const split = spec.supply.system === 'split-phase';
  const I = lineCurrents(spec, connections, factors);
  const a = cPolarDeg(1, 120);
  const a2 = cPolarDeg(1, -120);
  const mul = (x: ComplexValue, y: ComplexValue) => c(x.re * y.re - x.im * y.im, x.re * y.im + x.im * y.re);
  const negative = split ? 0 : cAbs(cScale(cSum([I[0]!, mul(a2, I[1]!), mul(a, I[2]!)]), 1 / 3));
  return { lines: I.map(cAbs), neutral: cAbs(cSum(I)), negative };
}

/** Options of each circuit on its board (test-side rules: L-N among the phases, L-L among the pairs on three-phase). */
export function circuitOptions(spec: BoardSpec, index: number): ConnectionSpec[] {
  const conn = spec.loads[index]!.connection;
  const system = spec.supply.system;
  if (conn.endsWith('-N')) return system === 'split-phase' ? ['A-N', 'B-N'] : [...LN];
  if (system !== 'split-phase' && LL.includes(conn as never)) return [...LL];
  return [conn];
}

/** Every assignment of the circuits' options (calls `visit` with the connections). */
export function enumerateAssignments(spec: BoardSpec, fixed: ReadonlyMap<number, ConnectionSpec>, visit: (connections: ConnectionSpec[]) => void): void {
  const options = spec.loads.map((_, i) => (fixed.has(i) ? [fixed.get(i)!] : circuitOptions(spec, i)));
  const current = spec.loads.map((l) => l.connection);
  const walk = (i: number) => {
    if (i === options.length) return visit(current);
    for (const o of options[i]!) {
      current[i] = o;
      walk(i + 1);
    }
  };
  walk(0);
}

export const movesBetween = (spec: BoardSpec, connections: readonly ConnectionSpec[]): number =>
  spec.loads.filter((l, i) => l.connection !== connections[i]).length;
