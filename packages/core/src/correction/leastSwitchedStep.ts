/**
 * The least switched step a bank is built with, and how wide its step series may run.
 *
 * A controller tells a step's switching from its reactive current on the CT secondary, the step's
 * C/k (controllerSettings.ts). A step whose C/k is below a share of the CT's rated secondary current
 * is lost in the CT's own error at full load, so it is not built: 1 % of the secondary for a plain
 * step, 2 % for a detuned one, whose own reactor is not worth building for a step that small, which
 * also delivers at least 2.5 kvar at nominal voltage; never below the controller's resolution over
 * the setting share. All of it common practice, no source (the reasons in CORRECTION_DEFAULTS).
 * The same floor in kvar at nominal voltage, by kind of step, inverts C/k = f(Q) (linear in Q):
 *   three-phase  Q = C/k · √3 · U_LL · k_CT      line pair  Q = C/k · (2/√3) · U_LL · k_CT
 *   single-phase Q = C/k · U · k_CT               (methods notes §10)
 */
import { CORRECTION_DEFAULTS } from './correctionDefaults.js';
import type { BankStep, CorrectionWarning, LeastSwitchedStep, StepFloor } from './correctionResult.js';
import { leastStepWords, warningText } from './correctionWording.js';

/** The least C/k of a switched step on a CT of this rated secondary, A, and the share of the secondary it is. */
export function leastStepResponse(ctSecondaryA: number, detuned: boolean): { responseThresholdA: number; shareOfSecondary: number } {
  const share = detuned ? CORRECTION_DEFAULTS.leastDetunedStepSecondaryShare : CORRECTION_DEFAULTS.leastStepSecondaryShare;
  const resolved = CORRECTION_DEFAULTS.ckResolutionA / CORRECTION_DEFAULTS.ckSettingFraction;
  const responseA = Math.max(share * ctSecondaryA, resolved);
  return { responseThresholdA: responseA, shareOfSecondary: responseA / ctSecondaryA };
}

type StepThresholdKind = StepFloor['kind'];

/** kvar at nominal voltage a step of this kind delivers at C/k `responseA` on a CT of `ctRatio`: responseThresholdA (controllerSettings.ts) inverted. */
export function kvarAtResponse(responseA: number, kind: StepThresholdKind, voltageV: number, ctRatio: number): number {
  const amps = responseA * ctRatio;
  const va = kind === 'three-phase' ? amps * Math.sqrt(3) * voltageV : kind === 'line-pair' ? (amps * 2 * voltageV) / Math.sqrt(3) : amps * voltageV;
  return va / 1000;
}

/** The least output of a switched step of this kind at nominal voltage, kvar: the least C/k's, and for a detuned step at least `leastDetunedStepKvar`. */
export function leastStepKvar(responseA: number, kind: StepThresholdKind, voltageV: number, ctRatio: number, detuned: boolean): number {
  return Math.max(kvarAtResponse(responseA, kind, voltageV, ctRatio), detuned ? CORRECTION_DEFAULTS.leastDetunedStepKvar : 0);
}

/** The least step on one CT, for the kinds of step a bank may have (kind and the voltage its C/k is read at). */
export function leastSwitchedStep(input: {
  readonly ct: { readonly primaryA: number; readonly secondaryA: number };
  readonly detuned: boolean;
  readonly minStepKvar: number;
  readonly kinds: readonly { readonly kind: StepThresholdKind; readonly voltageV: number }[];
}): Omit<LeastSwitchedStep, 'ratio' | 'heldBack'> {
  const { ct, detuned } = input;
  const { responseThresholdA: responseA, shareOfSecondary } = leastStepResponse(ct.secondaryA, detuned);
  const detunedKvar = detuned ? CORRECTION_DEFAULTS.leastDetunedStepKvar : null;
  const ratio = ct.primaryA / ct.secondaryA;
  const floors: StepFloor[] = input.kinds.map(({ kind, voltageV }) => ({ kind, voltageV, kvarAtNominalV: leastStepKvar(responseA, kind, voltageV, ratio, detuned) }));
  const least = { detuned, responseThresholdA: responseA, shareOfSecondary, ctPrimaryA: ct.primaryA, ctSecondaryA: ct.secondaryA, floors, nameplateKvar: input.minStepKvar, detunedKvar, widestRatio: CORRECTION_DEFAULTS.widestStepRatio };
  return { ...least, words: leastStepWords(least) };
}

/** Largest over smallest C/k of the switched steps as built, with the two steps; null with fewer than two. */
export function stepSeriesSpan(steps: readonly BankStep[]): { ratio: number; smallest: BankStep; largest: BankStep } | null {
  const switched = steps.filter((s) => s.output !== null && s.responseThresholdA > 0);
  if (switched.length < 2) return null;
  const smallest = switched.reduce((a, b) => (b.responseThresholdA < a.responseThresholdA ? b : a));
  const largest = switched.reduce((a, b) => (b.responseThresholdA > a.responseThresholdA ? b : a));
  return { ratio: largest.responseThresholdA / smallest.responseThresholdA, smallest, largest };
}

/** The warning for a step series wider than the build is kept within where it can be; none within it. */
export function stepSeriesWarning(steps: readonly BankStep[], label: (branch: string) => string): CorrectionWarning | null {
  const span = stepSeriesSpan(steps);
  const widest = CORRECTION_DEFAULTS.widestStepRatio;
  if (!span || span.ratio <= widest * (1 + 1e-9)) return null;
  const words = (s: BankStep) => ({ output: s.output!, branches: s.branches.length === 3 ? 'three-phase' : s.branches.map(label).join(', '), kvar: s.kvarAtNominalV, responseA: s.responseThresholdA });
  return { code: 'step-series-wide', message: warningText.stepSeriesWide(span.ratio, words(span.smallest), words(span.largest), widest), path: null, value: span.ratio, threshold: widest };
}

/** Switched steps whose C/k on the CT the controller was given is below the least (the CT chosen again on the bank as built). */
export function stepsBelowLeast(steps: readonly BankStep[], least: Pick<LeastSwitchedStep, 'responseThresholdA'>): BankStep[] {
  return steps.filter((s) => s.output !== null && s.responseThresholdA < least.responseThresholdA * (1 - 1e-9));
}
