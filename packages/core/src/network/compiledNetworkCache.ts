/**
 * Compiled networks kept for circuits met again. A study that solves one installation
 * in many states (the capacitor duty: every bank state, tolerance end and load
 * condition, at the fundamental and every harmonic order) builds circuits that differ
 * only in their load branches' values, and compiling each afresh cost about a quarter
 * of a `trivar correct` run with harmonic data.
 *
 * What a linear solve (`CompiledNetwork.solveLinear`) reads of its compile: the node
 * numbering, the fixed elements and sources as stamped, and the sparse pattern, which
 * follows the branch ends and which nodes are live — and a node joined to the rest only
 * through branches that draw no power is dead (compiledNetwork.ts, `liveNodes`). So a
 * network compiled for a circuit equal in all of that, to the bit, solves another
 * exactly as its own compile would, handed back with its branch admittances and
 * injections cleared, as a compile leaves them, for the caller to write.
 *
 * The load flow (`CompiledNetwork.solve`) reads the branches' nominal voltages and ZIP
 * fractions too (its Newton pairs and load ports are built from them at compile time),
 * and their powers, which it reads only while solving: a network for an equal circuit
 * whose branches also agree in voltage and ZIP fractions is handed back with the new
 * powers written in, and every solve starts from nominal, whatever the network solved
 * before.
 */
import type { ComplexValue } from '../complex.js';
import type { Installation } from '../board/boardModel.js';
import type { Circuit } from './circuit.js';
import { compileCircuit, liveNodes, type CompiledNetwork } from './compiledNetwork.js';
import { buildInstallationCircuit } from './installationCircuit.js';
import type { CompiledInstallation } from './solveNetwork.js';

/**
 * Most compiled networks one cache keeps: a duty check holds one per order and set of
 * live nodes (a few dozen); past this a circuit is compiled and not kept, so a caller
 * that never meets a circuit twice costs memory once.
 */
const MAX_KEPT = 256;

/**
 * Which nodes are live, one character each: the part of a compile that follows the branch powers.
 * @param powers the branches' powers in place of the circuit's own
 */
export function liveKey(circuit: Circuit, powers?: readonly ComplexValue[]): string {
  let key = '';
  for (const live of liveNodes(circuit, powers)) key += live ? '1' : '0';
  return key;
}

/**
 * True when a network compiled for `a` solves `b` linearly as `b`'s own compile would,
 * given the same live nodes (see the module comment).
 */
export function sameLinearNetwork(a: Circuit, b: Circuit): boolean {
  if (a.nodeNames.length !== b.nodeNames.length || a.elements.length !== b.elements.length || a.sources.length !== b.sources.length || a.branches.length !== b.branches.length)
    return false;
  if (!Object.is(a.voltageBase, b.voltageBase)) return false;
  for (let i = 0; i < a.elements.length; i++) {
    const x = a.elements[i]!;
    const y = b.elements[i]!;
    if (x.from !== y.from || x.to !== y.to || !Object.is(x.admittance.re, y.admittance.re) || !Object.is(x.admittance.im, y.admittance.im)) return false;
  }
  for (let i = 0; i < a.sources.length; i++) {
    const x = a.sources[i]!;
    const y = b.sources[i]!;
    if (x.plus !== y.plus || x.minus !== y.minus || !Object.is(x.emf.re, y.emf.re) || !Object.is(x.emf.im, y.emf.im)) return false;
    if (x.admittance === null || y.admittance === null) {
      if (x.admittance !== y.admittance) return false;
    } else if (!Object.is(x.admittance.re, y.admittance.re) || !Object.is(x.admittance.im, y.admittance.im)) return false;
  }
  for (let i = 0; i < a.branches.length; i++) {
    const x = a.branches[i]!;
    const y = b.branches[i]!;
    if (x.from !== y.from || x.to !== y.to) return false;
  }
  // Names last: they only word errors, and equal structure nearly always means equal names.
  for (let i = 0; i < a.nodeNames.length; i++) if (a.nodeNames[i] !== b.nodeNames[i]) return false;
  return true;
}

/** True when, beyond `sameLinearNetwork`, every branch of `a` and `b` has the same nominal voltage and ZIP fractions. */
export function sameLoadFlowNetwork(a: Circuit, b: Circuit): boolean {
  if (!sameLinearNetwork(a, b)) return false;
  for (let i = 0; i < a.branches.length; i++) {
    const x = a.branches[i]!;
    const y = b.branches[i]!;
    if (!Object.is(x.vNominal, y.vNominal) || !Object.is(x.zip.z, y.zip.z) || !Object.is(x.zip.i, y.zip.i) || !Object.is(x.zip.p, y.zip.p)) return false;
  }
  return true;
}

