/**
 * NetworkSolution → BoardResult: per-phase and per-load readings, symmetrical
 * components, unbalance, power definitions, losses, warnings.
 */
import {
  abs,
  absSquared,
  add,
  conj,
  mul,
  scale,
  sub,
  sum,
  toPhasor,
  ZERO,
  type ComplexValue,
} from '../complex.js';
import { isThreePhase } from '../board/systemTopology.js';
import type { LoadBranch, PhaseId } from '../board/boardModel.js';
import { terminalVoltage, type BranchState, type NetworkSolution } from '../network/solveNetwork.js';
import { sequenceComponents } from './symmetricalComponents.js';
import { deviationFromAveragePercent } from './unbalanceIndices.js';
import { boardPowerDefinitions } from './powerDefinitions.js';
import { boardWarnings, GENERAL_CAUTION, NEUTRAL_CAUTION } from './boardWarnings.js';
import type {
  BoardResult,
  LineToLineReading,
  LoadReading,
  NeutralReading,
  PhaseReading,
  PowerReading,
  UnbalanceReading,
} from './boardResult.js';

/** Power reading from complex power in VA. Q within 1e-9 of S counts as unity. */
export function powerReading(s: ComplexValue): PowerReading {
  const kVA = abs(s) / 1000;
  const kvar = s.im / 1000;
  const sense = Math.abs(s.im) <= 1e-9 * Math.max(abs(s), 1e-30) ? 'unity' : s.im > 0 ? 'lagging' : 'leading';
  return { kW: s.re / 1000, kvar, kVA, pf: kVA === 0 ? 1 : Math.abs(s.re) / 1000 / kVA, sense };
}

const PAIRS: Record<string, readonly [PhaseId, PhaseId][]> = {
  'three-phase-4wire': [['A', 'B'], ['B', 'C'], ['C', 'A']],
  'three-phase-3wire': [['A', 'B'], ['B', 'C'], ['C', 'A']],
  'split-phase': [['A', 'B']],
  'single-phase': [],
};

/** Current a load draws from one phase terminal: Σ of its branch currents leaving that terminal. */
function lineCurrentOfLoad(branches: readonly LoadBranch[], states: readonly BranchState[], phase: PhaseId): ComplexValue {
  let total = ZERO;
  branches.forEach((b, k) => {
    if (b.from === phase) total = add(total, states[k]!.current);
    if (b.to === phase) total = sub(total, states[k]!.current);
  });
  return total;
}

