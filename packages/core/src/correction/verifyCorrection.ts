/**
 * Re-solves a board with correction equipment in place and reports what it
 * does: before and after for every line and the whole board, the target check
 * at nominal capacitance and at both tolerance ends, the steady voltage rise,
 * the supply resonance estimate, and the light-load check of the fixed part.
 */
import * as z from 'zod';
import type { Board, LoadBranch, PhaseId } from '../board/boardModel.js';
import type { BoardResult } from '../analysis/boardResult.js';
import { analyseSolution, readTargetFigures, type TargetReadings } from '../analysis/analyseSolution.js';
import { compileBoard, solveCompiledBoard, solveNetwork, type NetworkSolution, type SolveOptions } from '../network/solveNetwork.js';
import { resolveSolveOptions } from '../network/solveOptions.js';
import type { ComplexValue } from '../complex.js';
import { boardShortCircuitVA, neutralPathImpedance, shortCircuitPathImpedance, supplyPathImpedance, supplyPathImpedancesPerLine } from '../network/installationModel.js';
import { capacitorPathReactance, type CapacitorPathReactance } from '../network/capacitorPathReactance.js';
import { lightLoadSchema, targetSchema, ARRANGEMENTS, type Arrangement, type CapacitanceToleranceSpec, type LightLoadSpec, type TargetSpec } from './correctionSpec.js';
import { CORRECTION_DEFAULTS, toleranceFractions } from './correctionDefaults.js';
import { judgeTarget, lineTanBounds, resolveTarget, TARGET_SLACK } from './correctionTarget.js';
import { addCorrectionEquipment, type EquipmentGroup } from './equipment.js';
import { scaleBoardLoads } from './scaleBoardLoads.js';
import type { BankStep, BranchSizing, CorrectionVerification, CorrectionWarning, LightLoadCheck, MeteringReadings, ResonanceCapacitance, VoltageRise } from './correctionResult.js';
import { meteringPlace, solveMeter } from './meteringPoint.js';
import { warningText } from './correctionWording.js';
import { labellerOf } from '../board/conventions/phaseNames.js';
import { beforeAfter, branchSizings, lineComparisons } from './_internal/branchReadings.js';
import { checkRules, definedOnly, solveOptionsSchema } from './_internal/optionSchemas.js';
import { parseOptions } from '../_internal/zodIssues.js';
import { balanceWorsening } from './balanceWorsening.js';
import { overloadsCaused } from './overloadsCaused.js';
import { readRiseFlag } from './voltageRiseFlag.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';
import { WARNING_THRESHOLDS } from '../analysis/boardWarnings.js';
import { headlineResonanceOrders } from './resonanceExcitation.js';
import { distinctOrders, resonanceNearOrders, stepStateResonance, watchedOrdersNear } from './stepStateResonance.js';

export interface VerifyCorrectionOptions {
  /** The equipment to add, e.g. `selection.equipment` or `sizing.equipment`. */
  readonly equipment: readonly EquipmentGroup[];
  /** The target to judge against. @defaultValue as for the arrangement's sizing function */
  readonly target?: TargetSpec;
  /** Only picks the default target definition (PF1+ for a compensator). @defaultValue 'star-bank' */
  readonly arrangement?: Arrangement;
  /** Light-load condition for the fixed part. @defaultValue none (no light-load check) */
  readonly lightLoad?: LightLoadSpec;
  /** @defaultValue `{ minusPercent: 5, plusPercent: 10 }` (IEC 60831-1, from memory) */
  readonly capacitanceTolerance?: CapacitanceToleranceSpec;
  /** Flag a steady voltage rise above this, %. @defaultValue 3 */
  readonly voltageRiseLimitPercent?: number;
  /** Passed to the board solver. @defaultValue solver defaults */
  readonly solve?: SolveOptions;
  /**
   * The bank's steps as built (`selection.steps`), matching `equipment`: the supply resonance is then estimated
   * in every state the controller can reach, not only with every step in. @defaultValue none (every step in only)
   */
  readonly steps?: readonly BankStep[];
}

