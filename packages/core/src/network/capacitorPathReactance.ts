/**
 * The supply path's reactance as a set of shunt capacitors' own current meets it: what the resonance
 * estimate h = √(S_sc,X/Q_C) and the rise estimate ΔV/V ≈ Q_C/S_sc,X are worked from.
 *
 * Which conductors that current takes depends on how the capacitors are connected:
 * - single-phase 2-wire: out on the line, back on the neutral, always (the loop of shortCircuitPathImpedance);
 * - split-phase: a line-to-line (240 V) capacitor's current goes out on one line and back on the other,
 *   the neutral carries none of it; a line-to-neutral one returns on the neutral, except for the part
 *   that an equal capacitor on the other line cancels there;
 * - three-phase 4-wire: a star bank with its star point on the neutral puts only the sum of its three
 *   currents, the zero-sequence part an unequal bank has, on the neutral; a balanced bank, a delta bank
 *   and a floating star put none there.
 * Weighing it: with the capacitors' fundamental currents I_k in each conductor (at the nominal voltages),
 * the path absorbs Q_L = Σ X_k·|I_k|² while the capacitors give Q_C, so S_sc,X = Q_C²/Q_L. For a single
 * loop or a balanced bank this is n·V²/X_path exactly; for a mixed set it is the single-node estimate
 * (the Rayleigh quotient of the fundamental pattern) and lies between the network's resonances, which the
 * frequency scan finds one by one.
 */
import { abs, absSquared, add, mul, scale, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, LoadBranch, Terminal } from '../board/boardModel.js';
import { neutralPathImpedance, reactanceShortCircuitVA, supplyPathImpedance } from './installationModel.js';

export interface CapacitorPathReactance {
  /** S_sc,X as the capacitors' current sees the path, Q_C²/Q_L, VA. */
  readonly shortCircuitVA: number;
  /** True where part of the capacitors' current returns on the neutral (always on a single-phase board). */
  readonly throughNeutral: boolean;
}

/** The capacitive part of each branch as a susceptance at its nominal voltage, S (inductive and resistive parts left out). */
const susceptanceOf = (b: LoadBranch): number => (b.sNominal.im < 0 && b.vNominal > 0 ? -b.sNominal.im / b.vNominal ** 2 : 0);

/**
 * The path as `branches` (the capacitors switched in) see it; falls back to the board's own figure
 * (reactanceShortCircuitVA) where the branches draw no capacitive current, and null where the path has
 * no reactance.
 */
export function capacitorPathReactance(board: Board, branches: readonly LoadBranch[]): CapacitorPathReactance | null {
  const boardFigure = reactanceShortCircuitVA(board);
  if (boardFigure === null) return null;
  // A branch sized to nothing carries round-off (1e-13 of the rest): not a capacitor whose path counts.
  const largest = Math.max(0, ...branches.map((b) => -b.sNominal.im));
  const capacitive = branches.filter((b) => susceptanceOf(b) > 0 && -b.sNominal.im > 1e-9 * largest);
  const fallback = { shortCircuitVA: boardFigure, throughNeutral: board.system === 'single-phase' };
  if (capacitive.length === 0) return fallback;

  // Nominal voltages to the source star point, each at its EMF's angle; the neutral bar at zero.
  const phaseV = new Map<Terminal, ComplexValue>(board.phases.map((p, k) => [p, scale(board.emf[k]!, board.nominalLineToNeutralV / (abs(board.emf[k]!) || 1))]));
  phaseV.set('N', ZERO);
  // A private star point floats where its branches put it (Millman).
  const stars = new Map<Terminal, { weighted: ComplexValue; total: number }>();
  for (const b of capacitive) {
    for (const [star, other] of [[b.from, b.to], [b.to, b.from]] as const) {
      if (!star.startsWith('star:') || !phaseV.has(other)) continue;
      const s = stars.get(star) ?? { weighted: ZERO, total: 0 };
      stars.set(star, { weighted: add(s.weighted, scale(phaseV.get(other)!, susceptanceOf(b))), total: s.total + susceptanceOf(b) });
    }
  }
  for (const [star, s] of stars) phaseV.set(star, s.total > 0 ? scale(s.weighted, 1 / s.total) : ZERO);

  const lineCurrent = new Map<Terminal, ComplexValue>(board.phases.map((p) => [p, ZERO]));
  let neutralCurrent = ZERO;
  let capacitorVA = 0;
  for (const b of capacitive) {
    const v = sub(phaseV.get(b.from) ?? ZERO, phaseV.get(b.to) ?? ZERO);
    const i = mul({ re: 0, im: susceptanceOf(b) }, v);
    capacitorVA += susceptanceOf(b) * absSquared(v);
    // Current leaves the source on the `from` line and comes back on the `to` one (the neutral for N).
    if (lineCurrent.has(b.from)) lineCurrent.set(b.from, add(lineCurrent.get(b.from)!, i));
    if (lineCurrent.has(b.to)) lineCurrent.set(b.to, sub(lineCurrent.get(b.to)!, i));
    if (b.to === 'N') neutralCurrent = add(neutralCurrent, i);
    if (b.from === 'N') neutralCurrent = sub(neutralCurrent, i);
  }
  // Each line at the path's mean reactance (supplyPathImpedance), the neutral at its own.
  const lineX = supplyPathImpedance(board).im;
  const neutralX = neutralPathImpedance(board)?.im ?? 0;
  const lineSquares = [...lineCurrent.values()].reduce((s, i) => s + absSquared(i), 0);
  const pathVA = lineX * lineSquares + neutralX * absSquared(neutralCurrent);
  if (!(pathVA > 0) || !(capacitorVA > 0)) return fallback;
  // A neutral share below round-off of the line currents (a balanced bank) is none.
  const throughNeutral = absSquared(neutralCurrent) > 1e-18 * lineSquares && neutralX !== 0;
  return { shortCircuitVA: capacitorVA ** 2 / pathVA, throughNeutral };
}
