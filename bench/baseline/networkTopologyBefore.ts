// The board topology as it was before compilation, for bench/baseline/solveNetworkBefore.ts only.
/**
 * Nodes and fixed elements of a board's circuit.
 *
 * The reference node is the source star point (earthed). Each phase EMF drives
 * an internal source node; the line (source + feeder) impedance joins it to the
 * phase bus. Where that impedance is zero the two nodes are one. The board
 * neutral bar is joined to the star point through the neutral conductor; a
 * zero-impedance neutral makes the bar the reference itself, an open one leaves
 * it to float.
 */
import { abs, add, inverse, type ComplexValue } from '../../packages/core/src/complex.js';
import type { Board, PhaseId, Terminal } from '../../packages/core/src/board/boardModel.js';

export { REFERENCE } from '../../packages/core/src/network/circuit.js';
import { REFERENCE } from '../../packages/core/src/network/circuit.js';

export interface NetworkTopology {
  /** Human names of the unknown nodes, index = node number. */
  readonly nodeNames: readonly string[];
  /** Node of each terminal; `REFERENCE` for the star point. */
  readonly terminalNode: ReadonlyMap<Terminal, number>;
  /** Per phase: the node the EMF drives and the bus node (equal when the line impedance is zero). */
  readonly sourceNode: readonly number[];
  readonly busNode: readonly number[];
  /** Admittance of each line (source + feeder), or null when the line impedance is zero. */
  readonly lineAdmittance: ComplexValue | null;
  /** Admittance of the neutral conductor; null when it is absent, open, or of zero impedance. */
  readonly neutralAdmittance: ComplexValue | null;
  /** Node of the board neutral bar; `REFERENCE` if tied solidly to the star point, undefined if the board has none. */
  readonly neutralNode: number | undefined;
}

export function terminalDescription(board: Board, terminal: Terminal): string {
  if (terminal === 'N') return 'the board neutral bar';
  if (terminal.startsWith('star:')) {
    const load = board.loads[Number(terminal.slice(5))];
    return `the star point of load "${load?.name ?? terminal}"`;
  }
  return `phase ${terminal} at the board`;
}

export function buildTopology(board: Board): NetworkTopology {
  const nodeNames: string[] = [];
  const terminalNode = new Map<Terminal, number>();
  const addNode = (name: string) => nodeNames.push(name) - 1;
  const lineZ = add(board.sourceImpedance, board.lineImpedance);
  const lineAdmittance = abs(lineZ) === 0 ? null : inverse(lineZ);
  const sourceNode: number[] = [];
  const busNode: number[] = [];
  board.phases.forEach((phase: PhaseId) => {
    const bus = addNode(`phase ${phase} at the board`);
    const source = lineAdmittance ? addNode(`phase ${phase} source terminal`) : bus;
    sourceNode.push(source);
    busNode.push(bus);
    terminalNode.set(phase, bus);
  });
  let neutralNode: number | undefined;
  let neutralAdmittance: ComplexValue | null = null;
  if (board.hasNeutral) {
    const solid = abs(board.neutralImpedance) === 0 && !board.neutralOpen;
    neutralNode = solid ? REFERENCE : addNode('the board neutral bar');
    if (!solid && !board.neutralOpen) neutralAdmittance = inverse(board.neutralImpedance);
    terminalNode.set('N', neutralNode);
  }
  board.loads.forEach((load) => {
    for (const branch of load.branches) {
      for (const t of [branch.from, branch.to]) {
        if (!terminalNode.has(t)) terminalNode.set(t, addNode(terminalDescription(board, t)));
      }
    }
  });
  return { nodeNames, terminalNode, sourceNode, busNode, lineAdmittance, neutralAdmittance, neutralNode };
}
