/**
 * NetworkSolution → BoardResult: per-phase and per-load readings, symmetrical
 * components, unbalance, power definitions, losses, warnings.
 */
import { abs, absSquared, add, conj, degToRad, mul, polar, scale, sub, sum, toPhasor, ZERO, type ComplexValue } from '../complex.js';
import { isThreePhase } from '../board/systemTopology.js';
import { lineRatingOf, type PhaseId } from '../board/boardModel.js';
import { judgedNominalOf } from '../board/nominalVoltages.js';
import { balancedAnglesDeg } from '../board/normaliseBoard.js';
import { terminalVoltage, type NetworkSolution } from '../network/solveNetwork.js';
import { fortescueComponents, type SequenceSet } from './symmetricalComponents.js';
import { deviationFromAveragePercent, nemaDerating } from './unbalanceIndices.js';
import { boardPowerDefinitions, positiveSequencePower } from './powerDefinitions.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { sourceModelOf } from '../board/conventions/regionWords.js';
import { labelIn } from '../board/conventions/phaseNames.js';
import { checkVoltages } from './voltageCheck.js';
import { boardWarnings, GENERAL_CAUTION, NEUTRAL_CAUTION } from './boardWarnings.js';
import { readLoads } from './readLoads.js';
import { powerReading } from './powerReading.js';
import { currentNoiseFloor, SEQUENCE_VOLTAGE_RESOLUTION, sequencesAbove, withNoiseFloor } from './noiseFloor.js';
import { judgeOperatingPoint, readIncomer, readSourceUnits, readTransformer } from './readSupplyState.js';
import type { BoardResult, LineToLineReading, LossReading, NeutralReading, PhaseReading, PowerReading, UnbalanceReading } from './boardResult.js';

const PAIRS: Record<string, readonly [PhaseId, PhaseId][]> = {
  'three-phase-4wire': [['A', 'B'], ['B', 'C'], ['C', 'A']],
  'three-phase-3wire': [['A', 'B'], ['B', 'C'], ['C', 'A']],
  'split-phase': [['A', 'B']],
  'single-phase': [],
};

/** |x|/|base| in %; magnitudes equal but for round-off (an A-B load alone: |I2| = |I1|) read exactly 100. */
const percentOf = (x: ComplexValue, base: ComplexValue) => {
  const b = abs(base);
  if (b === 0) return 0;
  const a = abs(x);
  return Math.abs(a - b) <= SEQUENCE_VOLTAGE_RESOLUTION * b ? 100 : (100 * a) / b;
};

/** The main board of a supply of zero impedance: every source impedance nothing (a sub-board's is zero as its supply is the board above). */
/**
 * The source EMFs as entered, where they are not the balanced set at the model's nominal voltage that
 * a file without `supply.emf` gets: the reports then describe the source by these, not by the nominal.
 */
function enteredEmf(board: NetworkSolution['board']): BoardResult['board']['sourceEmf'] {
  const angles = balancedAnglesDeg(board.system, board.sequence);
  const ln = board.nominalLineToNeutralV;
  const asNominal = board.emf.every((e, k) => abs(sub(e, polar(ln, degToRad(angles[k] ?? 0)))) <= 1e-9 * ln);
  return asNominal ? undefined : board.phases.map((phase, k) => {
        const { magnitude, angleDeg } = toPhasor(board.emf[k]!);
        return { phase, magnitude, angleDeg };
      });
}

function hasIdealSource(board: NetworkSolution['board']): boolean {
  const none = (z: ComplexValue | undefined) => z === undefined || (z.re === 0 && z.im === 0);
  return (board.installation?.boardIndex ?? 0) === 0 && none(board.sourceImpedance) && (board.sourceImpedances ?? []).every(none) && none(board.sourceStarImpedance) && !board.sourceUnits?.length;
}

/** Voltages of the board's phase buses to the source star point, and what line-to-neutral loads see. */
function boardVoltages(solution: Pick<NetworkSolution, 'board' | 'topology' | 'nodeVoltages'>) {
  const { board } = solution;
  const bus = board.phases.map((p) => terminalVoltage(solution, p) ?? ZERO);
  // Phase voltages are what line-to-neutral loads see: to the board neutral bar on a
  // 4-wire board, to the virtual neutral (centroid of the line voltages) on a 3-wire one.
  const neutralBar = board.hasNeutral ? terminalVoltage(solution, 'N') : null;
  const reference = board.hasNeutral ? (neutralBar ?? ZERO) : scale(sum(bus), 1 / bus.length);
  return { bus, neutralBar, phase: bus.map((v) => sub(v, reference)) };
}

