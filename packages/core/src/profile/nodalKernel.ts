/**
 * The general batch path: nodal analysis of any board (3- or 4-wire, line-to-
 * line and floating-star loads) on typed arrays, built once and reused for
 * every interval.
 *
 * Unknowns are the node voltages that the source does not fix: the phase
 * buses when the line has impedance, the neutral bar when its conductor has
 * impedance (or is open), and floating star points. Fixed nodes (the star
 * point, buses fed without impedance) move to the right-hand side. The dense
 * complex LU is written out here on Float64Arrays because the systems are a
 * handful of unknowns solved hundreds of thousands of times: the general
 * solver's object-per-entry LU would allocate on every interval.
 */
import type { Terminal } from '../board/boardModel.js';
import { NumericalError } from '../errors.js';
import type { BatchNetwork } from './batchNetwork.js';
import {
  edgeAdmittance,
  isLinearInterval,
  iterationSettled,
  newIntervalState,
  resolveKernelOptions,
  type BatchKernel,
  modulus,
  type KernelOptions,
} from './batchKernel.js';

/** Node numbering: ≥ 0 unknown, FIXED_BASE − k the bus of phase k held at its EMF, STAR the source star point. */
const STAR = -1;
const FIXED_BASE = -2;

export function createNodalKernel(net: BatchNetwork, options?: KernelOptions): BatchKernel {
  const opts = resolveKernelOptions(options);
  const { board } = net;
  const np = board.phases.length;
  const state = newIntervalState(np);
  const zr = board.sourceImpedance.re + board.lineImpedance.re;
  const zi = board.sourceImpedance.im + board.lineImpedance.im;
  const seriesZ = zr !== 0 || zi !== 0;
  const zm = zr * zr + zi * zi;
  const ylRe = seriesZ ? zr / zm : 0;
  const ylIm = seriesZ ? -zi / zm : 0;
  const zn = board.neutralImpedance;
  const solidNeutral = board.hasNeutral && !board.neutralOpen && zn.re === 0 && zn.im === 0;
  const znm = zn.re * zn.re + zn.im * zn.im;
  const ynRe = board.hasNeutral && !board.neutralOpen && !solidNeutral ? zn.re / znm : 0;
  const ynIm = board.hasNeutral && !board.neutralOpen && !solidNeutral ? -zn.im / znm : 0;

  const nodeOf = new Map<Terminal, number>();
  const names: string[] = [];
  board.phases.forEach((p, k) => {
    if (seriesZ) nodeOf.set(p, names.push(`phase ${p} at the board`) - 1);
    else nodeOf.set(p, FIXED_BASE - k);
  });
  if (board.hasNeutral) nodeOf.set('N', solidNeutral ? STAR : names.push('the board neutral bar') - 1);
  for (const e of net.edges)
    for (const t of [e.from, e.to]) if (!nodeOf.has(t)) nodeOf.set(t, names.push(`the star point ${t}`) - 1);
  const n = names.length;
  const neutralNode = board.hasNeutral ? nodeOf.get('N')! : STAR;
  const edgeFrom = Int32Array.from(net.edges, (e) => nodeOf.get(e.from)!);
  const edgeTo = Int32Array.from(net.edges, (e) => nodeOf.get(e.to)!);
  const edgeV0 = Float64Array.from(net.edges, (e) => e.vNominal);
  const emfRe = Float64Array.from(board.emf, (e) => e.re);
  const emfIm = Float64Array.from(board.emf, (e) => e.im);

  const aRe = new Float64Array(n * n);
  const aIm = new Float64Array(n * n);
  const bRe = new Float64Array(n);
  const bIm = new Float64Array(n);
  const vRe = new Float64Array(n);
  const vIm = new Float64Array(n);
  const yRe = new Float64Array(net.edges.length);
  const yIm = new Float64Array(net.edges.length);
  const y = new Float64Array(2);
  const vBase = board.nominalLineToNeutralV;

  const knownRe = (node: number) => (node === STAR ? 0 : node <= FIXED_BASE ? emfRe[FIXED_BASE - node]! : vRe[node]!);
  const knownIm = (node: number) => (node === STAR ? 0 : node <= FIXED_BASE ? emfIm[FIXED_BASE - node]! : vIm[node]!);

  function assemble(): void {
    aRe.fill(0);
    aIm.fill(0);
    bRe.fill(0);
    bIm.fill(0);
    if (seriesZ)
      for (let k = 0; k < np; k++) {
        const p = k; // buses are the first unknowns
        aRe[p * n + p] = aRe[p * n + p]! + ylRe;
        aIm[p * n + p] = aIm[p * n + p]! + ylIm;
        bRe[p] = bRe[p]! + ylRe * emfRe[k]! - ylIm * emfIm[k]!;
        bIm[p] = bIm[p]! + ylRe * emfIm[k]! + ylIm * emfRe[k]!;
      }
    if (neutralNode >= 0) {
      aRe[neutralNode * n + neutralNode] = aRe[neutralNode * n + neutralNode]! + ynRe;
      aIm[neutralNode * n + neutralNode] = aIm[neutralNode * n + neutralNode]! + ynIm;
    }
    for (let e = 0; e < net.edges.length; e++) {
      const gr = yRe[e]!;
      const gi = yIm[e]!;
      if (gr === 0 && gi === 0) continue;
      const p = edgeFrom[e]!;
      const q = edgeTo[e]!;
      if (p >= 0) {
        aRe[p * n + p] = aRe[p * n + p]! + gr;
        aIm[p * n + p] = aIm[p * n + p]! + gi;
      }
      if (q >= 0) {
        aRe[q * n + q] = aRe[q * n + q]! + gr;
        aIm[q * n + q] = aIm[q * n + q]! + gi;
      }
      if (p >= 0 && q >= 0) {
        aRe[p * n + q] = aRe[p * n + q]! - gr;
        aIm[p * n + q] = aIm[p * n + q]! - gi;
        aRe[q * n + p] = aRe[q * n + p]! - gr;
        aIm[q * n + p] = aIm[q * n + p]! - gi;
      } else if (p >= 0) {
        const vr = knownRe(q);
        const vi = knownIm(q);
        bRe[p] = bRe[p]! + gr * vr - gi * vi;
        bIm[p] = bIm[p]! + gr * vi + gi * vr;
      } else if (q >= 0) {
        const vr = knownRe(p);
        const vi = knownIm(p);
        bRe[q] = bRe[q]! + gr * vr - gi * vi;
        bIm[q] = bIm[q]! + gr * vi + gi * vr;
      }
    }
    // A node nothing live touches (a star point of a load that is off this interval) is pinned at 0 V.
    for (let i = 0; i < n; i++) {
      let empty = true;
      for (let j = 0; j < n && empty; j++) if (aRe[i * n + j] !== 0 || aIm[i * n + j] !== 0) empty = false;
      if (empty) aRe[i * n + i] = 1;
    }
  }

  /** Gaussian elimination with partial pivoting on (a, b) in place; the solution lands in (vRe, vIm). */
  function factorAndSolve(interval: number): void {
    for (let c = 0; c < n; c++) {
      let pivot = c;
      let best = modulus(aRe[c * n + c]!, aIm[c * n + c]!);
      for (let r = c + 1; r < n; r++) {
        const m = modulus(aRe[r * n + c]!, aIm[r * n + c]!);
        if (m > best) {
          best = m;
          pivot = r;
        }
      }
      if (best === 0 || !Number.isFinite(best))
        throw new NumericalError('singular', `interval ${interval + 1}: the voltage of ${names[c] ?? 'a node'} is not fixed (the admittances meeting there cancel)`);
      if (pivot !== c) {
        for (let j = 0; j < n; j++) {
          let t = aRe[c * n + j]!;
          aRe[c * n + j] = aRe[pivot * n + j]!;
          aRe[pivot * n + j] = t;
          t = aIm[c * n + j]!;
          aIm[c * n + j] = aIm[pivot * n + j]!;
          aIm[pivot * n + j] = t;
        }
        let t = bRe[c]!;
        bRe[c] = bRe[pivot]!;
        bRe[pivot] = t;
        t = bIm[c]!;
        bIm[c] = bIm[pivot]!;
        bIm[pivot] = t;
      }
      const pr = aRe[c * n + c]!;
      const pi = aIm[c * n + c]!;
      const pm = pr * pr + pi * pi;
      for (let r = c + 1; r < n; r++) {
        const xr = aRe[r * n + c]!;
        const xi = aIm[r * n + c]!;
        if (xr === 0 && xi === 0) continue;
        const fr = (xr * pr + xi * pi) / pm;
        const fi = (xi * pr - xr * pi) / pm;
        for (let j = c; j < n; j++) {
          const ur = aRe[c * n + j]!;
          const ui = aIm[c * n + j]!;
          aRe[r * n + j] = aRe[r * n + j]! - (fr * ur - fi * ui);
          aIm[r * n + j] = aIm[r * n + j]! - (fr * ui + fi * ur);
        }
        bRe[r] = bRe[r]! - (fr * bRe[c]! - fi * bIm[c]!);
        bIm[r] = bIm[r]! - (fr * bIm[c]! + fi * bRe[c]!);
      }
    }
    for (let r = n - 1; r >= 0; r--) {
      let sr = bRe[r]!;
      let si = bIm[r]!;
      for (let j = r + 1; j < n; j++) {
        sr -= aRe[r * n + j]! * vRe[j]! - aIm[r * n + j]! * vIm[j]!;
        si -= aRe[r * n + j]! * vIm[j]! + aIm[r * n + j]! * vRe[j]!;
      }
      const pr = aRe[r * n + r]!;
      const pi = aIm[r * n + r]!;
      const pm = pr * pr + pi * pi;
      vRe[r] = (sr * pr + si * pi) / pm;
      vIm[r] = (si * pr - sr * pi) / pm;
    }
  }

  const oldRe = new Float64Array(n);
  const oldIm = new Float64Array(n);
  const edgeVoltage = (e: number) => modulus(knownRe(edgeFrom[e]!) - knownRe(edgeTo[e]!), knownIm(edgeFrom[e]!) - knownIm(edgeTo[e]!));

  function linearSolve(powers: Float64Array, atNominal: boolean, interval: number): number {
    for (let e = 0; e < net.edges.length; e++) {
      edgeAdmittance(powers, e, edgeV0[e]!, atNominal ? edgeV0[e]! : edgeVoltage(e), opts.lowVoltageThreshold, y);
      yRe[e] = y[0]!;
      yIm[e] = y[1]!;
    }
    oldRe.set(vRe);
    oldIm.set(vIm);
    assemble();
    factorAndSolve(interval);
    let change = 0;
    for (let i = 0; i < n; i++) change = Math.max(change, modulus(vRe[i]! - oldRe[i]!, vIm[i]! - oldIm[i]!));
    return change / vBase;
  }

  function readOut(): void {
    let inRe = 0;
    let inIm = 0;
    for (let k = 0; k < np; k++) {
      const bus = nodeOf.get(board.phases[k]!)!;
      state.busRe[k] = knownRe(bus);
      state.busIm[k] = knownIm(bus);
      let ir = 0;
      let ii = 0;
      if (seriesZ) {
        const dr = emfRe[k]! - state.busRe[k]!;
        const di = emfIm[k]! - state.busIm[k]!;
        ir = ylRe * dr - ylIm * di;
        ii = ylRe * di + ylIm * dr;
      } else {
        for (let e = 0; e < net.edges.length; e++) {
          const sign = edgeFrom[e] === bus ? 1 : edgeTo[e] === bus ? -1 : 0;
          if (sign === 0) continue;
          const dr = knownRe(edgeFrom[e]!) - knownRe(edgeTo[e]!);
          const di = knownIm(edgeFrom[e]!) - knownIm(edgeTo[e]!);
          ir += sign * (yRe[e]! * dr - yIm[e]! * di);
          ii += sign * (yRe[e]! * di + yIm[e]! * dr);
        }
      }
      state.lineRe[k] = ir;
      state.lineIm[k] = ii;
      inRe += ir;
      inIm += ii;
    }
    if (board.hasNeutral) {
      state.reference[0] = knownRe(neutralNode);
      state.reference[1] = knownIm(neutralNode);
      if (board.neutralOpen) state.neutral.fill(0);
      else if (solidNeutral) {
        state.neutral[0] = inRe;
        state.neutral[1] = inIm;
      } else {
        state.neutral[0] = ynRe * state.reference[0]! - ynIm * state.reference[1]!;
        state.neutral[1] = ynRe * state.reference[1]! + ynIm * state.reference[0]!;
      }
    } else {
      let cr = 0;
      let ci = 0;
      for (let k = 0; k < np; k++) {
        cr += state.busRe[k]!;
        ci += state.busIm[k]!;
      }
      state.reference[0] = cr / np;
      state.reference[1] = ci / np;
      state.neutral.fill(0);
    }
  }

  return {
    path: 'nodal',
    state,
    solve(powers, interval) {
      linearSolve(powers, true, interval);
      let iterations = 1;
      if (!isLinearInterval(net, powers)) {
        let previous = 0;
        for (;;) {
          const change = linearSolve(powers, false, interval);
          iterations++;
          if (!Number.isFinite(change)) throw new NumericalError('non-finite', `interval ${interval + 1}: the load iteration produced non-finite voltages`);
          if (iterationSettled(change, previous, opts.tolerance)) break;
          previous = change;
          if (iterations >= opts.maxIterations)
            throw new NumericalError('no-convergence', `interval ${interval + 1}: the voltage-dependent loads did not settle after ${iterations} iterations; the loads may exceed what the supply can deliver`);
        }
      }
      readOut();
      state.iterations = iterations;
    },
  };
}
