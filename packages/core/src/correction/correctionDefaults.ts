/**
 * Every default of the correction study in one place, each with its reason.
 * The public functions resolve their options against these.
 */
export const CORRECTION_DEFAULTS = {
  /** A common tariff threshold (see the PFC notes: 0.90–0.95 is usual). */
  pf: 0.95,
  /** Star and delta banks: every line must meet the target (the strictest reading). */
  definition: 'per-line',
  /** A balancing compensator controls the positive-sequence reactive power, so its target is PF1+. */
  compensatorDefinition: 'positive-sequence',
  leading: 'never',
  share: 'equal',
  pattern: '1:2:4',
  maxUnitsPerBranch: 24,
  /** IEC 60831-1 capacitance tolerance −5 % … +10 % for units and banks up to 100 kvar (from memory). */
  capacitanceTolerance: { minusPercent: 5, plusPercent: 10 },
  /**
   * Rated voltage at least 10 % above the highest applied voltage: IEEE 18 and
   * IEC 60831-1 allow 110 % only as a contingency, so normal service should sit
   * at or below rated (common practice, no source for the exact margin).
   */
  voltageMarginPercent: 10,
  /** Steady rise ΔV/V ≈ Qc/S_sc flagged above 3 % (common practice, no source). */
  voltageRiseLimitPercent: 3,
  /**
   * Unit selection treats installed kvar within this much of the least as equal
   * and then prefers fewer units: a bank of many tiny units to save the last
   * few percent is not a good design (common practice, no source).
   */
  selectionKvarSlackPercent: 5,
  /** A unit giving less than this fraction of its rating where it is used is flagged (rated far above the applied voltage). */
  underusedOutputFraction: 0.7,
  compensatorWeights: { negativeSequence: 1, zeroSequence: 1, reactive: 1 },
  /**
   * Ridge weight on Σ(branch kvar)², per unit, in the capacitor-only objective:
   * it picks the smallest bank among equally good ones and keeps the QP strictly convex.
   */
  compensatorRidge: 1e-9,
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
