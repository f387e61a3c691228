/**
 * The general batch path on the compiled network (network/compiledNetwork.ts):
 * any board — 3- or 4-wire, line-to-line and floating-star loads. Each edge
 * becomes three circuit branches (its constant-impedance, -current and -power
 * parts) whose powers are overwritten per interval, so the compiled pattern,
 * the load iteration and its stopping rule are the general solver's own.
 */
import { compileBoard } from '../network/solveNetwork.js';
import { REFERENCE } from '../network/circuit.js';
import type { Board, BoardLoad, ZipFractions } from '../board/boardModel.js';
import type { BatchNetwork } from './batchNetwork.js';
import { newIntervalState, referenceAtCentroid, resolveKernelOptions, type BatchKernel, type KernelOptions } from './batchKernel.js';

const PARTS: readonly ZipFractions[] = [
  { z: 1, i: 0, p: 0 },
  { z: 0, i: 1, p: 0 },
  { z: 0, i: 0, p: 1 },
];

export function createCompiledKernel(net: BatchNetwork, options?: KernelOptions): BatchKernel {
  const opts = resolveKernelOptions(options);
  const { board } = net;
  // One load per edge with its three parts; a 1 VA placeholder marks every edge as conducting.
  const loads: BoardLoad[] = net.edges.map((e, k) => ({
    name: `edge ${k}`,
    connection: board.loads[0]?.connection ?? 'A-N',
    model: 'zip',
    origin: 'added',
    branches: PARTS.map((zip) => ({ from: e.from, to: e.to, sNominal: { re: 1, im: 0 }, vNominal: e.vNominal, zip })),
  }));
  const edgeBoard: Board = { ...board, loads };
  const { topology, network } = compileBoard(edgeBoard);
  const np = board.phases.length;
  const state = newIntervalState(np);
  const emf = board.emf;
  const yl = topology.lineAdmittance;
  const yn = topology.neutralAdmittance;
  const busNode = Int32Array.from(topology.busNode);
  const neutralNode = topology.neutralNode ?? REFERENCE;
  const branchFrom = Int32Array.from(network.circuit.branches, (b) => b.from);
  const branchTo = Int32Array.from(network.circuit.branches, (b) => b.to);
  const vRe = (node: number) => (node === REFERENCE ? 0 : network.voltageRe[node]!);
  const vIm = (node: number) => (node === REFERENCE ? 0 : network.voltageIm[node]!);
  // Edges of each floating star point: when all are off in an interval the point is tied to nothing,
  // which leaves the nodal matrix singular. Such an interval gives those edges a 1 µVA constant-impedance
  // placeholder (nanoampere currents, far below any figure shown), so the point sits at the centroid of
  // its phases, as an unloaded star point does.
  const starEdges = [...new Set(net.edges.flatMap((e) => [e.from, e.to]).filter((t) => t.startsWith('star:')))].map((t) =>
    net.edges.flatMap((e, k) => (e.from === t || e.to === t ? [k] : [])),
  );
  const PLACEHOLDER_VA = 1e-6;
  const solveOptions = { tolerance: opts.tolerance, maxIterations: opts.maxIterations, lowVoltageThreshold: opts.lowVoltageThreshold };

  return {
    path: 'nodal',
    state,
    solve(powers, interval) {
      for (let b = 0; b < network.branchCount; b++) {
        network.powerRe[b] = powers[2 * b]!;
        network.powerIm[b] = powers[2 * b + 1]!;
      }
      for (const edges of starEdges) {
        let off = true;
        for (const e of edges) for (let j = 0; j < 6 && off; j++) if (powers[e * 6 + j] !== 0) off = false;
        if (off) for (const e of edges) network.powerRe[3 * e] = PLACEHOLDER_VA;
      }
      try {
        network.solve(solveOptions);
      } catch (error) {
        if (error instanceof Error) error.message = `interval ${interval + 1}: ${error.message}`;
        throw error;
      }
      let inRe = 0;
      let inIm = 0;
      for (let k = 0; k < np; k++) {
        const bus = busNode[k]!;
        const br = vRe(bus);
        const bi = vIm(bus);
        state.busRe[k] = br;
        state.busIm[k] = bi;
        let ir = 0;
        let ii = 0;
        if (yl) {
          const dr = emf[k]!.re - br;
          const di = emf[k]!.im - bi;
          ir = yl.re * dr - yl.im * di;
          ii = yl.re * di + yl.im * dr;
        } else {
          // A stiff bus: its current is what the branches leaving it carry.
          for (let b = 0; b < network.branchCount; b++) {
            const sign = branchFrom[b] === bus ? 1 : branchTo[b] === bus ? -1 : 0;
            if (sign === 0) continue;
            const dr = network.branchVoltageRe(b);
            const di = network.branchVoltageIm(b);
            ir += sign * (network.admittanceRe[b]! * dr - network.admittanceIm[b]! * di);
            ii += sign * (network.admittanceRe[b]! * di + network.admittanceIm[b]! * dr);
          }
        }
        state.lineRe[k] = ir;
        state.lineIm[k] = ii;
        inRe += ir;
        inIm += ii;
      }
      if (board.hasNeutral) {
        state.reference[0] = vRe(neutralNode);
        state.reference[1] = vIm(neutralNode);
        if (board.neutralOpen) state.neutral.fill(0);
        else if (yn) {
          state.neutral[0] = yn.re * state.reference[0]! - yn.im * state.reference[1]!;
          state.neutral[1] = yn.re * state.reference[1]! + yn.im * state.reference[0]!;
        } else {
          state.neutral[0] = inRe;
          state.neutral[1] = inIm;
        }
      } else {
        referenceAtCentroid(state, np);
        state.neutral.fill(0);
      }
      state.iterations = network.iterations;
    },
  };
}
