/**
 * The specialised batch path for boards whose loads all sit between a phase
 * and the neutral bar, with a neutral conductor and a fixed source.
 *
 * Each phase is an EMF, the line impedance Z and the phase's load admittance
 * in series, all returning through the neutral bar, so Millman's theorem
 * gives the neutral-bar voltage in closed form:
 *   Y'_k = Y_k / (1 + Z·Y_k),  V_N = Σ Y'_k·E_k / (Σ Y'_k + Y_n),  I_k = Y'_k·(E_k − V_N).
 * Voltage-dependent loads iterate that formula the way solveNetwork iterates
 * its nodal solve (same start, same admittance update, same stopping rule), so
 * the two agree to round-off on every interval.
 */
import type { Board } from '../board/boardModel.js';
import { NumericalError } from '../errors.js';
import { labelIn } from '../board/conventions/phaseNames.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import type { BatchNetwork } from './batchNetwork.js';
import {
  edgeAdmittance,
  isLinearInterval,
  iterationSettled,
  newIntervalState,
  resolveKernelOptions,
  type BatchKernel,
  modulus,
  type KernelOptions,
} from './batchKernel.js';

/** Why a board cannot take the closed-form path, or null when it can. */
export function closedFormBlocker(net: BatchNetwork): string | null {
  const board: Board = net.board;
  if (!board.hasNeutral) return 'the board has no neutral conductor';
  if (board.neutralOpen) return 'the neutral conductor is open';
  for (const e of net.edges)
    if (e.to !== 'N' || e.from === 'N' || e.from.startsWith('star:')) return `a load branch runs ${e.from}-${e.to}, not phase to neutral`;
  return null;
}

export function createClosedFormKernel(net: BatchNetwork, options?: KernelOptions): BatchKernel {
  const blocker = closedFormBlocker(net);
  if (blocker) throw new RangeError(`createClosedFormKernel: ${blocker}`);
  const opts = resolveKernelOptions(options);
  const { board } = net;
  const np = board.phases.length;
  const state = newIntervalState(np);
  const emfRe = Float64Array.from(board.emf, (e) => e.re);
  const emfIm = Float64Array.from(board.emf, (e) => e.im);
  const zr = board.sourceImpedance.re + board.lineImpedance.re;
  const zi = board.sourceImpedance.im + board.lineImpedance.im;
  const seriesZ = zr !== 0 || zi !== 0;
  const zn = board.neutralImpedance;
  const solidNeutral = zn.re === 0 && zn.im === 0;
  const znm = zn.re * zn.re + zn.im * zn.im;
  const ynRe = solidNeutral ? 0 : zn.re / znm;
  const ynIm = solidNeutral ? 0 : -zn.im / znm;
  // Edge of each phase (-1: no load on that phase), and its nominal voltage.
  const edgeOfPhase = board.phases.map((p) => net.edges.findIndex((e) => e.from === p));
  const v0 = board.nominalLineToNeutralV;
  const yp = new Float64Array(2 * np); // Y'_k
  const y = new Float64Array(2);
  const vBase = board.nominalLineToNeutralV;

  /** One closed-form network solve with the given load voltages; returns the largest voltage change / vBase. */
  function solveWith(powers: Float64Array, loadV: Float64Array | null, interval: number): number {
    let sumYr = ynRe;
    let sumYi = ynIm;
    let numRe = 0;
    let numIm = 0;
    for (let k = 0; k < np; k++) {
      const e = edgeOfPhase[k]!;
      let gr = 0;
      let gi = 0;
      if (e >= 0) {
        edgeAdmittance(powers, e, v0, loadV ? loadV[k]! : v0, opts.lowVoltageThreshold, y);
        gr = y[0]!;
        gi = y[1]!;
        if (seriesZ) {
          // Y / (1 + Z·Y)
          const dr = 1 + zr * gr - zi * gi;
          const di = zr * gi + zi * gr;
          const dm = dr * dr + di * di;
          if (dm === 0) throw new NumericalError('singular', `interval ${interval + 1}: phase ${labelIn(conventionsOf(board).phaseNames, board.phases[k]!)} is in series resonance with the line impedance`);
          const tr = (gr * dr + gi * di) / dm;
          gi = (gi * dr - gr * di) / dm;
          gr = tr;
        }
      }
      yp[2 * k] = gr;
      yp[2 * k + 1] = gi;
      sumYr += gr;
      sumYi += gi;
      numRe += gr * emfRe[k]! - gi * emfIm[k]!;
      numIm += gr * emfIm[k]! + gi * emfRe[k]!;
    }
    let vnRe = 0;
    let vnIm = 0;
    if (!solidNeutral) {
      const sm = sumYr * sumYr + sumYi * sumYi;
      if (sm === 0) throw new NumericalError('singular', `interval ${interval + 1}: the voltage of the board neutral bar is not fixed`);
      vnRe = (numRe * sumYr + numIm * sumYi) / sm;
      vnIm = (numIm * sumYr - numRe * sumYi) / sm;
    }
    let change = modulus(vnRe - state.reference[0]!, vnIm - state.reference[1]!);
    let inRe = 0;
    let inIm = 0;
    for (let k = 0; k < np; k++) {
      const dr = emfRe[k]! - vnRe;
      const di = emfIm[k]! - vnIm;
      const ir = yp[2 * k]! * dr - yp[2 * k + 1]! * di;
      const ii = yp[2 * k]! * di + yp[2 * k + 1]! * dr;
      const br = emfRe[k]! - (zr * ir - zi * ii);
      const bi = emfIm[k]! - (zr * ii + zi * ir);
      change = Math.max(change, modulus(br - state.busRe[k]!, bi - state.busIm[k]!));
      state.lineRe[k] = ir;
      state.lineIm[k] = ii;
      state.busRe[k] = br;
      state.busIm[k] = bi;
      inRe += ir;
      inIm += ii;
    }
    state.reference[0] = vnRe;
    state.reference[1] = vnIm;
    // Solid neutral: the bar's current is what the phases bring to it; otherwise Y_n·V_N (equal by KCL).
    state.neutral[0] = solidNeutral ? inRe : ynRe * vnRe - ynIm * vnIm;
    state.neutral[1] = solidNeutral ? inIm : ynRe * vnIm + ynIm * vnRe;
    return change / vBase;
  }

  const loadV = new Float64Array(np);
  return {
    path: 'closed-form',
    state,
    solve(powers, interval) {
      solveWith(powers, null, interval);
      let iterations = 1;
      if (!isLinearInterval(net, powers)) {
        let previous = 0;
        for (;;) {
          for (let k = 0; k < np; k++) loadV[k] = modulus(state.busRe[k]! - state.reference[0]!, state.busIm[k]! - state.reference[1]!);
          const change = solveWith(powers, loadV, interval);
          iterations++;
          if (!Number.isFinite(change)) throw new NumericalError('non-finite', `interval ${interval + 1}: the load iteration produced non-finite voltages`);
          if (iterationSettled(change, previous, opts.tolerance)) break;
          previous = change;
          if (iterations >= opts.maxIterations)
            throw new NumericalError('no-convergence', `interval ${interval + 1}: the voltage-dependent loads did not settle after ${iterations} iterations; the loads may exceed what the supply can deliver`);
        }
      }
      state.iterations = iterations;
    },
  };
}
