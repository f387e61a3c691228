/**
 * The resonance seen from one bank's board while the installation's other banks
 * switch too. Less capacitance elsewhere moves the parallel resonance seen from
 * this board up (h_r ≈ √(S_sc/Q_c) with Q_c every capacitor on the way), more
 * moves it down, so a bank that clears the 5th and 7th with every other bank on
 * may sit on one of them with another bank partly or wholly off.
 *
 * The states: every combination of this bank's steps (as scanResonance), times
 * each other bank at each level an automatic controller reaches stepping it in
 * the order its steps are written (off, step 1, steps 1+2, …; with a fixed part:
 * out of service, fixed part only, fixed + step 1, …), every other bank
 * combined. Electrically identical levels are one level. Above `stateLimit`
 * networks the other banks are taken at their extremes only (each off or fully
 * on), and above it again all together off or all on; the result says which.
 */
import type { Board } from '../board/boardModel.js';
import { InputError, inputIssue } from '../errors.js';
import type { InstallationSolution } from '../network/solveNetwork.js';
import { HARMONICS_DEFAULTS } from './harmonicsDefaults.js';
import { stateKey, type BankModel, type HarmonicModel } from './harmonicModel.js';
import type { JointPeak, JointScan, JointScanCombination, OtherBankLevel, ScanPeak } from './harmonicsResult.js';
import { bankKvarOn, combinationLabel, refinedPeaks, stepCombinations } from './scanResonance.js';
import type { BankState, ScanEvaluator } from './scanEvaluator.js';
import { bankStateWords } from './harmonicsWording.js';

/** A level of another bank as the scan sets it, with its words. */
interface Level extends BankState {
  readonly label: string;
  readonly capacitorKvar: number;
}

/** The distinct levels a controller steps a bank through, lowest first (out of service first where it has a fixed part). */
export function controllerLevels(board: Board, bank: BankModel): Level[] {
  const n = bank.stepLoads.length;
  const stepped = Array.from({ length: n + 1 }, (_, on) => Array.from({ length: n }, (_, k) => k < on));
  const levels: Level[] = bank.fixedLoad === null ? [] : [{ steps: stepped[0]!, fixedOn: false, label: 'out of service', capacitorKvar: 0 }];
  const seen = new Set<string>();
  for (const steps of stepped) {
    const key = stateKey(board, bank, steps);
    if (seen.has(key)) continue;
    seen.add(key);
    const words = combinationLabel(bank, steps);
    levels.push({ steps, fixedOn: true, label: words === 'bank off' ? 'off' : words, capacitorKvar: bankKvarOn(board, bank, steps) });
  }
  return levels;
}

export interface JointScanOptions {
  /** Orders to scan (the scan's grid, so the states with every other bank on are the scan's own). */
  readonly grid: readonly number[];
  readonly checkedOrders: readonly number[];
  /** Most networks scanned per bank before the other banks are taken at their extremes. @defaultValue HARMONICS_DEFAULTS.jointStateLimit */
  readonly stateLimit?: number;
}

/** Every network state of a joint scan: per bank of the evaluator, its state. */
export type NetworkState = readonly BankState[];

/**
 * The curves and refined peaks of each network state, in chunks so the matrices of one order
 * serve many states while memory stays bounded. `values[i·pairs + k]`: |Z| of pair k at grid point i.
 */
export function scanNetworkStates(evaluator: ScanEvaluator, grid: readonly number[], states: readonly NetworkState[], each: (state: number, values: Float64Array, peaks: ScanPeak[]) => void): void {
  const nPairs = evaluator.pairs.length;
  const chunk = Math.max(1, Math.min(states.length, Math.floor(2 ** 21 / Math.max(1, grid.length * nPairs))));
  const values = Array.from({ length: chunk }, () => new Float64Array(grid.length * nPairs));
  for (let first = 0; first < states.length; first += chunk) {
    const count = Math.min(chunk, states.length - first);
    grid.forEach((h, i) => {
      evaluator.prepare(h);
      for (let s = 0; s < count; s++) evaluator.impedancesIn(states[first + s]!, values[s]!, i * nPairs);
    });
    for (let s = 0; s < count; s++) {
      const state = states[first + s]!;
      const { peaks } = refinedPeaks(evaluator, grid, values[s]!, (out) => evaluator.impedancesIn(state, out, 0));
      each(first + s, values[s]!, peaks);
    }
  }
}

/** Every combination of one level per bank, the first bank's level changing slowest. */
function product<T>(lists: readonly (readonly T[])[]): T[][] {
  return lists.reduce<T[][]>((acc, list) => acc.flatMap((prefix) => list.map((x) => [...prefix, x])), [[]]);
}

/** The other banks' states to scan and how they were chosen, within the limit where it can be. */
function otherStates(levels: readonly (readonly Level[])[], ownStates: number, limit: number): { states: Level[][]; coverage: JointScan['coverage'] } {
  const count = (lists: readonly (readonly Level[])[]) => lists.reduce((n, l) => n * l.length, ownStates);
  if (count(levels) <= limit) return { states: product(levels), coverage: 'controller levels' };
  const extremes = levels.map((l) => [l[0]!, l.at(-1)!]);
  if (count(extremes) <= limit) return { states: product(extremes), coverage: 'each off or fully on' };
  return { states: [levels.map((l) => l[0]!), levels.map((l) => l.at(-1)!)], coverage: 'all off or all on together' };
}