export function analyseSolution(solution: NetworkSolution): BoardResult {
  const { board } = solution;
  const ln = board.nominalLineToNeutralV;
  const threePhase = isThreePhase(board.system);
  const busVoltages = board.phases.map((p) => terminalVoltage(solution, p) ?? ZERO);
  const lineCurrents = solution.lineCurrents;
  // Phase voltages are what line-to-neutral loads see: to the board neutral bar on a
  // 4-wire board, to the virtual neutral (centroid of the line voltages) on a 3-wire one.
  const neutralBar = board.hasNeutral ? terminalVoltage(solution, 'N') : null;
  const reference = board.hasNeutral ? (neutralBar ?? ZERO) : scale(sum(busVoltages), 1 / busVoltages.length);
  const phaseVoltages = busVoltages.map((v) => sub(v, reference));
  const phases: PhaseReading[] = board.phases.map((phase, k) => {
    const v = phaseVoltages[k]!;
    const i = lineCurrents[k]!;
    return {
      phase,
      voltage: toPhasor(v),
      voltagePercent: (100 * abs(v)) / ln,
      current: toPhasor(i),
      ...powerReading(mul(v, conj(i))),
      loadingPercent: board.lineRatingA ? (100 * abs(i)) / board.lineRatingA : null,
      voltageDropPercent: (100 * (abs(board.emf[k]!) - abs(busVoltages[k]!))) / ln,
    };
  });
  const lineToLine: LineToLineReading[] = PAIRS[board.system]!.map(([p, q]) => {
    const v = sub(busVoltages[board.phases.indexOf(p)]!, busVoltages[board.phases.indexOf(q)]!);
    return { pair: `${p}-${q}`, voltage: toPhasor(v), voltagePercent: (100 * abs(v)) / (board.nominalLineToLineV ?? ln) };
  });
  const largestLine = Math.max(...lineCurrents.map(abs));
  const neutral: NeutralReading | null =
    solution.neutralCurrent === null
      ? null
      : {
          current: toPhasor(solution.neutralCurrent),
          barVoltage: neutralBar ? toPhasor(neutralBar) : null,
          ratingA: board.neutralRatingA,
          loadingPercent: board.neutralRatingA ? (100 * abs(solution.neutralCurrent)) / board.neutralRatingA : null,
          percentOfLargestLine: largestLine === 0 ? 0 : (100 * abs(solution.neutralCurrent)) / largestLine,
        };

  const loads: LoadReading[] = board.loads.map((load, li) => {
    const states = solution.branches[li]!;
    const branches = load.branches.map((b, bi) => {
      const st = states[bi]!;
      const s = mul(st.voltage, conj(st.current));
      return {
        from: b.from.startsWith('star:') ? 'star' : b.from,
        to: b.to.startsWith('star:') ? 'star' : b.to,
        voltage: toPhasor(st.voltage),
        voltagePercent: (100 * abs(st.voltage)) / b.vNominal,
        current: toPhasor(st.current),
        kW: s.re / 1000,
        kvar: s.im / 1000,
      };
    });
    const total = sum(load.branches.map((_, bi) => mul(states[bi]!.voltage, conj(states[bi]!.current))));
    const star = load.branches.find((b) => b.to.startsWith('star:'))?.to;
    const starV = star ? terminalVoltage(solution, star) : null;
    const busCentroid = scale(sum(busVoltages), 1 / busVoltages.length);
    return {
      name: load.name,
      connection: load.connection,
      model: load.model,
      origin: load.origin,
      branches,
      ...powerReading(total),
      currentA: Math.max(...board.phases.map((phase) => abs(lineCurrentOfLoad(load.branches, states, phase)))),
      starPointShift: starV ? toPhasor(sub(starV, busCentroid)) : null,
      energised: states.some((s) => s.energised),
    };
  });
  const loadTotal = sum(board.loads.flatMap((_, li) => solution.branches[li]!.map((s) => mul(s.voltage, conj(s.current)))));

  // Losses: line conductors carry the line currents; the neutral conductor its current.
  const lineSq = lineCurrents.reduce((s, i) => s + absSquared(i), 0);
  const neutralSq = solution.neutralCurrent ? absSquared(solution.neutralCurrent) : 0;
  const sourceLoss = scale(board.sourceImpedance, lineSq);
  const feederLoss = scale(board.lineImpedance, lineSq);
  const neutralLoss = board.neutralOpen ? ZERO : scale(board.neutralImpedance, neutralSq);
  const lossTotal = add(add(sourceLoss, feederLoss), neutralLoss);
  const sourcePower = sum(board.emf.map((e, k) => mul(e, conj(lineCurrents[k]!))));

  let sequences: BoardResult['sequences'] = null;
  let unbalance: UnbalanceReading | null = null;
  let seqV1: ComplexValue | null = null;
  let seqI1: ComplexValue | null = null;
  if (threePhase) {
    const vs = sequenceComponents(phaseVoltages as [ComplexValue, ComplexValue, ComplexValue], board.sequence);
    const is = sequenceComponents(lineCurrents as [ComplexValue, ComplexValue, ComplexValue], board.sequence);
    seqV1 = vs.positive;
    seqI1 = is.positive;
    sequences = {
      voltage: { zero: toPhasor(vs.zero), positive: toPhasor(vs.positive), negative: toPhasor(vs.negative) },
      current: { zero: toPhasor(is.zero), positive: toPhasor(is.positive), negative: toPhasor(is.negative) },
    };
    const ratio = (x: ComplexValue, base: ComplexValue) => (abs(base) === 0 ? 0 : (100 * abs(x)) / abs(base));
    unbalance = {
      voltageFactorPercent: ratio(vs.negative, vs.positive),
      zeroSequenceVoltagePercent: ratio(vs.zero, vs.positive),
      lineVoltageRatePercent: deviationFromAveragePercent(lineToLine.map((l) => l.voltage.magnitude)),
      phaseVoltageRatePercent: deviationFromAveragePercent(phases.map((p) => p.voltage.magnitude)),
      currentNegativePercent: ratio(is.negative, is.positive),
      currentZeroPercent: ratio(is.zero, is.positive),
      currentDeviationPercent: deviationFromAveragePercent(lineCurrents.map(abs)),
    };
  }
  const powerFactor = boardPowerDefinitions({
    phasePowers: phases.map((p) => ({ re: p.kW * 1000, im: p.kvar * 1000 })),
    phaseVoltages: phases.map((p) => p.voltage.magnitude),
    phaseCurrents: phases.map((p) => p.current.magnitude),
    lineToLine: lineToLine.map((l) => l.voltage.magnitude),
    neutralCurrent: solution.neutralCurrent ? abs(solution.neutralCurrent) : null,
    threePhase,
    sequence: seqV1 && seqI1 ? { V1: seqV1, I1: seqI1 } : null,
  });
  const belowThreshold = board.loads.flatMap((load, li) => {
    const pu = Math.min(
      ...load.branches.map((b, bi) => (b.zip.z === 1 || !solution.branches[li]![bi]!.energised ? Infinity : abs(solution.branches[li]![bi]!.voltage) / b.vNominal)),
    );
    return pu < solution.lowVoltageThreshold ? [{ name: load.name, pu, threshold: solution.lowVoltageThreshold }] : [];
  });
  const warnings = boardWarnings({ belowThreshold, phases, neutral, unbalance, loads, lineRatingA: board.lineRatingA });
  const cautions = [GENERAL_CAUTION];
  if (warnings.some((w) => w.code.startsWith('neutral'))) cautions.unshift(NEUTRAL_CAUTION);
  return {
    board: {
      name: board.name,
      system: board.system,
      sequence: board.sequence,
      frequencyHz: board.frequencyHz,
      nominalLineToNeutralV: ln,
      nominalLineToLineV: board.nominalLineToLineV,
      neutralOpen: board.neutralOpen,
    },
    solve: { iterations: solution.iterations, lastChangePercent: solution.lastChange * 100 },
    phases,
    lineToLine,
    neutral,
    loads,
    totals: powerReading(loadTotal),
    source: { kW: sourcePower.re / 1000, kvar: sourcePower.im / 1000 },
    losses: {
      sourceKW: sourceLoss.re / 1000,
      lineFeederKW: feederLoss.re / 1000,
      neutralKW: neutralLoss.re / 1000,
      totalKW: lossTotal.re / 1000,
      totalKvar: lossTotal.im / 1000,
    },
    sequences,
    unbalance,
    powerFactor,
    warnings,
    cautions,
    openNeutral: null,
  };
}
