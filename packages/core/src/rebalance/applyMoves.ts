/**
 * Installation edits a rebalancing study needs: circuits moved to other
 * connections, and every circuit scaled to a load condition. Both return new
 * installations; the network solver then re-solves them as it would any.
 */
import type { BoardLoad, Installation, Terminal } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { mul, type ComplexValue } from '../complex.js';
import type { RebalanceTree } from './rebalanceTree.js';

/** The installation with each board's loads replaced by `edit(load, flat index)`. */
function mapLoads(tree: RebalanceTree, installation: Installation, edit: (load: BoardLoad, flat: number) => BoardLoad): Installation {
  const loadsOf = (b: number, loads: readonly BoardLoad[]) => loads.map((l, i) => edit(l, tree.firstCircuit[b]! + i));
  return {
    ...installation,
    main: { ...installation.main, loads: loadsOf(0, installation.main.loads) },
    subBoards: installation.subBoards.map((sb, i) => ({ ...sb, loads: loadsOf(i + 1, sb.loads) })),
  };
}

/** The installation with each circuit (by flat index) moved to its new single-branch connection. */
export function moveInstallationCircuits(tree: RebalanceTree, moves: ReadonlyMap<number, ConnectionSpec>): Installation {
  return mapLoads(tree, tree.installation, (load, flat) => {
    const to = moves.get(flat);
    if (to === undefined || to === load.connection) return load;
    const [a, b] = to.split('-') as [Terminal, Terminal];
    return { ...load, connection: to, branches: load.branches.map((br) => ({ ...br, from: a, to: b })) };
  });
}

/** The installation with each load's rating multiplied by its (complex) factor (1 for added equipment in a file's conditions). */
export function installationInCondition(tree: RebalanceTree, installation: Installation, factors: readonly ComplexValue[]): Installation {
  return mapLoads(tree, installation, (load, flat) => {
    const k = factors[flat];
    if (k === undefined || (k.re === 1 && k.im === 0)) return load;
    return { ...load, branches: load.branches.map((br) => ({ ...br, sNominal: mul(br.sNominal, k) })) };
  });
}