const verifyOptionsSchema = z.strictObject({
  equipment: z.custom<readonly EquipmentGroup[]>((v) => Array.isArray(v)),
  target: targetSchema.optional(),
  arrangement: z.enum(ARRANGEMENTS).optional(),
  lightLoad: lightLoadSchema.optional(),
  capacitanceTolerance: z.strictObject({ minusPercent: z.number().min(0).max(50).optional(), plusPercent: z.number().min(0).max(50).optional() }).optional(),
  voltageRiseLimitPercent: z.number().positive().max(100).optional(),
  solve: solveOptionsSchema.optional(),
  steps: z.custom<readonly BankStep[]>((v) => Array.isArray(v) && v.every((s) => typeof s === 'object' && s !== null && Array.isArray((s as BankStep).branches))).optional(),
});

/** Two resonance orders closer than this fraction are one for the words (half a percent, well inside any scan's resolution). */
const SAME_ORDER = 0.005;

/** The branches of the loads added to `board` to make `equipped` (the equipment), every part as `equipped` has it. */
const addedBranches = (board: Board, equipped: Board): LoadBranch[] => equipped.loads.slice(board.loads.length).flatMap((l) => l.branches);

/**
 * The shunt capacitance the supply's inductance resonates with: the capacitors added, and every
 * board load that draws leading vars (a fixed bank written as a load, a capacitive filter), taken as
 * capacitance, as the added capacitors are. Added reactors sit in parallel with the supply inductance
 * and raise the order (for a balanced set h = √((S_sc,X + Q_L)/Q_C), common practice, no source);
 * reactive loads other than capacitive ones are left out, as the usual √(S_sc/Q_C) leaves them. The
 * orders are those of the LC network of the path's reactances and these capacitances and reactors
 * (capacitorPathReactance.ts), from X and C alone, so independent of the voltage the board settles at;
 * for a single loop or a balanced delta bank they are h = √(X_C/X_path), also behind a cable feeder whose
 * R is not small. The kvar figures are at the solved voltages, as delivered.
 */
function resonanceCapacitance(board: Board, corrected: Board, branches: readonly BranchSizing[], after: BoardResult): ResonanceCapacitance & { boardCapacitors: LoadBranch[] } {
  const addedKvar = branches.reduce((s, b) => s + (b.element === 'capacitor' ? b.kvarAtAppliedV : 0), 0);
  const reactorKvar = branches.reduce((s, b) => s + (b.element === 'reactor' ? -b.kvarAtAppliedV : 0), 0);
  const leading = after.loads.filter((l) => l.origin === 'board' && l.kvar < 0);
  const onBoardKvar = leading.reduce((s, l) => s - l.kvar, 0);
  const leadingNames = new Set(leading.map((l) => l.name));
  const boardCapacitors = corrected.loads.filter((l) => l.origin === 'board' && leadingNames.has(l.name)).flatMap((l) => l.branches);
  const path = capacitorPathReactance(board, [...boardCapacitors, ...addedBranches(board, corrected)]);
  return {
    boardCapacitors,
    addedKvar,
    onBoardKvar,
    loadsOnBoard: leading.map((l) => l.name),
    reactorKvar,
    totalKvar: addedKvar + onBoardKvar,
    ...pathFigures(board, path),
  };
}

/** X_path (the line and neutral loop on a single-phase board, per line otherwise), the neutral's X where the capacitors' current uses it, and S_sc,X. */
function pathFigures(
  board: Board,
  path: CapacitorPathReactance | null,
): Pick<ResonanceCapacitance, 'supplyReactanceOhm' | 'neutralReactanceOhm' | 'reactanceShortCircuitKVA' | 'unequalCurrents' | 'orders' | 'lowestBelowSingleNode' | 'singleNodeOrder' | 'neutralTieReactanceOhm' | 'capacitorKvarAtNominalV' | 'reactorKvarAtNominalV'> {
  if (path === null)
    return { supplyReactanceOhm: null, neutralReactanceOhm: null, reactanceShortCircuitKVA: null, unequalCurrents: false, orders: [], lowestBelowSingleNode: false, singleNodeOrder: null, neutralTieReactanceOhm: null, capacitorKvarAtNominalV: 0, reactorKvarAtNominalV: 0 };
  const lowest = path.resonanceOrders[0];
  const x = (board.system === 'single-phase' ? shortCircuitPathImpedance(board) : supplyPathImpedance(board)).im;
  // n·V²/X_path is S_sc,X for a single loop or a balanced bank; anything else is weighed by the current each conductor carries.
  const balanced = (board.phases.length * board.nominalLineToNeutralV ** 2) / x;
  return {
    supplyReactanceOhm: x,
    neutralReactanceOhm: path.throughNeutral ? (neutralPathImpedance(board)?.im ?? null) : null,
    reactanceShortCircuitKVA: path.shortCircuitVA / 1000,
    unequalCurrents: Math.abs(path.shortCircuitVA - balanced) > 1e-9 * balanced,
    orders: path.resonanceOrders,
    // Where the capacitors' own current pattern is not a mode of the network, √(S_sc,X/Q_C) lies above the lowest
    // order; within half a percent (a compensator's slightly unequal branches) it still names it.
    lowestBelowSingleNode: lowest !== undefined && path.singleNodeOrder !== null && lowest < path.singleNodeOrder * (1 - SAME_ORDER),
    singleNodeOrder: path.singleNodeOrder,
    capacitorKvarAtNominalV: path.capacitorVA / 1000,
    reactorKvarAtNominalV: path.reactorVA / 1000,
    neutralTieReactanceOhm: path.tiedToNeutral ? (neutralPathImpedance(board)?.im ?? null) : null,
  };
}

