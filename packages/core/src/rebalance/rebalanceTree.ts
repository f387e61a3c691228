/**
 * An installation as the rebalancing study sees it: its boards in board-number
 * order (0 = main), who feeds whom, and every circuit under one flat index so
 * pins, load conditions and the search address circuits the same way on a
 * single board and on a riser of sub-boards.
 */
import type { Board, Installation } from '../board/boardModel.js';
import { add, type ComplexValue } from '../complex.js';
import { boardOfInstallation } from '../network/installationModel.js';

/** One circuit of the installation: its board number and its position in that board's loads. */
export interface CircuitRef {
  readonly board: number;
  readonly load: number;
}

export interface RebalanceTree {
  readonly installation: Installation;
  /** Each board as a `Board` (a sub-board carries the supply's system and its own feeder). */
  readonly boards: readonly Board[];
  readonly names: readonly string[];
  /** Feeding board of each board; −1 for the main board. */
  readonly parent: readonly number[];
  /**
   * Series impedance per line of the path into each board from its feeding point, ohm:
   * source + service feeder for the main board, the feeder for a sub-board (mean of its lines).
   */
  readonly seriesZ: readonly ComplexValue[];
  /** Every circuit, board by board; the flat index of a circuit is its position here. */
  readonly circuits: readonly CircuitRef[];
  /** Flat index of the first circuit of each board. */
  readonly firstCircuit: readonly number[];
}

export function rebalanceTree(installation: Installation): RebalanceTree {
  const count = installation.subBoards.length + 1;
  const boards = Array.from({ length: count }, (_, b) => boardOfInstallation(installation, b));
  const parent = boards.map((_, b) => (b === 0 ? -1 : installation.subBoards[b - 1]!.fedFrom));
  const circuits: CircuitRef[] = [];
  const firstCircuit: number[] = [];
  boards.forEach((board, b) => {
    firstCircuit.push(circuits.length);
    board.loads.forEach((_, load) => circuits.push({ board: b, load }));
  });
  return {
    installation,
    boards,
    names: boards.map((b) => b.name),
    parent,
    seriesZ: boards.map((b) => add(b.sourceImpedance, b.lineImpedance)),
    circuits,
    firstCircuit,
  };
}

/** True when board `b` is `ancestor` or fed (directly or through others) from it. */
export function isUnder(tree: RebalanceTree, b: number, ancestor: number): boolean {
  for (let x = b; x >= 0; x = tree.parent[x]!) if (x === ancestor) return true;
  return false;
}

/** Boards from the main board down to `b`, inclusive. */
export function pathTo(tree: RebalanceTree, b: number): number[] {
  const path: number[] = [];
  for (let x = b; x >= 0; x = tree.parent[x]!) path.unshift(x);
  return path;
}

/** The board that holds a flat circuit index, and the load on it. */
export const loadOf = (tree: RebalanceTree, flat: number) => tree.boards[tree.circuits[flat]!.board]!.loads[tree.circuits[flat]!.load]!;
