/**
 * The batch path on an installation: every board and feeder in one compiled
 * circuit (network/installationCircuit.ts), the drivers reaching loads on any
 * board. As on a single board (compiledKernel.ts) each edge — the loads of one
 * board between the same two terminals — becomes three circuit branches (its
 * constant-impedance, -current and -power parts) whose powers are overwritten
 * per interval, so the pattern, load iteration and stopping rule are the
 * general solver's own. After each solve every board's state is read as
 * readInstallationSolution reads it: bus voltages, the current in its incomer
 * (the supply at the main board, its feeder at a sub-board) and its neutral.
 */
import type { BoardLoad, Installation, Terminal, ZipFractions } from '../board/boardModel.js';
import { REFERENCE } from '../network/circuit.js';
import { compileInstallation } from '../network/solveNetwork.js';
import { compileCircuit, type CompiledNetwork } from '../network/compiledNetwork.js';
import { foldDrivers, edgePowersAt, type BatchEdge, type DriverColumns, type DriverSpec } from './batchNetwork.js';
import { newIntervalState, referenceAtCentroid, resolveKernelOptions, type IntervalState, type KernelOptions } from './batchKernel.js';
import { allocateFigures, recordInterval, type IntervalFigures } from './solveBatch.js';
import { assertInstallationModel } from '../board/modelGuards.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

/** An edge on one board (0 = main, i + 1 = subBoards[i]). */
export interface InstallationEdge extends BatchEdge {
  readonly board: number;
}

export interface InstallationBatchNetwork {
  readonly installation: Installation;
  readonly edges: readonly InstallationEdge[];
  readonly drivers: readonly DriverSpec[];
  /** As BatchNetwork.coefficients: [driver][edge][part][re, im]. */
  readonly coefficients: Float64Array;
}

/**
 * Groups every board's load branches into edges and folds the drivers onto them.
 * @param loads every load the drivers index (each board's, metered phases too), with `loadBoards[l]` its board
 * @param extraEdges edges equipment added later needs (capacitor steps on a board)
 */
export function compileInstallationBatch(
  installation: Installation,
  loads: readonly BoardLoad[],
  loadBoards: readonly number[],
  drivers: readonly DriverSpec[],
  extraEdges: readonly InstallationEdge[] = [],
): InstallationBatchNetwork {
  assertInstallationModel(installation);
  const folded = foldDrivers(
    loads,
    (l, b) => ({ board: loadBoards[l]!, from: b.from, to: b.to, vNominal: b.vNominal }),
    (e) => `${e.board}|${e.from}|${e.to}|${e.vNominal}`,
    drivers,
    extraEdges,
  );
  return { installation, edges: folded.edges, drivers, coefficients: folded.coefficients };
}

/** The edge on a board between two terminals at a nominal voltage, or -1. */
export function installationEdgeIndex(net: InstallationBatchNetwork, edge: InstallationEdge): number {
  return net.edges.findIndex((e) => e.board === edge.board && e.from === edge.from && e.to === edge.to && e.vNominal === edge.vNominal);
}

const PARTS: readonly ZipFractions[] = [
  { z: 1, i: 0, p: 0 },
  { z: 0, i: 1, p: 0 },
  { z: 0, i: 0, p: 1 },
];

export interface InstallationKernel {
  /** Per board (board number): its solved interval, overwritten by each solve. */
  readonly states: readonly IntervalState[];
  /** Solves one interval from its edge powers (see edgePowersAt); `interval` only names it in errors. */
  solve(edgePowers: Float64Array, interval: number): void;
}

/** Branch indices (with the sign of their current into the terminal's node: +1 leaving) of one board's terminal. */
type Incidence = { readonly branch: Int32Array; readonly sign: Float64Array };

