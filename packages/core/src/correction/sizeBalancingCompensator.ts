/**
 * Balancing compensator: reactive branches line-to-line (and line-to-neutral on
 * a 4-wire board) that cancel the negative-sequence (and zero-sequence) line
 * current and set the positive-sequence reactive power — the Steinmetz /
 * Gyugyi compensator, sized on the solved board rather than from the formulas.
 * Two answers: the ideal one (reactors where needed) and the best one with
 * capacitors only.
 */
import type { Board } from '../board/boardModel.js';
import type { SolveOptions } from '../network/solveNetwork.js';
import { balanceTargetSchema, compensatorSchema, targetSchema, type BalanceTargetSpec, type CompensatorSpec, type TargetSpec } from './correctionSpec.js';
import { judgeBalance, resolveBalanceTarget, type BalanceTarget } from './balanceTarget.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import { judgeTarget, resolveTarget, type ResolvedTarget } from './correctionTarget.js';
import { lineBands } from './_internal/lineBands.js';
import { deltaSlots, starSlots } from './equipment.js';
import type { CompensatorSizing, CompensatorSolution, CorrectionWarning, TargetName } from './correctionResult.js';
import { compensatorWording, infeasibleReason, warningText } from './correctionWording.js';
import { checkRules, definedOnly, maxIterationsSchema, solveOptionsSchema } from './_internal/optionSchemas.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import { createProbe, type ProbeState } from './_internal/boardProbe.js';
import { branchSizings, emptyBelowKvar, lineComparisons } from './_internal/branchReadings.js';
import { compensatorResidual, residualBasesFor, residualWeights } from './_internal/compensatorResidual.js';
import { solveIdealCompensator } from './_internal/idealCompensator.js';
import { solveCapacitorOnlyCompensator } from './_internal/capacitorOnlyCompensator.js';
import { fewerCapacitorBranches } from './_internal/fewerCapacitorBranches.js';
import { leaveOutNegligible } from './_internal/negligibleBranches.js';
import { assertBoardModel } from '../board/modelGuards.js';

export interface CompensatorOptions {
  /**
   * The target: `pf` sets the positive-sequence reactive power aimed at,
   * Q1 = P1·tan(acos pf); `leading: 'never'` keeps every line from leading in
   * the capacitor-only solution.
   * @defaultValue `{ pf: 0.95, definition: 'positive-sequence', leading: 'never' }`
   */
  readonly target?: TargetSpec;
  /**
   * `delta`: line-to-line branches only (I0, the neutral current, is then left
   * as it is); `delta-and-star`: also line-to-neutral branches, which cancel I0.
   * @defaultValue 'delta-and-star' on a board with a closed neutral, otherwise 'delta'
   */
  readonly branches?: CompensatorSpec['branches'];
  /**
   * `allowed`: where capacitors alone cannot meet the PF and balance targets,
   * recommend the ideal solution with its reactors (given as kvar and mH).
   * @defaultValue 'allowed'
   */
  readonly reactors?: CompensatorSpec['reactors'];
  /** Weights of the capacitor-only objective. @defaultValue `{ negativeSequence: 1, zeroSequence: 1, reactive: 1 }` */
  readonly weights?: CompensatorSpec['weights'];
  /** Unbalance the compensator must bring down to. @defaultValue `{ maxNegativeSequencePercent: 10, maxNeutralPercent: 20 }` */
  readonly balance?: BalanceTargetSpec;
  /** Passed to the board solver at every re-solve. @defaultValue solver defaults */
  readonly solve?: SolveOptions;
  /** Outer iterations of each solution. @defaultValue 30 */
  readonly maxIterations?: number;
}

const compensatorOptionsSchema = compensatorSchema.extend({
  target: targetSchema.optional(),
  balance: balanceTargetSchema.optional(),
  solve: solveOptionsSchema.optional(),
  maxIterations: maxIterationsSchema.optional(),
});

interface ResolvedCompensatorOptions {
  readonly reactors: 'allowed' | 'none';
  readonly target: ResolvedTarget;
  readonly balance: BalanceTarget;
  readonly branches: 'delta' | 'delta-and-star';
  readonly weights: { negativeSequence: number; zeroSequence: number; reactive: number };
  readonly solve: SolveOptions;
  readonly maxIterations: number;
}

function resolveCompensatorOptions(board: Board, input: CompensatorOptions | undefined): ResolvedCompensatorOptions {
  const options = parseOptions(compensatorOptionsSchema, input, 'sizeBalancingCompensator options');
  const compensator = definedOnly({ branches: options.branches, weights: options.weights });
  checkRules(definedOnly({ arrangement: 'balancing-compensator' as const, target: options.target, compensator }), board, 'sizeBalancingCompensator options');
  const w = options.weights ?? {};
  const defaults = CORRECTION_DEFAULTS.compensatorWeights;
  const branches = options.branches ?? (board.hasNeutral && !board.neutralOpen ? 'delta-and-star' : 'delta');
  return {
    reactors: options.reactors ?? 'allowed',
    target: resolveTarget(options.target, board, 'balancing-compensator'),
    balance: resolveBalanceTarget(options.balance, branches === 'delta-and-star'),
    branches,
    weights: {
      negativeSequence: w.negativeSequence ?? defaults.negativeSequence,
      zeroSequence: w.zeroSequence ?? defaults.zeroSequence,
      reactive: w.reactive ?? defaults.reactive,
    },
    solve: definedOnly(options.solve ?? {}),
    maxIterations: options.maxIterations ?? CORRECTION_DEFAULTS.maxIterations,
  };
}

