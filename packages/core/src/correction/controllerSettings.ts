/**
 * Settings of the automatic controller that switches a bank's steps.
 *
 * Response threshold C/k (methods notes §10, common practice): the reactive
 * current of the smallest step referred to the CT secondary,
 *   three-phase step  C/k = Q_step / (√3 · U_LL · k_CT)
 *   single-phase step C/k = Q_step / (U · k_CT)   (U across the step; derived)
 *   line-pair step    C/k = (√3/2) · Q_step / (U_LL · k_CT)   (derived below)
 * with Q_step at the nominal voltage and k_CT = CT primary / secondary. The
 * setting is a share of it (0.6–0.7, from memory) so the controller does not hunt.
 *
 * The single-phase form is exact for a step to the neutral (its current is in
 * quadrature with that line's voltage) and for a split-phase L1-L2 step (V_1N and
 * V_2N lie along V_12, so the current is in quadrature with each). A step across two
 * lines of a three-phase board is not (a line-pair step): with V_AN = V∠0°, V_AB
 * = √3·V∠30°, and the branch current I = jωC·V_AB lies at 120°. Line A carries +I:
 * 120° from V_AN, a quadrature part |I|·sin 120° = (√3/2)·|I| (and −|I|/2 in phase).
 * Line B carries −I at −60°, and V_BN is at −120°: 60° apart, quadrature part
 * |I|·sin 60° = (√3/2)·|I| (and +|I|/2 in phase). A controller that measures each
 * line's current against that line's voltage to the neutral (the every-line
 * measurement such steps need; a 3-wire board's virtual neutral alike) sees a
 * step's switching as (√3/2)·Q/U_LL of reactive current in each of its two lines,
 * so that is the step's C/k there.
 */
