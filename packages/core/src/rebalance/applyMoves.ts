/**
 * Board-model edits a rebalancing study needs: a circuit moved to another
 * connection, and every load scaled to a load condition. Both return new
 * boards; the network solver then re-solves them as it would any board.
 */
import type { Board, Terminal } from '../board/boardModel.js';
import type { ConnectionSpec } from '../board/boardSchema.js';
import { scale } from '../complex.js';

/** The board with each named load (by index) moved to its new single-branch connection. */
export function moveCircuits(board: Board, moves: ReadonlyMap<number, ConnectionSpec>): Board {
  return {
    ...board,
    loads: board.loads.map((load, i) => {
      const to = moves.get(i);
      if (to === undefined || to === load.connection) return load;
      const [a, b] = to.split('-') as [Terminal, Terminal];
      return { ...load, connection: to, branches: load.branches.map((br) => ({ ...br, from: a, to: b })) };
    }),
  };
}

/** The board with each board load scaled by its factor (by load index); added equipment untouched. */
export function scaleToCondition(board: Board, factors: readonly number[]): Board {
  return {
    ...board,
    loads: board.loads.map((load, i) => {
      const k = factors[i] ?? 1;
      if (load.origin !== 'board' || k === 1) return load;
      return { ...load, branches: load.branches.map((br) => ({ ...br, sNominal: scale(br.sNominal, k) })) };
    }),
  };
}
