/**
 * |Z| between terminal pairs of one board at any order h, for any state of
 * every bank in the installation, with every EMF shorted: the network "looking
 * in" from the board. The network is the installation's compiled circuit — the
 * one every solve uses — so the source windings, the service feeder, a source
 * star-point impedance or open-delta corner where the file gives one, every
 * feeder on the way to the board and every other board's loads are all in it,
 * each scaled to order h like the harmonic solve (networkAtOrder.ts). A single
 * board is the installation with one board.
 *
 * Per order the elements and the loads outside the banks are stamped once;
 * each state then adds the bank parts that are on — this board's bank and any
 * other board's — and inverts the nodal matrix (network/terminalImpedance.ts:
 * flat typed arrays, no allocation in the loop), or on a network larger than a
 * board factorises it sparse (network/sparseTerminalImpedance.ts).
 */
import { inverse, type ComplexValue } from '../complex.js';
import type { Board, Terminal } from '../board/boardModel.js';
import { REFERENCE } from '../network/circuit.js';
import { compileInstallation, type InstallationSolution } from '../network/solveNetwork.js';
import { copyNodalMatrix, createNodalMatrix, impedanceBetween, invertNodalMatrix, stampAdmittance, type NodalMatrix } from '../network/terminalImpedance.js';
import { SparseTerminalImpedance } from '../network/sparseTerminalImpedance.js';
import type { HarmonicModel, LoadBehaviour } from './harmonicModel.js';
import { branchAdmittanceAtOrderInto } from './networkAtOrder.js';
import { checkListArgument, checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** A bank the evaluator switches: the board it is on and its parts. */
export interface ScanBank {
  /** Board number in the installation (0 = main board). */
  readonly board: number;
  readonly stepCount: number;
  readonly hasFixedPart: boolean;
}

/** One bank's state in a scanned network. */
export interface BankState {
  /** Which steps are on, in step order. */
  readonly steps: readonly boolean[];
  /** Whether its fixed part is on: false only for a bank out of service. */
  readonly fixedOn: boolean;
}

/**
 * An evaluator of |Z| between terminal pairs at any order h, for any state of
 * the banks. Reuses its matrices: not re-entrant.
 */
export interface ScanEvaluator {
  readonly pairs: readonly [Terminal, Terminal][];
  /** Every bank of the installation, in board order. */
  readonly banks: readonly ScanBank[];
  /** Index in `banks` of the scanned board's own bank; -1 when it has none. */
  readonly ownBank: number;
  /** Loads the network without the banks at order h; call before `impedances` for that h. */
  prepare(h: number): void;
  /** |Z| of each pair into `out[offset + pair]` for the prepared order, the board's own bank at `steps` and every other bank fully on. */
  impedances(steps: readonly boolean[], out: Float64Array, offset: number): void;
  /** As `impedances`, with every bank as `states` has it (one per `banks`). */
  impedancesIn(states: readonly BankState[], out: Float64Array, offset: number): void;
}

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

/** Flat lists of two-terminal parts, so each order stamps them without allocating. */
interface Parts {
  from: number[];
  to: number[];
  /** 0 = parallel G + jB, 1 = series R + jX, 2 = detuned step (a = B_C, b = p), 3 = conductor R + jX (resistance rule). */
  kind: number[];
  a: number[];
  b: number[];
}

const emptyParts = (): Parts => ({ from: [], to: [], kind: [], a: [], b: [] });

/** Numbers the unknowns with the EMFs shorted: a node an ideal EMF holds sits on the EMF's other end. */
function numberUnknowns(circuit: ReturnType<typeof compileInstallation>['network']['circuit'], live: Uint8Array): Int32Array {
  const index = new Int32Array(circuit.nodeNames.length).fill(-1);
  const held = new Map<number, number>();
  for (const s of circuit.sources) if (!s.admittance) held.set(s.plus, s.minus);
  let size = 0;
  live.forEach((ok, node) => {
    if (ok && !held.has(node)) index[node] = size++;
  });
  // Ideal sources are listed after the one their minus hangs from (see circuit.ts).
  for (const s of circuit.sources) if (!s.admittance) index[s.plus] = s.minus === REFERENCE ? -1 : index[s.minus]!;
  return index;
}

export interface ScanEvaluatorOptions {
  /**
   * How the network is solved at each order and state: `auto` (default) factorises a sparse
   * matrix above 8 unknowns (a board behind a supply impedance, an installation) and inverts the dense
   * one below; `dense` and `sparse` force one (`sparse` still hands a state whose pivot or
   * residual it cannot trust to the dense pivoted inverse). The two agree to round-off; the
   * choice is for tests and benchmarks.
   */
  readonly factorisation?: 'auto' | 'dense' | 'sparse';
}

/**
 * The evaluator for board `boardIndex` of a solved installation (0 = main board).
 * @param fundamental the installation solved at the fundamental with every bank part on
 * @param models one per board: how its loads behave at harmonic orders; every board's bank is switchable
 */
export function createInstallationScanEvaluator(
  fundamental: InstallationSolution,
  models: readonly HarmonicModel[],
  boardIndex: number,
  options: ScanEvaluatorOptions = {},
): ScanEvaluator {
  checkObjectArgument(fundamental, 'fundamental', 'an installation solution at the fundamental (solveInstallationNetwork(installation))', ['installation', 'boards']);
  checkListArgument(models, 'models', "every board's harmonic model, main board first", (x) => typeof x === 'object' && x !== null);
  checkNumberArgument(boardIndex, 'boardIndex', 'the index of a board of the installation (0 = the main board)', (x) => Number.isInteger(x) && x >= 0);
  const { layout, network } = compileInstallation(fundamental.installation);
  const circuit = network.circuit;
  const unknown = numberUnknowns(circuit, network.live);
  const at = (node: number) => (node === REFERENCE ? -1 : unknown[node]!);
  const alive = (node: number) => node === REFERENCE || network.live[node] === 1;
  const size = Math.max(-1, ...unknown) + 1;
  const resistance = models[0]!.resistance;
  const board = fundamental.boards[boardIndex]!.board;
  const terminals = layout.topologies[boardIndex]!.terminalNode;
  const pairs = scanPairs(board);
  const ends = pairs.map(([p, q]) => [terminals.has(p) ? at(terminals.get(p)!) : -1, terminals.has(q) ? at(terminals.get(q)!) : -1] as const);

  // Conductors and source windings (EMFs shorted): their impedance at the fundamental, scaled per order.
  const fixed = emptyParts();
  const push = (into: Parts, from: number, to: number, kind: number, a: number, b: number) => {
    into.from.push(from);
    into.to.push(to);
    into.kind.push(kind);
    into.a.push(a);
    into.b.push(b);
  };
  for (const e of circuit.elements) {
    if (!alive(e.from) || !alive(e.to)) continue;
    const z = inverse(e.admittance);
    push(fixed, at(e.from), at(e.to), 3, z.re, z.im);
  }
  for (const s of circuit.sources) {
    if (!s.admittance) continue;
    const z = inverse(s.admittance);
    push(fixed, at(s.plus), at(s.minus), 3, z.re, z.im);
  }
  // Loads: linear ones at their solved admittance, non-linear ones open; every bank's parts apart.
  const banks: ScanBank[] = [];
  /** Per switchable part: its board, its load, its bank (index in `banks`) and its step (-1: the fixed part). */
  const parts: { board: number; load: number; bank: number; step: number }[] = [];
  models.forEach((m, b) => {
    const bank = m.bank;
    if (!bank) return;
    const k = banks.push({ board: b, stepCount: bank.stepLoads.length, hasFixedPart: bank.fixedLoad !== null }) - 1;
    if (bank.fixedLoad !== null) parts.push({ board: b, load: bank.fixedLoad, bank: k, step: -1 });
    bank.stepLoads.forEach((load, step) => parts.push({ board: b, load, bank: k, step }));
  });
  const ownBank = banks.findIndex((x) => x.board === boardIndex);
  const isBankPart = (b: number, l: number) => parts.some((p) => p.board === b && p.load === l);
  const detuningFactors = new Set<number>();
  fundamental.boards.forEach((solution, b) => {
    let k = layout.branchOffset[b]!;
    solution.board.loads.forEach((load, l) => {
      const behaviour = models[b]!.loads[l]!;
      if (behaviour.kind === 'detuned') detuningFactors.add(behaviour.p);
      const banked = isBankPart(b, l);
      load.branches.forEach((_, i) => {
        const cb = circuit.branches[k++]!;
        const y = solution.branches[l]![i]!.admittance;
        if (banked || behaviour.kind === 'non-linear') return;
        if (!alive(cb.from) || !alive(cb.to) || (y.re === 0 && y.im === 0)) return;
        if (behaviour.kind === 'detuned') push(fixed, at(cb.from), at(cb.to), 2, y.im * (1 - behaviour.p), behaviour.p);
        else if (behaviour.form === 'parallel') push(fixed, at(cb.from), at(cb.to), 0, y.re, y.im);
        else {
          const z = inverse(y);
          push(fixed, at(cb.from), at(cb.to), 1, z.re, z.im);
        }
      });
    });
  });
  /** Each conductor, winding and linear load outside the banks at order h, as g + jb into `add(index, g, b)`. */
  const stampFixed = (h: number, add: (i: number, g: number, b: number) => void) => {
    const rootH = Math.sqrt(h);
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
        case 1:
        case 3: {
          // As impedanceAtOrder: X·h inductive, X/h capacitive; a conductor's R constant or × √h.
          const r = fixed.kind[i] === 3 && resistance === 'skin-effect' ? a * rootH : a;
          const x = b >= 0 ? b * h : b / h;
          const d = r * r + x * x;
          g = r / d;
          s = -x / d;
          break;
        }
        default:
          g = 0;
          s = (a * h) / (1 - h * h * b);
      }
      add(i, g, s);
    }
  };

  // Each part's branches as flat stamps (part, ends, fundamental admittance); the admittance at order h is set per order.
  const stamps: { part: number; p: number; q: number; y1: ComplexValue; behaviour: LoadBehaviour }[] = [];
  parts.forEach(({ board: b, load: l }, part) => {
    const solution = fundamental.boards[b]!;
    const first = layout.branchOffset[b]! + solution.board.loads.slice(0, l).reduce((n, x) => n + x.branches.length, 0);
    solution.board.loads[l]!.branches.forEach((_, i) => {
      const cb = circuit.branches[first + i]!;
      if (alive(cb.from) && alive(cb.to)) stamps.push({ part, p: at(cb.from), q: at(cb.to), y1: solution.branches[l]![i]!.admittance, behaviour: models[b]!.loads[l]! });
    });
  });
  const stampPart = Int32Array.from(stamps, (x) => x.part);
  const stampP = Int32Array.from(stamps, (x) => x.p);
  const stampQ = Int32Array.from(stamps, (x) => x.q);
  /** Each stamp's admittance at the prepared order: g at 2k, b at 2k + 1. */
  const stampY = new Float64Array(2 * stamps.length);
  // Floating star points of the banks are tied to nothing while every part on them is off, so they get a unit diagonal then.
  const starNodesOf = (b: number, l: number) => {
    const terminalsOf = layout.topologies[b]!.terminalNode;
    const names = fundamental.boards[b]!.board.loads[l]!.branches.flatMap((x) => [x.from, x.to]).filter((t) => t.startsWith('star:'));
    return [...new Set(names)].map((t) => at(terminalsOf.get(t) ?? REFERENCE)).filter((n) => n >= 0);
  };
  const starParts = new Map<number, number[]>();
  parts.forEach(({ board: b, load: l }, part) => {
    for (const n of starNodesOf(b, l)) starParts.set(n, [...(starParts.get(n) ?? []), part]);
  });
  const starNode = Int32Array.from(starParts.keys());
  const starPart = Int32Array.from([...starParts.values()].flat());
  const starStart = new Int32Array(starNode.length + 1);
  [...starParts.values()].forEach((list, k) => (starStart[k + 1] = starStart[k]! + list.length));
  const partOn = new Uint8Array(parts.length);

  // Large networks (installations) factorise a sparse matrix; small ones (a board) invert the dense
  // one, which is also every large network's fallback (sparseTerminalImpedance.ts). Dense matrices
  // are made when first needed: three of them for 1,200 unknowns would take 69 MB.
  let dense: { base: NodalMatrix; work: NodalMatrix; inverseWork: NodalMatrix; h: number } | null = null;
  let order = Number.NaN;
  const denseMatrices = () => {
    dense ??= { base: createNodalMatrix(size), work: createNodalMatrix(size), inverseWork: createNodalMatrix(size), h: Number.NaN };
    if (dense.h !== order) {
      const base = dense.base;
      base.re.fill(0);
      base.im.fill(0);
      stampFixed(order, (i, g, b) => stampAdmittance(base, fixed.from[i]!, fixed.to[i]!, g, b));
      dense.h = order;
    }
    return dense;
  };
  const useSparse = options.factorisation === 'sparse' ? size > 0 : options.factorisation !== 'dense' && size > SPARSE_FROM_UNKNOWNS;
  const sparse = useSparse ? new SparseTerminalImpedance(size, sparsePairs(fixed, stamps, starParts.keys()), ends.flat()) : null;
  const slotsOf = (from: readonly number[], to: readonly number[]) => {
    const slots = new Int32Array(4 * from.length);
    if (sparse) from.forEach((p, i) => slots.set(sparse.slotsOf(p, to[i]!), 4 * i));
    return slots;
  };
  const fixedSlots = slotsOf(fixed.from, fixed.to);
  const stampSlots = slotsOf([...stampP], [...stampQ]);
  const starSlots = slotsOf([...starNode], [...starNode].map(() => -1));
  const zRe = new Float64Array(ends.length);
  const zIm = new Float64Array(ends.length);
  const tiedStar = (k: number) => {
    for (let j = starStart[k]!; j < starStart[k + 1]!; j++) if (partOn[starPart[j]!] === 1) return true;
    return false;
  };
  /** Z of every pair into zRe/zIm through the sparse factorisation; false when it hands over to the dense inverse. */
  const evaluateSparse = (): boolean => {
    if (!sparse) return false;
    sparse.beginState();
    for (let k = 0; k < stampPart.length; k++) if (partOn[stampPart[k]!] === 1) sparse.stamp(stampSlots, 4 * k, stampY[2 * k]!, stampY[2 * k + 1]!);
    for (let k = 0; k < starNode.length; k++) if (!tiedStar(k)) sparse.stamp(starSlots, 4 * k, 1, 0);
    return sparse.evaluate(ends, zRe, zIm);
  };
  const pairZ = new Float64Array(2);
  /** |Z| of every pair with the parts `partOn` marks. */
  const evaluate = (out: Float64Array, offset: number) => {
    if (evaluateSparse()) {
      for (let k = 0; k < ends.length; k++) out[offset + k] = Math.sqrt(zRe[k]! * zRe[k]! + zIm[k]! * zIm[k]!);
      return;
    }
    const { base, work, inverseWork } = denseMatrices();
    copyNodalMatrix(base, work);
    for (let k = 0; k < stampPart.length; k++) if (partOn[stampPart[k]!] === 1) stampAdmittance(work, stampP[k]!, stampQ[k]!, stampY[2 * k]!, stampY[2 * k + 1]!);
    for (let k = 0; k < starNode.length; k++) if (!tiedStar(k)) stampAdmittance(work, starNode[k]!, -1, 1, 0);
    if (size > 0) invertNodalMatrix(work, inverseWork);
    for (let k = 0; k < ends.length; k++) {
      if (size === 0) pairZ.fill(0);
      else impedanceBetween(work, ends[k]![0], ends[k]![1], pairZ, 0);
      // Math.hypot is several times slower than this in V8, and |Z| never nears overflow.
      out[offset + k] = Math.sqrt(pairZ[0]! * pairZ[0]! + pairZ[1]! * pairZ[1]!);
    }
  };
  return {
    pairs,
    banks,
    ownBank,
    prepare(h0: number) {
      // Off the exact series resonance of a lossless detuned branch, where its admittance is infinite.
      let h = h0;
      for (const p of detuningFactors) if (Math.abs(1 - h0 * h0 * p) < 1e-9) h = h0 * (1 + 1e-7);
      order = h;
      if (sparse) {
        sparse.clearBase();
        stampFixed(h, (i, g, b) => sparse.stampBase(fixedSlots, 4 * i, g, b));
      } else denseMatrices();
      for (let k = 0; k < stamps.length; k++) branchAdmittanceAtOrderInto(stamps[k]!.y1, stamps[k]!.behaviour, h, stampY, 2 * k);
    },
    impedances(steps, out, offset) {
      for (let k = 0; k < parts.length; k++) {
        const part = parts[k]!;
        partOn[k] = part.bank !== ownBank || part.step < 0 || steps[part.step] === true ? 1 : 0;
      }
      evaluate(out, offset);
    },
    impedancesIn(states, out, offset) {
      for (let k = 0; k < parts.length; k++) {
        const part = parts[k]!;
        const state = states[part.bank]!;
        partOn[k] = (part.step < 0 ? state.fixedOn : state.steps[part.step] === true) ? 1 : 0;
      }
      evaluate(out, offset);
    },
  };
}

