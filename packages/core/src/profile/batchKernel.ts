/**
 * What the two batch kernels share: the per-interval state they write, the
 * stopping rule of the load iteration (the same as solveNetwork's, so both
 * paths stop where the general solver stops) and the ZIP admittance.
 */
import type { BatchNetwork } from './batchNetwork.js';

/** The solved interval, overwritten by each solve (no per-interval allocation). */
export interface IntervalState {
  /** Board phase-bus voltages to the source star point, V. */
  readonly busRe: Float64Array;
  readonly busIm: Float64Array;
  /** Line currents, source → board, A. */
  readonly lineRe: Float64Array;
  readonly lineIm: Float64Array;
  /** [re, im] of the neutral-bar voltage (4-wire) or the centroid of the bus voltages (3-wire). */
  readonly reference: Float64Array;
  /** [re, im] of the neutral current, board → source; zeros on a board without a neutral. */
  readonly neutral: Float64Array;
  /** Load-iteration count of the last solve. */
  iterations: number;
}

/** Sets `reference` to the centroid of the first `np` bus voltages: a board without a neutral bar (or with it dead). */
export function referenceAtCentroid(state: IntervalState, np: number): void {
  let cr = 0;
  let ci = 0;
  for (let k = 0; k < np; k++) {
    cr += state.busRe[k]!;
    ci += state.busIm[k]!;
  }
  state.reference[0] = cr / np;
  state.reference[1] = ci / np;
}

export interface BatchKernel {
  readonly path: 'closed-form' | 'nodal';
  readonly state: IntervalState;
  /**
   * Solves one interval from its edge powers ([edge][part][re, im], VA at nominal
   * voltage; see edgePowersAt). `interval` only names the interval in errors.
   */
  solve(edgePowers: Float64Array, interval: number): void;
}

export interface KernelOptions {
  /** @defaultValue 1e-10 (as solveNetwork) */
  readonly tolerance?: number;
  /** @defaultValue 100 */
  readonly maxIterations?: number;
  /** @defaultValue 0.7 */
  readonly lowVoltageThreshold?: number;
}

export interface ResolvedKernelOptions {
  readonly tolerance: number;
  readonly maxIterations: number;
  readonly lowVoltageThreshold: number;
}

export function resolveKernelOptions(options: KernelOptions = {}): ResolvedKernelOptions {
  return {
    tolerance: options.tolerance ?? 1e-10,
    maxIterations: options.maxIterations ?? 100,
    lowVoltageThreshold: options.lowVoltageThreshold ?? 0.7,
  };
}

/** solveNetwork's rule (network/iterationSettled.ts), shared. */
export { iterationSettled, ROUND_OFF_CHANGE } from '../network/iterationSettled.js';

export function newIntervalState(phases: number): IntervalState {
  return {
    busRe: new Float64Array(phases),
    busIm: new Float64Array(phases),
    lineRe: new Float64Array(phases),
    lineIm: new Float64Array(phases),
    reference: new Float64Array(2),
    neutral: new Float64Array(2),
    iterations: 0,
  };
}

/**
 * Writes into out[0..1] the admittance of an edge at voltage magnitude v:
 * Y = [conj(Sz) + conj(Si)·r + conj(Sp)·r²] / v0², r = v0 / max(v, threshold·v0).
 */
export function edgeAdmittance(powers: Float64Array, e: number, v0: number, v: number, threshold: number, out: Float64Array): void {
  const r = v0 / Math.max(v, threshold * v0);
  const b = e * 6;
  const inv = 1 / (v0 * v0);
  out[0] = (powers[b]! + powers[b + 2]! * r + powers[b + 4]! * r * r) * inv;
  out[1] = -(powers[b + 1]! + powers[b + 3]! * r + powers[b + 5]! * r * r) * inv;
}

/** True when no edge of this interval has a current or power part (one linear solve suffices). */
export function isLinearInterval(net: BatchNetwork, powers: Float64Array): boolean {
  for (let e = 0; e < net.edges.length; e++) {
    const b = e * 6;
    if (powers[b + 2] !== 0 || powers[b + 3] !== 0 || powers[b + 4] !== 0 || powers[b + 5] !== 0) return false;
  }
  return true;
}

/** |re + j·im|. Math.hypot guards against overflow we cannot meet here and is several times slower in V8. */
export const modulus = (re: number, im: number): number => Math.sqrt(re * re + im * im);
