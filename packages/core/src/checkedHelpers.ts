/**
 * The exported forms of the small helpers the studies call, unchecked, inside their loops (a phasor
 * read per branch, a label per row, an admittance per order, a batch per interval block). Each checks
 * its arguments once, naming the one that is wrong and what it takes (an InputError), then calls the
 * helper itself: the same answer, and the solves and sweeps inside the library pay nothing for it.
 */
import { degToRad as degToRadOf, polar as polarOf, radToDeg as radToDegOf, toPhasor as toPhasorOf, type ComplexValue, type Phasor } from './complex.js';
import { formatPath as formatPathOf } from './errors.js';
import { powerReading as powerReadingOf } from './analysis/powerReading.js';
import { analyseSolution as analyseSolutionOf } from './analysis/analyseSolution.js';
import { deviationFromAveragePercent as deviationOf } from './analysis/unbalanceIndices.js';
import { effectiveQuantities as effectiveQuantitiesOf } from './analysis/powerDefinitions.js';
import type { BoardResult, PowerReading } from './analysis/boardResult.js';
import {
  solveCompiledBoard as solveCompiledBoardOf,
  solveCompiledInstallation as solveCompiledInstallationOf,
  terminalVoltage as terminalVoltageOf,
  type CompiledBoard,
  type CompiledInstallation,
  type InstallationSolution,
  type NetworkSolution,
} from './network/solveNetwork.js';
import type { SolveOptions } from './network/solveOptions.js';
import type { Board, Terminal } from './board/boardModel.js';
import { labelIn as labelInOf, PHASE_NAMINGS, type PhaseLabel, type PhaseNaming } from './board/conventions/phaseNames.js';
import { conventionsOf as conventionsOfBoard, type BoardConventions } from './board/conventions/boardConventions.js';
import { judgedNominalOf as judgedNominalOfBoard } from './board/nominalVoltages.js';
import { isBoardModel, isInstallationModel } from './board/modelGuards.js';
import { branchAdmittanceAtOrder as branchAdmittanceOf, impedanceAtOrder as impedanceOf } from './harmonics/networkAtOrder.js';
import type { HarmonicModel, LoadBehaviour } from './harmonics/harmonicModel.js';
import { stepCombinations as stepCombinationsOf } from './harmonics/scanResonance.js';
import { dutyFigures as dutyFiguresOf } from './harmonics/capacitorDuty.js';
import type { DutyFigures } from './harmonics/harmonicsResult.js';
import { capacitorVoltage as capacitorVoltageOf, detunedOutputKvar as detunedOutputKvarOf, detunedSusceptance as detunedSusceptanceOf, tuningOrder as tuningOrderOf } from './harmonics/detuning.js';
import { edgePowersAt as edgePowersAtOf, type BatchNetwork, type DriverColumns } from './profile/batchNetwork.js';
import { solveBatch as solveBatchOf, type BatchSolveOptions, type IntervalFigures } from './profile/solveBatch.js';
import type { BatchKernel } from './profile/batchKernel.js';
import { bandDecimalsOf as bandDecimalsOfResult } from './analysis/voltageCheck.js';
import { worstBranch as worstBranchOf } from './analysis/readLoads.js';
import type { BranchReading, LoadReading } from './analysis/boardResult.js';
import { busFigureTexts as busFigureTextsOf, percentAgainstLevel as percentAgainstLevelOf, voltageBasisWords as voltageBasisWordsOf } from './harmonics/harmonicsWording.js';
import type { VoltageDistortionCheck } from './harmonics/harmonicsResult.js';
import { idealSourceHolds as idealSourceHoldsOf } from './render/nominalVoltageWords.js';
import { lowestInstallationVoltageChange as lowestInstallationVoltageChangeOf, lowestVoltageChange as lowestVoltageChangeOf } from './render/report/installationCorrectionSection.js';
import type { InstallationEffect } from './correction/installationEffect.js';
import type { BeforeAfter } from './correction/correctionResult.js';
import { lowestVoltagePercentText as lowestVoltagePercentTextOf } from './render/report/installationSections.js';
import type { InstallationResult } from './analysis/installationResult.js';
import { argumentIssueError, checkComplexArgument, checkListArgument, checkNumberArgument, checkObjectArgument, checkTextArgument } from './_internal/argumentChecks.js';

