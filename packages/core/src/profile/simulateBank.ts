/**
 * An automatic bank over the profile. Each interval's load is taken as steady
 * through the interval; the controller reads the board solved with the steps
 * connected and switches when its delay has run and a step's discharge allows,
 * the board solved again after each move, so on data coarser than the delay it
 * settles within the interval (up to interval ÷ delay moves) as a real one
 * would. The interval is shown with the steps in service for most of it. Steps are constant-impedance capacitors (output ∝ V², so the
 * voltage they raise is in the solve): three-phase steps as a star to the
 * neutral on a board with one, else as a delta; single-phase steps phase to neutral
 * or across two lines.
 */
import type { Board, PhaseId, Terminal } from '../board/boardModel.js';
import { compileBatchNetwork, edgeIndex, edgePowersAt, type BatchEdge, type DriverColumns, type DriverSpec } from './batchNetwork.js';
import { allocateFigures, createBatchKernel, recordInterval, type BatchSolveOptions, type IntervalFigures } from './solveBatch.js';
import { createBankController, isLinePair, type ChannelReading, type SwitchingSettings, type SwitchedStep, type StepChannel } from './bankController.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';
import { assertBoardModel } from '../board/modelGuards.js';

export interface BankRun {
  readonly figures: IntervalFigures;
  /** What the controller read, where that is not the bank's board (SwitchBankInput.meter). */
  readonly meterFigures?: IntervalFigures;
  /** Connected switched kvar (nominal) during each interval; the fixed part comes on top. */
  readonly connectedKvar: Float64Array;
  /** Per step (in the order given), 1 in each interval it is shown connected (the state held for most of it). */
  readonly stepOn: readonly Uint8Array[];
  readonly closings: readonly number[];
  readonly openings: readonly number[];
  readonly path: 'closed-form' | 'nodal';
}

/** Each phase's column in the figures (IntervalFigures keep the board's phases in order). */
export const phaseIndexOf = (phases: readonly PhaseId[]): ReadonlyMap<PhaseId, number> => new Map(phases.map((p, k) => [p, k]));

/**
 * What a channel's controller reads in interval i of `figures`: the total over the bank's board's phases
 * (`phaseIndex`) for a three-phase step,
 * the two lines' sum for a step across them (its output is shared by those two lines), else its phase.
 */
export function channelReadingAt(figures: IntervalFigures, phaseIndex: ReadonlyMap<PhaseId, number>, channel: StepChannel, i: number): ChannelReading {
  if (channel === 'ABC') {
    let w = 0;
    let q = 0;
    for (let k = 0; k < phaseIndex.size; k++) {
      w += figures.phaseW[k]![i]!;
      q += figures.phaseVar[k]![i]!;
    }
    return { w, var: q };
  }
  if (isLinePair(channel)) {
    const a = phaseIndex.get(channel[0] as PhaseId)!;
    const b = phaseIndex.get(channel[2] as PhaseId)!;
    return { w: figures.phaseW[a]![i]! + figures.phaseW[b]![i]!, var: figures.phaseVar[a]![i]! + figures.phaseVar[b]![i]! };
  }
  const k = phaseIndex.get(channel)!;
  return { w: figures.phaseW[k]![i]!, var: figures.phaseVar[k]![i]! };
}

/** Edges (and share of the step's kvar on each) a step occupies on this board. */
export function stepEdges(board: Board, channel: StepChannel): { edge: BatchEdge; share: number }[] {
  const ln = board.nominalLineToNeutralV;
  const ll = board.nominalLineToLineV ?? ln;
  if (isLinePair(channel)) {
    const [from, to] = channel.split('-') as [Terminal, Terminal];
    return [{ edge: { from, to, vNominal: ll }, share: 1 }];
  }
  if (channel !== 'ABC') return [{ edge: { from: channel, to: 'N', vNominal: ln }, share: 1 }];
  if (board.hasNeutral) return board.phases.map((p) => ({ edge: { from: p, to: 'N' as Terminal, vNominal: ln }, share: 1 / board.phases.length }));
  return [
    ['A', 'B'],
    ['B', 'C'],
    ['C', 'A'],
  ].map(([from, to]) => ({ edge: { from: from as Terminal, to: to as Terminal, vNominal: ll }, share: 1 / 3 }));
}

