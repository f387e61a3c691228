/**
 * Compile once, solve many: a circuit turned into numbered unknowns, a fixed
 * sparse pattern, the fixed admittances already stamped, and typed arrays for
 * every per-solve quantity. A solve copies the fixed part, stamps the load
 * admittances, factorises and substitutes — no per-element allocation.
 *
 * Folding: an EMF behind an admittance becomes its Norton equivalent (the
 * admittance on the diagonal, Y·E injected), so the source's internal node never
 * becomes an unknown; an ideal EMF fixes its node's voltage outright and moves
 * to the right-hand side. Nodes with no path to the reference are left out
 * (their voltage is NaN and `live` is 0).
 *
 * The fixed-point iteration for voltage-dependent loads is the one described in
 * solveNetwork.ts; it lives here so every caller (board solve, installation
 * solve, correction sizing, batches) shares it, and so does the Newton-type
 * shortcut to the same state (`solveByMagnitudes`).
 */
import { NumericalError } from '../errors.js';
import type { ComplexValue } from '../complex.js';
import { leastDeterminedUnknown, solveComplexSystem } from '../_internal/complexLu.js';
import { analysePattern, factorInPlace, forwardInOrder, substituteInOrder, type SparsePattern } from '../_internal/sparseComplexLu.js';
import { factorSolveFourInPlace, withPositionalSlots } from '../_internal/fourUnknownLu.js';
import { factorRealInPlace, invertReal3InPlace, multiplyReal3, solveRealFactored } from '../_internal/denseRealLu.js';
import { LoadPortReduction } from './loadPortReduction.js';
import { STEPS_CONTINUE, STEPS_DECLINED, STEPS_SETTLED, ThreePairPortSteps } from './threePairPortSteps.js';
import { iterationSettled, ROUND_OFF_CHANGE } from './iterationSettled.js';
import { REFERENCE, type Circuit } from './circuit.js';
import { resolveSolveOptions, type ResolvedSolveOptions, type SolveOptions } from './solveOptions.js';


/** The defaults, resolved once: a re-solve of a small network costs about a microsecond. */
const DEFAULT_OPTIONS = resolveSolveOptions();

/** A pivot this small against the largest diagonal sends the solve to the dense pivoted LU. */
const SPARSE_PIVOT_FLOOR = 1e-11;

/**
 * Newton on the load magnitudes is used up to this many node pairs carrying
 * voltage-dependent loads (a board has at most six, plus three per floating star).
 */
const MAX_PAIRS = 12;
/** Newton's answer is kept only where the fixed-point iteration contracts this fast (row sums of |φ'|). */
const CONTRACTION_LIMIT = 0.5;
/** Linear solves the Newton path may take before handing the solve to the fixed-point iteration. */
const MAX_NEWTON_SOLVES = 8;
/**
 * The Newton path solves through the load ports (loadPortReduction.ts) up to this many
 * unknowns and ports: a board has a handful of each; the dense transfer tables grow as
 * their product, and a large sparse network is cheaper to factorise than to reduce.
 */
const MAX_REDUCED_UNKNOWNS = 48;
const MAX_PORTS = 16;

const NODE_FREE = 1;
const NODE_FIXED = 2;

export class CompiledNetwork {
  readonly circuit: Circuit;
  readonly nodeCount: number;
  readonly branchCount: number;
  /** Per node: 1 when it has a path to the reference (its voltage is meaningful). */
  readonly live: Uint8Array;
  /** Node voltages of the last solve, V (NaN for dead nodes). Overwritten by the next solve. */
  readonly voltageRe: Float64Array;
  readonly voltageIm: Float64Array;
  /** Admittance each load branch was given in the last solve, S. */
  readonly admittanceRe: Float64Array;
  readonly admittanceIm: Float64Array;
  /** Complex power of each branch at its nominal voltage, VA; callers may overwrite between solves. */
  readonly powerRe: Float64Array;
  readonly powerIm: Float64Array;
  /**
   * Current injected into each node by ideal current sources, A: zero unless a
   * caller sets it (harmonic orders: non-linear loads as sources, see
   * solveFixedNetwork.ts). Read by `solveLinear`; an injection at a node an
   * ideal EMF fixes goes into that source.
   */
  readonly injectionRe: Float64Array;
  readonly injectionIm: Float64Array;
  /** Iterations and last voltage change (fraction of base) of the last solve. */
  iterations = 0;
  lastChange = 0;
  /** How the last solve ran: one linear solve, Newton on the load magnitudes, or the fixed-point iteration. */
  method: 'linear' | 'newton' | 'fixed-point' = 'linear';

  private readonly kind: Int8Array;
  private readonly unknownOf: Int32Array;
  private readonly nodeOfUnknown: Int32Array;
  /** Node of the unknown at each elimination position (the order `xRe/xIm` keep). */
  private readonly nodeAtPosition: Int32Array;
  private readonly pattern: SparsePattern;
  private readonly baseRe: Float64Array;
  private readonly baseIm: Float64Array;
  /**
   * Fixed right-hand side (the sources): by unknown number in the first `size` entries, then
   * the same by elimination position (the order `assemble` writes it in). One array for the
   * two: a typed array costs about half a microsecond to make, a good share of a compile.
   */
  private readonly baseRhsRe: Float64Array;
  private readonly baseRhsIm: Float64Array;
  private readonly workRe: Float64Array;
  private readonly workIm: Float64Array;
  private readonly rhsRe: Float64Array;
  private readonly rhsIm: Float64Array;
  private readonly xRe: Float64Array;
  private readonly xIm: Float64Array;
  private readonly previousRe: Float64Array;
  private readonly previousIm: Float64Array;
  private readonly diagonalSlots: Int32Array;
  // Per branch: nodes, the four stamp slots (-1 when that end is not an unknown), model.
  private readonly bFrom: Int32Array;
  private readonly bTo: Int32Array;
  private readonly bSlots: Int32Array;
  private readonly bActive: Uint8Array;
  private readonly vNominal: Float64Array;
  private readonly zipZ: Float64Array;
  private readonly zipI: Float64Array;
  private readonly zipP: Float64Array;
  private readonly allImpedance: boolean;
  // Newton on magnitudes (see solveByMagnitudes): one pair per node pair with a voltage-dependent branch.
  private readonly pairCount: number;
  private readonly pairOf: Int32Array;
  private readonly pairFrom: Int32Array;
  private readonly pairTo: Int32Array;
  /** Elimination position of each pair's two nodes (-1: the reference or a node an ideal EMF fixes). */
  private readonly pairPositionFrom: Int32Array;
  private readonly pairPositionTo: Int32Array;
  private readonly pairNominal: Float64Array;
  private readonly magnitude: Float64Array;
  private readonly slopeRe: Float64Array;
  private readonly slopeIm: Float64Array;
  private readonly residual: Float64Array;
  /** Each pair's voltage (from − to) in the last solve, and the current (dY/dm)·v the Jacobian uses. */
  private readonly pairRe: Float64Array;
  private readonly pairIm: Float64Array;
  private readonly driveRe: Float64Array;
  private readonly driveIm: Float64Array;
  private readonly transferRe: Float64Array;
  private readonly transferIm: Float64Array;
  private readonly jacobian: Float64Array;
  private readonly pivots: Int32Array;
  private readonly columnRe: Float64Array;
  private readonly columnIm: Float64Array;
  private factored = false;
  private readonly fourUnknowns: boolean;
  /**
   * The network reduced to its load ports, where the Newton path solves through them
   * (null: it assembles and factorises). Built at compile time, so that every solve of
   * a network, the first included, takes the same arithmetic: a network compiled once
   * and re-solved gives to the last bit what a fresh compile and solve gives.
   */
  private readonly reduction: LoadPortReduction | null = null;
  /** The first Newton steps written out, where three pairs are the only ports (see threePairPortSteps.ts). */
  private readonly threePairSteps: ThreePairPortSteps | null = null;
  /** Whether the last solve's Newton path went through `reduction`. */
  private throughPorts = false;
  /** Port of each branch in `reduction` (-1: inactive, or no end is an unknown); ports 0…pairCount−1 are the pairs. */
  private portOf: number[] = [];
  /** Set by admittancesAtMagnitudes: a voltage-dependent branch is held below the low-voltage threshold. */
  private held = false;

