/**
 * Frequency scan of the impedance seen from the board — each phase to the
 * neutral bar and each line pair — for every step combination of the bank,
 * with the parallel-resonance peaks found and refined, beside the classic
 * estimate h_r = √(S_sc/Q_c) [METHODS §5].
 *
 * Loads enter at the admittance of the solved fundamental (all steps on),
 * scaled to each order like the harmonic solve (networkAtOrder.ts); non-linear
 * loads are ideal current sources, so they are open circuits here. The bank's
 * parts are switched on the same nodal matrix: per order the rest of the board
 * is stamped once, then each combination adds its parts and inverts a matrix
 * of a few unknowns (network/terminalImpedance.ts).
 */
import { abs, add, inverse, type ComplexValue } from '../complex.js';
import type { Board, Terminal } from '../board/boardModel.js';
import type { NetworkSolution } from '../network/solveNetwork.js';
import { lineImpedanceOf, sourceImpedanceOf } from '../network/installationCircuit.js';
import {
  copyNodalMatrix,
  createNodalMatrix,
  impedanceBetween,
  invertNodalMatrix,
  planPassiveNetwork,
  stampAdmittance,
  stampConductors,
  type NodalMatrix,
  type PassiveNetworkPlan,
} from '../network/terminalImpedance.js';
import { HARMONICS_DEFAULTS } from './harmonicsDefaults.js';
import { stateKey, type BankModel, type HarmonicModel } from './harmonicModel.js';
import { branchAdmittanceAtOrder, impedanceAtOrder } from './networkAtOrder.js';
import type { ResonanceScan, ScanCombination, ScanPeak } from './harmonicsResult.js';

/** Terminal pairs the scan reads: phase to neutral where there is a neutral, then line pairs. */
export function scanPairs(board: Board): [Terminal, Terminal][] {
  const pairs: [Terminal, Terminal][] = board.hasNeutral ? board.phases.map((p): [Terminal, Terminal] => [p, 'N']) : [];
  if (board.phases.length === 3)
    pairs.push(
      ['A', 'B'],
      ['B', 'C'],
      ['C', 'A'],
    );
  else if (board.phases.length === 2) pairs.push(['A', 'B']);
  return pairs;
}

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

/** Short-circuit power at the board, VA; null on an ideal source. */
export function shortCircuitVA(board: Board): number | null {
  const z = abs(add(board.sourceImpedance, board.lineImpedance));
  return z === 0 ? null : (board.phases.length * board.nominalLineToNeutralV ** 2) / z;
}

/** Effective fundamental output of the bank parts that are on, at nominal voltage, kvar. */
export function bankKvarOn(board: Board, bank: BankModel, steps: readonly boolean[]): number {
  const parts = [...(bank.fixedLoad === null ? [] : [bank.fixedLoad]), ...bank.stepLoads.filter((_, k) => steps[k])];
  return parts.reduce((s, l) => s + board.loads[l]!.branches.reduce((t, b) => t - b.sNominal.im, 0), 0) / 1000;
}

/**
 * An evaluator of |Z| between terminal pairs at any order h, for any step
 * combination. Reuses its matrices: not re-entrant.
 */
export interface ScanEvaluator {
  readonly pairs: readonly [Terminal, Terminal][];
  /** Loads the board's non-bank part at order h; call before `impedances` for that h. */
  prepare(h: number): void;
  /** |Z| of each pair into `out[offset + pair]` for the prepared order and `steps`. */
  impedances(steps: readonly boolean[], out: Float64Array, offset: number): void;
}