export interface SimulateBankInput {
  readonly board: Board;
  readonly drivers: readonly DriverSpec[];
  readonly columns: DriverColumns;
  readonly utcMs: Float64Array;
  readonly intervalMs: number;
  readonly steps: readonly SwitchedStep[];
  /** Always-connected parts (a bank's fixed part), by channel; the controller reads the board with them in. */
  readonly fixed?: readonly SwitchedStep[];
  readonly settings: SwitchingSettings;
  readonly solve?: BatchSolveOptions;
}

/** What the switching loop needs of a solver: edge slots for the steps, each interval's load powers, a solve that records. */
export interface BankSolver {
  readonly edgeCount: number;
  readonly path: 'closed-form' | 'nodal';
  /** Index of the edge a step part sits on (it was among the extra edges the solver was prepared with). */
  edgeIndex(edge: BatchEdge): number;
  /** Writes interval i's load powers ([edge][part][re, im]). */
  powersAt(i: number, out: Float64Array): void;
  /** Solves interval i with these powers and records its figures (the controlled board's into `figures`). */
  solve(powers: Float64Array, i: number): void;
}

export interface SwitchBankInput {
  /** The board the bank is on and the controller measures (its incomer). */
  readonly board: Board;
  /** The controlled board's per-interval figures, which `solve` fills. */
  readonly figures: IntervalFigures;
  /**
   * Figures `solve` fills at the point the controller measures, when that is not the bank's board's incomer
   * (a target measured upstream, `measuredAt`). @defaultValue `figures`
   */
  readonly meter?: IntervalFigures;
  readonly utcMs: Float64Array;
  readonly intervalMs: number;
  readonly steps: readonly SwitchedStep[];
  readonly fixed?: readonly SwitchedStep[];
  readonly settings: SwitchingSettings;
}

export function simulateBank(input: SimulateBankInput): BankRun {
  checkObjectArgument(input, 'input', 'a bank simulation input { board, drivers, columns, ... }', ['board', 'drivers', 'columns']);
  assertBoardModel(input.board, 'input.board');
  const { board } = input;
  const figures = allocateFigures(input.columns.count, board.phases.length);
  return switchBank({ ...input, figures }, (extra) => {
    const net = compileBatchNetwork(board, input.drivers, extra);
    const kernel = createBatchKernel(net, input.solve);
    return {
      edgeCount: net.edges.length,
      path: kernel.path,
      edgeIndex: (edge) => edgeIndex(net, edge.from, edge.to, edge.vNominal),
      powersAt: (i, out) => edgePowersAt(net, input.columns, i, out),
      solve: (powers, i) => {
        kernel.solve(powers, i);
        recordInterval(kernel.state, board.sequence, figures, i);
      },
    };
  });
}

/**
 * The switching loop on any solver: each interval solved with the steps connected, the controller
 * reading the board's figures and switching within the interval as its delay allows (see the file's head).
 * @param prepare the solver, given the edges the steps need
 */