  constructor(circuit: Circuit) {
    this.circuit = circuit;
    const n = circuit.nodeNames.length;
    this.nodeCount = n;
    this.injectionRe = new Float64Array(n);
    this.injectionIm = new Float64Array(n);
    this.branchCount = circuit.branches.length;
    const m = this.branchCount;
    this.powerRe = new Float64Array(m);
    this.powerIm = new Float64Array(m);
    this.vNominal = new Float64Array(m);
    this.zipZ = new Float64Array(m);
    this.zipI = new Float64Array(m);
    this.zipP = new Float64Array(m);
    this.bFrom = new Int32Array(m);
    this.bTo = new Int32Array(m);
    let allImpedance = true;
    for (let k = 0; k < m; k++) {
      const b = circuit.branches[k]!;
      this.powerRe[k] = b.sNominal.re;
      this.powerIm[k] = b.sNominal.im;
      this.vNominal[k] = b.vNominal;
      this.zipZ[k] = b.zip.z;
      this.zipI[k] = b.zip.i;
      this.zipP[k] = b.zip.p;
      this.bFrom[k] = b.from;
      this.bTo[k] = b.to;
      if (b.zip.z !== 1) allImpedance = false;
    }
    this.allImpedance = allImpedance;

    // Which nodes reach the reference through something that conducts.
    this.live = liveNodes(circuit);
    // Ideal EMFs fix their nodes; the rest of the live nodes are unknowns.
    this.kind = new Int8Array(n);
    this.voltageRe = new Float64Array(n).fill(Number.NaN);
    this.voltageIm = new Float64Array(n).fill(Number.NaN);
    for (let v = 0; v < n; v++) if (this.live[v]) this.kind[v] = NODE_FREE;
    for (const s of circuit.sources) {
      if (s.admittance) continue;
      const base = s.minus === REFERENCE ? { re: 0, im: 0 } : this.kind[s.minus] === NODE_FIXED ? { re: this.voltageRe[s.minus]!, im: this.voltageIm[s.minus]! } : null;
      if (!base || this.kind[s.plus] === NODE_FIXED)
        throw new RangeError('compileNetwork: an ideal EMF must hang from the reference or from a node an earlier ideal EMF fixes, and fix a node only once');
      this.kind[s.plus] = NODE_FIXED;
      this.voltageRe[s.plus] = base.re + s.emf.re;
      this.voltageIm[s.plus] = base.im + s.emf.im;
    }
    this.unknownOf = new Int32Array(n).fill(-1);
    const nodeOfUnknown: number[] = [];
    for (let v = 0; v < n; v++) if (this.kind[v] === NODE_FREE) this.unknownOf[v] = nodeOfUnknown.push(v) - 1;
    this.nodeOfUnknown = new Int32Array(nodeOfUnknown);
    const size = nodeOfUnknown.length;

    const pairs: [number, number][] = [];
    const u = (v: number) => (v === REFERENCE ? -1 : this.unknownOf[v]!);
    const pair = (a: number, b: number) => {
      const i = u(a);
      const j = u(b);
      if (i >= 0 && j >= 0) pairs.push([i, j]);
    };
    for (const e of circuit.elements) pair(e.from, e.to);
    for (const s of circuit.sources) if (s.admittance) pair(s.plus, s.minus);
    this.bActive = new Uint8Array(m);
    circuit.branches.forEach((b, k) => {
      const fromLive = b.from === REFERENCE || this.live[b.from] === 1;
      const toLive = b.to === REFERENCE || this.live[b.to] === 1;
      if (fromLive && toLive) {
        this.bActive[k] = 1;
        pair(b.from, b.to);
      }
    });
    // Four unknowns (a three-phase four-wire board): the written-out solve of fourUnknownLu.ts.
    this.fourUnknowns = size === 4;
    this.pattern = this.fourUnknowns ? withPositionalSlots(analysePattern(size, pairs)) : analysePattern(size, pairs);
    const p = this.pattern;
    this.nodeAtPosition = Int32Array.from(p.order, (u) => this.nodeOfUnknown[u]!);
    this.diagonalSlots = new Int32Array(size);
    for (let i = 0; i < size; i++) this.diagonalSlots[i] = p.slotOf(i, i);

    // Fixed part of the matrix and right-hand side.
    this.baseRe = new Float64Array(p.slotCount);
    this.baseIm = new Float64Array(p.slotCount);
    this.baseRhsRe = new Float64Array(2 * size);
    this.baseRhsIm = new Float64Array(2 * size);
    const stampFixed = (a: number, b: number, y: ComplexValue) => {
      const i = u(a);
      const j = u(b);
      if (i >= 0) {
        const d = p.slotOf(i, i);
        this.baseRe[d] = this.baseRe[d]! + (y.re);
        this.baseIm[d] = this.baseIm[d]! + (y.im);
        if (j >= 0) {
          const ij = p.slotOf(i, j);
          const ji = p.slotOf(j, i);
          this.baseRe[ij] = this.baseRe[ij]! - (y.re);
          this.baseIm[ij] = this.baseIm[ij]! - (y.im);
          this.baseRe[ji] = this.baseRe[ji]! - (y.re);
          this.baseIm[ji] = this.baseIm[ji]! - (y.im);
        } else if (b !== REFERENCE && this.kind[b] === NODE_FIXED) this.addRhs(i, y, this.voltageRe[b]!, this.voltageIm[b]!);
      }
      if (j >= 0) {
        const d = p.slotOf(j, j);
        this.baseRe[d] = this.baseRe[d]! + (y.re);
        this.baseIm[d] = this.baseIm[d]! + (y.im);
        if (i < 0 && a !== REFERENCE && this.kind[a] === NODE_FIXED) this.addRhs(j, y, this.voltageRe[a]!, this.voltageIm[a]!);
      }
    };
    for (const e of circuit.elements) stampFixed(e.from, e.to, e.admittance);
    for (const s of circuit.sources) {
      if (!s.admittance) continue;
      stampFixed(s.plus, s.minus, s.admittance);
      // Norton: Y·E injected into plus, drawn from minus.
      const jr = s.admittance.re * s.emf.re - s.admittance.im * s.emf.im;
      const ji = s.admittance.re * s.emf.im + s.admittance.im * s.emf.re;
      const ip = u(s.plus);
      const im = u(s.minus);
      if (ip >= 0) {
        this.baseRhsRe[ip] = this.baseRhsRe[ip]! + (jr);
        this.baseRhsIm[ip] = this.baseRhsIm[ip]! + (ji);
      }
      if (im >= 0) {
        this.baseRhsRe[im] = this.baseRhsRe[im]! - (jr);
        this.baseRhsIm[im] = this.baseRhsIm[im]! - (ji);
      }
    }
    for (let k = 0; k < size; k++) {
      this.baseRhsRe[size + k] = this.baseRhsRe[p.order[k]!]!;
      this.baseRhsIm[size + k] = this.baseRhsIm[p.order[k]!]!;
    }
    this.bSlots = new Int32Array(4 * m).fill(-1);
    for (let k = 0; k < m; k++) {
      if (!this.bActive[k]) continue;
      const i = u(this.bFrom[k]!);
      const j = u(this.bTo[k]!);
      if (i >= 0) this.bSlots[4 * k] = p.slotOf(i, i);
      if (j >= 0) this.bSlots[4 * k + 1] = p.slotOf(j, j);
      if (i >= 0 && j >= 0) {
        this.bSlots[4 * k + 2] = p.slotOf(i, j);
        this.bSlots[4 * k + 3] = p.slotOf(j, i);
      }
    }
    this.workRe = new Float64Array(p.slotCount);
    this.workIm = new Float64Array(p.slotCount);
    this.rhsRe = new Float64Array(size);
    this.rhsIm = new Float64Array(size);
    this.xRe = new Float64Array(size);
    this.xIm = new Float64Array(size);
    this.previousRe = new Float64Array(size);
    this.previousIm = new Float64Array(size);
    this.admittanceRe = new Float64Array(m);
    this.admittanceIm = new Float64Array(m);

    // Node pairs carrying voltage-dependent branches (loads of one connection share one).
    this.pairOf = new Int32Array(m).fill(-1);
    const pairKey = new Map<number, number>();
    const pairFrom: number[] = [];
    const pairTo: number[] = [];
    const pairNominal: number[] = [];
    for (let k = 0; k < m; k++) {
      if (!this.bActive[k] || (this.zipI[k] === 0 && this.zipP[k] === 0)) continue;
      const a = this.bFrom[k]!;
      const b = this.bTo[k]!;
      const key = (Math.min(a, b) + 1) * (n + 1) + Math.max(a, b) + 1;
      let pair = pairKey.get(key);
      if (pair === undefined) {
        pair = pairFrom.push(a) - 1;
        pairTo.push(b);
        pairNominal.push(this.vNominal[k]!);
        pairKey.set(key, pair);
      }
      this.pairOf[k] = pair;
    }
    const q = pairFrom.length;
    this.pairCount = q;
    this.pairFrom = new Int32Array(pairFrom);
    this.pairTo = new Int32Array(pairTo);
    this.pairNominal = new Float64Array(pairNominal);
    const positionOf = (v: number) => (v === REFERENCE || this.unknownOf[v]! < 0 ? -1 : p.position[this.unknownOf[v]!]!);
    this.pairPositionFrom = Int32Array.from(pairFrom, positionOf);
    this.pairPositionTo = Int32Array.from(pairTo, positionOf);
    const newton = q <= MAX_PAIRS ? q : 0;
    this.magnitude = new Float64Array(newton);
    this.slopeRe = new Float64Array(newton);
    this.slopeIm = new Float64Array(newton);
    this.residual = new Float64Array(newton);
    this.pairRe = new Float64Array(newton);
    this.pairIm = new Float64Array(newton);
    this.driveRe = new Float64Array(newton);
    this.driveIm = new Float64Array(newton);
    this.transferRe = new Float64Array(newton * newton);
    this.transferIm = new Float64Array(newton * newton);
    this.jacobian = new Float64Array(newton * newton);
    this.pivots = new Int32Array(newton);
    this.columnRe = new Float64Array(newton * size);
    this.columnIm = new Float64Array(newton * size);

    if (newton > 0 && size <= MAX_REDUCED_UNKNOWNS) this.reduction = this.portReduction(pairKey, pairFrom, pairTo, positionOf);
    if (q === 3 && this.reduction !== null && this.reduction.portCount === 3)
      this.threePairSteps = new ThreePairPortSteps(
        {
          count: m,
          pairOf: this.pairOf,
          portOf: this.portOf,
          active: this.bActive,
          vNominal: this.vNominal,
          zipZ: this.zipZ,
          zipI: this.zipI,
          zipP: this.zipP,
          powerRe: this.powerRe,
          powerIm: this.powerIm,
        },
        this.reduction,
      );
  }

