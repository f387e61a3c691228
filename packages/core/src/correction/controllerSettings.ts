/**
 * Settings of the automatic controller that switches a bank's steps.
 *
 * Response threshold C/k (methods notes §10, common practice): the reactive
 * current of the smallest step referred to the CT secondary,
 *   three-phase step  C/k = Q_step / (√3 · U_LL · k_CT)
 *   single-phase step C/k = Q_step / (U · k_CT)   (U across the step; derived)
 * with Q_step at the nominal voltage and k_CT = CT primary / secondary. The
 * setting is a share of it (0.6–0.7, from memory) so the controller does not hunt.
 */
import { CAPACITOR_DISCHARGE } from './capacitorDischarge.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import type { BankStep, ControllerSettings } from './correctionResult.js';
import type { ControllerSpec, Practice } from './correctionSpec.js';
import { argumentIssueError, checkListArgument, checkNumberArgument, checkObjectArgument } from '../_internal/argumentChecks.js';

/** IEC 61869-2 preferred CT primary ratings: 10, 12.5, 15, 20, 25, 30, 40, 50, 60, 75 A and their decimal multiples (from memory). */
const CT_SERIES = [10, 12.5, 15, 20, 25, 30, 40, 50, 60, 75];

/** The smallest standard CT primary at or above `amps`. */
export function standardCtPrimaryA(amps: number): number {
  // null read as 0 A (10 A) and NaN fell through every rating to NaN.
  if (!(amps >= 0 && Number.isFinite(amps))) checkNumberArgument(amps, 'amps', 'the current the CT must carry, A, a finite number, 0 or more', (x) => x >= 0);
  for (let decade = 1; decade <= 1e5; decade *= 10) for (const r of CT_SERIES) if (r * decade >= amps - 1e-9) return r * decade;
  return Math.ceil(amps);
}

/**
 * C/k of one step, A on the CT secondary.
 * @param kvarAtNominalV the step's output at the nominal voltage, kvar
 * @param kind three-phase (balanced over three branches) or single-phase (one branch)
 * @param voltageV U_LL for a three-phase step, the voltage across the step for a single-phase one
 */
export function responseThresholdA(kvarAtNominalV: number, kind: 'three-phase' | 'single-phase', voltageV: number, ctRatio: number): number {
  checkNumberArgument(kvarAtNominalV, 'kvarAtNominalV', "a step's output in kvar, a finite number above 0", (x) => x > 0);
  if (kind !== 'three-phase' && kind !== 'single-phase') throw argumentIssueError('kind', '"three-phase" or "single-phase"', kind);
  checkNumberArgument(voltageV, 'voltageV', 'a voltage in V, a finite number above 0', (x) => x > 0);
  checkNumberArgument(ctRatio, 'ctRatio', 'the CT ratio (primary A / secondary A), a finite number above 0', (x) => x > 0);
  const q = kvarAtNominalV * 1000;
  return kind === 'three-phase' ? q / (Math.sqrt(3) * voltageV * ctRatio) : q / (voltageV * ctRatio);
}

export interface CurrentTransformer {
  readonly primaryA: number;
  readonly secondaryA: number;
  /** True when trivar chose the primary (none given). */
  readonly chosen: boolean;
}

/**
 * The CT the controller reads: as given, or the next standard primary at or
 * above 1.25 × the largest line current (common practice, no source).
 */
export function resolveCurrentTransformer(spec: ControllerSpec, lineCurrentA: number): CurrentTransformer {
  return {
    primaryA: spec.ctPrimaryA ?? standardCtPrimaryA(CORRECTION_DEFAULTS.ctHeadroom * lineCurrentA),
    secondaryA: spec.ctSecondaryA ?? CORRECTION_DEFAULTS.ctSecondaryA,
    chosen: spec.ctPrimaryA === undefined,
  };
}

export interface ControllerInputs {
  readonly spec: ControllerSpec;
  readonly practice: Practice;
  readonly ct: CurrentTransformer;
  readonly steps: readonly BankStep[];
  readonly band: { readonly minPf: number; readonly maxPf: number | null; readonly leadingAllowed: boolean };
  /** True when a step serves one line only (trim steps, or separate lines of a split-phase board). */
  readonly perLine: boolean;
}

/** Controller settings for the switched steps (C/k from the step with the smallest threshold), or null when the bank has none. */
export function controllerSettings(input: ControllerInputs): ControllerSettings | null {
  checkObjectArgument(input, 'input', "the controller's inputs { spec, practice, ct, steps, band }", ['spec', 'practice', 'ct', 'steps', 'band']);
  checkListArgument(input.steps, 'input.steps', "the bank's steps (a selection's steps)", (x) => typeof x === 'object' && x !== null);
  const switched = input.steps.filter((s) => s.output !== null);
  if (!switched.length) return null;
  const { primaryA, secondaryA, chosen } = input.ct;
  const smallest = switched.reduce((a, b) => (b.responseThresholdA < a.responseThresholdA ? b : a));
  const threshold = smallest.responseThresholdA;
  const discharge = CORRECTION_DEFAULTS.dischargeTimeS[input.practice];
  return {
    outputs: input.spec.outputs ?? CORRECTION_DEFAULTS.controllerOutputs,
    outputsUsed: switched.length,
    measurement: input.perLine ? 'every-line' : 'one-line',
    ctPrimaryA: primaryA,
    ctSecondaryA: secondaryA,
    ctRatio: primaryA / secondaryA,
    ctChosen: chosen,
    smallestStepKvar: smallest.kvarAtNominalV,
    responseThresholdA: threshold,
    responseSettingA: CORRECTION_DEFAULTS.ckSettingFraction * threshold,
    settingFraction: CORRECTION_DEFAULTS.ckSettingFraction,
    targetBand: input.band,
    switchingDelayS: input.spec.switchingDelayS ?? CORRECTION_DEFAULTS.switchingDelayS,
    dischargeTimeS: discharge,
    dischargeRule: CAPACITOR_DISCHARGE[input.practice].rule,
    reconnectionDelayS: Math.max(discharge, input.spec.switchingDelayS ?? CORRECTION_DEFAULTS.switchingDelayS),
  };
}
