/**
 * The solves of the capacitor duty on an installation: one per bank state and
 * condition, at the fundamental and at every order. The fundamental is solved
 * and read in full, since every order starts from its branch admittances and
 * currents; at an order only the node voltages are kept, all the duty reads
 * (the bank's branch voltages, capacitorDuty.ts), where reading every board
 * cost as much as the solve.
 *
 * The states change load powers only (parts switched off draw nothing, they
 * are not removed), so two states whose fundamentals are solved by one compiled
 * network (equal circuits but for the powers, the same live nodes) have one
 * circuit at each order too: its network is kept per fundamental network and
 * order, and not laid out and compared again for every state.
 */
import type { Installation } from '../board/boardModel.js';
import type { CompiledNetwork } from '../network/compiledNetwork.js';
import type { CompiledNetworkCache } from '../network/compiledNetworkCache.js';
import { solveFixedCompiled } from '../network/solveFixedInstallation.js';
import { solveCompiledInstallation, type CompiledInstallation, type SolveOptions } from '../network/solveNetwork.js';
import type { DutyOrder } from './capacitorDuty.js';
import type { HarmonicModel } from './harmonicModel.js';
import { inputAtOrder, installationAtOrder } from './installationAtOrder.js';

/**
 * Solves an installation state at the fundamental and at each of `orders`, read at board `b`.
 * Every installation it is given must differ from the others in load powers only (one
 * installation's duty states), its networks coming from `networks`.
 */
export type DutyOrderSolver = (installation: Installation, models: readonly HarmonicModel[], orders: readonly number[], b: number) => DutyOrder[];

export function installationDutyOrders(networks: CompiledNetworkCache, solve?: SolveOptions): DutyOrderSolver {
  // Weak: a fundamental network the cache did not keep goes, and its order networks with it.
  const atOrders = new WeakMap<CompiledNetwork, Map<number, CompiledInstallation>>();
  return (installation, models, orders, b) => {
    const compiled = networks.compileForLoadFlow(installation);
    const fundamental = solveCompiledInstallation(compiled, solve);
    let kept = atOrders.get(compiled.network);
    if (!kept) atOrders.set(compiled.network, (kept = new Map()));
    const board = fundamental.boards[b]!.board;
    return [
      { order: 1, solution: fundamental.boards[b]! },
      ...orders.map((h): DutyOrder => {
        const found = kept.get(h);
        const atOrder = found ? networks.againForLinearSolve(found) : networks.compileForLinearSolve(installationAtOrder(installation, models, h));
        if (!found) kept.set(h, atOrder);
        const { nodeVoltages } = solveFixedCompiled(atOrder, inputAtOrder(fundamental, models, h));
        // The board's loads and terminals are those at every order; its supply at h is not read.
        return { order: h, solution: { board, topology: atOrder.layout.topologies[b]!, nodeVoltages } };
      }),
    ];
  };
}
