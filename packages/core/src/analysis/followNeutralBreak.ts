/**
 * The state a board reaches when its neutral breaks, found by continuation:
 * start from the intact board, put a resistance in series with the neutral
 * conductor (a joint going bad), raise it step by step to open, and follow the
 * solution, each step's Newton solve starting from the last state.
 *
 * Why follow rather than solve the open board directly: with constant-power
 * loads in series behind a floating neutral the equations have more than one
 * solution, and a direct solve lands on whichever its start happens to favour.
 * Following the physical process picks the one the board actually moves into,
 * or shows that the state it was in ceases to exist on the way (a fold: voltage
 * collapse of the heavier side), which is an answer in itself.
 */
import { abs, sub, type ComplexValue } from '../complex.js';
import type { Board } from '../board/boardModel.js';
import { solveNetwork, type NetworkSolution } from '../network/solveNetwork.js';
import { neutralFaultNewton, withNeutralFault } from '../network/neutralFaultNewton.js';
import { assertBoardModel } from '../board/modelGuards.js';

export { withNeutralFault } from '../network/neutralFaultNewton.js';

export interface FollowNeutralBreakOptions {
  /**
   * Per-unit branch voltage below which current and power parts of a load are
   * held at their threshold admittance.
   * @defaultValue 0.7
   */
  readonly lowVoltageThreshold?: number;
}

export interface NeutralBreakPath {
  /** True when the state followed from the intact board still exists with the neutral open. */
  readonly reachedOpen: boolean;
  /**
   * Fault resistance in series with the neutral conductor at which the followed
   * state ceased to exist (ohm); null when it reached open, or was lost only on
   * the last step from a nearly open neutral to open.
   */
  readonly lostAtOhms: number | null;
  /** The state with the neutral open when `reachedOpen`; otherwise the last state followed. */
  readonly state: NetworkSolution;
  /** Fault resistance of `state`, ohm; null when it is the open-neutral state. */
  readonly stateAtOhms: number | null;
  /** Continuation steps taken. */
  readonly steps: number;
}

/**
 * Span of the fault resistance, as powers of ten: from 1e-3 of the board's load
 * impedance to 1e3 of its lightest branch's impedance. The end must be far above
 * every branch, not just the board as a whole: a lone small line-to-neutral load
 * still holds its node near the neutral through a resistance the size of the
 * board's impedance, and the last jump to open would then look like a collapse.
 */
const FIRST_DECADE = -3;
const DECADES_PAST_LIGHTEST = 3;
/** Step sizes in decades of fault resistance: start, largest, and the floor below which the state counts as lost. */
const STEP = { start: 0.25, largest: 1, floor: 1e-3 } as const;
/** A step may move no node by more than this fraction of nominal: larger means it jumped to another state. */
const LARGEST_MOVE = 0.05;
/** A Newton solve needing more iterations than this is too close to a fold to trust as "the same state". */
const ITERATIONS_PER_STEP = 6;
/** Intermediate states need only be close enough to start the next step from; the open-neutral state is solved to full accuracy. */
const STEP_TOLERANCE = 1e-7;

/**
 * Impedance of the load the neutral serves at nominal voltage, ohm: the scale the fault resistance
 * is swept over. Only branches to the neutral bar count — a large line-to-line load beside a small
 * line-to-neutral one would otherwise end the sweep while the bar is still far from where the open
 * neutral puts it, and the last step to open would look like a jump to another state.
 */
function loadImpedanceScale(board: Board): number {
  let va = 0;
  let all = 0;
  for (const load of board.loads)
    for (const b of load.branches) {
      all += abs(b.sNominal);
      if (b.from === 'N' || b.to === 'N') va += abs(b.sNominal);
    }
  return (board.nominalLineToNeutralV ** 2) / Math.max(va > 0 ? va : all, 1);
}

/** Largest impedance at nominal line-to-neutral voltage among the board's load branches, ohm. */
function lightestBranchImpedance(board: Board): number {
  let smallest = Infinity;
  for (const load of board.loads) for (const b of load.branches) if (abs(b.sNominal) > 0) smallest = Math.min(smallest, abs(b.sNominal));
  return Number.isFinite(smallest) ? (board.nominalLineToNeutralV ** 2) / smallest : 0;
}

function largestMove(a: readonly (ComplexValue | null)[], b: readonly (ComplexValue | null)[], vBase: number): number {
  let largest = 0;
  a.forEach((v, k) => {
    const w = b[k];
    if (v && w) largest = Math.max(largest, abs(sub(v, w)) / vBase);
  });
  return largest;
}

/**
 * Follows a board from intact to open neutral (see the module comment).
 * The board must have a neutral conductor.
 * @throws {NumericalError} when the intact board itself cannot be solved.
 */
export function followNeutralBreak(board: Board, options: FollowNeutralBreakOptions = {}): NeutralBreakPath {
  assertBoardModel(board);
  const lowVoltageThreshold = options.lowVoltageThreshold ?? 0.7;
  const stepNewton = { lowVoltageThreshold, maxIterations: ITERATIONS_PER_STEP, tolerance: STEP_TOLERANCE };
  const vBase = board.nominalLineToNeutralV;
  const zScale = loadImpedanceScale(board);
  const LAST_DECADE = Math.max(3, Math.log10(lightestBranchImpedance(board) / zScale) + DECADES_PAST_LIGHTEST);
  // The intact board (a negligible fault, so the neutral bar is a node of its own as in every later step).
  let decade = FIRST_DECADE;
  const intact = solveNetwork(withNeutralFault(board, zScale * 10 ** decade), { lowVoltageThreshold });
  // Each step's whole solution is read only for the state returned: a step needs the voltages alone.
  const newton = neutralFaultNewton(board);
  let voltages = intact.nodeVoltages;
  let settled: Extract<ReturnType<typeof newton.solve>, { converged: true }> | null = null;
  const state = () => (settled ? newton.read(zScale * 10 ** decade, settled, stepNewton) : intact);
  let step: number = STEP.start;
  let steps = 0;
  while (decade < LAST_DECADE) {
    const next = Math.min(LAST_DECADE, decade + step);
    const out = newton.solve(zScale * 10 ** next, voltages, stepNewton);
    if (out.converged && largestMove(out.voltages, voltages, vBase) <= LARGEST_MOVE) {
      decade = next;
      voltages = out.voltages;
      settled = out;
      steps++;
      step = Math.min(STEP.largest, step * 1.5);
    } else {
      step /= 2;
      if (step < STEP.floor) return { reachedOpen: false, lostAtOhms: zScale * 10 ** decade, state: state(), stateAtOhms: zScale * 10 ** decade, steps };
    }
  }
  const open = newton.solve(null, voltages, { lowVoltageThreshold });
  if (open.converged && largestMove(open.voltages, voltages, vBase) <= LARGEST_MOVE)
    return { reachedOpen: true, lostAtOhms: null, state: newton.read(null, open, { lowVoltageThreshold }), stateAtOhms: null, steps: steps + 1 };
  return { reachedOpen: false, lostAtOhms: null, state: state(), stateAtOhms: zScale * 10 ** decade, steps };
}