/**
 * The lines' own path reactances where they differ by more than CORRECTION_DEFAULTS.unequalPathSpread of
 * their mean (an open delta, unequal source units, unequal feeder conductors): there the one X per line the
 * first-order rise takes is no line's own; else null. A single-phase board's one loop is never unequal.
 */
function unequalPathOf(board: Board): VoltageRise['unequalPath'] {
  if (board.phases.length < 2) return null;
  const xs = supplyPathImpedancesPerLine(board).map((z) => z.im);
  const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
  if (!(mean > 0) || Math.max(...xs) - Math.min(...xs) <= CORRECTION_DEFAULTS.unequalPathSpread * mean) return null;
  const corner = (board.installation?.installation.main ?? board).openDeltaCorner ?? null;
  return { lines: board.phases.map((phase, k) => ({ phase, reactanceOhm: xs[k]! })), openDeltaCorner: corner };
}

/**
 * The steady rise: a capacitor's current is reactive, so it raises the voltage by about I·X of the path
 * it flows in. Each line's rise to the neutral bar is −Z_line·I_line − Z_N·I_N along that line's voltage
 * (capacitorPathReactance.ts), and the estimate is the worst line's: for a single loop or a balanced bank
 * that is Q_C·X/V² = Q_C/S_sc,X (R drops out), but the average Q_C/S_sc,X understates the line an unequal
 * bank loads most (a split-phase bank of 4.4 and 0.7 kvar: 0.42 % against 0.54 % on its large line, 0.53 %
 * solved). The classic Q_C/S_sc with S_sc from |Z| overstates it wherever R is not small beside X.
 * Scaled to Q_C at the solved voltage, as the kvar delivered. Where the lines' paths differ (an open delta:
 * 2.17 % estimated with their mean against 1.07 % solved) there is no estimate, only the solved rises.
 */
function voltageRise(board: Board, capacitors: readonly LoadBranch[], capacitorKvar: number, before: BoardResult, after: BoardResult, flagLevelPercent: number): VoltageRise {
  const ssc = boardShortCircuitVA(board);
  const path = capacitorPathReactance(board, capacitors);
  const sscX = path?.shortCircuitVA ?? null;
  // A compensator's reactors lower the lines they sit on while its capacitors raise theirs: the net kvar
  // over S_sc,X is neither line's rise (hillside-workshop's compensator: 0.91 % against 4.52 % solved), so
  // only the solved rise is given. A detuned branch (reactor in series) draws leading vars: not one of these.
  const largest = Math.max(0, ...capacitors.map((b) => Math.abs(b.sNominal.im)));
  const withReactors = capacitors.some((b) => b.sNominal.im > 1e-9 * largest);
  // Nothing built (no unit fits, or nothing needed): no capacitor current, no rise to estimate.
  const nothingAdded = !withReactors && !(capacitorKvar > 0);
  const unequalPath = sscX === null ? null : unequalPathOf(board);
  const worst = path?.worstRise ?? null;
  const estimatePercent =
    sscX === null || withReactors || nothingAdded || unequalPath !== null || worst === null || !(path!.capacitorVA > 0) ? null : (100 * worst.perUnit * capacitorKvar * 1000) / path!.capacitorVA;
  const nominal = judgedNominalOf(board).ln;
  const solvedPerLine = after.phases.map((p, k) => ({ phase: p.phase, percent: (100 * (p.voltage.magnitude - before.phases[k]!.voltage.magnitude)) / nominal }));
  const solvedPercent = Math.max(...solvedPerLine.map((l) => l.percent));
  const judgedPercent = Math.max(estimatePercent ?? -Infinity, solvedPercent);
  return {
    capacitorKvar,
    shortCircuitKVA: ssc === null ? null : ssc / 1000,
    reactanceShortCircuitKVA: sscX === null ? null : sscX / 1000,
    estimatePercent,
    estimateLine: estimatePercent === null || worst === null ? null : (worst.line as PhaseId),
    estimateWithheld: withReactors ? 'reactors' : nothingAdded && sscX !== null ? 'nothing-added' : unequalPath !== null ? 'unequal-path' : null,
    solvedPercent,
    solvedPerLine,
    unequalPath,
    flagLevelPercent,
    judgedPercent,
    flagged: judgedPercent > flagLevelPercent,
    flagReading: null,
  };
}

