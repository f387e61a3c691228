/**
 * Runs every interval of a profile through a batch kernel and keeps, per
 * interval, the few figures the summaries read (typed arrays, one per figure).
 */
import type { BatchNetwork, DriverColumns } from './batchNetwork.js';
import { edgePowersAt } from './batchNetwork.js';
import { modulus, type BatchKernel, type IntervalState, type KernelOptions } from './batchKernel.js';
import { closedFormBlocker, createClosedFormKernel } from './closedFormKernel.js';
import { createCompiledKernel } from './compiledKernel.js';
import { isLinearClosedForm, solveLinearClosedForm } from './linearClosedForm.js';
import { lineDeviationPercentOf } from '../analysis/unbalanceIndices.js';
import { checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** Per-interval figures, each a column of `count` values. */
export interface IntervalFigures {
  readonly count: number;
  /** Line current magnitude per phase, A. */
  readonly lineA: readonly Float64Array[];
  /** Neutral current magnitude, A (zeros without a neutral). */
  readonly neutralA: Float64Array;
  /** Phase voltage magnitude per phase (to the neutral bar, or the virtual neutral on 3-wire), V. */
  readonly phaseV: readonly Float64Array[];
  /** Line-to-line voltage magnitude per pair (`lineToLinePairs`: A-B, B-C, C-A; A-B on two lines; none on one), V. */
  readonly lineToLineV: readonly Float64Array[];
  /** Per-phase active and reactive power at the board (load convention), W and var. */
  readonly phaseW: readonly Float64Array[];
  readonly phaseVar: readonly Float64Array[];
  /** Negative- to positive-sequence voltage ratio at the board bus, % (0 for fewer than three phases). */
  readonly unbalancePercent: Float64Array;
  /**
   * Largest deviation of a line-to-line voltage magnitude from the average of the three, % of that average
   * (the ANSI C84.1 / NEMA MG 1 index; 0 for fewer than three phases).
   */
  readonly lineDeviationPercent: Float64Array;
}

/** The line pairs of a board of `phases` lines, in the order `lineToLineV` holds them. */
export const lineToLinePairs = (phases: number): readonly (readonly [number, number])[] =>
  phases === 3 ? [[0, 1], [1, 2], [2, 0]] : phases === 2 ? [[0, 1]] : [];

export function allocateFigures(count: number, phases: number): IntervalFigures {
  checkNumberArgument(count, 'count', 'a number of intervals: a whole number at least 0', (x) => Number.isInteger(x) && x >= 0);
  checkNumberArgument(phases, 'phases', "the board's number of phases: 1, 2 or 3", (x) => x === 1 || x === 2 || x === 3);
  const cols = (n = phases) => Array.from({ length: n }, () => new Float64Array(count));
  return {
    count,
    lineA: cols(),
    neutralA: new Float64Array(count),
    phaseV: cols(),
    lineToLineV: cols(lineToLinePairs(phases).length),
    phaseW: cols(),
    phaseVar: cols(),
    unbalancePercent: new Float64Array(count),
    lineDeviationPercent: new Float64Array(count),
  };
}

const H = Math.sqrt(3) / 2;

/** Copies the solved state of interval i into the figure columns. */
export function recordInterval(state: IntervalState, sequence: 'ABC' | 'ACB', out: IntervalFigures, i: number): void {
  const np = state.busRe.length;
  const rr = state.reference[0]!;
  const ri = state.reference[1]!;
  for (let k = 0; k < np; k++) {
    const vr = state.busRe[k]! - rr;
    const vi = state.busIm[k]! - ri;
    const ir = state.lineRe[k]!;
    const ii = state.lineIm[k]!;
    out.lineA[k]![i] = modulus(ir, ii);
    out.phaseV[k]![i] = modulus(vr, vi);
    // S = V·conj(I)
    out.phaseW[k]![i] = vr * ir + vi * ii;
    out.phaseVar[k]![i] = vi * ir - vr * ii;
  }
  out.neutralA[i] = modulus(state.neutral[0]!, state.neutral[1]!);
  const pairs = lineToLinePairs(np);
  for (let p = 0; p < pairs.length; p++) {
    const [x, y] = pairs[p]!;
    out.lineToLineV[p]![i] = modulus(state.busRe[x]! - state.busRe[y]!, state.busIm[x]! - state.busIm[y]!);
  }
  if (np === 3) {
    // V1 = Va + a·Vb + a²·Vc, V2 = Va + a²·Vb + a·Vc (the 1/3 cancels in the ratio), with
    // a·x = (−½ + jH)·x; ACB swaps a and a² (s = −1).
    const s = sequence === 'ABC' ? H : -H;
    const ar = state.busRe[0]!;
    const ai = state.busIm[0]!;
    const br = state.busRe[1]!;
    const bi = state.busIm[1]!;
    const cr = state.busRe[2]!;
    const ci = state.busIm[2]!;
    const sumR = ar - 0.5 * (br + cr);
    const sumI = ai - 0.5 * (bi + ci);
    // ±jH·(Vb − Vc)
    const dr = -s * (bi - ci);
    const di = s * (br - cr);
    const m1 = modulus(sumR + dr, sumI + di);
    out.unbalancePercent[i] = m1 === 0 ? 0 : (100 * modulus(sumR - dr, sumI - di)) / m1;
    out.lineDeviationPercent[i] = lineDeviationPercentOf(out.lineToLineV[0]![i]!, out.lineToLineV[1]![i]!, out.lineToLineV[2]![i]!);
  }
}

export interface BatchSolveOptions extends KernelOptions {
  /**
   * 'auto' takes the closed-form path where the board qualifies (a neutral, all
   * loads phase-to-neutral), else the nodal path.
   * @defaultValue 'auto'
   */
  readonly path?: 'auto' | 'closed-form' | 'nodal';
}

/** The kernel a board takes. */
export function createBatchKernel(net: BatchNetwork, options: BatchSolveOptions = {}): BatchKernel {
  checkObjectArgument(net, 'net', 'a batch network from compileBatchNetwork(...)', ['board', 'edges', 'coefficients']);
  const path = options.path ?? 'auto';
  if (path === 'nodal' || (path === 'auto' && closedFormBlocker(net))) return createCompiledKernel(net, options);
  return createClosedFormKernel(net, options);
}

/**
 * Solves intervals [from, to) of the drivers into `out` (same indices).
 * @throws {NumericalError} naming the interval that would not solve.
 */
export function solveBatch(
  net: BatchNetwork,
  columns: DriverColumns,
  out: IntervalFigures,
  options: BatchSolveOptions & { readonly from?: number; readonly to?: number; readonly onProgress?: (done: number) => void } = {},
): { path: BatchKernel['path'] } {
  const from0 = options.from ?? 0;
  const to0 = options.to ?? columns.count;
  if ((options.path ?? 'auto') !== 'nodal' && isLinearClosedForm(net)) {
    // Constant-impedance loads only: one fused pass, no load iteration.
    solveLinearClosedForm(net, columns, out, from0, to0);
    options.onProgress?.(to0 - from0);
    return { path: 'closed-form' };
  }
  const kernel = createBatchKernel(net, options);
  const powers = new Float64Array(net.edges.length * 6);
  const from = options.from ?? 0;
  const to = options.to ?? columns.count;
  for (let i = from; i < to; i++) {
    edgePowersAt(net, columns, i, powers);
    kernel.solve(powers, i);
    recordInterval(kernel.state, net.board.sequence, out, i);
    if (options.onProgress && (i - from) % 16384 === 16383) options.onProgress(i - from + 1);
  }
  return { path: kernel.path };
}
