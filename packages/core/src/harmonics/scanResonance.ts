/**
 * Frequency scan of the impedance seen from the board — each phase to the
 * neutral bar and each line pair — for every step combination of the bank,
 * with the parallel-resonance peaks found and refined, beside the classic
 * estimate h_r = √(X_C/X_path) [METHODS §5] (from the path's reactance: the
 * usual √(S_sc/Q_c) assumes X ≫ R).
 *
 * Loads enter at the admittance of the solved fundamental (all steps on),
 * scaled to each order like the harmonic solve (networkAtOrder.ts); non-linear
 * loads are ideal current sources, so they are open circuits here. The network
 * is the compiled circuit of the board's installation (scanEvaluator.ts): the
 * supply as the file earths it, and on a sub-board every feeder back to the source.
 */
import type { Board } from '../board/boardModel.js';
import type { NetworkSolution } from '../network/solveNetwork.js';
import { boardShortCircuitVA } from '../network/installationModel.js';
import { capacitorPathReactance } from '../network/capacitorPathReactance.js';
import { createBoardScanEvaluator, type ScanEvaluator } from './scanEvaluator.js';
import { HARMONICS_DEFAULTS } from './harmonicsDefaults.js';
import { stateKey, type BankModel, type HarmonicModel } from './harmonicModel.js';
import type { ResonanceScan, ScanCombination, ScanPeak } from './harmonicsResult.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { checkListArgument, checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** Every on/off pattern of n steps, all off first. */
export function stepCombinations(n: number): boolean[][] {
  return Array.from({ length: 2 ** n }, (_, k) => Array.from({ length: n }, (_, s) => ((k >> s) & 1) === 1));
}

export function combinationLabel(bank: BankModel | null, steps: readonly boolean[]): string {
  if (!bank) return 'as given';
  const on = steps.flatMap((s, k) => (s ? [k + 1] : []));
  const fixed = bank.fixedLoad !== null;
  if (on.length === 0) return fixed ? 'fixed part only' : 'bank off';
  return `${fixed ? 'fixed + ' : ''}step${on.length > 1 ? 's' : ''} ${on.join('+')}`;
}

/** Short-circuit power at the board from the impedance back to the source (line and neutral on a single-phase board), VA; null on an ideal source. */
export function shortCircuitVA(board: Board): number | null {
  assertBoardModel(board);
  // On a single-phase board the loop is the line and the neutral (see shortCircuitPathImpedance).
  return boardShortCircuitVA(board);
}

/** The board loads that are the bank's parts on: the fixed part and the steps on. */
const bankPartsOn = (bank: BankModel, steps: readonly boolean[]): number[] => [...(bank.fixedLoad === null ? [] : [bank.fixedLoad]), ...bank.stepLoads.filter((_, k) => steps[k])];

/** Effective fundamental output of the bank parts that are on, at nominal voltage, kvar. */
export function bankKvarOn(board: Board, bank: BankModel, steps: readonly boolean[]): number {
  return bankPartsOn(bank, steps).reduce((s, l) => s + board.loads[l]!.branches.reduce((t, b) => t - b.sNominal.im, 0), 0) / 1000;
}

/** The evaluator of a single board's solution (the installation with one board). */
export function createScanEvaluator(fundamental: NetworkSolution, model: HarmonicModel): ScanEvaluator {
  checkObjectArgument(fundamental, 'fundamental', 'a network solution of the board at the fundamental (solveNetwork(board))', ['board', 'topology', 'nodeVoltages', 'branches']);
  checkObjectArgument(model, 'model', "a board's harmonic model from resolveHarmonicModel(...)", ['loads', 'background', 'scan']);
  return createBoardScanEvaluator(fundamental, model);
}

/**
 * Rounds a curve for plotting to 1e-6 of its largest value (one multiply and
 * round per point: over a million points toPrecision would take longer than the scan).
 */
export function roundForPlot(curve: Float64Array | readonly number[]): number[] {
  if (!(curve instanceof Float64Array)) checkListArgument(curve, 'curve', 'a curve: a Float64Array or a list of numbers', (x) => typeof x === 'number');
  let largest = 0;
  for (let i = 0; i < curve.length; i++) if (curve[i]! > largest) largest = curve[i]!;
  if (!(largest > 0)) return Array.from(curve);
  const step = 10 ** (Math.floor(Math.log10(largest)) - 6);
  // Indexed, not Array.from's iterator: a correction with harmonic data rounds some 10^5 points per variant.
  const rounded: number[] = [];
  for (let i = 0; i < curve.length; i++) rounded.push(Math.round(curve[i]! / step) * step);
  return rounded;
}