  /**
   * The load ports (the pairs first, in the same order and orientation, then the node
   * pairs of the other active branches) and the reduction to them; null where there
   * are too many ports or the reduction declines (see loadPortReduction.ts).
   */
  private portReduction(pairKey: Map<number, number>, pairFrom: readonly number[], pairTo: readonly number[], positionOf: (v: number) => number): LoadPortReduction | null {
    const n = this.nodeCount;
    const m = this.branchCount;
    // Plain arrays: a typed array costs more to make than the few entries are worth here.
    const portOf: number[] = [];
    const portFrom = pairFrom.slice();
    const portTo = pairTo.slice();
    for (let k = 0; k < m; k++) {
      portOf.push(-1);
      if (!this.bActive[k]) continue;
      if (this.pairOf[k]! >= 0) {
        portOf[k] = this.pairOf[k]!;
        continue;
      }
      const a = this.bFrom[k]!;
      const b = this.bTo[k]!;
      if (positionOf(a) < 0 && positionOf(b) < 0) continue;
      // The pairs' keys, extended by the ports beyond them.
      const key = (Math.min(a, b) + 1) * (n + 1) + Math.max(a, b) + 1;
      let port = pairKey.get(key);
      if (port === undefined) {
        port = portFrom.push(a) - 1;
        portTo.push(b);
        pairKey.set(key, port);
      }
      portOf[k] = port;
    }
    this.portOf = portOf;
    if (portFrom.length > MAX_PORTS) return null;
    const fixedRe = (v: number) => (v !== REFERENCE && this.kind[v] === NODE_FIXED ? this.voltageRe[v]! : 0);
    const fixedIm = (v: number) => (v !== REFERENCE && this.kind[v] === NODE_FIXED ? this.voltageIm[v]! : 0);
    return LoadPortReduction.build(
      this.pattern,
      this.baseRe,
      this.baseIm,
      this.baseRhsRe,
      this.baseRhsIm,
      portFrom.map(positionOf),
      portTo.map(positionOf),
      portFrom.map((a, i) => fixedRe(a) - fixedRe(portTo[i]!)),
      portFrom.map((a, i) => fixedIm(a) - fixedIm(portTo[i]!)),
    );
  }

  /**
   * True when the last solve's Newton path went through the load ports
   * (loadPortReduction.ts) rather than assembling and factorising the nodal matrix
   * each time: a small network whose fixed part reduces.
   */
  get solvedThroughPorts(): boolean {
    return this.throughPorts;
  }

  /** Number of unknowns the linear solves work on. */
  get unknownCount(): number {
    return this.pattern.size;
  }

  private addRhs(i: number, y: ComplexValue, vr: number, vi: number): void {
    this.baseRhsRe[i] = this.baseRhsRe[i]! + (y.re * vr - y.im * vi);
    this.baseRhsIm[i] = this.baseRhsIm[i]! + (y.re * vi + y.im * vr);
  }

