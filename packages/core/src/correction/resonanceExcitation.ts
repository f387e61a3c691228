/**
 * Which harmonic orders can drive a bank's supply resonance hard enough to headline it.
 *
 * Every watched order (CORRECTION_DEFAULTS.resonanceWatchedOrders) is judged in the warnings and the step-state
 * table; the verdict's "but" is kept for an order that (1) carries significant current in the typical spectra
 * and (2) can flow into the capacitance that resonates. Triplen orders (3rd, 9th, 15th) of line-to-neutral
 * loads on a three-phase board are in phase in the three lines when the loads are alike: zero sequence, which
 * returns by the neutral and finds no path into a delta bank or a star bank with a floating star point, whose
 * modes are positive/negative sequence only (Dugan et al., Electrical Power Systems Quality, on triplen
 * harmonics in delta windings; from memory). So the triplens count where the capacitance has a branch to the
 * neutral, where the board is split-phase or single-phase (the triplens of two 120 V loads on opposite lines
 * flow line to line, in series through a line-to-line capacitor, like their fundamentals), or where a
 * single-phase load across two lines (a welder, a rectifier fed line to line) puts its triplens into two lines
 * as a line-to-line current (a constant-impedance load there is taken as a heating element). Unbalanced line-to-neutral rectifiers also give some positive- and negative-sequence
 * triplen current; that residue is why the orders stay in the warnings.
 */
import type { Board } from '../board/boardModel.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';

/** A capacitor branch by its two ends. */
export interface ResonatingBranch {
  readonly from: string;
  readonly to: string;
}

const isLine = (t: string) => t === 'A' || t === 'B' || t === 'C';

/** Why the triplen orders can or cannot drive the capacitance's modes: the reason is said in the JSON and tests. */
export type TriplenPath = 'neutral-branch' | 'not-three-phase' | 'line-to-line-loads' | 'none';

/** The first reason (in that order) triplen currents reach the capacitance, or 'none'. */
export function triplenPath(board: Board, capacitance: readonly ResonatingBranch[]): TriplenPath {
  if (capacitance.some((b) => b.to === 'N' || b.from === 'N')) return 'neutral-branch';
  if (board.phases.length < 3) return 'not-three-phase';
  // A constant-impedance load across two lines is taken as a heating element, not a rectifier (common practice, no source).
  const singleAcrossLines = board.loads.some(
    (l) => l.origin === 'board' && l.model !== 'constant-impedance' && l.branches.length === 1 && isLine(l.branches[0]!.from) && isLine(l.branches[0]!.to),
  );
  return singleAcrossLines ? 'line-to-line-loads' : 'none';
}

/** The watched orders that headline a resonance near them for this capacitance (ascending). */
export function headlineResonanceOrders(board: Board, capacitance: readonly ResonatingBranch[]): number[] {
  const significant = CORRECTION_DEFAULTS.resonanceHeadlineOrders;
  const triplens = triplenPath(board, capacitance) !== 'none';
  return significant.filter((h) => triplens || h % 3 !== 0);
}