/** The scan grid: 1, 1 + step, …, up to maxOrder. */
export function scanGrid(maxOrder: number, step: number): number[] {
  checkNumberArgument(maxOrder, 'maxOrder', 'the highest order to scan, at least 1', (x) => x >= 1);
  checkNumberArgument(step, 'step', 'a step between orders above 0', (x) => x > 0);
  const count = Math.floor((maxOrder - 1) / step + 1e-9) + 1;
  return Array.from({ length: count }, (_, k) => Math.round((1 + k * step) * 1e9) / 1e9);
}

/**
 * Refines a peak of |Z| bracketed by grid points a < m < b (f(m) the largest; za, zm, zb
 * the values the scan has at them, f's own, so not evaluated again).
 * Near a parallel resonance 1/|Z|² is close to a parabola in h, so successive
 * parabolic interpolation on it converges in a few evaluations; a step that
 * leaves the bracket falls back to bisecting the larger side.
 */
function refineMaximum(f: (h: number) => number, a: number, m: number, b: number, za: number, fm: number, zb: number): { h: number; value: number } {
  const g = (z: number) => 1 / (z * z);
  let fa = g(za);
  let fb = g(zb);
  let gm = g(fm);
  let best = { h: m, value: fm };
  for (let iteration = 0; iteration < 40 && b - a > 1e-9; iteration++) {
    const p = (m - a) * (gm - fb);
    const q = (m - b) * (gm - fa);
    const denominator = 2 * (p - q);
    let x = denominator !== 0 ? m - ((m - a) * p - (m - b) * q) / denominator : Number.NaN;
    if (!(x > a && x < b) || Math.abs(x - m) < 1e-10) x = m - a > b - m ? (a + m) / 2 : (m + b) / 2;
    const zx = f(x);
    const gx = g(zx);
    if (zx > best.value) best = { h: x, value: zx };
    // Keep the three points that bracket the smallest 1/|Z|².
    if (gx < gm) {
      if (x < m) {
        b = m;
        fb = gm;
      } else {
        a = m;
        fa = gm;
      }
      m = x;
      gm = gx;
    } else if (x < m) {
      a = x;
      fa = gx;
    } else {
      b = x;
      fb = gx;
    }
    if (Math.abs(x - m) < 1e-7 && b - a < 1e-3) break;
  }
  return best;
}

/** Local maxima of a sampled curve that stand out by the prominence rule, as grid indices. */
export function peakIndices(values: ArrayLike<number>, prominence: number): number[] {
  const peaks: number[] = [];
  for (let i = 1; i < values.length - 1; i++) {
    const v = values[i]!;
    if (!(v > values[i - 1]! && v >= values[i + 1]!)) continue;
    let left = v;
    for (let j = i - 1; j >= 0 && values[j]! <= v; j--) left = Math.min(left, values[j]!);
    let right = v;
    for (let j = i + 1; j < values.length && values[j]! <= v; j++) right = Math.min(right, values[j]!);
    if (v - Math.max(left, right) >= prominence * v) peaks.push(i);
  }
  return peaks;
}

/**
 * Every peak of one network state's curves, refined between grid points: `values[i·pairs + k]` is
 * |Z| of pair k at grid point i, and `evaluate` fills every pair's |Z| for the order the evaluator
 * was last prepared at, in that same state (so a peak's bracket is read off `values`, not evaluated again).
 */
export function refinedPeaks(
  evaluator: ScanEvaluator,
  grid: readonly number[],
  values: Float64Array,
  evaluate: (out: Float64Array) => void,
): { curves: Float64Array[]; peaks: ScanPeak[] } {
  const nPairs = evaluator.pairs.length;
  const out = new Float64Array(nPairs);
  const curves = evaluator.pairs.map((_, k) => {
    const curve = new Float64Array(grid.length);
    for (let i = 0; i < grid.length; i++) curve[i] = values[i * nPairs + k]!;
    return curve;
  });
  const peaks: ScanPeak[] = [];
  curves.forEach((curve, k) => {
    for (const i of peakIndices(curve, HARMONICS_DEFAULTS.peakProminence)) {
      const at = (h: number) => {
        evaluator.prepare(h);
        evaluate(out);
        return out[k]!;
      };
      const refined = refineMaximum(at, grid[i - 1]!, grid[i]!, grid[i + 1]!, curve[i - 1]!, curve[i]!, curve[i + 1]!);
      const [p, q] = evaluator.pairs[k]!;
      peaks.push({ pair: `${p}-${q}`, order: refined.h, impedanceOhm: refined.value });
    }
  });
  return { curves, peaks };
}