/** A network as a compile leaves it for `solveLinear`: no branch admittances, no injections. */
function clearForLinearSolve(network: CompiledNetwork): void {
  network.admittanceRe.fill(0);
  network.admittanceIm.fill(0);
  network.injectionRe.fill(0);
  network.injectionIm.fill(0);
}

/** Compiled networks found again by their circuit (see the module comment). */
export class CompiledNetworkCache {
  /** Networks by their live nodes; each list holds circuits that differ otherwise (e.g. by harmonic order). */
  private readonly kept = new Map<string, CompiledNetwork[]>();
  private count = 0;
  /** Networks compiled, and solves handed a kept one: what the cache saves, for tests and profiling. */
  compiled = 0;
  reused = 0;

  /**
   * The installation laid out as a circuit, with a network for its linear solves
   * (`solveLinear`): one kept for an equal circuit, admittances and injections cleared,
   * or a new compile.
   */
  compileForLinearSolve(installation: Installation): CompiledInstallation {
    return this.laidOut(installation, sameLinearNetwork, clearForLinearSolve);
  }

  /**
   * A network `compileForLinearSolve` gave, handed back for another linear solve of a circuit the
   * caller knows to be equal to the one it was compiled for (so nothing is laid out or compared):
   * admittances and injections cleared.
   */
  againForLinearSolve(compiled: CompiledInstallation): CompiledInstallation {
    clearForLinearSolve(compiled.network);
    this.reused++;
    return compiled;
  }

  /**
   * The installation laid out as a circuit, with a network for its load flow (`solve`):
   * one kept for an equal circuit with the same branch voltages and ZIP fractions, its
   * injections cleared and the circuit's branch powers written in, or a new compile.
   */
  compileForLoadFlow(installation: Installation): CompiledInstallation {
    return this.laidOut(installation, sameLoadFlowNetwork, (found, circuit) => {
      found.injectionRe.fill(0);
      found.injectionIm.fill(0);
      circuit.branches.forEach((b, k) => {
        found.powerRe[k] = b.sNominal.re;
        found.powerIm[k] = b.sNominal.im;
      });
    });
  }

  /**
   * A network `compileForLoadFlow` gave, handed back for the load flow of `installation`, which the
   * caller knows to lay out as the one it was compiled for but for its branch powers (`powers`, in
   * circuit order) and to have the same live nodes: injections cleared, the powers written in. The
   * layout is the earlier installation's (the same nodes, elements, sources and branch ends).
   */
  againForLoadFlow(compiled: CompiledInstallation, installation: Installation, powers: readonly ComplexValue[]): CompiledInstallation {
    const network = compiled.network;
    if (powers.length !== network.branchCount) throw new RangeError(`againForLoadFlow: ${network.branchCount} branch powers expected (received ${powers.length})`);
    network.injectionRe.fill(0);
    network.injectionIm.fill(0);
    powers.forEach((s, k) => {
      network.powerRe[k] = s.re;
      network.powerIm[k] = s.im;
    });
    this.reused++;
    return { installation, layout: compiled.layout, network };
  }

  /** The installation's circuit with a kept network `same` accepts, made ready by `reset`, or a new compile. */
  private laidOut(installation: Installation, same: (a: Circuit, b: Circuit) => boolean, reset: (found: CompiledNetwork, circuit: Circuit) => void): CompiledInstallation {
    const layout = buildInstallationCircuit(installation);
    const key = liveKey(layout.circuit);
    const found = this.find(layout.circuit, key, same);
    if (found) reset(found, layout.circuit);
    return { installation, layout, network: found ?? this.compile(layout.circuit, key) };
  }

  private find(circuit: Circuit, key: string, same: (a: Circuit, b: Circuit) => boolean): CompiledNetwork | undefined {
    const found = this.kept.get(key)?.find((net) => same(net.circuit, circuit));
    if (found) this.reused++;
    return found;
  }

  private compile(circuit: Circuit, key: string): CompiledNetwork {
    const network = compileCircuit(circuit);
    this.compiled++;
    if (this.count < MAX_KEPT) {
      const list = this.kept.get(key);
      if (list) list.push(network);
      else this.kept.set(key, [network]);
      this.count++;
    }
    return network;
  }
}