const FINITE = 'a finite number';
const isFiniteNumber = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
/** A detuning factor p = X_L/X_C: a step tuned below the fundamental (p ≥ 1) is not a detuned capacitor. */
const DETUNING_FACTOR = 'a detuning factor p = X_L/X_C from 0 up to (not including) 1, e.g. 0.07';
const checkDetuning = (p: unknown, argument = 'p'): void => checkNumberArgument(p, argument, DETUNING_FACTOR, (x) => x >= 0 && x < 1);
const checkOrder = (h: unknown, argument = 'h'): void => checkNumberArgument(h, argument, 'a harmonic order above 0 (1 is the fundamental)', (x) => x > 0);

/** Degrees to radians. @throws {InputError} when `deg` is not a finite number */
export function degToRad(deg: number): number {
  checkNumberArgument(deg, 'deg', `${FINITE} of degrees`);
  return degToRadOf(deg);
}

/** e^{jθ}·r, θ in radians. @throws {InputError} naming the argument that is not a finite number */
export function polar(magnitude: number, angleRad: number): ComplexValue {
  checkNumberArgument(magnitude, 'magnitude', FINITE);
  checkNumberArgument(angleRad, 'angleRad', `${FINITE} of radians`);
  return polarOf(magnitude, angleRad);
}

/** Radians to degrees. @throws {InputError} when `rad` is not a finite number */
export function radToDeg(rad: number): number {
  checkNumberArgument(rad, 'rad', `${FINITE} of radians`);
  return radToDegOf(rad);
}

/**
 * Adds magnitude and angle (degrees, in (-180, 180]) to a complex value.
 * @example toPhasor({ re: 0, im: 2 }) //=> { re: 0, im: 2, magnitude: 2, angleDeg: 90 }
 * @throws {InputError} when `a` is not { re, im } of finite numbers
 */
export function toPhasor(a: ComplexValue): Phasor {
  checkComplexArgument(a, 'a');
  return toPhasorOf(a);
}

/**
 * A complex power S = P + jQ (VA) read as kW, kvar, kVA, power factor and its sense.
 * @throws {InputError} when `s` is not { re, im } of finite numbers
 */
export function powerReading(s: ComplexValue): PowerReading {
  checkComplexArgument(s, 's');
  return powerReadingOf(s);
}

/**
 * Renders a path the way people read it: `loads[3].pf`.
 * @example formatPath(['loads', 3, 'pf']) //=> 'loads[3].pf'
 * @throws {InputError} when `path` is not a list of keys (strings, numbers, symbols)
 */
export function formatPath(path: readonly PropertyKey[]): string {
  checkListArgument(path, 'path', 'a list of keys (strings, numbers or symbols), e.g. ["loads", 3, "pf"]', (k) => typeof k === 'string' || typeof k === 'number' || typeof k === 'symbol');
  return formatPathOf(path);
}

/** A solved network read as a board result (what solveBoardModel gives). @throws {InputError} when `solved` is not a network solution */
export function analyseSolution(solved: NetworkSolution): BoardResult {
  checkObjectArgument(solved, 'solved', 'a network solution from solveNetwork(board) or solveCompiledBoard(...)', ['board', 'topology', 'nodeVoltages', 'lineCurrents', 'branches']);
  if (!isBoardModel(solved.board) || !Array.isArray(solved.lineCurrents) || !Array.isArray(solved.branches))
    throw argumentIssueError('solved', 'a network solution from solveNetwork(board) or solveCompiledBoard(...)', solved);
  return analyseSolutionOf(solved);
}

/**
 * The largest deviation of the magnitudes from their average, % of the average (NEMA line-voltage unbalance).
 * @throws {InputError} when `magnitudes` is not a non-empty list of finite numbers, or `noiseFloor` is negative
 */