  /** True when branch k has both terminals live (it carries current). */
  isBranchActive(k: number): boolean {
    return this.bActive[k] === 1;
  }

  /** Voltage across branch k (from − to) in the last solve; 0 when inactive. */
  branchVoltageRe(k: number): number {
    return this.nodeRe(this.bFrom[k]!) - this.nodeRe(this.bTo[k]!);
  }
  branchVoltageIm(k: number): number {
    return this.nodeIm(this.bFrom[k]!) - this.nodeIm(this.bTo[k]!);
  }
  private nodeRe(v: number): number {
    return v === REFERENCE ? 0 : this.voltageRe[v]!;
  }
  private nodeIm(v: number): number {
    return v === REFERENCE ? 0 : this.voltageIm[v]!;
  }

  /** Sets every branch admittance to what it draws at voltage magnitude (per branch) or nominal. */
  private updateAdmittances(atNominal: boolean, threshold: number): void {
    const vRe = this.voltageRe;
    const vIm = this.voltageIm;
    for (let k = 0; k < this.branchCount; k++) {
      const v0 = this.vNominal[k]!;
      let v = v0;
      if (!atNominal) {
        v = 0;
        if (this.bActive[k]) {
          // |V| as sqrt(re² + im²): Math.hypot's overflow guard is not needed at board voltages and cost a third of an iteration.
          const from = this.bFrom[k]!;
          const to = this.bTo[k]!;
          const dr = (from === REFERENCE ? 0 : vRe[from]!) - (to === REFERENCE ? 0 : vRe[to]!);
          const di = (from === REFERENCE ? 0 : vIm[from]!) - (to === REFERENCE ? 0 : vIm[to]!);
          v = Math.sqrt(dr * dr + di * di);
        }
      }
      const ratio = v0 / Math.max(v, threshold * v0);
      const factor = (this.zipZ[k]! + this.zipI[k]! * ratio + this.zipP[k]! * ratio * ratio) / (v0 * v0);
      this.admittanceRe[k] = this.powerRe[k]! * factor;
      this.admittanceIm[k] = -this.powerIm[k]! * factor;
    }
  }

  /**
   * One linear solve with the present branch admittances (`admittanceRe/Im`):
   * fills the node voltages. Public so batch callers can set admittances directly.
   * @throws {NumericalError} when the network is singular.
   */
  solveLinear(): void {
    const p = this.pattern;
    const re = this.workRe;
    const im = this.workIm;
    // The right-hand side straight into `x`, in elimination order, where the substitution works on it.
    this.assemble(re, im, this.xRe, this.xIm);
    let scale = 0;
    for (let i = 0; i < p.size; i++) {
      const d = this.diagonalSlots[i]!;
      const size = Math.abs(re[d]!) + Math.abs(im[d]!);
      if (size > scale) scale = size;
    }
    const floor = SPARSE_PIVOT_FLOOR * scale;
    const failed = this.fourUnknowns ? factorSolveFourInPlace(re, im, this.xRe, this.xIm, floor * floor) : factorInPlace(p, re, im, SPARSE_PIVOT_FLOOR, scale);
    this.factored = failed < 0;
    // The unknowns stay in elimination order (`x`), which saves permuting them back each solve.
    if (failed >= 0) this.solveDense();
    else if (!this.fourUnknowns) substituteInOrder(p, re, im, this.xRe, this.xIm, 0);
    this.scatterVoltages();
  }

  /** The nodal matrix (by slot) and right-hand side (by elimination position) at the present admittances. */
  private assemble(re: Float64Array, im: Float64Array, rhsRe: Float64Array, rhsIm: Float64Array): void {
    // TypedArray.set (a memmove): even on a four-unknown board's 16 slots the two calls cost less than
    // an element loop's checked copies (one nodal solve 3,427 → 2,961 instructions, cachegrind).
    re.set(this.baseRe);
    im.set(this.baseIm);
    const baseRhsRe = this.baseRhsRe;
    const baseRhsIm = this.baseRhsIm;
    const nodeAt = this.nodeAtPosition;
    const size = nodeAt.length;
    for (let k = 0; k < size; k++) {
      const v = nodeAt[k]!;
      rhsRe[k] = baseRhsRe[size + k]! + this.injectionRe[v]!;
      rhsIm[k] = baseRhsIm[size + k]! + this.injectionIm[v]!;
    }
    const slots = this.bSlots;
    for (let k = 0; k < this.branchCount; k++) {
      if (!this.bActive[k]) continue;
      const yr = this.admittanceRe[k]!;
      const yi = this.admittanceIm[k]!;
      const ii = slots[4 * k]!;
      const jj = slots[4 * k + 1]!;
      if (ii >= 0) {
        re[ii] = re[ii]! + (yr);
        im[ii] = im[ii]! + (yi);
      }
      if (jj >= 0) {
        re[jj] = re[jj]! + (yr);
        im[jj] = im[jj]! + (yi);
      }
      const ij = slots[4 * k + 2]!;
      if (ij >= 0) {
        const ji = slots[4 * k + 3]!;
        re[ij] = re[ij]! - (yr);
        im[ij] = im[ij]! - (yi);
        re[ji] = re[ji]! - (yr);
        im[ji] = im[ji]! - (yi);
      } else {
        // One end is fixed (or the reference): its known voltage moves to the right-hand side.
        const from = this.bFrom[k]!;
        const to = this.bTo[k]!;
        if (ii >= 0 && to !== REFERENCE && this.kind[to] === NODE_FIXED) {
          const i = this.pattern.position[this.unknownOf[from]!]!;
          rhsRe[i] = rhsRe[i]! + (yr * this.voltageRe[to]! - yi * this.voltageIm[to]!);
          rhsIm[i] = rhsIm[i]! + (yr * this.voltageIm[to]! + yi * this.voltageRe[to]!);
        } else if (jj >= 0 && from !== REFERENCE && this.kind[from] === NODE_FIXED) {
          const j = this.pattern.position[this.unknownOf[to]!]!;
          rhsRe[j] = rhsRe[j]! + (yr * this.voltageRe[from]! - yi * this.voltageIm[from]!);
          rhsIm[j] = rhsIm[j]! + (yr * this.voltageIm[from]! + yi * this.voltageRe[from]!);
        }
      }
    }
  }

  /** The dense pivoted LU on the same equations: for near-singular pivots, and to name the culprit node. */
  private solveDense(): void {
    const p = this.pattern;
    const n = p.size;
    const re = new Float64Array(p.slotCount);
    const im = new Float64Array(p.slotCount);
    const rhsRe = new Float64Array(n);
    const rhsIm = new Float64Array(n);
    this.assemble(re, im, rhsRe, rhsIm);
    const a: ComplexValue[][] = Array.from({ length: n }, (_, i) =>
      Array.from({ length: n }, (_, j) => {
        const s = p.slotOf(i, j);
        return s < 0 ? { re: 0, im: 0 } : { re: re[s]!, im: im[s]! };
      }),
    );
    const b = Array.from({ length: n }, (_, i) => ({ re: rhsRe[p.position[i]!]!, im: rhsIm[p.position[i]!]! }));
    const result = solveComplexSystem(a, b);
    if (!result.ok) {
      const node = this.nodeOfUnknown[leastDeterminedUnknown(a)];
      const what = node === undefined ? 'a source terminal' : this.circuit.nodeNames[node];
      throw new NumericalError(
        'singular',
        `the network has no unique solution: the voltage of ${what} is not fixed — the admittances meeting there cancel (series resonance of L and C) or form a loop of ideal sources`,
      );
    }
    result.x.forEach((x, i) => {
      this.xRe[p.position[i]!] = x.re;
      this.xIm[p.position[i]!] = x.im;
    });
  }

