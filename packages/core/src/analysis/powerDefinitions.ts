/**
 * Apparent power and power factor of a whole board by the definitions in
 * IEEE Std 1459-2010 (sinusoidal case): arithmetic, vector, effective
 * (Buchholz–Goodhue) and fundamental positive-sequence.
 */
import { abs, type ComplexValue } from '../complex.js';
import { powerParts } from './powerReading.js';
import { checkObjectArgument } from '../_internal/argumentChecks.js';

export interface ApparentPowerReading {
  readonly kVA: number;
  /** P / S, signed like P (negative when the board exports); null when no power flows (S = 0): a PF of nothing is not defined. */
  readonly pf: number | null;
}

export interface BoardPowerDefinitions {
  /** S_A = Σ |V_x|·|I_x| with line-to-neutral (or virtual-neutral) voltages. */
  readonly arithmetic: ApparentPowerReading;
  /** S_V = |Σ S_x|. */
  readonly vector: ApparentPowerReading;
  /** Se = 3·Ve·Ie (IEEE 1459 effective apparent power); null where it is not defined. */
  readonly effective: (ApparentPowerReading & { readonly Ve: number; readonly Ie: number }) | null;
  /** S1+ = 3·|V1|·|I1|, PF1+ = P1+/S1+ ; null on non-three-phase boards. */
  readonly positiveSequence: (ApparentPowerReading & { readonly kW: number; readonly kvar: number }) | null;
  /** Fundamental unbalanced power S_U1 = √(Se² − S1+²), kVA; null where not defined. */
  readonly unbalancedKVA: number | null;
}

/**
 * A power factor within this of ±1 is ±1: P/S of a board at unity comes out 1 ± a few 1e-16 (one
 * in five purely resistive boards read above 1), and an angle of 1.4 µrad is no measurement.
 */
const UNITY_RESOLUTION = 1e-12;

/** P/S held to [−1, 1], round-off next to ±1 read as ±1. */
export function cleanPowerFactor(ratio: number): number {
  return Math.abs(ratio) >= 1 - UNITY_RESOLUTION ? Math.sign(ratio) : ratio;
}

/**
 * S_U1 below this fraction of Se is round-off: √(Se² − S1+²) of two equal figures is about
 * √(4ε)·Se ≈ 3e-8·Se from their last bits alone (ε = 2.2e-16), 9e-7 kVA on a balanced 30 kW
 * board; 1e-6 is some 30 times that and far below any meter (common practice, no source).
 */
const UNBALANCED_POWER_RESOLUTION = 1e-6;

const reading = (p: number, s: number): ApparentPowerReading => ({ kVA: s / 1000, pf: s === 0 ? null : cleanPowerFactor(p / s) });

/** Ve and Ie for a three-phase board (IEEE 1459; ρ = ξ = 1 on four wires). */
export function effectiveQuantities(
  lineToNeutral: readonly number[],
  lineToLine: readonly number[],
  lineCurrents: readonly number[],
  neutralCurrent: number | null,
): { Ve: number; Ie: number } {
  const sq = (xs: readonly number[]) => xs.reduce((s, x) => s + x * x, 0);
  if (neutralCurrent === null) return { Ve: Math.sqrt(sq(lineToLine) / 9), Ie: Math.sqrt(sq(lineCurrents) / 3) };
  return {
    Ve: Math.sqrt((3 * sq(lineToNeutral) + sq(lineToLine)) / 18),
    Ie: Math.sqrt((sq(lineCurrents) + neutralCurrent ** 2) / 3),
  };
}

/** S1+ = 3·V1·conj(I1): P1+ and Q1+ in the load convention, W and var. */
export function positiveSequencePower(V1: ComplexValue, I1: ComplexValue): { p1: number; q1: number } {
  return { p1: 3 * (V1.re * I1.re + V1.im * I1.im), q1: 3 * (V1.im * I1.re - V1.re * I1.im) };
}

export function boardPowerDefinitions(input: {
  readonly phasePowers: readonly ComplexValue[];
  readonly phaseVoltages: readonly number[];
  readonly phaseCurrents: readonly number[];
  readonly lineToLine: readonly number[];
  readonly neutralCurrent: number | null;
  readonly threePhase: boolean;
  readonly sequence: { V1: ComplexValue; I1: ComplexValue } | null;
}): BoardPowerDefinitions {
  checkObjectArgument(input, 'input', 'the phase powers, voltages and currents of a solved board', ['phasePowers', 'phaseVoltages', 'phaseCurrents', 'lineToLine']);
  const p = input.phasePowers.reduce((s, x) => s + x.re, 0);
  const q = input.phasePowers.reduce((s, x) => s + x.im, 0);
  const sA = input.phaseVoltages.reduce((s, v, k) => s + v * input.phaseCurrents[k]!, 0);
  const sV = Math.hypot(p, q);
  let effective: BoardPowerDefinitions['effective'] = null;
  let positiveSequence: BoardPowerDefinitions['positiveSequence'] = null;
  let unbalancedKVA: number | null = null;
  if (input.threePhase && input.sequence) {
    const { Ve, Ie } = effectiveQuantities(input.phaseVoltages, input.lineToLine, input.phaseCurrents, input.neutralCurrent);
    const se = 3 * Ve * Ie;
    effective = { ...reading(p, se), Ve, Ie };
    const { V1, I1 } = input.sequence;
    const s1 = 3 * abs(V1) * abs(I1);
    const { p1, q1 } = positiveSequencePower(V1, I1);
    // Q1+ of a board at unity is ±1e-13 kvar of round-off, its sign changing: read as the phases' are.
    const { kW, kvar } = powerParts({ re: p1, im: q1 });
    positiveSequence = { ...reading(p1, s1), kW, kvar };
    const su1 = Math.sqrt(Math.max(0, se * se - s1 * s1));
    unbalancedKVA = su1 <= UNBALANCED_POWER_RESOLUTION * se ? 0 : su1 / 1000;
  }
  return { arithmetic: reading(p, sA), vector: reading(p, sV), effective, positiveSequence, unbalancedKVA };
}