/**
 * Verifies correction equipment on a board by re-solving it.
 * @param board the board without the equipment
 * @returns before/after readings (the two `BoardResult`s are embedded), the
 *   corrected `Board`, target checks at nominal and tolerance-end capacitance,
 *   voltage rise, resonance order and the light-load check
 * @throws {InputError} for options that do not fit the board
 * @throws {NumericalError} if a solve fails
 * @example
 * const v = verifyCorrection(board, { equipment: selection.equipment, lightLoad: { fraction: 0.25 } });
 * v.check.met //=> true when the built bank meets the target
 * v.lightLoad?.leadingLines //=> [] when the fixed part keeps every line lagging at light load
 */
/**
 * The board without equipment, solved and analysed with the default options: the same for every
 * arrangement a comparison verifies (and for a compensator's ideal solution), so solved once per board.
 */
const asIs = new WeakMap<Board, BoardResult>();
function solvedAsIs(board: Board): BoardResult {
  let result = asIs.get(board);
  if (!result) asIs.set(board, (result = analyseSolution(solveNetwork(board))));
  return result;
}

/**
 * Solves and analyses boards that differ from `corrected` only in the equipment's values (the
 * capacitance tolerance ends), compiling `corrected` once and writing each board's equipment
 * values into the network: the solve `solveNetwork` does, since a compiled network depends on
 * branch values only through which are zero. A board whose zero pattern differs is solved afresh.
 */
function equipmentValueSolver(corrected: Board, baseLoads: number, options: SolveOptions): <R>(b: Board, read: (s: NetworkSolution) => R) => R {
  const added = (b: Board) => b.loads.slice(baseLoads).flatMap((l) => l.branches);
  const isZero = (p: ComplexValue) => p.re === 0 && p.im === 0;
  const pattern = added(corrected).map((br) => isZero(br.sNominal));
  resolveSolveOptions(options);
  const compiled = compileBoard(corrected);
  let first = compiled.installation.layout.branchOffset[compiled.boardIndex]!;
  for (let l = 0; l < baseLoads; l++) first += corrected.loads[l]!.branches.length;
  const net = compiled.network;
  return (b, read) => {
    const branches = added(b);
    if (branches.length !== pattern.length || branches.some((br, j) => isZero(br.sNominal) !== pattern[j])) return read(solveNetwork(b, options));
    branches.forEach((br, j) => {
      net.powerRe[first + j] = br.sNominal.re;
      net.powerIm[first + j] = br.sNominal.im;
    });
    return read(solveCompiledBoard({ ...compiled, board: b }, options));
  };
}


