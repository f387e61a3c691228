/**
 * A light-load version of a board: every load of the board file scaled by a
 * fraction, or by its own fraction where one is named (0 switches it off).
 * Equipment already added (origin `added`) is left as it is. On a board of an
 * installation, the loads of every board it feeds (directly or further down)
 * are scaled too: its incomer carries them, and the target is judged there.
 */
import type { Board, BoardLoad, Installation } from '../board/boardModel.js';
import { scale } from '../complex.js';
import type { LightLoadSpec } from './correctionSpec.js';
import { assertBoardModel } from '../board/modelGuards.js';

function scaleLoads(loads: readonly BoardLoad[], lightLoad: LightLoadSpec): BoardLoad[] {
  return loads.map((load) => {
    if (load.origin !== 'board') return load;
    // Load names are user text: "constructor" or "toString" must not find Object.prototype members.
    const perLoad = lightLoad.perLoad;
    const k = perLoad && Object.hasOwn(perLoad, load.name) ? perLoad[load.name]! : lightLoad.fraction;
    return { ...load, branches: load.branches.map((b) => ({ ...b, sNominal: scale(b.sNominal, k) })) };
  });
}

/** Board numbers fed from `root`, directly or through other boards (not `root` itself). */
function boardsBelow(installation: Installation, root: number): Set<number> {
  const below = new Set<number>();
  let grew = true;
  while (grew) {
    grew = false;
    installation.subBoards.forEach((sb, i) => {
      if (!below.has(i + 1) && (sb.fedFrom === root || below.has(sb.fedFrom))) {
        below.add(i + 1);
        grew = true;
      }
    });
  }
  return below;
}

/**
 * @example
 * scaleBoardLoads(board, { fraction: 0.3, perLoad: { oven: 0 } }) // 30 % of every load, oven off
 */
export function scaleBoardLoads(board: Board, lightLoad: LightLoadSpec): Board {
  assertBoardModel(board);
  const loads = scaleLoads(board.loads, lightLoad);
  const place = board.installation;
  if (!place) return { ...board, loads };
  const below = boardsBelow(place.installation, place.boardIndex);
  if (below.size === 0) return { ...board, loads };
  const subBoards = place.installation.subBoards.map((sb, i) => (below.has(i + 1) ? { ...sb, loads: scaleLoads(sb.loads, lightLoad) } : sb));
  return { ...board, loads, installation: { ...place, installation: { ...place.installation, subBoards } } };
}