/** Checked orders within the resonance band (±10 %) of a peak. */
export const ordersNear = (peaks: readonly ScanPeak[], checked: readonly number[]): number[] =>
  checked.filter((o) => peaks.some((pk) => Math.abs(pk.order - o) <= HARMONICS_DEFAULTS.resonanceBand * o));

export interface ScanOptions {
  /** Orders to scan. @defaultValue the model's scan grid */
  readonly grid?: readonly number[];
  /** Orders a resonance is checked against. */
  readonly checkedOrders: readonly number[];
  readonly checkedOrdersFrom: ResonanceScan['checkedOrdersFrom'];
}

/**
 * Scans the impedance seen from the board for every step combination.
 * @param fundamental the solved board with every bank part on
 */
export function scanResonance(fundamental: NetworkSolution, model: HarmonicModel, options: ScanOptions, evaluator: ScanEvaluator = createScanEvaluator(fundamental, model)): ResonanceScan {
  checkObjectArgument(fundamental, 'fundamental', 'a network solution of the board at the fundamental (solveNetwork(board))', ['board', 'topology', 'nodeVoltages', 'branches']);
  checkObjectArgument(model, 'model', "a board's harmonic model from resolveHarmonicModel(...)", ['loads', 'background', 'scan']);
  checkObjectArgument(options, 'options', 'the scan options ({} for the defaults)');
  const board = fundamental.board;
  const grid = options.grid ?? scanGrid(model.scan.maxOrder, model.scan.step);
  const bank = model.bank;
  const combos = stepCombinations(bank ? bank.stepLoads.length : 0);
  const nPairs = evaluator.pairs.length;
  // Combinations that switch electrically identical parts are one network: evaluate it once.
  const keys = combos.map((steps) => (bank ? stateKey(board, bank, steps) : ''));
  const firstOf = keys.map((k) => keys.indexOf(k));
  const distinct = combos.flatMap((_, c) => (firstOf[c] === c ? [c] : []));
  const values = combos.map(() => new Float64Array(grid.length * nPairs));
  grid.forEach((h0, i) => {
    evaluator.prepare(h0);
    for (const c of distinct) evaluator.impedances(combos[c]!, values[c]!, i * nPairs);
  });
  combos.forEach((_, c) => {
    if (firstOf[c] !== c) values[c] = values[firstOf[c]!]!;
  });
  const ssc = shortCircuitVA(board);
  // The estimate beside the scan: the lowest order of the supply path's reactances with the parts on (capacitorPathReactance.ts).
  const lowestOrderOf = (steps: readonly boolean[]) => (bank ? (capacitorPathReactance(board, bankPartsOn(bank, steps).flatMap((l) => board.loads[l]!.branches))?.resonanceOrders[0] ?? null) : null);
  const shared = new Map<number, Pick<ScanCombination, 'impedanceOhm' | 'peaks'>>();
  const combinations = combos.map((steps, c): ScanCombination => {
    const kvar = bank ? bankKvarOn(board, bank, steps) : 0;
    const label = combinationLabel(bank, steps);
    const formulaOrder = kvar > 0 && (bank?.detuning ?? 0) === 0 ? lowestOrderOf(steps) : null;
    const same = shared.get(firstOf[c]!);
    if (same) return { steps, label, capacitorKvar: kvar, formulaOrder, impedanceOhm: same.impedanceOhm, peaks: same.peaks, nearOrders: ordersNear(same.peaks, options.checkedOrders) };
    const { curves, peaks } = refinedPeaks(evaluator, grid, values[c]!, (out) => evaluator.impedances(steps, out, 0));
    // The curves are for plotting, so rounded (peaks are found and refined on the exact values).
    const plotted = curves.map(roundForPlot);
    shared.set(c, { impedanceOhm: plotted, peaks });
    return { steps, label, capacitorKvar: kvar, formulaOrder, impedanceOhm: plotted, peaks, nearOrders: ordersNear(peaks, options.checkedOrders) };
  });
  return {
    orders: grid,
    pairs: evaluator.pairs.map(([p, q]) => `${p}-${q}`),
    shortCircuitKVA: ssc === null ? null : ssc / 1000,
    checkedOrders: options.checkedOrders,
    checkedOrdersFrom: options.checkedOrdersFrom,
    combinations,
    basis: 'linear loads at their solved fundamental admittance (every bank step on), scaled to each order; non-linear loads as ideal current sources (open circuits); every supply EMF shorted',
  };
}
