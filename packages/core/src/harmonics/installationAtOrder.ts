/**
 * An installation at order h, solved by the same compiled network as the
 * fundamental: the main board's supply scaled as for a single board
 * (`boardAtOrder`: source, service feeder, neutral, star-point impedance,
 * background EMFs), every sub-board feeder's line and neutral conductor scaled
 * the same way (R constant or × √h, X × h), the loads at their admittance of
 * order h and the non-linear loads as current sources at their own board.
 */
import type { Installation } from '../board/boardModel.js';
import type { InstallationSolution } from '../network/solveNetwork.js';
import { solveFixedInstallation, type FixedInstallationInput } from '../network/solveFixedInstallation.js';
import type { FixedSolveOptions } from '../network/solveFixedNetwork.js';
import type { HarmonicModel } from './harmonicModel.js';
import { admittancesAtOrder, boardAtOrder, impedanceAtOrder, injectionsAtOrder } from './networkAtOrder.js';

/** The installation with its supply and every feeder at order h (`models`: one per board, 0 = main). */
export function installationAtOrder(installation: Installation, models: readonly HarmonicModel[], h: number): Installation {
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
  return solveFixedInstallation(installationAtOrder(fundamental.installation, models, h), inputAtOrder(fundamental, models, h), options);
}

/** Every board's load branches at order h: linear ones at their admittance of that order, non-linear ones as current sources. */
export function inputAtOrder(fundamental: InstallationSolution, models: readonly HarmonicModel[], h: number): FixedInstallationInput {
  return {
    admittances: fundamental.boards.map((board, b) => admittancesAtOrder(board, models[b]!, h)),
    branchSources: fundamental.boards.map((board, b) => injectionsAtOrder(board, models[b]!, h)),
  };
}