export function deviationFromAveragePercent(magnitudes: readonly number[], noiseFloor = 0): number {
  checkListArgument(magnitudes, 'magnitudes', 'a non-empty list of finite magnitudes, e.g. [460, 467, 450]', isFiniteNumber);
  if (magnitudes.length === 0) throw argumentIssueError('magnitudes', 'a non-empty list of finite magnitudes, e.g. [460, 467, 450]', magnitudes);
  checkNumberArgument(noiseFloor, 'noiseFloor', 'a finite number at least 0', (x) => x >= 0);
  return deviationOf(magnitudes, noiseFloor);
}

/** Ve and Ie for a three-phase board (IEEE 1459). @throws {InputError} naming the list or current that is not finite figures */
export function effectiveQuantities(lineToNeutral: readonly number[], lineToLine: readonly number[], lineCurrents: readonly number[], neutralCurrent: number | null): { Ve: number; Ie: number } {
  checkListArgument(lineToNeutral, 'lineToNeutral', 'the three line-to-neutral voltage magnitudes, V', isFiniteNumber);
  checkListArgument(lineToLine, 'lineToLine', 'the three line-to-line voltage magnitudes, V', isFiniteNumber);
  checkListArgument(lineCurrents, 'lineCurrents', 'the three line current magnitudes, A', isFiniteNumber);
  if (neutralCurrent !== null) checkNumberArgument(neutralCurrent, 'neutralCurrent', 'the neutral current magnitude, A, or null on a board without a neutral');
  return effectiveQuantitiesOf(lineToNeutral, lineToLine, lineCurrents, neutralCurrent);
}

/** Voltage of a terminal in a solution (null when it is connected to nothing). @throws {InputError} naming the argument that is wrong */
export function terminalVoltage(solution: Pick<NetworkSolution, 'topology' | 'nodeVoltages'>, terminal: Terminal): ComplexValue | null {
  checkObjectArgument(solution, 'solution', 'a network solution from solveNetwork(board) or solveCompiledBoard(...)', ['topology', 'nodeVoltages']);
  checkTextArgument(terminal, 'terminal', 'a terminal: "A", "B", "C", "N" or a load\'s star point "star:<index>"');
  return terminalVoltageOf(solution, terminal);
}

/** Solves a compiled board (see compileBoard). @throws {InputError} when `compiled` is not one */
export function solveCompiledBoard(compiled: CompiledBoard, options?: SolveOptions): NetworkSolution {
  checkObjectArgument(compiled, 'compiled', 'a compiled board from compileBoard(board)', ['board', 'boardIndex', 'installation', 'network']);
  return solveCompiledBoardOf(compiled, options);
}

/** Solves a compiled installation (see compileInstallation). @throws {InputError} when `compiled` is not one */
export function solveCompiledInstallation(compiled: CompiledInstallation, options?: SolveOptions): InstallationSolution {
  checkObjectArgument(compiled, 'compiled', 'a compiled installation from compileInstallation(installation)', ['installation', 'layout', 'network']);
  if (!isInstallationModel(compiled.installation)) throw argumentIssueError('compiled', 'a compiled installation from compileInstallation(installation)', compiled);
  return solveCompiledInstallationOf(compiled, options);
}

/** A report label for a phase, line pair or connection written A/B/C. @throws {InputError} naming the argument that is wrong */
export function labelIn(naming: PhaseNaming, term: string): PhaseLabel {
  if (!(PHASE_NAMINGS as readonly unknown[]).includes(naming)) throw argumentIssueError('naming', PHASE_NAMINGS.join(' or '), naming);
  checkTextArgument(term, 'term', 'a phase, line pair or connection written A/B/C, e.g. "A", "A-B", "ABC-delta"');
  return labelInOf(naming, term);
}

const BOARD_LIKE = 'a board from normaliseBoard(...) (or an object with system, frequencyHz, nominalLineToNeutralV and nominalLineToLineV)';

/** A board's conventions: those settled from its file, or the defaults for a board built in code. @throws {InputError} when `board` is not a board */
export function conventionsOf(board: Parameters<typeof conventionsOfBoard>[0]): BoardConventions {
  checkObjectArgument(board, 'board', BOARD_LIKE, ['system', 'frequencyHz', 'nominalLineToNeutralV']);
  if (typeof board.system !== 'string' || !isFiniteNumber(board.frequencyHz) || !isFiniteNumber(board.nominalLineToNeutralV)) throw argumentIssueError('board', BOARD_LIKE, board);
  return conventionsOfBoard(board);
}

