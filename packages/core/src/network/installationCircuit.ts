/**
 * An installation (main board + radial sub-boards) written as one circuit for
 * the compiled solver, with each board's own numbering (its `NetworkTopology`)
 * pointing into it. A single board is the installation with no sub-boards, so
 * every solve goes through here.
 *
 * Reference node: the source's earthed neutral terminal. Per phase, the source
 * winding and the service feeder are in series with nothing between them, so
 * they are folded into one Norton source at the main bus (an ideal EMF when both
 * are zero). A zero-sequence source impedance adds the source star point as a
 * node, joined to the reference by (Z0 − Z1)/3. An open delta earths the corner
 * the two windings share; each other phase's winding runs from that corner.
 * A sub-board conductor of zero impedance joins its two ends into one node.
 */
import { abs, add, inverse, sub, ZERO, type ComplexValue } from '../complex.js';
import type { Board, Installation, PhaseId, Terminal } from '../board/boardModel.js';
import { REFERENCE, type Circuit, type CircuitBranch, type CircuitElement, type CircuitSource } from './circuit.js';
import type { NetworkTopology } from './networkTopology.js';
import { quoteText } from '../errors.js';

export interface InstallationCircuit {
  readonly circuit: Circuit;
  /** Per board (0 = main): its terminals' nodes in the circuit. */
  readonly topologies: readonly NetworkTopology[];
  /** Per board: index of its first load branch in `circuit.branches`. */
  readonly branchOffset: readonly number[];
  /** Boards in feeding order (every board after the one that feeds it). */
  readonly order: readonly number[];
  readonly children: readonly (readonly number[])[];
  /** Per sub-board (by board number; null for the main board): circuit element of each line conductor (null when merged) and of the neutral. */
  readonly feederElements: readonly ({ readonly lines: readonly (number | null)[]; readonly neutral: number | null } | null)[];
  /** Per phase of the main board: index of its source in `circuit.sources`. */
  readonly mainSources: readonly number[];
}

/**
 * An impedance below a microhm is a direct connection: its nodes are merged. Kept as an element, its
 * admittance (1e6 S and up, beside loads of a few siemens) leaves the solve's round-off above the load
 * iteration's tolerance (a 0.001 ft feeder would not settle) or makes the matrix singular, while the
 * voltage it drops is at most a milliohm's thousandth of a volt per kiloampere (common practice, no source).
 */
export const NEGLIGIBLE_OHMS = 1e-6;

const isZero = (z: ComplexValue) => abs(z) < NEGLIGIBLE_OHMS;

/** Per-phase source impedance of the main board (falls back to the equal short form). */
export const sourceImpedanceOf = (board: Board, k: number): ComplexValue => board.sourceImpedances?.[k] ?? board.sourceImpedance;
/** Per-phase feeder impedance of a board (falls back to the equal short form). */
export const lineImpedanceOf = (board: Board, k: number): ComplexValue => board.lineImpedances?.[k] ?? board.lineImpedance;

function terminalName(boardName: string | null, board: { loads: Board['loads'] }, terminal: Terminal): string {
  const at = boardName === null ? 'the board' : boardName;
  if (terminal === 'N') return boardName === null ? 'the board neutral bar' : `the neutral bar of ${boardName}`;
  if (terminal.startsWith('star:')) {
    const load = board.loads[Number(terminal.slice(5))];
    return `the star (wye) point of load ${quoteText(load?.name ?? terminal)}${boardName === null ? '' : ` on ${boardName}`}`;
  }
  return `phase ${terminal} at ${at}`;
}

/** Boards in feeding order, and each board's children. Assumes a valid tree (see installation rules). */
export function feedingOrder(installation: Installation): { order: number[]; children: number[][] } {
  const count = installation.subBoards.length + 1;
  const children: number[][] = Array.from({ length: count }, () => []);
  installation.subBoards.forEach((sb, i) => children[sb.fedFrom]!.push(i + 1));
  const order: number[] = [];
  const stack = [0];
  while (stack.length) {
    const b = stack.pop()!;
    order.push(b);
    for (let c = children[b]!.length - 1; c >= 0; c--) stack.push(children[b]![c]!);
  }
  return { order, children };
}

