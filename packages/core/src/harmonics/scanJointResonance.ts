/**
 * The resonance seen from one bank's board while the installation's other banks
 * switch too. Less capacitance elsewhere moves the parallel resonance seen from
 * this board up (h_r ≈ √(S_sc/Q_c) with Q_c every capacitor on the way), more
 * moves it down, so a bank that clears the 5th and 7th with every other bank on
 * may sit on one of them with another bank partly or wholly off.
 *
 * The states: every combination of this bank's steps (as scanResonance), times
 * each other bank in every state its parts can take, whatever order a controller
 * switches them in (rotating or combining steps; with a fixed part also out of
 * service and fixed part only), every other bank combined. Electrically identical
 * states are one state. Above `stateLimit` networks each other bank is taken at
 * the levels a controller reaches stepping in the order its steps are written
 * (off, step 1, steps 1+2, …); above it again at its extremes only (each off or
 * fully on), and above that all together off or all on; the result says which.
 */
import type { Board } from '../board/boardModel.js';
import { InputError, inputIssue } from '../errors.js';
import type { InstallationSolution } from '../network/solveNetwork.js';
import { HARMONICS_DEFAULTS } from './harmonicsDefaults.js';
import { stateKey, type BankModel, type HarmonicModel } from './harmonicModel.js';
import type { JointPeak, JointScan, JointScanCombination, OtherBankLevel, ResonanceScan, ScanPeak } from './harmonicsResult.js';
import { bankKvarOn, combinationLabel, refinedPeaks, stepCombinations } from './scanResonance.js';
import type { BankState, ScanEvaluator } from './scanEvaluator.js';
import { bankStateWords } from './harmonicsWording.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { argumentIssueError, checkListArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** A level of another bank as the scan sets it, with its words. */
interface Level extends BankState {
  readonly label: string;
  readonly capacitorKvar: number;
}

/** A bank's level from its steps, its fixed part on. */
function levelOf(board: Board, bank: BankModel, steps: boolean[]): Level {
  const words = combinationLabel(bank, steps);
  return { steps, fixedOn: true, label: words === 'bank off' ? 'off' : words, capacitorKvar: bankKvarOn(board, bank, steps) };
}

/** Keeps the first of electrically identical step sets (stateKey), out of service first where the bank has a fixed part. */
function distinctLevels(board: Board, bank: BankModel, stepSets: readonly boolean[][]): Level[] {
  const levels: Level[] = bank.fixedLoad === null ? [] : [{ steps: stepSets[0]!.map(() => false), fixedOn: false, label: 'out of service', capacitorKvar: 0 }];
  const seen = new Set<string>();
  for (const steps of stepSets) {
    const key = stateKey(board, bank, steps);
    if (seen.has(key)) continue;
    seen.add(key);
    levels.push(levelOf(board, bank, steps));
  }
  return levels;
}

/** The distinct levels a controller steps a bank through in the written order, lowest first (out of service first where it has a fixed part). */
export function controllerLevels(board: Board, bank: BankModel): Level[] {
  assertBoardModel(board);
  const n = bank.stepLoads.length;
  return distinctLevels(board, bank, Array.from({ length: n + 1 }, (_, on) => Array.from({ length: n }, (_, k) => k < on)));
}

/**
 * Every distinct state of a bank's parts, whatever order its steps are switched in, least
 * capacitance first (out of service first, then off or the fixed part alone; ties in the
 * order stepCombinations gives). The first is everything off, the last everything on.
 */
export function switchingLevels(board: Board, bank: BankModel): Level[] {
  assertBoardModel(board);
  return distinctLevels(board, bank, stepCombinations(bank.stepLoads.length))
    .map((level, k) => ({ level, k }))
    .sort((a, b) => a.level.capacitorKvar - b.level.capacitorKvar || a.k - b.k)
    .map(({ level }) => level);
}

export interface JointScanOptions {
  /** Orders to scan (the scan's grid, so the states with every other bank on are the scan's own). */
  readonly grid: readonly number[];
  readonly checkedOrders: readonly number[];
  /** Most networks scanned per bank before the other banks are taken at their extremes. @defaultValue HARMONICS_DEFAULTS.jointStateLimit */
  readonly stateLimit?: number;
  /**
   * The scan of this board on the same evaluator and grid (scanResonance): its peaks are those of the
   * states with every other bank fully on, which it has evaluated already, so they are taken from it.
   */
  readonly scan?: ResonanceScan;
}

