/**
 * What-if: the neutral conductor between source and board is broken. Every
 * line-to-neutral load is then in series with the others through the floating
 * neutral bar; this reports what each one sees in the state the board reaches
 * (followed from the intact board, see followNeutralBreak.ts), beside the
 * all-impedance answer, any other solution of the same equations, and whether
 * the low-voltage rule of the load model decides the result.
 */
import { abs, sub, toPhasor, ZERO, type ComplexValue } from '../complex.js';
import { NumericalError } from '../errors.js';
import type { Board, BoardLoad, LoadBranch, PhaseId } from '../board/boardModel.js';
import { installationOf } from '../network/installationModel.js';
import { buildInstallationCircuit } from '../network/installationCircuit.js';
import { REFERENCE } from '../network/circuit.js';
import { solveNetwork, terminalVoltage, type NetworkSolution, type SolveOptions } from '../network/solveNetwork.js';
import { SOLVE_OPTION_KEYS } from '../network/solveOptions.js';
import { checkOptionKeys } from '../_internal/argumentChecks.js';
import { solveNetworkByNewton } from '../network/solveNetworkByNewton.js';
import { followNeutralBreak, withNeutralFault } from './followNeutralBreak.js';
import type { OpenNeutralLoadReading, OpenNeutralState, OpenNeutralStudy, OpenNeutralWithoutRule } from './boardResult.js';
import { OPEN_NEUTRAL_BAND } from './boardWarnings.js';
import { judgeVoltage } from '../board/conventions/voltageLimits.js';
import { regionWords } from '../board/conventions/regionWords.js';
import { conventionsOf } from '../board/conventions/boardConventions.js';
import { labellerOf } from '../board/conventions/phaseNames.js';

/** The cautions in the words of the board's region (see regionWords), following the figures (openNeutralCautions). */
const openNeutralCautionsOf = (board: Board, beyond: BeyondLineToLine | null) => openNeutralCautions(regionWords(conventionsOf(board).region, board.system), beyond);
import { OPEN_NEUTRAL_LIMITS, openNeutralCautions, openNeutralFindings, type BeyondLineToLine } from './openNeutralWording.js';
import { assertBoardModel } from '../board/modelGuards.js';
import { judgedBranchNominal, judgedNominalOf } from '../board/nominalVoltages.js';

/** "No low-voltage rule": constant power held down to 5 % of nominal, low enough that no state this study reports gets there in practice. */
const RULE_OFF_THRESHOLD = 0.05;

/** What one line-to-neutral branch sees across it. */
/** `nominalV`: the system nominal the branch is judged at (judgedBranchNominal). */
function loadReading(name: string, b: LoadBranch, voltage: ComplexValue, threshold: number, nominalV: number, board?: string): OpenNeutralLoadReading {
  const percent = (100 * abs(voltage)) / nominalV;
  const side = judgeVoltage(OPEN_NEUTRAL_BAND, percent);
  return {
    name: board === undefined ? name : `${name} (${board})`,
    ...(board === undefined ? {} : { board }),
    phase: (b.to === 'N' ? b.from : b.to) as PhaseId,
    voltage: abs(voltage),
    voltagePercent: percent,
    flag: side === 'within' ? 'ok' : side,
    belowLowVoltageRule: b.zip.z < 1 && percent < 100 * threshold,
  };
}

/**
 * The line-to-neutral circuits of the boards fed (directly or further) from this board of an
 * installation: its feeder's neutral is theirs too, so the break floats their bars with it. The
 * solution is of the whole installation (the broken neutral in this board's feeder), so their
 * voltages are read off the same node voltages.
 */
function fedBoardReadings(board: Board, solution: NetworkSolution, threshold: number): OpenNeutralLoadReading[] {
  const fed = fedBoards(board);
  if (!fed.length) return [];
  const { installation } = installationOf(board);
  const layout = buildInstallationCircuit(installation);
  const v = solution.nodeVoltages;
  const at = (node: number) => (node === REFERENCE ? ZERO : v[node]);
  const out: OpenNeutralLoadReading[] = [];
  for (const d of fed) {
    const sb = installation.subBoards[d - 1]!;
    let k = layout.branchOffset[d]!;
    for (const load of sb.loads)
      for (const b of load.branches) {
        const cb = layout.circuit.branches[k++]!;
        if (b.to !== 'N' && b.from !== 'N') continue;
        const from = at(cb.from);
        const to = at(cb.to);
        // Energised as the board's own circuits are (both ends live), so the two lists follow one rule.
        if (!from || !to) continue;
        out.push(loadReading(load.name, b, sub(from, to), threshold, judgedBranchNominal(board, b), sb.name));
      }
  }
  return out;
}

/** Indices (in the installation) of the boards fed directly or further from this board. */
function fedBoards(board: Board): number[] {
  if (!board.installation) return [];
  const { installation, boardIndex } = installationOf(board);
  const feeding = (d: number) => installation.subBoards[d - 1]!.fedFrom;
  const below = (d: number) => {
    for (let x = d; x !== 0; x = feeding(x)) if (feeding(x) === boardIndex) return true;
    return false;
  };
  return installation.subBoards.map((_, i) => i + 1).filter(below);
}

