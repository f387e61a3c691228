/**
 * An installation at order h, solved by the same compiled network as the
 * fundamental: the main board's supply scaled as for a single board
 * (`boardAtOrder`: source, service feeder, neutral, star-point impedance,
 * background EMFs), every sub-board feeder's line and neutral conductor scaled
 * the same way (R constant or × √h, X × h), the loads at their admittance of
 * order h and the non-linear loads as current sources at their own board.
 */
import type { Installation } from '../board/boardModel.js';
import type { ComplexValue } from '../complex.js';
import { compileInstallation, type BranchState, type CompiledInstallation, type InstallationSolution } from '../network/solveNetwork.js';
import { solveWrittenInstallation, type PerBoardBranches } from '../network/solveFixedInstallation.js';
import { injectBranchSource, type FixedSolveOptions } from '../network/solveFixedNetwork.js';
import type { HarmonicModel } from './harmonicModel.js';
import { boardAtOrder, branchAdmittanceAtOrderInto, contentAtOrder, impedanceAtOrder, injectionAtOrder } from './networkAtOrder.js';
import { assertInstallationModel } from '../board/modelGuards.js';
import { checkListArgument, checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** The installation with its supply and every feeder at order h (`models`: one per board, 0 = main). */
export function installationAtOrder(installation: Installation, models: readonly HarmonicModel[], h: number): Installation {
  assertInstallationModel(installation);
  const resistance = models[0]!.resistance;
  const atOrder = (z: Parameters<typeof impedanceAtOrder>[0]) => impedanceAtOrder(z, h, resistance);
  return {
    ...installation,
    main: boardAtOrder(installation.main, models[0]!, h),
    subBoards: installation.subBoards.map((sb) => ({
      ...sb,
      feeder: { ...sb.feeder, lineImpedances: sb.feeder.lineImpedances.map(atOrder), neutralImpedance: atOrder(sb.feeder.neutralImpedance) },
    })),
  };
}

/**
 * Solves the installation at integer order h ≥ 2 given its fundamental solution.
 * @param options `networks`: compiled networks to reuse, where the same installation is solved in many states
 * @throws {NumericalError} when the network is singular at that order.
 */
export function solveInstallationAtOrder(fundamental: InstallationSolution, models: readonly HarmonicModel[], h: number, options: FixedSolveOptions = {}): InstallationSolution {
  checkObjectArgument(fundamental, 'fundamental', 'an installation solution at the fundamental (solveInstallationNetwork(installation))', ['installation', 'boards']);
  checkListArgument(models, 'models', "every board's harmonic model, main board first", (x) => typeof x === 'object' && x !== null);
  checkNumberArgument(h, 'h', 'a harmonic order above 0', (x) => x > 0);
  const installation = installationAtOrder(fundamental.installation, models, h);
  const compiled = options.networks ? options.networks.compileForLinearSolve(installation) : compileInstallation(installation);
  const branches = fundamental.boards.map((board) => board.branches);
  return solveWrittenInstallation(compiled, (c) => writeAtOrder(c, branches, models, h));
}

const scratch = new Float64Array(2);

/**
 * Writes every board's load branches at order h into a compiled installation's network, from the
 * fundamental's branch states: linear ones at their admittance of that order, non-linear ones as
 * current sources (`admittancesAtOrder` and `injectionsAtOrder`, the same numbers, without building them).
 * @returns the source beside each circuit branch, null for none
 */
export function writeAtOrder({ layout, network: net }: CompiledInstallation, branches: PerBoardBranches<BranchState>, models: readonly HarmonicModel[], h: number): (ComplexValue | null)[] {
  const sources: (ComplexValue | null)[] = new Array(net.branchCount).fill(null);
  for (let b = 0; b < branches.length; b++) {
    let k = layout.branchOffset[b]!;
    branches[b]!.forEach((load, l) => {
      const behaviour = models[b]!.loads[l]!;
      const content = contentAtOrder(behaviour, h);
      load.forEach((state) => {
        branchAdmittanceAtOrderInto(state.admittance, behaviour, h, scratch, 0);
        net.admittanceRe[k] = scratch[0]!;
        net.admittanceIm[k] = scratch[1]!;
        const j = content ? injectionAtOrder(state.current, content, h) : null;
        sources[k] = j;
        if (j) injectBranchSource(net, layout.circuit.branches[k]!.from, layout.circuit.branches[k]!.to, j);
        k++;
      });
    });
  }
  return sources;
}
