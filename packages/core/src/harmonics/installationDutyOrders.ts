/**
 * The solves of the capacitor duty on an installation: one per bank state and
 * condition, at the fundamental and at every order. The fundamental's load
 * branches are read (every order starts from their admittances and currents)
 * and, like every order, the node voltages, which is all the duty reads (the
 * bank's branch voltages, capacitorDuty.ts): reading each board's lines,
 * neutral and supply cost as much as the solves.
 *
 * The states change load powers only (parts switched off draw nothing, they
 * are not removed), so they lay out as one circuit whose live nodes follow which
 * branches draw nothing: the fundamental's network is kept per set of live
 * nodes and each order's per fundamental network and order, as the compiled
 * network cache would find them, without laying out and comparing every state.
 */
import type { ComplexValue } from '../complex.js';
import type { Installation } from '../board/boardModel.js';
import type { CompiledNetwork } from '../network/compiledNetwork.js';
import { liveKey, type CompiledNetworkCache } from '../network/compiledNetworkCache.js';
import type { InstallationCircuit } from '../network/installationCircuit.js';
import { solveLinearVoltages } from '../network/solveFixedInstallation.js';
import { readBranchStates, type CompiledInstallation, type SolveOptions } from '../network/solveNetwork.js';
import { resolveSolveOptions } from '../network/solveOptions.js';
import type { DutyOrder } from './capacitorDuty.js';
import type { HarmonicModel } from './harmonicModel.js';
import { installationAtOrder, writeAtOrder } from './installationAtOrder.js';

/**
 * Solves an installation state at the fundamental and at each of `orders`, read at board `b`. Every
 * installation one solver is given must be the first but for its load powers (one installation's
 * duty states), its networks coming from `networks`.
 */
export type DutyOrderSolver = (installation: Installation, models: readonly HarmonicModel[], orders: readonly number[], b: number) => DutyOrder[];

/** Every load branch's power, board by board as the circuit lists them. */
function branchPowers(installation: Installation): ComplexValue[] {
  const powers: ComplexValue[] = [];
  for (const board of [installation.main, ...installation.subBoards]) for (const load of board.loads) for (const branch of load.branches) powers.push(branch.sNominal);
  return powers;
}

export function installationDutyOrders(networks: CompiledNetworkCache, solve?: SolveOptions): DutyOrderSolver {
  /** The first state's layout, every state's but for the powers; the fundamental's network per set of live nodes. */
  let shape: InstallationCircuit | undefined;
  const fundamentals = new Map<string, CompiledInstallation>();
  // Weak: a fundamental network the cache did not keep goes, and its order networks with it.
  const atOrders = new WeakMap<CompiledNetwork, Map<number, CompiledInstallation>>();
  return (installation, models, orders, b) => {
    const options = resolveSolveOptions(solve);
    const powers = branchPowers(installation);
    const live = shape && liveKey(shape.circuit, powers);
    const found = live === undefined ? undefined : fundamentals.get(live);
    const compiled = found ? networks.againForLoadFlow(found, installation, powers) : networks.compileForLoadFlow(installation);
    if (!found) {
      shape ??= compiled.layout;
      fundamentals.set(live ?? liveKey(shape.circuit, powers), compiled);
    }
    const { layout, network: net } = compiled;
    // As solveCompiledInstallation solves and reads it.
    net.solve(options);
    const nodeVoltages = Array.from({ length: net.nodeCount }, (_, v): ComplexValue | null => (net.live[v] ? { re: net.voltageRe[v]!, im: net.voltageIm[v]! } : null));
    const admittances = Array.from({ length: net.branchCount }, (_, k): ComplexValue => ({ re: net.admittanceRe[k]!, im: net.admittanceIm[k]! }));
    const branches = readBranchStates(installation, layout, { nodeVoltages, admittances });
    let kept = atOrders.get(net);
    if (!kept) atOrders.set(net, (kept = new Map()));
    return [
      { order: 1, solution: { topology: layout.topologies[b]!, nodeVoltages } },
      ...orders.map((h): DutyOrder => {
        const known = kept.get(h);
        const atOrder = known ? networks.againForLinearSolve(known) : networks.compileForLinearSolve(installationAtOrder(installation, models, h));
        if (!known) kept.set(h, atOrder);
        writeAtOrder(atOrder, branches, models, h);
        return { order: h, solution: { topology: atOrder.layout.topologies[b]!, nodeVoltages: solveLinearVoltages(atOrder.network) } };
      }),
    ];
  };
}