  /**
   * Solves the network: the fixed-point iteration over the load admittances (a
   * single linear solve when every branch is constant impedance), or where it is
   * sure to reach the same state, Newton's method on the load magnitudes
   * (`solveByMagnitudes`). Results are left in `voltageRe/Im`, `admittanceRe/Im`,
   * `iterations`, `lastChange`, `method`.
   * @throws {NumericalError} for a singular network or an iteration that does not settle.
   */
  solve(solveOptions?: SolveOptions): void {
    const options = solveOptions === undefined ? DEFAULT_OPTIONS : resolveSolveOptions(solveOptions);
    if (this.allImpedance || !(this.pairCount <= MAX_PAIRS && this.solveByMagnitudes(options))) {
      this.throughPorts = false;
      this.iterate(options);
    }
    this.assertFinite();
  }

  /**
   * The fixed-point iteration alone: the reference the Newton path is checked
   * against, and where `solve` goes when Newton declines.
   * @throws {NumericalError} for a singular network or an iteration that does not settle.
   */
  solveByFixedPoint(solveOptions?: SolveOptions): void {
    this.throughPorts = false;
    this.iterate(solveOptions === undefined ? DEFAULT_OPTIONS : resolveSolveOptions(solveOptions));
    this.assertFinite();
  }

  private assertFinite(): void {
    for (let i = 0; i < this.pattern.size; i++)
      if (!Number.isFinite(this.xRe[i]!) || !Number.isFinite(this.xIm[i]!))
        throw new NumericalError('non-finite', 'the solve produced a non-finite voltage; check for extreme impedance values');
  }

  /** The fixed-point iteration described in solveNetwork.ts. */
  private iterate(options: ResolvedSolveOptions): void {
    const threshold = options.lowVoltageThreshold;
    this.updateAdmittances(true, threshold);
    this.solveLinear();
    let iterations = 1;
    let lastChange = 0;
    if (!this.allImpedance) {
      const vBase = this.circuit.voltageBase;
      let previousChange = 0;
      for (;;) {
        this.keepVoltages();
        this.updateAdmittances(false, threshold);
        this.solveLinear();
        iterations++;
        lastChange = this.change() / vBase;
        if (!Number.isFinite(lastChange)) throw new NumericalError('non-finite', `the load iteration produced non-finite voltages at iteration ${iterations}`);
        const settled = iterationSettled(lastChange, previousChange, options.tolerance);
        const ratio = previousChange > 0 ? lastChange / previousChange : 0;
        previousChange = lastChange;
        if (settled) break;
        if (iterations >= options.maxIterations) {
          // The error left as the stop judges it, so the message never sets a change below the tolerance against it.
          const left = ratio < 1 ? (lastChange * ratio) / (1 - ratio) : Infinity;
          const leftWords = Number.isFinite(left) ? `an estimated ${(left * 100).toPrecision(3)} % left` : 'not shrinking';
          throw new NumericalError(
            'no-convergence',
            `the voltage-dependent loads did not settle after ${iterations} iterations (last voltage change ${(lastChange * 100).toPrecision(3)} % of nominal, ${leftWords}; tolerance ${(options.tolerance * 100).toPrecision(3)} %): the loads may exceed what the supply can deliver`,
          );
        }
      }
    }
    this.iterations = iterations;
    this.lastChange = lastChange;
    this.method = this.allImpedance ? 'linear' : 'fixed-point';
  }

  /** Copies the unknowns' voltages aside, for `change`. */
  private keepVoltages(): void {
    for (let i = 0; i < this.pattern.size; i++) {
      this.previousRe[i] = this.xRe[i]!;
      this.previousIm[i] = this.xIm[i]!;
    }
  }

  /** Largest node-voltage change since `keepVoltages`, V (NaN when a voltage is not finite). */
  private change(): number {
    let change2 = 0;
    for (let i = 0; i < this.pattern.size; i++) {
      const dr = this.xRe[i]! - this.previousRe[i]!;
      const di = this.xIm[i]! - this.previousIm[i]!;
      const d2 = dr * dr + di * di;
      if (d2 > change2 || Number.isNaN(d2)) change2 = d2;
    }
    return Math.sqrt(change2);
  }