export function switchBank(input: SwitchBankInput, prepare: (extraEdges: BatchEdge[]) => BankSolver): BankRun {
  const { board, steps, figures } = input;
  const read = input.meter ?? figures;
  const fixed = input.fixed ?? [];
  const layout = [...steps, ...fixed].map((s) => stepEdges(board, s.channel));
  const solver = prepare(layout.flat().map((x) => x.edge));
  const stepSlots = layout.map((edges) =>
    edges.map(({ edge, share }) => {
      const e = solver.edgeIndex(edge);
      // The solver was prepared with these edges; a miss would drop the step silently.
      if (e < 0) throw new RangeError(`switchBank: the solver has no edge ${edge.from}-${edge.to} for a step`);
      return { e, share };
    }),
  );
  const n = figures.count;
  const connectedKvar = new Float64Array(n);
  const stepOn = steps.map(() => new Uint8Array(n));
  const record = (i: number, on: Uint8Array, kvar: number) => {
    connectedKvar[i] = kvar;
    for (let s = 0; s < steps.length; s++) stepOn[s]![i] = on[s]!;
  };
  const controller = createBankController(steps, input.settings);
  const powers = new Float64Array(solver.edgeCount * 6);
  const phaseIndex = phaseIndexOf(board.phases);
  // A controller that never waits (delay 0) could otherwise trade steps back and forth without end.
  const moveCap = 4 * steps.length + 8;

  /** Solves interval i with the steps set in `on` (and the fixed part) connected. */
  const solveWith = (i: number, on: Uint8Array): number => {
    solver.powersAt(i, powers);
    let kvar = 0;
    for (let s = 0; s < steps.length; s++) {
      if (!on[s]) continue;
      kvar += steps[s]!.kvar;
      // A capacitor draws −jQ at nominal voltage (load convention), all of it constant impedance.
      for (const { e, share } of stepSlots[s]!) powers[e * 6 + 1] = powers[e * 6 + 1]! - steps[s]!.kvar * 1000 * share;
    }
    for (let f = 0; f < fixed.length; f++)
      for (const { e, share } of stepSlots[steps.length + f]!) powers[e * 6 + 1] = powers[e * 6 + 1]! - fixed[f]!.kvar * 1000 * share;
    solver.solve(powers, i);
    return kvar;
  };

  const readingAt = (i: number) => (channel: StepChannel) => channelReadingAt(read, phaseIndex, channel, i);

  /**
   * The bank is taken as already settled at the first interval's load when the data starts, as it would be
   * in service: the controller switches at that load, with every step free to close, until it is content,
   * and those moves are not counted (a start-up, not the switching the data shows).
   */
  function settleBeforeFirst(): void {
    if (n === 0 || steps.length === 0) return;
    const start = input.utcMs[0]!;
    const reading = readingAt(0);
    const stride = Math.max(input.settings.delaySeconds * 1000, 1);
    let clock = start - (moveCap + 1) * stride;
    solveWith(0, controller.on);
    for (let moves = 0; moves < moveCap; moves++) {
      const at = controller.advance(clock, start, reading);
      if (at === null) break;
      clock = at;
      solveWith(0, controller.on);
    }
    controller.closings.fill(0);
    controller.openings.fill(0);
    controller.interrupt();
  }

  settleBeforeFirst();
  for (let i = 0; i < n; i++) {
    if (i > 0 && input.utcMs[i]! - input.utcMs[i - 1]! > input.intervalMs) controller.interrupt();
    const start = input.utcMs[i]!;
    const end = start + input.intervalMs;
    // The load is taken as steady through the interval (its average is all the data says): the controller
    // watches it, moves when its delay and the steps' discharge allow, and each move is solved again.
    let kvar = solveWith(i, controller.on);
    const reading = readingAt(i);
    let before = controller.on.slice();
    let at = controller.advance(start, end, reading);
    if (at === null) {
      // No move: the common case, the interval as solved.
      record(i, controller.on, kvar);
      continue;
    }
    const held = new Map<string, { on: Uint8Array; ms: number; kvar: number }>();
    let clock = start;
    for (let moves = 1; ; moves++) {
      // `before` held from `clock` until the move at `at` (or to the interval's end).
      const key = before.join('');
      const entry = held.get(key) ?? { on: before, ms: 0, kvar };
      entry.ms += (at ?? end) - clock;
      held.set(key, entry);
      if (at === null) break;
      clock = at;
      kvar = solveWith(i, controller.on);
      before = controller.on.slice();
      at = moves < moveCap ? controller.advance(clock, end, reading) : null;
    }
    // The interval is shown with the steps in service for most of it (the first such on a tie); the
    // controller goes on from where it ended.
    let shown: { on: Uint8Array; ms: number; kvar: number } | undefined;
    for (const entry of held.values()) if (!shown || entry.ms > shown.ms) shown = entry;
    if (shown!.on.join('') !== controller.on.join('')) solveWith(i, shown!.on);
    record(i, shown!.on, shown!.kvar);
  }
  return { figures, ...(input.meter ? { meterFigures: input.meter } : {}), connectedKvar, stepOn, closings: [...controller.closings], openings: [...controller.openings], path: solver.path };
}