/** A current as a percentage of a rating; null without one. */
const loadingOf = (currentA: number, ratingA: number | null): number | null => (ratingA ? (100 * currentA) / ratingA : null);

function readPhases(solution: NetworkSolution, phaseVoltages: readonly ComplexValue[]): PhaseReading[] {
  const { board } = solution;
  const ln = judgedNominalOf(board).ln;
  // Each phase's open-circuit voltage to the point its phase voltage is read from: the source star point
  // where a neutral is carried; on a 3-wire board the centroid of the EMFs, since no current sees their
  // zero-sequence part (unequal EMFs of an open delta would otherwise show a drop with no load at all).
  const emfCentroid = board.hasNeutral ? ZERO : scale(sum(board.emf), 1 / board.emf.length);
  return board.phases.map((phase, k) => {
    const v = phaseVoltages[k]!;
    const i = solution.lineCurrents[k]!;
    return {
      phase,
      voltage: toPhasor(v),
      voltagePercent: (100 * abs(v)) / ln,
      current: toPhasor(i),
      ...powerReading(mul(v, conj(i))),
      loadingPercent: loadingOf(abs(i), lineRatingOf(board, k)),
      // What line-to-neutral loads lose: to the neutral bar, so the neutral conductor's drop counts too.
      voltageDropPercent: (100 * (abs(sub(board.emf[k]!, emfCentroid)) - abs(v))) / ln,
    };
  });
}

function readLineToLine(solution: NetworkSolution, bus: readonly ComplexValue[]): LineToLineReading[] {
  const { board } = solution;
  const nominal = judgedNominalOf(board);
  return PAIRS[board.system]!.map(([p, q]) => {
    const v = sub(bus[board.phases.indexOf(p)]!, bus[board.phases.indexOf(q)]!);
    return { pair: `${p}-${q}`, voltage: toPhasor(v), voltagePercent: (100 * abs(v)) / (nominal.ll ?? nominal.ln) };
  });
}

function readNeutral(solution: NetworkSolution, neutralBar: ComplexValue | null): NeutralReading | null {
  const { board, neutralCurrent } = solution;
  if (neutralCurrent === null) return null;
  const largestLine = Math.max(...solution.lineCurrents.map(abs));
  return {
    current: toPhasor(neutralCurrent),
    barVoltage: neutralBar ? toPhasor(neutralBar) : null,
    ratingA: board.neutralRatingA,
    loadingPercent: board.neutralRatingA ? (100 * abs(neutralCurrent)) / board.neutralRatingA : null,
    percentOfLargestLine: largestLine === 0 ? 0 : (100 * abs(neutralCurrent)) / largestLine,
  };
}

/**
 * Losses in what feeds this board: its feeder's line conductors carry the line currents,
 * the neutral conductor its own current; on a main board also the source windings
 * (per phase when they differ; none at an open delta's corner) and the star-point
 * return that models a zero-sequence impedance, which carries the sum of the line currents.
 */
function readLosses(solution: NetworkSolution): LossReading {
  const { board } = solution;
  let source = ZERO;
  let feeder = ZERO;
  solution.lineCurrents.forEach((i, k) => {
    const sq = absSquared(i);
    if (board.openDeltaCorner !== board.phases[k]) source = add(source, scale(board.sourceImpedances?.[k] ?? board.sourceImpedance, sq));
    feeder = add(feeder, scale(board.lineImpedances?.[k] ?? board.lineImpedance, sq));
  });
  if (board.sourceStarImpedance && !board.openDeltaCorner) source = add(source, scale(board.sourceStarImpedance, absSquared(sum(solution.lineCurrents))));
  const neutralSq = solution.neutralCurrent ? absSquared(solution.neutralCurrent) : 0;
  const neutral = board.neutralOpen ? ZERO : scale(board.neutralImpedance, neutralSq);
  const total = add(add(source, feeder), neutral);
  return { sourceKW: source.re / 1000, lineFeederKW: feeder.re / 1000, neutralKW: neutral.re / 1000, totalKW: total.re / 1000, totalKvar: total.im / 1000 };
}