  /**
   * Newton's method on the voltage magnitude of each node pair that carries a
   * voltage-dependent branch. The branch admittances hang on nothing else, so these
   * few numbers m are the whole non-linear problem, and the fixed-point iteration is
   * m → φ(m), the pairs' voltage magnitudes in the linear solve with the admittances
   * for m. Each solve (the first at nominal magnitudes, where that iteration starts
   * too) also gives, from the same factors, the derivative of the node voltages with
   * respect to each pair's magnitude (dV/dm = −Y⁻¹·e·(dY/dm)·v), hence φ', and the
   * magnitudes move by (I − φ')⁻¹·(φ(m) − m). On a small network whose fixed part
   * reduces to its load ports (loadPortReduction.ts) each solve is a dense one on the
   * ports, whose inverse is the transfer impedance φ' needs, and the node voltages of
   * the settled state are those of its last port solve (V_open − T·i); otherwise it assembles
   * and factorises the nodal matrix, and φ' takes one substitution per pair. The
   * state is kept only where the fixed-point iteration contracts at every step
   * (every row sum of |φ'| below CONTRACTION_LIMIT),
   * the steps shrink, and no load is ever held below the low-voltage threshold: then
   * it is the state that iteration settles on. It stops on the same estimate of the
   * error left (last change × the rate changes shrink). Returns false, with nothing
   * reported, to hand the solve to the fixed-point iteration, which then gives the
   * answer or the error it always gave.
   */
  private solveByMagnitudes(options: ResolvedSolveOptions): boolean {
    const q = this.pairCount;
    const threshold = options.lowVoltageThreshold;
    const vBase = this.circuit.voltageBase;
    const mag = this.magnitude;
    const res = this.residual;
    for (let g = 0; g < q; g++) mag[g] = this.pairNominal[g]!;
    const reduction = this.reduction;
    this.throughPorts = reduction !== null;
    if (reduction) this.openCircuit(reduction);
    let previousChange = 0;
    const most = Math.min(options.maxIterations, MAX_NEWTON_SOLVES);
    const steps = this.threePairSteps;
    if (steps !== null) {
      // The steps the loop below takes through the ports, written out.
      const outcome = steps.run(mag, most, threshold, options.tolerance, vBase, CONTRACTION_LIMIT, ROUND_OFF_CHANGE, this.xRe, this.xIm);
      if (outcome === STEPS_DECLINED) return false;
      if (outcome === STEPS_SETTLED) {
        // As below: the node voltages of the last port solve, at the state's admittances.
        this.admittancesAtMagnitudes(threshold, false);
        this.scatterVoltages();
        this.iterations = steps.solves;
        this.lastChange = steps.lastChange;
        this.method = 'newton';
        return true;
      }
      // Every step taken without settling: as the loop below, hand over to the fixed-point iteration.
      if (outcome === STEPS_CONTINUE) return false;
      for (let g = 0; g < q; g++) mag[g] = this.pairNominal[g]!; // a small port pivot: the loop below, from the start
    }
    for (let solves = 1; solves <= most; solves++) {
      // Through the ports wherever the network has them, the confirming solve too: a port
      // solve costs about two thirds of a nodal one (constant-power three-load board: 9,658 →
      // 8,029 instructions a solve, cachegrind), and its node voltages differ from a nodal
      // solve's in the last digits only (correction outputs: 1.8e-10 relative at most).
      const viaPorts = reduction !== null;
      this.admittancesAtMagnitudes(threshold, viaPorts);
      if (this.held) return false;
      let moved: number;
      if (viaPorts) {
        moved = reduction.solvePorts(this.xRe, this.xIm);
        if (moved < 0) return false;
        this.portResiduals(reduction);
      } else {
        if (reduction) this.keepVoltages();
        this.solveLinear();
        this.pairResiduals();
        moved = solves > 1 ? this.change() : 0;
      }
      if (solves > 1) {
        const change = moved / vBase;
        if (!Number.isFinite(change)) return false;
        const rate = solves > 2 ? Math.min(1, change / previousChange) : 1;
        // Settled when the error estimate is within tolerance and the magnitudes the admittances
        // assumed are the solved ones (as the fixed-point iteration's stop implies): a node voltage
        // can move far less than a load's assumed magnitude is off.
        let mismatch = 0;
        for (let g = 0; g < q; g++) mismatch = Math.max(mismatch, Math.abs(res[g]!));
        if ((change * rate <= options.tolerance || change <= ROUND_OFF_CHANGE) && mismatch <= options.tolerance * vBase) {
          // Through the ports, the node voltages are the last port solve's (V_open − T·i), which
          // differ from a nodal solve's in the last digits only: verdicts that compare quantities
          // equal in exact arithmetic (a single-phase board's line and neutral currents) allow for
          // round-off themselves (see ROUND_OFF_MARGIN in boardWarnings.ts).
          if (viaPorts) this.scatterVoltages();
          this.iterations = solves;
          this.lastChange = change;
          this.method = 'newton';
          return true;
        }
        if (solves > 2 && !(rate < 1)) return false;
        previousChange = change;
      }
      if (viaPorts) {
        reduction.loadedTransfer();
        if (!this.prepareJacobian(reduction.inverseRe, reduction.inverseIm, reduction.portCount)) return false;
      } else if (!this.factored) return false;
      else {
        this.pairSlopes(threshold);
        this.sparseTransfer();
        if (!this.prepareJacobian(this.transferRe, this.transferIm, q)) return false;
      }
      if (!viaPorts) this.keepVoltages();
      if (q === 3) multiplyReal3(this.jacobian, res);
      else solveRealFactored(this.jacobian, q, this.pivots, res);
      for (let g = 0; g < q; g++) {
        const next = mag[g]! + res[g]!;
        if (!(next > 0)) return false;
        mag[g] = next;
      }
    }
    return false;
  }

  /**
   * Branch admittances at the pairs' present magnitudes (`magnitude`); with `throughPorts`,
   * also their sums per load port and each pair's dY/dm (`pairSlopes`). Sets `held` when a
   * voltage-dependent branch is below the low-voltage threshold.
   */
  private admittancesAtMagnitudes(threshold: number, throughPorts: boolean): void {
    const magnitude = this.magnitude;
    const pairOf = this.pairOf;
    const portOf = this.portOf;
    const vNominal = this.vNominal;
    const zipZ = this.zipZ;
    const zipI = this.zipI;
    const zipP = this.zipP;
    const powerRe = this.powerRe;
    const powerIm = this.powerIm;
    let held = false;
    const ports = throughPorts ? this.reduction : null;
    const portRe = ports === null ? null : ports.admittanceRe;
    const portIm = ports === null ? null : ports.admittanceIm;
    if (portRe !== null && portIm !== null)
      for (let port = 0; port < portRe.length; port++) {
        portRe[port] = 0;
        portIm[port] = 0;
      }
    for (let k = 0; k < this.branchCount; k++) {
      const v0 = vNominal[k]!;
      const g = pairOf[k]!;
      // As updateAdmittances: a dead branch at zero volts; a constant-impedance one draws the same at any voltage.
      const v = g >= 0 ? magnitude[g]! : this.bActive[k] ? v0 : 0;
      const floor = threshold * v0;
      if (g >= 0 && v <= floor) held = true;
      const ratio = v0 / Math.max(v, floor);
      const zi = zipI[k]!;
      const zp = zipP[k]!;
      const factor = (zipZ[k]! + zi * ratio + zp * ratio * ratio) / (v0 * v0);
      const yr = powerRe[k]! * factor;
      const yi = -powerIm[k]! * factor;
      this.admittanceRe[k] = yr;
      this.admittanceIm[k] = yi;
      const port = portOf[k]!;
      if (portRe !== null && portIm !== null && port >= 0) {
        portRe[port] = portRe[port]! + yr;
        portIm[port] = portIm[port]! + yi;
      }
    }
    this.held = held;
    if (throughPorts) this.pairSlopes(threshold);
  }

  /**
   * Each pair's dY/dm at its present magnitude (zero where held), the ratio as
   * `admittancesAtMagnitudes` takes it: asked for only when a Newton step follows.
   */
  private pairSlopes(threshold: number): void {
    const slopeRe = this.slopeRe;
    const slopeIm = this.slopeIm;
    const magnitude = this.magnitude;
    const pairOf = this.pairOf;
    const vNominal = this.vNominal;
    const zipI = this.zipI;
    const zipP = this.zipP;
    const powerRe = this.powerRe;
    const powerIm = this.powerIm;
    for (let g = 0; g < this.pairCount; g++) {
      slopeRe[g] = 0;
      slopeIm[g] = 0;
    }
    for (let k = 0; k < this.branchCount; k++) {
      const g = pairOf[k]!;
      if (g < 0) continue;
      const v0 = vNominal[k]!;
      const v = magnitude[g]!;
      const floor = threshold * v0;
      if (!(v > floor)) continue;
      const ratio = v0 / Math.max(v, floor);
      const zi = zipI[k]!;
      const zp = zipP[k]!;
      const slope = -(zi * ratio + 2 * zp * ratio * ratio) / (v * v0 * v0);
      slopeRe[g] = slopeRe[g]! + powerRe[k]! * slope;
      slopeIm[g] = slopeIm[g]! - powerIm[k]! * slope;
    }
  }

  /** The right-hand side into the reduction: its sources alone (known since compile time) unless a caller injects current. */
  private openCircuit(reduction: LoadPortReduction): void {
    let injected = false;
    for (let i = 0; i < this.nodeOfUnknown.length; i++) {
      const v = this.nodeOfUnknown[i]!;
      if (this.injectionRe[v] !== 0 || this.injectionIm[v] !== 0) injected = true;
    }
    if (!injected) return reduction.openCircuit(null, null);
    const rhsRe = this.rhsRe;
    const rhsIm = this.rhsIm;
    for (let i = 0; i < this.nodeOfUnknown.length; i++) {
      const v = this.nodeOfUnknown[i]!;
      rhsRe[i] = this.baseRhsRe[i]! + this.injectionRe[v]!;
      rhsIm[i] = this.baseRhsIm[i]! + this.injectionIm[v]!;
    }
    reduction.openCircuit(rhsRe, rhsIm);
  }