export function createScanEvaluator(fundamental: NetworkSolution, model: HarmonicModel): ScanEvaluator {
  const board = fundamental.board;
  const plan: PassiveNetworkPlan = planPassiveNetwork(board);
  const pairs = scanPairs(board);
  const ends = pairs.map(([p, q]) => [plan.terminalIndex.get(p) ?? -1, plan.terminalIndex.get(q) ?? -1] as const);
  const bank = model.bank;
  const bankParts = new Set(bank ? [...(bank.fixedLoad === null ? [] : [bank.fixedLoad]), ...bank.stepLoads] : []);
  const base = createNodalMatrix(plan.size);
  const work = createNodalMatrix(plan.size);
  const inverseWork = createNodalMatrix(plan.size);
  const pairZ = new Float64Array(2);
  // Per bank part: its branches' ends and admittance at the prepared order.
  const partStamps = new Map<number, { p: number; q: number; y: ComplexValue }[]>();
  // Floating star points of the bank: tied to nothing while every part on them is off, so they
  // get a unit diagonal then (a decoupled node that changes no other impedance).
  const starNodesOf = (l: number) =>
    [...new Set(board.loads[l]!.branches.flatMap((b) => [b.from, b.to]).filter((t) => t.startsWith('star:')))].map((t) => plan.terminalIndex.get(t) ?? -1).filter((n) => n >= 0);
  const bankStarNodes = [...new Set([...bankParts].flatMap(starNodesOf))];
  const partsOnStar = new Map<number, number[]>(bankStarNodes.map((n) => [n, [...bankParts].filter((l) => starNodesOf(l).includes(n))]));

  // The non-bank branches as flat arrays, so that each order stamps them without allocating:
  // kind 0 = parallel G + jB, 1 = series R + jX, 2 = detuned step (a = B_C, b = p).
  const fixed = { from: [] as number[], to: [] as number[], kind: [] as number[], a: [] as number[], b: [] as number[] };
  board.loads.forEach((_, l) => {
    if (bankParts.has(l)) return;
    const behaviour = model.loads[l]!;
    if (behaviour.kind === 'non-linear') return;
    fundamental.branches[l]!.forEach((state, k) => {
      const e = plan.branchEnds[l]![k];
      const y = state.admittance;
      if (!e || (y.re === 0 && y.im === 0)) return;
      fixed.from.push(e[0]);
      fixed.to.push(e[1]);
      if (behaviour.kind === 'detuned') {
        fixed.kind.push(2);
        fixed.a.push(y.im * (1 - behaviour.p));
        fixed.b.push(behaviour.p);
      } else if (behaviour.form === 'parallel') {
        fixed.kind.push(0);
        fixed.a.push(y.re);
        fixed.b.push(y.im);
      } else {
        const z = inverse(y);
        fixed.kind.push(1);
        fixed.a.push(z.re);
        fixed.b.push(z.im);
      }
    });
  });
  const stampFixed = (m: NodalMatrix, h: number) => {
    for (let i = 0; i < fixed.kind.length; i++) {
      const a = fixed.a[i]!;
      const b = fixed.b[i]!;
      let g: number;
      let s: number;
      switch (fixed.kind[i]) {
        case 0:
          g = a;
          s = b < 0 ? b / h : b * h;
          break;
        case 1: {
          // Same scaling as branchAdmittanceAtOrder: X·h inductive, X/h capacitive, R constant.
          const x = b >= 0 ? b * h : b / h;
          const d = a * a + x * x;
          g = a / d;
          s = -x / d;
          break;
        }
        default:
          g = 0;
          s = (a * h) / (1 - h * h * b);
      }
      stampAdmittance(m, fixed.from[i]!, fixed.to[i]!, g, s);
    }
  };
  const stepOfPart = new Map<number, number>(bank ? bank.stepLoads.map((l, k) => [l, k]) : []);
  const parts = [...bankParts];

  return {
    pairs,
    prepare(h: number) {
      base.re.fill(0);
      base.im.fill(0);
      // Each line its own source and feeder impedance (they differ per phase on some boards).
      const lines = board.phases.map((_, k) => {
        const z = add(impedanceAtOrder(sourceImpedanceOf(board, k), h, model.resistance), impedanceAtOrder(lineImpedanceOf(board, k), h, model.resistance));
        return abs(z) === 0 ? null : inverse(z);
      });
      const neutral = impedanceAtOrder(board.neutralImpedance, h, model.resistance);
      stampConductors(plan, base, lines, board.neutralOpen || abs(neutral) === 0 ? null : inverse(neutral));
      stampFixed(base, h);
      for (const l of bankParts) {
        const behaviour = model.loads[l]!;
        partStamps.set(
          l,
          fundamental.branches[l]!.flatMap((state, k) => {
            const e = plan.branchEnds[l]![k];
            return e ? [{ p: e[0], q: e[1], y: branchAdmittanceAtOrder(state.admittance, behaviour, h) }] : [];
          }),
        );
      }
    },
    impedances(steps, out, offset) {
      copyNodalMatrix(base, work);
      const isOn = (l: number) => {
        const step = stepOfPart.get(l);
        return step === undefined || steps[step] === true;
      };
      for (let k = 0; k < parts.length; k++) {
        const l = parts[k]!;
        if (isOn(l)) for (const s of partStamps.get(l)!) stampAdmittance(work, s.p, s.q, s.y.re, s.y.im);
      }
      for (const n of bankStarNodes) if (!partsOnStar.get(n)!.some(isOn)) stampAdmittance(work, n, -1, 1, 0);
      if (plan.size > 0) invertNodalMatrix(work, inverseWork);
      for (let k = 0; k < ends.length; k++) {
        if (plan.size === 0) pairZ.fill(0);
        else impedanceBetween(work, ends[k]![0], ends[k]![1], pairZ, 0);
        // Math.hypot is several times slower than this in V8, and |Z| never nears overflow.
        out[offset + k] = Math.sqrt(pairZ[0]! * pairZ[0]! + pairZ[1]! * pairZ[1]!);
      }
    },
  };
}

/**
 * Nudges an order off the exact series resonance of a lossless detuned branch,
 * where its admittance is infinite (the scan's value there is the limit from
 * one side; real reactors have resistance).
 */
function safeOrder(h: number, model: HarmonicModel): number {
  for (const load of model.loads) if (load.kind === 'detuned' && Math.abs(1 - h * h * load.p) < 1e-9) return h * (1 + 1e-7);
  return h;
}

/**
 * Rounds a curve for plotting to 1e-6 of its largest value (one multiply and
 * round per point: over a million points toPrecision would take longer than the scan).
 */
