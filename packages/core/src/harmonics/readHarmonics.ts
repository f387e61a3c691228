/**
 * Per-order solutions → line, neutral and voltage readings: rms, THD, each
 * order, true and displacement power factor.
 */
import { abs, absSquared, arg, conj, mul, radToDeg, scale, sub, sum, ZERO, type ComplexValue } from '../complex.js';
import type { Board, PhaseId } from '../board/boardModel.js';
import type { NetworkSolution } from '../network/solveNetwork.js';
import { terminalVoltage } from '../network/solveNetwork.js';
import { currentNoiseFloor } from '../analysis/noiseFloor.js';
import type { DistortionReading, HarmonicLineReading, OrderReading } from './harmonicsResult.js';
import { powerReading } from '../analysis/powerReading.js';

/** A solved order: h and its solution (h = 1 is the fundamental). */
export interface OrderSolution {
  readonly order: number;
  readonly solution: NetworkSolution;
}

/** Share of a quantity's rms below which its fundamental is round-off of a cancellation, not a value. */
const ROUND_OFF = 1e-9;

/** Reads a quantity, given per order, into rms/THD/orders. `values[0]` is the fundamental. */
export function distortionOf(values: readonly { order: number; value: ComplexValue }[]): DistortionReading {
  const fundamental = abs(values.find((v) => v.order === 1)?.value ?? ZERO);
  const harmonics = values.filter((v) => v.order !== 1);
  const rms = Math.sqrt(values.reduce((s, v) => s + absSquared(v.value), 0));
  const distortion = Math.sqrt(harmonics.reduce((s, v) => s + absSquared(v.value), 0));
  // A fundamental at round-off beside the harmonics (a neutral whose fundamentals cancel, carrying only
  // triplens) gives no percentage: dividing by it would show noise as 10^17 %.
  const defined = fundamental > ROUND_OFF * rms;
  const orders = harmonics.map(
    (v): OrderReading => ({
      order: v.order,
      magnitude: abs(v.value),
      percentOfFundamental: defined ? (100 * abs(v.value)) / fundamental : null,
      angleDeg: radToDeg(arg(v.value)),
    }),
  );
  return { rms, fundamental, thdPercent: defined ? (100 * distortion) / fundamental : null, orders };
}

/** Voltage of each phase bus to the neutral bar, or to the centroid of the bus voltages on a 3-wire board. */
export function phaseVoltages(solution: NetworkSolution): ComplexValue[] {
  const board = solution.board;
  const bus = board.phases.map((p) => terminalVoltage(solution, p) ?? ZERO);
  const reference = board.hasNeutral ? (terminalVoltage(solution, 'N') ?? ZERO) : scale(sum(bus), 1 / bus.length);
  return bus.map((v) => sub(v, reference));
}

export const LINE_PAIRS: readonly (readonly [PhaseId, PhaseId])[] = [
  ['A', 'B'],
  ['B', 'C'],
  ['C', 'A'],
];

/** The line-to-line pairs a board has. */
export function linePairs(board: Board): (readonly [PhaseId, PhaseId])[] {
  if (board.phases.length === 3) return [...LINE_PAIRS];
  if (board.phases.length === 2) return [['A', 'B']];
  return [];
}

export function readLines(orders: readonly OrderSolution[]): HarmonicLineReading[] {
  const board = orders[0]!.solution.board;
  // Round-off is not data (noiseFloor.ts): a line carrying nothing read 4e-15 A and a "true PF" of -0.050.
  // The fundamental's floor (the largest currents of the study) serves every order.
  const floor = currentNoiseFloor(orders.find((o) => o.order === 1)?.solution ?? orders[0]!.solution);
  const clean = (i: ComplexValue) => (abs(i) < floor ? ZERO : i);
  const voltages = orders.map((o) => ({ order: o.order, v: phaseVoltages(o.solution), i: o.solution.lineCurrents.map(clean) }));
  return board.phases.map((phase, k) => {
    const current = distortionOf(voltages.map((o) => ({ order: o.order, value: o.i[k]! })));
    const voltage = distortionOf(voltages.map((o) => ({ order: o.order, value: o.v[k]! })));
    const watts = voltages.reduce((s, o) => s + mul(o.v[k]!, conj(o.i[k]!)).re, 0);
    const apparent = voltage.rms * current.rms;
    const v1 = voltages.find((o) => o.order === 1)!;
    const s1 = mul(v1.v[k]!, conj(v1.i[k]!));
    // The fundamental's P and Q, a part within round-off of S read as 0 (powerReading.ts): the sense of the displacement PF.
    const fundamental = powerReading(s1);
    return {
      phase,
      current,
      voltage,
      kW: watts / 1000,
      truePf: apparent > 0 ? watts / apparent : null,
      displacementPf: abs(s1) > 0 ? s1.re / abs(s1) : null,
      displacementSense: fundamental.sense,
      fundamentalKW: fundamental.kW,
      fundamentalKvar: fundamental.kvar,
    };
  });
}

export function readLineToLine(orders: readonly OrderSolution[]): { pair: string; voltage: DistortionReading }[] {
  const board = orders[0]!.solution.board;
  return linePairs(board).map(([p, q]) => ({
    pair: `${p}-${q}`,
    voltage: distortionOf(orders.map((o) => ({ order: o.order, value: sub(terminalVoltage(o.solution, p) ?? ZERO, terminalVoltage(o.solution, q) ?? ZERO) }))),
  }));
}

export function readNeutral(orders: readonly OrderSolution[]): DistortionReading | null {
  if (!orders[0]!.solution.board.hasNeutral) return null;
  const floor = currentNoiseFloor(orders.find((o) => o.order === 1)?.solution ?? orders[0]!.solution);
  return distortionOf(orders.map((o) => ({ order: o.order, value: o.solution.neutralCurrent && abs(o.solution.neutralCurrent) >= floor ? o.solution.neutralCurrent : ZERO })));
}