  /** As `pairResiduals`, from the ports' voltages of the last solve through them (pair g is port g). */
  private portResiduals(reduction: LoadPortReduction): void {
    for (let g = 0; g < this.pairCount; g++) {
      const dr = reduction.voltageRe[g]!;
      const di = reduction.voltageIm[g]!;
      this.pairRe[g] = dr;
      this.pairIm[g] = di;
      this.residual[g] = Math.sqrt(dr * dr + di * di) - this.magnitude[g]!;
    }
  }

  /** The unknowns' voltages (`x`, elimination order) into the node voltages. */
  private scatterVoltages(): void {
    for (let k = 0; k < this.pattern.size; k++) {
      const v = this.nodeAtPosition[k]!;
      this.voltageRe[v] = this.xRe[k]!;
      this.voltageIm[v] = this.xIm[k]!;
    }
  }

  /** `residual` ← φ(m) − m: each pair's voltage magnitude in the last solve, less the one assumed. */
  private pairResiduals(): void {
    for (let g = 0; g < this.pairCount; g++) {
      const a = this.pairFrom[g]!;
      const b = this.pairTo[g]!;
      const dr = (a === REFERENCE ? 0 : this.voltageRe[a]!) - (b === REFERENCE ? 0 : this.voltageRe[b]!);
      const di = (a === REFERENCE ? 0 : this.voltageIm[a]!) - (b === REFERENCE ? 0 : this.voltageIm[b]!);
      this.pairRe[g] = dr;
      this.pairIm[g] = di;
      this.residual[g] = Math.sqrt(dr * dr + di * di) - this.magnitude[g]!;
    }
  }

  /**
   * `transfer` ← Z, the transfer impedance between pairs in the network just factorised:
   * Z = Fᵀ·D⁻¹·F where F = L⁻¹·E (one forward substitution per pair: the nodal matrix is
   * complex symmetric, see `forwardInOrder`).
   */
  private sparseTransfer(): void {
    const q = this.pairCount;
    const p = this.pattern;
    const size = p.size;
    const fRe = this.columnRe;
    const fIm = this.columnIm;
    const posFrom = this.pairPositionFrom;
    const posTo = this.pairPositionTo;
    const work = this.workRe;
    const workIm = this.workIm;
    for (let j = 0; j < q; j++) {
      const base = j * size;
      for (let k = 0; k < size; k++) {
        fRe[base + k] = 0;
        fIm[base + k] = 0;
      }
      if (posFrom[j]! >= 0) fRe[base + posFrom[j]!] = 1;
      if (posTo[j]! >= 0) fRe[base + posTo[j]!] = -1;
      forwardInOrder(p, work, workIm, fRe, fIm, base);
    }
    // 1/pivot per position (in `rhs`, which the next solve overwrites anyway).
    const invRe = this.rhsRe;
    const invIm = this.rhsIm;
    for (let k = 0; k < size; k++) {
      const d = p.diagonal[k]!;
      const dr = work[d]!;
      const di = workIm[d]!;
      const dd = dr * dr + di * di;
      invRe[k] = dr / dd;
      invIm[k] = -di / dd;
    }
    // Z(g, j) = Σ_k F_g[k]·F_j[k]/D_k, symmetric.
    const zRe = this.transferRe;
    const zIm = this.transferIm;
    for (let g = 0; g < q; g++) {
      const bg = g * size;
      for (let j = g; j < q; j++) {
        const bj = j * size;
        let zr = 0;
        let zi = 0;
        for (let k = 0; k < size; k++) {
          const ar = fRe[bg + k]!;
          const ai = fIm[bg + k]!;
          if (ar === 0 && ai === 0) continue;
          const br = fRe[bj + k]!;
          const bi = fIm[bj + k]!;
          const pr = ar * br - ai * bi;
          const pi = ar * bi + ai * br;
          zr += pr * invRe[k]! - pi * invIm[k]!;
          zi += pr * invIm[k]! + pi * invRe[k]!;
        }
        zRe[g * q + j] = zr;
        zIm[g * q + j] = zi;
        zRe[j * q + g] = zr;
        zIm[j * q + g] = zi;
      }
    }
  }

  /**
   * At the last solve, with `z` holding Z between the pairs there (row stride
   * `stride`): φ', the contraction check, and the factors of I − φ' (its inverse, for
   * three pairs). dv_g/dm_j = −Z(g, j)·(dY_j/dm)·v_j.
   * False when the fixed-point iteration would not contract there, or I − φ' is singular.
   */
  private prepareJacobian(zRe: Float64Array, zIm: Float64Array, stride: number): boolean {
    const q = this.pairCount;
    if (q === 3) return this.prepareThreePairJacobian(zRe, zIm, stride);
    for (let g = 0; g < q; g++) {
      // c_g = (dY_g/dm)·v_g: dv_h/dm_g = −Z(h, g)·c_g.
      const ur = this.pairRe[g]!;
      const ui = this.pairIm[g]!;
      this.driveRe[g] = this.slopeRe[g]! * ur - this.slopeIm[g]! * ui;
      this.driveIm[g] = this.slopeRe[g]! * ui + this.slopeIm[g]! * ur;
    }
    // I − φ', φ'(g, j) = Re(conj(v_g)·dv_g/dm_j)/|v_g|; every row sum of |φ'| below the limit.
    const jac = this.jacobian;
    for (let g = 0; g < q; g++) {
      const dr = this.pairRe[g]!;
      const di = this.pairIm[g]!;
      const m = Math.sqrt(dr * dr + di * di);
      let rowSum = 0;
      for (let j = 0; j < q; j++) {
        const zr = zRe[g * stride + j]!;
        const zi = zIm[g * stride + j]!;
        const cr = this.driveRe[j]!;
        const ci = this.driveIm[j]!;
        const slope = -(dr * (zr * cr - zi * ci) + di * (zr * ci + zi * cr)) / m;
        rowSum += Math.abs(slope);
        jac[g * q + j] = (g === j ? 1 : 0) - slope;
      }
      if (!(rowSum < CONTRACTION_LIMIT)) return false;
    }
    // Three pairs (the commonest board): the inverse itself, applied by `multiplyReal3`.
    return q === 3 ? invertReal3InPlace(jac) : factorRealInPlace(jac, q, this.pivots);
  }