export function createInstallationKernel(net: InstallationBatchNetwork, options?: KernelOptions): InstallationKernel {
  checkObjectArgument(net, 'net', 'an installation batch network from compileInstallationBatch(...)', ['installation', 'edges', 'coefficients']);
  const opts = resolveKernelOptions(options);
  const { installation } = net;
  const main = installation.main;
  const count = installation.subBoards.length + 1;
  const boardEdges: number[][] = Array.from({ length: count }, () => []);
  net.edges.forEach((e, k) => boardEdges[e.board]!.push(k));
  // One load per edge with its three parts; a 1 VA placeholder marks every edge as conducting.
  const edgeLoads = (b: number): BoardLoad[] =>
    boardEdges[b]!.map((k) => {
      const e = net.edges[k]!;
      return { name: `edge ${k}`, connection: 'A-N', model: 'zip', origin: 'added', branches: PARTS.map((zip) => ({ from: e.from, to: e.to, sNominal: { re: 1, im: 0 }, vNominal: e.vNominal, zip })) };
    });
  const edgeInstallation: Installation = { ...installation, main: { ...main, loads: edgeLoads(0) }, subBoards: installation.subBoards.map((sb, i) => ({ ...sb, loads: edgeLoads(i + 1) })) };
  const { layout, network: compiled } = compileInstallation(edgeInstallation);
  const circuit = layout.circuit;
  const edgeBranch = new Int32Array(net.edges.length);
  boardEdges.forEach((edges, b) => edges.forEach((k, j) => (edgeBranch[k] = layout.branchOffset[b]! + 3 * j)));
  const np = main.phases.length;
  const hasNeutral = main.hasNeutral;
  const incidence = (b: number, t: Terminal): Incidence => {
    const branch: number[] = [];
    const sign: number[] = [];
    for (const k of boardEdges[b]!) {
      const e = net.edges[k]!;
      const s = e.from === t ? 1 : e.to === t ? -1 : 0;
      if (s !== 0) for (let m = 0; m < 3; m++) branch.push(edgeBranch[k]! + m), sign.push(s);
    }
    return { branch: Int32Array.from(branch), sign: Float64Array.from(sign) };
  };
  const phaseIncidence = Array.from({ length: count }, (_, b) => main.phases.map((p) => incidence(b, p)));
  const neutralIncidence = Array.from({ length: count }, (_, b) => incidence(b, 'N'));
  const neutralOpen = (b: number) => (b === 0 ? main.neutralOpen : installation.subBoards[b - 1]!.feeder.neutralOpen);
  // Edges of each floating star point (per board). An interval with all of them off leaves the point tied to
  // nothing: the general solve then drops it as a dead node, so here the circuit is compiled once more for each
  // set of switched-off star points met (with those edges dead), and that interval is solved on it.
  const starKeys = [...new Set(net.edges.flatMap((e) => [e.from, e.to].filter((t) => t.startsWith('star:')).map((t) => `${e.board}|${t}`)))];
  const starEdges = starKeys.map((key) => net.edges.flatMap((e, k) => (`${e.board}|${e.from}` === key || `${e.board}|${e.to}` === key ? [k] : [])));
  const variants = new Map<string, CompiledNetwork>([['', compiled]]);
  const variantOf = (off: string): CompiledNetwork => {
    let found = variants.get(off);
    if (!found) {
      const dead = new Set<number>();
      off.split(',').forEach((s) => starEdges[Number(s)]!.forEach((e) => [0, 1, 2].forEach((m) => dead.add(edgeBranch[e]! + m))));
      found = compileCircuit({ ...circuit, branches: circuit.branches.map((b, k) => (dead.has(k) ? { ...b, sNominal: { re: 0, im: 0 } } : b)) });
      variants.set(off, found);
    }
    return found;
  };
  let network = compiled;
  const solveOptions = { tolerance: opts.tolerance, maxIterations: opts.maxIterations, lowVoltageThreshold: opts.lowVoltageThreshold };
  const states = Array.from({ length: count }, () => newIntervalState(np));
  const vRe = (node: number) => (node === REFERENCE ? 0 : network.voltageRe[node]!);
  const vIm = (node: number) => (node === REFERENCE ? 0 : network.voltageIm[node]!);
  const isLive = (node: number) => node === REFERENCE || network.live[node] === 1;
  const current = { re: 0, im: 0 };
  /** Current into a board's terminal from its loads' branches, summed as `own` in readInstallationSolution. */
  const own = (inc: Incidence) => {
    let re = 0;
    let im = 0;
    for (let j = 0; j < inc.branch.length; j++) {
      const b = inc.branch[j]!;
      // A branch of a switched-off star point is dead in this interval's circuit: it carries nothing.
      if (!isLive(circuit.branches[b]!.from) || !isLive(circuit.branches[b]!.to)) continue;
      const dr = network.branchVoltageRe(b);
      const di = network.branchVoltageIm(b);
      const s = inc.sign[j]!;
      re += s * (network.admittanceRe[b]! * dr - network.admittanceIm[b]! * di);
      im += s * (network.admittanceRe[b]! * di + network.admittanceIm[b]! * dr);
    }
    current.re = re;
    current.im = im;
  };
  const elementCurrent = (e: number) => {
    const el = circuit.elements[e]!;
    const dr = vRe(el.from) - vRe(el.to);
    const di = vIm(el.from) - vIm(el.to);
    current.re = el.admittance.re * dr - el.admittance.im * di;
    current.im = el.admittance.re * di + el.admittance.im * dr;
  };

  return {
    states,
    solve(powers, interval) {
      let offStars = '';
      starEdges.forEach((edges, s) => {
        let off = true;
        for (const e of edges) for (let j = 0; j < 6 && off; j++) if (powers[e * 6 + j] !== 0) off = false;
        if (off) offStars += offStars ? `,${s}` : String(s);
      });
      network = variantOf(offStars);
      for (let k = 0; k < net.edges.length; k++) {
        const base = edgeBranch[k]!;
        for (let m = 0; m < 3; m++) {
          network.powerRe[base + m] = powers[k * 6 + 2 * m]!;
          network.powerIm[base + m] = powers[k * 6 + 2 * m + 1]!;
        }
      }
      try {
        network.solve(solveOptions);
      } catch (error) {
        if (error instanceof Error) error.message = `interval ${interval + 1}: ${error.message}`;
        throw error;
      }
      // Children first: where a conductor has no impedance its current is found by KCL at the board.
      for (let o = layout.order.length - 1; o >= 0; o--) {
        const b = layout.order[o]!;
        const state = states[b]!;
        const topo = layout.topologies[b]!;
        const children = layout.children[b]!;
        const feeder = layout.feederElements[b];
        for (let k = 0; k < np; k++) {
          const bus = topo.busNode[k]!;
          state.busRe[k] = vRe(bus);
          state.busIm[k] = vIm(bus);
          const source = b === 0 ? circuit.sources[layout.mainSources[k]!]! : null;
          const line = feeder ? feeder.lines[k] : null;
          if (source?.admittance) {
            const y = source.admittance;
            const dr = source.emf.re - (vRe(source.plus) - vRe(source.minus));
            const di = source.emf.im - (vIm(source.plus) - vIm(source.minus));
            current.re = y.re * dr - y.im * di;
            current.im = y.re * di + y.im * dr;
          } else if (line !== null && line !== undefined) elementCurrent(line);
          else {
            own(phaseIncidence[b]![k]!);
            for (const c of children) {
              current.re += states[c]!.lineRe[k]!;
              current.im += states[c]!.lineIm[k]!;
            }
          }
          state.lineRe[k] = current.re;
          state.lineIm[k] = current.im;
        }
        const bar = topo.neutralNode;
        if (hasNeutral && bar !== undefined && isLive(bar)) {
          state.reference[0] = vRe(bar);
          state.reference[1] = vIm(bar);
        } else {
          referenceAtCentroid(state, np);
        }
        if (!hasNeutral || neutralOpen(b)) {
          state.neutral.fill(0);
          continue;
        }
        if (b === 0 && topo.neutralAdmittance) {
          const y = topo.neutralAdmittance;
          current.re = y.re * state.reference[0]! - y.im * state.reference[1]!;
          current.im = y.re * state.reference[1]! + y.im * state.reference[0]!;
        } else if (b > 0 && feeder!.neutral !== null) elementCurrent(feeder!.neutral);
        else {
          own(neutralIncidence[b]!);
          current.re = -current.re;
          current.im = -current.im;
          for (const c of children) {
            current.re += states[c]!.neutral[0]!;
            current.im += states[c]!.neutral[1]!;
          }
        }
        state.neutral[0] = current.re;
        state.neutral[1] = current.im;
      }
      for (const s of states) s.iterations = network.iterations;
    },
  };
}

/** Per-interval figures of every board (board number = index). */
export const allocateBoardFigures = (installation: Installation, count: number): IntervalFigures[] =>
  Array.from({ length: installation.subBoards.length + 1 }, () => allocateFigures(count, installation.main.phases.length));

/**
 * Solves intervals of the drivers on the installation into each board's figures (same indices).
 * @throws {NumericalError} naming the interval that would not solve.
 */
export function solveInstallationBatch(
  net: InstallationBatchNetwork,
  columns: DriverColumns,
  out: readonly IntervalFigures[],
  options: KernelOptions & { readonly onProgress?: (done: number) => void } = {},
): void {
  const kernel = createInstallationKernel(net, options);
  const powers = new Float64Array(net.edges.length * 6);
  const sequence = net.installation.main.sequence;
  for (let i = 0; i < columns.count; i++) {
    edgePowersAt(net, columns, i, powers);
    kernel.solve(powers, i);
    kernel.states.forEach((s, b) => recordInterval(s, sequence, out[b]!, i));
    if (options.onProgress && i % 16384 === 16383) options.onProgress(i + 1);
  }
}
