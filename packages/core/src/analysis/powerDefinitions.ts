/**
 * Apparent power and power factor of a whole board by the definitions in
 * IEEE Std 1459-2010 (sinusoidal case): arithmetic, vector, effective
 * (Buchholz–Goodhue) and fundamental positive-sequence.
 */
import { abs, type ComplexValue } from '../complex.js';

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

const reading = (p: number, s: number): ApparentPowerReading => ({ kVA: s / 1000, pf: s === 0 ? null : p / s });

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
    positiveSequence = { ...reading(p1, s1), kW: p1 / 1000, kvar: q1 / 1000 };
    unbalancedKVA = Math.sqrt(Math.max(0, se * se - s1 * s1)) / 1000;
  }
  return { arithmetic: reading(p, sA), vector: reading(p, sV), effective, positiveSequence, unbalancedKVA };
}