  /**
   * `prepareJacobian` for three pairs (the commonest board: a load from each phase to
   * neutral), written out: 3 × 3 loops cost more than the arithmetic in them, and
   * this runs for every Newton step. Leaves (I − φ')⁻¹ in `jacobian`.
   */
  private prepareThreePairJacobian(zRe: Float64Array, zIm: Float64Array, s: number): boolean {
    const pRe = this.pairRe;
    const pIm = this.pairIm;
    const u0r = pRe[0]!;
    const u0i = pIm[0]!;
    const u1r = pRe[1]!;
    const u1i = pIm[1]!;
    const u2r = pRe[2]!;
    const u2i = pIm[2]!;
    const n0 = -1 / Math.sqrt(u0r * u0r + u0i * u0i);
    const n1 = -1 / Math.sqrt(u1r * u1r + u1i * u1i);
    const n2 = -1 / Math.sqrt(u2r * u2r + u2i * u2i);
    // c_j = (dY_j/dm)·v_j
    const sRe = this.slopeRe;
    const sIm = this.slopeIm;
    const c0r = sRe[0]! * u0r - sIm[0]! * u0i;
    const c0i = sRe[0]! * u0i + sIm[0]! * u0r;
    const c1r = sRe[1]! * u1r - sIm[1]! * u1i;
    const c1i = sRe[1]! * u1i + sIm[1]! * u1r;
    const c2r = sRe[2]! * u2r - sIm[2]! * u2i;
    const c2i = sRe[2]! * u2i + sIm[2]! * u2r;
    // φ'(g, j) = −Re(conj(v_g)·Z(g, j)·c_j)/|v_g|
    const phi = (ur: number, ui: number, n: number, k: number, cr: number, ci: number) => {
      const zr = zRe[k]!;
      const zi = zIm[k]!;
      return (ur * (zr * cr - zi * ci) + ui * (zr * ci + zi * cr)) * n;
    };
    const f00 = phi(u0r, u0i, n0, 0, c0r, c0i);
    const f01 = phi(u0r, u0i, n0, 1, c1r, c1i);
    const f02 = phi(u0r, u0i, n0, 2, c2r, c2i);
    const f10 = phi(u1r, u1i, n1, s, c0r, c0i);
    const f11 = phi(u1r, u1i, n1, s + 1, c1r, c1i);
    const f12 = phi(u1r, u1i, n1, s + 2, c2r, c2i);
    const f20 = phi(u2r, u2i, n2, 2 * s, c0r, c0i);
    const f21 = phi(u2r, u2i, n2, 2 * s + 1, c1r, c1i);
    const f22 = phi(u2r, u2i, n2, 2 * s + 2, c2r, c2i);
    if (
      !(Math.abs(f00) + Math.abs(f01) + Math.abs(f02) < CONTRACTION_LIMIT) ||
      !(Math.abs(f10) + Math.abs(f11) + Math.abs(f12) < CONTRACTION_LIMIT) ||
      !(Math.abs(f20) + Math.abs(f21) + Math.abs(f22) < CONTRACTION_LIMIT)
    )
      return false;
    const jac = this.jacobian;
    jac[0] = 1 - f00;
    jac[1] = -f01;
    jac[2] = -f02;
    jac[3] = -f10;
    jac[4] = 1 - f11;
    jac[5] = -f12;
    jac[6] = -f20;
    jac[7] = -f21;
    jac[8] = 1 - f22;
    return invertReal3InPlace(jac);
  }

  /**
   * Current each source delivers out of its `plus` terminal in the last solve, A.
   * Norton sources from their own equation; ideal ones by KCL at the node they fix
   * (elements, branches and any injection there).
   */
  sourceCurrents(): ComplexValue[] {
    const c = this.circuit;
    const v = (node: number) => (node === REFERENCE ? { re: 0, im: 0 } : { re: this.voltageRe[node]!, im: this.voltageIm[node]! });
    const out = new Array<ComplexValue>(c.sources.length);
    const netOut = new Map<number, { re: number; im: number }>();
    const needKcl = new Set<number>();
    c.sources.forEach((s) => {
      if (!s.admittance) needKcl.add(s.plus);
    });
    // A current source injecting at a node an ideal EMF holds flows into that EMF (harmonic orders).
    for (const node of needKcl) {
      if (node === REFERENCE || (this.injectionRe[node] === 0 && this.injectionIm[node] === 0)) continue;
      netOut.set(node, { re: -this.injectionRe[node]!, im: -this.injectionIm[node]! });
    }
    const leave = (node: number, re: number, im: number) => {
      if (!needKcl.has(node)) return;
      const t = netOut.get(node) ?? { re: 0, im: 0 };
      t.re += re;
      t.im += im;
      netOut.set(node, t);
    };
    const through = (from: number, to: number, yr: number, yi: number) => {
      const a = v(from);
      const b = v(to);
      const dr = a.re - b.re;
      const di = a.im - b.im;
      const ir = yr * dr - yi * di;
      const ii = yr * di + yi * dr;
      leave(from, ir, ii);
      leave(to, -ir, -ii);
    };
    // Only the nodes of ideal sources need KCL; with none (every source behind an impedance) skip the sweep.
    if (needKcl.size > 0) {
      for (const e of c.elements) if (this.isLiveEnd(e.from) && this.isLiveEnd(e.to)) through(e.from, e.to, e.admittance.re, e.admittance.im);
      c.branches.forEach((b, k) => {
        if (this.bActive[k]) through(b.from, b.to, this.admittanceRe[k]!, this.admittanceIm[k]!);
      });
    }
    c.sources.forEach((s, k) => {
      if (!s.admittance) return;
      const a = v(s.plus);
      const b = v(s.minus);
      const y = s.admittance;
      const dr = s.emf.re - (a.re - b.re);
      const di = s.emf.im - (a.im - b.im);
      const i = { re: y.re * dr - y.im * di, im: y.re * di + y.im * dr };
      out[k] = i;
      leave(s.plus, -i.re, -i.im);
      leave(s.minus, i.re, i.im);
    });
    // Ideal sources: the ones fixed last hang from the earlier ones, so settle them first.
    for (let k = c.sources.length - 1; k >= 0; k--) {
      const s = c.sources[k]!;
      if (s.admittance) continue;
      const i = netOut.get(s.plus) ?? { re: 0, im: 0 };
      out[k] = { re: i.re, im: i.im };
      leave(s.minus, i.re, i.im);
    }
    return out;
  }

  private isLiveEnd(node: number): boolean {
    return node === REFERENCE || this.live[node] === 1;
  }
}

/**
 * Per node, 1 where it has a path of conducting elements, sources or non-zero-power branches to the reference.
 * @param powers the branches' powers in place of the circuit's own (a circuit met again with other powers)
 */
export function liveNodes(circuit: Circuit, powers?: readonly ComplexValue[]): Uint8Array {
  const n = circuit.nodeNames.length;
  const adjacency: number[][] = [];
  for (let v = 0; v <= n; v++) adjacency.push([]);
  const at = (node: number) => (node === REFERENCE ? n : node);
  const link = (a: number, b: number) => {
    adjacency[at(a)]!.push(at(b));
    adjacency[at(b)]!.push(at(a));
  };
  for (const e of circuit.elements) link(e.from, e.to);
  for (const s of circuit.sources) link(s.plus, s.minus);
  circuit.branches.forEach((b, k) => {
    const s = powers ? powers[k]! : b.sNominal;
    if (s.re !== 0 || s.im !== 0) link(b.from, b.to);
  });
  const seen = new Uint8Array(n + 1);
  const stack = [n];
  seen[n] = 1;
  while (stack.length) {
    for (const next of adjacency[stack.pop()!]!) {
      if (!seen[next]) {
        seen[next] = 1;
        stack.push(next);
      }
    }
  }
  return seen.subarray(0, n);
}

/** Compiles a circuit for repeated solves. */
export function compileCircuit(circuit: Circuit): CompiledNetwork {
  return new CompiledNetwork(circuit);
}