/** Every network state of a joint scan: per bank of the evaluator, its state. */
export type NetworkState = readonly BankState[];

/**
 * The curves and refined peaks of each network state, in chunks so the matrices of one order
 * serve many states while memory stays bounded. `values[i·pairs + k]`: |Z| of pair k at grid point i.
 */
export function scanNetworkStates(evaluator: ScanEvaluator, grid: readonly number[], states: readonly NetworkState[], each: (state: number, values: Float64Array, peaks: ScanPeak[]) => void): void {
  checkObjectArgument(evaluator, 'evaluator', 'a scan evaluator from createInstallationScanEvaluator(...)', ['pairs']);
  checkListArgument(grid, 'grid', 'the orders to scan, a list of numbers', (x) => typeof x === 'number');
  checkListArgument(states, 'states', 'a list of network states');
  if (typeof each !== 'function') throw argumentIssueError('each', 'a function called with each state\'s values and peaks', each);
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

/** The other banks' states to scan, the levels they come from and how they were chosen, within the limit where it can be. */
function otherStates(
  every: readonly (readonly Level[])[],
  ordered: readonly (readonly Level[])[],
  ownStates: number,
  limit: number,
): { states: Level[][]; levels: readonly (readonly Level[])[]; coverage: JointScan['coverage'] } {
  const count = (lists: readonly (readonly Level[])[]) => lists.reduce((n, l) => n * l.length, ownStates);
  if (count(every) <= limit) return { states: product(every), levels: every, coverage: 'every step combination' };
  if (count(ordered) <= limit) return { states: product(ordered), levels: ordered, coverage: 'controller levels' };
  const extremes = ordered.map((l) => [l[0]!, l.at(-1)!]);
  if (count(extremes) <= limit) return { states: product(extremes), levels: extremes, coverage: 'each off or fully on' };
  return { states: [ordered.map((l) => l[0]!), ordered.map((l) => l.at(-1)!)], levels: extremes, coverage: 'all off or all on together' };
}

/** The other banks' state in words: `Studios bank off; Plant bank steps 1+2`. */
const stateWords = (boards: readonly string[], levels: readonly Level[]) => levels.map((l, k) => bankStateWords(boards[k]!, l.label)).join('; ');

const nearness = (peak: ScanPeak, order: number) => Math.abs(peak.order - order) / order;

type Summary = Omit<JointScanCombination, 'steps' | 'label' | 'capacitorKvar'>;

/** One combination of this bank over the other banks' states: each state's peaks, the extremes, the nearest approaches. */
function summarise(scanned: readonly { readonly otherBanks: string; readonly peaks: readonly ScanPeak[] }[], checked: readonly number[]): Summary {
  const band = HARMONICS_DEFAULTS.resonanceBand;
  const peaks = scanned.flatMap(({ otherBanks, peaks: found }) => found.map((p): JointPeak => ({ ...p, otherBanks })));
  const first = <T>(list: readonly T[], better: (x: T, y: T) => boolean) => list.reduce<T | null>((best, x) => (best === null || better(x, best) ? x : best), null);
  const nearest = first(
    peaks.flatMap((p) => checked.map((o) => ({ ...p, checkedOrder: o }))),
    (x, y) => nearness(x, x.checkedOrder) < nearness(y, y.checkedOrder),
  );
  return {
    networkStates: scanned.length,
    states: scanned.map((x) => ({ otherBanks: x.otherBanks, peakOrders: [...new Set(x.peaks.map((p) => Math.round(p.order * 100) / 100))].sort((a, b) => a - b) })),
    lowestPeak: first(peaks, (x, y) => x.order < y.order),
    highestPeak: first(peaks, (x, y) => x.order > y.order),
    nearest,
    nearOrders: checked.flatMap((o) => {
      const peak = first(
        peaks.filter((p) => Math.abs(p.order - o) <= band * o),
        (x, y) => nearness(x, o) < nearness(y, o),
      );
      return peak ? [{ order: o, peak }] : [];
    }),
  };
}

/**
 * Scans the resonance seen from the evaluator's board for every combination of its bank's steps
 * with the other banks switched; null when the board has no bank or the installation no other bank.
 * @param fundamental the installation solved with every bank part on
 * @throws {InputError} for a `stateLimit` that is not a whole number ≥ 1
 */
export function scanJointResonance(fundamental: InstallationSolution, models: readonly HarmonicModel[], evaluator: ScanEvaluator, options: JointScanOptions): JointScan | null {
  checkObjectArgument(fundamental, 'fundamental', 'an installation solution at the fundamental (solveInstallationNetwork(installation))', ['installation', 'boards']);
  checkListArgument(models, 'models', "every board's harmonic model, main board first", (x) => typeof x === 'object' && x !== null);
  checkObjectArgument(evaluator, 'evaluator', 'a scan evaluator from createInstallationScanEvaluator(...)', ['ownBank', 'banks']);
  checkObjectArgument(options, 'options', 'the joint scan options ({} for the defaults)');
  const own = evaluator.ownBank;
  if (own < 0 || evaluator.banks.length < 2) return null;
  const limit = options.stateLimit ?? HARMONICS_DEFAULTS.jointStateLimit;
  if (!Number.isInteger(limit) || limit < 1) throw new InputError([inputIssue('out_of_range', 'jointStateLimit', 'a whole number of networks, at least 1', limit)]);
  const boardOf = (k: number) => fundamental.boards[evaluator.banks[k]!.board]!.board;
  const ownBoard = boardOf(own);
  const bank = models[evaluator.banks[own]!.board]!.bank!;
  const others = evaluator.banks.flatMap((_, k) => (k === own ? [] : [k]));
  const otherNames = others.map((k) => boardOf(k).name);
  const bankOf = (k: number) => models[evaluator.banks[k]!.board]!.bank!;
  const every = others.map((k) => switchingLevels(boardOf(k), bankOf(k)));
  const ordered = others.map((k) => controllerLevels(boardOf(k), bankOf(k)));

  // This bank's combinations, electrically identical ones once (as scanResonance).
  const combos = stepCombinations(bank.stepLoads.length);
  const keys = combos.map((steps) => stateKey(ownBoard, bank, steps));
  const firstOf = keys.map((k) => keys.indexOf(k));
  const distinct = combos.flatMap((_, c) => (firstOf[c] === c ? [c] : []));
  const { states: chosen, levels, coverage } = otherStates(every, ordered, distinct.length, limit);

  const states: NetworkState[] = distinct.flatMap((c) =>
    chosen.map((levelsOn) => {
      const state: BankState[] = new Array(evaluator.banks.length);
      state[own] = { steps: combos[c]!, fixedOn: true };
      others.forEach((k, j) => (state[k] = levelsOn[j]!));
      return state;
    }),
  );
  // Each state's peaks: the scan's where the other banks are all fully on (the same network, so the same
  // numbers), the others scanned here. The scan's grid is this one, and so are its evaluator's networks.
  const allOn = (levelsOn: readonly Level[]) => levelsOn.every((l) => l.fixedOn && l.steps.every(Boolean));
  const known = (s: number) => (options.scan && allOn(chosen[s % chosen.length]!) ? options.scan.combinations[distinct[Math.floor(s / chosen.length)]!]!.peaks : null);
  const peaksOf: (readonly ScanPeak[] | null)[] = states.map((_, s) => known(s));
  const toScan = states.flatMap((_, s) => (peaksOf[s] === null ? [s] : []));
  scanNetworkStates(evaluator, options.grid, toScan.map((s) => states[s]!), (t, _values, peaks) => (peaksOf[toScan[t]!] = peaks));
  // Per distinct combination, every state of the other banks with its peaks (states run combination by combination).
  const scanned = distinct.map(() => [] as { otherBanks: string; peaks: readonly ScanPeak[] }[]);
  states.forEach((_, s) => scanned[Math.floor(s / chosen.length)]!.push({ otherBanks: stateWords(otherNames, chosen[s % chosen.length]!), peaks: peaksOf[s]! }));
  const summaries = new Map(distinct.map((c, d) => [c, summarise(scanned[d]!, options.checkedOrders)]));
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