/** A board's system nominal voltages, its model's where the board carries none. @throws {InputError} when `board` is not a board */
export function judgedNominalOf(board: Pick<Board, 'nominalLineToNeutralV' | 'nominalLineToLineV' | 'systemNominal'>): { ln: number; ll: number | null } {
  checkObjectArgument(board, 'board', 'a board from normaliseBoard(...)', ['nominalLineToNeutralV']);
  if (!isFiniteNumber(board.nominalLineToNeutralV)) throw argumentIssueError('board', 'a board from normaliseBoard(...)', board);
  return judgedNominalOfBoard(board);
}

/** Scales a series impedance R + jX to order h. @throws {InputError} naming the argument that is wrong */
export function impedanceAtOrder(z: ComplexValue, h: number, resistance: HarmonicModel['resistance'] = 'constant'): ComplexValue {
  checkComplexArgument(z, 'z');
  checkOrder(h);
  return impedanceOf(z, h, resistance);
}

/** Admittance of a linear or detuned branch at order h from its fundamental admittance y1. @throws {InputError} naming the argument that is wrong */
export function branchAdmittanceAtOrder(y1: ComplexValue, behaviour: LoadBehaviour, h: number): ComplexValue {
  checkComplexArgument(y1, 'y1');
  checkObjectArgument(behaviour, 'behaviour', "a load's harmonic behaviour (resolveHarmonicModel(...).loads[i].behaviour)", ['kind']);
  checkOrder(h);
  return branchAdmittanceOf(y1, behaviour, h);
}

/** Every on/off pattern of n steps, all off first. @throws {InputError} when `n` is not a whole number of steps from 0 to 20 */
export function stepCombinations(n: number): boolean[][] {
  // 2^20 patterns is past any bank a controller steps (common practice, no source: 6 to 12 outputs).
  checkNumberArgument(n, 'n', 'a whole number of steps from 0 to 20', (x) => Number.isInteger(x) && x >= 0 && x <= 20);
  return stepCombinationsOf(n);
}

/** Figures per unit for one bank branch from its branch voltage at each order. @throws {InputError} naming the argument that is wrong */
export function dutyFigures(branchVoltages: readonly { order: number; volts: number }[], ratedV: number, p: number, capacitanceFactor = 1): DutyFigures {
  checkListArgument(branchVoltages, 'branchVoltages', 'a list of { order, volts } with the fundamental (order 1) among them', (x) => typeof x === 'object' && x !== null && isFiniteNumber((x as { order?: unknown }).order) && isFiniteNumber((x as { volts?: unknown }).volts));
  checkNumberArgument(ratedV, 'ratedV', 'the units\' rated voltage, V, above 0', (x) => x > 0);
  checkDetuning(p);
  checkNumberArgument(capacitanceFactor, 'capacitanceFactor', 'the capacitance over nominal, above 0 (1 = nominal)', (x) => x > 0);
  return dutyFiguresOf(branchVoltages, ratedV, p, capacitanceFactor);
}

/** Tuning order 1/√p of a detuned step. @throws {InputError} when `p` is not a detuning factor above 0 */
export function tuningOrder(p: number): number {
  checkNumberArgument(p, 'p', 'a detuning factor p = X_L/X_C above 0 and below 1, e.g. 0.07', (x) => x > 0 && x < 1);
  return tuningOrderOf(p);
}

/** Fundamental voltage across the capacitor of a detuned step at network voltage u, V. @throws {InputError} naming the argument that is wrong */
export function capacitorVoltage(u: number, p: number): number {
  checkNumberArgument(u, 'u', 'the network voltage, V, at least 0', (x) => x >= 0);
  checkDetuning(p);
  return capacitorVoltageOf(u, p);
}