function roundForPlot(curve: Float64Array | readonly number[]): number[] {
  let largest = 0;
  for (const z of curve) if (z > largest) largest = z;
  if (!(largest > 0)) return Array.from(curve);
  const step = 10 ** (Math.floor(Math.log10(largest)) - 6);
  return Array.from(curve, (z) => Math.round(z / step) * step);
}

/** The scan grid: 1, 1 + step, …, up to maxOrder. */
export function scanGrid(maxOrder: number, step: number): number[] {
  const count = Math.floor((maxOrder - 1) / step + 1e-9) + 1;
  return Array.from({ length: count }, (_, k) => Math.round((1 + k * step) * 1e9) / 1e9);
}

/**
 * Refines a peak of |Z| bracketed by grid points a < m < b (f(m) the largest).
 * Near a parallel resonance 1/|Z|² is close to a parabola in h, so successive
 * parabolic interpolation on it converges in a few evaluations; a step that
 * leaves the bracket falls back to bisecting the larger side.
 */
function refineMaximum(f: (h: number) => number, a: number, m: number, b: number, fm: number): { h: number; value: number } {
  const g = (z: number) => 1 / (z * z);
  let fa = g(f(a));
  let fb = g(f(b));
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
export function scanResonance(fundamental: NetworkSolution, model: HarmonicModel, options: ScanOptions): ResonanceScan {
  const board = fundamental.board;
  const grid = options.grid ?? scanGrid(model.scan.maxOrder, model.scan.step);
  const evaluator = createScanEvaluator(fundamental, model);
  const bank = model.bank;
  const combos = stepCombinations(bank ? bank.stepLoads.length : 0);
  const nPairs = evaluator.pairs.length;
  // Combinations that switch electrically identical parts are one network: evaluate it once.
  const keys = combos.map((steps) => (bank ? stateKey(board, bank, steps) : ''));
  const firstOf = keys.map((k) => keys.indexOf(k));
  const distinct = combos.flatMap((_, c) => (firstOf[c] === c ? [c] : []));
  const values = combos.map(() => new Float64Array(grid.length * nPairs));
  grid.forEach((h0, i) => {
    evaluator.prepare(safeOrder(h0, model));
    for (const c of distinct) evaluator.impedances(combos[c]!, values[c]!, i * nPairs);
  });
  combos.forEach((_, c) => {
    if (firstOf[c] !== c) values[c] = values[firstOf[c]!]!;
  });
  const ssc = shortCircuitVA(board);
  const band = HARMONICS_DEFAULTS.resonanceBand;
  const out = new Float64Array(nPairs);
  const shared = new Map<number, Pick<ScanCombination, 'impedanceOhm' | 'peaks'>>();
  const combinations = combos.map((steps, c): ScanCombination => {
    const kvar = bank ? bankKvarOn(board, bank, steps) : 0;
    const label = combinationLabel(bank, steps);
    const formulaOrder = ssc !== null && kvar > 0 && (bank?.detuning ?? 0) === 0 ? Math.sqrt(ssc / (kvar * 1000)) : null;
    const same = shared.get(firstOf[c]!);
    if (same) {
      const nearOrders = options.checkedOrders.filter((o) => same.peaks.some((pk) => Math.abs(pk.order - o) <= band * o));
      return { steps, label, capacitorKvar: kvar, formulaOrder, impedanceOhm: same.impedanceOhm, peaks: same.peaks, nearOrders };
    }
    const curves = evaluator.pairs.map((_, k) => {
      const curve = new Float64Array(grid.length);
      for (let i = 0; i < grid.length; i++) curve[i] = values[c]![i * nPairs + k]!;
      return curve;
    });
    // The curves are for plotting, so rounded (peaks are found and refined on the exact values).
    const plotted = curves.map(roundForPlot);
    const peaks: ScanPeak[] = [];
    curves.forEach((curve, k) => {
      for (const i of peakIndices(curve, HARMONICS_DEFAULTS.peakProminence)) {
        const at = (h: number) => {
          evaluator.prepare(safeOrder(h, model));
          evaluator.impedances(steps, out, 0);
          return out[k]!;
        };
        const refined = refineMaximum(at, grid[i - 1]!, grid[i]!, grid[i + 1]!, curve[i]!);
        const [p, q] = evaluator.pairs[k]!;
        peaks.push({ pair: `${p}-${q}`, order: refined.h, impedanceOhm: refined.value });
      }
    });
    shared.set(c, { impedanceOhm: plotted, peaks });
    const nearOrders = options.checkedOrders.filter((o) => peaks.some((pk) => Math.abs(pk.order - o) <= band * o));
    return { steps, label, capacitorKvar: kvar, formulaOrder, impedanceOhm: plotted, peaks, nearOrders };
  });
  return {
    orders: grid,
    pairs: evaluator.pairs.map(([p, q]) => `${p}-${q}`),
    shortCircuitKVA: ssc === null ? null : ssc / 1000,
    checkedOrders: options.checkedOrders,
    checkedOrdersFrom: options.checkedOrdersFrom,
    combinations,
    basis: 'linear loads at their solved fundamental admittance (every bank step on), scaled to each order; non-linear loads as ideal current sources (open circuits); supply EMFs shorted',
  };
}