export function verifyCorrection(board: Board, options: VerifyCorrectionOptions): CorrectionVerification {
  assertBoardModel(board);
  const opts = parseOptions(verifyOptionsSchema, options, 'verifyCorrection options');
  const arrangement = opts.arrangement ?? 'star-bank';
  checkRules(definedOnly({ arrangement, target: opts.target, lightLoad: opts.lightLoad }), board, 'verifyCorrection options');
  const target = resolveTarget(opts.target, board, arrangement);
  const { minus, plus } = toleranceFractions(opts.capacitanceTolerance);
  const riseLimit = opts.voltageRiseLimitPercent ?? CORRECTION_DEFAULTS.voltageRiseLimitPercent;
  const solveOptions = definedOnly(opts.solve ?? {});
  const solve = (b: Board) => analyseSolution(solveNetwork(b, solveOptions));
  const equipment = opts.equipment;
  const warnings: CorrectionWarning[] = [];
  const warn = (code: string, message: string, value: number | null = null, threshold: number | null = null) =>
    warnings.push({ code, message, path: null, value, threshold });

  // The target is judged where it is measured: the board, or a metering point the feeders lead up to.
  const meter = meteringPlace(board, target.measuredAt);
  const judged = (b: Board, atBoard?: BoardResult) => (meter ? solveMeter(b, meter, solveOptions) : (atBoard ?? solve(b)));
  const before = Object.keys(solveOptions).length === 0 ? solvedAsIs(board) : solve(board);
  // Warnings name lines the way the board file does (L1 or A).
  const label = labellerOf(before.conventions.phaseNames);
  const corrected = addCorrectionEquipment(board, equipment);
  const solveEquipped = meter ? <R>(b: Board, read: (s: NetworkSolution) => R) => read(solveNetwork(b, solveOptions)) : equipmentValueSolver(corrected, board.loads.length, solveOptions);
  const after = solveEquipped(corrected, analyseSolution);
  const meteredBefore = judged(board, before);
  const meteredAfter = judged(corrected, after);
  const check = judgeTarget(meteredAfter, target, meteredBefore);
  const branches = branchSizings(equipment, corrected, after);
  const atTolerance = (capacitanceFactor: number) => {
    const b = addCorrectionEquipment(board, equipment, { capacitanceFactor });
    // Only the target figures are read at the tolerance ends: not the whole analysis.
    const figures: TargetReadings = meter ? solveMeter(b, meter, solveOptions, readTargetFigures) : solveEquipped(b, readTargetFigures);
    return judgeTarget(figures, target, meteredBefore);
  };
  const low = atTolerance(1 - minus);
  const high = atTolerance(1 + plus);
  if (check.met && !low.met) warn('tolerance-low', warningText.toleranceLow(low.shortfalls));
  if (high.leadingLines.length && !check.leadingLines.length) warn('tolerance-high', warningText.toleranceHigh(high.leadingLines.map(label)));

  // Judged at a metering point, the target says nothing of the equipment's own board: sized for the PF
  // upstream, the bank can leave its own board leading. Said as solve says it of a board's own capacitors
  // (the line-leading warning, below 0.90 leading), for the lines the equipment makes lead there.
  if (meter) {
    const limit = WARNING_THRESHOLDS.leadingLinePf;
    const madeLead = after.phases.filter((p, k) => {
      const b = before.phases[k]!;
      return p.kW > 0 && p.sense === 'leading' && p.pf !== null && p.pf < limit && !(b.sense === 'leading' && b.pf !== null && b.pf <= p.pf);
    });
    if (madeLead.length) {
      const through = (r: BoardResult) => r.phases.reduce((sum, p) => sum + p.kvar, 0);
      warn(
        'equipment-board-leading',
        warningText.equipmentBoardLeading(
          board.name,
          target.measuredAt!,
          madeLead.map((p) => ({ phase: label(p.phase), pf: p.pf! })),
          limit,
          { before: through(before), after: through(after) },
          opts.lightLoad !== undefined,
        ),
        Math.min(...madeLead.map((p) => p.pf!)),
        limit,
      );
    }
  }

  const capacitorKvar = branches.reduce((s, b) => s + b.kvarAtAppliedV, 0);
  const measuredRise = voltageRise(board, addedBranches(board, corrected), capacitorKvar, before, after, riseLimit);
  // Above the flag level: what the rise does on this board, at design load and with its loads off.
  const what = arrangement === 'balancing-compensator' ? 'the compensator' : 'the bank';
  const rise: VoltageRise = measuredRise.flagged ? { ...measuredRise, flagReading: readRiseFlag({ board, equipment, before, after, solve, what }) } : measuredRise;
  if (rise.flagged) warn('voltage-rise', warningText.voltageRise(`${what} at the design load`, rise.judgedPercent, riseLimit, rise.flagReading!.words), rise.solvedPercent, riseLimit);
  const ssc = boardShortCircuitVA(board);
  const { boardCapacitors, ...resonance } = resonanceCapacitance(board, corrected, branches, after);
  // Orders that print alike (a balanced bank's two sequence modes) are one order for the words.
  const orders = resonance.totalKvar > 0 ? distinctOrders(resonance.orders) : [];
  const resonanceOrder = orders[0] ?? null;
  const nearOrders = watchedOrdersNear(orders);
  const nearResonances = orders.filter((h) => resonanceNearOrders(h).length > 0);
  // Every state the controller can reach, where the steps are known and the every-step-in state has an estimate.
  const stepStates = opts.steps && resonanceOrder !== null && resonance.addedKvar > 0 ? stepStateResonance({ board, equipment, steps: opts.steps, boardCapacitors }) : null;
  // The states with fewer steps in (the first is every step in).
  const nearPartial = stepStates?.states.slice(1).filter((st) => st.nearOrders.length > 0) ?? [];
  const statesChecked = opts.steps === undefined ? 'unknown' : stepStates === null ? null : { others: stepStates.states.length - 1, othersNear: nearPartial.length };
  if (nearResonances.length)
    warn('resonance', warningText.lowResonance(nearResonances, resonance.onBoardKvar > 0 ? (resonance.addedKvar > 0 ? 'both' : 'board') : 'bank', nearOrders, statesChecked), nearResonances[0]!, null);
  if (stepStates && nearPartial.length)
    warn('resonance-step-state', warningText.stepStateResonance(nearPartial, stepStates.fixedPart, nearResonances.length > 0, null, resonance.onBoardKvar > 0), nearPartial[0]!.lowestOrder, null);
  // The orders that headline the verdict: near in some state, with significant typical content, and able to reach this capacitance.
  const headline = new Set(headlineResonanceOrders(board, [...boardCapacitors, ...equipment.flatMap((g) => g.branches.filter((b) => b.susceptanceS > 0))]));
  const headlineNear = [...new Set([...nearOrders, ...nearPartial.flatMap((st) => st.nearOrders)])].filter((h) => headline.has(h)).sort((a, b) => a - b);
  if (ssc === null && capacitorKvar > 0) warn('ideal-source', warningText.idealSource);
  const overloads = overloadsCaused(before, after);
  for (const o of overloads) warn('overload-caused', warningText.overloadCaused(o.message), o.value, o.threshold);
  for (const w of balanceWorsening(before, after))
    if (!(w.code === 'neutral-worse' && overloads.some((o) => o.code === 'neutral-over-rating')))
      warn(w.code, w.code === 'unbalance-worse' ? warningText.unbalanceWorse(w.before, w.after, w.threshold) : warningText.neutralWorse(w.before, w.after, after.neutral?.ratingA ?? null), w.after, w.threshold);

  let lightLoad: LightLoadCheck | null = null;
  if (opts.lightLoad) {
    const lightBoard = scaleBoardLoads(board, opts.lightLoad);
    const lightBefore = solve(lightBoard);
    const lightCorrected = addCorrectionEquipment(lightBoard, equipment, { state: 'fixed', capacitanceFactor: 1 + plus });
    const lightAfter = solve(lightCorrected);
    const lightJudged = meter ? judged(lightCorrected) : lightAfter;
    const lightJudgedBefore = meter ? judged(lightBoard) : lightBefore;
    const leadingLines: PhaseId[] = [];
    lightJudged.phases.forEach((p, k) => {
      const b = lightJudgedBefore.phases[k]!;
      const present = b.kW !== 0 ? b.kvar / Math.abs(b.kW) : Infinity;
      const bound = Math.min(lineTanBounds(target, k).low, present);
      if (p.kVA > 0 && p.kvar < bound * Math.abs(p.kW) - TARGET_SLACK * Math.max(p.kVA, b.kVA)) leadingLines.push(p.phase);
    });
    const fixedOnly = equipment.map((g) => ({ ...g, branches: g.branches.map((b) => ({ ...b, susceptanceS: b.fixedSusceptanceS })) }));
    const fixedKvar = branchSizings(fixedOnly, lightCorrected, lightAfter).reduce((sum, b) => sum + b.kvarAtAppliedV, 0);
    const lightRise = voltageRise(board, addedBranches(lightBoard, lightCorrected), fixedKvar, lightBefore, lightAfter, riseLimit);
    if (leadingLines.length) warn('light-load-leading', warningText.lightLoadLeading(leadingLines.map(label)));
    // A fixed part that is inductive (a compensator's reactors stay connected) makes lines lag more at light load:
    // said where a line then lags below the target and more than it did without the equipment.
    if (fixedKvar < 0) {
      const lagging = lightJudged.phases.flatMap((p, k) => {
        const b = lightJudgedBefore.phases[k]!;
        return p.kVA > 0 && p.kvar > b.kvar + TARGET_SLACK * p.kVA && p.pf !== null && p.pf < target.pf ? [{ phase: label(p.phase), pf: p.pf, before: b.pf }] : [];
      });
      if (lagging.length) warn('light-load-lagging', warningText.lightLoadLagging(-fixedKvar, lagging), -fixedKvar, null);
    }
    if (lightRise.flagged) warn('voltage-rise-light-load', warningText.voltageRise('the fixed part at light load', lightRise.judgedPercent, riseLimit), lightRise.solvedPercent, riseLimit);
    lightLoad = {
      fraction: opts.lightLoad.fraction,
      perLoad: opts.lightLoad.perLoad ?? {},
      fixedKvar,
      lines: lightJudged.phases.map((p) => ({ phase: p.phase, pf: p.pf, sense: p.sense })),
      leadingLines,
      ok: leadingLines.length === 0,
      voltageRise: lightRise,
      after: lightAfter,
    };
  }

  const pairOf = (b: number | null | undefined, a: number | null | undefined) => (b === null || b === undefined || a === null || a === undefined ? null : beforeAfter(b, a));
  const powerFactors = (b: BoardResult, a: BoardResult) => ({
    effective: pairOf(b.powerFactor.effective?.pf, a.powerFactor.effective?.pf),
    vector: pairOf(b.powerFactor.vector.pf, a.powerFactor.vector.pf),
    arithmetic: pairOf(b.powerFactor.arithmetic.pf, a.powerFactor.arithmetic.pf),
    positiveSequence: pairOf(b.powerFactor.positiveSequence?.pf, a.powerFactor.positiveSequence?.pf),
  });
  const through = (r: BoardResult, key: 'kW' | 'kvar') => r.phases.reduce((sum, p) => sum + p[key], 0);
  const metering: MeteringReadings | null = meter
    ? {
        point: meter.point,
        lines: lineComparisons(meteredBefore, meteredAfter),
        powerFactor: powerFactors(meteredBefore, meteredAfter),
        kW: beforeAfter(through(meteredBefore, 'kW'), through(meteredAfter, 'kW')),
        kvar: beforeAfter(through(meteredBefore, 'kvar'), through(meteredAfter, 'kvar')),
        before: meteredBefore,
        after: meteredAfter,
      }
    : null;
  const sourceKVA = (r: BoardResult) => Math.hypot(r.source.kW, r.source.kvar);
  return {
    equipment,
    board: corrected,
    target,
    before,
    after,
    check,
    checkBefore: judgeTarget(meteredBefore, target),
    branches,
    lines: lineComparisons(before, after),
    powerFactor: powerFactors(before, after),
    neutralCurrentA: before.neutral && after.neutral ? beforeAfter(before.neutral.current.magnitude, after.neutral.current.magnitude) : null,
    unbalance:
      before.unbalance && after.unbalance
        ? {
            negativeSequenceCurrentPercent: beforeAfter(before.unbalance.currentNegativePercent, after.unbalance.currentNegativePercent),
            zeroSequenceCurrentPercent: beforeAfter(before.unbalance.currentZeroPercent, after.unbalance.currentZeroPercent),
            voltageFactorPercent: beforeAfter(before.unbalance.voltageFactorPercent, after.unbalance.voltageFactorPercent),
          }
        : null,
    releasedKVA: {
      effective: before.powerFactor.effective && after.powerFactor.effective ? before.powerFactor.effective.kVA - after.powerFactor.effective.kVA : null,
      vector: before.powerFactor.vector.kVA - after.powerFactor.vector.kVA,
      arithmetic: before.powerFactor.arithmetic.kVA - after.powerFactor.arithmetic.kVA,
      source: sourceKVA(before) - sourceKVA(after),
    },
    lossReductionKW: before.losses.totalKW - after.losses.totalKW,
    tolerance: { low: { capacitanceFactor: 1 - minus, check: low }, high: { capacitanceFactor: 1 + plus, check: high } },
    voltageRise: rise,
    resonanceOrder,
    resonanceOrders: orders,
    resonanceNearOrders: nearOrders,
    resonanceCapacitance: resonance,
    resonanceStepStates: stepStates,
    resonanceHeadlineOrders: headlineNear,
    resonanceNearHarmonic: headlineNear.length > 0,
    lightLoad,
    overloadsCaused: overloads.map((o) => ({ code: o.code, message: o.message })),
    warnings,
    ...(metering ? { metering } : {}),
  };
}