/** Phase voltages' sequence components, round-off of the zero and negative sequences (a balanced board's) read as zero. */
function voltageSequences(phaseVoltages: readonly ComplexValue[], sequence: 'ABC' | 'ACB') {
  const vs = fortescueComponents(phaseVoltages as unknown as [ComplexValue, ComplexValue, ComplexValue], sequence);
  return sequencesAbove(vs, SEQUENCE_VOLTAGE_RESOLUTION * abs(vs.positive));
}

function readSequences(solution: NetworkSolution, phaseVoltages: readonly ComplexValue[], phases: readonly PhaseReading[], lineToLine: readonly LineToLineReading[], currentFloor: number) {
  const triple = (xs: readonly ComplexValue[]) => xs as unknown as [ComplexValue, ComplexValue, ComplexValue];
  const vs = voltageSequences(phaseVoltages, solution.board.sequence);
  const is = sequencesAbove(fortescueComponents(triple(solution.lineCurrents), solution.board.sequence), currentFloor);
  const asPhasors = (x: typeof vs) => ({ zero: toPhasor(x.zero), positive: toPhasor(x.positive), negative: toPhasor(x.negative) });
  // Magnitudes of a balanced set differ in their last bits: below the sequences' resolution (voltages)
  // and the current noise floor (currents) a deviation is round-off, as |V2| and |I2| are.
  const voltageDeviation = (ms: readonly number[]) => deviationFromAveragePercent(ms, SEQUENCE_VOLTAGE_RESOLUTION * Math.max(...ms));
  const lineRate = voltageDeviation(lineToLine.map((l) => l.voltage.magnitude));
  const unbalance: UnbalanceReading = {
    voltageFactorPercent: percentOf(vs.negative, vs.positive),
    zeroSequenceVoltagePercent: percentOf(vs.zero, vs.positive),
    lineVoltageRatePercent: lineRate,
    phaseVoltageRatePercent: voltageDeviation(phases.map((p) => p.voltage.magnitude)),
    currentNegativePercent: percentOf(is.negative, is.positive),
    currentZeroPercent: percentOf(is.zero, is.positive),
    currentDeviationPercent: deviationFromAveragePercent(solution.lineCurrents.map(abs), currentFloor),
    motorDeratingFactor: nemaDerating(lineRate),
  };
  return { sequences: { voltage: asPhasors(vs), current: asPhasors(is) }, unbalance, V1: vs.positive, I1: is.positive };
}

/** Loads whose current/power part runs below the solver's low-voltage threshold. */
function loadsBelowThreshold(solution: NetworkSolution) {
  const board = solution.board;
  return board.loads.flatMap((load, li) => {
    const states = solution.branches[li]!;
    let pu = Infinity;
    let ratingV = 0;
    load.branches.forEach((b, bi) => {
      const x = b.zip.z === 1 || !states[bi]!.energised ? Infinity : abs(states[bi]!.voltage) / b.vNominal;
      if (x < pu) [pu, ratingV] = [x, b.vNominal];
    });
    if (!(pu < solution.lowVoltageThreshold)) return [];
    // Where the rating is taken at another voltage than the nominal the tables print against (a 400 V source's 230.9 V), the words name it.
    return [{ name: load.name, pu, threshold: solution.lowVoltageThreshold, ...(board.systemNominal ? { ratingV } : {}) }];
  });
}

/**
 * Per line, the power the board takes (what `analyseSolution(solved).phases[k]` reports as
 * kW, kvar, kVA, read the same way, noise floor included) without the rest of the analysis:
 * the correction's sizing loops read only these on most of their trial solves.
 */
export function readLinePowers(solved: NetworkSolution): PowerReading[] {
  return linePowersAbove(solved, currentNoiseFloor(solved));
}

/** What the line readings take of a solved board: its layout, node voltages and line currents. */
export type SolvedLines = Pick<NetworkSolution, 'board' | 'topology' | 'nodeVoltages' | 'lineCurrents'>;

/** `readLinePowers` with the board's noise floor given (see noiseFloor.ts), for readers that find it without a whole solution. */
export function linePowersAbove(solved: SolvedLines, floor: number): PowerReading[] {
  const phase = boardVoltages(solved).phase;
  return solved.lineCurrents.map((i, k) => powerReading(mul(phase[k]!, conj(abs(i) < floor ? ZERO : i))));
}