import { CAPACITOR_DISCHARGE } from './capacitorDischarge.js';
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import type { BankSelection, BankStep, ControllerSettings, CorrectionWarning, CtBasis, LineComparison, StepStateCurrent } from './correctionResult.js';
import type { ControllerSpec, Practice } from './correctionSpec.js';
import { ctCurrentWords, ctPlaceWords, ctRatingWords, warningText } from './correctionWording.js';
import { leastSwitchedStep, stepsBelowLeast } from './leastSwitchedStep.js';
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
 * @param kind three-phase (balanced over three branches), single-phase (one branch to the neutral, or
 *   across a split-phase board's two lines) or line-pair (one branch across two lines of a three-phase
 *   board, read per line against the line's voltage to the neutral: see the top of this file)
 * @param voltageV U_LL for a three-phase or line-pair step, the voltage across the step for a single-phase one
 */
export function responseThresholdA(kvarAtNominalV: number, kind: StepThresholdKind, voltageV: number, ctRatio: number): number {
  checkNumberArgument(kvarAtNominalV, 'kvarAtNominalV', "a step's output in kvar, a finite number above 0", (x) => x > 0);
  if (kind !== 'three-phase' && kind !== 'single-phase' && kind !== 'line-pair') throw argumentIssueError('kind', '"three-phase", "single-phase" or "line-pair"', kind);
  checkNumberArgument(voltageV, 'voltageV', 'a voltage in V, a finite number above 0', (x) => x > 0);
  checkNumberArgument(ctRatio, 'ctRatio', 'the CT ratio (primary A / secondary A), a finite number above 0', (x) => x > 0);
  const q = kvarAtNominalV * 1000;
  if (kind === 'three-phase') return q / (Math.sqrt(3) * voltageV * ctRatio);
  // The branch current's part in quadrature with each of its lines' voltages to the neutral: sin 60° = sin 120° = √3/2.
  if (kind === 'line-pair') return (Math.sqrt(3) / 2) * (q / (voltageV * ctRatio));
  return q / (voltageV * ctRatio);
}

/** How a step's C/k is read (see responseThresholdA). */
export type StepThresholdKind = 'three-phase' | 'single-phase' | 'line-pair';

export interface CurrentTransformer {
  readonly primaryA: number;
  readonly secondaryA: number;
  /** True when trivar chose the primary (none given). */
  readonly chosen: boolean;
}

/**
 * Where a controller's CT reads and the line currents it must carry there: before the equipment, with
 * every step in, and in the worst state the switched steps can sit in. The two ends alone do not bound
 * the rest: part of the equipment stays in while the steps switch (a compensator's reactors, a bank's
 * fixed part), and steps on different branches switch apart, so the states are the corners of a box and
 * not the points of one segment; switchedStepStates.ts finds the worst corner and re-solves it.
 */
export interface CtReading {
  readonly place: CtBasis['place'];
  readonly point: string | null;
  readonly lines: readonly Pick<LineComparison, 'currentA'>[];
  readonly afterFrom: 'as-built' | 'as-sized';
  /** The worst state of the switched steps other than every step in; null or absent where there is none. */
  readonly stepState?: StepStateCurrent | null;
  /**
   * The readings at each capacitance tolerance end, where the build was solved there: the CT is then sized on
   * the end with the larger current (its after and worst step state; `lines`' after and `stepState` are at nominal
   * and stand aside).
   */
  readonly toleranceEnds?: { readonly low: CtEndReading; readonly high: CtEndReading } | null;
}

/** Where the CT reads, at one capacitance tolerance end. */
export interface CtEndReading {
  readonly capacitanceFactor: number;
  /** The largest line current there with every step in, A. */
  readonly afterA: number;
  /** The worst state of the switched steps at this end; null where there is none. */
  readonly stepState: StepStateCurrent | null;
}

/** The CT's basis: where it reads and the largest of the before, after and worst step-state currents there, or a current the caller gave. */
export function ctBasisOf(reading: CtReading | { readonly givenA: number }): CtBasis {
  if ('givenA' in reading)
    return withWords({ place: 'board', point: null, largestLineCurrentA: null, afterFrom: null, stepState: null, capacitance: null, sizedOn: 'given', currentA: reading.givenA });
  const before = Math.max(0, ...reading.lines.map((l) => l.currentA.before));
  const nominalAfter = Math.max(0, ...reading.lines.map((l) => l.currentA.after));
  // At the tolerance end that draws more where the CT reads (the high end is not always it).
  const ends = reading.toleranceEnds ?? null;
  const worstAt = (e: CtEndReading) => Math.max(e.afterA, e.stepState?.currentA ?? 0);
  const end = ends === null ? null : worstAt(ends.high) >= worstAt(ends.low) ? ('high' as const) : ('low' as const);
  const used = ends === null || end === null ? null : ends[end];
  const after = used ? used.afterA : nominalAfter;
  const stepState = used ? used.stepState : (reading.stepState ?? null);
  const sizedOn = stepState && stepState.currentA > Math.max(before, after) ? 'step-state' : after > before ? 'after' : 'before';
  return withWords({
    place: reading.place,
    point: reading.point,
    largestLineCurrentA: { before, after: nominalAfter },
    afterFrom: reading.afterFrom,
    stepState,
    capacitance:
      ends && end && used
        ? {
            end,
            capacitanceFactor: used.capacitanceFactor,
            afterA: { low: ends.low.afterA, high: ends.high.afterA },
            stepStateA: ends.low.stepState || ends.high.stepState ? { low: ends.low.stepState?.currentA ?? ends.low.afterA, high: ends.high.stepState?.currentA ?? ends.high.afterA } : null,
          }
        : null,
    sizedOn,
    currentA: Math.max(before, after, stepState?.currentA ?? 0),
  });
}

const withWords = (b: Omit<CtBasis, 'placeWords' | 'currentWords'>): CtBasis => ({ ...b, placeWords: ctPlaceWords(b.place, b.point), currentWords: ctCurrentWords(b) });

/**
 * The CT the controller reads: as given, or the next standard primary at or
 * above 1.25 × the largest line current where it reads (common practice, no source).
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
  /** Where the CT reads and the current it is chosen on (ctBasisOf). */
  readonly ctBasis: CtBasis;
}

