/**
 * Invented installations for the rebalancing tests: a main board and a few
 * sub-boards in a random radial tree, each with random circuits (the board
 * generator's), and a test-side scorer that composes each board's incomer
 * current as the sum of the line currents of the boards under it (KCL at each
 * board, stiff supply) — written here from the circuit data, not from core.
 */
import fc from 'fast-check';
import type { BoardSpec, ComplexValue, ConnectionSpec, InstallationSpec } from '@trivar/core';
import { cAbs, cAdd, cPolarDeg, cScale, cSum, c, C0 } from '../../support/complexMath.js';
import { circuitOptions, lineCurrents, randomBoard, seeded } from './rebalanceBoards.js';

export interface InstallationRecipe {
  readonly system: 'three-phase-4wire' | 'three-phase-3wire';
  /** Circuits on each board, main board first. */
  readonly circuits: readonly number[];
  /** Feeding board of each sub-board (index into the boards, smaller than its own). */
  readonly parents: readonly number[];
  /** Give the supply and feeders impedance (otherwise a stiff installation the fast model matches exactly). */
  readonly impedance: boolean;
  readonly seed: number;
}

export function randomInstallation(recipe: InstallationRecipe): InstallationSpec {
  const random = seeded(recipe.seed);
  const boards = recipe.circuits.map((count, b) => {
    const name = b === 0 ? 'Main board' : `Board ${b}`;
    const spec = randomBoard({ system: recipe.system, circuits: count }, random);
    return {
      name,
      ...(b > 0 ? { fedFrom: recipe.parents[b - 1]! === 0 ? 'Main board' : `Board ${recipe.parents[b - 1]!}` } : {}),
      ...(recipe.impedance
        ? { feeder: { lengthM: b === 0 ? 30 : 15, line: { mm2: b === 0 ? 95 : 35 }, ...(recipe.system === 'three-phase-4wire' ? { neutral: { mm2: b === 0 ? 95 : 35 } } : {}) } }
        : {}),
      // Short names repeat on every board ("Circuit 1" on each), as real charts do.
      loads: spec.loads,
    };
  });
  return {
    name: 'random installation',
    supply: {
      system: recipe.system,
      voltage: { lineToLine: 400 },
      frequencyHz: 50,
      ...(recipe.impedance ? { transformer: { kVA: 250, impedancePercent: 4.5, xOverR: 4 } } : {}),
    },
    boards,
  } as InstallationSpec;
}

/** fast-check: a small installation of 2–3 boards with `total` circuits at most. */
export function smallInstallationArb(total: number, impedance = false): fc.Arbitrary<InstallationSpec> {
  return fc
    .record({
      system: fc.constantFrom<'three-phase-4wire' | 'three-phase-3wire'>('three-phase-4wire', 'three-phase-4wire', 'three-phase-3wire'),
      boards: fc.integer({ min: 2, max: 3 }),
      seed: fc.integer(),
      impedance: fc.constant(impedance),
    })
    .chain(({ boards, ...rest }) =>
      fc.record({
        circuits: fc.array(fc.integer({ min: 1, max: Math.max(1, Math.floor(total / boards)) }), { minLength: boards, maxLength: boards }),
        parents: fc.tuple(...Array.from({ length: boards - 1 }, (_, k) => fc.integer({ min: 0, max: k }))),
      }).map((shape) => ({ ...rest, ...shape })),
    )
    .map((recipe) => randomInstallation(recipe));
}

/** Each board as a board spec on the installation's supply (for the test-side line currents). */
export const boardSpecs = (spec: InstallationSpec): BoardSpec[] =>
  spec.boards.map((b) => ({ supply: { ...spec.supply, transformer: undefined } as BoardSpec['supply'], loads: b.loads }) as BoardSpec);

/** Board indices (in the file) under board `b`, itself included. */
export function boardsUnder(spec: InstallationSpec, b: number): number[] {
  const out = [b];
  for (let k = 0; k < out.length; k++)
    spec.boards.forEach((x, i) => {
      if (x.fedFrom === spec.boards[out[k]!]!.name) out.push(i);
    });
  return out;
}

export interface IncomerFigures {
  readonly lines: number[];
  readonly neutral: number;
  readonly negative: number;
}

/** Incomer figures of board `b` with the given connections per board. */
export function incomerFigures(spec: InstallationSpec, connections: readonly (readonly ConnectionSpec[])[], b: number): IncomerFigures {
  const specs = boardSpecs(spec);
  let I: ComplexValue[] = [C0, C0, C0];
  for (const x of boardsUnder(spec, b)) I = lineCurrents(specs[x]!, connections[x]!).map((i, k) => cAdd(I[k]!, i));
  const a = cPolarDeg(1, 120);
  const a2 = cPolarDeg(1, -120);
  const mul = (x: ComplexValue, y: ComplexValue) => c(x.re * y.re - x.im * y.im, x.re * y.im + x.im * y.re);
  return { lines: I.map(cAbs), neutral: cAbs(cSum(I)), negative: cAbs(cScale(cSum([I[0]!, mul(a2, I[1]!), mul(a, I[2]!)]), 1 / 3)) };
}

/** Every assignment of every board's circuits (boards not in `movable` stay as wired). */
export function enumerateInstallation(spec: InstallationSpec, movable: ReadonlySet<number>, visit: (connections: ConnectionSpec[][]) => void): void {
  const specs = boardSpecs(spec);
  const slots: [number, number][] = [];
  spec.boards.forEach((b, i) => b.loads.forEach((_, l) => movable.has(i) && slots.push([i, l])));
  const current = spec.boards.map((b) => b.loads.map((l) => l.connection));
  const walk = (s: number) => {
    if (s === slots.length) return visit(current);
    const [b, l] = slots[s]!;
    for (const o of circuitOptions(specs[b]!, l)) {
      current[b]![l] = o;
      walk(s + 1);
    }
  };
  walk(0);
}