/**
 * Sizes the ideal and the best capacitor-only balancing compensator for a
 * three-phase board.
 * @param board a normalised three-phase board
 * @returns both solutions with their branches (kvar, µF or mH, current), which
 *   branches need reactors, and the residual unbalance, neutral current and PF of each
 * @throws {InputError} on a board without three phases, or options that do not fit it
 * @throws {NumericalError} if a re-solve fails
 * @example
 * // 10 kW resistive load across A–B of a 400 V 3-wire ABC board, target unity:
 * const { ideal } = sizeBalancingCompensator(board, { target: { pf: 1 } });
 * ideal.branches.map((b) => b.kvarAtNominalV)
 * //=> [0, 5.773…, −5.773…]  (A-B, B-C capacitor, C-A reactor: P/√3 each)
 */
/** A compensator solution whose weighted residual (per unit) is below this is exact. */
const EXACT_RESIDUAL = 1e-6;

/** How a correction study uses the sizing (not options a user sets). */
export interface CompensatorUse {
  /** Solve the capacitor-only compensator with these branches (A-B, A-N …) held at zero: the light-load sizing of a build on fewer branches. */
  readonly heldBranches?: readonly string[];
  /** Look for the same job on fewer branches (`fewerBranches`). @defaultValue true */
  readonly fewerBranches?: boolean;
}

