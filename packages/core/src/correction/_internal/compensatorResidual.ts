/**
 * What a balancing compensator drives to zero, read off a solved board, per
 * unit: the negative-sequence line current I2, the zero-sequence current I0
 * (only when line-to-neutral branches can act on it), and the positive-sequence
 * reactive power's distance from its target, Q1 − P1·tan φ_target.
 * Bases: I_base = |I1| of the uncorrected board, S_base = 3·V_LN·I_base.
 */
import type { Board } from '../../board/boardModel.js';
import type { BoardResult } from '../../analysis/boardResult.js';
import type { ResolvedTarget } from '../correctionTarget.js';
import { abs } from '../../complex.js';
import type { ProbeState } from './boardProbe.js';

export interface ResidualBases {
  readonly currentA: number;
  readonly powerKVA: number;
  /** tan φ of the target PF1+. */
  readonly targetTan: number;
  readonly includeZeroSequence: boolean;
}

export function compensatorResidual(state: ProbeState, bases: ResidualBases): number[] {
  const seq = state.sequences;
  const ps = seq?.positiveSequence;
  if (!seq || !ps) throw new Error('internal error: a balancing compensator needs a three-phase board (checked by the options rules)');
  const i2 = seq.current.negative;
  const i0 = seq.current.zero;
  const r = [i2.re / bases.currentA, i2.im / bases.currentA];
  if (bases.includeZeroSequence) r.push(i0.re / bases.currentA, i0.im / bases.currentA);
  r.push((ps.kvar - ps.kW * bases.targetTan) / bases.powerKVA);
  return r;
}

/** Weights (squared) of the residual entries, in order. */
export function residualWeights(bases: ResidualBases, w: { negativeSequence: number; zeroSequence: number; reactive: number }): number[] {
  return [w.negativeSequence, w.negativeSequence, ...(bases.includeZeroSequence ? [w.zeroSequence, w.zeroSequence] : []), w.reactive];
}

const tanOf = (pf: number) => Math.sqrt(1 - pf * pf) / pf;

/**
 * The bases on the board before correction. The PF target is a lower bound: a board already better
 * than it keeps its own Q1 (clamped to the upper bound), so nothing adds lagging vars to reach it.
 */
export function residualBasesFor(before: BoardResult, board: Board, target: ResolvedTarget, includeZeroSequence: boolean): ResidualBases {
  const i1 = before.sequences ? abs(before.sequences.current.positive) : 0;
  const currentA = i1 > 0 ? i1 : 1;
  const ps0 = before.powerFactor.positiveSequence;
  const presentTan = ps0 && ps0.kW > 0 ? ps0.kvar / ps0.kW : Infinity;
  const lowTan = target.leading === 'allowed' ? -tanOf(target.minLeadingPf ?? target.pf) : target.maxLaggingPf !== null ? tanOf(target.maxLaggingPf) : 0;
  return {
    currentA,
    powerKVA: (3 * board.nominalLineToNeutralV * currentA) / 1000,
    targetTan: Math.min(tanOf(target.pf), Math.max(presentTan, lowTan)),
    includeZeroSequence,
  };
}
