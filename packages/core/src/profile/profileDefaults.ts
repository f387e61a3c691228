/**
 * Every default of the profile study, with its reason, in one place. The time a step stays off before it
 * is switched on again defaults to the discharge time of the board's capacitor practice, the correction
 * study's one definition (correction/capacitorDischarge.ts); the voltage unbalance threshold, and the index
 * it judges, is the board region's (board/conventions/unbalanceLimits.ts).
 */
import { CORRECTION_DEFAULTS, RESPONSE_SHARE_OF_CK } from '../correction/correctionDefaults.js';

/**
 * The lowest switching threshold, as a share of the smallest step: below half a step, a need between
 * r × step and (1 − r) × step closes the step, which leaves the board over-corrected by more than r × step,
 * so the step opens again, and so on while the load holds (common practice, no source).
 */
export const MIN_RESPONSE_SHARE = 0.5;

export const PROFILE_DEFAULTS = {
  /** Common demand-meter window (common practice, no source). */
  demandWindowMinutes: 15,
  /** A usual tariff target: the correction study's default, so the two agree. */
  targetPf: CORRECTION_DEFAULTS.pf,
  /** Size the bank to cover the kvar the target needs in 95 % of intervals (that percentile of the need): the last few per cent of peaks cost the most kvar. */
  coverShare: 0.95,
  /** Controllers commonly have 6, 8 or 12 outputs (METHODS §10, common practice). */
  stepCount: 6,
  /** The switching threshold's share of the smallest step: the correction study's C/k setting share (RESPONSE_SHARE_OF_CK, with its reason). */
  responseShare: RESPONSE_SHARE_OF_CK,
  /** Switching delay of tens of seconds (METHODS §10, common practice). */
  delaySeconds: 30,
  /** IEC 60831-1 manufacturer note: ≤ 5000 switching operations per year (METHODS §4, confirmed secondary). */
  operationsPerYearLimit: 5000,
  /** A capacitor-duty contactor's electrical life, order of 100 000 operations (from memory). */
  contactorLifeOperations: 100_000,
  /**
   * The horizon a time to the contactor's life is given within, years: longer than a capacitor bank is
   * expected to stay in service, so a figure beyond it is no forecast and is said to lie beyond it
   * (common practice, no source).
   */
  contactorLifeHorizonYears: 50,
} as const;
