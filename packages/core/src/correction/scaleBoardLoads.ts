/**
 * A light-load version of a board: every load of the board file scaled by a
 * fraction, or by its own fraction where one is named (0 switches it off).
 * Equipment already added (origin `added`) is left as it is.
 */
import type { Board } from '../board/boardModel.js';
import { scale } from '../complex.js';
import type { LightLoadSpec } from './correctionSpec.js';

/**
 * @example
 * scaleBoardLoads(board, { fraction: 0.3, perLoad: { oven: 0 } }) // 30 % of every load, oven off
 */
export function scaleBoardLoads(board: Board, lightLoad: LightLoadSpec): Board {
  return {
    ...board,
    loads: board.loads.map((load) => {
      if (load.origin !== 'board') return load;
      // Load names are user text: "constructor" or "toString" must not find Object.prototype members.
      const perLoad = lightLoad.perLoad;
      const k = perLoad && Object.hasOwn(perLoad, load.name) ? perLoad[load.name]! : lightLoad.fraction;
      return { ...load, branches: load.branches.map((b) => ({ ...b, sNominal: scale(b.sNominal, k) })) };
    }),
  };
}