/** Controller settings for the switched steps (C/k from the step with the smallest threshold), or null when the bank has none. */
export function controllerSettings(input: ControllerInputs): ControllerSettings | null {
  checkObjectArgument(input, 'input', "the controller's inputs { spec, practice, ct, steps, band, ctBasis }", ['spec', 'practice', 'ct', 'steps', 'band', 'ctBasis']);
  checkListArgument(input.steps, 'input.steps', "the bank's steps (a selection's steps)", (x) => typeof x === 'object' && x !== null);
  const switched = input.steps.filter((s) => s.output !== null);
  if (!switched.length) return null;
  const { primaryA, secondaryA, chosen } = input.ct;
  const smallest = switched.reduce((a, b) => (b.responseThresholdA < a.responseThresholdA ? b : a));
  const threshold = smallest.responseThresholdA;
  const discharge = CORRECTION_DEFAULTS.dischargeTimeS[input.practice];
  // A CT given below the current it must carry saturates: the CT it needs, and C/k on it (C/k ∝ primary⁻¹ at the same secondary).
  const neededA = !chosen && primaryA < input.ctBasis.currentA ? standardCtPrimaryA(CORRECTION_DEFAULTS.ctHeadroom * input.ctBasis.currentA) : null;
  const ctNeeded =
    neededA === null
      ? null
      : { primaryA: neededA, responseThresholdA: (threshold * primaryA) / neededA, responseSettingA: (CORRECTION_DEFAULTS.ckSettingFraction * threshold * primaryA) / neededA };
  return {
    outputs: input.spec.outputs ?? CORRECTION_DEFAULTS.controllerOutputs,
    outputsUsed: switched.length,
    measurement: input.perLine ? 'every-line' : 'one-line',
    ctPrimaryA: primaryA,
    ctSecondaryA: secondaryA,
    ctRatio: primaryA / secondaryA,
    ctChosen: chosen,
    ctNeeded,
    ctBasis: input.ctBasis,
    smallestStepKvar: smallest.kvarAtNominalV,
    thresholdBasis: smallest.thresholdBasis,
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

/**
 * What the controller's CT is warned of: a primary below the current it must carry (a CT given; one
 * chosen is at least 1.25 × it), and a C/k setting finer than controllers resolve.
 */
export function controllerWarnings(controller: ControllerSettings): CorrectionWarning[] {
  const out: CorrectionWarning[] = [];
  const { ctPrimaryA, ctBasis } = controller;
  if (!controller.ctChosen && ctPrimaryA < ctBasis.currentA)
    out.push({
      code: 'ct-below-line-current',
      message: warningText.ctBelowLineCurrent(ctPrimaryA, ctBasis, standardCtPrimaryA(CORRECTION_DEFAULTS.ctHeadroom * ctBasis.currentA)),
      path: 'controller.ctPrimaryA',
      value: ctPrimaryA,
      threshold: ctBasis.currentA,
    });
  if (controller.responseSettingA < CORRECTION_DEFAULTS.ckResolutionA)
    out.push({
      code: 'ck-below-resolution',
      message: warningText.ckBelowResolution(controller.responseSettingA, CORRECTION_DEFAULTS.ckResolutionA, controller.ctChosen),
      path: 'controller.ctPrimaryA',
      value: controller.responseSettingA,
      threshold: CORRECTION_DEFAULTS.ckResolutionA,
    });
  return out;
}

/** The warnings `controllerWarnings` gives, and a step below the least on the CT: a selection's are given again when its CT is. */
const CT_WARNINGS: ReadonlySet<string> = new Set(['ct-below-line-current', 'ck-below-resolution', 'step-below-least']);

/**
 * A selection with its controller's CT chosen (where none was given) and checked where it reads, on the
 * current there: every step's C/k on that CT (C/k ∝ 1/k_CT), the controller's settings and its CT
 * warnings again. correctBoard calls it on the build it verified, whose after-correction currents (and
 * the metering point's) the selection alone does not know.
 */
export function withCtReading(selection: BankSelection, reading: CtReading, spec: ControllerSpec): BankSelection {
  const was = selection.controller;
  if (!was) return selection;
  const ctBasis = ctBasisOf(reading);
  const ct = resolveCurrentTransformer(spec, ctBasis.currentA);
  const scale = was.ctRatio / (ct.primaryA / ct.secondaryA);
  const steps = selection.steps.map((s) => ({ ...s, responseThresholdA: s.responseThresholdA * scale }));
  const controller = controllerSettings({ spec, practice: selection.practice, ct, steps, band: was.targetBand, perLine: was.measurement === 'every-line', ctBasis });
  // The least step on this CT: the build was chosen on the selection's, so a larger CT may leave a step below it.
  const kept = selection.leastStep;
  const least = { ...leastSwitchedStep({ ct, detuned: kept.detuned, minStepKvar: kept.nameplateKvar, kinds: kept.floors }), ratio: kept.ratio, heldBack: kept.heldBack };
  const below = stepsBelowLeast(steps, least);
  const belowWarning: CorrectionWarning[] = below.length
    ? [
        {
          code: 'step-below-least',
          message: warningText.stepsBelowLeastOnCt(
            below.map((s) => ({ output: s.output!, branches: s.branches.length === 3 ? 'three-phase' : s.branches.join(', '), kvar: s.kvarAtNominalV, responseA: s.responseThresholdA })),
            ctRatingWords(ct.primaryA, ct.secondaryA),
            least.responseThresholdA,
          ),
          path: 'controller.ctPrimaryA',
          value: Math.min(...below.map((s) => s.responseThresholdA)),
          threshold: least.responseThresholdA,
        },
      ]
    : [];
  return {
    ...selection,
    steps,
    controller,
    leastStep: least,
    warnings: [...selection.warnings.filter((w) => !CT_WARNINGS.has(w.code)), ...(controller ? controllerWarnings(controller) : []), ...belowWarning],
  };
}
