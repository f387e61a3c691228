/**
 * Round-off is not data. The linear solve leaves currents of about 1e-15 of the
 * board's largest current in conductors that carry nothing (a line with no load
 * on it); read as data they gave "PF 0.200 lag" on an idle line. A conductor's
 * current is its admittance times a voltage difference, so its round-off also
 * scales with how stiff it is: about 1e-16 × nominal voltage × |Y|. Every current
 * below the larger of the two floors is taken as exactly zero before anything is
 * read from the solution.
 */
import { abs, add, ZERO, type ComplexValue } from '../complex.js';
import type { NetworkSolution } from '../network/solveNetwork.js';
import { NEGLIGIBLE_OHMS } from '../network/installationCircuit.js';

/** Fraction of the board's largest current below which a current is zero: far above LU round-off (~1e-15), far below anything measurable. */
export const NOISE_FLOOR_RELATIVE = 1e-9;

/** Resolution of a conductor's current as a fraction of nominal voltage × its admittance (1000 × double round-off). */
export const CONDUCTOR_RESOLUTION = 1e-13;

/** 1/|Z| of the stiffest series conductor (source + line, neutral); 0 when every one is ideal or merged as a direct connection (no round-off through it). */
function stiffestAdmittance(board: NetworkSolution['board']): number {
  const paths = [add(board.sourceImpedance, board.lineImpedance), board.neutralImpedance];
  return Math.max(0, ...paths.map((z) => (abs(z) >= NEGLIGIBLE_OHMS ? 1 / abs(z) : 0)));
}

/** The current below which a solution's currents are round-off, A. */
export function currentNoiseFloor(solution: NetworkSolution): number {
  // Index loops: read after every trial solve of a sizing, mostly before the code is optimised,
  // where a for…of allocates an iterator result per step.
  let largest = 0;
  const lines = solution.lineCurrents;
  for (let k = 0; k < lines.length; k++) largest = Math.max(largest, abs(lines[k]!));
  if (solution.neutralCurrent) largest = Math.max(largest, abs(solution.neutralCurrent));
  const branches = solution.branches;
  for (let l = 0; l < branches.length; l++) {
    const states = branches[l]!;
    for (let b = 0; b < states.length; b++) largest = Math.max(largest, abs(states[b]!.current));
  }
  return noiseFloorFor(solution.board)(largest);
}

/** A board's noise floor as a function of its largest current (line, neutral or load branch), A: for readers that solve one board many times. */
export function noiseFloorFor(board: NetworkSolution['board']): (largestCurrent: number) => number {
  const conductorFloor = CONDUCTOR_RESOLUTION * board.nominalLineToNeutralV * stiffestAdmittance(board);
  return (largestCurrent) => Math.max(NOISE_FLOOR_RELATIVE * largestCurrent, conductorFloor);
}

/**
 * A sequence component is a sum of three phasors, so on a board where it is zero by
 * KCL (zero-sequence current without a neutral) or by symmetry it comes out as the
 * round-off of that sum: below the current noise floor for currents, below this
 * fraction of the positive-sequence voltage for voltages (double round-off is ~1e-16;
 * no meter resolves 1e-12 — common practice, no source).
 */
export const SEQUENCE_VOLTAGE_RESOLUTION = 1e-12;

/** A sequence set with every component under `floor` set to exactly zero. */
export function sequencesAbove<T extends { zero: ComplexValue; positive: ComplexValue; negative: ComplexValue }>(set: T, floor: number): T {
  const clean = (x: ComplexValue): ComplexValue => (abs(x) < floor ? ZERO : x);
  return { ...set, zero: clean(set.zero), positive: clean(set.positive), negative: clean(set.negative) };
}

/** The solution with every current under the noise floor (`floor`, found from the solution when not given) set to zero. */
export function withNoiseFloor(solution: NetworkSolution, floor: number = currentNoiseFloor(solution)): NetworkSolution {
  const clean = (i: ComplexValue): ComplexValue => (abs(i) < floor ? ZERO : i);
  return {
    ...solution,
    lineCurrents: solution.lineCurrents.map(clean),
    neutralCurrent: solution.neutralCurrent === null ? null : clean(solution.neutralCurrent),
    branches: solution.branches.map((states) => states.map((s) => ({ ...s, current: clean(s.current) }))),
  };
}
