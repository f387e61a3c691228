/**
 * Every default of the correction study in one place, each with its reason.
 * The public functions resolve their options against these.
 */
import { CAPACITOR_DISCHARGE } from './capacitorDischarge.js';

/**
 * The automatic controller's response threshold as a share of C/k (the reactive current of the smallest
 * step): a step closes only while the need exceeds this share of it. Inside the usual 0.6–0.7 that keeps a
 * controller from hunting (methods notes §10, from memory, common practice). One convention for every
 * controller trivar sets or simulates: the correction study's C/k setting and the profile's switching
 * threshold (profile.bank.responseShare's default) are the same setting, so they take the same share.
 */
export const RESPONSE_SHARE_OF_CK = 0.65;

export const CORRECTION_DEFAULTS = {
  /** A common tariff threshold (see the PFC notes: 0.90–0.95 is usual). */
  pf: 0.95,
  /** Star and delta banks: every line must meet the target (the strictest reading). */
  definition: 'per-line',
  /** A balancing compensator controls the positive-sequence reactive power, so its target is PF1+. */
  compensatorDefinition: 'positive-sequence',
  leading: 'never',
  share: 'equal',
  maxUnitsPerBranch: 24,
  /**
   * A switched step below about 1 kvar nameplate does not pay for its contactor and
   * controller output (common practice, no source). No build has a smaller switched step
   * (nor one below the least C/k, leastStepSecondaryShare).
   */
  minStepKvar: 1,
  trimSteps: 'auto',
  /**
   * An automatic bank has at least three equal switched steps where the
   * controller outputs and the minimum step allow, so it follows the load in
   * thirds or finer (common practice, no source).
   */
  minSwitchedSteps: 3,
  /** The smallest common controller size; 8 and 12 are the usual larger ones (methods notes §10, common practice). */
  controllerOutputs: 6,
  ctSecondaryA: 5,
  /** CT primary at least this much above the largest line current (common practice, no source). */
  ctHeadroom: 1.25,
  /** "Tens of seconds" between switching decisions (methods notes §10, common practice). */
  switchingDelayS: 30,
  /** Response threshold set at this share of C/k (RESPONSE_SHARE_OF_CK, with its reason). */
  ckSettingFraction: RESPONSE_SHARE_OF_CK,
  /** A C/k setting below this (A, on the CT secondary) is finer than controllers usually resolve (common practice, no source). */
  ckResolutionA: 0.02,
  /**
   * The least C/k of a switched step, as a share of the CT's rated secondary current (leastSwitchedStep.ts):
   * 1 % of 5 A is 0.05 A. A class 1 CT may read its rated current up to 1 % off in ratio and about 1° off
   * in phase (IEC 61869-2 class limits, from memory), which moves the reactive current it reports by 1–2 %
   * of the secondary at full load: a step whose own reactive current is below about 1 % is lost in that
   * error (a design choice, common practice, no source). Never below the controller's resolution over
   * the setting share (ckResolutionA / ckSettingFraction ≈ 0.031 A), which decides on a 1 A secondary.
   */
  leastStepSecondaryShare: 0.01,
  /**
   * The same for a detuned step: twice the plain share. Each detuned step has its own reactor, contactor
   * and output; a reactor for a step a CT can hardly see is not built (common practice, no source).
   */
  leastDetunedStepSecondaryShare: 0.02,
  /**
   * A detuned step also delivers at least this much at nominal voltage, kvar: below a few kvar a reactor
   * per step costs more than the capacitance it switches (common practice, no source).
   */
  leastDetunedStepKvar: 2.5,
  /**
   * Widest ratio of the largest switched step's C/k to the smallest's the build is ranked to keep within,
   * and warned past: the binary series 1:2:4:8 is the widest step series controllers commonly take (from
   * memory, common practice), and 10 leaves room for the spread of delivered kvar between units of
   * different ratings. Past it the largest step moves the reactive current by more than ten thresholds,
   * so the band must be wide or the controller hunts (a design choice, common practice, no source).
   */
  widestStepRatio: 10,
  /**
   * A unit must deliver at least this share of its nameplate at the nominal voltage
   * across it (the rating is chosen for the system, not for a board a few per cent
   * low): below about two thirds the square law wastes more than a third of what is
   * bought. 480 V units on 400 V (69 %) and 280 V units on 230 V (67 %) pass;
   * 525 V on 400 V (58 %), 600 V on 480 V (64 %) and 690 V on 230 V (11 %) do not
   * (common practice, no source).
   */
  deliveryFloorPercent: 65,
  /**
   * Cost the unit choice minimises, in kvar-equivalents: nameplate kvar plus
   * this much per unit bought (its case, terminals, fuse and wiring cost about
   * as much as 2 kvar of low-voltage capacitance; common practice, no source).
   */
  unitCostKvar: 2,
  /**
   * On a three-phase bank, equal steps are kept over a build with single-line steps (trims) unless that
   * build costs this much less, in the same kvar-equivalents: single-line steps need a controller that
   * measures every line (two CTs more, a dearer controller) and follow the load line by line in coarse
   * steps where equal ones follow it in thirds or finer (a design choice, common practice, no source:
   * about the price difference of the two controllers with their CTs).
   */
  singleLineStepsKvar: 25,
  /**
   * Balancing compensator: |I2|/|I1| left at most 10 %. Current unbalance runs
   * at about 6–10 × the voltage unbalance it causes (methods notes §3, secondary
   * source), so this keeps well inside a 2 % voltage-unbalance budget
   * (common practice, no source for the exact figure).
   */
  maxNegativeSequencePercent: 10,
  /** Balancing compensator on a 4-wire board: neutral current left at most 20 % of |I1| (common practice, no source). */
  maxNeutralPercent: 20,
  /** IEC 60831-1 capacitance tolerance −5 % … +10 % for units and banks up to 100 kvar (from memory). */
  capacitanceTolerance: { minusPercent: 5, plusPercent: 10 },
  /**
   * Rated voltage above the nominal voltage across a unit, by practice.
   * IEC practice: 10 % (a 400 V network gets 440 V units), so normal service
   * sits below rated where harmonics and voltage rise add to it.
   * North-American practice: 0 %, units at their nameplate voltage (480 V units
   * on 480 V systems), relying on IEEE 18's 110 % continuous limit.
   * Both common practice, no source (methods notes §10).
   */
  voltageMarginPercent: { iec: 10, 'north-american': 0 },
  /**
   * Whatever the margin, the highest solved voltage across a unit stays within
   * 110 % of its rating (IEEE 18 and IEC 60831-1 continuous limit, methods notes §4).
   */
  continuousVoltageLimit: 1.1,
  /** Discharge time before a step may be switched on again, s, by practice (capacitorDischarge.ts: the rule each follows). */
  dischargeTimeS: { iec: CAPACITOR_DISCHARGE.iec.seconds, 'north-american': CAPACITOR_DISCHARGE['north-american'].seconds },
  /**
   * The flag level of the steady rise, 3 %, solved or estimated as ΔV/V ≈ Q_C/S_sc,X (common practice, no
   * source): a rise above it is flagged with what it does on the board, not judged as a failure.
   */
  voltageRiseLimitPercent: 3,
  /**
   * The lines' path reactances may spread over this fraction of their mean and still be read as one X per
   * line for the first-order rise: the estimate is then off by about that much on some line, inside its own
   * first-order accuracy; beyond it (an open delta: 0.0078 against 0.0490 Ω) only the solved rises are given
   * (a design choice, no source).
   */
  unequalPathSpread: 0.05,
  /**
   * Harmonic orders a supply resonance is flagged near (within ±10 %, resonanceNearFraction) where the
   * study has no spectrum of the board: every odd order the built-in typical spectra give a few percent
   * (harmonics/typicalSpectra.ts): the six-pulse orders 6k ± 1 up to the 19th (drives carry 3–4 % at the
   * 17th and 19th), and the triplen 3rd, 9th and 15th of single-phase rectifiers (switch-mode supplies,
   * LED drivers: 9th ≈ 16 %, 15th ≈ 8 %), which flow in the lines of a board with a neutral and, from
   * rectifiers across two lines, of one without. Above the 19th the typical currents are small and a
   * single-node estimate too coarse to name an order. Even orders are left out (half-wave loads are rare).
   */
  resonanceWatchedOrders: [3, 5, 7, 9, 11, 13, 15, 17, 19],
  /**
   * The watched orders a resonance near them headlines the verdict ("meets the target, but …"): those a built-in
   * typical spectrum (harmonics/typicalSpectra.ts) gives at least 5 % of the fundamental — 5th, 7th, 11th, 13th
   * from drives and rectifiers, and the triplen 3rd, 9th and 15th from single-phase rectifiers, which count only
   * where they can reach the capacitance (resonanceExcitation.ts). The 17th and 19th (3–4 % from drives) go to
   * the warnings and the step-state table. The 5 % line is common practice, no source.
   */
  resonanceHeadlineOrders: [3, 5, 7, 9, 11, 13, 15],
  /** A resonance within this fraction of a watched order is flagged (common practice, no source; as the harmonic scan's band). */
  resonanceNearFraction: 0.1,
  compensatorWeights: { negativeSequence: 1, zeroSequence: 1, reactive: 1 },
  /**
   * Ridge weight on Σ(branch kvar)², per unit, in the capacitor-only objective:
   * it picks the smallest bank among equally good ones and keeps the QP strictly convex.
   */
  compensatorRidge: 1e-9,
  /**
   * A compensator branch below this share of the compensator's total kvar is what the supply impedance
   * leaves in an exact solution, not a component to buy: the sizing leaves it out and re-solves, and
   * keeps it only where a target needs it (common practice, no source).
   */
  negligibleBranchFraction: 0.01,
  /**
   * How far, in percent of |I1|, leaving a branch out of the capacitor-only compensator may raise |I2|/|I1|
   * or the neutral current (the balance targets must still be met besides). A design choice (common
   * practice, no source): within what a class-1 meter reads, far inside the default targets of 10 % and 20 %.
   */
  fewerBranchesAllowancePercent: 0.5,
  /** A reactor costs about this many times a capacitor of the same kvar, when builds are compared (common practice, no source). */
  reactorCostFactor: 2,
  /** Outer iterations of the sizing loops (each re-solves the board). */
  maxIterations: 30,
  /**
   * Sizing stops when no branch moves by more than this fraction of the board's
   * apparent power. On boards with voltage-dependent loads the numerical Jacobian
   * carries noise of ~1e-9 (see the probe's solve tolerance), and a least-squares
   * optimum (the capacitor-only compensator) moves with it, so a tighter step
   * cannot be reached there; on linear boards one step is exact anyway.
   */
  convergence: 1e-8,
} as const;

/** A capacitance tolerance as given (% each way, either may be left out) → fractions, the defaults filling the gaps. */
export function toleranceFractions(given?: { readonly minusPercent?: number | undefined; readonly plusPercent?: number | undefined }): { minus: number; plus: number } {
  return {
    minus: (given?.minusPercent ?? CORRECTION_DEFAULTS.capacitanceTolerance.minusPercent) / 100,
    plus: (given?.plusPercent ?? CORRECTION_DEFAULTS.capacitanceTolerance.plusPercent) / 100,
  };
}