export function buildInstallationCircuit(installation: Installation): InstallationCircuit {
  const main = installation.main;
  const named = installation.subBoards.length > 0;
  const nodeNames: string[] = [];
  const addNode = (name: string) => nodeNames.push(name) - 1;
  const elements: CircuitElement[] = [];
  const sources: CircuitSource[] = [];
  const branches: CircuitBranch[] = [];
  const count = installation.subBoards.length + 1;
  const topologies: NetworkTopology[] = new Array(count);
  const branchOffset: number[] = new Array(count);
  const feederElements: InstallationCircuit['feederElements'][number][] = new Array(count).fill(null);
  const { order, children } = feedingOrder(installation);
  const addElement = (from: number, to: number, z: ComplexValue) => elements.push({ from, to, admittance: inverse(z) }) - 1;

  const addLoads = (boardName: string | null, loads: Board['loads'], terminalNode: Map<Terminal, number>) => {
    for (const load of loads)
      for (const b of load.branches)
        for (const t of [b.from, b.to]) if (!terminalNode.has(t)) terminalNode.set(t, addNode(terminalName(boardName, { loads }, t)));
  };
  const pushBranches = (loads: Board['loads'], terminalNode: Map<Terminal, number>) => {
    for (const load of loads)
      for (const b of load.branches) branches.push({ from: terminalNode.get(b.from)!, to: terminalNode.get(b.to)!, sNominal: b.sNominal, vNominal: b.vNominal, zip: b.zip });
  };

  // Main board: supply folded into the service feeder.
  const mainName = named ? main.name : null;
  const terminalNode = new Map<Terminal, number>();
  const busNode: number[] = [];
  main.phases.forEach((phase) => {
    const bus = addNode(terminalName(mainName, main, phase));
    busNode.push(bus);
    terminalNode.set(phase, bus);
  });
  let star = REFERENCE;
  if (main.sourceStarImpedance && !isZero(main.sourceStarImpedance) && !main.openDeltaCorner) {
    star = addNode('the source star (wye) point');
    addElement(star, REFERENCE, main.sourceStarImpedance);
  }
  const corner = main.openDeltaCorner ? main.phases.indexOf(main.openDeltaCorner) : -1;
  const mainSources: number[] = [];
  let sameLine: ComplexValue | null | undefined;
  main.phases.forEach((_, k) => {
    const winding = k === corner ? ZERO : sourceImpedanceOf(main, k);
    const z = add(winding, lineImpedanceOf(main, k));
    const emf = corner >= 0 ? sub(main.emf[k]!, main.emf[corner]!) : main.emf[k]!;
    const admittance = isZero(z) ? null : inverse(z);
    sameLine = k === 0 ? admittance : sameLine && admittance && admittance.re === sameLine.re && admittance.im === sameLine.im ? sameLine : undefined;
    mainSources.push(sources.push({ plus: busNode[k]!, minus: star, emf, admittance }) - 1);
  });
  let neutralNode: number | undefined;
  let neutralAdmittance: ComplexValue | null = null;
  if (main.hasNeutral) {
    const solid = isZero(main.neutralImpedance) && !main.neutralOpen;
    neutralNode = solid ? REFERENCE : addNode(terminalName(mainName, main, 'N'));
    if (!solid && !main.neutralOpen) {
      neutralAdmittance = inverse(main.neutralImpedance);
      addElement(neutralNode, REFERENCE, main.neutralImpedance);
    }
    terminalNode.set('N', neutralNode);
  }
  addLoads(mainName, main.loads, terminalNode);
  topologies[0] = { nodeNames, terminalNode, sourceNode: busNode, busNode, lineAdmittance: sameLine ?? null, neutralAdmittance, neutralNode };

  // Sub-boards, each after the board feeding it.
  for (const b of order) {
    if (b === 0) continue;
    const sb = installation.subBoards[b - 1]!;
    const parent = topologies[sb.fedFrom]!;
    const nodes = new Map<Terminal, number>();
    const buses: number[] = [];
    const lines: (number | null)[] = [];
    main.phases.forEach((phase: PhaseId, k) => {
      const z = sb.feeder.lineImpedances[k]!;
      const from = parent.busNode[k]!;
      if (isZero(z)) {
        buses.push(from);
        lines.push(null);
      } else {
        const bus = addNode(terminalName(sb.name, sb, phase));
        buses.push(bus);
        lines.push(addElement(from, bus, z));
      }
      nodes.set(phase, buses[k]!);
    });
    let bar: number | undefined;
    let neutral: number | null = null;
    let barAdmittance: ComplexValue | null = null;
    if (main.hasNeutral) {
      const parentBar = parent.neutralNode!;
      if (!sb.feeder.neutralOpen && isZero(sb.feeder.neutralImpedance)) bar = parentBar;
      else {
        bar = addNode(terminalName(sb.name, sb, 'N'));
        if (!sb.feeder.neutralOpen) {
          neutral = addElement(bar, parentBar, sb.feeder.neutralImpedance);
          barAdmittance = inverse(sb.feeder.neutralImpedance);
        }
      }
      nodes.set('N', bar);
    }
    addLoads(sb.name, sb.loads, nodes);
    feederElements[b] = { lines, neutral };
    topologies[b] = { nodeNames, terminalNode: nodes, sourceNode: buses, busNode: buses, lineAdmittance: null, neutralAdmittance: barAdmittance, neutralNode: bar };
  }
  for (let b = 0; b < count; b++) {
    branchOffset[b] = branches.length;
    pushBranches(b === 0 ? main.loads : installation.subBoards[b - 1]!.loads, topologies[b]!.terminalNode as Map<Terminal, number>);
  }
  return {
    circuit: { nodeNames, elements, sources, branches, voltageBase: main.nominalLineToNeutralV },
    topologies,
    branchOffset,
    order,
    children,
    feederElements,
    mainSources,
  };
}