/**
 * Unknowns above which the scan factorises a sparse matrix, which solves only for the terminals it
 * reads where the dense route inverts the whole matrix. Measured 4 December 2026: ferrybank-joinery's
 * installation (12 unknowns, scanned some 10^5 times by a correction with harmonic data) 3.5 → 2.8 s
 * for `trivar correct --board "Machine shop"`, harrow-yard-studios (16) about 3 % quicker, every
 * report of the shipped harmonic examples unchanged to the byte (peak orders in --json within 1e-8).
 * An ideal-source board (4 unknowns) keeps the dense inverse.
 */
const SPARSE_FROM_UNKNOWNS = 8;

/** Every (p, q) the sparse matrix takes a stamp at: conductors, loads, bank parts and the floating star points' unit ties. */
function* sparsePairs(fixed: Parts, stamps: readonly { p: number; q: number }[], stars: Iterable<number>): Iterable<readonly [number, number]> {
  for (let i = 0; i < fixed.from.length; i++) yield [fixed.from[i]!, fixed.to[i]!];
  for (const x of stamps) yield [x.p, x.q];
  for (const n of stars) yield [n, -1];
}

/** The evaluator of a single board (the installation with one board). */
export function createBoardScanEvaluator(fundamental: InstallationSolution['boards'][number], model: HarmonicModel): ScanEvaluator {
  const { installation: _place, ...board } = fundamental.board;
  return createInstallationScanEvaluator({ installation: { name: board.name, main: board, subBoards: [] }, boards: [{ ...fundamental, board }] }, [model], 0);
}