/** Effective fundamental output of a detuned step of rating qRated at uRated, on network voltage u, kvar. @throws {InputError} naming the argument that is wrong */
export function detunedOutputKvar(qRatedKvar: number, uRated: number, u: number, p: number): number {
  checkNumberArgument(qRatedKvar, 'qRatedKvar', 'the rated output, kvar, at least 0', (x) => x >= 0);
  checkNumberArgument(uRated, 'uRated', 'the rated voltage, V, above 0', (x) => x > 0);
  checkNumberArgument(u, 'u', 'the network voltage, V, at least 0', (x) => x >= 0);
  checkDetuning(p);
  return detunedOutputKvarOf(qRatedKvar, uRated, u, p);
}

/** Susceptance of a detuned branch at order h (h ≠ the tuning order), S. @throws {InputError} naming the argument that is wrong */
export function detunedSusceptance(bEffective: number, p: number, h: number): number {
  checkNumberArgument(bEffective, 'bEffective', `${FINITE}: the branch's effective fundamental susceptance, S`);
  checkDetuning(p);
  checkNumberArgument(h, 'h', 'a harmonic order above 0 other than the tuning order 1/√p', (x) => x > 0 && x * x * p !== 1);
  return detunedSusceptanceOf(bEffective, p, h);
}

/** Fills `out` with the edge powers of interval i. @throws {InputError} naming the argument that is wrong */
export function edgePowersAt(net: Pick<BatchNetwork, 'coefficients'>, columns: DriverColumns, i: number, out: Float64Array): void {
  checkObjectArgument(net, 'net', 'a batch network from compileBatchNetwork(...)', ['coefficients']);
  checkObjectArgument(columns, 'columns', 'the columns from driverColumns(...)', ['count', 're', 'im']);
  checkNumberArgument(i, 'i', `an interval index from 0 to below columns.count (${String(columns.count)})`, (x) => Number.isInteger(x) && x >= 0 && x < Number(columns.count));
  if (!(out instanceof Float64Array)) throw argumentIssueError('out', 'a Float64Array of [edge][part][re, im]', out);
  edgePowersAtOf(net, columns, i, out);
}

/** Solves intervals [from, to) of the drivers into `out`. @throws {InputError} naming the argument that is wrong */
export function solveBatch(
  net: BatchNetwork,
  columns: DriverColumns,
  out: IntervalFigures,
  options: BatchSolveOptions & { readonly from?: number; readonly to?: number; readonly onProgress?: (done: number) => void } = {},
): { path: BatchKernel['path'] } {
  checkObjectArgument(net, 'net', 'a batch network from compileBatchNetwork(...)', ['board', 'edges', 'coefficients']);
  checkObjectArgument(columns, 'columns', 'the columns from driverColumns(...)', ['count', 're', 'im']);
  checkObjectArgument(out, 'out', 'interval figures from allocateFigures(...)', ['count']);
  checkObjectArgument(options, 'options', 'an options object ({} for the defaults)');
  return solveBatchOf(net, columns, out, options);
}

const SOLVED_BOARD = 'a solved board from solveBoard(...) or solveBoardModel(...)';

/** The decimals a board's band in volts is printed with (see voltageBesideBand.ts). @throws {InputError} when `result` is not a solved board */
export function bandDecimalsOf(result: Pick<BoardResult, 'voltageCheck' | 'phases' | 'lineToLine' | 'neutral' | 'loads'>): { lineToNeutral: number; lineToLine: number } {
  checkObjectArgument(result, 'result', SOLVED_BOARD, ['voltageCheck', 'phases', 'lineToLine', 'loads']);
  checkListArgument(result.phases, 'result.phases', SOLVED_BOARD);
  checkListArgument(result.loads, 'result.loads', SOLVED_BOARD);
  return bandDecimalsOfResult(result);
}

/** The branch of a circuit furthest from its nominal voltage, above or below. @throws {InputError} when `load` has no branches to read */
export function worstBranch(load: Pick<LoadReading, 'branches'>): BranchReading {
  checkObjectArgument(load, 'load', 'a circuit of a solved board (result.loads[k])', ['branches']);
  checkListArgument(load.branches, 'load.branches', 'the branches of a solved circuit, at least one', (x) => typeof x === 'object' && x !== null);
  if (load.branches.length === 0) throw argumentIssueError('load.branches', 'the branches of a solved circuit, at least one', load.branches);
  return worstBranchOf(load);
}