/** The other banks' state in words: `Studios bank off; Plant bank steps 1+2`. */
const stateWords = (boards: readonly string[], levels: readonly Level[]) => levels.map((l, k) => bankStateWords(boards[k]!, l.label)).join('; ');

const nearness = (peak: ScanPeak, order: number) => Math.abs(peak.order - order) / order;

/**
 * Scans the resonance seen from the evaluator's board for every combination of its bank's steps
 * with the other banks switched; null when the board has no bank or the installation no other bank.
 * @param fundamental the installation solved with every bank part on
 * @throws {InputError} for a `stateLimit` that is not a whole number ≥ 1
 */
export function scanJointResonance(fundamental: InstallationSolution, models: readonly HarmonicModel[], evaluator: ScanEvaluator, options: JointScanOptions): JointScan | null {
  const own = evaluator.ownBank;
  if (own < 0 || evaluator.banks.length < 2) return null;
  const limit = options.stateLimit ?? HARMONICS_DEFAULTS.jointStateLimit;
  if (!Number.isInteger(limit) || limit < 1) throw new InputError([inputIssue('out_of_range', 'jointStateLimit', 'a whole number of networks, at least 1', limit)]);
  const boardOf = (k: number) => fundamental.boards[evaluator.banks[k]!.board]!.board;
  const ownBoard = boardOf(own);
  const bank = models[evaluator.banks[own]!.board]!.bank!;
  const others = evaluator.banks.flatMap((_, k) => (k === own ? [] : [k]));
  const otherNames = others.map((k) => boardOf(k).name);
  const levels = others.map((k) => controllerLevels(boardOf(k), models[evaluator.banks[k]!.board]!.bank!));

  // This bank's combinations, electrically identical ones once (as scanResonance).
  const combos = stepCombinations(bank.stepLoads.length);
  const keys = combos.map((steps) => stateKey(ownBoard, bank, steps));
  const firstOf = keys.map((k) => keys.indexOf(k));
  const distinct = combos.flatMap((_, c) => (firstOf[c] === c ? [c] : []));
  const { states: chosen, coverage } = otherStates(levels, distinct.length, limit);

  const states: NetworkState[] = distinct.flatMap((c) =>
    chosen.map((levelsOn) => {
      const state: BankState[] = new Array(evaluator.banks.length);
      state[own] = { steps: combos[c]!, fixedOn: true };
      others.forEach((k, j) => (state[k] = levelsOn[j]!));
      return state;
    }),
  );
  const band = HARMONICS_DEFAULTS.resonanceBand;
  const summaries = new Map<number, Omit<JointScanCombination, 'steps' | 'label' | 'capacitorKvar'>>();
  let current: { lowest: JointPeak | null; highest: JointPeak | null; nearest: JointScanCombination['nearest']; near: Map<number, JointPeak>; states: JointScanCombination['states'][number][] } | null = null;
  scanNetworkStates(evaluator, options.grid, states, (s, _values, peaks) => {
    const d = Math.floor(s / chosen.length);
    const levelsOn = chosen[s % chosen.length]!;
    if (s % chosen.length === 0) current = { lowest: null, highest: null, nearest: null, near: new Map(), states: [] };
    const acc = current!;
    const others = stateWords(otherNames, levelsOn);
    acc.states.push({ otherBanks: others, peakOrders: [...new Set(peaks.map((p) => Math.round(p.order * 100) / 100))].sort((a, b) => a - b) });
    for (const p of peaks) {
      const peak: JointPeak = { ...p, otherBanks: others };
      if (!acc.lowest || p.order < acc.lowest.order) acc.lowest = peak;
      if (!acc.highest || p.order > acc.highest.order) acc.highest = peak;
      for (const o of options.checkedOrders) {
        if (!acc.nearest || nearness(p, o) < nearness(acc.nearest, acc.nearest.checkedOrder)) acc.nearest = { ...peak, checkedOrder: o };
        const held = acc.near.get(o);
        if (Math.abs(p.order - o) <= band * o && (!held || nearness(p, o) < nearness(held, o))) acc.near.set(o, peak);
      }
    }
    if (s % chosen.length === chosen.length - 1)
      summaries.set(distinct[d]!, {
        networkStates: chosen.length,
        states: acc.states,
        lowestPeak: acc.lowest,
        highestPeak: acc.highest,
        nearest: acc.nearest,
        nearOrders: options.checkedOrders.flatMap((o) => (acc.near.has(o) ? [{ order: o, peak: acc.near.get(o)! }] : [])),
      });
  });
  return {
    otherBanks: others.map((_, j) => ({
      board: otherNames[j]!,
      levels: levels[j]!.filter((l) => chosen.some((c) => c[j] === l)).map((l): OtherBankLevel => ({ label: l.label, steps: l.steps, fixedOn: l.fixedOn, capacitorKvar: l.capacitorKvar })),
    })),
    coverage,
    networkStates: states.length,
    stateLimit: limit,
    combinations: combos.map((steps, c) => ({ steps, label: combinationLabel(bank, steps), capacitorKvar: bankKvarOn(ownBoard, bank, steps), ...summaries.get(firstOf[c]!)! })),
  };
}