/** What a balancing compensator's sizing reads off a trial solve. */
export interface SequenceReading {
  /** Sequence components of the line currents, A (`analyseSolution(solved).sequences.current` as plain complex values). */
  readonly current: SequenceSet;
  /** Positive-sequence power (`analyseSolution(solved).powerFactor.positiveSequence`'s kW and kvar). */
  readonly positiveSequence: { readonly kW: number; readonly kvar: number };
}

/**
 * The line currents' sequence components and the positive-sequence power of a three-phase board,
 * read the same way `analyseSolution` reads them (noise floor included, the same operations, so the
 * same numbers) without the rest of the analysis; null on a board without three phases.
 */
export function readSequenceCurrents(solved: NetworkSolution): SequenceReading | null {
  return sequenceCurrentsAbove(solved, currentNoiseFloor(solved));
}

/** `readSequenceCurrents` with the board's noise floor given. */
export function sequenceCurrentsAbove(solved: SolvedLines, floor: number): SequenceReading | null {
  if (!isThreePhase(solved.board.system)) return null;
  const lines = solved.lineCurrents.map((i) => (abs(i) < floor ? ZERO : i));
  const triple = (xs: readonly ComplexValue[]) => xs as unknown as [ComplexValue, ComplexValue, ComplexValue];
  const vs = voltageSequences(boardVoltages(solved).phase, solved.board.sequence);
  const is = sequencesAbove(fortescueComponents(triple(lines), solved.board.sequence), floor);
  const { p1, q1 } = positiveSequencePower(vs.positive, is.positive);
  return { current: is, positiveSequence: { kW: p1 / 1000, kvar: q1 / 1000 } };
}

/** What a target check reads of a solved board (`judgeTarget` in correction/correctionTarget.ts). */
export type TargetReadings = Pick<BoardResult, 'conventions' | 'phases' | 'powerFactor'>;

/**
 * The per-line readings and board power factors `analyseSolution` reports (noise floor included,
 * the same operations, so the same numbers) without the rest of the analysis: the correction's
 * verification reads only these at the capacitance tolerance ends.
 */
export function readTargetFigures(solved: NetworkSolution): TargetReadings {
  const floor = currentNoiseFloor(solved);
  const clean = (i: ComplexValue): ComplexValue => (abs(i) < floor ? ZERO : i);
  const solution = { ...solved, lineCurrents: solved.lineCurrents.map(clean), neutralCurrent: solved.neutralCurrent === null ? null : clean(solved.neutralCurrent) };
  const voltages = boardVoltages(solution);
  const phases = readPhases(solution, voltages.phase);
  const lineToLine = readLineToLine(solution, voltages.bus);
  const triple = (xs: readonly ComplexValue[]) => xs as unknown as [ComplexValue, ComplexValue, ComplexValue];
  const sequence = isThreePhase(solution.board.system)
    ? { V1: fortescueComponents(triple(voltages.phase), solution.board.sequence).positive, I1: fortescueComponents(triple(solution.lineCurrents), solution.board.sequence).positive }
    : null;
  return { conventions: conventionsOf(solution.board), phases, powerFactor: readPowerFactors(solution, phases, lineToLine, sequence) };
}

function readPowerFactors(
  solution: Pick<NetworkSolution, 'board' | 'neutralCurrent'>,
  phases: readonly PhaseReading[],
  lineToLine: readonly LineToLineReading[],
  sequence: { V1: ComplexValue; I1: ComplexValue } | null,
) {
  return boardPowerDefinitions({
    phasePowers: phases.map((p) => ({ re: p.kW * 1000, im: p.kvar * 1000 })),
    phaseVoltages: phases.map((p) => p.voltage.magnitude),
    phaseCurrents: phases.map((p) => p.current.magnitude),
    lineToLine: lineToLine.map((l) => l.voltage.magnitude),
    neutralCurrent: solution.neutralCurrent ? abs(solution.neutralCurrent) : null,
    threePhase: isThreePhase(solution.board.system),
    sequence,
  });
}