const DISTORTION_CHECK = 'a board\'s voltage distortion check (a harmonics report\'s voltageDistortion)';

/** A harmonic voltage figure beside its level, with the decimals it needs to read above it. @throws {InputError} naming an argument that is not a finite figure */
export function percentAgainstLevel(x: number, limit: number | null): string {
  checkNumberArgument(x, 'x', `${FINITE} (% of the fundamental)`);
  if (limit !== null) checkNumberArgument(limit, 'limit', 'a level in % of the fundamental, a finite number of 0 or more, or null', (v) => v >= 0);
  return percentAgainstLevelOf(x, limit);
}

/** How one bus's figures print against the check's levels. @throws {InputError} when `check` is not a distortion check or `bus` not a name */
export function busFigureTexts(check: VoltageDistortionCheck, bus: string): { thd: (x: number) => string; order: (order: number, x: number) => string } {
  checkObjectArgument(check, 'check', DISTORTION_CHECK, ['thdLimitPercent', 'orderLimits', 'buses']);
  checkTextArgument(bus, 'bus', 'the name of one of the check\'s buses, e.g. "A-N"');
  return busFigureTextsOf(check, bus);
}

/** The basis of a distortion check in words. @throws {InputError} when `check` is not a distortion check */
export function voltageBasisWords(check: Pick<VoltageDistortionCheck, 'basisName' | 'basisFrom' | 'individualLimitPercent' | 'orderLimits' | 'thdLimitPercent'>): string {
  checkObjectArgument(check, 'check', DISTORTION_CHECK, ['basisName', 'basisFrom', 'orderLimits', 'thdLimitPercent']);
  checkListArgument(check.orderLimits, 'check.orderLimits', DISTORTION_CHECK);
  return voltageBasisWordsOf(check);
}

/** What an ideal source holds, in words. @throws {InputError} when `board` is not a solved board's board */
export function idealSourceHolds(board: BoardResult['board']): string {
  checkObjectArgument(board, 'board', 'the board of a solved board (result.board)', ['nominalLineToNeutralV']);
  checkNumberArgument(board.nominalLineToNeutralV, 'board.nominalLineToNeutralV', 'a nominal voltage in V, a finite number above 0', (x) => x > 0);
  return idealSourceHoldsOf(board);
}

const EFFECT = 'the installation effect of a correction (correctInstallation(...).effect)';

/** One board's lowest voltage before → after a correction, printed against its limits. @throws {InputError} naming the argument that is not what it takes */
export function lowestVoltageChange(effect: Pick<InstallationEffect, 'before'>, board: { readonly name: string; readonly lowestVoltagePercent: BeforeAfter }): { before: string; after: string } {
  checkObjectArgument(effect, 'effect', EFFECT, ['before']);
  checkObjectArgument(board, 'board', 'a board of the effect (effect.boards[k])', ['name', 'lowestVoltagePercent']);
  checkObjectArgument(board.lowestVoltagePercent, 'board.lowestVoltagePercent', 'the lowest voltage before and after, % of nominal', ['before', 'after']);
  return lowestVoltageChangeOf(effect, board);
}

/** The installation's lowest voltage before → after a correction, printed against its limits. @throws {InputError} when `effect` is not an installation effect */
export function lowestInstallationVoltageChange(effect: Pick<InstallationEffect, 'before' | 'after'>): { before: string; after: string } {
  checkObjectArgument(effect, 'effect', EFFECT, ['before', 'after']);
  checkObjectArgument(effect.before, 'effect.before', 'a solved installation', ['totals', 'boards']);
  checkObjectArgument(effect.after, 'effect.after', 'a solved installation', ['totals', 'boards']);
  return lowestInstallationVoltageChangeOf(effect);
}

/** An installation's lowest voltage, printed against its board's limits. @throws {InputError} when `result` is not a solved installation */
export function lowestVoltagePercentText(result: Pick<InstallationResult, 'totals' | 'boards'>): string {
  checkObjectArgument(result, 'result', 'a solved installation from solveInstallation(...)', ['totals', 'boards']);
  checkListArgument(result.boards, 'result.boards', 'a solved installation from solveInstallation(...)');
  return lowestVoltagePercentTextOf(result);
}