export function sizeBalancingCompensator(board: Board, options?: CompensatorOptions, use: CompensatorUse = {}): CompensatorSizing {
  assertBoardModel(board);
  const opts = resolveCompensatorOptions(board, options);
  const { target } = opts;
  const slots = [...deltaSlots(board), ...(opts.branches === 'delta-and-star' ? starSlots(board, 'neutral') : [])];
  const probe = createProbe(board, slots, 'compensator', opts.solve);
  const start = probe.at(slots.map(() => 0));
  const bases = residualBasesFor(start.result, board, target, opts.branches === 'delta-and-star');
  const weights = residualWeights(bases, opts.weights);
  const warnings: CorrectionWarning[] = [];
  const warn = (code: string, message: string) => warnings.push({ code, message, path: null, value: null, threshold: null });

  const solution = (kind: CompensatorSolution['kind'], state: ProbeState, objective: number, exact: boolean): CompensatorSolution => {
    const equipment = probe.groups(state.kvar);
    const branches = branchSizings(equipment, state.board, state.result);
    const check = judgeTarget(state.result, target, start.result);
    const ps = state.result.powerFactor.positiveSequence;
    return {
      kind,
      frequencyHz: board.frequencyHz,
      branches,
      equipment,
      reactorBranches: branches.filter((b) => b.element === 'reactor').map((b) => b.branch),
      exact,
      objective,
      residual: {
        negativeSequenceCurrentPercent: state.result.unbalance?.currentNegativePercent ?? 0,
        zeroSequenceCurrentPercent: state.result.unbalance?.currentZeroPercent ?? 0,
        neutralCurrentA: state.result.neutral?.current.magnitude ?? null,
        positiveSequencePf: ps?.pf ?? null,
        positiveSequenceKvar: ps?.kvar ?? null,
        effectivePf: state.result.powerFactor.effective?.pf ?? null,
        leadingLines: check.leadingLines,
      },
      check,
      lines: lineComparisons(start.result, state.result),
    };
  };

  const ideal = solveIdealCompensator(probe, bases, opts.maxIterations);
  if (!ideal.converged) warn('not-converged', compensatorWording.notConverged('ideal', ideal.iterations));
  const targetsMet = (state: ProbeState): TargetName[] => [
    ...(judgeTarget(state.result, target, start.result).met ? (['power-factor'] as const) : []),
    ...(judgeBalance(state.result, opts.balance).met ? (['balance'] as const) : []),
  ];
  const reading = (state: ProbeState) => {
    const balance = judgeBalance(state.result, opts.balance);
    return { positiveSequencePf: state.result.powerFactor.positiveSequence?.pf ?? null, negativeSequenceCurrentPercent: balance.negativeSequencePercent, neutralPercent: balance.neutralPercent };
  };
  // The exact solution's negligible branches are left out here, once, so every table and the build agree.
  const idealBuilt = leaveOutNegligible(probe, ideal.state, { bases, maxIterations: opts.maxIterations, targetsMet, reading });
  const lowerTan = lineBands(target, start, 'limit').map((b) => b.low);
  const capSettings = {
    weights,
    ridge: CORRECTION_DEFAULTS.compensatorRidge,
    lineLowerTan: lowerTan,
    maxIterations: opts.maxIterations,
    convergence: CORRECTION_DEFAULTS.convergence,
  };
  const held = use.heldBranches ? slots.map((s) => use.heldBranches!.includes(s.branch)) : undefined;
  const capOnly = solveCapacitorOnlyCompensator(probe, bases, { ...capSettings, ...(held ? { heldAtZero: held } : {}) });
  // The programme spreads output over every branch that helps; the same job on fewer branches may build
  // cheaper. Looked for where the solution is exact on more branches than it has conditions to meet (I2,
  // I0 and Q1 rows): there the spread is the ridge's choice among exact solutions, not a least-squares need.
  const builtBranches = capOnly.state.kvar.filter((q) => q >= emptyBelowKvar(capOnly.state.kvar.reduce((sum, x) => sum + Math.abs(x), 0))).length;
  const spreadByChoice = Math.sqrt(capOnly.objective) < EXACT_RESIDUAL && builtBranches > weights.length;
  const fewer = capOnly.converged && spreadByChoice && !held && use.fewerBranches !== false
    ? fewerCapacitorBranches(probe, bases, capSettings, capOnly, { targetsMet: (o) => targetsMet(o.state), reading: (o) => reading(o.state) })
    : null;
  if (!capOnly.converged) warn('not-converged', compensatorWording.notConverged('capacitor-only', capOnly.iterations));
  if (capOnly.leadingConstraintsDropped) warn('leading-bound-dropped', compensatorWording.leadingDropped);

  // Exact (objective 0) as solved; with a negligible branch left out, the small residual it leaves is its objective.
  const leftOut = idealBuilt.small.some((b) => b.leftOut);
  const idealObjective = leftOut ? compensatorResidual(idealBuilt.state, bases).reduce((sum, r, k) => sum + weights[k]! * r * r, 0) : 0;
  const idealSolution = solution('ideal', idealBuilt.state, idealObjective, ideal.converged && !leftOut);
  const capSolution = solution('capacitor-only', capOnly.state, capOnly.objective, Math.sqrt(capOnly.objective) < EXACT_RESIDUAL);
  const balanceBefore = judgeBalance(start.result, opts.balance);
  const balanceAfter = judgeBalance(capOnly.state.result, opts.balance);
  const idealBalance = judgeBalance(idealBuilt.state.result, opts.balance);
  const idealWorks = opts.reactors === 'allowed' && idealSolution.check.met && idealBalance.met && ideal.converged;
  let status: CompensatorSizing['status'] = 'infeasible';
  let recommended: CompensatorSizing['recommended'] = 'capacitor-only';
  const reasons: string[] = [];
  // Sentences name branches the way the board file does (L1-L2 or A-B).
  const label = labellerOf(start.result.conventions.phaseNames);
  const reactorLabels = idealSolution.reactorBranches.map(label);
  if (balanceBefore.met && judgeTarget(start.result, target).met) status = 'already-meets-target';
  else if (!(capSolution.check.met && balanceAfter.met) && idealWorks) {
    // Capacitors alone cannot do it; the Steinmetz/Gyugyi solution with its reactors can.
    status = 'meets-target';
    recommended = 'ideal';
    warn('reactors-needed', warningText.reactorsNeeded(reactorLabels, balanceAfter.shortfalls.concat(capSolution.check.shortfalls)));
  } else if (capSolution.check.met && balanceAfter.met) {
    status = 'meets-target';
    if (!capSolution.exact && idealSolution.reactorBranches.length)
      warn(
        'partial-balance',
        warningText.partialBalance(capSolution.residual.negativeSequenceCurrentPercent, capSolution.residual.zeroSequenceCurrentPercent, reactorLabels),
      );
  } else {
    if (!balanceAfter.met) reasons.push(infeasibleReason.capacitorsCannotBalance(balanceAfter.shortfalls));
    if (capSolution.check.shortfalls.length) reasons.push(infeasibleReason.capacitorsCannotReach(capSolution.check.shortfalls));
    if (idealSolution.reactorBranches.length) reasons.push(infeasibleReason.needsReactors(reactorLabels, idealSolution.branches.map((b) => ({ ...b, branch: label(b.branch) }))));
  }
  return {
    arrangement: 'balancing-compensator',
    branchesUsed: opts.branches,
    target,
    q1TargetKvar: (capOnly.state.result.powerFactor.positiveSequence?.kW ?? 0) * bases.targetTan,
    objectiveStatement: compensatorWording.objective(opts.weights, bases.includeZeroSequence, CORRECTION_DEFAULTS.compensatorRidge, true),
    weights: opts.weights,
    balance: opts.balance,
    balanceBefore,
    balanceAfter: recommended === 'ideal' ? idealBalance : balanceAfter,
    recommended,
    ideal: idealSolution,
    smallBranches: idealBuilt.small,
    capacitorOnly: capSolution,
    fewerBranches: fewer && fewer.spared.length ? { solution: solution('capacitor-only', fewer.outcome.state, fewer.outcome.objective, Math.sqrt(fewer.outcome.objective) < EXACT_RESIDUAL), spared: fewer.spared } : null,
    status,
    reasons,
    warnings,
    solves: probe.solves(),
  };
}
