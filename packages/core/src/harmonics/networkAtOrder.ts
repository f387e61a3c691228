/**
 * The board at order h: every element scaled to h·f and the non-linear loads
 * turned into current sources, then one linear solve by the network solver
 * (`solveFixedNetwork`) — the same nodes and elements as the fundamental.
 *
 * Scaling: inductive reactance × h, capacitive reactance / h; resistance
 * constant (or × √h for source and feeder with `skin-effect`). Linear loads
 * start from the admittance the fundamental solve converged to, in series
 * (R + jX) or parallel (G + jB) form; detuned steps follow detuning.ts.
 */
import { abs, complex, polar, arg, ZERO, type ComplexValue } from '../complex.js';
import type { Board } from '../board/boardModel.js';
import type { NetworkSolution } from '../network/solveNetwork.js';
import { solveFixedNetwork, type FixedSolveOptions } from '../network/solveFixedNetwork.js';
import type { HarmonicModel, LoadBehaviour } from './harmonicModel.js';
import { detunedSusceptance } from './detuning.js';
import { checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** Scales a series impedance R + jX to order h. */
export function impedanceAtOrder(z: ComplexValue, h: number, resistance: HarmonicModel['resistance'] = 'constant'): ComplexValue {
  const r = resistance === 'skin-effect' ? z.re * Math.sqrt(h) : z.re;
  return complex(r, z.im >= 0 ? z.im * h : z.im / h);
}

/** Admittance of a linear or detuned branch at order h from its fundamental admittance y1. */
export function branchAdmittanceAtOrder(y1: ComplexValue, behaviour: LoadBehaviour, h: number): ComplexValue {
  branchAdmittanceAtOrderInto(y1, behaviour, h, scratch, 0);
  return complex(scratch[0]!, scratch[1]!);
}

const scratch = new Float64Array(2);

/**
 * `branchAdmittanceAtOrder` into out[at] (real part) and out[at + 1], allocating nothing: a
 * resonance scan takes every bank part to each order it refines a peak at, some 10^5 times.
 */
export function branchAdmittanceAtOrderInto(y1: ComplexValue, behaviour: LoadBehaviour, h: number, out: Float64Array, at: number): void {
  let g = 0;
  let b = 0;
  // |y1| = 0 exactly when both parts are (abs's Math.hypot allocates).
  if (!(y1.re === 0 && y1.im === 0))
    switch (behaviour.kind) {
      case 'non-linear':
        break;
      case 'detuned':
        b = detunedSusceptance(y1.im, behaviour.p, h);
        break;
      case 'linear':
        if (behaviour.form === 'parallel') {
          g = y1.re;
          b = y1.im < 0 ? y1.im / h : y1.im * h;
        } else {
          // inverse(impedanceAtOrder(inverse(y1), h)) with complex.ts's division written out, term for term.
          const d1 = y1.re * y1.re + y1.im * y1.im;
          const r = (1 * y1.re + 0 * y1.im) / d1;
          const x1 = (0 * y1.re - 1 * y1.im) / d1;
          const x = x1 >= 0 ? x1 * h : x1 / h;
          const d = r * r + x * x;
          g = (1 * r + 0 * x) / d;
          b = (0 * r - 1 * x) / d;
        }
    }
  out[at] = g;
  out[at + 1] = b;
}

/** The supply EMFs of order h: the background distortion with each phase at h × its fundamental angle. */
function emfAtOrder(board: Board, model: HarmonicModel, h: number): ComplexValue[] {
  const content = model.background.find((b) => b.order === h);
  return board.emf.map((e) => (content ? polar(board.nominalLineToNeutralV * content.fraction, h * arg(e) + content.angleRad) : ZERO));
}

/** Per load, per branch: the harmonic current a non-linear load draws at order h (from → to), or null. */
export function injectionsAtOrder(fundamental: NetworkSolution, model: HarmonicModel, h: number): (ComplexValue | null)[][] {
  return fundamental.board.loads.map((load, l) => {
    const content = contentAtOrder(model.loads[l]!, h);
    return load.branches.map((_, k) => (content ? injectionAtOrder(fundamental.branches[l]![k]!.current, content, h) : null));
  });
}

/** What a load injects at order h: its spectrum's entry there; none for a linear load or an order its spectrum lacks. */
export function contentAtOrder(behaviour: LoadBehaviour, h: number): { readonly fraction: number; readonly angleRad: number } | undefined {
  return behaviour.kind === 'non-linear' ? behaviour.spectrum.find((o) => o.order === h) : undefined;
}

/** The current of order h a non-linear branch draws (from → to), from its fundamental current i1. */
export function injectionAtOrder(i1: ComplexValue, content: { readonly fraction: number; readonly angleRad: number }, h: number): ComplexValue {
  return polar(abs(i1) * content.fraction, h * arg(i1) + content.angleRad);
}

/**
 * The board with its supply and conductors at order h: every impedance the
 * network solves with, including the per-phase source and line impedances and
 * the source star-point impedance where the board has them.
 */
export function boardAtOrder(board: Board, model: HarmonicModel, h: number): Board {
  const atOrder = (z: ComplexValue) => impedanceAtOrder(z, h, model.resistance);
  return {
    ...board,
    emf: emfAtOrder(board, model, h),
    sourceImpedance: atOrder(board.sourceImpedance),
    lineImpedance: atOrder(board.lineImpedance),
    neutralImpedance: atOrder(board.neutralImpedance),
    ...(board.sourceImpedances ? { sourceImpedances: board.sourceImpedances.map(atOrder) } : {}),
    ...(board.lineImpedances ? { lineImpedances: board.lineImpedances.map(atOrder) } : {}),
    ...(board.sourceStarImpedance ? { sourceStarImpedance: atOrder(board.sourceStarImpedance) } : {}),
  };
}

/** Per load, per branch admittance at order h. */
export function admittancesAtOrder(fundamental: NetworkSolution, model: HarmonicModel, h: number): ComplexValue[][] {
  return fundamental.branches.map((branches, l) => branches.map((b) => branchAdmittanceAtOrder(b.admittance, model.loads[l]!, h)));
}

/**
 * Solves the board at integer order h ≥ 2 given its fundamental solution.
 * @param options `networks`: compiled networks to reuse, where the same board is solved in many states
 * @throws {NumericalError} when the network is singular at that order.
 */
export function solveAtOrder(fundamental: NetworkSolution, model: HarmonicModel, h: number, options: FixedSolveOptions = {}): NetworkSolution {
  checkObjectArgument(fundamental, 'fundamental', 'a network solution of the board at the fundamental (solveNetwork(board))', ['board', 'topology', 'nodeVoltages', 'branches']);
  checkObjectArgument(model, 'model', "a board's harmonic model from resolveHarmonicModel(...)", ['loads', 'background']);
  checkNumberArgument(h, 'h', 'a harmonic order above 0', (x) => x > 0);
  return solveFixedNetwork(boardAtOrder(fundamental.board, model, h), {
    admittances: admittancesAtOrder(fundamental, model, h),
    branchSources: injectionsAtOrder(fundamental, model, h),
  }, options);
}

