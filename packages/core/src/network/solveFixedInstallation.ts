/**
 * One linear solve of a whole installation with branch admittances given by the
 * caller and, optionally, an ideal current source beside each branch: the
 * installation's form of `solveFixedNetwork`. A harmonic study passes the
 * installation with its supply and feeders at order h, the loads' admittances at
 * that order and the non-linear loads as sources; the installation is compiled
 * like every solve and read board by board like every solve.
 */
import { isFiniteComplex, type ComplexValue } from '../complex.js';
import { NumericalError } from '../errors.js';
import type { Installation } from '../board/boardModel.js';
import { injectBranchSource, type FixedSolveOptions } from './solveFixedNetwork.js';
import { compileInstallation, readInstallationSolution, type CompiledInstallation, type InstallationSolution } from './solveNetwork.js';
import type { CompiledNetwork } from './compiledNetwork.js';
import { assertInstallationModel } from '../board/modelGuards.js';

/** Per board (0 = main board, i + 1 = `subBoards[i]`), per load, per branch. */
export type PerBoardBranches<T> = readonly (readonly (readonly T[])[])[];

export interface FixedInstallationInput {
  /** The admittance of every load branch, S. */
  readonly admittances: PerBoardBranches<ComplexValue>;
  /** An ideal current source beside a branch, flowing from → to like the branch's own current, A; null for none. */
  readonly branchSources?: PerBoardBranches<ComplexValue | null>;
}

/**
 * Solves `installation` as a linear network: its EMFs, source, feeder and
 * neutral impedances as given, the branches at the given admittances, plus the
 * given sources. Branch, line and neutral currents include the sources' currents.
 * @throws {NumericalError} when the network is singular or a voltage is not finite.
 */
export function solveFixedInstallation(installation: Installation, input: FixedInstallationInput, options: FixedSolveOptions = {}): InstallationSolution {
  assertInstallationModel(installation);
  const compiled = options.networks ? options.networks.compileForLinearSolve(installation) : compileInstallation(installation);
  return solveWrittenInstallation(compiled, ({ layout, network: net }) => {
    const sources: (ComplexValue | null)[] = new Array(net.branchCount).fill(null);
    for (let b = 0; b < layout.branchOffset.length; b++) {
      let k = layout.branchOffset[b]!;
      input.admittances[b]!.forEach((load, l) =>
        load.forEach((y, i) => {
          net.admittanceRe[k] = y.re;
          net.admittanceIm[k] = y.im;
          const j = input.branchSources?.[b]?.[l]?.[i] ?? null;
          sources[k] = j;
          if (j) injectBranchSource(net, layout.circuit.branches[k]!.from, layout.circuit.branches[k]!.to, j);
          k++;
        }),
      );
    }
    return sources;
  });
}

/**
 * Writes the load branches into a compiled installation's network (admittances, and sources as
 * injections): the source beside each circuit branch, null for none.
 */
export type BranchWriter = (compiled: CompiledInstallation) => (ComplexValue | null)[];

/**
 * `solveFixedInstallation` on a compiled installation whose admittances and injections are clear
 * (a compile, or a cache's hand-back), its load branches as `write` sets them.
 * @throws {NumericalError} when the network is singular or a voltage is not finite.
 */
export function solveWrittenInstallation(compiled: CompiledInstallation, write: BranchWriter): InstallationSolution {
  const { installation, layout, network: net } = compiled;
  const branchSources = write(compiled);
  const nodeVoltages = solveLinearVoltages(net);
  const admittances = Array.from({ length: net.branchCount }, (_, k): ComplexValue => ({ re: net.admittanceRe[k]!, im: net.admittanceIm[k]! }));
  return readInstallationSolution(installation, layout, {
    nodeVoltages,
    admittances,
    sourceCurrents: net.sourceCurrents(),
    iterations: 1,
    lastChange: 0,
    lowVoltageThreshold: 0,
    branchSources,
  });
}

/**
 * The linear solve of a written network: every node voltage, null for a dead node.
 * @throws {NumericalError} when the network is singular or a voltage is not finite.
 */
export function solveLinearVoltages(net: CompiledNetwork): (ComplexValue | null)[] {
  net.solveLinear();
  const nodeVoltages = Array.from({ length: net.nodeCount }, (_, v): ComplexValue | null => (net.live[v] ? { re: net.voltageRe[v]!, im: net.voltageIm[v]! } : null));
  for (const v of nodeVoltages)
    if (v && !isFiniteComplex(v)) throw new NumericalError('non-finite', 'the solve produced a non-finite voltage; check for extreme impedance values');
  return nodeVoltages;
}
