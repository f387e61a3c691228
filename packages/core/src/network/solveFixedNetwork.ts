/**
 * One linear solve of a board with branch admittances given by the caller and,
 * optionally, an ideal current source across each branch. This is how a study
 * solves the board at another frequency (harmonic order h: the caller scales
 * the reactances and supplies the EMFs of that order) without a second
 * topology: the board is compiled like every solve (compileBoard), the given
 * admittances replace the load model and the sources enter as node injections.
 */
import { add, mul, sub, ZERO, isFiniteComplex, type ComplexValue } from '../complex.js';
import { NumericalError } from '../errors.js';
import type { Board } from '../board/boardModel.js';
import { REFERENCE } from './networkTopology.js';
import { compileBoard, type BranchState, type NetworkSolution } from './solveNetwork.js';
import type { CompiledNetwork } from './compiledNetwork.js';
import type { CompiledNetworkCache } from './compiledNetworkCache.js';
import { assertBoardModel } from '../board/modelGuards.js';

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

/** Adds an ideal current source j across a branch: it draws j out of node `from` and returns it into `to`. */
export function injectBranchSource(net: CompiledNetwork, from: number, to: number, j: ComplexValue): void {
  if (from !== REFERENCE) {
    net.injectionRe[from] = net.injectionRe[from]! - j.re;
    net.injectionIm[from] = net.injectionIm[from]! - j.im;
  }
  if (to !== REFERENCE) {
    net.injectionRe[to] = net.injectionRe[to]! + j.re;
    net.injectionIm[to] = net.injectionIm[to]! + j.im;
  }
}

export interface FixedSolveOptions {
  /**
   * Compiled networks to reuse for a circuit met before (compiledNetworkCache.ts): a study
   * solving one installation in many states passes one cache to all its solves.
   * @defaultValue none: the installation is compiled for this solve
   */
  readonly networks?: CompiledNetworkCache;
}

/**
 * Solves `board` as a linear network with fixed admittances and branch current
 * sources. The board's EMFs, source, line and neutral impedances are used as
 * given (a harmonic study passes a board whose values are those of order h).
 * Branch currents in the result include the source current; branch
 * `admittance` is the admittance given.
 * @throws {NumericalError} when the network is singular.
 */
export function solveFixedNetwork(board: Board, input: FixedNetworkInput, options: FixedSolveOptions = {}): NetworkSolution {
  assertBoardModel(board);
  const { networks } = options;
  const { topology: topo, network: net, installation, boardIndex } = compileBoard(board, networks ? (i) => networks.compileForLinearSolve(i) : undefined);
  const sourceOf = (l: number, k: number) => input.branchSources?.[l]?.[k] ?? null;
  let index = 0;
  board.loads.forEach((load, l) =>
    load.branches.forEach((b, k) => {
      const y = input.admittances[l]![k]!;
      net.admittanceRe[index] = y.re;
      net.admittanceIm[index] = y.im;
      index++;
      const j = sourceOf(l, k);
      if (!j) return;
      injectBranchSource(net, topo.terminalNode.get(b.from)!, topo.terminalNode.get(b.to)!, j);
    }),
  );
  net.solveLinear();
  const nodeVoltages = Array.from({ length: net.nodeCount }, (_, v): ComplexValue | null => (net.live[v] ? { re: net.voltageRe[v]!, im: net.voltageIm[v]! } : null));
  for (const v of nodeVoltages)
    if (v && !isFiniteComplex(v)) throw new NumericalError('non-finite', 'the solve produced a non-finite voltage; check for extreme impedance values');
  const voltageAt = (node: number) => (node === REFERENCE ? ZERO : nodeVoltages[node]);
  const branches = board.loads.map((load, l) =>
    load.branches.map((b, k): BranchState => {
      const admittance = input.admittances[l]![k]!;
      const vf = voltageAt(topo.terminalNode.get(b.from)!);
      const vt = voltageAt(topo.terminalNode.get(b.to)!);
      if (!vf || !vt) return { voltage: ZERO, current: ZERO, admittance, energised: false };
      const voltage = sub(vf, vt);
      return { voltage, current: add(mul(admittance, voltage), sourceOf(l, k) ?? ZERO), admittance, energised: true };
    }),
  );
  // Behind a line impedance the main board's line currents are its supply sources' currents, read
  // as the general solve reads them (right behind a zero-sequence star-point return too). An ideal
  // source, or a board without its own source, feeds its bus by KCL over the branches, whose
  // currents include the injections the compiled sources do not see.
  const sourceCurrents = boardIndex === 0 && topo.lineAdmittance ? net.sourceCurrents() : null;
  const lineCurrents = topo.busNode.map((bus, k) => {
    if (sourceCurrents) return sourceCurrents[installation.layout.mainSources[k]!]!;
    let out = ZERO;
    board.loads.forEach((load, l) =>
      load.branches.forEach((b, i) => {
        const current = branches[l]![i]!.current;
        if (topo.terminalNode.get(b.from) === bus) out = add(out, current);
        if (topo.terminalNode.get(b.to) === bus) out = sub(out, current);
      }),
    );
    return out;
  });
  let neutralCurrent: ComplexValue | null = null;
  if (board.hasNeutral) {
    if (board.neutralOpen) neutralCurrent = ZERO;
    else if (topo.neutralAdmittance && !board.sourceStarImpedance) neutralCurrent = mul(topo.neutralAdmittance, voltageAt(topo.neutralNode!) ?? ZERO);
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
  return { board, topology: topo, nodeVoltages, lineCurrents, neutralCurrent, branches, iterations: 1, lastChange: 0, lowVoltageThreshold: 0 };
}