export function analyseSolution(solved: NetworkSolution): BoardResult {
  const floor = currentNoiseFloor(solved);
  const solution = withNoiseFloor(solved, floor);
  const { board } = solution;
  const threePhase = isThreePhase(board.system);
  const voltages = boardVoltages(solution);
  const phases = readPhases(solution, voltages.phase);
  const lineToLine = readLineToLine(solution, voltages.bus);
  const neutral = readNeutral(solution, voltages.neutralBar);
  const loads = readLoads(solution, voltages.bus);
  const loadTotal = sum(solution.branches.flat().map((s) => mul(s.voltage, conj(s.current))));
  // A sub-board's supply is what its feeder takes from the board feeding it; nothing when no current
  // above round-off flows in it (its raw sum was about 1e-14 kW on a board with nothing on).
  const idle = solution.lineCurrents.every((i) => i.re === 0 && i.im === 0) && (solution.neutralCurrent === null || (solution.neutralCurrent.re === 0 && solution.neutralCurrent.im === 0));
  const sourcePower = idle ? ZERO : (solution.suppliedPower ?? sum(board.emf.map((e, k) => mul(e, conj(solution.lineCurrents[k]!)))));
  const seq = threePhase ? readSequences(solution, voltages.phase, phases, lineToLine, floor) : null;
  const powerFactor = readPowerFactors(solution, phases, lineToLine, seq ? { V1: seq.V1, I1: seq.I1 } : null);
  const unbalance = seq?.unbalance ?? null;
  const belowThreshold = loadsBelowThreshold(solution);
  const transformer = readTransformer(solution);
  const sourceUnits = readSourceUnits(solution);
  const operatingPoint = judgeOperatingPoint(solution, phases, lineToLine, belowThreshold);
  const conventions = conventionsOf(board);
  const label = (term: string) => labelIn(conventions.phaseNames, term);
  const limits = conventions.voltageLimits;
  const feederResistance = board.hasNeutral ? { lines: (board.lineImpedances ?? board.phases.map(() => board.lineImpedance)).map((z) => z.re), neutral: board.neutralImpedance.re } : null;
  const warnings = boardWarnings({ belowThreshold, phases, neutral, unbalance, loads, lineRatingsA: board.phases.map((_, k) => lineRatingOf(board, k)), transformer, sourceUnits, limits, label, lineToLine, hasNeutral: board.hasNeutral, region: conventions.region, feederResistance, ...(board.feederUnequalLengths ? { feederLengths: board.feederUnequalLengths } : {}) });
  const voltageCheck = checkVoltages({ limits, phases, lineToLine, hasNeutral: board.hasNeutral, loads, label });
  // On a single-phase 2-wire board the neutral carries the line's current, which the line's breaker protects,
  // unless the neutral is smaller than the line: only then can it overheat with nothing tripping.
  const lineRatingA = lineRatingOf(board, 0);
  const singlePhaseNeutralGuarded = board.phases.length === 1 && (board.neutralRatingA === null || lineRatingA === null || board.neutralRatingA >= lineRatingA);
  const nominal = judgedNominalOf(board);
  const sourceEmf = enteredEmf(board);
  const cautions = !singlePhaseNeutralGuarded && warnings.some((w) => w.code.startsWith('neutral')) ? [NEUTRAL_CAUTION, GENERAL_CAUTION] : [GENERAL_CAUTION];
  return {
    board: {
      name: board.name,
      system: board.system,
      sequence: board.sequence,
      frequencyHz: board.frequencyHz,
      nominalLineToNeutralV: nominal.ln,
      nominalLineToLineV: nominal.ll,
      ...(board.systemNominal ? { sourceNominal: { lineToNeutralV: board.nominalLineToNeutralV, lineToLineV: board.nominalLineToLineV } } : {}),
      ...(sourceEmf ? { sourceEmf } : {}),
      neutralOpen: board.neutralOpen,
      ...(board.withoutNeutral ? { withoutNeutral: true as const } : {}),
      ...(hasIdealSource(board) ? { idealSource: true as const } : {}),
      ...(sourceModelOf(board) === 'transformer' ? { suppliedByTransformer: true as const } : {}),
    },
    conventions,
    solve: { iterations: solution.iterations, lastChangePercent: solution.lastChange * 100 },
    phases,
    lineToLine,
    neutral,
    loads,
    totals: powerReading(loadTotal),
    source: { kW: sourcePower.re / 1000, kvar: sourcePower.im / 1000 },
    losses: readLosses(solution),
    sequences: seq?.sequences ?? null,
    unbalance,
    powerFactor,
    voltageCheck,
    warnings,
    cautions,
    openNeutral: null,
    transformer,
    sourceUnits,
    incomer: readIncomer(solution, phases),
    operatingPoint,
  };
}
