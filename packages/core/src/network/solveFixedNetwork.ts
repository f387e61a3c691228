/**
 * One linear solve of a board with branch admittances given by the caller and,
 * optionally, an ideal current source across each branch. This is how a study
 * solves the board at another frequency (harmonic order h: the caller scales
 * the reactances and supplies the EMFs of that order) without a second
 * topology: node numbering, the source/line/neutral elements and the MNA step
 * are the ones `solveNetwork` uses.
 */
import { add, mul, sub, ZERO, isFiniteComplex, type ComplexValue } from '../complex.js';
import { NumericalError } from '../errors.js';
import type { Board } from '../board/boardModel.js';
import { buildTopology, REFERENCE } from './networkTopology.js';
import { connectedNodes, solveLinearStep, voltageOf, type BranchState, type NetworkSolution } from './solveNetwork.js';

export interface FixedNetworkInput {
  /** Per load, per branch: the admittance to use, S. */
  readonly admittances: readonly (readonly ComplexValue[])[];
  /**
   * Per load, per branch: current of an ideal current source in parallel with
   * the branch, flowing from → to through the load like its own current, A;
   * null (or a missing list) for none. A non-linear load at a harmonic order is
   * such a source with a zero admittance beside it.
   */
  readonly branchSources?: readonly (readonly (ComplexValue | null)[] | undefined)[];
}

/**
 * Solves `board` as a linear network with fixed admittances and branch current
 * sources. The board's EMFs, source, line and neutral impedances are used as
 * given (a harmonic study passes a board whose values are those of order h).
 * Branch currents in the result include the source current; branch
 * `admittance` is the admittance given.
 * @throws {NumericalError} when the network is singular.
 */
export function solveFixedNetwork(board: Board, input: FixedNetworkInput): NetworkSolution {
  const topo = buildTopology(board);
  const live = connectedNodes(board, topo);
  const injections = new Array<ComplexValue>(topo.nodeNames.length).fill(ZERO);
  const inject = (terminal: string, current: ComplexValue) => {
    const node = topo.terminalNode.get(terminal as never)!;
    if (node !== REFERENCE) injections[node] = add(injections[node]!, current);
  };
  board.loads.forEach((load, l) =>
    load.branches.forEach((b, k) => {
      const j = input.branchSources?.[l]?.[k];
      if (!j) return;
      // The source draws j from `from` and returns it at `to`.
      inject(b.from, { re: -j.re, im: -j.im });
      inject(b.to, j);
    }),
  );
  const step = solveLinearStep(board, topo, live, input.admittances, injections);
  const branches = board.loads.map((load, l) =>
    load.branches.map((b, k): BranchState => {
      const admittance = input.admittances[l]![k]!;
      const vf = voltageOf(step.voltages, topo.terminalNode.get(b.from)!);
      const vt = voltageOf(step.voltages, topo.terminalNode.get(b.to)!);
      if (!vf || !vt) return { voltage: ZERO, current: ZERO, admittance, energised: false };
      const voltage = sub(vf, vt);
      const j = input.branchSources?.[l]?.[k] ?? ZERO;
      return { voltage, current: add(mul(admittance, voltage), j), admittance, energised: true };
    }),
  );
  const lineCurrents = topo.sourceNode.map((s, k) =>
    topo.lineAdmittance ? mul(topo.lineAdmittance, sub(step.voltages[s]!, step.voltages[topo.busNode[k]!]!)) : step.sourceCurrents[k]!,
  );
  let neutralCurrent: ComplexValue | null = null;
  if (board.hasNeutral) {
    if (board.neutralOpen) neutralCurrent = ZERO;
    else if (topo.neutralAdmittance) neutralCurrent = mul(topo.neutralAdmittance, voltageOf(step.voltages, topo.neutralNode!) ?? ZERO);
    else {
      let total = ZERO;
      board.loads.forEach((load, l) =>
        load.branches.forEach((b, k) => {
          const i = branches[l]![k]!.current;
          if (b.to === 'N') total = add(total, i);
          if (b.from === 'N') total = sub(total, i);
        }),
      );
      neutralCurrent = total;
    }
  }
  for (const v of step.voltages)
    if (v && !isFiniteComplex(v)) throw new NumericalError('non-finite', 'the solve produced a non-finite voltage; check for extreme impedance values');
  return { board, topology: topo, nodeVoltages: step.voltages, lineCurrents, neutralCurrent, branches, iterations: 1, lastChange: 0, lowVoltageThreshold: 0 };
}