const hasNeutralLoads = (loads: Board['loads']) => loads.some((l) => l.branches.some((b) => (b.from === 'N' || b.to === 'N') && abs(b.sNominal) > 0));

function readState(board: Board, solution: NetworkSolution, threshold: number): OpenNeutralState {
  const loads: OpenNeutralLoadReading[] = [];
  board.loads.forEach((load, li) =>
    load.branches.forEach((b, bi) => {
      if (b.to !== 'N' && b.from !== 'N') return;
      const state = solution.branches[li]![bi]!;
      if (!state.energised) return;
      loads.push(loadReading(load.name, b, state.voltage, threshold, judgedBranchNominal(board, b)));
    }),
  );
  loads.push(...fedBoardReadings(board, solution, threshold));
  const bar = terminalVoltage(solution, 'N');
  const percents = loads.map((l) => l.voltagePercent);
  return {
    barVoltage: bar ? toPhasor(bar) : null,
    loads,
    highestPercent: Math.max(...percents),
    lowestPercent: Math.min(...percents),
  };
}

/** Largest node-voltage difference between two solutions of the same board, % of nominal. */
function distancePercent(a: NetworkSolution, b: NetworkSolution): number {
  let largest = 0;
  a.nodeVoltages.forEach((v, k) => {
    const w = b.nodeVoltages[k];
    if (v && w) largest = Math.max(largest, abs(sub(v, w)));
  });
  return (100 * largest) / judgedNominalOf(a.board).ln;
}

/** The highest line-to-line voltage between the board's lines in a solution, V. */
function highestLineToLine(board: Board, solution: NetworkSolution): number {
  const v = board.phases.map((p) => terminalVoltage(solution, p));
  let highest = 0;
  v.forEach((a, i) => v.slice(i + 1).forEach((b) => (highest = a && b ? Math.max(highest, abs(sub(a, b))) : highest)));
  return highest;
}

/**
 * The load seeing most above the board's line-to-line voltage, in the state reached or else in the
 * all-impedance model (both are printed); null where none does.
 */
function beyondLineToLine(board: Board, states: readonly { state: OpenNeutralState; solution: NetworkSolution; impedanceModelOnly: boolean }[], loads: readonly BoardLoad[]): BeyondLineToLine | null {
  const capacitive = loads.some((l) => l.branches.some((b) => (b.from === 'N' || b.to === 'N') && b.sNominal.im < 0));
  const phasesWord = board.system === 'split-phase' ? 'legs' : 'phases';
  for (const { state, solution, impedanceModelOnly } of states) {
    const lineToLineV = highestLineToLine(board, solution);
    const worst = state.loads.reduce<OpenNeutralLoadReading | null>((w, l) => (l.voltage > lineToLineV && (!w || l.voltage > w.voltage) ? l : w), null);
    if (worst) return { load: worst, lineToLineV, impedanceModelOnly, capacitive, phasesWord };
  }
  return null;
}

const asImpedance = (loads: readonly BoardLoad[]): BoardLoad[] => loads.map((l) => ({ ...l, branches: l.branches.map((b) => ({ ...b, zip: { z: 1, i: 0, p: 0 } })) }));

/**
 * Every load as a constant impedance: the board's own and, where it has a place in an installation, every
 * other board's too (the boards it feeds share its broken neutral, and a solve of the board is a solve of
 * the whole installation).
 */
const allImpedance = (board: Board): Board => {
  const own = { ...board, loads: asImpedance(board.loads) };
  const place = board.installation;
  if (!place) return own;
  const { installation } = place;
  return {
    ...own,
    installation: {
      ...place,
      installation: { ...installation, main: { ...installation.main, loads: asImpedance(installation.main.loads) }, subBoards: installation.subBoards.map((sb) => ({ ...sb, loads: asImpedance(sb.loads) })) },
    },
  };
};

/** Solves, or null when this board has no solution there (the study reports what it found). */
function trySolve<T>(solve: () => T): T | null {
  try {
    return solve();
  } catch (error) {
    if (error instanceof NumericalError) return null;
    throw error;
  }
}

/** Every distinct open-neutral solution Newton reaches from the given starts. */
function openStates(open: Board, starts: readonly (NetworkSolution | null)[], threshold: number): NetworkSolution[] {
  const found: NetworkSolution[] = [];
  for (const start of starts) {
    if (!start) continue;
    const out = solveNetworkByNewton(open, start.nodeVoltages, { lowVoltageThreshold: threshold, maxIterations: 80 });
    if (out.converged && found.every((s) => distancePercent(s, out.solution) > OPEN_NEUTRAL_LIMITS.sameStatePercent)) found.push(out.solution);
  }
  return found;
}

export function studyOpenNeutral(board: Board, options?: SolveOptions): OpenNeutralStudy {
  assertBoardModel(board);
  checkOptionKeys(options as unknown, 'options', SOLVE_OPTION_KEYS);
  const notApplicable = (note: string): OpenNeutralStudy => ({
    applicable: false,
    note,
    barVoltage: null,
    loads: [],
    highestPercent: null,
    lowestPercent: null,
    cautions: [],
    reachedFromIntact: false,
    collapseAtOhms: null,
    impedanceModel: null,
    otherStates: [],
    withoutLowVoltageRule: null,
    dependsOnLoadModel: false,
    multipleStates: false,
    lowVoltageRuleDecides: false,
    findings: [],
  });
  if (!board.hasNeutral) return notApplicable('a three-phase-3wire board has no neutral conductor to lose');
  if (board.system === 'single-phase') return notApplicable('on a single-phase 2-wire board a broken neutral simply de-energises every load');
  const fed = fedBoards(board);
  const subBoards = fed.length ? installationOf(board).installation.subBoards : [];
  const fedLoads = fed.flatMap((d) => subBoards[d - 1]!.loads);
  if (!hasNeutralLoads(board.loads) && !hasNeutralLoads(fedLoads))
    return notApplicable('no line-to-neutral loads on this board or the boards it feeds, so a broken neutral changes nothing');
  const threshold = options?.lowVoltageThreshold ?? 0.7;
  const open = withNeutralFault(board, null);
  let path;
  try {
    path = followNeutralBreak(board, { lowVoltageThreshold: threshold });
  } catch (error) {
    // The what-if failing must not hide the main result; say why instead.
    if (error instanceof NumericalError) return notApplicable(`the board could not be followed to a broken neutral: ${error.message}`);
    throw error;
  }
  const impedance = trySolve(() => solveNetwork(allImpedance(open)));
  const direct = trySolve(() => solveNetwork(open, options));
  const states = openStates(open, [path.reachedOpen ? path.state : null, impedance, direct, path.reachedOpen ? null : path.state], threshold);
  const reachedSolution = path.reachedOpen
    ? path.state
    : states.map((s) => ({ s, high: readState(board, s, threshold).highestPercent })).sort((a, b) => b.high - a.high)[0]?.s;
  if (!reachedSolution) return notApplicable('no solution of the board with a broken neutral was found: the loads cannot all be supplied in series');
  const reached = readState(board, reachedSolution, threshold);
  const others = states
    .filter((s) => distancePercent(s, reachedSolution) > OPEN_NEUTRAL_LIMITS.sameStatePercent)
    .map((s) => readState(board, s, threshold));
  const impedanceModel = impedance ? readState(board, impedance, threshold) : null;
  const beyond = beyondLineToLine(
    board,
    [{ state: reached, solution: reachedSolution, impedanceModelOnly: false }, ...(impedance && impedanceModel ? [{ state: impedanceModel, solution: impedance, impedanceModelOnly: true }] : [])],
    [...board.loads, ...fedLoads],
  );

  // Every line-to-neutral load on one line: with the neutral open they have no return path, so no
  // current flows through them whatever their model (a constant-power load's "collapse" is that).
  const phasesFed = new Set(reached.loads.map((l) => l.phase));
  const deadLine = phasesFed.size === 1 ? reached.loads[0]!.phase : null;
  const powerDependent = deadLine === null && [...board.loads, ...fedLoads].some((l) => l.branches.some((b) => b.zip.z < 1 && abs(b.sNominal) > 0));
  let withoutLowVoltageRule: OpenNeutralWithoutRule | null = null;
  let ruleDecides = false;
  if (powerDependent && reached.loads.some((l) => l.belowLowVoltageRule)) {
    const free = trySolve(() => followNeutralBreak(board, { lowVoltageThreshold: RULE_OFF_THRESHOLD }));
    if (free) {
      withoutLowVoltageRule = { reachedOpen: free.reachedOpen, collapseAtOhms: free.lostAtOhms, state: readState(board, free.state, RULE_OFF_THRESHOLD) };
      ruleDecides = !free.reachedOpen || distancePercent(free.state, reachedSolution) > OPEN_NEUTRAL_LIMITS.ruleAgreementPercent;
    } else ruleDecides = true;
  }
  const dependsOnLoadModel =
    impedanceModel !== null &&
    reached.loads.some((l, k) => Math.abs(l.voltagePercent - impedanceModel.loads[k]!.voltagePercent) > OPEN_NEUTRAL_LIMITS.modelDependencePercent);
  const findings = openNeutralFindings({
    reached,
    reachedFromIntact: path.reachedOpen,
    collapseAtOhms: path.lostAtOhms,
    impedanceModel,
    otherStates: others,
    withoutRule: withoutLowVoltageRule,
    lowVoltageRuleDecides: ruleDecides,
    dependsOnLoadModel,
    thresholdPercent: 100 * threshold,
    deadLine: deadLine === null ? null : labellerOf(conventionsOf(board).phaseNames)(deadLine),
  });
  return {
    applicable: true,
    note: null,
    ...reached,
    cautions: openNeutralCautionsOf(board, beyond),
    reachedFromIntact: path.reachedOpen,
    collapseAtOhms: path.lostAtOhms,
    impedanceModel,
    otherStates: others,
    withoutLowVoltageRule,
    dependsOnLoadModel,
    multipleStates: others.length > 0,
    lowVoltageRuleDecides: ruleDecides,
    findings,
  };
}
